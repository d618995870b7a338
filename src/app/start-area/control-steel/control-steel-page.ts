import { ChangeDetectionStrategy, Component, DestroyRef, ElementRef, computed, effect, inject, input, signal, viewChild } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import { catchError, of, switchMap } from 'rxjs';
import { controlSteelStatus } from '../../../../shared/rules/control-steel';
import { formatTenths } from '../../../../shared/rules/measurement';
import { RulesInputError } from '../../../../shared/rules/rules-error';
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
 * of every reading of the competition on this device, with corrections. Works offline once the
 * competition's rules have been on screen with signal.
 */
@Component({
  selector: 'rl-control-steel-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatFormFieldModule, MatInputModule, RouterLink, GloveKeypad],
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
  private readonly records = toSignal(
    toObservable(this.id).pipe(
      switchMap((id) =>
        this.store.watchRecords(id, 'control-reading').pipe(
          catchError((error: unknown) => {
            this.logProblem.set(messageOf(error));
            return of<LocalRecord[]>([]);
          }),
        ),
      ),
    ),
    { initialValue: null },
  );
  protected readonly log = computed(() => {
    const records = this.records();
    return records === null ? null : controlLog(records);
  });
  protected readonly logError = this.logProblem.asReadonly();

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

  constructor() {
    inject(LastScreen).rememberWhileShown();
    effect(() => {
      if (this.rules.hasValue()) keepRules(this.rules.value());
    });
    const ticking = setInterval(() => this.now.set(this.clock()), 1000);
    inject(DestroyRef).onDestroy(() => clearInterval(ticking));
  }

  protected canCorrect(entry: ControlLogEntry): boolean {
    return !entry.isCorrected && entry.officialId === this.auth.activeUserId();
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

// RecordRefusedError, StorageFullError and DeviceStoreUnavailableError already speak to the official.
function messageOf(error: unknown): string {
  return error instanceof Error && error.message ? error.message : 'Something went wrong on this device. Try again.';
}
