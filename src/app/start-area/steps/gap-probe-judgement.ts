import { judgeGapProbe, type GapProbeResult } from '../../../../shared/rules/gap-probe';
import { formatProfileValue } from '../../../../shared/rules/profile-value';
import type { RulesProfile } from '../../../../shared/rules/rules-profile';
import { attempt, judged, type StepJudgement } from './step-judgement';

export const gapProbeWaitingWords = 'No verdict yet: choose how far the feeler went into the joint.';

/** The gap probe step: waiting until a result is chosen, then the rules engine's verdict or its refusal. */
export function gapProbeJudgement(profile: RulesProfile, result: GapProbeResult | null): StepJudgement {
  if (result === null) return { kind: 'waiting', words: gapProbeWaitingWords };
  return judged(attempt(() => judgeGapProbe({ profile, probe: result })));
}

/** "0.5 mm", or null while the profile has no feeler thickness (the verdict then says why). */
export function feelerThicknessText(profile: RulesProfile): string | null {
  const feeler = profile.gapProbe?.feeler;
  return feeler && feeler.value !== null ? formatProfileValue(feeler.value, feeler.unit) : null;
}
