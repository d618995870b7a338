import type { LocalRecord } from '../device-db';

/**
 * A record as the device holds it, for specs of the screens that read records: the start area of a test
 * competition, made by 'official-one' on 'device-1', not yet confirmed by the server unless `more` says so.
 */
export function localRecord(kind: LocalRecord['kind'], id: string, fields: Record<string, unknown>, more: Partial<LocalRecord> = {}): LocalRecord {
  return {
    id,
    kind,
    competitionId: '0190a7e2-0000-7000-8000-000000000001',
    area: 'start',
    fields: fields as LocalRecord['fields'],
    createdBy: 'official-one',
    deviceId: 'device-1',
    hlc: '',
    deleted: false,
    version: null,
    supersedes: typeof fields['supersedes'] === 'string' ? fields['supersedes'] : null,
    lastLocalChange: null,
    ...more,
  };
}
