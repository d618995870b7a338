import { steels, type Steel } from '../../../../shared/rules/dimensions';
import type { Verdict } from '../../../../shared/rules/verdict';
import { recordFieldSchemas } from '../../../../shared/sync/record-kinds';
import type { LocalRecord } from '../../core/device-store/device-db';
import { planOf, shortSpotName, spotsPerSteel, type SledJudgement, type Spot, type SpotPlan, type SpotReading } from '../steel-temperatures/steel-spots';

/** What a steel temperature measurement record says it measured. */
export const steelTemperature = 'steel temperature';
/** The rule a steel temperature violation names. */
export const steelRule = 'Steel temperature over the limit';

const measurementFields = recordFieldSchemas.measurement;
const violationFields = recordFieldSchemas.violation;
const measuredMax = violationFields.shape.measured.maxLength ?? 200;

/** A steel reading saved as a measurement record: the record, and the instrument that took it. */
export interface SavedSteelReading {
  id: string;
  instrumentId: string | null;
  reading: SpotReading;
}

/**
 * "left:2": the steel and the spot of a reading as a measurement's place, counted from 1 at the front as
 * the screen counts them, so a stored record reads the same as the screen did.
 */
export const placeOf = ({ steel, spot }: Spot): string => `${steel}:${spot + 1}`;

export function spotOfPlace(place: string | null): Spot | null {
  const [steel, spot, ...rest] = (place ?? '').split(':');
  const index = Number(spot) - 1;
  if (rest.length > 0 || !steels.includes(steel as Steel) || spot === '' || !Number.isInteger(index) || index < 0 || index >= spotsPerSteel) return null;
  return { steel: steel as Steel, spot: index };
}

/** The fields of the measurement record for one steel reading. */
export function steelMeasurementFields(checkId: string, reading: SpotReading, instrumentId: string): Record<string, unknown> {
  return {
    checkId,
    what: steelTemperature,
    place: placeOf(reading),
    value: { tenths: reading.tenths, unit: 'celsius' },
    takenAt: reading.takenAt,
    instrumentId,
  };
}

/**
 * The steel readings of one check that still count: its steel temperature measurements, less those a
 * correction replaced and those removed. Records this app cannot read are left out.
 */
export function savedSteelReadings(records: readonly LocalRecord[], checkId: string): SavedSteelReading[] {
  const live = records.filter((record) => !record.deleted && record.kind === 'measurement');
  const corrected = new Set(live.map((record) => record.supersedes ?? record.fields['supersedes']).filter((id) => typeof id === 'string'));
  const saved: SavedSteelReading[] = [];
  for (const record of live) {
    if (corrected.has(record.id)) continue;
    const parsed = measurementFields.safeParse(record.fields);
    if (!parsed.success) continue;
    const fields = parsed.data;
    const spot = spotOfPlace(fields.place);
    if (fields.checkId !== checkId || fields.what !== steelTemperature || fields.value.unit !== 'celsius' || !spot) continue;
    saved.push({ id: record.id, instrumentId: fields.instrumentId, reading: { ...spot, tenths: fields.value.tenths, takenAt: fields.takenAt } });
  }
  return saved.sort((a, b) => a.reading.takenAt.localeCompare(b.reading.takenAt));
}

/** The newest saved reading at a spot: the one a reading taken again there corrects. */
export function savedAt(saved: readonly SavedSteelReading[], spot: Spot): SavedSteelReading | null {
  return saved.filter((s) => s.reading.steel === spot.steel && s.reading.spot === spot.spot).at(-1) ?? null;
}

/** The sled and run of a check, as far as preset spots need them. */
interface SledOfCheck {
  id: string;
  run: number;
  bib: number;
  sled: number;
}

export function sledOfCheck(record: LocalRecord): SledOfCheck {
  return { id: record.id, run: Number(record.fields['run']), bib: Number(record.fields['bib']), sled: Number(record.fields['sled'] ?? 1) };
}

/**
 * Where the athlete's first sled in this run was read, for their second or later sled; null on a first
 * sled or when the first sled has no check on this device.
 */
export function firstSledPlan(check: LocalRecord, checks: readonly LocalRecord[], measurements: readonly LocalRecord[]): SpotPlan | null {
  const sled = sledOfCheck(check);
  if (sled.sled <= 1) return null;
  const first = checks.map((record) => ({ record, sled: sledOfCheck(record) })).find(
    ({ record, sled: other }) => !record.deleted && other.id !== sled.id && other.run === sled.run && other.bib === sled.bib && other.sled === 1,
  );
  return first ? planOf(savedSteelReadings(measurements, first.sled.id).map((s) => s.reading)) : null;
}

export const samePlan = (a: SpotPlan | null, b: SpotPlan | null): boolean =>
  a === b || (!!a && !!b && steels.every((steel) => a[steel].join() === b[steel].join()));

/** One reading over the limit, with its verdict and the measurement it rests on. */
export interface FailedSpot {
  name: string;
  verdict: Verdict;
  measurement: SavedSteelReading;
}

/** What the result section needs to know about the sled's steels. */
export type SteelOutcome =
  | { kind: 'none' }
  | { kind: 'pass' }
  | { kind: 'fail'; failed: FailedSpot[] }
  /** The engine could not judge (control reading overdue or missing, a profile gap): the delegate decides. */
  | { kind: 'not-judged'; reason: string };

/** The sled's steels for the result: every reading over the limit with its record, or why none could be judged. */
export function steelOutcome(judgement: SledJudgement | null, saved: readonly SavedSteelReading[]): SteelOutcome {
  if (!judgement) return { kind: 'none' };
  if (judgement.kind === 'cannot-judge') return { kind: 'not-judged', reason: judgement.problem };
  const byReading = new Map(saved.map((s) => [s.reading, s]));
  if (judgement.outcome === 'fail') {
    const failed = judgement.spots.flatMap(({ reading, verdict }) => {
      const measurement = byReading.get(reading);
      return verdict.outcome === 'fail' && measurement ? [{ name: shortSpotName(reading), verdict, measurement }] : [];
    });
    if (failed.length > 0) return { kind: 'fail', failed };
  }
  const unsure = judgement.spots.find(({ verdict }) => verdict.outcome === 'not-judged' || verdict.outcome === 'refer-to-delegate');
  if (unsure) return { kind: 'not-judged', reason: `${shortSpotName(unsure.reading)}: ${unsure.verdict.reason}` };
  return { kind: 'pass' };
}

/** "Left steel, spot 2: steel (left, front) +0.2 °C, control steel −4.9 °C, read 5 min before, limit +0.1 °C" */
export const numbersInWords = ({ name, verdict }: FailedSpot): string =>
  `${name}: ${verdict.numbers.map((n) => `${n.label.charAt(0).toLowerCase()}${n.label.slice(1)} ${n.text}`).join(', ')}`;

/** The fields of the violation record for the readings over the limit. */
export function steelViolationFields(checkId: string, failed: readonly FailedSpot[]): Record<string, unknown> {
  return {
    checkId,
    rule: steelRule,
    measured: measuredWords(failed),
    measurementIds: failed.map((f) => f.measurement.id),
    instrumentId: failed[0]?.measurement.instrumentId ?? null,
    note: failed.map((f) => `${f.name}: ${f.verdict.reason}`).join('\n'),
    decision: 'pending',
  };
}

/** The numbers of every reading over the limit, as many as fit the record; the note keeps every reason. */
function measuredWords(failed: readonly FailedSpot[]): string {
  const parts = failed.map(numbersInWords);
  for (let shown = parts.length; shown > 0; shown--) {
    const more = parts.length - shown;
    const words = parts.slice(0, shown).join('; ') + (more === 0 ? '' : `; and ${more} more over the limit (see the note)`);
    if (words.length <= measuredMax) return words;
  }
  return `${parts.length} ${parts.length === 1 ? 'reading' : 'readings'} over the limit (see the note)`;
}

/** A violation of this check already recorded for exactly these measurements, so it is not recorded twice. */
export function isAlreadyReported(violations: readonly LocalRecord[], checkId: string, failed: readonly FailedSpot[]): boolean {
  const ids = failed.map((f) => f.measurement.id).sort().join();
  return violations.some((record) => {
    const fields = violationFields.safeParse(record.fields);
    return !record.deleted && fields.success && fields.data.checkId === checkId && fields.data.rule === steelRule && [...fields.data.measurementIds].sort().join() === ids;
  });
}

/** A violation as the check screen lists it. */
export interface ShownViolation {
  id: string;
  rule: string;
  measured: string;
  decision: 'pending' | 'upheld' | 'dismissed';
  onlyHere: boolean;
}

export function violationsOfCheck(records: readonly LocalRecord[], checkId: string): ShownViolation[] {
  return records.flatMap((record) => {
    const fields = violationFields.safeParse(record.fields);
    if (record.deleted || !fields.success || fields.data.checkId !== checkId) return [];
    const { rule, measured, decision } = fields.data;
    return [{ id: record.id, rule, measured, decision, onlyHere: record.version === null }];
  });
}

export const decisionWords: Record<ShownViolation['decision'], string> = {
  pending: '⧗ Waiting for the technical delegate',
  upheld: '⚠ Upheld by the technical delegate',
  dismissed: '✓ Dismissed by the technical delegate',
};
