import { z } from 'zod';
import { formatTenths, measurementSchema, tenthsIn, type Measurement } from './measurement';
import { useValue, type UsedValue } from './profile-value';
import { RulesInputError } from './rules-error';
import type { RulesProfile } from './rules-profile';
import { verdict, worstOutcome, type Outcome, type Verdict } from './verdict';

export const timedReadingSchema = z.strictObject({
  reading: measurementSchema,
  takenAt: z.iso.datetime({ offset: true }),
});
export type TimedReading = z.infer<typeof timedReadingSchema>;

export const steelPositions = ['left-front', 'left-rear', 'right-front', 'right-rear'] as const;
export type SteelPosition = (typeof steelPositions)[number];

const minute = 60_000;
const temp = (tenths: number) => formatTenths(tenths, 'celsius');

export function timeOf(takenAt: string, what: string): number {
  const ms = Date.parse(takenAt);
  if (Number.isNaN(ms)) throw new RulesInputError('invalid-input', `${what} has no valid time ("${takenAt}").`);
  return ms;
}

/** limit = max(control + margin, floor): one formula for both track types, values from the profile. */
export function steelTemperatureLimit(profile: RulesProfile, control: Measurement, used: UsedValue[] = []): { limit: number; steps: string[] } {
  const controlTenths = tenthsIn(control, 'celsius', 'The control steel reading');
  const margin = useValue(used, 'temperature.margin', profile.temperature.margin, 'celsius');
  const floor = useValue(used, 'temperature.floor', profile.temperature.floor, 'celsius');
  const raised = controlTenths + margin;
  const limit = Math.max(raised, floor);
  const steps = [`Control ${temp(controlTenths)} + ${formatTenths(margin, 'celsius', { signed: false })} = ${temp(raised)}`];
  steps.push(
    raised < floor
      ? `That is below the floor of ${temp(floor)} for ${profile.trackType} track, so the limit is ${temp(limit)}`
      : `Not below the floor of ${temp(floor)}, so the limit is ${temp(limit)}`,
  );
  return { limit, steps };
}

/** The latest control reading taken at or before the given time, if any. */
export function latestControlBefore(controlReadings: readonly TimedReading[], at: number): TimedReading | undefined {
  let latest: TimedReading | undefined;
  for (const reading of controlReadings) {
    const takenAt = timeOf(reading.takenAt, 'A control steel reading');
    if (takenAt <= at && (!latest || takenAt > timeOf(latest.takenAt, 'A control steel reading'))) latest = reading;
  }
  return latest;
}

export interface SteelTemperatureInput {
  profile: RulesProfile;
  steel: TimedReading & { position?: SteelPosition };
  /** Every control steel reading of the competition so far. */
  controlReadings: readonly TimedReading[] | undefined;
}

/**
 * One steel reading against the latest control reading taken before it. A control reading older than
 * the interval plus grace gives "not judged", never a pass on a stale value.
 */
export function judgeSteelTemperature({ profile, steel, controlReadings }: SteelTemperatureInput): Verdict {
  if (!controlReadings) {
    throw new RulesInputError('missing-control-reading', 'The control steel readings are missing: a steel temperature is only judged against the control steel.');
  }
  const steelTenths = tenthsIn(steel.reading, 'celsius', 'The steel reading');
  const steelAt = timeOf(steel.takenAt, 'The steel reading');
  const where = steel.position ? ` (${steel.position.replace('-', ', ')})` : '';
  const numbers = [{ label: `Steel${where}`, text: temp(steelTenths) }];
  const used: UsedValue[] = [];

  const control = latestControlBefore(controlReadings, steelAt);
  if (!control) {
    return verdict('steel-temperature', 'not-judged', 'No control steel reading was taken before this steel reading. Read the control steel first, then judge again.', { numbers });
  }
  const controlTenths = tenthsIn(control.reading, 'celsius', 'The control steel reading');
  const ageMinutes = Math.floor((steelAt - timeOf(control.takenAt, 'The control steel reading')) / minute);
  numbers.push({ label: 'Control steel', text: `${temp(controlTenths)}, read ${ageMinutes} min before` });

  const interval = useValue(used, 'controlSteel.interval', profile.controlSteel.interval, 'minutes');
  const grace = useValue(used, 'controlSteel.grace', profile.controlSteel.grace, 'minutes');
  if (steelAt - timeOf(control.takenAt, 'The control steel reading') > (interval + grace) * minute) {
    return verdict(
      'steel-temperature',
      'not-judged',
      `Control reading overdue: the latest was read ${ageMinutes} min before this steel reading, and one is due every ${interval} min (${grace} min grace). Read the control steel, then judge again.`,
      { numbers, used },
    );
  }

  const { limit, steps } = steelTemperatureLimit(profile, control.reading, used);
  numbers.push({ label: 'Limit', text: temp(limit) });
  const over = steelTenths - limit;
  const outcome: Outcome = over > 0 ? 'fail' : 'pass';
  const reason =
    outcome === 'pass'
      ? `Steel ${temp(steelTenths)} is within the limit of ${temp(limit)}.`
      : `Steel ${temp(steelTenths)} is ${formatTenths(over, 'celsius', { signed: false })} over the limit of ${temp(limit)}.`;
  return verdict('steel-temperature', outcome, reason, { numbers, steps, used });
}

/** All steel readings of one sled (two per steel): each judged, and the most serious outcome overall. */
export function judgeSledSteels(input: Omit<SteelTemperatureInput, 'steel'> & { steels: SteelTemperatureInput['steel'][] }): {
  outcome: Outcome;
  verdicts: Verdict[];
} {
  if (input.steels.length === 0) {
    throw new RulesInputError('missing-value', 'No steel readings were entered for this sled.');
  }
  const verdicts = input.steels.map((steel) => judgeSteelTemperature({ profile: input.profile, steel, controlReadings: input.controlReadings }));
  return { outcome: worstOutcome(verdicts), verdicts };
}
