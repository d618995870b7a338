import { formatTenths, measurement, type Measurement } from '../../../../shared/rules/measurement';
import type { Discipline, RulesProfile } from '../../../../shared/rules/rules-profile';
import { judgeAthleteWithSled, judgeSledWeight } from '../../../../shared/rules/weights';
import { attempt, judged, type StepJudgement } from './step-judgement';

export type WeightReading = 'sled' | 'athlete-with-sled' | 'second-athlete';
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

export interface WeighingPlan {
  trackType: 'natural' | 'artificial';
  discipline: Discipline;
}

/** What goes on the scale, in order: natural track the sled alone; artificial the athlete(s), the first carrying the sled. */
export function weightReadingsFor({ trackType, discipline }: WeighingPlan): { reading: WeightReading; label: string }[] {
  if (trackType === 'natural') return [{ reading: 'sled', label: 'Sled weight' }];
  return discipline === 'doubles'
    ? [
        { reading: 'athlete-with-sled', label: 'First athlete carrying the sled' },
        { reading: 'second-athlete', label: 'Second athlete, without the sled' },
      ]
    : [{ reading: 'athlete-with-sled', label: 'Athlete carrying the sled' }];
}

const kg = (tenths: number): string => formatTenths(tenths, 'kilogram');

/** The weight step judged from the values saved so far. */
export function weightJudgement(
  plan: WeighingPlan & { profile: RulesProfile; officialBodyWeights: readonly Measurement[] | null },
  values: SavedWeights,
): StepJudgement {
  const pads = weightReadingsFor(plan).map((one) => ({ ...one, tenths: values[one.reading] ?? null }));
  const missing = pads.filter((pad) => pad.tenths === null);
  if (missing.length > 0) {
    const still = missing.map((pad) => pad.label.toLowerCase()).join(' and the ');
    return { kind: 'waiting', words: `No verdict yet: weigh the ${still}.` };
  }
  const readings = pads.map((pad) => measurement(pad.tenths ?? 0, 'kilogram'));
  const { profile, discipline, officialBodyWeights } = plan;
  if (plan.trackType === 'natural') return judged(attempt(() => judgeSledWeight({ profile, discipline, sled: readings[0]! })));
  if (!officialBodyWeights) {
    const recorded = pads.map((pad) => `${pad.label} ${kg(pad.tenths ?? 0)}`).join(', ');
    return { kind: 'no-verdict', words: `Recorded: ${recorded}. ${unknownBodyWeightWords}` };
  }
  return judged(attempt(() => judgeAthleteWithSled({ profile, discipline, officialBodyWeights, readings })));
}
