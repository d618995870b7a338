// First: Dexie reads the global indexedDB once when it loads (each store still gets its own factory).
import 'fake-indexeddb/auto';
import type { Type } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { Router } from '@angular/router';
import { firstValueFrom, filter } from 'rxjs';
import { firstOfficial } from '../../auth/testing/auth-fixtures';
import { FakeSyncServer } from '../../core/device-store/testing/fake-sync-server';
import { competitionId, startCheck } from '../../core/device-store/testing/test-device';
import type { DeviceStore } from '../../core/sync/device-store';
import { FakeBrowserStorage, provideTestDeviceStore, startSignedIn, until } from '../../core/sync/testing/test-device-store';
import { appTestProviders, BlankPage } from '../../testing/app-test-providers';
import { StartCheckPage } from './start-check-page';
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
  const press = (label: string) => {
    fixture.detectChanges();
    const button = [...element.querySelectorAll<HTMLButtonElement>('button')].find((b) => b.textContent?.replace(/\s+/g, ' ').trim() === label);
    if (!button) throw new Error(`No button "${label}"`);
    button.click();
  };
  return { fixture, element, text, press };
}

const checksOf = (store: DeviceStore) => firstValueFrom(store.watchRecords(competitionId, 'start-check'));

describe('StartChecksPage', () => {
  it('when a bib is entered and the check begun, then an open check is saved for that run and bib and its screen opens', async () => {
    const { store } = await setUp();
    const page = render(StartChecksPage, { id: competitionId });
    page.press('+');
    const bib = page.element.querySelector<HTMLInputElement>('input[name=bib]')!;
    bib.value = '12';
    bib.dispatchEvent(new Event('input'));

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
    const bib = page.element.querySelector<HTMLInputElement>('input[name=bib]')!;
    bib.value = '5';
    bib.dispatchEvent(new Event('input'));

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

describe('StartCheckPage', () => {
  async function openCheck() {
    const setup = await setUp();
    const { record } = await setup.store.createRecord('start-check', competitionId, 'start', startCheck(7));
    const page = render(StartCheckPage, { id: competitionId, checkId: record.id });
    await until(() => page.text().includes('Run 1 · Bib 7'), 'the check shows');
    return { ...setup, page, id: record.id };
  }
  const statusOf = async (store: DeviceStore, id: string) =>
    (await firstValueFrom(store.watchRecords(competitionId, 'start-check').pipe(filter((rs) => rs.length > 0)))).find((r) => r.id === id)?.fields['status'];

  it('when the sled is cleared, then the result is saved, said in words, and the check no longer holds back an app update', async () => {
    const { store, page, id } = await openCheck();
    expect(store.openChecks()).toBe(1);

    page.press('✓ Cleared to start');

    await until(() => page.text().includes('Cleared to start: saved on this device'), 'the result is saved');
    expect(await statusOf(store, id)).toBe('cleared');
    await until(() => page.text().includes('Next sled') && store.openChecks() === 0, 'the check no longer counts as open');
  });

  it('when a violation is chosen, then nothing changes until the official confirms it', async () => {
    const { store, page, id } = await openCheck();

    page.press('⚠ Violation');
    await until(() => page.text().includes('Report a violation for bib 7?'), 'the question is asked');
    expect(await statusOf(store, id)).toBe('in-progress');
    page.press('No, go back');
    page.press('⚠ Violation');
    page.press('Yes, report the violation');

    await until(() => page.text().includes('Violation reported: saved on this device'), 'the violation is saved');
    expect(await statusOf(store, id)).toBe('violation');
  });

  it('when the screen closes with the check still open, then it stops holding back an app update', async () => {
    const { store, page } = await openCheck();
    expect(store.openChecks()).toBe(1);
    page.fixture.destroy();
    expect(store.openChecks()).toBe(0);
  });

  it('when a note is written, then it is saved on this device when the field is left', async () => {
    const { store, page, id } = await openCheck();
    const note = page.element.querySelector<HTMLTextAreaElement>('textarea[name=note]')!;
    note.value = 'left runner bent at the bridge';
    note.dispatchEvent(new Event('change'));
    await until(() => page.text().includes('Note saved on this device'), 'the note is saved');
    const records = await checksOf(store);
    expect(records.find((r) => r.id === id)?.fields['note']).toBe('left runner bent at the bridge');
  });
});
