import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const projectRoot = fileURLToPath(new URL('..', import.meta.url));

function portFrom(value: string | undefined, fallback: number, name: string): number {
  if (value === undefined || value === '') return fallback;
  const port = Number(value);
  if (!Number.isInteger(port) || port < 0 || port > 65535) {
    throw new Error(`${name} must be a port number from 0 to 65535, not "${value}".`);
  }
  return port;
}

/** Everything the server reads from the environment, in one place. */
export interface ServerConfig {
  host: string;
  port: number;
  /** Set by the user to use their own PostgreSQL; otherwise the start command runs one. */
  databaseUrl: string | undefined;
  /** Port of the PostgreSQL the start command runs on loopback. */
  postgresPort: number;
  dataDir: string;
  clientDir: string;
}

export function readConfig(env: NodeJS.ProcessEnv = process.env): ServerConfig {
  return {
    host: env['HOST'] || '127.0.0.1',
    port: portFrom(env['PORT'], 4310, 'PORT'),
    databaseUrl: env['DATABASE_URL'] || undefined,
    postgresPort: portFrom(env['RIMELOG_PG_PORT'], 54329, 'RIMELOG_PG_PORT'),
    dataDir: path.resolve(projectRoot, env['RIMELOG_DATA_DIR'] || '.data'),
    clientDir: path.resolve(projectRoot, env['CLIENT_DIR'] || 'dist/rimelog/browser'),
  };
}
