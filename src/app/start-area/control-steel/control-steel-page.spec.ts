// First: Dexie reads the global indexedDB once when it loads (each store still gets its own factory).
import 'fake-indexeddb/auto';
import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import type { CompetitionRulesProfile } from '../../../../shared/rules/competition-profile';
import { profileWith } from '../../../../shared/rules/test-profiles';
import { firstOfficial } from '../../auth/testing/auth-fixtures';
import { createRecordWriter } from '../../core/device-store/record-writer';
import { StorageFullError } from '../../core/device-store/store-errors';
import { FakeSyncServer } from '../../core/device-store/testing/fake-sync-server';
import { competitionId, openTestDevice, otherOfficial } from '../../core/device-store/testing/test-device';
import type { DeviceStore } from '../../core/sync/device-store';
import { FakeBrowserStorage, provideTestDeviceStore, startSignedIn, until } from '../../core/sync/testing/test-device-store';
import { appTestProviders, blankRoutes } from '../../testing/app-test-providers';
import { CONTROL_STEEL_CLOCK } from './control-steel-clock';
import { ControlSteelPage } from './control-steel-page';

// The shipped profiles leave the grace unset; 2 min is this spec's own assumption. The 15 min interval
// is trade practice, no published source.
const frozen: CompetitionRulesProfile = {
  competitionId,
  frozenAt: '2027-01-14T07:00:00.000Z',
  profile: profileWith('natural', 'international', { 'controlSteel.grace': 2 }),
};
const rulesUrl = `/api/competitions/${competitionId}/rules-profile`;

/** A time on this device's own clock, so "09:05" on screen holds in any time zone. */
const at = (hours: number, minutes: number, seconds = 0) => new Date(2027, 0, 14, hours, minutes, seconds);

const reading = (tenths: number, takenAt: Date, instrumentId = 'P-7') => ({
  reading: { tenths, unit: 'celsius' },
  takenAt: takenAt.toISOString(),
  instrumentId,
});

async function setUp({ server = new FakeSyncServer(), time = at(9, 20) } = {}) {
  const clock = { now: time.getTime() };
  TestBed.configureTestingModule({
    providers: [
      ...appTestProviders(blankRoutes('')),
      ...provideTestDeviceStore(server, new FakeBrowserStorage()),
      { provide: CONTROL_STEEL_CLOCK, useValue: () => clock.now },
    ],
  });
  const store = await startSignedIn(firstOfficial);
  return { server, store, clock };
}

/** Opens the page; the rules arrive, fail as without signal, or are left pending. */
async function openPage(rules: 'arrive' | 'no-signal') {
  const fixture = TestBed.createComponent(ControlSteelPage);
  fixture.componentRef.setInput('id', competitionId);
  TestBed.tick();
  const request = TestBed.inject(HttpTestingController).expectOne(rulesUrl);
  if (rules === 'arrive') request.flush(frozen);
  else request.error(new ProgressEvent('error'), { status: 0, statusText: 'Unknown Error' });
  const page = pageOf(fixture);
  await until(() => !page.text('[data-section="log"]').includes('Reading the log'), 'the log is read');
  return page;
}

function pageOf(fixture: ComponentFixture<ControlSteelPage>) {
  const element = fixture.nativeElement as HTMLElement;
  const text = (selector: string) => {
    fixture.detectChanges();
    return element.querySelector(selector)?.textContent?.replace(/\s+/g, ' ').trim() ?? '';
  };
  const entries = () => {
    fixture.detectChanges();
    return [...element.querySelectorAll('.log-entry')].map((li) => li.textContent?.replace(/\s+/g, ' ').trim() ?? '');
  };
  const buttonsIn = (scope: string) => [...element.querySelectorAll<HTMLButtonElement>(`${scope} button`)];
  /** Presses keypad keys (and its Save) inside `scope`. */
  const keys = (scope: string, ...labels: string[]) => {
    for (const label of labels) {
      fixture.detectChanges();
      const key = buttonsIn(`${scope} .keys`).find((b) => b.textContent?.trim() === label);
      if (!key) throw new Error(`No key "${label}" in ${scope}`);
      key.click();
    }
    fixture.detectChanges();
  };
  const press = (label: string, scope = ':scope') => {
    fixture.detectChanges();
    const button = buttonsIn(scope).find((b) => b.textContent?.trim() === label);
    if (!button) throw new Error(`No button "${label}" in ${scope}`);
    button.click();
    fixture.detectChanges();
  };
  const type = (selector: string, value: string) => {
    fixture.detectChanges();
    const input = element.querySelector<HTMLInputElement>(selector);
    if (!input) throw new Error(`No field ${selector}`);
    input.value = value;
    input.dispatchEvent(new Event('input'));
    fixture.detectChanges();
  };
  return { fixture, element, text, entries, keys, press, type };
}

const storedReadings = (store: DeviceStore) => firstValueFrom(store.watchRecords(competitionId, 'control-reading'));

describe('ControlSteelPage', () => {
  beforeEach(() => localStorage.clear());

  it('when a reading is keyed with a pyrometer, then "Saved on this device" shows only once it is saved, and the log shows it with the official', async () => {
    const { server, store, clock } = await setUp();
    let release!: () => void;
    const gate = new Promise<void>((resolve) => (release = resolve));
    const createRecord = store.createRecord.bind(store);
    vi.spyOn(store, 'createRecord').mockImplementation(async (...args) => {
      await gate;
      return createRecord(...args);
    });
    const page = await openPage('arrive');

    expect(page.text('h1')).toBe('Control steel');
    page.type('input[name="instrument"]', 'P-7');
    page.keys('[data-section="entry"]', '6', '.', '2', '±', 'Save');

    // The write has not finished: no word of "saved" yet.
    expect(page.text('[data-section="saved"]')).toBe('');
    expect(page.text('[data-section="entry"]')).toContain('Saving on this device…');
    expect(page.element.querySelector('[data-section="entry"] rl-glove-keypad')).toBeNull();
    expect(await storedReadings(store)).toEqual([]);

    release();
    await until(() => page.text('[data-section="saved"]') !== '', 'the save is confirmed');
    expect(page.element.querySelector('[data-section="saved"]')?.getAttribute('role')).toBe('status');
    expect(page.text('[data-section="saved"]')).toBe('✓ Saved on this device 09:20:00: −6.2 °C.');
    const [saved] = await storedReadings(store);
    expect(saved?.fields).toMatchObject({ reading: { tenths: -62, unit: 'celsius' }, instrumentId: 'P-7', takenAt: new Date(clock.now).toISOString(), ice: null, air: null });

    await until(() => page.entries().length === 1, 'the log shows the reading');
    expect(page.entries()[0]).toContain('−6.2 °C 09:20');
    expect(page.entries()[0]).toContain('First Official · pyrometer P-7');
    await until(() => server.received.length === 1, 'the reading reaches the server');
    expect(server.received[0]).toMatchObject({ recordKind: 'control-reading', userId: 'official-one', fields: { reading: { tenths: -62 }, instrumentId: 'P-7' } });
    // A fresh keypad for the next reading; the pyrometer stays keyed (and kept on this device).
    expect(page.text('[data-section="entry"] output')).toBe('No value yet');
    expect((page.element.querySelector('input[name="instrument"]') as HTMLInputElement).value).toBe('P-7');
    expect(JSON.parse(localStorage.getItem('rimelog.control-steel.instrument') ?? 'null')).toBe('P-7');
  });

  it('when the server cannot be reached, then a saved reading is marked "only on this device" until a sync confirms it', async () => {
    const server = new FakeSyncServer();
    server.outage = 'unreachable';
    const { store } = await setUp({ server });
    const page = await openPage('arrive');
    page.type('input[name="instrument"]', 'P-7');
    page.keys('[data-section="entry"]', '4', '.', '9', '±', 'Save');

    await until(() => page.entries().length === 1, 'the log shows the reading');
    expect(page.entries()[0]).toContain('↑ only on this device');

    server.outage = null;
    await store.syncNow();
    await until(() => !page.entries()[0]!.includes('only on this device'), 'the server has confirmed it');
    expect(page.entries()[0]).toContain('−4.9 °C');
  });

  it('when no pyrometer id is keyed, then Save is refused in words and nothing is saved', async () => {
    const { server, store } = await setUp();
    const page = await openPage('arrive');

    page.keys('[data-section="entry"]', '6', '.', '2', '±', 'Save');

    expect(page.text('[data-section="entry-problem"]')).toContain("Enter the pyrometer's id first: every control reading says which instrument took it.");
    expect(page.element.querySelector('[data-section="entry-problem"]')?.getAttribute('role')).toBe('alert');
    expect(page.text('[data-section="saved"]')).toBe('');
    expect(await storedReadings(store)).toEqual([]);
    expect(server.received).toEqual([]);
    expect(page.text('[data-section="empty-log"]')).toContain('No control readings');
  });

  it('when the device refuses the write, then its reason is shown in words and nothing says "Saved"', async () => {
    const { store } = await setUp();
    vi.spyOn(store, 'createRecord').mockRejectedValue(new StorageFullError(new DOMException('full', 'QuotaExceededError')));
    const page = await openPage('arrive');
    page.type('input[name="instrument"]', 'P-7');

    page.keys('[data-section="entry"]', '3', 'Save');

    await until(() => page.text('[data-section="entry-problem"]') !== '', 'the refusal shows');
    expect(page.text('[data-section="entry-problem"]')).toContain('Not saved. This device is out of storage, so the record was NOT saved.');
    expect(page.text('[data-section="saved"]')).toBe('');
    // The value is still on the keypad, ready for another try.
    expect(page.text('[data-section="entry"] output')).toBe('3.0 °C');
  });

  it('when the last reading is 5 min old, then it counts down on time; as the clock runs on it says due now, then overdue', async () => {
    const { store, clock } = await setUp({ time: at(9, 20) });
    await store.createRecord('control-reading', competitionId, 'start', reading(-62, at(9, 15)));
    const page = await openPage('arrive');

    await until(() => page.text('.state') !== '', 'the countdown shows');
    expect(page.text('.state')).toBe('✓ On time');
    expect(page.text('[role="timer"]')).toBe('10:00 until the next reading');
    expect(page.text('.advice')).toContain('due at 09:30');
    expect(page.text('.values')).toContain('Control steel reading every: 15 min');

    // The page ticks by itself, once a second.
    clock.now = at(9, 31).getTime();
    await until(() => page.text('.state') === '⏰ Due now', 'the countdown says due now');
    expect(page.text('[role="timer"]')).toBe('1:00 since it was due');

    clock.now = at(9, 33).getTime();
    await until(() => page.text('.state') === '⚠ Overdue', 'the countdown says overdue');
    expect(page.text('[role="timer"]')).toBe('3:00 past due');
    expect(page.text('.advice')).toContain('steel temperatures are not judged');
  });

  it('when the rules are not on this device and there is no signal, then the log and keypad are there with a notice and no countdown', async () => {
    const { store } = await setUp();
    await store.createRecord('control-reading', competitionId, 'start', reading(-30, at(9, 0)));
    const page = await openPage('no-signal');

    expect(page.text('[data-section="no-rules"]')).toBe(
      '⚠ The rules for this competition are not on this device yet: open this screen once with signal to get the reading interval.',
    );
    expect(page.element.querySelector('[role="timer"]')).toBeNull();
    expect(page.element.querySelector('.state')).toBeNull();
    expect(page.element.querySelector('[data-section="entry"] rl-glove-keypad')).not.toBeNull();
    expect(page.entries()[0]).toContain('−3.0 °C 09:00');
  });

  it('when the rules came once with signal, then a later visit without signal still counts down from them', async () => {
    await setUp();
    const first = await openPage('arrive');
    await until(() => first.text('.state') !== '', 'the first visit shows the countdown');
    first.fixture.destroy();

    const page = await openPage('no-signal');

    await until(() => page.text('.state') !== '', 'the countdown shows from the kept rules');
    expect(page.text('.state')).toBe('⚠ No control reading yet');
    expect(page.text('.values')).toContain('Control steel reading every: 15 min');
    expect(page.element.querySelector('[data-section="no-rules"]')).toBeNull();
  });

  it('when a reading is corrected, then a reason is required, and the log shows the new value with why and marks the old one corrected', async () => {
    const { store } = await setUp();
    await store.createRecord('control-reading', competitionId, 'start', reading(-62, at(9, 5)));
    const page = await openPage('arrive');
    await until(() => page.entries().length === 1, 'the log shows the reading');

    page.press('Correct', '[data-section="log"]');
    expect(page.text('[data-section="correction"] output')).toBe('−6.2 °C');
    page.keys('[data-section="correction"]', 'Clear', '6', '.', '4', '±', 'Save');

    expect(page.text('[data-section="correction-problem"]')).toContain('Say why the reading is corrected');
    expect(await storedReadings(store)).toHaveLength(1);

    page.type('input[name="reason"]', 'misread the display');
    page.keys('[data-section="correction"]', 'Save');

    await until(() => page.entries().length === 2, 'the log shows the correction');
    const [correction, original] = page.entries();
    expect(correction).toContain('−6.4 °C 09:05');
    expect(correction).toContain('corrects 09:05 reading: misread the display');
    expect(original).toContain('−6.2 °C 09:05 ✎ corrected');
    expect(page.text('[data-section="correction-saved"]')).toContain('✓ Correction saved on this device');
    // Only the newest value can be corrected again.
    expect([...page.element.querySelectorAll('.log-entry')].map((li) => li.querySelector('button')?.textContent?.trim() ?? null)).toEqual(['Correct', null]);
    const stored = await storedReadings(store);
    const saved = stored.find((record) => record.supersedes !== null);
    expect(saved?.fields).toMatchObject({ reading: { tenths: -64, unit: 'celsius' }, reason: 'misread the display', instrumentId: 'P-7' });
  });

  it("when another official's reading arrives, then it shows under their name and offers no Correct button", async () => {
    const { server, store } = await setUp();
    const otherDb = await openTestDevice();
    await createRecordWriter({ db: otherDb }).createRecord('control-reading', competitionId, 'start', reading(-71, at(9, 10), 'P-9'), otherOfficial);
    server.push((await otherDb.outbox.toArray()).map((entry) => entry.op));
    otherDb.close();
    await store.syncNow();
    const page = await openPage('arrive');

    await until(() => page.entries().length === 1, 'the log shows the reading');
    expect(page.entries()[0]).toContain('−7.1 °C 09:10');
    expect(page.entries()[0]).toContain('another official · pyrometer P-9');
    expect(page.entries()[0]).not.toContain('only on this device');
    expect(page.element.querySelector('.log-entry button')).toBeNull();
  });
});
