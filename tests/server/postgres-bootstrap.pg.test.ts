import { existsSync, statSync } from 'node:fs';
import { chmod, mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';
import { afterAll, describe, expect, it } from 'vitest';
import { freePort, startLocalPostgres, type LocalPostgres } from '../../server/ops/postgres';
import { runOrThrow } from '../../server/ops/run-command';

const isRoot = process.getuid?.() === 0;

async function query(url: string, sql: string): Promise<string> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    const result = await client.query<{ value: string }>(sql);
    return result.rows[0]!.value;
  } finally {
    await client.end();
  }
}

describe('startLocalPostgres', () => {
  let folder: string;
  let postgres: LocalPostgres | undefined;

  afterAll(async () => {
    await postgres?.stop();
    await rm(folder, { recursive: true, force: true });
  });

  it('when started in an empty folder, then a loopback-only cluster runs and is removed after', async () => {
    folder = await mkdtemp(path.join(os.tmpdir(), 'rimelog-bootstrap-'));
    await chmod(folder, 0o711);
    const dataDir = path.join(folder, 'data');
    const port = await freePort();
    postgres = await startLocalPostgres({ dataDir, port, throwaway: true });

    expect(await query(postgres.url, "select current_setting('listen_addresses') as value")).toBe('127.0.0.1');
    expect(await query(postgres.url, "select current_setting('port') as value")).toBe(String(port));
    expect(await query(postgres.url, "select current_setting('unix_socket_directories') as value")).toBe('');
    expect(await query(postgres.url, 'select current_database() as value')).toBe('rimelog');
    expect(await query(postgres.url, "select current_setting('password_encryption') as value")).toBe(
      'scram-sha-256',
    );
    if (isRoot) {
      // PostgreSQL refuses root, so as root the cluster must belong to the postgres user.
      const postgresUid = Number((await runOrThrow('id', ['-u', 'postgres'])).trim());
      expect(statSync(dataDir).uid).toBe(postgresUid);
    }

    await postgres.stop();
    expect(existsSync(dataDir)).toBe(false);
    await expect(query(postgres.url, 'select 1 as value')).rejects.toThrow();
  });

  it('when the password is wrong, then the cluster refuses the connection', async () => {
    folder ??= await mkdtemp(path.join(os.tmpdir(), 'rimelog-bootstrap-'));
    await chmod(folder, 0o711);
    postgres = await startLocalPostgres({
      dataDir: path.join(folder, 'data2'),
      port: await freePort(),
      throwaway: true,
    });
    const wrong = new URL(postgres.url);
    wrong.password = 'not-the-password';
    await expect(query(wrong.toString(), 'select 1 as value')).rejects.toThrow(/password authentication failed/);
  });
});
