import { athletesOf, type StartListEntry } from '../../../../shared/competition/start-list';
import { RulesInputError } from '../../../../shared/rules/rules-error';
import { disciplineLabels, type RulesProfile } from '../../../../shared/rules/rules-profile';
import { judgeWaitingSleds } from '../../../../shared/rules/start-area';
import type { Verdict } from '../../../../shared/rules/verdict';
import { clockTime } from '../control-steel/clock-time';
import type { CheckRow } from './check-words';

export type QueueState = 'to-check' | 'under-way' | 'waiting' | 'started' | 'referred' | 'violation' | 'withdrawn';

/** One sled of the run: from the start list, or a check of a sled that is not on it. */
export interface QueueEntry {
  bib: number;
  /** Null for a sled that is not on the start list. */
  startOrder: number | null;
  /** "Singles women", "Doubles"; null off the list. */
  discipline: string | null;
  /** "Ann Example / Bea Example"; null off the list. */
  athletes: string | null;
  state: QueueState;
  /** This sled's check in the run (the newest, if the athlete presented more than one sled); null while none. */
  check: CheckRow | null;
}

/** Whether a new check may begin now, in the rules engine's words. */
export interface BeginRuling {
  allowed: boolean;
  reason: string;
  /** The engine's verdict; null when it could not judge (no rules on this device, or a gap in them). */
  verdict: Verdict | null;
}

export interface StartQueue {
  /** The start list in start order, then checks of sleds not on it in the order they began. */
  entries: QueueEntry[];
  /** The first sled still to check, in start order. */
  next: QueueEntry | null;
  /** Controlled sleds waiting at the start: cleared or referred, and not started. */
  waiting: number;
  mayBegin: BeginRuling;
}

export interface StartQueueInput {
  startList: readonly StartListEntry[];
  /** The checks of one run (removed ones already left out). */
  checks: readonly CheckRow[];
  /** The competition's frozen rules; null while they are not on this device, 'not-open' before the competition opens. */
  profile: RulesProfile | null | 'not-open';
}

const countThem = 'so the app cannot say how many checked sleds may wait: count them before you begin.';
const noRules = {
  'not-on-device': `The competition’s rules are not on this device yet, ${countThem}`,
  'not-open': `The competition is not open yet and its rules are not fixed, ${countThem}`,
};

export function startQueue({ startList, checks, profile }: StartQueueInput): StartQueue {
  const newestByBib = new Map<number, CheckRow>();
  for (const check of [...checks].sort((a, b) => a.beganAt.localeCompare(b.beganAt))) newestByBib.set(check.bib, check);

  const listed = [...startList].sort((a, b) => a.startOrder - b.startOrder);
  const onList = new Set(listed.map((entry) => entry.bib));
  const entries: QueueEntry[] = [
    ...listed.map((entry) => entryOf(entry.bib, newestByBib.get(entry.bib) ?? null, entry)),
    ...[...newestByBib.values()].filter((check) => !onList.has(check.bib)).map((check) => entryOf(check.bib, check, null)),
  ];

  // The engine counts "sleds already checked and waiting to start", and a start-check record says a cleared
  // sled waits until it has started. A check under way is not a controlled sled yet, so it does not count;
  // every sled checked in the run counts, on the list or not. A referred sled waits at the start for the
  // delegate and may still start (a gap probe referral does), so it counts; a violation sled is out of the queue.
  const waiting = checks.filter((check) => (check.status === 'cleared' || check.status === 'referred') && check.startedAt === null).length;
  return {
    entries,
    next: entries.find((entry) => entry.state === 'to-check') ?? null,
    waiting,
    mayBegin: rulingFor(profile, waiting),
  };
}

function entryOf(bib: number, check: CheckRow | null, listed: StartListEntry | null): QueueEntry {
  return {
    bib,
    startOrder: listed?.startOrder ?? null,
    discipline: listed ? disciplineLabels[listed.discipline] : null,
    athletes: listed ? athletesOf(listed) : null,
    state: stateOf(check),
    check,
  };
}

function stateOf(check: CheckRow | null): QueueState {
  if (check === null) return 'to-check';
  switch (check.status) {
    case 'in-progress':
      return 'under-way';
    case 'cleared':
      return check.startedAt === null ? 'waiting' : 'started';
    case 'referred':
      return check.startedAt === null ? 'referred' : 'started';
    default:
      return check.status;
  }
}

function rulingFor(profile: StartQueueInput['profile'], waiting: number): BeginRuling {
  // Not judged is not a pass: the official is told the app could not count for them, and decides.
  if (profile === null) return { allowed: true, reason: noRules['not-on-device'], verdict: null };
  if (profile === 'not-open') return { allowed: true, reason: noRules['not-open'], verdict: null };
  try {
    const verdict = judgeWaitingSleds({ profile, waitingControlledSleds: waiting });
    return { allowed: verdict.outcome === 'pass', reason: sentence(verdict.reason), verdict };
  } catch (error) {
    if (!(error instanceof RulesInputError)) throw error;
    return { allowed: true, reason: `${sentence(error.message)} Count the checked sleds waiting before you begin.`, verdict: null };
  }
}

const sentence = (words: string) => (/[.!?]$/.test(words) ? words : `${words}.`);

/** The state of a sled in words, with a mark so it never rests on colour. */
export function queueStateWords({ state, check }: Pick<QueueEntry, 'state' | 'check'>, timeOf: (iso: string) => string = clockTime): string {
  if (state === 'to-check' || check === null) return '○ To check';
  switch (state) {
    case 'under-way':
      return `… Check under way (closed to preparation since ${timeOf(check.beganAt)})`;
    case 'waiting':
      return '✓ Cleared, waiting at the start';
    case 'started':
      return check.startedAt === null ? '→ Started' : `→ Started at ${timeOf(check.startedAt)}`;
    case 'referred':
      return '⚑ Referred to the technical delegate, waiting at the start';
    case 'violation':
      return '⚠ Violation reported';
    case 'withdrawn':
      return '✕ Withdrawn';
  }
}
