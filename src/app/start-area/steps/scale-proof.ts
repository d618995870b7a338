import { measurement } from '../../../../shared/rules/measurement';
import { RulesInputError } from '../../../../shared/rules/rules-error';
import type { RulesProfile } from '../../../../shared/rules/rules-profile';
import { judgeControlWeights, judgeScaleReading } from '../../../../shared/rules/scale';
import { attempt, judged, summaryOf, worstOf, type StepJudgement, type StepSummary } from './step-judgement';

/** A calibrated control weight issued at this scale; `nominalMass` is its certified mass in tenths of a kg. */
export interface ControlWeight {
  id: string;
  label: string;
  nominalMass: number | null;
}

/** What the official did: which control weights went on the scale, and what it read in tenths of a kg. */
export interface ScaleProofEntry {
  controlWeightIds: readonly string[];
  readingTenths: number;
}

export type KnownTotal = { tenths: number } | { problem: string };

export interface ScaleProofJudgement {
  /** Are there enough control weights at the scale, each heavy enough? */
  weights: StepJudgement;
  /** The certified mass on the scale, or why it is not known. */
  known: KnownTotal;
  /** Does the scale read the known mass within its tolerance? */
  reading: StepJudgement;
}

export type ScaleProofSummary = StepSummary;

export const scaleReadingWaitingWords = 'No verdict yet: put the chosen control weights on the scale and key in what it reads.';

function unknownMassWords(labels: readonly string[]): string {
  return labels.length === 1
    ? `The certified mass of control weight ${labels[0]} is not known: its certificate must give the mass.`
    : `The certified masses of control weights ${labels.join(', ')} are not known: their certificates must give the mass.`;
}

/** The certified mass of the chosen weights together, or words saying why it cannot be known. */
export function knownTotal(weightsAtScale: readonly ControlWeight[], chosenIds: readonly string[]): KnownTotal {
  if (chosenIds.length === 0) return { problem: 'Choose the control weights you put on the scale.' };
  const byId = new Map(weightsAtScale.map((weight) => [weight.id, weight]));
  const chosen = chosenIds.map((id) => byId.get(id));
  if (chosen.some((weight) => weight === undefined)) {
    return { problem: 'A chosen control weight is not among those issued at this scale: choose the weights again.' };
  }
  const present = chosen.filter((weight): weight is ControlWeight => weight !== undefined);
  const unknown = present.filter((weight) => weight.nominalMass === null).map((weight) => weight.label);
  if (unknown.length > 0) return { problem: unknownMassWords(unknown) };
  return { tenths: present.reduce((sum, weight) => sum + (weight.nominalMass ?? 0), 0) };
}

/**
 * Proving a scale before weighing: the control weights at the scale are judged on their own, and the
 * reading with the chosen weights on it against their certified mass. A weight without a certified mass
 * is never assumed: it is a no-verdict that names it.
 */
export function scaleProofJudgement(
  profile: RulesProfile,
  weightsAtScale: readonly ControlWeight[],
  entry: ScaleProofEntry | null,
): ScaleProofJudgement {
  const weights = judged(
    attempt(() => {
      const unknown = weightsAtScale.filter((weight) => weight.nominalMass === null).map((weight) => weight.label);
      if (unknown.length > 0) throw new RulesInputError('missing-value', unknownMassWords(unknown));
      return judgeControlWeights({ profile, weights: weightsAtScale.map((weight) => measurement(weight.nominalMass ?? 0, 'kilogram')) });
    }),
  );
  if (entry === null) {
    return { weights, known: { problem: 'Choose the control weights you put on the scale.' }, reading: { kind: 'waiting', words: scaleReadingWaitingWords } };
  }
  const known = knownTotal(weightsAtScale, entry.controlWeightIds);
  const reading =
    'problem' in known
      ? judged({ problem: known.problem })
      : judged(
          attempt(() =>
            judgeScaleReading({ profile, knownWeight: measurement(known.tenths, 'kilogram'), reading: measurement(entry.readingTenths, 'kilogram') }),
          ),
        );
  return { weights, known, reading };
}

/** Where the proof stands as one word: fail beats no-verdict beats refer beats waiting; pass needs both parts to pass. */
export function scaleProofSummary(j: ScaleProofJudgement): ScaleProofSummary {
  return worstOf([summaryOf(j.weights), summaryOf(j.reading)]);
}
