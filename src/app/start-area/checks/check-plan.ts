import type { RulesProfile } from '../../../../shared/rules/rules-profile';
import type { Verdict } from '../../../../shared/rules/verdict';
import type { StepSummary } from '../steps/step-judgement';

/** The steps of a start check, in the order officials work them. */
export type CheckStepId = 'equipment' | 'scale-proof' | 'weight' | 'dimensions' | 'gap-probe' | 'steel';
export type { StepSummary };

export const stepLabels: Record<CheckStepId, string> = {
  equipment: 'Equipment and bib',
  'scale-proof': 'Prove the scale',
  weight: 'Weight',
  dimensions: 'Dimensions',
  'gap-probe': 'Gap probe',
  steel: 'Steel temperatures',
};

/** A mark and words for each state, so the step list never rests on colour. */
export const summaryWords: Record<StepSummary, { mark: string; words: string }> = {
  waiting: { mark: '◌', words: 'to do' },
  pass: { mark: '✓', words: 'within the limits' },
  fail: { mark: '⚠', words: 'fails the check' },
  refer: { mark: '⚑', words: 'for the delegate' },
  'no-verdict': { mark: '?', words: 'no verdict' },
};

/**
 * Only the steps that apply on this track, in working order. The scale is proved before the first weighing
 * of a run (a weight read on an unproved scale defends nothing), so its step shows while a proof is due or
 * when one was made in this check.
 */
export function checkSteps(profile: RulesProfile, showScaleProof: boolean): CheckStepId[] {
  const natural = profile.trackType === 'natural';
  return [
    'equipment',
    ...(showScaleProof ? (['scale-proof'] as const) : []),
    'weight',
    ...(natural && profile.dimensions.length > 0 ? (['dimensions'] as const) : []),
    ...(!natural && profile.gapProbe !== null ? (['gap-probe'] as const) : []),
    'steel',
  ];
}

/** One step as the step list and the result see it. */
export interface StepState {
  id: CheckStepId;
  label: string;
  summary: StepSummary;
  /** Why a step has no verdict or goes to the delegate, in the engine's words; null otherwise. */
  reason: string | null;
  /** The verdicts behind a failed step, for the violation record. */
  failed: Verdict[];
  /** The measurements a verdict rests on and the instrument that took them. */
  measurementIds: string[];
  instrumentId: string | null;
}

/** What the result section offers first. */
export type ResultAdvice =
  /** No step could run on this device (no rules or instruments here): the official and the delegate decide. */
  | { kind: 'unjudged' }
  | { kind: 'report'; failed: StepState[] }
  | { kind: 'refer'; unsure: StepState[] }
  | { kind: 'waiting'; left: StepState[] }
  | { kind: 'clear' };

/**
 * A failed step asks for a violation report; a step the engine could not judge or refers goes to the
 * delegate; a step still to do holds back "cleared". A failed scale proof is not the athlete's violation:
 * the scale cannot be used, so it goes to the delegate.
 */
export function resultAdvice(steps: readonly StepState[]): ResultAdvice {
  if (steps.length === 0) return { kind: 'unjudged' };
  const failed = steps.filter((step) => step.summary === 'fail' && step.id !== 'scale-proof');
  if (failed.length > 0) return { kind: 'report', failed };
  const unsure = steps.filter((step) => step.summary === 'no-verdict' || step.summary === 'refer' || step.summary === 'fail');
  if (unsure.length > 0) return { kind: 'refer', unsure };
  const left = steps.filter((step) => step.summary === 'waiting');
  return left.length > 0 ? { kind: 'waiting', left } : { kind: 'clear' };
}

/** The rule a violation of each step names. */
export const stepRules: Record<Exclude<CheckStepId, 'steel' | 'scale-proof'>, string> = {
  equipment: 'Safety equipment missing or bib not right',
  weight: 'Weight over the limit',
  dimensions: 'Sled dimension outside the limits',
  'gap-probe': 'Gap between runner and steel',
};
