import { compareHybridTimes, formatHybridTime, parseHybridTime, receive, type HybridTime } from '../../../../shared/sync/hybrid-clock';
import { pullResponseSchema, type PullResponse } from '../../../../shared/sync/sync-api';
import { deviceMetaKey, hasPendingOps, localFromServer, readSyncState, syncStateKey, type DeviceDb } from './device-db';
import { SyncTransportError, type SyncTransport } from './sync-transport';

/** Pulls pages after the device's cursor until the server has no more; returns the new cursor. */
export async function pullChanges(db: DeviceDb, transport: SyncTransport, options: { now: () => number }): Promise<{ cursor: number; changes: number }> {
  let after = (await readSyncState(db)).cursor;
  let changes = 0;
  for (;;) {
    const page = pullResponseSchema.safeParse(await transport.pull(after));
    if (!page.success) throw new SyncTransportError('refused', "The server's list of changes could not be read; try again later.");
    const cursor = await applyPulledPage(db, page.data, options);
    changes += page.data.changes.length;
    if (!page.data.hasMore) return { cursor, changes };
    if (cursor <= after) throw new SyncTransportError('unavailable', 'The server sent the same changes again; the device stops here and tries later.');
    after = cursor;
  }
}

/**
 * Applies one page and moves the cursor in one transaction, so a page is either wholly applied with its
 * cursor or not at all. The cursor never goes down, a record's version never goes back, a settled
 * conflict never reopens, and a record with ops still in the outbox keeps the device's values (the
 * server's copy is kept beside it for when those ops are answered).
 */
export async function applyPulledPage(db: DeviceDb, page: PullResponse, options: { now: () => number }): Promise<number> {
  return db.transaction('rw', [db.syncState, db.serverRecords, db.records, db.conflicts, db.outbox, db.meta], async () => {
    const state = await readSyncState(db);
    // A page older than what this device has (another tab pulled further meanwhile): nothing to take.
    if (page.cursor < state.cursor) return state.cursor;
    let newest: HybridTime | null = null;
    for (const change of page.changes) {
      if (change.seq <= state.cursor) continue;
      if (change.type === 'record') {
        const record = change.record;
        const known = await db.serverRecords.get(record.id);
        if (known && known.version > record.version) continue;
        await db.serverRecords.put(record);
        if (!(await hasPendingOps(db, record.id))) await db.records.put(localFromServer(record));
        const clock = readableClock(record.hlc);
        if (clock && (!newest || compareHybridTimes(clock, newest) > 0)) newest = clock;
      } else {
        const conflict = change.conflict;
        const known = await db.conflicts.get(conflict.id);
        if (known?.status === 'settled' && conflict.status === 'open') continue;
        const mine = known?.localSettlement;
        const stillPending = mine && conflict.status === 'open' && (await db.outbox.get(mine.opId)) !== undefined;
        await db.conflicts.put({ ...conflict, localSettlement: stillPending ? mine : null });
      }
    }
    const cursor = Math.max(state.cursor, page.cursor);
    await db.syncState.put({ ...state, key: syncStateKey, cursor });
    if (newest) {
      // The device's clock moves past every change it has seen (hybrid clock receive rule).
      const meta = await db.meta.get(deviceMetaKey);
      if (meta) await db.meta.put({ ...meta, hlc: formatHybridTime(receive(parseHybridTime(meta.hlc), newest, options.now())) });
    }
    return cursor;
  });
}

function readableClock(text: string): HybridTime | null {
  try {
    return parseHybridTime(text);
  } catch {
    // A clock text this device cannot read orders nothing; the record itself is still taken.
    return null;
  }
}
