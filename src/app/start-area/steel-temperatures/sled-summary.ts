import { outcomeLabels } from '../../../../shared/rules/verdict';
import { outcomeMarks } from '../verdict/verdict-words';
import { missingReadings, readingsPerSled, type SledJudgement, type Spot } from './steel-spots';

export interface SledSummary {
  mark: string;
  words: string;
  /** How far the sled is read, or why it cannot be judged. */
  detail: string;
  state: 'nothing-read' | 'incomplete' | 'complete' | 'cannot-judge';
}

const readingCount = (n: number) => `${n} ${n === 1 ? 'reading' : 'readings'}`;

/**
 * The sled's steel temperatures in one line: the most serious outcome so far. A sled with readings
 * still missing never shows as within the limit, only as not complete.
 */
export function describeSled(judgement: SledJudgement | null, current: readonly Spot[]): SledSummary {
  if (!judgement) {
    return { mark: '…', words: 'No steel read yet', detail: `Each steel is read at two spots: ${readingsPerSled} readings.`, state: 'nothing-read' };
  }
  if (judgement.kind === 'cannot-judge') {
    return { mark: outcomeMarks['not-judged'], words: outcomeLabels['not-judged'], detail: judgement.problem, state: 'cannot-judge' };
  }
  const missing = missingReadings(current);
  const stillNeeded = missing.left + missing.right;
  if (stillNeeded === 0) {
    return { mark: outcomeMarks[judgement.outcome], words: outcomeLabels[judgement.outcome], detail: `All ${readingsPerSled} readings taken.`, state: 'complete' };
  }
  const where = (['left', 'right'] as const)
    .filter((steel) => missing[steel] > 0)
    .map((steel) => `${missing[steel]} on the ${steel} steel`)
    .join(' and ');
  const detail = `${readingCount(readingsPerSled - stillNeeded)} of ${readingsPerSled} taken; ${readingCount(stillNeeded)} still needed (${where}).`;
  if (judgement.outcome === 'pass') return { mark: '…', words: 'Not complete yet', detail, state: 'incomplete' };
  return { mark: outcomeMarks[judgement.outcome], words: outcomeLabels[judgement.outcome], detail, state: 'incomplete' };
}
