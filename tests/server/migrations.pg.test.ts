import { cp, mkdtemp, readdir, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { projectRoot } from '../../server/config';
import { migrationsFolder } from '../../server/db/migrate';
import { runOrThrow } from '../../server/ops/run-command';
import { createTestDatabase } from '../support/test-database';

describe('migrations', () => {
  let scratch: string | undefined;
  afterAll(async () => {
    if (scratch) await rm(scratch, { recursive: true, force: true });
  });

  it('when drizzle-kit compares the schema with migrations/, then nothing is left to generate', async () => {
    scratch = await mkdtemp(path.join(os.tmpdir(), 'rimelog-migrations-'));
    await cp(migrationsFolder, scratch, { recursive: true });
    const before = (await readdir(scratch)).sort();
    await runOrThrow(
      path.join(projectRoot, 'node_modules/.bin/drizzle-kit'),
      ['generate', '--dialect', 'postgresql', '--schema', './server/db/schema.ts', '--out', scratch],
      { cwd: projectRoot },
    );
    expect((await readdir(scratch)).sort()).toEqual(before);
  });

  it('when applied to a fresh database, then the competitions table exists', async () => {
    const database = await createTestDatabase();
    try {
      const result = await database.pool.query(
        "select count(*)::int as n from information_schema.tables where table_name = 'competitions'",
      );
      expect(result.rows[0].n).toBe(1);
    } finally {
      await database.drop();
    }
  });
});
