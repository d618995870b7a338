/**
 * `npm run bench:sync` (issue 5): how fast pushed ops merge into PostgreSQL, against the floor of
 * inserting the same record rows with one plain `unnest` INSERT. A measurement, not a test: it prints
 * the numbers beside the targets and exits 0 either way.
 *
 * One run: a throwaway PostgreSQL, the demo scenario, 8 officials each on their own device; 10,000 ops
 * (mostly new records, some edits of a few shared start checks) merged through pushOps() in batches of
 * 500; the p95 of those 500-op pushes; then the floor.
 */
import { randomBytes } from 'node:crypto';
import { chmod, mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { inArray } from 'drizzle-orm';
import type { RoleAssignment } from '../shared/auth/roles';
import type { OpResult, SyncOpInput } from '../shared/sync/sync-api';
import { generateUserId } from '../server/auth/user-ids';
import { connectDatabase, type Database, type DatabaseHandle } from '../server/db/client';
import { applyMigrations } from '../server/db/migrate';
import { roleAssignments, sessions, syncRecords, users } from '../server/db/schema';
import { demoOpenCompetitionId, seedDemoScenario } from '../server/ops/demo-scenario';
import { freePort, startLocalPostgres } from '../server/ops/postgres';
import { pushOps, type PushSession } from '../server/sync/push-ops';
import { controlReading, deviceOps, startCheck } from '../tests/support/sync-ops';

const deviceCount = 8;
const totalOps = 10_000;
const batchSize = 500;
const sharedChecks = 4;
const targets = { ratio: 3, opsPerSecond: 5_000, p95Ms: 500 };

interface BenchDevice {
  session: PushSession;
  ops: ReturnType<typeof deviceOps>;
  /** What this device last saw of each shared check's fields: the base of its next edit. */
  seen: Map<string, Record<string, string>>;
}

/** Officials of our own invention, each with a start role and a session on their own device. */
async function addOfficials(db: Database): Promise<BenchDevice[]> {
  const devices: BenchDevice[] = [];
  for (let n = 1; n <= deviceCount; n += 1) {
    const userId = generateUserId();
    const role: RoleAssignment = { role: n === 1 ? 'area-leader' : 'official', competitionId: demoOpenCompetitionId, area: 'start' };
    await db.insert(users).values({ id: userId, email: `bench-${n}@frostbarrow.test`, displayName: `Bench Official ${n}`, passwordHash: 'no sign-in' });
    await db.insert(roleAssignments).values({ userId, ...role });
    const ops = deviceOps(userId);
    await db.insert(sessions).values({ id: randomBytes(20).toString('hex'), userId, deviceId: ops.deviceId, expiresAt: new Date(Date.now() + 86_400_000) });
    devices.push({ session: { userId, deviceId: ops.deviceId, roles: [role] }, ops, seen: new Map() });
  }
  return devices;
}

/** The next op a device makes: mostly new records, one in twenty an edit of a shared start check. */
function nextOp(device: BenchDevice, index: number, deviceNumber: number, shared: string[], ownChecks: string[]): SyncOpInput {
  const { op } = device.ops;
  if (index % 20 === 19) {
    const recordId = shared[(index + deviceNumber) % shared.length]!;
    const base = device.seen.get(recordId) ?? { status: 'in-progress', note: '' };
    const fields: Record<string, string> = index % 40 === 19 ? { note: `device ${deviceNumber}, edit ${index}` } : { status: index % 3 ? 'cleared' : 'referred' };
    device.seen.set(recordId, { ...base, ...fields });
    const changedBase = Object.fromEntries(Object.keys(fields).map((f) => [f, base[f]!]));
    return op({ action: 'update', recordKind: 'start-check', recordId, fields, base: changedBase });
  }
  if (index % 4 === 0) {
    // Each device checks sleds of its own (at most 375 each), so the new checks never clash.
    const check = op({ action: 'create', recordKind: 'start-check', fields: startCheck(1 + deviceNumber * 1_000 + index / 4) });
    ownChecks.push(check.recordId);
    return check;
  }
  if (index % 4 === 1 && ownChecks.length > 0) {
    const checkId = ownChecks[ownChecks.length - 1]!;
    return op({ action: 'create', recordKind: 'measurement', fields: { checkId, what: 'runner width', value: { tenths: 1_000 + (index % 50), unit: 'millimetre' }, takenAt: '2027-01-09T09:20:00.000Z' } });
  }
  return op({ action: 'create', recordKind: 'control-reading', fields: controlReading(-(index % 120)) });
}

const percentile = (values: number[], p: number) => [...values].sort((a, b) => a - b)[Math.max(0, Math.ceil((p / 100) * values.length) - 1)]!;
const median = (values: number[]) => percentile(values, 50);

/**
 * The floor: the same record rows in one plain multi-row INSERT from unnest arrays. The two jsonb
 * columns travel as one JSON array each: node-pg's array-literal encoding escapes every quote of every
 * element and took longer than the insert itself.
 */
async function insertFloor({ db, pool }: DatabaseHandle, recordIds: string[]): Promise<number> {
  await pool.query('create table sync_records_floor (like sync_records including all)');
  const rows = await db.select().from(syncRecords).where(inArray(syncRecords.id, recordIds));
  const column = <K extends keyof (typeof rows)[number]>(key: K) => rows.map((r) => r[key]);
  const json = (key: 'fields' | 'fieldSources') => JSON.stringify(rows.map((r) => r[key]));
  const elements = (parameter: string) => `array(select value from jsonb_array_elements(${parameter}::jsonb) with ordinality order by ordinality)`;
  const timings: number[] = [];
  for (let run = 0; run < 3; run += 1) {
    await pool.query('truncate sync_records_floor');
    const started = performance.now();
    await pool.query(
      `insert into sync_records_floor (id, kind, competition_id, area, fields, field_sources, created_by, device_id, hlc, created_op_id, natural_key, deleted, version, change_seq)
       select * from unnest($1::uuid[], $2::text[], $3::uuid[], $4::area[], ${elements('$5')}, ${elements('$6')},
         $7::text[], $8::uuid[], $9::text[], $10::uuid[], $11::text[], $12::boolean[], $13::int[], $14::bigint[])`,
      [
        column('id'), column('kind'), column('competitionId'), column('area'), json('fields'), json('fieldSources'), column('createdBy'),
        column('deviceId'), column('hlc'), column('createdOpId'), column('naturalKey'), column('deleted'), column('version'), column('changeSeq'),
      ],
    );
    timings.push(performance.now() - started);
  }
  return rows.length / (median(timings) / 1_000);
}

async function main(): Promise<void> {
  const folder = await mkdtemp(path.join(os.tmpdir(), 'rimelog-bench-pg-'));
  await chmod(folder, 0o711);
  const postgres = await startLocalPostgres({ dataDir: path.join(folder, 'data'), port: await freePort(), throwaway: true });
  const database = connectDatabase(postgres.url);
  // Stopping the server ends idle connections; that is expected here, not an error.
  database.pool.on('error', () => {});
  try {
    const { db } = database;
    await applyMigrations(db);
    await seedDemoScenario(db);
    const devices = await addOfficials(db);

    // Not timed: the shared start checks, pushed by the first device, which also warms everything up.
    const first = devices[0]!;
    const sharedOps = Array.from({ length: sharedChecks }, (_, i) => first.ops.op({ action: 'create', recordKind: 'start-check', fields: startCheck(9_000 + i, 3) }));
    const warmUp = Array.from({ length: batchSize - sharedChecks }, (_, i) => first.ops.op({ action: 'create', recordKind: 'control-reading', fields: controlReading(-i) }));
    await pushOps(db, first.session, [...sharedOps, ...warmUp]);
    const shared = sharedOps.map((op) => op.recordId);

    // Devices 1–4 make three batches each, devices 5–8 two: 20 batches of 500, 10,000 ops.
    const batches: { device: BenchDevice; ops: SyncOpInput[] }[][] = [];
    devices.forEach((device, d) => {
      const ownChecks: string[] = [];
      const count = d < deviceCount / 2 ? 3 : 2;
      for (let b = 0; b < count; b += 1) {
        const ops = Array.from({ length: batchSize }, (_, i) => nextOp(device, b * batchSize + i, d, shared, ownChecks));
        (batches[b] ??= []).push({ device, ops });
      }
    });
    const rounds = batches.flat();
    const opCount = rounds.reduce((sum, r) => sum + r.ops.length, 0);
    if (opCount !== totalOps) throw new Error(`The bench made ${opCount} ops instead of ${totalOps}.`);

    const latencies: number[] = [];
    const results: OpResult[] = [];
    const started = performance.now();
    for (const { device, ops } of rounds) {
      const pushStarted = performance.now();
      results.push(...(await pushOps(db, device.session, ops)));
      latencies.push(performance.now() - pushStarted);
    }
    const mergeSeconds = (performance.now() - started) / 1_000;
    const opsPerSecond = totalOps / mergeSeconds;
    const p95 = percentile(latencies, 95);

    const created = rounds.flatMap((r) => r.ops.filter((op) => op.action === 'create').map((op) => op.recordId));
    const rowsPerSecond = await insertFloor(database, created);
    const ratio = rowsPerSecond / opsPerSecond;

    const statuses = new Map<string, number>();
    for (const r of results) statuses.set(r.status, (statuses.get(r.status) ?? 0) + 1);
    const number = (n: number, digits = 0) => n.toLocaleString('en-GB', { maximumFractionDigits: digits, minimumFractionDigits: digits });
    const verdict = (ok: boolean) => (ok ? 'pass' : 'FAIL');
    const table = [
      ['', 'measured', 'target', ''],
      ['merge through pushOps()', `${number(opsPerSecond)} ops/s`, `≥ ${number(targets.opsPerSecond)} ops/s`, verdict(opsPerSecond >= targets.opsPerSecond)],
      ['floor: one unnest INSERT', `${number(rowsPerSecond)} rows/s`, '', ''],
      ['ratio floor / merge', number(ratio, 2), `≤ ${targets.ratio}`, verdict(ratio <= targets.ratio)],
      [`p95 of a ${batchSize}-op push`, `${number(p95, 1)} ms`, `< ${targets.p95Ms} ms`, verdict(p95 < targets.p95Ms)],
    ];
    const widths = table[0]!.map((_, c) => Math.max(...table.map((row) => row[c]!.length)));
    console.log(`\nSync merge: ${number(totalOps)} ops from ${deviceCount} devices in ${rounds.length} batches of ${batchSize}, ${number(mergeSeconds, 2)} s`);
    console.log(`Outcomes: ${[...statuses].map(([status, n]) => `${number(n)} ${status}`).join(', ')}; floor: ${number(created.length)} record rows\n`);
    for (const row of table) console.log(row.map((cell, c) => (c === 0 ? cell.padEnd(widths[c]!) : cell.padStart(widths[c]!))).join('   '));
    console.log(`\nPush latencies (ms): ${latencies.map((l) => number(l)).join(' ')}`);
  } finally {
    await database.close();
    await postgres.stop();
    await rm(folder, { recursive: true, force: true });
  }
}

main().catch((error: unknown) => {
  console.error(error);
  process.exitCode = 1;
});
