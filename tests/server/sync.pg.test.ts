import { eq, sql } from 'drizzle-orm';
import type { Express } from 'express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { pullResponseSchema, pushResponseSchema, type SyncOpInput } from '../../shared/sync/sync-api';
import { roleAssignments, syncRecords, users } from '../../server/db/schema';
import { seedDemoScenario } from '../../server/ops/demo-scenario';
import { sameOrigin, signInAs } from '../support/sign-in';
import { controlReading, deviceOps, startCheck } from '../support/sync-ops';
import { createTestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

let database: TestDatabase;
let app: Express;
const ids = new Map<string, string>();

beforeAll(async () => {
  database = await createTestDatabase();
  await seedDemoScenario(database.db);
  app = createTestApp(database);
  for (const row of await database.db.select({ id: users.id, email: users.email }).from(users)) ids.set(row.email.split('@')[0]!, row.id);
});
afterAll(() => database.drop());

/** A device signed in as a demo user; its ops are authored by that user unless said otherwise. */
async function device(who: string) {
  const ops = deviceOps(ids.get(who)!);
  const cookie = await signInAs(app, `${who}@frostbarrow.test`, { deviceId: ops.deviceId });
  const push = async (...batch: SyncOpInput[]) =>
    pushResponseSchema.parse((await request(app).post('/api/sync/push').set(sameOrigin).set('Cookie', cookie).send({ ops: batch }).expect(200)).body).results;
  const pull = async (after = 0, limit?: number) =>
    pullResponseSchema.parse((await request(app).get('/api/sync/pull').query({ after, ...(limit ? { limit } : {}) }).set('Cookie', cookie).expect(200)).body);
  return { ...ops, cookie, push, pull };
}

describe('push: receipts, order, replays (SPEC.md §1–§4)', () => {
  it('when a reading is pushed twice, then it is saved once and the replay gets the stored answer', async () => {
    const phone = await device('start-official');
    const reading = phone.op({ action: 'create', recordKind: 'control-reading', fields: controlReading(-62) });
    const [first] = await phone.push(reading);
    const [again] = await phone.push(reading);
    expect(first).toMatchObject({ status: 'applied', opId: reading.opId });
    expect(again).toEqual(first);
    const rows = await database.db.select().from(syncRecords).where(eq(syncRecords.id, reading.recordId));
    expect(rows).toHaveLength(1);
  });

  it('when a later op arrives before an earlier one, then it waits (deferred) and both apply once the gap is filled', async () => {
    const phone = await device('start-official');
    const one = phone.op({ action: 'create', recordKind: 'control-reading', fields: controlReading(-60) });
    const two = phone.op({ action: 'create', recordKind: 'control-reading', fields: controlReading(-58) });
    expect((await phone.push(two))[0]!.status).toBe('deferred');
    const results = await phone.push(two, one);
    expect(results.map((r) => r.status)).toEqual(['applied', 'applied']);
  });

  it('when one op in a batch is bad, then it alone is rejected with a reason, and the queue moves on', async () => {
    const phone = await device('start-official');
    const bad = phone.op({ action: 'create', recordKind: 'control-reading', fields: { ...controlReading(-61), reading: { tenths: 6.15, unit: 'celsius' } } });
    const good = phone.op({ action: 'create', recordKind: 'control-reading', fields: controlReading(-61) });
    const results = await phone.push(bad, good, { nonsense: true } as unknown as SyncOpInput);
    expect(results.map((r) => r.status)).toEqual(['rejected', 'applied', 'rejected']);
    expect(results[0]!.reason).toMatch(/^The control reading is not complete: reading\.tenths: Measured values are kept in whole tenths/);
    expect(results[2]!.reason).toMatch(/^This record is not complete or not readable/);
  });

  it('when a reading is edited, then it is refused: a correction is a new record', async () => {
    const phone = await device('start-official');
    const reading = phone.op({ action: 'create', recordKind: 'control-reading', fields: controlReading(-55) });
    const edit = phone.op({ action: 'update', recordKind: 'control-reading', recordId: reading.recordId, fields: { instrumentId: 'x' }, base: { instrumentId: 'pyrometer-c1' } });
    const results = await phone.push(reading, edit);
    expect(results[1]).toMatchObject({ status: 'rejected', reason: 'Readings and measurements are never changed; record a correction instead.' });
  });
});

describe('merging edits (SPEC.md §5)', () => {
  it('when two devices change the same field from the same base, then a conflict keeps base and both values with who entered them', async () => {
    const a = await device('start-official');
    const b = await device('start-official-2');
    const check = a.op({ action: 'create', recordKind: 'start-check', fields: startCheck(11) });
    await a.push(check);
    const fromA = a.op({ action: 'update', recordKind: 'start-check', recordId: check.recordId, fields: { status: 'cleared' }, base: { status: 'in-progress' } });
    const fromB = b.op({ action: 'update', recordKind: 'start-check', recordId: check.recordId, fields: { status: 'referred' }, base: { status: 'in-progress' } });
    expect((await a.push(fromA))[0]!.status).toBe('applied');
    const [clash] = await b.push(fromB);
    expect(clash!.status).toBe('conflict');

    const { changes } = await b.pull();
    const conflict = changes.find((c) => c.type === 'conflict' && c.conflict.id === clash!.conflictIds[0]);
    expect(conflict?.type === 'conflict' && conflict.conflict).toMatchObject({
      kind: 'field',
      field: 'status',
      base: 'in-progress',
      kept: { value: 'cleared', userId: ids.get('start-official'), opId: fromA.opId },
      incoming: { value: 'referred', userId: ids.get('start-official-2'), opId: fromB.opId },
      status: 'open',
    });
    const record = changes.find((c) => c.type === 'record' && c.record.id === check.recordId);
    expect(record?.type === 'record' && record.record.fields['status']).toBe('cleared');
  });

  it("when one device edits the same field twice offline, then its edits chain and nothing clashes", async () => {
    const a = await device('start-official');
    const check = a.op({ action: 'create', recordKind: 'start-check', fields: startCheck(12) });
    const first = a.op({ action: 'update', recordKind: 'start-check', recordId: check.recordId, fields: { status: 'referred' }, base: { status: 'in-progress' } });
    const second = a.op({ action: 'update', recordKind: 'start-check', recordId: check.recordId, fields: { status: 'cleared' }, base: { status: 'referred' } });
    expect((await a.push(check, first, second)).map((r) => r.status)).toEqual(['applied', 'applied', 'applied']);
  });

  it('when an edit clashes with a value a field still holds from its creation, then the conflict names the creating op as the kept side', async () => {
    const a = await device('start-official');
    const b = await device('start-official-2');
    const check = a.op({ action: 'create', recordKind: 'start-check', fields: startCheck(61) });
    await a.push(check);
    const fromB = b.op({ action: 'update', recordKind: 'start-check', recordId: check.recordId, fields: { status: 'referred' }, base: { status: 'cleared' } });
    const [clash] = await b.push(fromB);
    expect(clash!.status).toBe('conflict');

    const { changes } = await b.pull();
    const conflict = changes.find((c) => c.type === 'conflict' && c.conflict.id === clash!.conflictIds[0]);
    expect(conflict?.type === 'conflict' && conflict.conflict).toMatchObject({
      field: 'status',
      base: 'cleared',
      kept: { value: 'in-progress', userId: ids.get('start-official'), deviceId: a.deviceId, opId: check.opId, hlc: check.hlc },
      incoming: { value: 'referred', userId: ids.get('start-official-2'), deviceId: b.deviceId, opId: fromB.opId, hlc: fromB.hlc },
    });
  });

  it('when the device that made a record edits a field still at its created value from an older base, then the edit chains and applies', async () => {
    const a = await device('start-official');
    const check = a.op({ action: 'create', recordKind: 'start-check', fields: startCheck(62) });
    const edit = a.op({ action: 'update', recordKind: 'start-check', recordId: check.recordId, fields: { status: 'cleared' }, base: { status: 'referred' } });
    await a.push(check);
    expect((await a.push(edit))[0]).toMatchObject({ status: 'applied', conflictIds: [] });
    const [row] = await database.db.select().from(syncRecords).where(eq(syncRecords.id, check.recordId));
    expect(row!.fields['status']).toBe('cleared');
  });

  it('when two devices record the start check of the same sled and run, then both are kept as a duplicate-record conflict', async () => {
    const a = await device('start-official');
    const b = await device('start-official-2');
    const one = a.op({ action: 'create', recordKind: 'start-check', fields: startCheck(13) });
    const two = b.op({ action: 'create', recordKind: 'start-check', fields: startCheck(13) });
    await a.push(one);
    const [result] = await b.push(two);
    expect(result).toMatchObject({ status: 'conflict', reason: 'Another device recorded this check too; both are kept for the area leader to settle.' });
    const kept = await database.db.select().from(syncRecords).where(sql`${syncRecords.id} in (${one.recordId}, ${two.recordId})`);
    expect(kept).toHaveLength(2);
  });

  it('when the area leader settles a clash, then the chosen value applies and the settlement syncs; an official may not settle', async () => {
    const a = await device('start-official');
    const b = await device('start-official-2');
    const leader = await device('start-leader');
    const check = a.op({ action: 'create', recordKind: 'start-check', fields: startCheck(14) });
    await a.push(check);
    await a.push(a.op({ action: 'update', recordKind: 'start-check', recordId: check.recordId, fields: { note: 'left steel warm' }, base: { note: '' } }));
    const [clash] = await b.push(b.op({ action: 'update', recordKind: 'start-check', recordId: check.recordId, fields: { note: 'right steel warm' }, base: { note: '' } }));
    const conflictId = clash!.conflictIds[0]!;
    const settle = (dev: Awaited<ReturnType<typeof device>>) =>
      dev.op({ action: 'settle', recordKind: 'start-check', recordId: check.recordId, fields: { note: 'both steels warm' }, settlement: { conflictId, reason: 'asked both officials' } });
    const [refused] = await a.push(settle(a));
    expect(refused!.reason).toMatch(/only the area leader settles clashing records/);
    const [settled] = await leader.push(settle(leader));
    expect(settled!.status).toBe('applied');
    const { changes } = await leader.pull();
    const conflict = changes.find((c) => c.type === 'conflict' && c.conflict.id === conflictId);
    expect(conflict?.type === 'conflict' && conflict.conflict.settlement).toMatchObject({ value: 'both steels warm', reason: 'asked both officials' });
    const record = changes.filter((c) => c.type === 'record' && c.record.id === check.recordId).at(-1);
    expect(record?.type === 'record' && record.record.fields['note']).toBe('both steels warm');
  });
});

describe('authorisation per op (SPEC.md §6)', () => {
  it('when an official lost the assignment while offline, then each of their ops is rejected with that reason, never dropped', async () => {
    const phone = await device('finish-official');
    const made = phone.op({ action: 'create', recordKind: 'control-reading', area: 'finish', fields: controlReading(-40) });
    await database.db.delete(roleAssignments).where(eq(roleAssignments.userId, ids.get('finish-official')!));
    const [result] = await phone.push(made);
    expect(result).toMatchObject({ status: 'rejected' });
    expect(result!.reason).toMatch(/^Mira Sol no longer holds an official's role at the finish of this competition/);
    const next = phone.op({ action: 'create', recordKind: 'control-reading', area: 'finish', fields: controlReading(-41) });
    expect((await phone.push(next))[0]!.reason).toMatch(/no longer holds/);
  });

  it('when an op names an official who never signed in on the device, then it is rejected, not accepted in their name', async () => {
    const phone = await device('start-official');
    const forged = { ...phone.op({ action: 'create', recordKind: 'control-reading', fields: controlReading(-30) }), userId: ids.get('start-leader')! };
    const [result] = await phone.push(forged);
    expect(result!.reason).toMatch(/^Runa Holt has not signed in on the device this record came from/);
  });
});

describe('pull (SPEC.md §8)', () => {
  it('when pulling in small pages, then every change comes once, in order, and the cursor never goes back', async () => {
    const phone = await device('start-official');
    const start = (await phone.pull()).changes.length;
    await phone.push(...[1, 2, 3, 4, 5].map((i) => phone.op({ action: 'create', recordKind: 'control-reading', fields: controlReading(-70 + i) })));
    const seen: number[] = [];
    let cursor = 0;
    for (;;) {
      const page = await phone.pull(cursor, 2);
      expect(page.cursor).toBeGreaterThanOrEqual(cursor);
      seen.push(...page.changes.map((c) => c.seq));
      cursor = page.cursor;
      if (!page.hasMore) break;
    }
    expect(seen).toEqual([...seen].sort((x, y) => x - y));
    expect(new Set(seen).size).toBe(seen.length);
    expect(seen.length).toBe(start + 5);
  });
});

describe('a failing database (SPEC.md §3)', () => {
  it('when the batch cannot be saved, then 503 and nothing of it is kept; the same ops apply when sent again', async () => {
    const phone = await device('start-official');
    const ops = [1, 2].map((i) => phone.op({ action: 'create', recordKind: 'control-reading', fields: controlReading(-20 - i) }));
    await database.db.execute(sql`alter table sync_counter rename to sync_counter_away`);
    try {
      const response = await request(app).post('/api/sync/push').set(sameOrigin).set('Cookie', phone.cookie).send({ ops }).expect(503);
      expect(response.body.error.message).toMatch(/nothing of it was saved/);
    } finally {
      await database.db.execute(sql`alter table sync_counter_away rename to sync_counter`);
    }
    expect(await database.db.select().from(syncRecords).where(eq(syncRecords.id, ops[0]!.recordId))).toHaveLength(0);
    expect((await phone.push(...ops)).map((r) => r.status)).toEqual(['applied', 'applied']);
  });
});
