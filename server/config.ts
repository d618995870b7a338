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
  /** Evidence photos and calibration certificates, each named by its SHA-256: `<dataDir>/uploads`. */
  uploadsDir: string;
  /** Largest photo or certificate accepted, in bytes (RIMELOG_UPLOAD_LIMIT_MB). */
  uploadLimitBytes: number;
  clientDir: string;
  /** Base URL of this server as devices reach it, put in e-mailed links (no trailing slash). */
  publicUrl: string;
  /** A real SMTP server to send mail through; when unset the local fake mail server is started. */
  smtpUrl: string | undefined;
  /** Port of the local fake mail server on 127.0.0.1. */
  smtpPort: number;
  /** The sender of Rimelog's e-mails. */
  mailFrom: string;
}

function megabytesFrom(value: string | undefined, fallback: number, name: string): number {
  if (value === undefined || value === '') return fallback * 1024 * 1024;
  const megabytes = Number(value);
  if (!Number.isFinite(megabytes) || megabytes <= 0) {
    throw new Error(`${name} must be a number of megabytes above 0, not "${value}".`);
  }
  return Math.floor(megabytes * 1024 * 1024);
}

/** A URL setting; its value is never echoed, since SMTP_URL may hold a password. */
function urlFrom(value: string | undefined, name: string, schemes: readonly string[]): string | undefined {
  if (value === undefined || value === '') return undefined;
  const scheme = URL.canParse(value) ? new URL(value).protocol.replace(/:$/, '') : undefined;
  if (scheme === undefined || !schemes.includes(scheme)) {
    throw new Error(`${name} must be a full URL starting with ${schemes.map((s) => `${s}://`).join(' or ')}.`);
  }
  return value.replace(/\/+$/, '');
}

export function readConfig(env: NodeJS.ProcessEnv = process.env): ServerConfig {
  const host = env['HOST'] || '127.0.0.1';
  const port = portFrom(env['PORT'], 4310, 'PORT');
  const dataDir = path.resolve(projectRoot, env['RIMELOG_DATA_DIR'] || '.data');
  return {
    host,
    port,
    databaseUrl: env['DATABASE_URL'] || undefined,
    postgresPort: portFrom(env['RIMELOG_PG_PORT'], 54329, 'RIMELOG_PG_PORT'),
    dataDir,
    uploadsDir: path.join(dataDir, 'uploads'),
    uploadLimitBytes: megabytesFrom(env['RIMELOG_UPLOAD_LIMIT_MB'], 10, 'RIMELOG_UPLOAD_LIMIT_MB'),
    clientDir: path.resolve(projectRoot, env['CLIENT_DIR'] || 'dist/rimelog/browser'),
    publicUrl: urlFrom(env['PUBLIC_URL'], 'PUBLIC_URL', ['http', 'https']) ?? `http://${host}:${port}`,
    smtpUrl: urlFrom(env['SMTP_URL'], 'SMTP_URL', ['smtp', 'smtps']),
    smtpPort: portFrom(env['RIMELOG_SMTP_PORT'], 2525, 'RIMELOG_SMTP_PORT'),
    mailFrom: env['MAIL_FROM'] || 'Rimelog <no-reply@localhost>',
  };
}
