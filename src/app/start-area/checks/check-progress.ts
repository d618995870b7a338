import type { Measurement } from '../../../../shared/rules/measurement';
import type { Discipline, RulesProfile } from '../../../../shared/rules/rules-profile';
import { dimensionJudgements, dimensionsSummary, type SavedDimensions } from '../steps/dimension-readings';
import { equipmentJudgement } from '../steps/equipment-judgement';
import { gapProbeJudgement } from '../steps/gap-probe-judgement';
import { scaleProofJudgement, scaleProofSummary, type ControlWeight } from '../steps/scale-proof';
import { summaryOf, type StepJudgement, type StepSummary } from '../steps/step-judgement';
import { weightJudgement } from '../steps/weight-judgement';
import { readingsPerSled } from '../steel-temperatures/steel-spots';
import type { CheckAnswers, LiveMeasurement, SavedScaleProof } from './check-records';
import { valuesByPlace } from './check-records';
import { checkSteps, stepLabels, type CheckStepId, type StepState } from './check-plan';
import type { SavedSteelReading, SteelOutcome } from './check-steel';

/** Everything the steps of one check are judged from. */
export interface ProgressInput {
  profile: RulesProfile;
  checkId: string;
  run: number;
  /** Null when the bib is not on this device's start list. */
  discipline: Discipline | null;
  officialBodyWeights: readonly Measurement[] | null;
  answers: CheckAnswers;
  weights: readonly LiveMeasurement[];
  dimensions: readonly LiveMeasurement[];
  /** Every scale proof on the device, of every run. */
  scaleProofs: readonly SavedScaleProof[];
  /** The calibrated control weights at the scale (issued to this official). */
  controlWeights: readonly ControlWeight[];
  steel: SteelOutcome;
  savedSteel: readonly SavedSteelReading[];
}

/** The newest scale proof of the run: the one that says whether the scale is proved for this run. */
export function latestProofOfRun(proofs: readonly SavedScaleProof[], run: number): SavedScaleProof | null {
  return proofs.filter((proof) => proof.run === run).at(-1) ?? null;
}

export function scaleProofState(input: Pick<ProgressInput, 'profile' | 'run' | 'checkId' | 'scaleProofs' | 'controlWeights'>) {
  const proof = latestProofOfRun(input.scaleProofs, input.run);
  const judgement = scaleProofJudgement(input.profile, input.controlWeights, proof && { controlWeightIds: proof.controlWeightIds, readingTenths: proof.readingTenths });
  const summary = scaleProofSummary(judgement);
  // Shown while the run has no proof that passed, and in the check it was made in, so it never vanishes mid-check.
  return { proof, judgement, summary, shown: summary !== 'pass' || proof?.checkId === input.checkId };
}

export function savedDimensions(dimensions: readonly LiveMeasurement[], answers: CheckAnswers): SavedDimensions {
  return { values: valuesByPlace(dimensions), byEye: answers.byEye };
}

/** Every step of the check that applies, in working order, with where it stands. */
export function stepStates(input: ProgressInput): StepState[] {
  const scale = scaleProofState(input);
  return checkSteps(input.profile, scale.shown).map((id) => stateOf(id, input, scale.summary));
}

function stateOf(id: CheckStepId, input: ProgressInput, scaleSummary: StepSummary): StepState {
  const base = { id, label: stepLabels[id], reason: null, failed: [], measurementIds: [], instrumentId: null };
  const fromJudgement = (judgement: StepJudgement, measured: readonly LiveMeasurement[] = []): StepState => ({
    ...base,
    summary: summaryOf(judgement),
    reason: reasonOf(judgement),
    failed: judgement.kind === 'judged' && judgement.verdict.outcome === 'fail' ? [judgement.verdict] : [],
    measurementIds: measured.map((m) => m.id),
    instrumentId: measured.at(-1)?.instrumentId ?? null,
  });
  const { profile, answers } = input;
  switch (id) {
    case 'equipment':
      return fromJudgement(equipmentJudgement(profile, answers));
    case 'scale-proof':
      return { ...base, summary: scaleSummary, reason: scaleSummary === 'pass' || scaleSummary === 'waiting' ? null : 'The scale is not proved for this run: weigh only on a proved scale.' };
    case 'weight':
      if (input.discipline === null) return { ...base, summary: 'no-verdict', reason: 'The bib is not on the start list on this device, so its discipline is not known.' };
      return fromJudgement(
        weightJudgement(
          { profile, trackType: profile.trackType, discipline: input.discipline, officialBodyWeights: input.officialBodyWeights },
          valuesByPlace(input.weights),
        ),
        input.weights,
      );
    case 'dimensions': {
      const judgements = dimensionJudgements(profile, savedDimensions(input.dimensions, answers));
      const failed = judgements.flatMap(({ judgement }) => (judgement.kind === 'judged' && judgement.verdict.outcome === 'fail' ? [judgement.verdict] : []));
      const unsure = judgements.find(({ judgement }) => reasonOf(judgement) !== null);
      const reason = unsure ? `${unsure.rule.label}: ${reasonOf(unsure.judgement)}` : null;
      return { ...base, summary: dimensionsSummary(judgements), reason, failed, measurementIds: input.dimensions.map((m) => m.id), instrumentId: input.dimensions.at(-1)?.instrumentId ?? null };
    }
    case 'gap-probe': {
      const state = fromJudgement(gapProbeJudgement(profile, answers.gapProbe?.result ?? null));
      return { ...state, instrumentId: answers.gapProbe?.instrumentId ?? null };
    }
    case 'steel':
      return steelState(base, input);
  }
}

function steelState(base: Omit<StepState, 'summary'>, { steel, savedSteel }: ProgressInput): StepState {
  switch (steel.kind) {
    case 'fail':
      return {
        ...base,
        summary: 'fail',
        failed: steel.failed.map((spot) => spot.verdict),
        measurementIds: steel.failed.map((spot) => spot.measurement.id),
        instrumentId: steel.failed[0]?.measurement.instrumentId ?? null,
      };
    case 'not-judged':
      return { ...base, summary: 'no-verdict', reason: steel.reason };
    case 'pass':
      return { ...base, summary: savedSteel.length >= readingsPerSled ? 'pass' : 'waiting' };
    default:
      return { ...base, summary: 'waiting' };
  }
}

/** The words behind a step the engine could not judge or refers to the delegate. */
function reasonOf(judgement: StepJudgement): string | null {
  if (judgement.kind === 'no-verdict') return judgement.words;
  if (judgement.kind === 'judged' && (judgement.verdict.outcome === 'refer-to-delegate' || judgement.verdict.outcome === 'not-judged')) return judgement.verdict.reason;
  return null;
}
