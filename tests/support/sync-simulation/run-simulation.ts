// Dexie reads the global indexedDB once when it loads; each device still gets a factory of its own.
import 'fake-indexeddb/auto';
import { randomBytes } from 'node:crypto';
import { performance } from 'node:perf_hooks';
import { v4 as uuidv4 } from 'uuid';
import { hashSecret } from '../../../server/auth/passwords';
import { grantRole } from '../../../server/auth/role-store';
import { generateUserId } from '../../../server/auth/user-ids';
import { users } from '../../../server/db/schema';
import { demoOpenCompetitionId, seedDemoScenario } from '../../../server/ops/demo-scenario';
import { sessionCookieFrom } from '../sign-in';
import type { TestDatabase } from '../test-database';
import { checkInvariants, type Verdict } from './check-invariants';
import { Ledger } from './ledger';
import { seededRandom } from './prng';
import { SimDevice } from './sim-device';
import { SimNetwork, type Fault } from './sim-network';
import { startSimServer, type SimServer } from './sim-server';
import { createSharedChecks, DeviceWorkload } from './workload';

export interface SimulationOptions {
  seed: number;
  devices: number;
  opsPerDevice: number;
  /** Start checks every device edits. */
  sharedRecords: number;
  /** Sleds two or more devices may both record (duplicate start checks). */
  contestedSleds: number;
  /** The rate of each fault: lost request, lost response, duplicate, reorder, device kill, server restart. */
  faultRate: number;
  /** Share of steps in which two or three devices sync at the same moment. */
  parallelShare: number;
}

export const fullSize: Omit<SimulationOptions, 'seed'> = { devices: 8, opsPerDevice: 500, sharedRecords: 4, contestedSleds: 6, faultRate: 0.1, parallelShare: 0.25 };

export interface SimulationReport extends Verdict {
  options: SimulationOptions;
  seconds: number;
  /** Where the time went: sign-in and shared checks, the morning, quiescence, the checks. */
  phases: Record<'setup' | 'morning' | 'quiescence' | 'checks', number>;
  ops: number;
  steps: number;
  syncRounds: number;
  failedRounds: number;
  pulledPages: number;
  faults: Record<Fault | 'requests' | 'kills' | 'restarts', number>;
}

const password = 'simulated-official-2027';

/** Officials of our own invention, each an official at the start of the open demo race. */
async function addOfficials(database: TestDatabase, count: number): Promise<{ userId: string; email: string }[]> {
  const passwordHash = await hashSecret(password);
  const officials = [];
  for (let n = 1; n <= count; n++) {
    const userId = generateUserId();
    const email = `sim-official-${n}@frostbarrow.test`;
    await database.db.insert(users).values({ id: userId, email, displayName: `Simulated Official ${n}`, passwordHash });
    await grantRole(database.db, userId, { role: 'official', competitionId: demoOpenCompetitionId, area: 'start' });
    officials.push({ userId, email });
  }
  return officials;
}

/** Signs in through the real route (no faults), as the official does once at the hut. */
async function signIn(server: SimServer, email: string, deviceId: string): Promise<string> {
  const response = await fetch(`${server.origin()}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: server.origin() },
    body: JSON.stringify({ email, password, deviceId }),
  });
  if (!response.ok) throw new Error(`Sign-in of ${email} failed with ${response.status}: ${await response.text()}`);
  return sessionCookieFrom(response.headers.getSetCookie());
}

/** A device syncs until it has sent everything and is pulled to the end (or gives up after `tries`). */
async function syncUntil(device: SimDevice, done: () => Promise<boolean>, tries: number): Promise<boolean> {
  for (let attempt = 0; attempt < tries; attempt++) {
    const round = await device.sync();
    if (round.ok && (await done())) return true;
  }
  return false;
}

/**
 * One run of the randomised sync simulation (issue 5): real Express and PostgreSQL, devices on
 * fake-indexeddb with the real device store, faults on the network, devices and server; then
 * quiescence and every check. The database must be fresh and migrated; it is seeded here.
 * `beforeChecks` may change the database after quiescence (for tests of the checks themselves).
 */
export async function runSimulation(
  database: TestDatabase,
  options: SimulationOptions,
  beforeChecks?: (devices: readonly SimDevice[]) => Promise<void>,
): Promise<SimulationReport> {
  const started = performance.now();
  const random = seededRandom(options.seed);
  const schedule = random.fork('schedule');
  const problems: string[] = [];
  const ledger = new Ledger();
  let clock = Date.parse('2027-01-09T08:00:00.000Z');
  const now = () => clock;
  const phases = { setup: 0, morning: 0, quiescence: 0, checks: 0 };
  let phaseStart = started;
  const endPhase = (phase: keyof typeof phases) => {
    const at = performance.now();
    phases[phase] = (at - phaseStart) / 1_000;
    phaseStart = at;
  };

  // Dropping the database afterwards ends connections the pool is still closing; that is no failure.
  database.pool.on('error', () => undefined);
  await seedDemoScenario(database.db);
  const officials = await addOfficials(database, options.devices);
  const server = await startSimServer(database);
  const network = new SimNetwork(server, options.faultRate);
  const devices: SimDevice[] = [];
  const workloads: DeviceWorkload[] = [];
  let steps = 0;
  let failedRounds = 0;
  try {
    for (const [index, official] of officials.entries()) {
      const deviceRandom = random.fork(`device ${index}`);
      // Device ids from the seed: the server orders a batch's devices by id.
      const deviceId = uuidv4({ random: Uint8Array.from({ length: 16 }, () => deviceRandom.int(0, 255)) });
      const cookie = await signIn(server, official.email, deviceId);
      const device = new SimDevice({ index, deviceId, userId: official.userId, cookie, network, random: deviceRandom.fork('network'), now, problems });
      await device.open();
      devices.push(device);
    }

    // The shared start checks: made by the first device and pulled by every other before anyone edits them.
    const first = devices[0]!;
    const shared = await createSharedChecks(first, ledger, options.sharedRecords);
    if (!(await syncUntil(first, async () => (await first.db.outbox.count()) === 0, 200))) problems.push('the first device could not send the shared start checks');
    for (const device of devices.slice(1)) {
      const hasShared = async () => (await device.db.records.bulkGet(shared)).every((r) => r !== undefined);
      if (!(await syncUntil(device, hasShared, 200))) problems.push(`device ${device.index} could not pull the shared start checks`);
    }
    for (const device of devices) {
      workloads.push(new DeviceWorkload(device, random.fork(`workload ${device.index}`), ledger, shared, options.contestedSleds, device === first ? shared.length : 0));
    }

    endPhase('setup');

    // The morning: devices record offline and sync at random moments; faults everywhere.
    const busy = () => workloads.some((w) => w.made < options.opsPerDevice);
    while (busy()) {
      steps++;
      clock += schedule.int(1, 30) * 1_000;
      const taskCount = schedule.chance(options.parallelShare) ? schedule.int(2, 3) : 1;
      const chosen = new Set<number>();
      while (chosen.size < Math.min(taskCount, devices.length)) chosen.add(schedule.int(0, devices.length - 1));
      // Everything the step does is drawn before it runs, so devices running side by side draw nothing.
      const tasks = [...chosen].map((index) => {
        const sync = workloads[index]!.made >= options.opsPerDevice || schedule.chance(0.35);
        const burst = sync ? 0 : Math.min(schedule.int(1, 8), options.opsPerDevice - workloads[index]!.made);
        return { index, sync, killAfter: Array.from({ length: burst }, () => schedule.chance(options.faultRate)) };
      });
      if (tasks.some((t) => t.sync) && schedule.chance(options.faultRate)) await server.restart();
      await Promise.all(
        tasks.map(async ({ index, sync, killAfter }) => {
          const device = devices[index]!;
          if (sync && !(await device.sync()).ok) failedRounds++;
          for (const kill of killAfter) {
            await workloads[index]!.next();
            if (kill) await device.kill();
          }
        }),
      );
    }

    endPhase('morning');

    // Quiescence: no more faults; held-back requests arrive; every device sends everything, then pulls to the end.
    network.faultsOn = false;
    await network.deliverHeld();
    for (const device of devices) {
      if (!(await syncUntil(device, async () => (await device.db.outbox.count()) === 0, 20))) problems.push(`device ${device.index} could not empty its outbox`);
    }
    for (const device of devices) if (!(await device.sync()).ok) problems.push(`device ${device.index} could not pull after quiescence`);

    endPhase('quiescence');

    await beforeChecks?.(devices);
    const verdict = await checkInvariants(database.db, ledger, devices);
    endPhase('checks');
    const deviceTotals = devices.reduce((sum, d) => ({ kills: sum.kills + d.kills, rounds: sum.rounds + d.rounds, pages: sum.pages + d.pulledPages }), { kills: 0, rounds: 0, pages: 0 });
    return {
      ...verdict,
      problems: [...problems, ...verdict.problems],
      options,
      seconds: (performance.now() - started) / 1_000,
      phases,
      ops: ledger.ops.size,
      steps,
      syncRounds: deviceTotals.rounds,
      failedRounds,
      pulledPages: deviceTotals.pages,
      faults: { ...network.counts, kills: deviceTotals.kills, restarts: server.restarts() },
    };
  } finally {
    for (const device of devices) device.close();
    await server.close();
  }
}

/** A fresh random seed for the soak. */
export const randomSeed = () => randomBytes(4).readUInt32BE(0);
