import type { UsedValue } from './profile-value';

export const outcomes = ['pass', 'fail', 'refer-to-delegate', 'not-judged'] as const;
export type Outcome = (typeof outcomes)[number];

export const outcomeLabels: Record<Outcome, string> = {
  pass: 'Within the limit',
  fail: 'Fails the check: violation to report',
  'refer-to-delegate': 'Refer to the technical delegate',
  'not-judged': 'Not judged',
};

export const checkKinds = [
  'steel-temperature',
  'control-steel-mounting',
  'sled-weight',
  'athlete-with-sled-weight',
  'finish-remeasure-weight',
  'control-weights',
  'scale-reading',
  'dimension',
  'gap-probe',
  'equipment',
  'start-area-waiting',
  'start-area-preparation',
] as const;
export type CheckKind = (typeof checkKinds)[number];

/** A number shown with a verdict, already written out for the screen and the report. */
export interface VerdictNumber {
  label: string;
  text: string;
}

export const verdictFlags = ['extra-finish-inspection'] as const;
export type VerdictFlag = (typeof verdictFlags)[number];

/**
 * What the engine concluded and why. It never decides alone: the rulebook in force and the technical
 * delegate do; the verdict carries everything they need to check it.
 */
export interface Verdict {
  check: CheckKind;
  outcome: Outcome;
  /** Plain words for an official in the start area. */
  reason: string;
  numbers: VerdictNumber[];
  /** Step-by-step working where a limit is computed. */
  steps: string[];
  /** The profile values used, with their sources. */
  used: UsedValue[];
  flags: VerdictFlag[];
}

export function verdict(
  check: CheckKind,
  outcome: Outcome,
  reason: string,
  parts: { numbers?: VerdictNumber[]; steps?: string[]; used?: UsedValue[]; flags?: VerdictFlag[] } = {},
): Verdict {
  return { check, outcome, reason, numbers: parts.numbers ?? [], steps: parts.steps ?? [], used: parts.used ?? [], flags: parts.flags ?? [] };
}

const severity: Record<Outcome, number> = { pass: 0, 'not-judged': 1, 'refer-to-delegate': 2, fail: 3 };

/** The outcome of several verdicts together: the most serious one. */
export function worstOutcome(verdicts: readonly Verdict[]): Outcome {
  return verdicts.reduce<Outcome>((worst, v) => (severity[v.outcome] > severity[worst] ? v.outcome : worst), 'pass');
}
