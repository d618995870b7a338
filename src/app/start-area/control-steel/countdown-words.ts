import type { ControlSteelState, ControlSteelStatus } from '../../../../shared/rules/control-steel';
import { clockTime, countdownClock } from './clock-time';

/** The next-reading countdown in words and a mark, so it never rests on colour alone. */
export interface CountdownWords {
  state: ControlSteelState;
  mark: string;
  words: string;
  /** The big clock ("11:59"), or null when there is nothing to count. */
  clock: string | null;
  /** What the big clock counts: "until the next reading", "past due". */
  clockMeaning: string | null;
  advice: string;
  /** The profile values the countdown used, with their labels: "Control steel reading every: 15 min". */
  values: string[];
}

/** What the countdown panel says for a status from `controlSteelStatus`. */
export function countdownWords(status: ControlSteelStatus): CountdownWords {
  const values = status.used.map((value) => `${value.label}: ${value.text}`);
  const ms = status.msUntilDue;
  if (status.state === 'no-reading-yet' || !status.dueAt || ms === undefined || !status.last) {
    return {
      state: status.state,
      mark: '⚠',
      words: 'No control reading yet',
      clock: null,
      clockMeaning: null,
      advice: 'Read the control steel now: no steel temperature can be judged before the first control reading.',
      values,
    };
  }
  const due = clockTime(status.dueAt);
  const lastAt = clockTime(status.last.takenAt);
  // Counting down, a second that has begun still counts; counting up, only whole seconds have passed.
  const remaining = Math.ceil(ms / 1000);
  const past = Math.floor(-ms / 1000);
  switch (status.state) {
    case 'on-time':
      return {
        state: status.state,
        mark: '✓',
        words: 'On time',
        clock: countdownClock(remaining),
        clockMeaning: 'until the next reading',
        advice: `The next control reading is due at ${due}. Steel temperatures are judged against the ${lastAt} reading.`,
        values,
      };
    case 'due-now':
      return {
        state: status.state,
        mark: '⏰',
        words: 'Due now',
        clock: countdownClock(past),
        clockMeaning: 'since it was due',
        advice: `Read the control steel now: it was due at ${due}. Shortly, steel temperatures can no longer be judged against the ${lastAt} reading.`,
        values,
      };
    case 'overdue':
      return {
        state: status.state,
        mark: '⚠',
        words: 'Overdue',
        clock: countdownClock(past),
        clockMeaning: 'past due',
        advice: `Read the control steel now: it was due at ${due}. Until then, steel temperatures are not judged.`,
        values,
      };
  }
}
