import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, DestroyRef, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';
import { switchMap } from 'rxjs';
import type { FieldData } from '../../../../shared/competition/field-data';
import type { RecordKind } from '../../../../shared/sync/record-kinds';
import { AuthStore } from '../../auth/auth-store';
import type { LocalRecord } from '../../core/device-store/device-db';
import { FieldDataStore } from '../../core/field-data/field-data-store';
import { DeviceStore } from '../../core/sync/device-store';
import { controlLog, currentReadings as countingControlReadings } from '../control-steel/control-log';
import { LastScreen } from '../last-screen';
import { keepScreenAwake } from '../screen-awake';
import { STEEL_READING_CLOCK } from '../steel-temperatures/steel-reading-clock';
import { celsius, judgeSpots, shortSpotName, type SpotReading } from '../steel-temperatures/steel-spots';
import { SteelTemperatureStep } from '../steel-temperatures/steel-temperature-step';
import { keepChosenPyrometer, localDay, pyrometerChoices, readChosenPyrometer, type PyrometerChoices } from './check-instruments';
import { CheckPhotos } from './check-photos';
import { CheckPyrometerPicker } from './check-pyrometer-picker';
import { decisionWords, firstSledPlan, samePlan, savedSteelReadings, steelOutcome, violationsOfCheck } from './check-steel';
import { reportSteelViolation, saveSteelReading } from './check-steel-writer';
import { checkRowOf, checkStatusWords, type CheckStatus } from './check-words';

type Outcome = Exclude<CheckStatus, 'in-progress'>;

/** What the steel temperature section can show: the step, or why it cannot. */
type SteelPanel = 'loading' | 'no-field-data' | 'no-rules' | 'ready';

const noChoices: PyrometerChoices = { usable: [], refused: [] };

/**
 * One sled's start check: its steel temperatures (each reading saved as a measurement with the pyrometer
 * that took it), photos, a note, and the result. A steel reading over the limit is reported as a
 * violation record, never cleared. Every change is saved on this device as it is made. While the check
 * is open, an app update waits (DeviceStore.openChecks).
 */
@Component({
  selector: 'rl-start-check-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatButtonModule, RouterLink, CheckPhotos, CheckPyrometerPicker, SteelTemperatureStep],
  templateUrl: './start-check-page.html',
  styleUrls: ['./start-checks.scss', './start-check-page.scss'],
})
export class StartCheckPage {
  private readonly store = inject(DeviceStore);
  private readonly fieldDataStore = inject(FieldDataStore);
  private readonly auth = inject(AuthStore);
  private readonly clock = inject(STEEL_READING_CLOCK);
  /** The competition and the check, from the route. */
  readonly id = input.required<string>();
  readonly checkId = input.required<string>();

  private readonly records = this.watch('start-check');
  private readonly measurementRecords = this.watch('measurement');
  private readonly controlRecords = this.watch('control-reading');
  private readonly violationRecords = this.watch('violation');
  private readonly checkRecord = computed(() => this.records()?.find((r) => r.id === this.checkId()) ?? null);
  readonly check = computed(() => {
    const record = this.checkRecord();
    return record ? checkRowOf(record) : null;
  });
  readonly isLoading = computed(() => this.records() === null);
  readonly statusWords = checkStatusWords;
  readonly decisionWords = decisionWords;
  readonly confirming = signal<Outcome | null>(null);
  readonly confirmingSteel = signal(false);
  readonly saved = signal<string | null>(null);
  readonly problem = signal<string | null>(null);
  readonly busy = signal(false);

  /** This device's copy of the start list, instruments and rules: undefined while it is read, null when there is none. */
  private readonly fieldData = toSignal<FieldData | null | undefined, undefined>(
    toObservable(this.id).pipe(switchMap((id) => this.fieldDataStore.watch(id))),
    { initialValue: undefined },
  );
  readonly profile = computed(() => this.fieldData()?.profile?.profile ?? null);
  readonly steelPanel = computed<SteelPanel>(() => {
    const data = this.fieldData();
    if (data === undefined) return 'loading';
    if (data === null) return 'no-field-data';
    return data.profile === null ? 'no-rules' : 'ready';
  });
  readonly controlReadings = computed(() => countingControlReadings(controlLog(this.controlRecords() ?? []).entries));
  private readonly savedSteel = computed(() => savedSteelReadings(this.measurementRecords() ?? [], this.checkId()));
  readonly steelReadings = computed(() => this.savedSteel().map((s) => s.reading));
  /** Where the athlete's first sled in this run was read; kept the same object while it does not change, so the step keeps its place. */
  readonly preset = computed(
    () => {
      const record = this.checkRecord();
      return record ? firstSledPlan(record, this.records() ?? [], this.measurementRecords() ?? []) : null;
    },
    { equal: samePlan },
  );
  private readonly judgement = computed(() => {
    const profile = this.profile();
    const readings = this.steelReadings();
    return profile && readings.length > 0 ? judgeSpots(profile, this.controlReadings(), readings) : null;
  });
  readonly steel = computed(() => steelOutcome(this.judgement(), this.savedSteel()));
  readonly failedSpots = computed(() => {
    const steel = this.steel();
    return steel.kind === 'fail' ? steel.failed : [];
  });
  readonly notJudgedReason = computed(() => {
    const steel = this.steel();
    return steel.kind === 'not-judged' ? steel.reason : null;
  });
  readonly violations = computed(() => violationsOfCheck(this.violationRecords() ?? [], this.checkId()));

  readonly pyrometers = computed(() => {
    const data = this.fieldData();
    return data ? pyrometerChoices(data.instruments, this.auth.activeUserId(), localDay(this.clock())) : noChoices;
  });
  private readonly chosenPyrometerId = signal(readChosenPyrometer());
  /** The chosen pyrometer while the official may use it; null otherwise. */
  readonly pyrometer = computed(() => this.pyrometers().usable.find((p) => p.id === this.chosenPyrometerId()) ?? null);
  /** Why no steel reading can be entered now, or null when one can. */
  readonly steelLock = computed(() => {
    if (this.check()?.status !== 'in-progress') return 'This check is finished. Open this check again to read the steels again.';
    return this.pyrometer() ? null : 'Choose a calibrated sled pyrometer issued to you first.';
  });
  /** A new step for each check, and a fresh one after a failed save so no unsaved reading stays on screen. */
  private readonly stepRound = signal(0);
  readonly stepKey = computed(() => `${this.checkId()}#${this.stepRound()}`);
  readonly steelSaved = signal<string | null>(null);
  readonly steelProblem = signal<string | null>(null);
  private savingSteel: Promise<void> = Promise.resolve();

  readonly screenAwake = keepScreenAwake();

  constructor() {
    this.countOpenCheck();
    this.askForMissingFieldData();
    inject(LastScreen).rememberWhileShown();
  }

  choosePyrometer(id: string): void {
    this.chosenPyrometerId.set(id);
    keepChosenPyrometer(id);
  }

  /** Saves each reading in turn, in the order it was keyed. */
  enterReading(reading: SpotReading): void {
    const pyrometerId = this.pyrometer()?.id ?? null;
    this.savingSteel = this.savingSteel.then(() => this.saveReading(reading, pyrometerId));
  }

  async saveNote(note: string): Promise<void> {
    const check = this.check();
    if (!check || note === check.note) return;
    await this.save(() => this.store.updateRecord(this.checkId(), { note }), 'Note saved on this device');
  }

  choose(outcome: Outcome): void {
    this.confirmingSteel.set(false);
    // Clearing a sled is the everyday result; the others go to the delegate, so they are asked twice.
    if (outcome === 'cleared') void this.finish(outcome);
    else this.confirming.set(outcome);
  }

  askToReportSteel(): void {
    this.confirming.set(null);
    this.confirmingSteel.set(true);
  }

  async finish(outcome: Outcome): Promise<void> {
    this.confirming.set(null);
    await this.save(() => this.store.updateRecord(this.checkId(), { status: outcome }), `${checkStatusWords[outcome]}: saved on this device`);
  }

  async reportSteelViolation(): Promise<void> {
    this.confirmingSteel.set(false);
    const failed = this.failedSpots();
    if (failed.length === 0) return;
    await this.save(() => reportSteelViolation(this.store, this.id(), this.checkId(), failed), `${checkStatusWords.violation}: saved on this device`);
  }

  async reopen(): Promise<void> {
    await this.save(() => this.store.updateRecord(this.checkId(), { status: 'in-progress' }), 'Check open again');
  }

  private async saveReading(reading: SpotReading, pyrometerId: string | null): Promise<void> {
    const what = `${shortSpotName(reading)}: ${celsius(reading.tenths)}`;
    this.steelProblem.set(null);
    try {
      // Checked again for the moment of the reading: a calibration can run out while the screen is open.
      const usable = pyrometerChoices(this.fieldData()?.instruments ?? [], this.auth.activeUserId(), localDay(Date.parse(reading.takenAt))).usable;
      if (pyrometerId === null || !usable.some((p) => p.id === pyrometerId)) {
        throw new Error('Choose a calibrated sled pyrometer issued to you first.');
      }
      await saveSteelReading(this.store, { competitionId: this.id(), checkId: this.checkId(), reading, instrumentId: pyrometerId });
      this.steelSaved.set(`${what} saved on this device ${timeNow()}`);
    } catch (error) {
      this.steelSaved.set(null);
      this.steelProblem.set(`${what}. ${messageOf(error)} Key the reading again.`);
      this.stepRound.update((round) => round + 1);
    }
  }

  private async save(change: () => Promise<unknown>, words: string): Promise<void> {
    this.busy.set(true);
    this.problem.set(null);
    try {
      await change();
      this.saved.set(`${words} ${timeNow()}`);
    } catch (error) {
      this.saved.set(null);
      this.problem.set(messageOf(error));
    } finally {
      this.busy.set(false);
    }
  }

  private watch(kind: RecordKind) {
    return toSignal<LocalRecord[] | null, null>(toObservable(this.id).pipe(switchMap((id) => this.store.watchRecords(id, kind))), { initialValue: null });
  }

  /** With no copy on the device, asks the server once (it never throws; with no signal the notice stays). */
  private askForMissingFieldData(): void {
    const asked = new Set<string>();
    effect(() => {
      const id = this.id();
      if (this.fieldData() !== null || asked.has(id)) return;
      asked.add(id);
      untracked(() => void this.fieldDataStore.refresh(id));
    });
  }

  /** Counts this check as open on a screen while it is under way, so an app update never reloads over it. */
  private countOpenCheck(): void {
    let counted = false;
    const count = (open: boolean) => {
      if (open === counted) return;
      counted = open;
      this.store.openChecks.update((n) => n + (open ? 1 : -1));
    };
    effect(() => {
      const open = this.check()?.status === 'in-progress';
      untracked(() => count(open));
    });
    inject(DestroyRef).onDestroy(() => count(false));
  }
}

const timeNow = () => new Date().toLocaleTimeString([], { hour: '2-digit', minute: '2-digit', second: '2-digit' });
const messageOf = (error: unknown) => (error instanceof Error ? error.message : String(error));
