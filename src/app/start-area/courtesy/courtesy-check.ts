import type { CompetitionSummary } from '../../../../shared/competition/competition';
import { formatTenths } from '../../../../shared/rules/measurement';
import { recordFieldSchemas } from '../../../../shared/sync/record-kinds';
import type { LocalRecord } from '../../core/device-store/device-db';

export type CourtesyWhat = 'steel temperature' | 'athlete with sled';

/**
 * The courtesy check a race offers athletes before the official one: a second pyrometer at natural-track
 * international races, a spare scale at artificial-track races (trade practice, no published source).
 */
export function courtesyCheckOf(competition: Pick<CompetitionSummary, 'trackType' | 'level'>): CourtesyWhat | null {
  if (competition.trackType === 'artificial') return 'athlete with sled';
  return competition.level === 'international' ? 'steel temperature' : null;
}

export const courtesyKeypads: Record<CourtesyWhat, { label: string; unit: '°C' | 'kg'; min: number; max: number; negative: boolean }> = {
  'steel temperature': { label: 'Steel temperature', unit: '°C', min: -400, max: 400, negative: true },
  'athlete with sled': { label: 'Athlete with sled', unit: 'kg', min: 10, max: 3000, negative: false },
};

export interface CourtesyLine {
  id: string;
  bib: number;
  valueText: string;
  takenAt: string;
  onlyHere: boolean;
}

/** The courtesy readings on this device, newest first (unreadable ones left out: they are not evidence). */
export function courtesyLines(records: readonly LocalRecord[]): CourtesyLine[] {
  return records
    .flatMap((record) => {
      const parsed = recordFieldSchemas['courtesy-reading'].safeParse(record.fields);
      if (!parsed.success) return [];
      const { bib, value, takenAt } = parsed.data;
      return [{ id: record.id, bib, valueText: formatTenths(value.tenths, value.unit), takenAt, onlyHere: record.version === null }];
    })
    .sort((a, b) => b.takenAt.localeCompare(a.takenAt));
}
