import { ChangeDetectionStrategy, Component, DestroyRef, ElementRef, computed, effect, inject, input, signal, viewChild } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import { catchError, of, switchMap, type Observable } from 'rxjs';
import { controlSteelStatus } from '../../../../shared/rules/control-steel';
import { formatTenths } from '../../../../shared/rules/measurement';
import { RulesInputError } from '../../../../shared/rules/rules-error';
import type { RecordKind } from '../../../../shared/sync/record-kinds';
import { AuthStore } from '../../auth/auth-store';
import type { LocalRecord } from '../../core/device-store/device-db';
import { DeviceStore } from '../../core/sync/device-store';
import { competitionRulesResource } from '../../rules/rules-api';
import { GloveKeypad } from '../../ui/glove-keypad/glove-keypad';
import { OfficialNames } from '../official-names';
import { clockTime } from './clock-time';
import { controlLog, currentReadings, type ControlLogEntry } from './control-log';
import { CONTROL_STEEL_CLOCK } from './control-steel-clock';
import { instrumentProblem, keepInstrument, keepRules, readKeptInstrument, readKeptRules } from './control-steel-memory';
import { countdownWords, type CountdownWords } from './countdown-words';
import { SignaturePadField } from './signature-pad';
import { logSignatures, readingsToSign, signedReadingIds, signingStatement } from './signed-log';
import { LastScreen } from '../last-screen';
import { keepScreenAwake } from '../screen-awake';

/** The control steel is read to 0.1 °C within this range (shade at a start area in winter). */
export const controlReadingRange = { minTenths: -400, maxTenths: 200 } as const;

type CountdownPanel =
  | { kind: 'loading' }
  | { kind: 'no-rules' }
  | { kind: 'problem'; message: string }
  | { kind: 'ready'; words: CountdownWords };

/**
 * The control steel at the start: when the next reading is due, a glove keypad to log one, and the log
 * of every reading of the competition on this device, with corrections. The measuring official signs
 * the log here; a signed reading is frozen (never corrected on the device). Works offline once the
 * competition's rules have been on screen with signal.
 */
@Component({
  selector: 'rl-control-steel-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatFormFieldModule, MatInputModule, RouterLink, GloveKeypad, SignaturePadField],
  templateUrl: './control-steel-page.html',
  styleUrl: './control-steel-page.scss',
})
export class ControlSteelPage {
  /** From the route `competitions/:id/start/control-steel`. */
  readonly id = input.required<string>();

  private readonly store = inject(DeviceStore);
  private readonly auth = inject(AuthStore);
  protected readonly names = inject(OfficialNames);
  private readonly clock = inject(CONTROL_STEEL_CLOCK);
  protected readonly range = controlReadingRange;

  protected readonly now = signal(this.clock());

  private readonly rules = competitionRulesResource(this.id);
  private readonly keptRules = computed(() => readKeptRules(this.id()));
  private readonly profile = computed(() => (this.rules.hasValue() ? this.rules.value().profile : (this.keptRules()?.profile ?? null)));

  private readonly logProblem = signal<string | null>(null);
  private readonly records = toSignal(this.watch('control-reading'), { initialValue: null });
  private readonly signatureRecords = toSignal(this.watch('log-signature'), { initialValue: null });
  private readonly photoRecords = toSignal(this.watch('photo'), { initialValue: null });
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
      return { kind: 'ready', words: countdownWords(controlSteelStatus(profile, currentReadings(log.entries), new Date(this.now()))) };
    } catch (error) {
      // A profile gap or a record with an unreadable time: say so, never count down from a guess.
      if (error instanceof RulesInputError) return { kind: 'problem', message: error.message };
      throw error;
    }
  });

  protected readonly instrument = signal(readKeptInstrument());
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

  protected async saveReading(tenths: number): Promise<void> {
    if (this.isSaving()) return;
    this.savedMessage.set(null);
    const problem = instrumentProblem(this.instrument());
    if (problem) {
      this.entryProblem.set(problem);
      this.instrumentInput()?.nativeElement.focus();
      return;
    }
    this.entryProblem.set(null);
    this.isSaving.set(true);
    try {
      await this.store.createRecord('control-reading', this.id(), 'start', {
        reading: { tenths, unit: 'celsius' },
        takenAt: new Date(this.clock()).toISOString(),
        instrumentId: this.instrument().trim(),
        ice: null,
        air: null,
      });
      this.unsavedTenths.set(null);
      this.savedMessage.set(`✓ Saved on this device ${clockTime(this.clock(), { seconds: true })}: ${formatTenths(tenths, 'celsius')}.`);
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
