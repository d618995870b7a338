import { formatTenths } from '../../../../shared/rules/measurement';
import { recordFieldSchemas } from '../../../../shared/sync/record-kinds';
import type { LocalRecord } from '../../core/device-store/device-db';
import { steelTemperature } from '../checks/check-steel';
import { clockTime } from './clock-time';

const measurementFields = recordFieldSchemas.measurement;

/** The warmest sled steel read so far in a competition, and whose sled it was. */
export interface HighestSteel {
  tenths: number;
  /** The bib of the start check the reading belongs to; null when that check is not on this device. */
  bib: number | null;
  takenAt: string;
  measurementId: string;
}

/**
 * The highest sled steel temperature among a competition's live steel temperature measurements (none a
 * correction replaced, none removed), joined to its start check for the bib. Readings of a removed check
 * do not count. On a tie the earlier reading is the one named: it reached that value first.
 */
export function highestSteelTemperature(measurements: readonly LocalRecord[], checks: readonly LocalRecord[]): HighestSteel | null {
  const live = measurements.filter((record) => !record.deleted && record.kind === 'measurement');
  const corrected = new Set(live.map((record) => record.supersedes ?? record.fields['supersedes']).filter((id) => typeof id === 'string'));
  const checkById = new Map(checks.filter((check) => check.kind === 'start-check').map((check) => [check.id, check]));
  let highest: HighestSteel | null = null;
  for (const record of live) {
    if (corrected.has(record.id)) continue;
    const parsed = measurementFields.safeParse(record.fields);
    if (!parsed.success) continue;
    const { what, value, takenAt, checkId } = parsed.data;
    if (what !== steelTemperature || value.unit !== 'celsius') continue;
    const check = checkById.get(checkId);
    if (check?.deleted) continue;
    const isHigher = highest === null || value.tenths > highest.tenths || (value.tenths === highest.tenths && Date.parse(takenAt) < Date.parse(highest.takenAt));
    if (isHigher) highest = { tenths: value.tenths, bib: bibOf(check), takenAt, measurementId: record.id };
  }
  return highest;
}

function bibOf(check: LocalRecord | undefined): number | null {
  const bib = check?.fields['bib'];
  return typeof bib === 'number' && Number.isInteger(bib) ? bib : null;
}

/** "Highest sled steel temperature so far: +0.4 °C (bib 12, 09:14)", as posted in the start area. */
export function highestSteelWords(highest: HighestSteel | null): string {
  if (!highest) return 'Highest sled steel temperature so far: no sled steel read yet.';
  const bib = highest.bib === null ? 'bib not on this device' : `bib ${highest.bib}`;
  return `Highest sled steel temperature so far: ${formatTenths(highest.tenths, 'celsius')} (${bib}, ${clockTime(highest.takenAt)})`;
}
