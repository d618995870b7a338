import { TestBed } from '@angular/core/testing';
import { filter, firstValueFrom } from 'rxjs';
import type { FieldData } from '../../../../../../shared/competition/field-data';
import type { Instrument, InstrumentPurpose } from '../../../../../../shared/competition/instruments';
import type { StartListEntry } from '../../../../../../shared/competition/start-list';
import type { RulesProfile } from '../../../../../../shared/rules/rules-profile';
import type { RecordKind } from '../../../../../../shared/sync/record-kinds';
import { firstOfficial } from '../../../../auth/testing/auth-fixtures';
import type { LocalRecord } from '../../../../core/device-store/device-db';
import { FakeSyncServer } from '../../../../core/device-store/testing/fake-sync-server';
import { competitionId, startCheck } from '../../../../core/device-store/testing/test-device';
import { fieldDataFor } from '../../../../core/field-data/testing/field-data-fixture';
import type { DeviceStore } from '../../../../core/sync/device-store';
import { FakeBrowserStorage, provideTestDeviceStore, startSignedIn, until } from '../../../../core/sync/testing/test-device-store';
import { appTestProviders, BlankPage } from '../../../../testing/app-test-providers';
import { STEEL_READING_CLOCK } from '../../../steel-temperatures/steel-reading-clock';
import { CheckSession } from '../../check-session';
import { StartCheckPage } from '../../start-check-page';

// Invented instruments, athletes and times for the check-step specs; nothing here is loaded by the app.
// Specs that use this import 'fake-indexeddb/auto' first, before anything loads Dexie.

export { competitionId, startCheck, until };

/** The official signed in: every instrument below is issued to them unless a spec says otherwise. */
const me = firstOfficial.user.id;

/** When the readings of a check are taken: the check day, 2027-01-09, in the morning. */
export const checkTime = '2027-01-09T09:05:00.000Z';

/** The day the specs' instruments are calibrated until, months after the check day. */
const calibratedUntil = '2027-07-08';

/** An instrument issued to the signed-in official and calibrated beyond the check day; `n` makes its id. */
export function issued(n: number, purpose: InstrumentPurpose, label: string, changes: Partial<Instrument> = {}): Instrument {
  return {
    id: `0190a7e2-0001-7000-8000-${String(n).padStart(12, '0')}`,
    label,
    purpose,
    calibratedUntil,
    assignedTo: me,
    nominalMass: null,
    certificateSha256: null,
    ...changes,
  };
}

/** The same kind of instrument, issued to another official: listed with the reason, never offered. */
export const anotherOfficials = (n: number, purpose: InstrumentPurpose, label: string, changes: Partial<Instrument> = {}): Instrument =>
  issued(n, purpose, label, { ...changes, assignedTo: 'official-two' });

/** The same kind of instrument, whose calibration ran out the day before the check. */
export const expired = (n: number, purpose: InstrumentPurpose, label: string, changes: Partial<Instrument> = {}): Instrument =>
  issued(n, purpose, label, { ...changes, calibratedUntil: '2027-01-08' });

/** A start list entry; singles unless a second athlete is given. */
export function entry(bib: number, changes: Partial<StartListEntry> = {}): StartListEntry {
  return {
    bib,
    startOrder: bib,
    discipline: 'singles-women',
    athlete: 'Gil Example',
    secondAthlete: null,
    officialBodyWeight: null,
    secondOfficialBodyWeight: null,
    ...changes,
  };
}

/** The time a step reads "now" from; a spec may move it while the screen is open. */
export class CheckClock {
  now = Date.parse(checkTime);
  set(iso: string): void {
    this.now = Date.parse(iso);
  }
}

export interface CheckPageSetUp {
  profile: RulesProfile;
  /** The start list on the device; the bib checked must be on it for the weight step. */
  startList: StartListEntry[];
  instruments: Instrument[];
  clock?: CheckClock;
}

function fieldData({ profile, startList, instruments }: CheckPageSetUp): FieldData {
  const data = fieldDataFor(competitionId);
  return {
    ...data,
    competition: { ...data.competition, trackType: profile.trackType },
    profile: { competitionId, frozenAt: '2027-01-09T05:00:00.000Z', profile },
    startList,
    // The server sends them sorted by label.
    instruments: [...instruments].sort((a, b) => a.label.localeCompare(b.label)),
  };
}

/** A device signed in as the first official, holding the field data; nothing remembered from earlier specs. */
export async function setUpDevice(setUp: CheckPageSetUp): Promise<DeviceStore> {
  localStorage.clear();
  const clock = setUp.clock ?? new CheckClock();
  TestBed.configureTestingModule({
    providers: [
      ...appTestProviders([
        { path: '', component: BlankPage },
        { path: 'competitions/:id/start/checks', component: BlankPage },
      ]),
      ...provideTestDeviceStore(new FakeSyncServer(), new FakeBrowserStorage()),
      { provide: STEEL_READING_CLOCK, useValue: () => clock.now },
    ],
  });
  const store = await startSignedIn(firstOfficial);
  const kept = await store.keepFieldData(fieldData(setUp));
  if (!kept.kept) throw new Error('The field data was not kept on the device');
  return store;
}

const squash = (text: string | null | undefined) => text?.replace(/\s+/g, ' ').trim() ?? '';

/** The real check page for one check, with ways to work it as an official would. */
export function renderCheck(checkId: string) {
  const fixture = TestBed.createComponent(StartCheckPage);
  fixture.componentRef.setInput('id', competitionId);
  fixture.componentRef.setInput('checkId', checkId);
  const element = fixture.nativeElement as HTMLElement;

  const find = (selector: string): HTMLElement | null => {
    fixture.detectChanges();
    return element.querySelector<HTMLElement>(selector);
  };
  const text = (selector?: string) => {
    fixture.detectChanges();
    return squash((selector ? element.querySelector(selector) : element)?.textContent);
  };
  const has = (selector: string) => find(selector) !== null;
  const all = (selector: string) => {
    fixture.detectChanges();
    return [...element.querySelectorAll<HTMLElement>(selector)];
  };
  const buttons = () => all('button').map((b) => squash(b.textContent));
  const click = (selector: string) => {
    const target = find(selector);
    if (!target) throw new Error(`Nothing matches ${selector}`);
    target.click();
    fixture.detectChanges();
  };
  const press = (label: string) => {
    const button = all('button').find((b) => squash(b.textContent) === label);
    if (!button) throw new Error(`No button "${label}"`);
    button.click();
    fixture.detectChanges();
  };
  /** The step list's state of a step: waiting, pass, fail, refer or no-verdict; null when the step is not listed. */
  const summaryOf = (step: string) => find(`button[data-step="${step}"]`)?.getAttribute('data-summary') ?? null;
  const listedSteps = () => all('button[data-step]').map((b) => b.getAttribute('data-step'));
  const showStep = (step: string) => click(`button[data-step="${step}"]`);
  const pickInstrument = (section: string, label: string) => click(`[data-section="${section}"] button[data-instrument="${label}"]`);
  /** The refusals listed under a picker, as [label, words]. */
  const refusedIn = (section: string) => all(`[data-section="${section}"] [data-refused]`).map((li) => [li.getAttribute('data-refused'), squash(li.textContent)]);
  /** Clears the keypad, keys a value (e.g. '2', '1', '.', '4') and saves it. */
  const keyAndSave = (keypad: string, ...labels: string[]) => {
    for (const label of ['Clear', ...labels, 'Save']) {
      const key = all(`${keypad} .keys button`).find((b) => squash(b.textContent) === label);
      if (!key) throw new Error(`No key "${label}" on ${keypad}`);
      key.click();
    }
    fixture.detectChanges();
  };
  /** The page's own session: what its steps are judged from. */
  const session = () => fixture.debugElement.injector.get(CheckSession);
  /** True once the page has read the check's records from the device, so what it lists no longer changes by itself. */
  const hasLoaded = () => {
    const s = session();
    return [s.checks(), s.measurements(), s.scaleProofRecords(), s.violationRecords()].every((records) => records !== null) && s.setup() === 'ready';
  };
  return { fixture, element, find, text, has, all, buttons, click, press, summaryOf, listedSteps, showStep, pickInstrument, refusedIn, keyAndSave, session, hasLoaded };
}

export type CheckPage = ReturnType<typeof renderCheck>;

/** Begins a check on the device, shows its page and waits until its steps are listed. */
export async function openCheck(store: DeviceStore, fields: Record<string, unknown> = startCheck(7)) {
  const { record } = await store.createRecord('start-check', competitionId, 'start', fields);
  const page = renderCheck(record.id);
  await until(() => page.hasLoaded() && page.has('button[data-step="equipment"]'), 'the steps are listed');
  return { page, id: record.id };
}

/** Sets the device up, opens a check and shows one of its steps. */
export async function openStep(setUp: CheckPageSetUp, step: string, fields?: Record<string, unknown>) {
  const store = await setUpDevice(setUp);
  const opened = await openCheck(store, fields);
  opened.page.showStep(step);
  await until(() => opened.page.has(`[data-current-step="${step}"]`), `the ${step} step shows`);
  return { store, ...opened };
}

/** Every record of a kind on the device, as the device has it now. */
export const recordsOf = (store: DeviceStore, kind: RecordKind): Promise<LocalRecord[]> => firstValueFrom(store.watchRecords(competitionId, kind));

/** The fields of one check record. */
export async function checkFieldsOf(store: DeviceStore, checkId: string): Promise<Record<string, unknown>> {
  const checks = await firstValueFrom(store.watchRecords(competitionId, 'start-check').pipe(filter((rs) => rs.some((r) => r.id === checkId))));
  return checks.find((r) => r.id === checkId)!.fields;
}

/** Waits until what the device holds passes `holds` (a save lands after the click that asked for it), and returns it. */
export async function untilStored<T>(read: () => Promise<T>, holds: (value: T) => boolean, what: string, timeoutMs = 5_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await read();
    if (holds(value)) return value;
    if (Date.now() > deadline) throw new Error(`Timed out waiting until ${what}`);
    TestBed.tick();
    await new Promise((resolve) => setTimeout(resolve, 10));
  }
}

/** Waits until a save notice of a step says `words` was saved on this device. */
export const untilSaved = (page: CheckPage, words: string) => until(() => page.text().includes(`${words} saved on this device`), `${words} is saved`);
