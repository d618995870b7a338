import { randomBytes } from 'node:crypto';
import { existsSync, readdirSync } from 'node:fs';
import { appendFile, chmod, chown, mkdir, readFile, rm, writeFile } from 'node:fs/promises';
import { createServer } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';
import { runCommand, runOrThrow } from './run-command';

const superuser = 'rimelog';
const databaseName = 'rimelog';
const debianPostgresRoot = '/usr/lib/postgresql';

export interface LocalPostgresOptions {
  /** Cluster folder; created with initdb when it holds no cluster yet. */
  dataDir: string;
  port: number;
  /** Remove the cluster when it stops (the test run's own database). */
  throwaway?: boolean;
  log?: (line: string) => void;
}

export interface LocalPostgres {
  url: string;
  stop(): Promise<void>;
}

const isRoot = () => process.getuid?.() === 0;

/** Newest Debian PostgreSQL install, e.g. /usr/lib/postgresql/15/bin, or undefined. */
export function findPostgresBinaries(): string | undefined {
  if (!existsSync(debianPostgresRoot)) return undefined;
  const versions = readdirSync(debianPostgresRoot)
    .filter((name) => existsSync(path.join(debianPostgresRoot, name, 'bin', 'pg_ctl')))
    .sort((a, b) => Number(b) - Number(a));
  return versions[0] === undefined ? undefined : path.join(debianPostgresRoot, versions[0], 'bin');
}

async function installPostgresFromDebian(log: (line: string) => void): Promise<string> {
  if (!isRoot()) {
    throw new Error(
      'PostgreSQL is not installed and only root can install it. Run `apt-get install postgresql` ' +
        'or set DATABASE_URL to a server of your own.',
    );
  }
  log('PostgreSQL not found: installing Debian\'s postgresql package (one time)...');
  // Debian would otherwise create and start a system-wide cluster on port 5432 that we never use.
  const createClusterConf = '/etc/postgresql-common/createcluster.conf';
  if (!existsSync(createClusterConf)) {
    await mkdir(path.dirname(createClusterConf), { recursive: true });
    await writeFile(createClusterConf, 'create_main_cluster = false\n');
  }
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  await runOrThrow('apt-get', ['update', '-qq'], { env });
  await runOrThrow('apt-get', ['install', '-y', '-qq', '--no-install-recommends', 'postgresql'], { env });
  const bin = findPostgresBinaries();
  if (!bin) throw new Error('apt-get installed postgresql, but no pg_ctl was found under /usr/lib/postgresql.');
  return bin;
}

/** PostgreSQL refuses to run as root, so as root every server command runs as the `postgres` user. */
function asServerUser(command: string, args: string[]): [string, string[]] {
  return isRoot() ? ['runuser', ['-u', 'postgres', '--', command, ...args]] : [command, args];
}

async function giveToServerUser(...paths: string[]): Promise<void> {
  if (!isRoot()) return;
  const uid = Number((await runOrThrow('id', ['-u', 'postgres'])).trim());
  const gid = Number((await runOrThrow('id', ['-g', 'postgres'])).trim());
  for (const p of paths) await chown(p, uid, gid);
}

/** As root, the `postgres` user must be able to reach the cluster folder through every parent. */
async function checkServerUserCanReach(folder: string): Promise<void> {
  if (!isRoot()) return;
  const [cmd, args] = asServerUser('test', ['-x', folder]);
  if ((await runCommand(cmd, args)).code !== 0) {
    throw new Error(
      `The postgres user cannot enter ${folder}, so PostgreSQL cannot keep its data there. ` +
        'Let other users enter the folders above it (chmod o+x), or set RIMELOG_DATA_DIR elsewhere.',
    );
  }
}

async function initCluster(bin: string, dataDir: string, passwordFile: string): Promise<void> {
  await checkServerUserCanReach(path.dirname(dataDir));
  await mkdir(dataDir, { recursive: true, mode: 0o700 });
  await chmod(dataDir, 0o700);
  const password = randomBytes(18).toString('base64url');
  await writeFile(passwordFile, password + '\n', { mode: 0o600 });
  // initdb reads the password from a file the server user can read; it lives only during initdb.
  const scratch = path.join(os.tmpdir(), `rimelog-pw-${randomBytes(6).toString('hex')}`);
  await writeFile(scratch, password + '\n', { mode: 0o600 });
  try {
    await giveToServerUser(dataDir, scratch);
    const [cmd, args] = asServerUser(path.join(bin, 'initdb'), [
      '-D', dataDir, '-U', superuser, `--pwfile=${scratch}`,
      '--auth=scram-sha-256', '--encoding=UTF8', '--locale=C',
    ]);
    await runOrThrow(cmd, args);
  } finally {
    await rm(scratch, { force: true });
  }
  // Loopback TCP only: no Unix socket, so the data folder may sit anywhere the server user can reach.
  await appendFile(
    path.join(dataDir, 'postgresql.conf'),
    "\n# Rimelog: loopback only\nlisten_addresses = '127.0.0.1'\nunix_socket_directories = ''\n",
  );
}

async function isPortFree(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const probe = createServer();
    probe.once('error', () => resolve(false));
    probe.listen(port, '127.0.0.1', () => probe.close(() => resolve(true)));
  });
}

/** A port nobody listens on right now, for the throwaway test cluster. */
export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const address = probe.address();
      const port = typeof address === 'object' && address ? address.port : 0;
      probe.close(() => resolve(port));
    });
  });
}

async function ensureDatabase(adminUrl: string): Promise<void> {
  const client = new pg.Client({ connectionString: adminUrl });
  await client.connect();
  try {
    const found = await client.query('select 1 from pg_database where datname = $1', [databaseName]);
    if (found.rowCount === 0) await client.query(`create database ${databaseName}`);
  } finally {
    await client.end();
  }
}

/**
 * Starts (creating when needed) a PostgreSQL cluster of Debian's packages on 127.0.0.1:port,
 * installing the package first when it is missing, and waits until it accepts connections.
 */
export async function startLocalPostgres(options: LocalPostgresOptions): Promise<LocalPostgres> {
  const log = options.log ?? (() => {});
  const { dataDir, port } = options;
  const bin = findPostgresBinaries() ?? (await installPostgresFromDebian(log));
  const passwordFile = `${dataDir}.password`;
  await mkdir(path.dirname(dataDir), { recursive: true });

  if (!existsSync(path.join(dataDir, 'PG_VERSION'))) {
    log(`Creating a PostgreSQL cluster in ${dataDir}`);
    await initCluster(bin, dataDir, passwordFile);
  }
  const password = (await readFile(passwordFile, 'utf8')).trim();
  const pgCtl = (...args: string[]) => asServerUser(path.join(bin, 'pg_ctl'), ['-D', dataDir, ...args]);

  const [statusCmd, statusArgs] = pgCtl('status');
  const alreadyRunning = (await runCommand(statusCmd, statusArgs)).code === 0;
  if (alreadyRunning) {
    log('PostgreSQL was still running from an earlier start: stopping it to start afresh.');
    const [stopCmd, stopArgs] = pgCtl('stop', '-m', 'fast', '-w');
    await runOrThrow(stopCmd, stopArgs);
  }
  if (!(await isPortFree(port))) {
    throw new Error(
      `Port ${port} on 127.0.0.1 is taken, so PostgreSQL cannot start there. ` +
        'Set RIMELOG_PG_PORT to a free port, or DATABASE_URL to a server of your own.',
    );
  }
  const [startCmd, startArgs] = pgCtl(
    'start', '-w', '-t', '60', '-l', path.join(dataDir, 'server.log'), '-o', `-p ${port}`,
  );
  try {
    await runOrThrow(startCmd, startArgs);
  } catch (error) {
    const serverLog = await readFile(path.join(dataDir, 'server.log'), 'utf8').catch(() => '');
    throw new Error(`${(error as Error).message}\nPostgreSQL log:\n${serverLog.slice(-2000)}`);
  }
  const auth = `${superuser}:${encodeURIComponent(password)}@127.0.0.1:${port}`;
  await ensureDatabase(`postgres://${auth}/postgres`);
  log(`PostgreSQL is up on 127.0.0.1:${port}`);

  let stopped = false;
  return {
    url: `postgres://${auth}/${databaseName}`,
    async stop() {
      if (stopped) return;
      stopped = true;
      const [stopCmd, stopArgs] = pgCtl('stop', '-m', 'fast', '-w');
      await runCommand(stopCmd, stopArgs);
      if (options.throwaway) {
        await rm(dataDir, { recursive: true, force: true });
        await rm(passwordFile, { force: true });
      }
    },
  };
}
