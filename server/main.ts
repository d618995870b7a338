// The server on its own: `DATABASE_URL=postgres://... tsx server/main.ts`.
// `npm start` (server/ops/start.ts) wraps it with a local PostgreSQL, demo data and the client build.
import type { Server } from 'node:http';
import { pathToFileURL } from 'node:url';
import type { Logger } from 'pino';
import { createApp } from './app';
import { readConfig, type ServerConfig } from './config';
import { connectDatabase } from './db/client';
import { applyMigrations } from './db/migrate';
import { createLogger } from './logger';
import { startFakeMailServer, type FakeMailServer } from './mail/fake-mail-server';
import { fakeServerMailer, smtpUrlMailer, type Mailer } from './mail/mailer';

export interface RunningRimelog {
  url: string;
  database: ReturnType<typeof connectDatabase>;
  /** Where e-mail goes, in words to print. */
  mailDestination: string;
  /** Stops listening, sends the mail in flight, stops the fake mail server, closes the database pool. */
  close(): Promise<void>;
}

/**
 * Connects, applies pending migrations, starts the local fake mail server (unless SMTP_URL names a
 * real one) and listens; the caller owns the returned handle.
 */
export async function serve(config: ServerConfig, databaseUrl: string, logger: Logger): Promise<RunningRimelog> {
  const database = connectDatabase(databaseUrl, (error) => logger.warn({ err: error }, 'an idle database connection ended; the next query opens a new one'));
  let fakeMail: FakeMailServer | undefined;
  let mailer: Mailer | undefined;
  const closeMail = async () => {
    await mailer?.close();
    await fakeMail?.close();
  };
  try {
    await applyMigrations(database.db);
    if (config.smtpUrl) {
      mailer = smtpUrlMailer(config.smtpUrl, config.mailFrom);
    } else {
      fakeMail = await startFakeMailServer({ db: database.db, port: config.smtpPort, logger });
      mailer = fakeServerMailer(fakeMail.host, fakeMail.port, config.mailFrom);
    }
    const app = createApp({
      db: database.db,
      logger,
      clientDir: config.clientDir,
      mailer,
      publicUrl: config.publicUrl,
      uploadsDir: config.uploadsDir,
      uploadLimitBytes: config.uploadLimitBytes,
    });
    const server: Server = await new Promise((resolve, reject) => {
      const listening = app.listen(config.port, config.host, (error?: Error) => (error ? reject(error) : resolve(listening)));
    });
    return {
      url: `http://${config.host}:${config.port}/`,
      database,
      mailDestination: mailer.destination,
      async close() {
        const closed = new Promise<void>((resolve) => server.close(() => resolve()));
        // Browsers keep connections open; without this, Ctrl-C would wait for them to time out.
        server.closeAllConnections();
        await closed;
        await closeMail();
        await database.close();
      },
    };
  } catch (error) {
    await closeMail();
    await database.close();
    throw error;
  }
}

async function main(): Promise<void> {
  const config = readConfig();
  if (!config.databaseUrl) {
    console.error('Set DATABASE_URL to your PostgreSQL, or use `npm start`, which runs one for you.');
    process.exit(1);
  }
  const logger = createLogger(process.env['LOG_LEVEL'] ?? 'info');
  const running = await serve(config, config.databaseUrl, logger);
  logger.info({ url: running.url, mail: running.mailDestination }, 'Rimelog is listening');
  const stop = () => void running.close().then(() => process.exit(0));
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  await main();
}
