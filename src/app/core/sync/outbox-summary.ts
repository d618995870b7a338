import type { RecordKind } from '../../../../shared/sync/record-kinds';
import type { DeviceDb } from '../device-store/device-db';

/** What waits in the outbox, for the sync screen. */
export interface OutboxSummary {
  /** Records with changes only on this device, per kind, in a fixed order. */
  byKind: { kind: RecordKind; records: number }[];
  /** Why the server asked some changes to wait (it misses earlier ones), with how many wait for it. */
  deferred: { reason: string; changes: number }[];
}

export const emptyOutboxSummary: OutboxSummary = { byKind: [], deferred: [] };

export async function readOutboxSummary(db: DeviceDb): Promise<OutboxSummary> {
  const entries = await db.outbox.toArray();
  const recordsByKind = new Map<RecordKind, Set<string>>();
  const deferred = new Map<string, number>();
  for (const entry of entries) {
    const kind = entry.op.recordKind as RecordKind;
    const records = recordsByKind.get(kind) ?? new Set<string>();
    records.add(entry.recordId);
    recordsByKind.set(kind, records);
    if (entry.lastAnswer) deferred.set(entry.lastAnswer.reason, (deferred.get(entry.lastAnswer.reason) ?? 0) + 1);
  }
  return {
    byKind: [...recordsByKind]
      .map(([kind, records]) => ({ kind, records: records.size }))
      .sort((a, b) => a.kind.localeCompare(b.kind)),
    deferred: [...deferred].map(([reason, changes]) => ({ reason, changes })),
  };
}
