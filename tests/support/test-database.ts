import { randomBytes } from 'node:crypto';
import { inject } from 'vitest';
import { connectDatabase, type DatabaseHandle } from '../../server/db/client';
import { templateDatabase, withDatabaseName } from './database-names';

export interface TestDatabase extends DatabaseHandle {
  url: string;
  /** Closes the pool and drops the database. */
  drop(): Promise<void>;
}

/** A fresh, migrated database of its own for one test file, cloned from the template. */
export async function createTestDatabase(): Promise<TestDatabase> {
  const adminUrl = inject('pgAdminUrl');
  const name = `rimelog_test_${randomBytes(5).toString('hex')}`;
  const admin = connectDatabase(adminUrl);
  try {
    await admin.pool.query(`create database ${name} template ${templateDatabase}`);
  } finally {
    await admin.close();
  }
  const url = withDatabaseName(adminUrl, name);
  const handle = connectDatabase(url);
  return {
    ...handle,
    url,
    async drop() {
      await handle.close();
      const cleanup = connectDatabase(adminUrl);
      try {
        await cleanup.pool.query(`drop database if exists ${name} with (force)`);
      } finally {
        await cleanup.close();
      }
    },
  };
}
