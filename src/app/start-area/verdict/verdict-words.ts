import { sourceKindLabels, type UsedValue } from '../../../../shared/rules/profile-value';
import { outcomeLabels, type Outcome } from '../../../../shared/rules/verdict';

/** A mark beside the words of every outcome, so no outcome rests on colour. */
export const outcomeMarks: Record<Outcome, string> = {
  pass: '✓',
  fail: '⚠',
  'refer-to-delegate': '⚑',
  'not-judged': '?',
};

/** "✓ Within the limit" */
export const outcomeWords = (outcome: Outcome): string => `${outcomeMarks[outcome]} ${outcomeLabels[outcome]}`;

/** Where a profile value comes from, worded as on the rules page: "trade practice, no published source · verified". */
export function usedValueSource({ source }: UsedValue): string {
  const kind = source.note ? `${sourceKindLabels[source.kind]}: ${source.note}` : sourceKindLabels[source.kind];
  return `${kind} · ${source.verified ? 'verified' : 'not verified'}`;
}

export const decidesLine = 'The rulebook in force and the technical delegate decide.';
