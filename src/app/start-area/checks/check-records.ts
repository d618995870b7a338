import { recordFieldSchemas } from '../../../../shared/sync/record-kinds';
import type { LocalRecord } from '../../core/device-store/device-db';

const measurementFields = recordFieldSchemas.measurement;
const scaleProofFields = recordFieldSchemas['scale-proof'];
const checkFields = recordFieldSchemas['start-check'];

/** What a weight measurement record says it measured; its place names the reading (sled, athlete-with-sled…). */
export const weighed = 'weight';
/** What a dimension measurement record says it measured; its place is the dimension and, per steel, where. */
export const dimensioned = 'dimension';

/** One measurement that still counts: not removed and not replaced by a correction. */
export interface LiveMeasurement {
  id: string;
  place: string | null;
  tenths: number;
  instrumentId: string | null;
  takenAt: string;
}

/** Records replaced by a correction: a correction names the record it supersedes. */
export function supersededIds(records: readonly LocalRecord[]): Set<string> {
  return new Set(records.filter((r) => !r.deleted).map((r) => r.supersedes ?? r.fields['supersedes']).filter((id): id is string => typeof id === 'string'));
}

/** The measurements of one check that still count for `what`, oldest first. Records this app cannot read are left out. */
export function liveMeasurements(records: readonly LocalRecord[], checkId: string, what: string): LiveMeasurement[] {
  const superseded = supersededIds(records);
  return records
    .flatMap((record) => {
      if (record.deleted || record.kind !== 'measurement' || superseded.has(record.id)) return [];
      const parsed = measurementFields.safeParse(record.fields);
      if (!parsed.success || parsed.data.checkId !== checkId || parsed.data.what !== what) return [];
      const { place, value, instrumentId, takenAt } = parsed.data;
      return [{ id: record.id, place, tenths: value.tenths, instrumentId, takenAt }];
    })
    .sort((a, b) => a.takenAt.localeCompare(b.takenAt));
}

/** The newest value at each place, as tenths by place. */
export function valuesByPlace(measurements: readonly LiveMeasurement[]): Record<string, number> {
  return Object.fromEntries(measurements.map((m) => [m.place ?? '', m.tenths]));
}

/** The newest measurement at a place: the one measuring there again corrects. */
export const measurementAt = (measurements: readonly LiveMeasurement[], place: string | null): LiveMeasurement | null =>
  measurements.filter((m) => m.place === place).at(-1) ?? null;

export interface SavedScaleProof {
  id: string;
  run: number;
  scaleId: string;
  controlWeightIds: string[];
  knownTenths: number;
  readingTenths: number;
  takenAt: string;
  checkId: string | null;
}

/** Scale proofs that still count, oldest first. */
export function liveScaleProofs(records: readonly LocalRecord[]): SavedScaleProof[] {
  const superseded = supersededIds(records);
  return records
    .flatMap((record) => {
      if (record.deleted || record.kind !== 'scale-proof' || superseded.has(record.id)) return [];
      const parsed = scaleProofFields.safeParse(record.fields);
      if (!parsed.success) return [];
      const f = parsed.data;
      return [
        {
          id: record.id,
          run: f.run,
          scaleId: f.scaleId,
          controlWeightIds: [...f.controlWeightIds],
          knownTenths: f.knownWeight.tenths,
          readingTenths: f.reading.tenths,
          takenAt: f.takenAt,
          checkId: f.checkId,
        },
      ];
    })
    .sort((a, b) => a.takenAt.localeCompare(b.takenAt));
}

/** The parts of a start check the steps answer in the check record itself. */
export interface CheckAnswers {
  equipment: Record<string, boolean> | null;
  bibConfirmed: boolean | null;
  byEye: Record<string, boolean>;
  gapProbe: (typeof checkFields.shape.gapProbe)['_output'];
}

export function checkAnswers(record: LocalRecord): CheckAnswers {
  const parsed = checkFields.safeParse(record.fields);
  if (!parsed.success) return { equipment: null, bibConfirmed: null, byEye: {}, gapProbe: null };
  const { equipment, bibConfirmed, byEye, gapProbe } = parsed.data;
  return { equipment, bibConfirmed, byEye: byEye ?? {}, gapProbe };
}
