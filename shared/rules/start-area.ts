import { z } from 'zod';
import { useValue, type UsedValue } from './profile-value';
import { RulesInputError } from './rules-error';
import type { RulesProfile } from './rules-profile';
import { verdict, type Verdict } from './verdict';

export interface WaitingSledsInput {
  profile: RulesProfile;
  /** Sleds already checked and waiting to start. */
  waitingControlledSleds: number;
}

export interface PreparationInput {
  /** ISO 8601 with a time zone, e.g. "2027-01-09T10:15:00Z". */
  checkBegunAt: string;
  preparationAt: string;
}

const waitingSchema = z.number().int().min(0).safe();
const timestampSchema = z.iso.datetime({ offset: true });

/** May one more controlled sled wait in the start area? */
export function judgeWaitingSleds({ profile, waitingControlledSleds }: WaitingSledsInput): Verdict {
  const parsed = waitingSchema.safeParse(waitingControlledSleds);
  if (!parsed.success) {
    throw new RulesInputError('invalid-input', `The number of waiting sleds must be a whole number, 0 or more (got ${waitingControlledSleds}).`);
  }
  const waiting = parsed.data;
  const used: UsedValue[] = [];
  const max = useValue(used, 'startArea.maxWaitingSleds', profile.startArea.maxWaitingSleds, 'count');
  const numbers = [
    { label: 'Controlled sleds waiting', text: String(waiting) },
    { label: 'At most waiting at once', text: String(max) },
  ];
  const sleds = `${countInWords(waiting)} controlled ${waiting === 1 ? 'sled is' : 'sleds are'}`;
  if (waiting >= max) {
    const over = waiting > max ? ` (at most ${max} may wait at once)` : '';
    return verdict('start-area-waiting', 'fail', `${sleds} already waiting; check the next sled when one has started${over}`, { numbers, used });
  }
  return verdict('start-area-waiting', 'pass', `${sleds} waiting (at most ${max} at once): this sled may be checked.`, { numbers, used });
}

/** Work on the sled is allowed only before its check has begun. */
export function judgePreparation({ checkBegunAt, preparationAt }: PreparationInput): Verdict {
  const begunMs = epochMs(checkBegunAt, 'The time the check began');
  const preparationMs = epochMs(preparationAt, 'The time of the work on the sled');
  const numbers = [
    { label: 'Check began (UTC)', text: new Date(begunMs).toISOString() },
    { label: 'Work on the sled (UTC)', text: new Date(preparationMs).toISOString() },
  ];
  // The same millisecond counts as after: once the check has begun, the sled is no longer the athlete's to touch.
  if (preparationMs >= begunMs) {
    return verdict('start-area-preparation', 'fail', 'The sled was worked on after its check had begun: report it to the technical delegate.', {
      numbers,
      steps: ['Work at the same moment as the start of the check counts as after it.'],
    });
  }
  return verdict('start-area-preparation', 'pass', 'The sled was worked on before its check began.', { numbers });
}

function epochMs(timestamp: string, what: string): number {
  const parsed = timestampSchema.safeParse(timestamp);
  const ms = parsed.success ? Date.parse(parsed.data) : Number.NaN;
  if (!Number.isSafeInteger(ms)) {
    throw new RulesInputError('invalid-input', `${what} is not a valid date and time with a time zone: ${String(timestamp)}.`);
  }
  return ms;
}

const numberWords = ['No', 'One', 'Two', 'Three', 'Four', 'Five', 'Six', 'Seven', 'Eight', 'Nine', 'Ten'];
const countInWords = (count: number) => numberWords[count] ?? String(count);
