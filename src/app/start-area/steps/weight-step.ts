import { ChangeDetectionStrategy, Component, computed, input, output, signal } from '@angular/core';
import { formatTenths, measurement, type Measurement } from '../../../../shared/rules/measurement';
import type { Discipline, RulesProfile } from '../../../../shared/rules/rules-profile';
import { judgeAthleteWithSled, judgeSledWeight, permittedUpperBound, type PermittedUpperBound } from '../../../../shared/rules/weights';
import { GloveKeypad } from '../../ui/glove-keypad/glove-keypad';
import { VerdictCard } from '../verdict/verdict-card';
import { decidesLine } from '../verdict/verdict-words';
import { attempt, judged, type StepJudgement } from './step-judgement';

export type WeightReading = 'sled' | 'athlete-with-sled' | 'second-athlete';
export interface WeighedReading {
  reading: WeightReading;
  tenths: number;
}
/** Tenths of a kg already saved, per reading. */
export type SavedWeights = Partial<Record<WeightReading, number>>;

export const unknownBodyWeightWords =
  'The official body weight is not on this device, so the upper bound cannot be computed: refer to the technical delegate.';

/** The keypad takes weights in these ranges: a plausibility check of ours against mistyping, not a rule value. */
export const weightReadingRanges: Record<WeightReading, { minTenths: number; maxTenths: number }> = {
  sled: { minTenths: 1, maxTenths: 1000 },
  'athlete-with-sled': { minTenths: 1, maxTenths: 3000 },
  'second-athlete': { minTenths: 1, maxTenths: 3000 },
};

const kg = (tenths: number): string => formatTenths(tenths, 'kilogram');
const kgTenths = (tenths: number): Measurement => measurement(tenths, 'kilogram');

type Bound = { kind: 'computed'; bound: PermittedUpperBound } | { kind: 'unknown' | 'refused'; words: string };

/**
 * The weight step of a start check. Natural track: the sled alone. Artificial track: the athlete
 * carrying the sled, and in doubles the second athlete without it, against the upper bound worked out
 * from the official body weights. The host saves each `weighed` and passes the saved values back in.
 */
@Component({
  selector: 'rl-weight-step',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [GloveKeypad, VerdictCard],
  templateUrl: './weight-step.html',
  styleUrl: './weight-step.scss',
  host: { class: 'weight-step' },
})
export class WeightStep {
  readonly profile = input.required<RulesProfile>();
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
  protected readonly decidesLine = decidesLine;
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
    const isDoubles = this.discipline() === 'doubles';
    const readings: { reading: WeightReading; label: string }[] = this.isNatural()
      ? [{ reading: 'sled', label: 'Sled weight' }]
      : isDoubles
        ? [
            { reading: 'athlete-with-sled', label: 'First athlete carrying the sled' },
            { reading: 'second-athlete', label: 'Second athlete, without the sled' },
          ]
        : [{ reading: 'athlete-with-sled', label: 'Athlete carrying the sled' }];
    const values = this.values();
    return readings.map((one) => ({ ...one, range: weightReadingRanges[one.reading], tenths: values[one.reading] ?? null }));
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

  protected readonly judgement = computed<StepJudgement>(() => {
    const keypads = this.keypads();
    const missing = keypads.filter((pad) => pad.tenths === null);
    if (missing.length > 0) {
      const still = missing.map((pad) => pad.label.toLowerCase()).join(' and the ');
      return { kind: 'waiting', words: `No verdict yet: weigh the ${still}.` };
    }
    const readings = keypads.map((pad) => kgTenths(pad.tenths ?? 0));
    const profile = this.profile();
    const discipline = this.discipline();
    if (this.isNatural()) return judged(attempt(() => judgeSledWeight({ profile, discipline, sled: readings[0]! })));
    const bodyWeights = this.officialBodyWeights();
    if (!bodyWeights) {
      const recorded = keypads.map((pad) => `${pad.label} ${kg(pad.tenths ?? 0)}`).join(', ');
      return { kind: 'no-verdict', words: `Recorded: ${recorded}. ${unknownBodyWeightWords}` };
    }
    return judged(attempt(() => judgeAthleteWithSled({ profile, discipline, officialBodyWeights: bodyWeights, readings })));
  });

  protected save(reading: WeightReading, label: string, tenths: number): void {
    this.entered.update((entered) => ({ ...entered, [reading]: tenths }));
    this.weighed.emit({ reading, tenths });
    this.lastEntered.set(`${label}: ${kg(tenths)} entered.`);
  }
}
