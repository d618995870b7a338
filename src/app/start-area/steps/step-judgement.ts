import { RulesInputError } from '../../../../shared/rules/rules-error';
import type { Verdict } from '../../../../shared/rules/verdict';

/**
 * Where one step of a start check stands: still waiting for readings, judged by the rules engine, or
 * refused by it (a bad input, a gap in the profile), which is never a pass and goes to the delegate.
 */
export type StepJudgement = { kind: 'waiting'; words: string } | { kind: 'judged'; verdict: Verdict } | { kind: 'no-verdict'; words: string };

export type Attempt<T> = { value: T; problem?: undefined } | { value?: undefined; problem: string };

/** Runs the rules engine; a refusal comes back as words, never as a pass. Any other error is a bug and is thrown. */
export function attempt<T>(run: () => T): Attempt<T> {
  try {
    return { value: run() };
  } catch (error) {
    if (error instanceof RulesInputError) return { problem: error.message };
    throw error;
  }
}

/** A verdict, or the engine's refusal as "No verdict: … Refer to the technical delegate." */
export function judged(result: Attempt<Verdict>): StepJudgement {
  return result.problem === undefined
    ? { kind: 'judged', verdict: result.value }
    : { kind: 'no-verdict', words: `No verdict: ${result.problem} Refer to the technical delegate.` };
}

/** Where a step stands in one word, for the step list and the result. */
export type StepSummary = 'waiting' | 'pass' | 'fail' | 'refer' | 'no-verdict';

/** A judgement as a summary: the engine's refer and its "not judged" (never a pass) are told apart. */
export function summaryOf(judgement: StepJudgement): StepSummary {
  if (judgement.kind !== 'judged') return judgement.kind;
  switch (judgement.verdict.outcome) {
    case 'pass':
      return 'pass';
    case 'fail':
      return 'fail';
    case 'refer-to-delegate':
      return 'refer';
    default:
      return 'no-verdict';
  }
}

/** The gravest of several summaries: a violation, then a refusal, then a referral, then readings still to take; pass only when all pass. */
export function worstOf(summaries: readonly StepSummary[]): StepSummary {
  const order: StepSummary[] = ['fail', 'no-verdict', 'refer', 'waiting'];
  return order.find((summary) => summaries.includes(summary)) ?? 'pass';
}
