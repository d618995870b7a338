import { desc } from 'drizzle-orm';
import nodemailer from 'nodemailer';
import { fakeMailMessages } from '../../server/db/schema';
import { startFakeMailServer, type FakeMailServer } from '../../server/mail/fake-mail-server';
import { createMailer, fakeServerMailer, type Mailer } from '../../server/mail/mailer';
import type { TestDatabase } from './test-database';

export const testMailFrom = 'Rimelog <no-reply@rimelog.test>';

/** For apps whose tests send no mail they look at: nodemailer renders each message and keeps nothing. */
export function discardingMailer(): Mailer {
  return createMailer({ transporter: nodemailer.createTransport({ jsonTransport: true }), from: testMailFrom, destination: 'nowhere (tests)' });
}

export interface TestMail {
  server: FakeMailServer;
  /** Real nodemailer over SMTP to the real fake mail server. */
  mailer: Mailer;
  /** Messages the fake mail server kept for one recipient, newest first, once all mail in flight is in. */
  messagesTo(address: string): Promise<(typeof fakeMailMessages.$inferSelect)[]>;
  close(): Promise<void>;
}

/** The fake mail server on a free loopback port, storing into the test database, and a mailer to it. */
export async function startTestMail(database: TestDatabase): Promise<TestMail> {
  const server = await startFakeMailServer({ db: database.db, port: 0 });
  const mailer = fakeServerMailer(server.host, server.port, testMailFrom);
  return {
    server,
    mailer,
    async messagesTo(address) {
      await mailer.settled();
      const rows = await database.db.select().from(fakeMailMessages).orderBy(desc(fakeMailMessages.receivedAt));
      return rows.filter((row) => row.to.includes(address));
    },
    async close() {
      await mailer.close();
      await server.close();
    },
  };
}

/** The one-time token of the first link to `path` (e.g. "/accept-invitation") in a mail's text. */
export function tokenFromLink(text: string, publicUrl: string, path: string): string {
  const match = new RegExp(`${publicUrl.replace(/[.]/g, '\\.')}${path}\\?token=([A-Za-z0-9_-]+)`).exec(text);
  if (!match) throw new Error(`No ${path} link in the mail:\n${text}`);
  return match[1]!;
}
