// First: Dexie reads the global indexedDB once when it loads, and liveQuery stays silent without it.
// Each test database still gets its own fake factory (testing/test-device.ts).
import 'fake-indexeddb/auto';
import { afterEach, describe, expect, it } from 'vitest';
import type { PullResponse, SyncRecord } from '../../../../shared/sync/sync-api';
import { readSyncState, type DeviceDb, type LocalRecord } from './device-db';
import { applyPulledPage, pullChanges } from './pull-changes';
import { pushOutbox } from './push-outbox';
import { dismissRejection, readRejections } from './rejections';
import { createRecordWriter } from './record-writer';
import { FakeSyncServer } from './testing/fake-sync-server';
import { competitionId, leader, measurement, official, openTestDevice, otherOfficial, startCheck } from './testing/test-device';

const now = () => Date.parse('2027-01-14T10:00:00Z');
const opts = { now };

describe('push', () => {
  const open: DeviceDb[] = [];
  afterEach(() => open.splice(0).forEach((db) => db.close()));
  async function device() {
    const db = await openTestDevice();
    open.push(db);
    return { db, writer: createRecordWriter({ db, now }) };
  }

  // server/sync/SPEC.md §3, §4
  it('when 501 ops wait, then they go oldest first in batches of at most 500 and every applied entry leaves the outbox', async () => {
    const { db, writer } = await device();
    const server = new FakeSyncServer();
    for (let bib = 1; bib <= 501; bib++) await writer.createRecord('start-check', competitionId, 'start', startCheck(bib), official);

    const summary = await pushOutbox(db, server.transport(), opts);

    expect(server.batchSizes).toEqual([500, 1]);
    expect(server.received.map((op) => op.seq)).toEqual(Array.from({ length: 501 }, (_, i) => i + 1));
    expect(summary.applied).toBe(501);
    expect(await db.outbox.count()).toBe(0);
  });

  // server/sync/SPEC.md §4
  it('when the server defers an op (an earlier one is missing), then it stays queued with the reason, and goes once the gap is filled', async () => {
    const { db, writer } = await device();
    const server = new FakeSyncServer();
    const first = await writer.createRecord('start-check', competitionId, 'start', startCheck(1), official);
    await writer.createRecord('start-check', competitionId, 'start', startCheck(2), official);
    await db.outbox.delete(first.op!.opId); // the entry of seq 1 is gone from this device's outbox

    const summary = await pushOutbox(db, server.transport(), opts);
    expect(summary.deferred).toBe(1);
    const waiting = await db.outbox.toArray();
    expect(waiting.map((e) => e.seq)).toEqual([2]);
    expect(waiting[0]?.lastAnswer?.reason).toMatch(/Waiting for number 1/);

    server.push([first.op!]); // seq 1 reaches the server another way (a backup uploaded at the hut)
    expect((await pushOutbox(db, server.transport(), opts)).applied).toBe(1);
    expect(await db.outbox.count()).toBe(0);
  });

  // server/sync/SPEC.md §4, §6
  it('when the server rejects an op, then it leaves the outbox and its reason and values are kept for the official', async () => {
    const { db, writer } = await device();
    const server = new FakeSyncServer();
    server.refuse = (op) => (op.fields['bib'] === 13 ? 'Anna no longer holds an official role at the start.' : null);
    await writer.createRecord('start-check', competitionId, 'start', startCheck(12), official);
    const refused = await writer.createRecord('start-check', competitionId, 'start', startCheck(13), official);

    const summary = await pushOutbox(db, server.transport(), opts);

    expect(summary).toMatchObject({ applied: 1, rejected: 1 });
    expect(await db.outbox.count()).toBe(0);
    expect(await db.rejections.get(refused.op!.opId)).toMatchObject({ reason: 'Anna no longer holds an official role at the start.', op: refused.op });
    expect(await db.records.get(refused.record.id)).toBeDefined();
  });

  it('when an official puts a refusal away, then it leaves the list and the count but its values stay on the device, marked with who and when', async () => {
    const { db, writer } = await device();
    const server = new FakeSyncServer();
    server.refuse = () => 'Anna no longer holds an official role at the start.';
    const refused = await writer.createRecord('start-check', competitionId, 'start', startCheck(13), official);
    await pushOutbox(db, server.transport(), opts);
    expect((await readRejections(db)).map((r) => r.opId)).toEqual([refused.op!.opId]);

    await dismissRejection(db, refused.op!.opId, leader, now);

    expect(await readRejections(db)).toEqual([]);
    expect(await db.rejections.get(refused.op!.opId)).toMatchObject({ op: refused.op, dismissed: { userId: leader, at: '2027-01-14T10:00:00.000Z' } });
    await expect(dismissRejection(db, 'no-such-op', leader, now)).rejects.toThrow(/no longer on this device/);
  });

  // server/sync/SPEC.md §2, §3
  it('when the answer to a committed push is lost, then the same op ids go again, get their stored answers, and nothing is applied twice', async () => {
    const { db, writer } = await device();
    const server = new FakeSyncServer();
    const { record } = await writer.createRecord('start-check', competitionId, 'start', startCheck(5), official);
    await writer.updateRecord(record.id, { note: 'first' }, official);
    server.loseNextPushAnswer = true;

    await expect(pushOutbox(db, server.transport(), opts)).rejects.toThrow(/dropped/);
    expect(await db.outbox.count()).toBe(2);
    await pushOutbox(db, server.transport(), opts);

    expect(await db.outbox.count()).toBe(0);
    expect(server.receipts.size).toBe(2);
    expect(server.records.get(record.id)?.version).toBe(2);
  });

  // server/sync/SPEC.md §5
  it("when one device edits a field twice offline, then the server applies both without a conflict (its own edits chain)", async () => {
    const { db, writer } = await device();
    const server = new FakeSyncServer();
    const { record } = await writer.createRecord('start-check', competitionId, 'start', startCheck(8), official);
    await writer.updateRecord(record.id, { note: 'a' }, official);
    await writer.updateRecord(record.id, { note: 'b', status: 'cleared' }, official);
    await writer.updateRecord(record.id, { note: 'c' }, official);

    const summary = await pushOutbox(db, server.transport(), opts);

    expect(summary).toMatchObject({ applied: 4, conflict: 0 });
    expect(server.conflicts.size).toBe(0);
    expect(server.records.get(record.id)?.fields).toMatchObject({ note: 'c', status: 'cleared' });
  });
});

describe('pull', () => {
  const open: DeviceDb[] = [];
  afterEach(() => open.splice(0).forEach((db) => db.close()));
  async function device() {
    const db = await openTestDevice();
    open.push(db);
    return { db, writer: createRecordWriter({ db, now }) };
  }

  // server/sync/SPEC.md §8
  it('when the server has more than a page, then every page is applied and the cursor ends at the last change', async () => {
    const a = await device();
    const b = await device();
    const server = new FakeSyncServer();
    server.pageSize = 2;
    for (let bib = 1; bib <= 5; bib++) await a.writer.createRecord('start-check', competitionId, 'start', startCheck(bib), official);
    await pushOutbox(a.db, server.transport(), opts);

    const result = await pullChanges(b.db, server.transport(), opts);

    expect(server.calls.filter((c) => c === 'pull')).toHaveLength(3);
    expect(result.cursor).toBe(5);
    expect((await readSyncState(b.db)).cursor).toBe(5);
    expect((await b.db.records.toArray()).map((r) => r.fields['bib']).sort()).toEqual([1, 2, 3, 4, 5]);
  });

  // server/sync/SPEC.md §8
  it('when applying a page fails, then neither its records nor its cursor are kept, and the pages before it stay', async () => {
    const a = await device();
    const b = await device();
    const server = new FakeSyncServer();
    server.pageSize = 2;
    const made: LocalRecord[] = [];
    for (let bib = 1; bib <= 4; bib++) made.push((await a.writer.createRecord('start-check', competitionId, 'start', startCheck(bib), official)).record);
    await pushOutbox(a.db, server.transport(), opts);
    b.db.records.hook('creating', (id) => {
      if (id === made[3]!.id) throw new Error('the browser closed the database');
    });

    await expect(pullChanges(b.db, server.transport(), opts)).rejects.toThrow('closed the database');

    expect((await readSyncState(b.db)).cursor).toBe(2);
    expect(await b.db.records.count()).toBe(2);
    expect(await b.db.serverRecords.get(made[2]!.id)).toBeUndefined();
  });

  // server/sync/SPEC.md §8
  it('when a page is older than the cursor or a record older than the stored version, then neither goes backwards', async () => {
    const { db, writer } = await device();
    const { record } = await writer.createRecord('start-check', competitionId, 'start', startCheck(1), official);
    await db.outbox.clear();
    const version = (v: number, note: string): SyncRecord => ({ ...record, fields: { ...record.fields, note }, version: v });
    const page = (cursor: number, ...records: [number, SyncRecord][]): PullResponse => ({
      changes: records.map(([seq, r]) => ({ seq, type: 'record', record: r })),
      cursor,
      hasMore: false,
    });

    await applyPulledPage(db, page(10, [10, version(3, 'third')]), opts);
    expect(await applyPulledPage(db, page(7, [7, version(2, 'second')]), opts)).toBe(10);
    await applyPulledPage(db, page(12, [12, version(2, 'stale copy')]), opts);

    expect((await readSyncState(db)).cursor).toBe(12);
    expect((await db.records.get(record.id))?.fields['note']).toBe('third');
  });

  it('when a record still has ops in the outbox, then a pulled copy does not overwrite it; once answered, the server copy comes through', async () => {
    const a = await device();
    const b = await device();
    const server = new FakeSyncServer();
    const { record } = await a.writer.createRecord('start-check', competitionId, 'start', startCheck(21), official);
    await pushOutbox(a.db, server.transport(), opts);
    await pullChanges(b.db, server.transport(), opts);
    await a.writer.updateRecord(record.id, { status: 'cleared' }, official); // A is offline with this edit
    await b.writer.updateRecord(record.id, { note: 'checked twice' }, otherOfficial);
    await pushOutbox(b.db, server.transport(), opts);

    await pullChanges(a.db, server.transport(), opts);
    expect((await a.db.records.get(record.id))?.fields).toMatchObject({ status: 'cleared', note: '' });
    expect((await a.db.serverRecords.get(record.id))?.fields['note']).toBe('checked twice');

    await pushOutbox(a.db, server.transport(), opts);
    await pullChanges(a.db, server.transport(), opts);
    expect((await a.db.records.get(record.id))?.fields).toMatchObject({ status: 'cleared', note: 'checked twice' });
    expect((await a.db.records.get(record.id))?.version).toBe(server.records.get(record.id)?.version);
  });

  // server/sync/SPEC.md §5, §7
  it('when two devices change one field from the same base, then the loser goes back to the server value, the conflict comes down, and the leader settles it everywhere', async () => {
    const a = await device();
    const b = await device();
    const server = new FakeSyncServer();
    const { record } = await a.writer.createRecord('start-check', competitionId, 'start', startCheck(30), official);
    await pushOutbox(a.db, server.transport(), opts);
    await pullChanges(b.db, server.transport(), opts);
    await a.writer.updateRecord(record.id, { note: 'left runner worn' }, official);
    await b.writer.updateRecord(record.id, { note: 'right runner worn' }, otherOfficial);
    await pushOutbox(a.db, server.transport(), opts);

    expect((await pushOutbox(b.db, server.transport(), opts)).conflict).toBe(1);
    expect((await b.db.records.get(record.id))?.fields['note']).toBe('');
    await pullChanges(b.db, server.transport(), opts);
    const [conflict] = await b.db.conflicts.toArray();
    expect(conflict).toMatchObject({ field: 'note', base: '', status: 'open', kept: { value: 'left runner worn' }, incoming: { value: 'right runner worn' } });
    expect((await b.db.records.get(record.id))?.fields['note']).toBe('left runner worn');

    await b.writer.settleConflict(conflict!.id, 'both runners worn', 'both officials saw wear', leader);
    await pushOutbox(b.db, server.transport(), opts);
    await pullChanges(a.db, server.transport(), opts);
    await pullChanges(b.db, server.transport(), opts);
    for (const db of [a.db, b.db]) {
      expect((await db.conflicts.get(conflict!.id))).toMatchObject({ status: 'settled', localSettlement: null });
      expect((await db.records.get(record.id))?.fields['note']).toBe('both runners worn');
    }
  });

  // server/sync/SPEC.md §5
  it('when a measurement is corrected on one device, then the other device pulls both the original and the correction', async () => {
    const a = await device();
    const b = await device();
    const server = new FakeSyncServer();
    const { record } = await a.writer.createRecord('measurement', competitionId, 'start', measurement(231), official);
    const { record: fixed } = await a.writer.correctRecord(record.id, { value: { tenths: 241, unit: 'kilogram' } }, 'scale not zeroed', official);
    await pushOutbox(a.db, server.transport(), opts);
    await pullChanges(b.db, server.transport(), opts);

    expect((await b.db.records.get(record.id))?.fields['value']).toEqual({ tenths: 231, unit: 'kilogram' });
    expect(await b.db.records.where('supersedes').equals(record.id).primaryKeys()).toEqual([fixed.id]);
  });
});
