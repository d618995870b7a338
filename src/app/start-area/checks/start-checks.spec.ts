// First: Dexie reads the global indexedDB once when it loads (each store still gets its own factory).
import 'fake-indexeddb/auto';
import { HttpTestingController, type TestRequest } from '@angular/common/http/testing';
import type { Type } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { Router } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import type { FieldData } from '../../../../shared/competition/field-data';
import { profileWith } from '../../../../shared/rules/test-profiles';
import { firstOfficial } from '../../auth/testing/auth-fixtures';
import { FakeSyncServer } from '../../core/device-store/testing/fake-sync-server';
import { competitionId, startCheck } from '../../core/device-store/testing/test-device';
import { fieldDataUrl } from '../../core/field-data/field-data-store';
import { fieldDataFor } from '../../core/field-data/testing/field-data-fixture';
import type { DeviceStore } from '../../core/sync/device-store';
import { clockTime } from '../control-steel/clock-time';
import { FakeBrowserStorage, provideTestDeviceStore, startSignedIn, until } from '../../core/sync/testing/test-device-store';
import { appTestProviders, BlankPage } from '../../testing/app-test-providers';
import { StartChecksPage } from './start-checks-page';

async function setUp() {
  localStorage.clear();
  const server = new FakeSyncServer();
  TestBed.configureTestingModule({
    providers: [
      ...appTestProviders([
        { path: '', component: BlankPage },
        { path: 'competitions/:id/start/checks/:checkId', component: BlankPage },
      ]),
      ...provideTestDeviceStore(server, new FakeBrowserStorage()),
    ],
  });
  const store = await startSignedIn(firstOfficial);
  return { server, store };
}

function render<T>(component: Type<T>, inputs: Record<string, string>) {
  const fixture = TestBed.createComponent(component);
  for (const [name, value] of Object.entries(inputs)) fixture.componentRef.setInput(name, value);
  const element = fixture.nativeElement as HTMLElement;
  const text = () => {
    fixture.detectChanges();
    return element.textContent?.replace(/\s+/g, ' ').trim() ?? '';
  };
  /** The sled's row in the start queue. */
  const row = (bib: number) => {
    fixture.detectChanges();
    const found = element.querySelector<HTMLElement>(`li[data-bib="${bib}"]`);
    if (!found) throw new Error(`No row for bib ${bib}`);
    return found;
  };
  const rowText = (bib: number) => row(bib).textContent?.replace(/\s+/g, ' ').trim() ?? '';
  /** Clicks the button with these words, on the whole screen or in one sled's row. */
  const press = (label: string, inRowOf?: number) => {
    fixture.detectChanges();
    const scope = inRowOf === undefined ? element : row(inRowOf);
    const button = [...scope.querySelectorAll<HTMLButtonElement>('button')].find((b) => b.textContent?.replace(/\s+/g, ' ').trim() === label);
    if (!button) throw new Error(`No button "${label}"`);
    button.click();
  };
  const typeBib = (bib: string) => {
    const input = element.querySelector<HTMLInputElement>('input[name=bib]')!;
    input.value = bib;
    input.dispatchEvent(new Event('input'));
  };
  return { fixture, element, text, row, rowText, press, typeBib };
}

const checksOf = (store: DeviceStore) => firstValueFrom(store.watchRecords(competitionId, 'start-check'));

// The waiting limit is the test's own assumption, set with profileWith, not a rule value.
const atMostTwoWaiting = profileWith('natural', 'national', { 'startArea.maxWaitingSleds': 2 });

/** Field data with invented sleds 1 to 7 in start order and the test's waiting limit. */
function fieldDataWithList(): FieldData {
  const data = fieldDataFor(competitionId);
  return {
    ...data,
    profile: { competitionId, frozenAt: '2027-01-09T05:00:00.000Z', profile: atMostTwoWaiting },
    startList: [
      ...data.startList,
      { bib: 4, startOrder: 4, discipline: 'singles-men', athlete: 'Ed Example', secondAthlete: null, officialBodyWeight: null, secondOfficialBodyWeight: null },
      { bib: 5, startOrder: 5, discipline: 'singles-men', athlete: 'Fay Example', secondAthlete: null, officialBodyWeight: null, secondOfficialBodyWeight: null },
      { bib: 6, startOrder: 6, discipline: 'singles-women', athlete: 'Gus Example', secondAthlete: null, officialBodyWeight: null, secondOfficialBodyWeight: null },
      { bib: 7, startOrder: 7, discipline: 'singles-women', athlete: 'Hal Example', secondAthlete: null, officialBodyWeight: null, secondOfficialBodyWeight: null },
    ],
  };
}

/** Answers the screen's request for the start list, as the server or a dead connection would. */
async function answerFieldData(answer: (request: TestRequest) => void): Promise<void> {
  const http = TestBed.inject(HttpTestingController);
  let request: TestRequest | undefined;
  await until(() => (request ??= http.match(fieldDataUrl(competitionId))[0]) !== undefined, 'the screen asks for the start list');
  answer(request!);
}

/** The screen open with the start list and the rules on the device. */
async function openQueue() {
  const page = render(StartChecksPage, { id: competitionId });
  await answerFieldData((request) => request.flush(fieldDataWithList()));
  await until(() => page.text().includes('Ann Example'), 'the queue shows');
  return page;
}

const cleared = (bib: number, startedAt: string | null = null) => ({ ...startCheck(bib), status: 'cleared', startedAt });
const url = () => TestBed.inject(Router).url;

describe('StartChecksPage', () => {
  it('when a bib is entered and the check begun, then an open check is saved for that run and bib and its screen opens', async () => {
    const { store } = await setUp();
    const page = render(StartChecksPage, { id: competitionId });
    page.press('+');
    page.typeBib('12');

    page.press('Begin check');

    await until(() => TestBed.inject(Router).url.includes('/start/checks/'), 'the check screen opens');
    const [check] = await checksOf(store);
    expect(check?.fields).toMatchObject({ run: 2, bib: 12, status: 'in-progress', note: '' });
    expect(TestBed.inject(Router).url).toBe(`/competitions/${competitionId}/start/checks/${check?.id}`);
  });

  it('when the same sled is begun again in the same run, then its check opens again and no second one is made', async () => {
    const { store } = await setUp();
    const { record } = await store.createRecord('start-check', competitionId, 'start', startCheck(5));
    const page = render(StartChecksPage, { id: competitionId });
    await until(() => page.text().includes('Bib 5'), 'the list shows the check');
    page.typeBib('5');

    page.press('Begin check');

    await until(() => TestBed.inject(Router).url.endsWith(record.id), 'the existing check opens');
    expect(await checksOf(store)).toHaveLength(1);
  });

  it('when no bib is entered, then nothing is saved and the official is told what to enter', async () => {
    const { store } = await setUp();
    const page = render(StartChecksPage, { id: competitionId });
    page.press('Begin check');
    await until(() => page.text().includes('Enter the bib number'), 'the problem is shown');
    expect(await checksOf(store)).toEqual([]);
  });
});

describe('StartChecksPage start queue', () => {
  it('when the next sled is checked in one tap, then its open check is saved for this run with the time it began, and its screen opens', async () => {
    const { store } = await setUp();
    const page = await openQueue();
    expect(page.rowText(1)).toContain('▶ next');
    expect(page.row(1).querySelector('button.primary-action')?.textContent?.trim()).toBe('Check bib 1');
    const before = new Date().toISOString();

    page.press('Check bib 1', 1);

    await until(() => url().includes('/start/checks/'), 'the check screen opens');
    const after = new Date().toISOString();
    const [check] = await checksOf(store);
    expect(check?.fields).toMatchObject({ run: 1, bib: 1, sled: 1, status: 'in-progress', startedAt: null, note: '' });
    const beganAt = String(check?.fields['beganAt']);
    expect(beganAt >= before && beganAt <= after).toBe(true);
    expect(url()).toBe(`/competitions/${competitionId}/start/checks/${check?.id}`);
  });

  it('when another sled than the next is picked, then its check begins instead', async () => {
    const { store } = await setUp();
    const page = await openQueue();
    page.press('Check bib 3', 3);
    await until(() => url().includes('/start/checks/'), 'the check screen opens');
    expect((await checksOf(store)).map((c) => c.fields['bib'])).toEqual([3]);
  });

  it('when as many cleared sleds wait as the rules allow, then a further check is refused in the engine’s words and nothing is saved', async () => {
    const { store } = await setUp();
    await store.createRecord('start-check', competitionId, 'start', cleared(1));
    await store.createRecord('start-check', competitionId, 'start', cleared(2));
    const page = await openQueue();
    const refusal = 'Two controlled sleds are already waiting; check the next sled when one has started.';
    await until(() => page.text().includes(refusal), 'the screen says why before any tap');

    page.press('Check bib 3', 3);
    await until(() => page.rowText(3).includes(`⚠ Bib 3 cannot be checked yet. ${refusal}`), 'the refusal shows beside the sled');

    page.typeBib('44');
    page.press('Begin check');
    await until(() => page.element.querySelector('[aria-labelledby=typed-title] [role=alert]')?.textContent?.includes('Bib 44 cannot be checked yet.') === true, 'the typed bib is refused too');

    expect((await checksOf(store)).map((c) => c.fields['bib']).sort()).toEqual([1, 2]);
    expect(url()).not.toContain('/start/checks/');
  });

  it('when a waiting sled is confirmed as started, then its start time is saved and the queue frees a place for the next check', async () => {
    const { store } = await setUp();
    const { record: first } = await store.createRecord('start-check', competitionId, 'start', cleared(1));
    await store.createRecord('start-check', competitionId, 'start', cleared(2));
    const page = await openQueue();
    await until(() => page.rowText(1).includes('✓ Cleared, waiting at the start'), 'bib 1 waits');
    const startedOf = async () => (await checksOf(store)).find((c) => c.id === first.id)?.fields['startedAt'];

    page.press('Started', 1);
    expect(page.rowText(1)).toContain('Bib 1 has left the start?');
    page.press('No, go back', 1);
    expect(page.rowText(1)).not.toContain('has left the start?');
    expect(await startedOf()).toBeNull();

    page.press('Started', 1);
    page.press('Yes, bib 1 has left', 1);
    await until(() => page.rowText(1).includes('→ Started at'), 'bib 1 shows as started');
    expect(typeof (await startedOf())).toBe('string');
    expect(page.rowText(1)).toContain(`→ Started at ${clockTime(String(await startedOf()))}`);
    expect(page.text()).toContain('One controlled sled is waiting (at most 2 at once): this sled may be checked.');

    page.press('Check bib 3', 3);
    await until(() => url().includes('/start/checks/'), 'the next check opens');
    expect((await checksOf(store)).map((c) => c.fields['bib']).sort()).toEqual([1, 2, 3]);
  });

  it('when sleds are in every state, then each row says its state in words with a mark, and the next to check is the first left', async () => {
    const { store } = await setUp();
    const make = (fields: Record<string, unknown>) => store.createRecord('start-check', competitionId, 'start', fields);
    await make(cleared(1, '2027-01-14T09:41:00.000Z'));
    await make(cleared(2));
    await make(startCheck(3));
    await make({ ...startCheck(4), status: 'referred' });
    await make({ ...startCheck(5), status: 'violation' });
    await make({ ...startCheck(6), status: 'withdrawn' });
    const page = await openQueue();
    await until(() => page.rowText(6).includes('Withdrawn'), 'every check shows');

    const stateOf = (bib: number) => page.row(bib).querySelector('.sled-state')?.textContent?.trim();
    expect(stateOf(1)).toBe(`→ Started at ${clockTime('2027-01-14T09:41:00.000Z')}`);
    expect(stateOf(2)).toBe('✓ Cleared, waiting at the start');
    expect(stateOf(3)).toBe(`… Check under way (closed to preparation since ${clockTime(startCheck(3).beganAt)})`);
    expect(stateOf(4)).toBe('⚑ Referred to the technical delegate, waiting at the start');
    expect(stateOf(5)).toBe('⚠ Violation reported');
    expect(stateOf(6)).toBe('✕ Withdrawn');
    expect(stateOf(7)).toBe('○ To check');
    expect(page.rowText(7)).toContain('Bib 7 · ▶ next');
    expect(page.rowText(3)).toContain('Cy Example / Di Example · Doubles');
    expect(page.row(3).querySelector('a')?.textContent?.trim()).toBe('Open check');
    expect([...page.element.querySelectorAll('li.next')].map((li) => li.getAttribute('data-bib'))).toEqual(['7']);
  });

  it('when the start list is not on the device and cannot be fetched, then the screen says so and a typed bib still begins a check', async () => {
    const { store } = await setUp();
    const page = render(StartChecksPage, { id: competitionId });
    await answerFieldData((request) => request.error(new ProgressEvent('error'), { status: 0, statusText: 'Unknown Error' }));

    await until(() => page.text().includes('The start list is not on this device yet: open this screen once with signal.'), 'the notice shows');
    await until(() => page.text().includes('The server cannot be reached from this device right now.'), 'the reason shows');
    expect(page.element.querySelector('ol.queue')).toBeNull();
    expect(page.text()).toContain('count them before you begin');

    page.typeBib('12');
    page.press('Begin check');
    await until(() => url().includes('/start/checks/'), 'the check screen opens');
    expect((await checksOf(store))[0]?.fields).toMatchObject({ run: 1, bib: 12, status: 'in-progress' });
  });
});
