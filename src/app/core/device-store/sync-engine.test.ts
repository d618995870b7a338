// First: Dexie reads the global indexedDB once when it loads, and liveQuery stays silent without it.
// Each test database still gets its own fake factory (testing/test-device.ts).
import 'fake-indexeddb/auto';
import { Subject, filter, firstValueFrom, timeout } from 'rxjs';
import { afterEach, describe, expect, it } from 'vitest';
import { backoffDelayMs } from './backoff';
import type { DeviceDb } from './device-db';
import { createRecordWriter } from './record-writer';
import { createSyncEngine, type SyncEngine, type SyncStatus } from './sync-engine';
import type { SyncTransport } from './sync-transport';
import { FakeSyncServer } from './testing/fake-sync-server';
import { competitionId, official, openTestDevice, startCheck } from './testing/test-device';

const statusWhere = (engine: SyncEngine, test: (s: SyncStatus) => boolean) => firstValueFrom(engine.status$.pipe(filter(test), timeout(5_000)));

describe('backoff', () => {
  it('when failures repeat, then the wait doubles up to the cap and the jitter keeps it in the upper half', () => {
    const policy = { baseMs: 5_000, capMs: 300_000 };
    const ceilings = [1, 2, 3, 4, 10].map((n) => backoffDelayMs(n, () => 1, policy));
    expect(ceilings).toEqual([5_000, 10_000, 20_000, 40_000, 300_000]);
    for (let n = 1; n <= 12; n++) {
      const ceiling = backoffDelayMs(n, () => 1, policy);
      expect(backoffDelayMs(n, () => 0, policy)).toBe(ceiling / 2);
      expect(backoffDelayMs(n, () => 0.3, policy)).toBeGreaterThan(ceiling / 2);
    }
  });
});

describe('sync engine', () => {
  const open: DeviceDb[] = [];
  const engines: SyncEngine[] = [];
  afterEach(() => {
    engines.splice(0).forEach((e) => e.stop());
    open.splice(0).forEach((db) => db.close());
  });
  async function setup(server = new FakeSyncServer(), extra: Partial<Parameters<typeof createSyncEngine>[0]> = {}) {
    const db = await openTestDevice();
    open.push(db);
    const engine = createSyncEngine({ db, transport: server.transport(), random: () => 0.5, ...extra });
    engines.push(engine);
    const writer = createRecordWriter({ db, onCommitted: () => engine.nudge() });
    return { db, engine, writer, server };
  }

  it('when a round succeeds, then the status shows online, nothing pending and the sync time', async () => {
    const { engine, writer } = await setup();
    await writer.createRecord('start-check', competitionId, 'start', startCheck(1), official);
    await writer.createRecord('start-check', competitionId, 'start', startCheck(2), official);
    expect((await statusWhere(engine, (s) => s.pendingCount === 2)).online).toBeNull();

    const result = await engine.syncNow();

    expect(result).toMatchObject({ ok: true, pushed: { applied: 2 }, pulledChanges: 2 });
    const status = await statusWhere(engine, (s) => s.pendingCount === 0 && s.lastSyncAt !== null);
    expect(status).toMatchObject({ online: true, lastError: null, openConflicts: 0, clockWarning: null });
  });

  it('when the server cannot be reached, then the round fails in words, the status says offline, and the records stay', async () => {
    const { engine, writer, server } = await setup();
    await writer.createRecord('start-check', competitionId, 'start', startCheck(1), official);
    server.outage = 'unreachable';

    const result = await engine.syncNow();

    expect(result.ok).toBe(false);
    const status = await statusWhere(engine, (s) => s.lastError !== null);
    expect(status).toMatchObject({ online: false, pendingCount: 1 });
    expect(status.lastError).toMatch(/cannot be reached/);
    expect(server.calls).toEqual(['heartbeat']);
  });

  it('when rounds keep failing, then the wait grows; after one good round it is back to the regular interval', async () => {
    const { engine, server } = await setup(new FakeSyncServer(), { intervalMs: 60_000, backoff: { baseMs: 5_000, capMs: 300_000 } });
    server.outage = 'unavailable';
    const waits: number[] = [];
    for (let i = 0; i < 4; i++) {
      await engine.syncNow();
      waits.push(engine.nextDelayMs());
    }
    expect(waits[1]!).toBeGreaterThan(waits[0]!);
    expect(waits[2]!).toBeGreaterThan(waits[1]!);
    expect(waits[3]!).toBeGreaterThan(waits[2]!);
    expect(engine.failures()).toBe(4);

    server.outage = null;
    await engine.syncNow();
    expect(engine.failures()).toBe(0);
    expect(engine.nextDelayMs()).toBe(60_000);
  });

  it('when sync is asked for again while a round runs, then only one round runs and the callers share its result', async () => {
    const server = new FakeSyncServer();
    let release!: () => void;
    const gate = new Promise<void>((resolve) => (release = resolve));
    let running = 0;
    let most = 0;
    const inner = server.transport();
    const slow: SyncTransport = {
      ...inner,
      heartbeat: async () => {
        running++;
        most = Math.max(most, running);
        await gate;
        running--;
        return inner.heartbeat();
      },
    };
    const { engine } = await setup(server, { transport: slow });

    const rounds = [engine.syncNow(), engine.syncNow(), engine.syncNow()];
    release();
    const results = await Promise.all(rounds);

    expect(most).toBe(1);
    expect(server.calls.filter((c) => c === 'heartbeat')).toHaveLength(1);
    expect(results[1]).toBe(results[0]);
  });

  it('when the loop runs and the server is down at first, then it retries on its own after the backoff and drains the outbox', async () => {
    const server = new FakeSyncServer();
    server.outage = 'unreachable';
    const { engine, writer } = await setup(server, { intervalMs: 60_000, backoff: { baseMs: 20, capMs: 40 } });
    await writer.createRecord('start-check', competitionId, 'start', startCheck(1), official);
    engine.start();
    await statusWhere(engine, (s) => s.online === false);
    server.outage = null;

    const status = await statusWhere(engine, (s) => s.pendingCount === 0 && s.online === true);

    expect(status.lastError).toBeNull();
    expect(server.records.size).toBe(1);
  });

  it('when the device comes back online or writes a record, then a round runs at once instead of waiting for the timer', async () => {
    const online$ = new Subject<void>();
    const { engine, writer, server } = await setup(new FakeSyncServer(), { intervalMs: 600_000, online$ });
    engine.start();
    await statusWhere(engine, (s) => s.lastSyncAt !== null && !s.syncing);
    const heartbeats = () => server.calls.filter((c) => c === 'heartbeat').length;
    expect(heartbeats()).toBe(1);

    online$.next();
    await statusWhere(engine, () => heartbeats() === 2);
    await writer.createRecord('start-check', competitionId, 'start', startCheck(2), official);
    await statusWhere(engine, (s) => s.pendingCount === 0 && server.records.size === 1);
    expect(heartbeats()).toBeGreaterThanOrEqual(3);
  });

  it('when the server clock differs by more than 2 minutes, then the status says the device clock is off', async () => {
    const server = new FakeSyncServer();
    const deviceNow = Date.parse('2027-01-14T10:00:00Z');
    server.serverTime = () => deviceNow - 3 * 60_000;
    const { engine } = await setup(server, { now: () => deviceNow });

    await engine.syncNow();

    const status = await statusWhere(engine, (s) => s.clockOffsetMs !== null);
    expect(status.clockOffsetMs).toBe(180_000);
    expect(status.clockWarning).toMatch(/3 min ahead of the server/);
  });

  it('when the device clock is within 2 minutes, then there is no clock warning', async () => {
    const server = new FakeSyncServer();
    const deviceNow = Date.parse('2027-01-14T10:00:00Z');
    server.serverTime = () => deviceNow + 90_000;
    const { engine } = await setup(server, { now: () => deviceNow });
    await engine.syncNow();
    const status = await statusWhere(engine, (s) => s.clockOffsetMs !== null);
    expect(status.clockWarning).toBeNull();
  });

  it('when another tab holds the sync lock, then this tab skips its round and sends nothing', async () => {
    const { engine, server, writer } = await setup(new FakeSyncServer(), { lock: async () => null });
    await writer.createRecord('start-check', competitionId, 'start', startCheck(1), official);
    expect(await engine.syncNow()).toMatchObject({ skipped: true });
    expect(server.calls).toEqual([]);
  });
});
