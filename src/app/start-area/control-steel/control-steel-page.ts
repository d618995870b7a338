import { ChangeDetectionStrategy, Component, DestroyRef, ElementRef, computed, effect, inject, input, linkedSignal, signal, untracked, viewChild } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import { catchError, map, of, switchMap, type Observable } from 'rxjs';
import { controlSteelStatus, type ControlSteelStatus } from '../../../../shared/rules/control-steel';
import { formatTenths } from '../../../../shared/rules/measurement';
import { RulesInputError } from '../../../../shared/rules/rules-error';
import type { RecordKind } from '../../../../shared/sync/record-kinds';
import { AuthStore } from '../../auth/auth-store';
import type { LocalRecord } from '../../core/device-store/device-db';
import { FieldDataStore } from '../../core/field-data/field-data-store';
import { DeviceStore } from '../../core/sync/device-store';
import { competitionRulesResource } from '../../rules/rules-api';
import { GloveKeypad } from '../../ui/glove-keypad/glove-keypad';
import { OfficialNames } from '../official-names';
import { clockTime } from './clock-time';
import { controlLog, currentReadings, type ControlLogEntry } from './control-log';
import { CheckInstrumentPicker } from '../checks/check-instrument-picker';
import { CONTROL_STEEL_CLOCK } from './control-steel-clock';
import { controlPyrometer } from './control-pyrometer';
import { forgetWeather, keepWeather, readKeptWeather } from './kept-weather';
import { instrumentProblem, keepInstrument, keepRules, readKeptInstrument, readKeptRules } from './control-steel-memory';
import { ControlSteelReminder, type ReminderMoment } from './control-steel-reminder';
import { countdownWords, type CountdownWords } from './countdown-words';
import { highestSteelTemperature, highestSteelWords } from './highest-steel';
import { MountingCheck } from './mounting-check';
import { ReminderSettings } from './reminder-settings';
import { SignaturePadField } from './signature-pad';
import { logSignatures, readingsToSign, signedReadingIds, signingStatement } from './signed-log';
import { LastScreen } from '../last-screen';
import { keepScreenAwake } from '../screen-awake';

/** The control steel is read to 0.1 °C within this range (shade at a start area in winter). */
export const controlReadingRange = { minTenths: -400, maxTenths: 200 } as const;
/** Ice and air are keyed within this range: a plausibility check of ours against mistyping, not a rule value. */
export const iceAndAirRange = { minTenths: -400, maxTenths: 300 } as const;

type CountdownPanel =
  | { kind: 'loading' }
  | { kind: 'no-rules' }
  | { kind: 'problem'; message: string }
  | { kind: 'ready'; status: ControlSteelStatus; words: CountdownWords };

/**
 * The control steel at the start: its mounting checklist before the first start, when the next reading is
 * due (with reminders, and a large overdue state), a glove keypad to log one (with ice and air where the
 * rules ask), and the log of every reading of the competition on this device, with corrections and the
 * highest sled steel temperature so far. The measuring official signs the log here; a signed reading is
 * frozen (never corrected on the device). Works offline once the competition's rules have been on screen
 * with signal.
 */
@Component({
  selector: 'rl-control-steel-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatFormFieldModule, MatInputModule, RouterLink, CheckInstrumentPicker, GloveKeypad, SignaturePadField, MountingCheck, ReminderSettings],
  templateUrl: './control-steel-page.html',
  styleUrl: './control-steel-page.scss',
})
export class ControlSteelPage {
  /** From the route `competitions/:id/start/control-steel`. */
  readonly id = input.required<string>();

  private readonly store = inject(DeviceStore);
  private readonly auth = inject(AuthStore);
  private readonly fieldDataStore = inject(FieldDataStore);
  protected readonly names = inject(OfficialNames);
  private readonly clock = inject(CONTROL_STEEL_CLOCK);
  protected readonly range = controlReadingRange;
  protected readonly iceAndAirRange = iceAndAirRange;
  protected readonly celsius = (tenths: number) => formatTenths(tenths, 'celsius');
  private readonly reminder = inject(ControlSteelReminder);

  protected readonly now = signal(this.clock());

  private readonly rules = competitionRulesResource(this.id);
  private readonly keptRules = computed(() => readKeptRules(this.id()));
  protected readonly profile = computed(() => (this.rules.hasValue() ? this.rules.value().profile : (this.keptRules()?.profile ?? null)));
  /** The rules ask for the ice and air temperature with every reading (artificial track). */
  protected readonly asksIceAndAir = computed(() => this.profile()?.controlSteel.recordIceAndAir ?? false);

  private readonly logProblem = signal<string | null>(null);
  private readonly records = toSignal(this.watch('control-reading'), { initialValue: null });
  private readonly signatureRecords = toSignal(this.watch('log-signature'), { initialValue: null });
  private readonly photoRecords = toSignal(this.watch('photo'), { initialValue: null });
  protected readonly mountingRecords = toSignal(this.watch('control-steel-mounting'), { initialValue: null });
  private readonly measurementRecords = toSignal(this.watch('measurement'), { initialValue: null });
  private readonly checkRecords = toSignal(this.watch('start-check'), { initialValue: null });
  /** The competition's first run day, from this device's copy of its field data (null when it has none). */
  protected readonly firstRunOn = toSignal(
    toObservable(this.id).pipe(
      switchMap((id) =>
        this.store.fieldData(id).pipe(
          // Without field data the first start simply begins on today's date; the official sets it anyway.
          catchError(() => of(null)),
        ),
      ),
      map((data) => data?.competition.firstRunOn ?? null),
    ),
    { initialValue: null },
  );
  /** "Highest sled steel temperature so far: …", posted with the control readings; null while the records are read. */
  protected readonly highestSteel = computed(() => {
    const measurements = this.measurementRecords();
    const checks = this.checkRecords();
    return measurements === null || checks === null ? null : highestSteelWords(highestSteelTemperature(measurements, checks));
  });
  protected readonly log = computed(() => {
    const records = this.records();
    return records === null ? null : controlLog(records);
  });
  protected readonly logError = this.logProblem.asReadonly();

  /** Readings in a signed log: shown "signed", never corrected here. */
  protected readonly signedIds = computed(() => signedReadingIds(this.signatureRecords() ?? []));
  protected readonly signatures = computed(() => logSignatures(this.signatureRecords() ?? [], this.photoRecords() ?? []));
  /** Whether the photo records have been read, so a missing signature picture is really missing. */
  protected readonly picturesKnown = computed(() => this.photoRecords() !== null);
  /** The readings a signature now would cover, and how many wait beyond it; null while the log is read. */
  protected readonly toSign = computed(() => {
    const log = this.log();
    return log === null || this.signatureRecords() === null ? null : readingsToSign(log.entries, this.signedIds(), this.auth.activeUserId());
  });
  /**
   * A signature the active official made on this device whose picture was not saved (the save failed, or
   * the app was closed in between): the next Sign saves the picture for it instead of signing again.
   */
  protected readonly pictureOwed = computed(() =>
    this.picturesKnown()
      ? (this.signatures().find((line) => !line.hasPicture && line.deviceId === this.store.deviceId && line.officialId === this.auth.activeUserId()) ?? null)
      : null,
  );
  protected readonly hasReadings = computed(() => (this.log()?.entries.length ?? 0) > 0);
  protected readonly activeUserId = this.auth.activeUserId;
  protected readonly statement = signingStatement;
  protected readonly isSigning = signal(false);
  protected readonly signProblem = signal<string | null>(null);
  protected readonly signedMessage = signal<string | null>(null);
  private readonly signaturePad = viewChild(SignaturePadField);

  protected readonly countdown = computed<CountdownPanel>(() => {
    const profile = this.profile();
    if (!profile) return this.rules.isLoading() ? { kind: 'loading' } : { kind: 'no-rules' };
    const log = this.log();
    if (!log) return { kind: 'loading' };
    try {
      const status = controlSteelStatus(profile, currentReadings(log.entries), new Date(this.now()));
      return { kind: 'ready', status, words: countdownWords(status) };
    } catch (error) {
      // A profile gap or a record with an unreadable time: say so, never count down from a guess.
      if (error instanceof RulesInputError) return { kind: 'problem', message: error.message };
      throw error;
    }
  });

  protected readonly isOverdue = computed(() => {
    const panel = this.countdown();
    return panel.kind === 'ready' && panel.status.state === 'overdue';
  });
  /** What to remind of now: the reading fell due, or is overdue; null otherwise. Changes only when that does. */
  private readonly reminderMoment = computed<ReminderMoment | null>(
    () => {
      const panel = this.countdown();
      if (panel.kind !== 'ready' || !panel.status.dueAt) return null;
      const { state, dueAt } = panel.status;
      return state === 'due-now' ? { kind: 'due', dueAt } : state === 'overdue' ? { kind: 'overdue', dueAt } : null;
    },
    { equal: (a, b) => a?.kind === b?.kind && a?.dueAt === b?.dueAt },
  );

  protected readonly instrument = signal(readKeptInstrument());
  /** This device's copy of the competition's instruments: undefined while read, null when there is none. */
  private readonly fieldData = toSignal(toObservable(this.id).pipe(switchMap((id) => this.fieldDataStore.watch(id))), { initialValue: undefined });
  protected readonly pyrometer = controlPyrometer(this.fieldData, this.auth.activeUserId, this.now);
  /** Ice and air kept for the next reading (whole tenths of °C), when the rules ask for them; kept on the device too. */
  private readonly keptWeather = linkedSignal(() => readKeptWeather(this.id(), this.clock()));
  protected readonly ice = computed(() => this.keptWeather().ice);
  protected readonly air = computed(() => this.keptWeather().air);
  /** A value whose save failed: the keypad comes back with it, so it need not be keyed again. */
  protected readonly unsavedTenths = signal<number | null>(null);
  protected readonly isSaving = signal(false);
  protected readonly entryProblem = signal<string | null>(null);
  protected readonly savedMessage = signal<string | null>(null);
  private readonly instrumentInput = viewChild<ElementRef<HTMLInputElement>>('instrumentInput');

  /** The log entry being corrected (its id), with the reason keyed so far. */
  protected readonly correcting = signal<string | null>(null);
  protected readonly reason = signal('');
  protected readonly isSavingCorrection = signal(false);
  protected readonly correctionProblem = signal<string | null>(null);
  protected readonly correctionMessage = signal<string | null>(null);
  private readonly reasonInput = viewChild<ElementRef<HTMLInputElement>>('reasonInput');

  protected readonly screenAwake = keepScreenAwake();

  /** This competition's records of one kind, kept up to date; a failed read is said in words. */
  private watch(kind: RecordKind): Observable<LocalRecord[]> {
    return toObservable(this.id).pipe(
      switchMap((id) =>
        this.store.watchRecords(id, kind).pipe(
          catchError((error: unknown) => {
            this.logProblem.set(messageOf(error));
            return of<LocalRecord[]>([]);
          }),
        ),
      ),
    );
  }

  constructor() {
    inject(LastScreen).rememberWhileShown();
    effect(() => {
      if (this.rules.hasValue()) keepRules(this.rules.value());
    });
    effect(() => {
      const moment = this.reminderMoment();
      untracked(() => this.reminder.remind(moment));
    });
    // Browsers slow or stop this timer while the screen is off or the app is hidden: see ControlSteelReminder.
    const ticking = setInterval(() => this.now.set(this.clock()), 1000);
    inject(DestroyRef).onDestroy(() => clearInterval(ticking));
  }

  protected canCorrect(entry: ControlLogEntry): boolean {
    return !entry.isCorrected && !this.signedIds().has(entry.id) && entry.officialId === this.auth.activeUserId();
  }

  /**
   * Signs the readings not yet signed (those listed on screen), then keeps the signature's picture as it
   * is, attached to the signature. When only the picture is owed, it is saved for that signature.
   */
  protected async sign(picture: Blob): Promise<void> {
    if (this.isSigning()) return;
    this.signProblem.set(null);
    this.signedMessage.set(null);
    const owed = this.pictureOwed();
    const readings = this.toSign()?.readings ?? [];
    if (!owed && readings.length === 0) {
      this.signProblem.set('There is no unsigned reading on this device to sign.');
      return;
    }
    this.isSigning.set(true);
    const count = owed?.readingCount ?? readings.length;
    let signatureId = owed?.id ?? null;
    try {
      signatureId ??= (
        await this.store.createRecord('log-signature', this.id(), 'start', {
          log: 'control-steel',
          readingIds: readings.map((reading) => reading.id),
          signedAt: new Date(this.clock()).toISOString(),
          statement: signingStatement,
        })
      ).record.id;
      await this.store.attachFileAsIs(signatureId, picture, 'signature', 'Signature under the control steel log');
      this.signaturePad()?.clear();
      this.signedMessage.set(`✓ Signed on this device ${clockTime(this.clock(), { seconds: true })}: ${readingCount(count)} in the signed log.`);
    } catch (error) {
      this.signProblem.set(
        signatureId === null
          ? `Not signed. ${messageOf(error)}`
          : `The log is signed (${readingCount(count)} frozen), but the picture of the signature was NOT saved. ${messageOf(error)} Sign again to save the picture.`,
      );
    } finally {
      this.isSigning.set(false);
    }
  }

  protected setInstrument(event: Event): void {
    const text = (event.target as HTMLInputElement).value;
    this.instrument.set(text);
    keepInstrument(text);
    this.entryProblem.set(null);
  }

  /** Ice and air, each on its own keypad, kept for the next reading. */
  protected readonly weatherPads = computed(() => [
    { what: 'ice' as const, label: 'Ice', kept: this.ice() },
    { what: 'air' as const, label: 'Air', kept: this.air() },
  ]);

  protected keepWeather(what: 'ice' | 'air', tenths: number): void {
    const weather = { ...this.keptWeather(), [what]: tenths };
    this.keptWeather.set(weather);
    keepWeather(this.id(), weather, this.clock());
    this.entryProblem.set(null);
  }

  /**
   * The instrument the reading is taken with: the chosen control steel pyrometer, or, while the competition's
   * instruments are not on this device, the label typed. Null (with the reason shown) when there is none.
   */
  private instrumentFor(tenths: number): string | null {
    const refuse = (problem: string) => {
      this.unsavedTenths.set(tenths);
      this.entryProblem.set(problem);
      return null;
    };
    if (this.pyrometer.choices() !== null) {
      const chosen = this.pyrometer.chosen();
      if (chosen === null || !this.pyrometer.mayUse(chosen.id, this.clock())) return refuse('Choose a calibrated control steel pyrometer issued to you first.');
      return chosen.id;
    }
    const problem = instrumentProblem(this.instrument());
    if (problem) {
      this.instrumentInput()?.nativeElement.focus();
      return refuse(problem);
    }
    return this.instrument().trim();
  }

  protected async saveReading(tenths: number): Promise<void> {
    if (this.isSaving()) return;
    // A tap: the moment browsers allow the reminder's beep to be prepared.
    this.reminder.prepareSound();
    this.savedMessage.set(null);
    const instrumentId = this.instrumentFor(tenths);
    if (instrumentId === null) return;
    const ice = this.asksIceAndAir() ? this.ice() : null;
    const air = this.asksIceAndAir() ? this.air() : null;
    if (this.asksIceAndAir() && (ice === null || air === null)) {
      this.unsavedTenths.set(tenths);
      const missing = ice === null && air === null ? 'the ice and the air temperature' : ice === null ? 'the ice temperature' : 'the air temperature';
      this.entryProblem.set(`Key ${missing} first and press Keep: the rules ask for ice and air with every control reading.`);
      return;
    }
    this.entryProblem.set(null);
    this.isSaving.set(true);
    try {
      await this.store.createRecord('control-reading', this.id(), 'start', {
        reading: { tenths, unit: 'celsius' },
        takenAt: new Date(this.clock()).toISOString(),
        instrumentId,
        ice: ice === null ? null : { tenths: ice, unit: 'celsius' },
        air: air === null ? null : { tenths: air, unit: 'celsius' },
      });
      this.unsavedTenths.set(null);
      this.keptWeather.set({ ice: null, air: null });
      forgetWeather(this.id());
      const weather = ice !== null && air !== null ? ` (ice ${formatTenths(ice, 'celsius')}, air ${formatTenths(air, 'celsius')})` : '';
      this.savedMessage.set(`✓ Saved on this device ${clockTime(this.clock(), { seconds: true })}: ${formatTenths(tenths, 'celsius')}${weather}.`);
    } catch (error) {
      this.unsavedTenths.set(tenths);
      this.entryProblem.set(`Not saved. ${messageOf(error)}`);
    } finally {
      this.isSaving.set(false);
    }
  }

  protected startCorrection(entry: ControlLogEntry): void {
    this.correcting.set(entry.id);
    this.reason.set('');
    this.correctionProblem.set(null);
    this.correctionMessage.set(null);
  }

  protected cancelCorrection(): void {
    this.correcting.set(null);
    this.correctionProblem.set(null);
  }

  protected setReason(event: Event): void {
    this.reason.set((event.target as HTMLInputElement).value);
    this.correctionProblem.set(null);
  }

  protected async saveCorrection(entry: ControlLogEntry, tenths: number): Promise<void> {
    if (this.isSavingCorrection()) return;
    const reason = this.reason().trim();
    if (reason === '') {
      this.correctionProblem.set('Say why the reading is corrected: the reason stays in the log for the technical delegate.');
      this.reasonInput()?.nativeElement.focus();
      return;
    }
    if (tenths === entry.reading.tenths) {
      this.correctionProblem.set(`${formatTenths(tenths, 'celsius')} is the value already logged: key the right value, or cancel.`);
      return;
    }
    this.isSavingCorrection.set(true);
    try {
      await this.store.correctRecord(entry.id, { reading: { tenths, unit: 'celsius' } }, reason);
      this.correcting.set(null);
      this.correctionMessage.set(
        `✓ Correction saved on this device ${clockTime(this.clock(), { seconds: true })}: the ${entry.timeText} reading is now ${formatTenths(tenths, 'celsius')}.`,
      );
    } catch (error) {
      this.correctionProblem.set(`Not saved. ${messageOf(error)}`);
    } finally {
      this.isSavingCorrection.set(false);
    }
  }
}

/** "1 reading", "3 readings". */
function readingCount(count: number): string {
  return `${count} ${count === 1 ? 'reading' : 'readings'}`;
}

// RecordRefusedError, StorageFullError and DeviceStoreUnavailableError already speak to the official.
function messageOf(error: unknown): string {
  return error instanceof Error && error.message ? error.message : 'Something went wrong on this device. Try again.';
}
