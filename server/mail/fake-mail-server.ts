import { simpleParser } from 'mailparser';
import { SMTPServer, type SMTPServerDataStream, type SMTPServerSession } from 'smtp-server';
import type { Database } from '../db/client';
import { fakeMailMessages } from '../db/schema';
import type { Logger } from '../logger';

export const fakeMailHost = '127.0.0.1';
const largestMessageBytes = 1024 * 1024;

export interface FakeMailServer {
  readonly host: string;
  readonly port: number;
  close(): Promise<void>;
}

export interface FakeMailServerOptions {
  db: Database;
  /** 0 picks a free port (tests). */
  port: number;
  logger?: Logger;
}

async function keepMessage(db: Database, stream: SMTPServerDataStream, session: SMTPServerSession): Promise<void> {
  const parsed = await simpleParser(stream);
  if (stream.sizeExceeded) {
    throw Object.assign(new Error('The message is larger than the fake mail server keeps.'), { responseCode: 552 });
  }
  const envelopeFrom = session.envelope.mailFrom ? session.envelope.mailFrom.address : '';
  await db.insert(fakeMailMessages).values({
    from: parsed.from?.text ?? envelopeFrom,
    to: session.envelope.rcptTo.map((recipient) => recipient.address),
    subject: parsed.subject ?? '',
    text: parsed.text ?? '',
  });
}

/**
 * An SMTP server on loopback that delivers nothing: it keeps every message in fake_mail_messages for
 * the organisers' mailbox page. The message is stored before the sender is told it was accepted, so
 * once nodemailer's sendMail resolves the message is there to read.
 */
export async function startFakeMailServer({ db, port, logger }: FakeMailServerOptions): Promise<FakeMailServer> {
  const server = new SMTPServer({
    // Only reachable from this machine, so there is no password or TLS to protect anything with.
    authOptional: true,
    disabledCommands: ['AUTH', 'STARTTLS'],
    size: largestMessageBytes,
    logger: false,
    banner: 'Rimelog fake mail server: keeps messages for the mailbox page, delivers nothing',
    closeTimeout: 2_000,
    onData(stream, session, callback) {
      keepMessage(db, stream, session).then(
        () => callback(),
        (error: unknown) => {
          logger?.error({ err: error }, 'the fake mail server could not keep a message');
          callback(error instanceof Error ? error : new Error(String(error)));
        },
      );
    },
  });

  await new Promise<void>((resolve, reject) => {
    const refuse = (error: Error) =>
      reject(
        new Error(
          `The fake mail server could not listen on ${fakeMailHost}:${port} (${error.message}). ` +
            'Set RIMELOG_SMTP_PORT to a free port, or SMTP_URL to a real mail server.',
        ),
      );
    server.once('error', refuse);
    server.listen(port, fakeMailHost, () => {
      server.off('error', refuse);
      resolve();
    });
  });
  // Errors on single connections must not end the process.
  server.on('error', (error: Error) => logger?.warn({ err: error }, 'fake mail server connection error'));

  const address = server.server.address();
  if (address === null || typeof address === 'string') throw new Error('The fake mail server has no TCP port.');
  return {
    host: fakeMailHost,
    port: address.port,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
