import { afterAll, describe, expect, it } from 'vitest';
import { connectDatabase } from '../../server/db/client';
import { createTestDatabase } from '../support/test-database';

describe('database connections', () => {
  const databaseReady = createTestDatabase();
  afterAll(async () => (await databaseReady).drop());

  it('when PostgreSQL ends an idle connection, then it is reported, the process lives on and the next query gets a new connection', async () => {
    const database = await databaseReady;
    const reported: Error[] = [];
    const handle = connectDatabase(database.url, (error) => reported.push(error));
    try {
      const { rows } = await handle.pool.query<{ pid: number }>('select pg_backend_pid() as pid');
      const pid = rows[0]!.pid;

      await database.pool.query('select pg_terminate_backend($1)', [pid]);

      await expect.poll(() => reported.length, { timeout: 5_000 }).toBe(1);
      expect(reported[0]?.message).toMatch(/terminat/i);
      const again = await handle.pool.query<{ pid: number }>('select pg_backend_pid() as pid');
      expect(again.rows[0]!.pid).not.toBe(pid);
    } finally {
      await handle.close();
    }
  });
});
