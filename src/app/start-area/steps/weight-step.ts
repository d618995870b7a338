import { ChangeDetectionStrategy, Component, computed, input, output, signal } from '@angular/core';
import { formatTenths, type Measurement } from '../../../../shared/rules/measurement';
import type { Discipline, RulesProfile } from '../../../../shared/rules/rules-profile';
import { permittedUpperBound, type PermittedUpperBound } from '../../../../shared/rules/weights';
import { GloveKeypad } from '../../ui/glove-keypad/glove-keypad';
import { StepJudgementView } from './step-judgement-view';
import { attempt, type StepJudgement } from './step-judgement';
import { unknownBodyWeightWords, weightJudgement, weightReadingRanges, weightReadingsFor, type SavedWeights, type WeightReading } from './weight-judgement';

export interface WeighedReading {
  reading: WeightReading;
  tenths: number;
}

const kg = (tenths: number): string => formatTenths(tenths, 'kilogram');

type Bound = { kind: 'computed'; bound: PermittedUpperBound } | { kind: 'unknown' | 'refused'; words: string };

/**
 * The weight step of a start check. Natural track: the sled alone. Artificial track: the athlete
 * carrying the sled, and in doubles the second athlete without it, against the upper bound worked out
 * from the official body weights. The host saves each `weighed` and passes the saved values back in.
 */
@Component({
  selector: 'rl-weight-step',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [GloveKeypad, StepJudgementView],
  templateUrl: './weight-step.html',
  styleUrl: './weight-step.scss',
  host: { class: 'weight-step' },
})
export class WeightStep {
  readonly profile = input.required<RulesProfile>();
  /** Names this sled's keypad drafts (e.g. "check:<id>"), so a value half keyed survives the app being killed; null keeps no draft. */
  readonly draftScope = input<string | null>(null);
  readonly trackType = input.required<'natural' | 'artificial'>();
  readonly discipline = input.required<Discipline>();
  /** The athletes' official body weights when known; null when they are not on this device. */
  readonly officialBodyWeights = input<readonly Measurement[] | null>(null);
  readonly saved = input<SavedWeights>({});
  readonly weighed = output<WeighedReading>();

  /** Readings keyed here that the host may not have passed back yet. */
  private readonly entered = signal<SavedWeights>({});
  private readonly values = computed<SavedWeights>(() => ({ ...this.saved(), ...this.entered() }));
  protected readonly lastEntered = signal('');
  protected readonly kg = kg;

  protected readonly isNatural = computed(() => this.trackType() === 'natural');
  protected readonly how = computed(() =>
    this.isNatural()
      ? 'Weigh the sled on its own.'
      : this.discipline() === 'doubles'
        ? 'Weigh the first athlete carrying the sled, then the second athlete without it.'
        : 'Weigh the athlete carrying the sled.',
  );

  protected readonly keypads = computed(() => {
    const values = this.values();
    return weightReadingsFor({ trackType: this.trackType(), discipline: this.discipline() }).map((one) => ({
      ...one,
      range: weightReadingRanges[one.reading],
      tenths: values[one.reading] ?? null,
    }));
  });

  /** Artificial track only: the most the athlete(s) with the sled may weigh, shown before weighing. */
  protected readonly bound = computed<Bound | null>(() => {
    if (this.isNatural()) return null;
    const bodyWeights = this.officialBodyWeights();
    if (!bodyWeights) return { kind: 'unknown', words: unknownBodyWeightWords };
    const result = attempt(() =>
      permittedUpperBound({ profile: this.profile(), discipline: this.discipline(), officialBodyWeights: bodyWeights }),
    );
    return result.problem === undefined ? { kind: 'computed', bound: result.value } : { kind: 'refused', words: `Cannot compute the upper bound: ${result.problem}` };
  });

  protected readonly judgement = computed<StepJudgement>(() =>
    weightJudgement(
      { profile: this.profile(), trackType: this.trackType(), discipline: this.discipline(), officialBodyWeights: this.officialBodyWeights() },
      this.values(),
    ),
  );

  protected save(reading: WeightReading, label: string, tenths: number): void {
    this.entered.update((entered) => ({ ...entered, [reading]: tenths }));
    this.weighed.emit({ reading, tenths });
    this.lastEntered.set(`${label}: ${kg(tenths)} entered.`);
  }
}
