// First: Dexie reads the global indexedDB once when it loads (each store still gets its own factory).
import 'fake-indexeddb/auto';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import type { FieldData } from '../../../../shared/competition/field-data';
import { firstOfficial, raceId } from '../../auth/testing/auth-fixtures';
import { FakeSyncServer } from '../../core/device-store/testing/fake-sync-server';
import { fieldDataFor } from '../../core/field-data/testing/field-data-fixture';
import { FakeBrowserStorage, provideTestDeviceStore, startSignedIn, until } from '../../core/sync/testing/test-device-store';
import { appTestProviders, blankRoutes } from '../../testing/app-test-providers';
import { CourtesyPage } from './courtesy-page';

async function setUp(change: (data: FieldData) => FieldData = (data) => data) {
  localStorage.clear();
  TestBed.configureTestingModule({
    providers: [...appTestProviders(blankRoutes('')), ...provideTestDeviceStore(new FakeSyncServer(), new FakeBrowserStorage())],
  });
  const store = await startSignedIn(firstOfficial);
  await store.keepFieldData(change(fieldDataFor(raceId)));
  return mount(store);
}

/** Shows the page again on the same device: after `fixture.destroy()`, like the app started again. */
function mount(store: Awaited<ReturnType<typeof startSignedIn>>) {
  const fixture = TestBed.createComponent(CourtesyPage);
  fixture.componentRef.setInput('id', raceId);
  const element = fixture.nativeElement as HTMLElement;
  const text = () => {
    fixture.detectChanges();
    return element.textContent?.replace(/\s+/g, ' ').trim() ?? '';
  };
  const press = (name: string) => {
    fixture.detectChanges();
    const button = [...element.querySelectorAll<HTMLButtonElement>('rl-glove-keypad button')].find(
      (b) => b.getAttribute('aria-label') === name || b.textContent?.trim() === name,
    );
    if (!button) throw new Error(`No key "${name}"`);
    button.click();
  };
  const enterBib = (bib: string) => {
    const input = element.querySelector<HTMLInputElement>('input[name=bib]')!;
    input.value = bib;
    input.dispatchEvent(new Event('input'));
  };
  const courtesy = () => firstValueFrom(store.watchRecords(raceId, 'courtesy-reading'));
  const display = () => {
    fixture.detectChanges();
    return element.querySelector('rl-glove-keypad output')?.textContent?.replace(/\s+/g, ' ').trim() ?? '';
  };
  return { store, fixture, element, text, press, enterBib, courtesy, display };
}

const international = (data: FieldData): FieldData => ({ ...data, competition: { ...data.competition, level: 'international' } });

describe('CourtesyPage', () => {
  it('when an athlete checks a steel at a natural international race, then the reading is kept apart and shown with the words that it never counts', async () => {
    const page = await setUp(international);
    await until(() => page.text().includes('Steel temperature'), 'the keypad shows');
    page.enterBib('1');
    await until(() => page.text().includes('Ann Example'), 'the athlete is named');

    for (const key of ['Change the sign, plus or minus', '3', 'Decimal point', '2', 'Show the athlete']) page.press(key);

    await until(() => page.text().includes('Bib 1 · Ann Example'), 'the result shows');
    expect(page.text()).toContain('−3.2 °C');
    expect(page.text()).toContain('never a violation');
    expect(page.text()).toContain('No value yet'); // the keypad is empty for the next athlete
    const [reading] = await page.courtesy();
    expect(reading?.fields).toMatchObject({ bib: 1, what: 'steel temperature', value: { tenths: -32, unit: 'celsius' } });
    expect(await firstValueFrom(page.store.watchRecords(raceId, 'violation'))).toEqual([]);
  });

  it('when a reading is half keyed and the app is killed, then the page comes back with the bib and the value, marked not saved', async () => {
    const first = await setUp(international);
    await until(() => first.text().includes('Steel temperature'), 'the keypad shows');
    first.enterBib('1');
    for (const key of ['Change the sign, plus or minus', '3', 'Decimal point']) first.press(key);
    expect(first.display()).toBe('−3. °C');
    first.fixture.destroy();

    const again = mount(first.store);
    await until(() => again.text().includes('Ann Example'), 'the athlete is named again');
    expect(again.element.querySelector<HTMLInputElement>('input[name=bib]')?.value).toBe('1');
    expect(again.display()).toBe('−3. °C');
    expect(again.text()).toContain('◌ Restored: not saved yet');
    for (const key of ['2', 'Show the athlete']) again.press(key);
    await until(() => again.text().includes('Bib 1 · Ann Example'), 'the result shows');
    expect((await again.courtesy())[0]?.fields).toMatchObject({ bib: 1, value: { tenths: -32, unit: 'celsius' } });
    expect(again.display()).toBe('No value yet');
    expect(localStorage.getItem(`rimelog.keypad-draft.courtesy:${raceId}`)).toBeNull();
    expect(localStorage.getItem(`rimelog.courtesy-bib.${raceId}`)).toBeNull();
  });

  it('when the bib is not on the start list, then nothing is kept and the official is told', async () => {
    const page = await setUp(international);
    await until(() => page.text().includes('Steel temperature'), 'the keypad shows');
    page.enterBib('42');
    for (const key of ['1', 'Show the athlete']) page.press(key);
    await until(() => page.text().includes('bib 42 is not on it'), 'the refusal shows');
    expect(await page.courtesy()).toEqual([]);
  });

  it('when the race is on an artificial track, then the spare scale reading is kept in kilograms', async () => {
    const page = await setUp((data) => ({ ...data, competition: { ...data.competition, trackType: 'artificial', level: 'junior' } }));
    await until(() => page.text().includes('Athlete with sled'), 'the weight keypad shows');
    page.enterBib('2');
    for (const key of ['9', '8', 'Decimal point', '4', 'Show the athlete']) page.press(key);
    await until(() => page.text().includes('Bib 2 · Bo Example'), 'the result shows');
    expect(page.text()).toContain('98.4 kg');
    expect((await page.courtesy())[0]?.fields).toMatchObject({ bib: 2, what: 'athlete with sled', value: { tenths: 984, unit: 'kilogram' } });
  });

  it('when the race is a natural-track national race, then it says no courtesy checks are offered there', async () => {
    const page = await setUp();
    await until(() => page.text().includes('This race has no courtesy checks'), 'the notice shows');
    expect(page.fixture.nativeElement.querySelector('rl-glove-keypad')).toBeNull();
  });
});
