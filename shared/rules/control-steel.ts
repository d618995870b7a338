import { formatTenths, tenthsIn, type Measurement } from './measurement';
import { useValue, type UsedValue } from './profile-value';
import { RulesInputError } from './rules-error';
import type { RulesProfile } from './rules-profile';
import { timeOf, type TimedReading } from './temperature';
import { verdict, type Verdict, type VerdictNumber } from './verdict';

const minute = 60_000;

export type ControlSteelState = 'no-reading-yet' | 'on-time' | 'due-now' | 'overdue';

export interface ControlSteelStatus {
  state: ControlSteelState;
  /** Latest reading at or before now. */
  last: TimedReading | undefined;
  /** When the next reading is due (ISO), once there is a first one. */
  dueAt: string | undefined;
  /** Milliseconds until due; negative once it is past due. */
  msUntilDue: number | undefined;
  used: UsedValue[];
}

/**
 * When the next control steel reading is due. "Due now" lasts for the profile's grace; after that
 * steel readings are no longer judged until the control steel is read again.
 */
export function controlSteelStatus(profile: RulesProfile, readings: readonly TimedReading[], now: Date): ControlSteelStatus {
  const used: UsedValue[] = [];
  const interval = useValue(used, 'controlSteel.interval', profile.controlSteel.interval, 'minutes');
  const grace = useValue(used, 'controlSteel.grace', profile.controlSteel.grace, 'minutes');
  const nowMs = now.getTime();
  const past = readings.filter((r) => timeOf(r.takenAt, 'A control steel reading') <= nowMs);
  const last = past.reduce<TimedReading | undefined>(
    (latest, r) => (!latest || Date.parse(r.takenAt) > Date.parse(latest.takenAt) ? r : latest),
    undefined,
  );
  if (!last) return { state: 'no-reading-yet', last, dueAt: undefined, msUntilDue: undefined, used };
  const due = Date.parse(last.takenAt) + interval * minute;
  const msUntilDue = due - nowMs;
  const state: ControlSteelState = msUntilDue > 0 ? 'on-time' : -msUntilDue <= grace * minute ? 'due-now' : 'overdue';
  return { state, last, dueAt: new Date(due).toISOString(), msUntilDue, used };
}

export interface ControlSteelMounting {
  /** Height of the control steel above the ground. */
  height?: Measurement;
  length?: Measurement;
  inShade: boolean;
  awayFromDrafts?: boolean;
  mountedAt: string;
  firstStartAt: string;
}

/** The mounting checklist before the first start; which items apply comes from the profile. */
export function judgeControlSteelMounting(profile: RulesProfile, mounting: ControlSteelMounting): Verdict {
  const rules = profile.controlSteel;
  const used: UsedValue[] = [];
  const numbers: VerdictNumber[] = [];
  const problems: string[] = [];
  const cm = (tenths: number) => formatTenths(tenths, 'centimetre');

  if (rules.minHeight || rules.maxHeight) {
    const height = tenthsIn(mounting.height, 'centimetre', 'The control steel height');
    numbers.push({ label: 'Height above ground', text: cm(height) });
    if (rules.minHeight) {
      const min = useValue(used, 'controlSteel.minHeight', rules.minHeight, 'centimetre');
      if (height < min) problems.push(`mounted ${cm(height)} high, lower than ${cm(min)}`);
    }
    if (rules.maxHeight) {
      const max = useValue(used, 'controlSteel.maxHeight', rules.maxHeight, 'centimetre');
      if (height > max) problems.push(`mounted ${cm(height)} high, higher than ${cm(max)}`);
    }
  }
  if (rules.minLength) {
    const length = tenthsIn(mounting.length, 'centimetre', 'The control steel length');
    const min = useValue(used, 'controlSteel.minLength', rules.minLength, 'centimetre');
    numbers.push({ label: 'Length', text: cm(length) });
    if (length < min) problems.push(`${cm(length)} long, shorter than ${cm(min)}`);
  }
  if (rules.inShade && !mounting.inShade) problems.push('not in the shade');
  if (rules.awayFromDrafts) {
    if (mounting.awayFromDrafts === undefined) {
      throw new RulesInputError('missing-value', 'Say whether the control steel is out of drafts.');
    }
    if (!mounting.awayFromDrafts) problems.push('in a draft');
  }

  const before = useValue(used, 'controlSteel.mountedBeforeFirstStart', rules.mountedBeforeFirstStart, 'minutes');
  const mountedAt = timeOf(mounting.mountedAt, 'The mounting time');
  const firstStartAt = timeOf(mounting.firstStartAt, 'The first start');
  const lead = Math.floor((firstStartAt - mountedAt) / minute);
  numbers.push({ label: 'Mounted before the first start', text: `${lead} min` });
  if (lead < before) problems.push(`mounted ${lead} min before the first start, less than ${before} min`);

  return problems.length === 0
    ? verdict('control-steel-mounting', 'pass', 'The control steel is mounted as the profile asks.', { numbers, used })
    : verdict('control-steel-mounting', 'fail', `The control steel is ${problems.join('; ')}.`, { numbers, used });
}
