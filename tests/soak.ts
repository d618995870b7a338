/**
 * `npm run soak -- --seeds 50`: the randomised sync simulation (issue 5) at full size with many random
 * seeds, each on a fresh database of a throwaway PostgreSQL. A failing seed is pinned in
 * tests/server/sync-simulation.regressions.json, which the simulation test runs as a fixed seed.
 *
 * Options: --seeds N (default 10), --seed S (run this seed only; repeatable), --devices N, --ops N.
 * Exits 1 when any seed fails.
 */
import { randomBytes } from 'node:crypto';
import { chmod, mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { connectDatabase } from '../server/db/client';
import { applyMigrations } from '../server/db/migrate';
import { freePort, startLocalPostgres } from '../server/ops/postgres';
import { withDatabaseName } from './support/database-names';
import { pinRegression, regressionsFile } from './support/sync-simulation/regressions';
import { describeReport } from './support/sync-simulation/describe-report';
import { fullSize, randomSeed, runSimulation, type SimulationOptions } from './support/sync-simulation/run-simulation';
import type { TestDatabase } from './support/test-database';

const { values } = parseArgs({
  options: {
    seeds: { type: 'string', default: '10' },
    seed: { type: 'string', multiple: true },
    devices: { type: 'string' },
    ops: { type: 'string' },
  },
});

const size = { ...fullSize, ...(values.devices ? { devices: Number(values.devices) } : {}), ...(values.ops ? { opsPerDevice: Number(values.ops) } : {}) };
const seeds = values.seed?.map(Number) ?? Array.from({ length: Number(values.seeds) }, randomSeed);
const template = 'rimelog_soak_template';

async function main(): Promise<number> {
  const folder = await mkdtemp(path.join(os.tmpdir(), 'rimelog-soak-pg-'));
  // The cluster runs as the postgres user when this runs as root: it must be able to enter here.
  await chmod(folder, 0o711);
  const postgres = await startLocalPostgres({ dataDir: path.join(folder, 'data'), port: await freePort(), throwaway: true });
  const admin = connectDatabase(withDatabaseName(postgres.url, 'postgres'));
  let failures = 0;
  try {
    await admin.pool.query(`create database ${template}`);
    const migrated = connectDatabase(withDatabaseName(postgres.url, template));
    await applyMigrations(migrated.db);
    await migrated.close();

    console.log(`Sync soak: ${seeds.length} seeds, ${size.devices} devices × ${size.opsPerDevice} ops each`);
    for (const seed of seeds) {
      const options: SimulationOptions = { ...size, seed };
      const name = `rimelog_soak_${randomBytes(5).toString('hex')}`;
      await admin.pool.query(`create database ${name} template ${template}`);
      const url = withDatabaseName(postgres.url, name);
      const handle = connectDatabase(url);
      const database: TestDatabase = {
        ...handle,
        url,
        async drop() {
          await handle.close();
          await admin.pool.query(`drop database if exists ${name} with (force)`);
        },
      };
      try {
        const report = await runSimulation(database, options);
        console.log(describeReport(report));
        if (report.problems.length > 0) {
          failures++;
          pinRegression(options, report.problems[0]!);
          console.log(`  pinned in ${path.relative(process.cwd(), regressionsFile)}`);
        }
      } catch (error) {
        failures++;
        console.log(`seed ${seed}: the run itself failed: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}`);
        pinRegression(options, `the run failed: ${error instanceof Error ? error.message : String(error)}`);
      } finally {
        await database.drop();
      }
    }
  } finally {
    await admin.close();
    await postgres.stop();
    await rm(folder, { recursive: true, force: true });
  }
  console.log(`\n${seeds.length - failures} seeds passed, ${failures} failed`);
  return failures === 0 ? 0 : 1;
}

main().then(
  (code) => process.exit(code),
  (error: unknown) => {
    console.error(error);
    process.exit(1);
  },
);
