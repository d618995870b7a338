import { desc } from 'drizzle-orm';
import nodemailer from 'nodemailer';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fakeMailMessages } from '../../server/db/schema';
import { startFakeMailServer } from '../../server/mail/fake-mail-server';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

let database: TestDatabase;

beforeAll(async () => {
  database = await createTestDatabase();
});
afterAll(() => database.drop());

const transportTo = (port: number) => nodemailer.createTransport({ host: '127.0.0.1', port, secure: false, ignoreTLS: true });

describe('the local fake mail server', () => {
  it('when a message for two people arrives, then it is kept with sender, both recipients, subject and text decoded', async () => {
    const server = await startFakeMailServer({ db: database.db, port: 0 });
    try {
      expect(server.host).toBe('127.0.0.1');
      await transportTo(server.port).sendMail({
        from: 'Rimelog <no-reply@rimelog.test>',
        to: ['runa@example.org', 'oskar@example.org'],
        subject: 'Kälte-Check 7 °C',
        text: 'Steel at −3.5 °C against control −4.0 °C.\nSecond line.',
      });
      const [kept] = await database.db.select().from(fakeMailMessages).orderBy(desc(fakeMailMessages.receivedAt)).limit(1);
      expect(kept).toMatchObject({
        from: '"Rimelog" <no-reply@rimelog.test>',
        to: ['runa@example.org', 'oskar@example.org'],
        subject: 'Kälte-Check 7 °C',
      });
      // SMTP ends the body with a line break; mailparser keeps it.
      expect(kept!.text.trimEnd()).toBe('Steel at −3.5 °C against control −4.0 °C.\nSecond line.');
    } finally {
      await server.close();
    }
  });

  it('when it is closed, then it takes no more mail', async () => {
    const server = await startFakeMailServer({ db: database.db, port: 0 });
    await server.close();
    await expect(transportTo(server.port).sendMail({ from: 'a@example.org', to: 'b@example.org', subject: 'x', text: 'x' })).rejects.toThrow();
  });

  it('when its port is taken, then starting says which setting to change', async () => {
    const first = await startFakeMailServer({ db: database.db, port: 0 });
    try {
      await expect(startFakeMailServer({ db: database.db, port: first.port })).rejects.toThrow(/Set RIMELOG_SMTP_PORT to a free port, or SMTP_URL/);
    } finally {
      await first.close();
    }
  });
});
