import { steels, type Steel } from '../../../../shared/rules/dimensions';
import { formatTenths } from '../../../../shared/rules/measurement';
import { RulesInputError } from '../../../../shared/rules/rules-error';
import type { RulesProfile } from '../../../../shared/rules/rules-profile';
import { judgeSledSteels, type SteelPosition, type TimedReading } from '../../../../shared/rules/temperature';
import type { Outcome, Verdict } from '../../../../shared/rules/verdict';

/** Places along a steel where a reading may be taken: 0 = front … 4 = rear. */
export const spotsPerSteel = 5;
/** Each steel is read at two different spots, four readings per sled. */
export const readingsPerSteel = 2;
export const readingsPerSled = readingsPerSteel * steels.length;
export const spotIndices: readonly number[] = Array.from({ length: spotsPerSteel }, (_, i) => i);

export interface Spot {
  steel: Steel;
  /** 0 = front … 4 = rear. */
  spot: number;
}
export type SpotKey = `${Steel}-${number}`;

/** For each steel, the spots (front to rear) read on it: two when the sled is complete. */
export type SpotPlan = Readonly<Record<Steel, readonly number[]>>;

/** One steel reading as the host saves it. `replacesSpot` names the spot on the same steel it takes over from. */
export interface SpotReading extends Spot {
  tenths: number;
  takenAt: string;
  replacesSpot?: number;
}

export const spotKey = ({ steel, spot }: Spot): SpotKey => `${steel}-${spot}`;
export const isSameSpot = (a: Spot | null, b: Spot | null): boolean => !!a && !!b && a.steel === b.steel && a.spot === b.spot;
const isSpotIndex = (spot: number) => Number.isInteger(spot) && spot >= 0 && spot < spotsPerSteel;
const steelName = (steel: Steel) => (steel === 'left' ? 'Left' : 'Right');

/** "Left steel, spot 2 of 5, from the front" (spots are counted from 1 on screen). */
export const spotName = ({ steel, spot }: Spot): string => `${steelName(steel)} steel, spot ${spot + 1} of ${spotsPerSteel}, from the front`;
export const shortSpotName = ({ steel, spot }: Spot): string => `${steelName(steel)} steel, spot ${spot + 1}`;
export const celsius = (tenths: number): string => formatTenths(tenths, 'celsius');

/**
 * The readings that count now, in any order of arrival: a later reading at a spot takes over from the
 * earlier one there, and a reading that names `replacesSpot` removes that spot's reading. A third spot
 * on a steel with no replacement named takes over from that steel's oldest reading, so a steel never
 * counts more than two. Sorted left then right, front to rear.
 */
export function currentReadings(readings: readonly SpotReading[]): SpotReading[] {
  const byTime = readings
    .map((reading, order) => ({ reading, order, at: Date.parse(reading.takenAt) }))
    .sort((a, b) => a.at - b.at || a.order - b.order);
  const current = new Map<SpotKey, SpotReading>();
  for (const { reading } of byTime) {
    if (reading.replacesSpot !== undefined) current.delete(spotKey({ steel: reading.steel, spot: reading.replacesSpot }));
    current.delete(spotKey(reading));
    const onSteel = [...current.values()].filter((r) => r.steel === reading.steel);
    if (onSteel.length >= readingsPerSteel) current.delete(spotKey(onSteel[0]!));
    current.set(spotKey(reading), reading);
  }
  return [...current.values()].sort(bySpot);
}

function bySpot(a: Spot, b: Spot): number {
  return steels.indexOf(a.steel) - steels.indexOf(b.steel) || a.spot - b.spot;
}

/** The spots a sled was read at, per steel, front to rear. */
export function planOf(readings: readonly SpotReading[]): SpotPlan {
  const current = currentReadings(readings);
  return { left: spotsOn(current, 'left'), right: spotsOn(current, 'right') };
}

const spotsOn = (spots: readonly Spot[], steel: Steel) => spots.filter((s) => s.steel === steel).map((s) => s.spot).sort((a, b) => a - b);

/**
 * The spots an athlete's first sled in this run was read at become the spots to read on their other
 * sleds in the run. Keeps at most two different, real spots per steel; with none, nothing is preset.
 */
export function presetPlan(firstSledPlan: SpotPlan | null): SpotPlan | null {
  if (!firstSledPlan) return null;
  const clean = (spots: readonly number[] | undefined) => [...new Set((spots ?? []).filter(isSpotIndex))].sort((a, b) => a - b).slice(0, readingsPerSteel);
  const plan: SpotPlan = { left: clean(firstSledPlan.left), right: clean(firstSledPlan.right) };
  return plan.left.length + plan.right.length === 0 ? null : plan;
}

export const isPreset = (plan: SpotPlan | null, { steel, spot }: Spot): boolean => !!plan?.[steel].includes(spot);

/** The first preset spot (left then right, front to rear) with no reading yet. */
export function nextPresetSpot(plan: SpotPlan | null, readings: readonly Spot[]): Spot | null {
  if (!plan) return null;
  for (const steel of steels) {
    for (const spot of plan[steel]) {
      if (!readings.some((r) => isSameSpot(r, { steel, spot }))) return { steel, spot };
    }
  }
  return null;
}

/**
 * On each steel the reading nearer the front is "front", the other "rear". A steel with one reading so
 * far has no position yet (null): it is only known once its second spot is read.
 */
export function positionOf(readings: readonly Spot[], spot: Spot): SteelPosition | null {
  const others = spotsOn(readings, spot.steel).filter((s) => s !== spot.spot);
  if (others.length === 0) return null;
  return `${spot.steel}-${spot.spot < others[0]! ? 'front' : 'rear'}`;
}

export type TapMeaning = { kind: 'read' } | { kind: 'ask-replace'; readSpots: number[] };

/** A tap on a spot reads it, unless its steel is already read at two other spots: then it asks which one to replace. */
export function meaningOfTap(readings: readonly Spot[], tapped: Spot): TapMeaning {
  const readSpots = spotsOn(readings, tapped.steel);
  if (readSpots.includes(tapped.spot) || readSpots.length < readingsPerSteel) return { kind: 'read' };
  return { kind: 'ask-replace', readSpots };
}

export interface JudgedSpot {
  reading: SpotReading;
  position: SteelPosition | null;
  verdict: Verdict;
}

export type SledJudgement =
  | { kind: 'judged'; outcome: Outcome; spots: JudgedSpot[] }
  /** The engine refused (a profile gap, bad input): never a pass. */
  | { kind: 'cannot-judge'; problem: string };

/** Every current reading against the latest control steel reading before it, by the rules engine. */
export function judgeSpots(profile: RulesProfile, controlReadings: readonly TimedReading[], readings: readonly SpotReading[]): SledJudgement {
  const current = currentReadings(readings);
  const positions = current.map((reading) => positionOf(current, reading));
  try {
    const { outcome, verdicts } = judgeSledSteels({
      profile,
      controlReadings,
      steels: current.map((reading, i) => ({
        reading: { tenths: reading.tenths, unit: 'celsius' },
        takenAt: reading.takenAt,
        ...(positions[i] ? { position: positions[i] } : {}),
      })),
    });
    return { kind: 'judged', outcome, spots: current.map((reading, i) => ({ reading, position: positions[i] ?? null, verdict: verdicts[i]! })) };
  } catch (error) {
    // The engine's refusals are worded for the official; anything else is a bug and must surface.
    if (error instanceof RulesInputError) return { kind: 'cannot-judge', problem: error.message };
    throw error;
  }
}

/** How many readings the sled still needs, per steel. */
export function missingReadings(readings: readonly Spot[]): Record<Steel, number> {
  return {
    left: Math.max(0, readingsPerSteel - spotsOn(readings, 'left').length),
    right: Math.max(0, readingsPerSteel - spotsOn(readings, 'right').length),
  };
}
