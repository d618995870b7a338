import { randomUUID } from 'node:crypto';
import { eq, inArray, sql } from 'drizzle-orm';
import type { Express } from 'express';
import fc from 'fast-check';
import request from 'supertest';
import { v7 as uuidv7 } from 'uuid';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiErrorBodySchema } from '../../shared/api/api-error';
import { pushResponseSchema, type OpResult, type SyncOpInput } from '../../shared/sync/sync-api';
import { syncConflicts, syncRecords, users } from '../../server/db/schema';
import { seedDemoScenario } from '../../server/ops/demo-scenario';
import { sameOrigin, signInAs } from '../support/sign-in';
import { controlReading, deviceOps, startCheck } from '../support/sync-ops';
import { createTestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

// Fuzzing POST /api/sync/push (issue 5): random and malformed batches against the real app and
// PostgreSQL. Every answer is a push response or a 400/413 error body, never a 5xx; a batch in which
// no op was applied changes no record, no conflict and no change number (SPEC.md §2–§4); sending the
// same batch again answers the same and changes nothing (SPEC.md §2).

let database: TestDatabase;
let app: Express;
let cookie: string;
let sessionUserId: string;
const ids = new Map<string, string>();
/** Start checks every batch may edit, so edits meet each other. */
const shared: { recordId: string; bib: number }[] = [];

beforeAll(async () => {
  database = await createTestDatabase();
  await seedDemoScenario(database.db);
  app = createTestApp(database);
  for (const row of await database.db.select({ id: users.id, email: users.email }).from(users)) ids.set(row.email.split('@')[0]!, row.id);
  sessionUserId = ids.get('start-official')!;
  const phone = deviceOps(sessionUserId);
  cookie = await signInAs(app, 'start-official@frostbarrow.test', { deviceId: phone.deviceId });
  const creates = [901, 902, 903].map((bib) => phone.op({ action: 'create', recordKind: 'start-check', fields: startCheck(bib) }));
  const results = await push({ ops: creates });
  expect(results.map((r) => r.status)).toEqual(['applied', 'applied', 'applied']);
  creates.forEach((op, i) => shared.push({ recordId: op.recordId, bib: 901 + i }));
});
afterAll(() => database.drop());

async function push(body: unknown): Promise<OpResult[]> {
  const response = await request(app).post('/api/sync/push').set(sameOrigin).set('Cookie', cookie).send(body as object).expect(200);
  return pushResponseSchema.parse(response.body).results;
}

/** Sends a body (an object, or raw text as JSON) and checks the answer's shape; never a 5xx. */
async function send(body: unknown): Promise<{ status: number; results?: OpResult[] }> {
  const call = request(app).post('/api/sync/push').set(sameOrigin).set('Cookie', cookie).set('Content-Type', 'application/json');
  const response = await call.send(typeof body === 'string' ? body : withDeepValues(JSON.stringify(body)));
  expect([200, 400, 413], `answered ${response.status}: ${JSON.stringify(response.body).slice(0, 400)}`).toContain(response.status);
  if (response.status !== 200) {
    apiErrorBodySchema.parse(response.body);
    return { status: response.status };
  }
  return { status: 200, results: pushResponseSchema.parse(response.body).results };
}

/**
 * Everything a push can change apart from receipts and device cursors: every change to a record bumps
 * its version, every settlement a conflict's status, and every change takes a change number.
 */
async function footprint() {
  const result = await database.db.execute<Record<string, string>>(sql`select
    (select count(*) from sync_records) as records,
    (select coalesce(sum(version), 0) from sync_records) as versions,
    (select count(*) from sync_conflicts) as conflicts,
    (select count(*) from sync_conflicts where status = 'settled') as settled,
    (select value from sync_counter where id = 1) as counter,
    (select count(*) from op_receipts) as receipts`);
  const { receipts, ...state } = result.rows[0]!;
  return { state, receipts: Number(receipts) };
}

// ---- What a batch is made of -------------------------------------------------------------------

type Json = unknown;
type Mutation = (op: Record<string, Json>) => Record<string, Json>;

const opKeys = ['opId', 'deviceId', 'seq', 'userId', 'hlc', 'madeAt', 'competitionId', 'area', 'action', 'recordKind', 'recordId', 'fields', 'base', 'settlement'];
const without = (op: Record<string, Json>, key: string) => Object.fromEntries(Object.entries(op).filter(([k]) => k !== key));
const withField = (op: Record<string, Json>, key: string, value: Json) => ({ ...op, fields: { ...(op['fields'] as object), [key]: value } });
/** Deeply nested arrays, spliced into the request text (JSON.stringify itself would overflow the stack). */
const nested = (depth: number) => `<<nested ${depth}>>`;
const withDeepValues = (text: string) => text.replace(/"<<nested (\d+)>>"/g, (_, depth: string) => '['.repeat(Number(depth)) + ']'.repeat(Number(depth)));
const bigText = (length: number) => 'ᚠx'.repeat(Math.ceil(length / 2)).slice(0, length);

const strangeSeq = fc.constantFrom<Json>(0, -1, -2_147_483_648, 2_147_483_647, 2_147_483_648, 2 ** 53 - 1, 2 ** 53, 1.5, 1e308, '1', null, true);
const unstorable = fc.constantFrom('\u0000', 'a\u0000b', '\ud800', 'cut emoji \ud83d', '\udc00 low half');

const mutation: fc.Arbitrary<Mutation> = fc.oneof(
  fc.constantFrom(...opKeys).map((key): Mutation => (op) => without(op, key)),
  fc.tuple(fc.constantFrom(...opKeys, 'extra'), fc.jsonValue({ maxDepth: 3 })).map(([key, value]): Mutation => (op) => ({ ...op, [key]: value })),
  fc.constantFrom('Control-Reading', 'photo', '', 'start_check', 'measurement ', 'violation').map((kind): Mutation => (op) => ({ ...op, recordKind: kind })),
  fc.constantFrom<Json>('middle', 'START', '', 'finish', null, 1).map((area): Mutation => (op) => ({ ...op, area })),
  fc.constantFrom('update', 'delete', 'settle', 'merge', '').map((action): Mutation => (op) => ({ ...op, action })),
  strangeSeq.map((seq): Mutation => (op) => ({ ...op, seq })),
  fc.tuple(fc.integer({ min: -999, max: 999 }), fc.constantFrom(0.1, 0.5, 0.05, 1e-9)).map(([whole, part]): Mutation => (op) =>
    withField(withField(op, 'reading', { tenths: whole + part, unit: 'celsius' }), 'value', { tenths: whole + part, unit: 'kilogram' }),
  ),
  fc.constantFrom<Json>(-0, Number.MAX_SAFE_INTEGER, 2 ** 60, 'ten', null).map((tenths): Mutation => (op) => withField(op, 'reading', { tenths, unit: 'celsius' })),
  fc.tuple(fc.constantFrom('hlc', 'userId', 'note', 'instrumentId', 'rule'), fc.integer({ min: 61, max: 120_000 })).map(([key, length]): Mutation => (op) =>
    key === 'hlc' || key === 'userId' ? { ...op, [key]: bigText(length) } : withField(op, key, bigText(length)),
  ),
  fc.tuple(fc.constantFrom('hlc', 'note', 'instrumentId', 'key', 'base', 'reason'), unstorable).map(([where, text]): Mutation => (op) => {
    if (where === 'hlc') return { ...op, hlc: text };
    if (where === 'key') return withField(op, text, 1);
    if (where === 'base') return { ...op, base: { note: text } };
    if (where === 'reason') return withField(op, 'reason', text);
    return withField(op, where, text);
  }),
  fc.constantFrom(33, 200, 3_000, 5_000).map((depth): Mutation => (op) => (depth % 2 ? withField(op, 'deep', nested(depth)) : { ...op, base: { note: nested(depth) } })),
  fc.jsonValue({ maxDepth: 2 }).map((fields): Mutation => (op) => ({ ...op, fields })),
  fc.constantFrom('someone-else', 'start-leader', 'finish-official', 'organiser').map((who): Mutation => (op) => ({ ...op, userId: ids.get(who) ?? who })),
  fc.constantFrom(randomUUID(), '0193a5c0-0000-7000-8000-000000000002', 'not-a-uuid').map((competitionId): Mutation => (op) => ({ ...op, competitionId })),
  fc.constantFrom('yesterday', '2027-01-09', '2027-13-40T99:00:00Z', '').map((madeAt): Mutation => (op) => ({ ...op, madeAt })),
);

/** One entry of a batch, made into JSON only when it is sent (record and device ids are fresh then). */
type Item =
  | { type: 'valid'; kind: 'control-reading' | 'start-check' | 'measurement' | 'violation'; number: number; mutations: Mutation[] }
  | { type: 'edit'; target: number; fields: Record<string, Json>; base: Record<string, Json>; action: 'create' | 'update' | 'delete' | 'settle'; mutations: Mutation[] }
  | { type: 'random'; value: Json };

const item: fc.Arbitrary<Item> = fc.oneof(
  {
    weight: 5,
    arbitrary: fc.record({
      type: fc.constant('valid' as const),
      kind: fc.constantFrom('control-reading' as const, 'start-check' as const, 'measurement' as const, 'violation' as const),
      number: fc.integer({ min: 1, max: 60 }),
      mutations: fc.array(mutation, { maxLength: 2 }),
    }),
  },
  {
    weight: 2,
    arbitrary: fc.record({
      type: fc.constant('edit' as const),
      target: fc.integer({ min: 0, max: 2 }),
      fields: fc.oneof(
        fc.record({ status: fc.constantFrom('in-progress', 'cleared', 'referred', 'violation', 'withdrawn', 'lost') }, { requiredKeys: [] }),
        fc.record({ note: fc.string({ maxLength: 30 }), bib: fc.oneof(fc.integer({ min: -5, max: 10_000 }), fc.double()) }, { requiredKeys: [] }),
      ),
      base: fc.record({ status: fc.constantFrom('in-progress', 'cleared'), note: fc.constantFrom('', 'x') }, { requiredKeys: [] }),
      action: fc.constantFrom('create' as const, 'update' as const, 'update' as const, 'delete' as const, 'settle' as const),
      mutations: fc.array(mutation, { maxLength: 1 }),
    }),
  },
  { weight: 1, arbitrary: fc.record({ type: fc.constant('random' as const), value: fc.jsonValue({ maxDepth: 3 }) }) },
);

const fieldsOf = (kind: string, n: number): Record<string, Json> => {
  if (kind === 'control-reading') return controlReading(-n);
  if (kind === 'start-check') return startCheck(n, 1 + (n % 3));
  if (kind === 'measurement') return { checkId: shared[n % 3]!.recordId, what: 'runner width', value: { tenths: 1000 + n, unit: 'millimetre' }, takenAt: '2027-01-09T09:20:00.000Z' };
  return { checkId: shared[n % 3]!.recordId, rule: 'runner temperature', measured: `+${n}.0 °C`, note: '' };
};

/** The batch as a device (or a broken one) would send it: one fresh device, numbered 1, 2, 3 ... */
function materialise(items: Item[], duplicates: [number, number][]): Json[] {
  const device = deviceOps(sessionUserId);
  const ops: Json[] = items.map((entry) => {
    if (entry.type === 'random') return entry.value;
    let op: Record<string, Json>;
    if (entry.type === 'valid') {
      op = device.op({ action: 'create', recordKind: entry.kind, fields: fieldsOf(entry.kind, entry.number) as SyncOpInput['fields'] }) as Record<string, Json>;
    } else {
      const target = shared[entry.target]!.recordId;
      op = device.op({
        action: entry.action,
        recordKind: 'start-check',
        recordId: target,
        fields: (entry.action === 'settle' ? { keep: target } : entry.action === 'create' ? startCheck(shared[entry.target]!.bib) : entry.fields) as SyncOpInput['fields'],
        base: entry.base as SyncOpInput['base'],
        ...(entry.action === 'settle' ? { settlement: { conflictId: uuidv7(), reason: 'fuzz' } } : {}),
      }) as Record<string, Json>;
    }
    return entry.mutations.reduce((current, mutate) => mutate(current), op);
  });
  for (const [from, to] of duplicates) {
    const source = ops[from % ops.length];
    const target = ops[to % ops.length];
    if (source && target && typeof source === 'object' && typeof target === 'object' && 'opId' in source && !Array.isArray(target)) {
      (target as Record<string, Json>)['opId'] = (source as Record<string, Json>)['opId'];
    }
  }
  return ops;
}

const batch = fc.record({
  items: fc.array(item, { minLength: 1, maxLength: 8 }),
  duplicates: fc.array(fc.tuple(fc.nat(), fc.nat()), { maxLength: 2 }),
  reversed: fc.boolean(),
});

// ---- The properties ----------------------------------------------------------------------------

describe('fuzzing POST /api/sync/push', () => {
  it('when 1,000 random and malformed batches arrive, then none answers 5xx, every answer has its shape, a batch with nothing applied changes nothing, and a replay answers the same', async () => {
    const seen = { batches: 0, nothingApplied: 0, statuses: new Map<string, number>() };
    await fc.assert(
      fc.asyncProperty(batch, async ({ items, duplicates, reversed }) => {
        const ops = materialise(items, duplicates);
        if (reversed) ops.reverse();
        const before = await footprint();
        const first = await send({ ops });
        seen.batches += 1;
        if (!first.results) return;
        expect(first.results.map((r) => r.index)).toEqual(ops.map((_, i) => i));
        for (const r of first.results) seen.statuses.set(r.status, (seen.statuses.get(r.status) ?? 0) + 1);

        const after = await footprint();
        if (first.results.every((r) => r.status === 'rejected' || r.status === 'deferred' || r.status === 'duplicate')) {
          seen.nothingApplied += 1;
          expect(after.state).toEqual(before.state);
        }
        expect(after.receipts - before.receipts).toBeLessThanOrEqual(first.results.filter((r) => r.status !== 'deferred').length);
        const replay = await send({ ops });
        expect(replay.results).toEqual(first.results);
        expect(await footprint()).toEqual(after);
      }),
      { numRuns: 1_000 },
    );
    // The mix must really reach every outcome, or the property above proves little.
    expect(seen.batches).toBe(1_000);
    expect(seen.nothingApplied).toBeGreaterThan(100);
    for (const status of ['applied', 'rejected', 'deferred', 'conflict', 'duplicate']) expect(seen.statuses.get(status) ?? 0, status).toBeGreaterThan(0);
  }, 120_000);

  it('when whole bodies are random JSON, text or too large, then each is answered 400 or 413 in words and nothing changes', async () => {
    const before = await footprint();
    const body = fc.oneof(
      fc.jsonValue({ maxDepth: 4 }),
      fc.record({ ops: fc.jsonValue({ maxDepth: 3 }) }),
      fc.record({ ops: fc.array(fc.jsonValue({ maxDepth: 2 }), { minLength: 501, maxLength: 520 }) }),
      fc.string({ maxLength: 40 }).map((text) => `{"ops": [${text}`),
      fc.constant({ ops: [] }),
      fc.constant({ ops: [{ note: 'x'.repeat(1_100_000) }] }),
    );
    await fc.assert(
      fc.asyncProperty(body, async (value) => {
        const answer = await send(value);
        // A random value may happen to be a list of ops; every op in it is then answered one by one.
        if (answer.results) expect(answer.results.every((r) => r.status === 'rejected')).toBe(true);
      }),
      { numRuns: 200 },
    );
    expect((await footprint()).state).toEqual(before.state);
  }, 60_000);
});

// ---- Bugs the fuzzing found, kept as regression tests ------------------------------------------

describe('ops the database cannot store (found by fuzzing)', () => {
  it('when a note holds a NUL character or half of an emoji, then that op alone is rejected with a reason and the queue moves on', async () => {
    const phone = deviceOps(sessionUserId);
    const nul = phone.op({ action: 'create', recordKind: 'start-check', fields: { ...startCheck(951), note: 'warm\u0000steel' } });
    const halfEmoji = phone.op({ action: 'create', recordKind: 'start-check', fields: { ...startCheck(952), note: 'cut \ud83d' } });
    const fine = phone.op({ action: 'create', recordKind: 'start-check', fields: startCheck(953) });
    const results = await push({ ops: [nul, halfEmoji, fine] });
    expect(results.map((r) => r.status)).toEqual(['rejected', 'rejected', 'applied']);
    expect(results[0]!.reason).toMatch(/a character the server cannot store/);
    expect(await database.db.select().from(syncRecords).where(inArray(syncRecords.id, [nul.recordId, halfEmoji.recordId]))).toHaveLength(0);
  });

  it('when an op nests values hundreds of levels deep, then it is answered as unreadable, not with 503', async () => {
    const phone = deviceOps(sessionUserId);
    const deep = { ...phone.op({ action: 'create', recordKind: 'start-check', fields: startCheck(954) }), base: { note: nested(3_000) } };
    const answer = await send({ ops: [deep] });
    expect(answer.status).toBe(200);
    const [result] = answer.results!;
    expect(result).toMatchObject({ status: 'rejected', opId: deep.opId });
    expect(result!.reason).toMatch(/nested more than 32 levels deep/);
  });

  it('when the author id holds a NUL character, then the op is unreadable and the rest of the batch still applies', async () => {
    const phone = deviceOps(sessionUserId);
    const fine = phone.op({ action: 'create', recordKind: 'control-reading', fields: controlReading(-12) });
    const broken = { ...deviceOps(sessionUserId).op({ action: 'create', recordKind: 'control-reading', fields: controlReading(-13) }), userId: 'a\u0000' };
    expect((await push({ ops: [broken, fine] })).map((r) => r.status)).toEqual(['rejected', 'applied']);
  });
});

describe('changes that name another record than they change (found by fuzzing, SPEC.md §6)', () => {
  async function deviceOf(who: string) {
    const ops = deviceOps(ids.get(who)!);
    const session = await signInAs(app, `${who}@frostbarrow.test`, { deviceId: ops.deviceId });
    const pushAs = async (...batch: SyncOpInput[]) =>
      pushResponseSchema.parse((await request(app).post('/api/sync/push').set(sameOrigin).set('Cookie', session).send({ ops: batch }).expect(200)).body).results;
    return { ...ops, push: pushAs };
  }

  it('when a finish official edits or removes a start check by calling it a finish record, then both are rejected and the check is untouched', async () => {
    const start = await deviceOf('start-official');
    const finish = await deviceOf('finish-official');
    const check = start.op({ action: 'create', recordKind: 'start-check', fields: startCheck(961) });
    await start.push(check);
    const edit = finish.op({ action: 'update', recordKind: 'start-check', area: 'finish', recordId: check.recordId, fields: { status: 'withdrawn' }, base: { status: 'in-progress' } });
    const removal = finish.op({ action: 'delete', recordKind: 'start-check', area: 'finish', recordId: check.recordId });
    const results = await finish.push(edit, removal);
    expect(results.map((r) => r.status)).toEqual(['rejected', 'rejected']);
    expect(results[0]!.reason).toBe('This change names another competition, area or kind of record than the record it changes.');
    const [row] = await database.db.select().from(syncRecords).where(eq(syncRecords.id, check.recordId));
    expect(row).toMatchObject({ deleted: false, version: 1, fields: { status: 'in-progress' } });
  });

  it('when the technical delegate edits a start check by calling it a violation, then it is rejected', async () => {
    const start = await deviceOf('start-official');
    const delegate = await deviceOf('delegate');
    const check = start.op({ action: 'create', recordKind: 'start-check', fields: startCheck(962) });
    await start.push(check);
    const [result] = await delegate.push(delegate.op({ action: 'update', recordKind: 'violation', recordId: check.recordId, fields: { status: 'cleared' }, base: { status: 'in-progress' } }));
    expect(result).toMatchObject({ status: 'rejected', reason: 'This change names another competition, area or kind of record than the record it changes.' });
  });

  it('when the finish leader settles a start clash by naming the finish, then it is rejected and the clash stays open', async () => {
    const a = await deviceOf('start-official');
    const b = await deviceOf('start-official-2');
    const finishLeader = await deviceOf('finish-leader');
    const check = a.op({ action: 'create', recordKind: 'start-check', fields: startCheck(963) });
    await a.push(check);
    await a.push(a.op({ action: 'update', recordKind: 'start-check', recordId: check.recordId, fields: { note: 'left' }, base: { note: '' } }));
    const [clash] = await b.push(b.op({ action: 'update', recordKind: 'start-check', recordId: check.recordId, fields: { note: 'right' }, base: { note: '' } }));
    const conflictId = clash!.conflictIds[0]!;
    const [result] = await finishLeader.push(
      finishLeader.op({ action: 'settle', recordKind: 'start-check', area: 'finish', recordId: check.recordId, fields: { note: 'both' }, settlement: { conflictId, reason: 'mine now' } }),
    );
    expect(result).toMatchObject({ status: 'rejected', reason: 'This settlement names another competition or area than the clash it settles.' });
    const [conflict] = await database.db.select().from(syncConflicts).where(eq(syncConflicts.id, conflictId));
    expect(conflict!.status).toBe('open');
  });

  it('when the area leader settles a duplicate start check by keeping the first, then the second becomes a tombstone (SPEC.md §7)', async () => {
    const a = await deviceOf('start-official');
    const b = await deviceOf('start-official-2');
    const leader = await deviceOf('start-leader');
    const first = a.op({ action: 'create', recordKind: 'start-check', fields: startCheck(964) });
    const second = b.op({ action: 'create', recordKind: 'start-check', fields: startCheck(964) });
    await a.push(first);
    const [clash] = await b.push(second);
    const [settled] = await leader.push(
      leader.op({ action: 'settle', recordKind: 'start-check', recordId: first.recordId, fields: { keep: first.recordId }, settlement: { conflictId: clash!.conflictIds[0]!, reason: 'first was complete' } }),
    );
    expect(settled!.status).toBe('applied');
    const rows = await database.db.select({ id: syncRecords.id, deleted: syncRecords.deleted }).from(syncRecords).where(inArray(syncRecords.id, [first.recordId, second.recordId]));
    expect(Object.fromEntries(rows.map((r) => [r.id, r.deleted]))).toEqual({ [first.recordId]: false, [second.recordId]: true });
  });
});
