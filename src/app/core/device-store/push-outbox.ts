import { maxOpsPerPush, pushResponseSchema, type OpResult, type OpStatus } from '../../../../shared/sync/sync-api';
import { hasPendingOps, localFromServer, type DeviceDb, type OutboxEntry } from './device-db';
import { SyncTransportError, type SyncTransport } from './sync-transport';

export type PushSummary = Record<OpStatus | 'unanswered', number>;

export const emptyPushSummary = (): PushSummary => ({ applied: 0, duplicate: 0, rejected: 0, conflict: 0, deferred: 0, unanswered: 0 });

/**
 * Sends the outbox oldest first (by seq, so each device's ops keep their order) in batches of at most
 * 500. Only the entries in the outbox when the push starts are sent: changes made meanwhile go in the
 * next round, and ops the server defers are not sent twice in one round.
 */
export async function pushOutbox(db: DeviceDb, transport: SyncTransport, options: { now: () => number; batchSize?: number }): Promise<PushSummary> {
  const batchSize = Math.min(options.batchSize ?? maxOpsPerPush, maxOpsPerPush);
  const summary = emptyPushSummary();
  const opIds = await db.outbox.orderBy('seq').primaryKeys();
  for (let start = 0; start < opIds.length; start += batchSize) {
    const entries = (await db.outbox.bulkGet(opIds.slice(start, start + batchSize))).filter((e): e is OutboxEntry => e !== undefined);
    if (entries.length === 0) continue;
    const answer = pushResponseSchema.safeParse(await transport.push(entries.map((e) => e.op)));
    if (!answer.success) throw new SyncTransportError('refused', "The server's answer to the upload could not be read; the records stay on this device.");
    const counts = await applyPushAnswers(db, entries, answer.data.results, new Date(options.now()).toISOString());
    for (const status of Object.keys(summary) as (keyof PushSummary)[]) summary[status] += counts[status];
  }
  return summary;
}

/**
 * In one transaction: an entry leaves the outbox only when the server answered applied, duplicate,
 * rejected (its reason kept for the official) or conflict; a deferred one stays with the reason.
 * When a record has nothing left in the outbox and the server did not take all its ops as sent, the
 * device goes back to the server's copy: the server kept its value and the clash comes down as a conflict.
 */
async function applyPushAnswers(db: DeviceDb, entries: readonly OutboxEntry[], results: readonly OpResult[], at: string): Promise<PushSummary> {
  const counts = emptyPushSummary();
  const byOpId = new Map(results.flatMap((r) => (r.opId === null ? [] : [[r.opId, r] as const])));
  await db.transaction('rw', [db.outbox, db.rejections, db.records, db.serverRecords, db.conflicts], async () => {
    /** recordId → every answered op of it was applied as sent. */
    const answered = new Map<string, boolean>();
    for (const entry of entries) {
      const result = byOpId.get(entry.opId);
      if (!result) {
        counts.unanswered++;
        continue;
      }
      counts[result.status]++;
      if (result.status === 'deferred') {
        await db.outbox.update(entry.opId, { lastAnswer: { status: 'deferred', reason: result.reason, at } });
        continue;
      }
      await db.outbox.delete(entry.opId);
      if (result.status === 'rejected') {
        await db.rejections.put({ opId: entry.opId, recordId: entry.recordId, reason: result.reason, op: entry.op, rejectedAt: at, dismissed: null });
      }
      const settled = entry.op.settlement ? await db.conflicts.get(entry.op.settlement.conflictId) : undefined;
      if (settled?.localSettlement?.opId === entry.opId) await db.conflicts.put({ ...settled, localSettlement: null });
      answered.set(entry.recordId, (answered.get(entry.recordId) ?? true) && result.status === 'applied');
    }
    for (const [recordId, allApplied] of answered) {
      // Applied: the server's new version comes with the next pull; until then the device shows what it sent.
      if (allApplied || (await hasPendingOps(db, recordId))) continue;
      const server = await db.serverRecords.get(recordId);
      if (server) await db.records.put(localFromServer(server));
    }
  });
  return counts;
}
