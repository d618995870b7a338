// Vitest global setup: one throwaway PostgreSQL cluster for the whole run, with a migrated template
// database that each test file clones (CREATE DATABASE ... TEMPLATE) so files never share rows.
import { chmod, mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { connectDatabase } from '../../server/db/client';
import { applyMigrations } from '../../server/db/migrate';
import { freePort, startLocalPostgres } from '../../server/ops/postgres';
import { templateDatabase, withDatabaseName } from './database-names';

declare module 'vitest' {
  export interface ProvidedContext {
    pgAdminUrl: string;
  }
}

export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  const folder = await mkdtemp(path.join(os.tmpdir(), 'rimelog-test-pg-'));
  // The cluster runs as the postgres user when tests run as root: it must be able to enter here.
  await chmod(folder, 0o711);
  const postgres = await startLocalPostgres({
    dataDir: path.join(folder, 'data'),
    port: await freePort(),
    throwaway: true,
  });
  const adminUrl = withDatabaseName(postgres.url, 'postgres');
  const admin = connectDatabase(adminUrl);
  try {
    await admin.pool.query(`create database ${templateDatabase}`);
  } finally {
    await admin.close();
  }
  const template = connectDatabase(withDatabaseName(postgres.url, templateDatabase));
  try {
    await applyMigrations(template.db);
  } finally {
    await template.close();
  }
  project.provide('pgAdminUrl', adminUrl);
  return async () => {
    await postgres.stop();
    await rm(folder, { recursive: true, force: true });
  };
}
