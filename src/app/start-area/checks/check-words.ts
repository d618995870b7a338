import type { LocalRecord } from '../../core/device-store/device-db';

export type CheckStatus = 'in-progress' | 'cleared' | 'referred' | 'violation' | 'withdrawn';

/** The result of a check in words, with a mark so it never rests on colour. */
export const checkStatusWords: Record<CheckStatus, string> = {
  'in-progress': '… Check under way',
  cleared: '✓ Cleared to start',
  referred: '⚑ Referred to the technical delegate',
  violation: '⚠ Violation reported',
  withdrawn: '✕ Withdrawn',
};

export interface CheckRow {
  id: string;
  run: number;
  bib: number;
  /** Which of the athlete's sleds (most present one). */
  sled: number;
  status: CheckStatus;
  beganAt: string;
  /** When the sled left the start; null while it has not. */
  startedAt: string | null;
  note: string;
  /** The server has not confirmed this check's latest change yet. */
  onlyHere: boolean;
}

export function checkRowOf(record: LocalRecord): CheckRow {
  const f = record.fields;
  return {
    id: record.id,
    run: Number(f['run']),
    bib: Number(f['bib']),
    sled: typeof f['sled'] === 'number' ? f['sled'] : 1,
    status: f['status'] as CheckStatus,
    beganAt: String(f['beganAt']),
    startedAt: typeof f['startedAt'] === 'string' ? f['startedAt'] : null,
    note: typeof f['note'] === 'string' ? f['note'] : '',
    onlyHere: record.version === null,
  };
}

/** Checks newest first; removed ones are left out. */
export function checkRows(records: readonly LocalRecord[]): CheckRow[] {
  return records
    .filter((record) => !record.deleted)
    .map(checkRowOf)
    .sort((a, b) => b.beganAt.localeCompare(a.beganAt));
}
