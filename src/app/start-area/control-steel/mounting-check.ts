import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import type { RulesProfile } from '../../../../shared/rules/rules-profile';
import type { LocalRecord } from '../../core/device-store/device-db';
import { DeviceStore } from '../../core/sync/device-store';
import { AnswerPair } from '../../ui/answer-pair/answer-pair';
import { GloveKeypad } from '../../ui/glove-keypad/glove-keypad';
import { OfficialNames } from '../official-names';
import type { StepJudgement } from '../steps/step-judgement';
import { VerdictCard } from '../verdict/verdict-card';
import { decidesLine, outcomeMarks } from '../verdict/verdict-words';
import { clockTime } from './clock-time';
import { CONTROL_STEEL_CLOCK } from './control-steel-clock';
import {
  firstStartSeed,
  formOf,
  freshMountingForm,
  judgeMounting,
  latestMounting,
  mountingAsks,
  mountingFields,
  mountingInput,
  mountingItems,
  mountingRanges,
  recheckReason,
  unansweredItems,
  type MountingForm,
} from './mounting-checklist';
import { TimeStepper } from './time-stepper';

/** The one line the screen shows once a mounting is saved. */
interface MountingSummary {
  mark: string;
  /** 'pass', 'fail', … or 'no-verdict' / 'no-rules'; for styling and specs, never the only signal. */
  state: string;
  words: string;
  who: string;
  isOnlyOnDevice: boolean;
}

/**
 * The control steel mounting checklist before the first start: only the items the competition's rules ask
 * for, judged by the rules engine as the official answers, saved as a `control-steel-mounting` record.
 * Once saved it shrinks to one line with its verdict mark; checking it again saves a correction of it.
 */
@Component({
  selector: 'rl-mounting-check',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, AnswerPair, GloveKeypad, TimeStepper, VerdictCard],
  templateUrl: './mounting-check.html',
  styleUrl: './mounting-check.scss',
})
export class MountingCheck {
  readonly competitionId = input.required<string>();
  /** The competition's rules; null while they are not on this device. */
  readonly profile = input.required<RulesProfile | null>();
  /** The competition's mounting records; null while they are read. */
  readonly records = input.required<readonly LocalRecord[] | null>();
  /** The competition's first run day ("2027-01-14"), when this device has it. */
  readonly firstRunOn = input<string | null>(null);
  /** The time now (the host's ticking clock), for "now" and the day words. */
  readonly now = input.required<number>();

  private readonly store = inject(DeviceStore);
  private readonly clock = inject(CONTROL_STEEL_CLOCK);
  protected readonly names = inject(OfficialNames);
  protected readonly ranges = mountingRanges;
  protected readonly decidesLine = decidesLine;

  protected readonly saved = computed(() => {
    const records = this.records();
    return records === null ? null : latestMounting(records);
  });
  private readonly latest = computed(() => this.saved()?.latest ?? null);
  protected readonly items = computed(() => {
    const profile = this.profile();
    return profile ? mountingItems(profile) : null;
  });
  protected readonly asks = computed(() => {
    const profile = this.profile();
    return profile ? mountingAsks(profile) : [];
  });

  protected readonly isRechecking = signal(false);
  /** The record just created, until the device's records show it (so a second press cannot save a second one). */
  private readonly createdId = signal<string | null>(null);
  protected readonly showsForm = computed(() => this.isRechecking() || (this.latest() === null && this.createdId() === null));
  protected readonly form = signal<MountingForm>(freshMountingForm(this.clock()));

  private readonly mounting = computed(() => {
    const items = this.items();
    return items ? mountingInput(items, this.form()) : null;
  });
  protected readonly judgement = computed<StepJudgement | null>(() => {
    const profile = this.profile();
    const items = this.items();
    if (!profile || !items) return null;
    const mounting = this.mounting();
    if (!mounting) return { kind: 'waiting', words: `Still to answer: ${unansweredItems(items, this.form()).join(', ')}.` };
    return judgeMounting(profile, mounting);
  });

  protected readonly summary = computed<MountingSummary | null>(() => {
    const latest = this.latest();
    if (!latest) return null;
    const profile = this.profile();
    const judgement = profile ? judgeMounting(profile, latest.mounting) : null;
    const what = `Mounted ${clockTime(latest.mounting.mountedAt)} for the first start at ${clockTime(latest.mounting.firstStartAt)}`;
    const base = { who: this.names.nameOf(latest.createdBy), isOnlyOnDevice: latest.isOnlyOnDevice };
    if (!judgement) return { ...base, mark: '◌', state: 'no-rules', words: `${what}. No verdict until the rules are on this device.` };
    if (judgement.kind === 'judged') {
      return { ...base, mark: outcomeMarks[judgement.verdict.outcome], state: judgement.verdict.outcome, words: `${what}: ${judgement.verdict.reason}` };
    }
    return { ...base, mark: '?', state: 'no-verdict', words: `${what}. ${judgement.kind === 'no-verdict' ? judgement.words : ''}`.trim() };
  });

  protected readonly isSaving = signal(false);
  protected readonly problem = signal<string | null>(null);
  protected readonly savedMessage = signal<string | null>(null);

  protected setHeight(tenths: number): void {
    this.change({ heightTenths: tenths });
  }

  protected setLength(tenths: number): void {
    this.change({ lengthTenths: tenths });
  }

  protected setInShade(answer: boolean): void {
    this.change({ inShade: answer });
  }

  protected setAwayFromDrafts(answer: boolean): void {
    this.change({ awayFromDrafts: answer });
  }

  protected setMountedAt(at: number): void {
    this.change({ mountedAt: at });
  }

  protected setFirstStartAt(at: number): void {
    this.change({ firstStartAt: at });
  }

  protected enterFirstStart(): void {
    this.change({ firstStartAt: firstStartSeed(this.clock(), this.firstRunOn()) });
  }

  protected recheck(): void {
    const latest = this.latest();
    this.form.set(latest ? formOf(latest.mounting) : freshMountingForm(this.clock()));
    this.problem.set(null);
    this.savedMessage.set(null);
    this.isRechecking.set(true);
  }

  protected cancelRecheck(): void {
    this.isRechecking.set(false);
    this.problem.set(null);
  }

  /** Saves the checklist: the first one as a new record, a re-check as a correction of the one that counts. */
  protected async save(): Promise<void> {
    if (this.isSaving()) return;
    this.savedMessage.set(null);
    const items = this.items();
    const mounting = this.mounting();
    if (!items || !mounting) {
      this.problem.set(items ? `Answer ${unansweredItems(items, this.form()).join(', ')} first.` : 'The rules are not on this device yet.');
      return;
    }
    this.problem.set(null);
    this.isSaving.set(true);
    // A second save is always a correction of the mounting that counts, never a second first one.
    const latest = this.latest();
    try {
      if (latest) {
        await this.store.correctRecord(latest.id, mountingFields(mounting), recheckReason(latest.mounting, mounting, this.clock()));
      } else {
        const { record } = await this.store.createRecord('control-steel-mounting', this.competitionId(), 'start', mountingFields(mounting));
        this.createdId.set(record.id);
      }
      this.isRechecking.set(false);
      this.savedMessage.set(`✓ Mounting saved on this device ${clockTime(this.clock(), { seconds: true })}.`);
    } catch (error) {
      // RecordRefusedError, StorageFullError and DeviceStoreUnavailableError already speak to the official.
      this.problem.set(`Not saved. ${error instanceof Error && error.message ? error.message : 'Something went wrong on this device. Try again.'}`);
    } finally {
      this.isSaving.set(false);
    }
  }

  private change(part: Partial<MountingForm>): void {
    this.form.update((form) => ({ ...form, ...part }));
    this.problem.set(null);
  }
}
