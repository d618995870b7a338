import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import type { Express } from 'express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiErrorBodySchema } from '../../shared/api/api-error';
import { devicePins, passwordResets, users } from '../../server/db/schema';
import { seedDemoScenario } from '../../server/ops/demo-scenario';
import { demoPassword } from '../../server/ops/demo-users';
import { startTestMail, tokenFromLink, type TestMail } from '../support/fake-mail';
import { sameOrigin, signInAs } from '../support/sign-in';
import { createTestApp, testPublicUrl } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

let database: TestDatabase;
let mail: TestMail;
let app: Express;

beforeAll(async () => {
  database = await createTestDatabase();
  await seedDemoScenario(database.db);
  mail = await startTestMail(database);
  app = createTestApp(database, undefined, { mailer: mail.mailer });
});
afterAll(async () => {
  await mail.close();
  await database.drop();
});

const askForReset = (email: string, on: Express = app) =>
  request(on).post('/api/auth/password-reset').set(sameOrigin).send({ email });
const confirm = (token: string, password: string) =>
  request(app).post('/api/auth/password-reset/confirm').set(sameOrigin).send({ token, password });
const signIn = (email: string, password: string) =>
  request(app).post('/api/auth/sign-in').set(sameOrigin).send({ email, password, deviceId: randomUUID() });
const errorOf = (body: unknown) => apiErrorBodySchema.parse(body).error;

async function resetToken(email: string): Promise<string> {
  await askForReset(email).expect(202);
  const [message] = await mail.messagesTo(email);
  return tokenFromLink(message!.text, testPublicUrl, '/reset-password');
}

async function userIdOf(email: string): Promise<string> {
  const [user] = await database.db.select({ id: users.id }).from(users).where(eq(users.email, email));
  return user!.id;
}

describe('asking for a password reset', () => {
  it('when the address has no account, then the answer is exactly that for a known one, and no mail is sent', async () => {
    const known = await askForReset('start-leader@frostbarrow.test').expect(202);
    const unknown = await askForReset('nobody-here@frostbarrow.test').expect(202);
    expect(unknown.body).toEqual(known.body);
    expect(unknown.headers['content-type']).toBe(known.headers['content-type']);
    expect(unknown.headers['content-length']).toBe(known.headers['content-length']);
    expect(await mail.messagesTo('nobody-here@frostbarrow.test')).toEqual([]);

    const [message] = await mail.messagesTo('start-leader@frostbarrow.test');
    expect(message!.subject).toBe('Reset your Rimelog password');
    expect(message!.text).toContain('Hello Runa Holt,');
    const token = tokenFromLink(message!.text, testPublicUrl, '/reset-password');
    expect(JSON.stringify(known.body)).not.toContain(token);
    const [row] = await database.db.select().from(passwordResets).where(eq(passwordResets.userId, await userIdOf('start-leader@frostbarrow.test')));
    const hoursValid = (row!.expiresAt.getTime() - Date.now()) / 3_600_000;
    expect(hoursValid).toBeGreaterThan(0.99);
    expect(hoursValid).toBeLessThanOrEqual(1);
  });

  it('when the e-mail address is malformed, then 400 says how to write one', async () => {
    const response = await askForReset('runa@').expect(400);
    expect(errorOf(response.body).details).toEqual([{ field: 'email', message: 'Enter a valid e-mail address, like name@example.org.' }]);
  });

  it('when an address asks a fourth time within the hour, then 429, in the same words whether or not it has an account', async () => {
    const limited = createTestApp(database, undefined, { mailer: mail.mailer });
    for (let i = 0; i < 3; i += 1) {
      await askForReset('delegate@frostbarrow.test', limited).expect(202);
      await askForReset('nobody-either@frostbarrow.test', limited).expect(202);
    }
    const known = await askForReset('delegate@frostbarrow.test', limited).expect(429);
    const unknown = await askForReset('nobody-either@frostbarrow.test', limited).expect(429);
    expect(errorOf(known.body)).toEqual(errorOf(unknown.body));
    expect(errorOf(known.body).message).toMatch(/^Too many password reset requests\. Wait 60 min/);
    expect(await mail.messagesTo('delegate@frostbarrow.test')).toHaveLength(3);
  });
});

describe('choosing a new password', () => {
  it('when the link is used, then the new password works, the old does not, every old session ends and the device PINs are gone', async () => {
    const email = 'finish-official@frostbarrow.test';
    const oldCookie = await signInAs(app, email);
    await request(app).post('/api/auth/pin').set(sameOrigin).set('Cookie', oldCookie).send({ password: demoPassword, pin: '2468' }).expect(204);
    const otherDevice = await signInAs(app, email);
    expect(await database.db.select().from(devicePins).where(eq(devicePins.userId, await userIdOf(email)))).toHaveLength(1);

    const token = await resetToken(email);
    await confirm(token, 'fresh snow on the track').expect(204);

    await request(app).get('/api/auth/me').set('Cookie', oldCookie).expect(401);
    await request(app).get('/api/auth/me').set('Cookie', otherDevice).expect(401);
    expect(await database.db.select().from(devicePins).where(eq(devicePins.userId, await userIdOf(email)))).toEqual([]);
    await signIn(email, demoPassword).expect(401);
    const newCookie = await signInAs(app, email, { password: 'fresh snow on the track' });
    await request(app).get('/api/auth/me').set('Cookie', newCookie).expect(200);
  });

  it('when the link is used a second time, then 400 says to ask for a new link, and the password stays', async () => {
    const email = 'finish-leader@frostbarrow.test';
    const token = await resetToken(email);
    await confirm(token, 'the first new password').expect(204);
    const again = await confirm(token, 'a second new password').expect(400);
    expect(errorOf(again.body).message).toMatch(/already used.*Ask for a new link on the sign-in page\.$/);
    await signIn(email, 'the first new password').expect(200);
  });

  it('when two links were sent and one is used, then the other no longer works', async () => {
    const email = 'start-official-2@frostbarrow.test';
    const first = await resetToken(email);
    const second = await resetToken(email);
    expect(second).not.toBe(first);
    await confirm(second, 'the newer link was used').expect(204);
    await confirm(first, 'the older link tried later').expect(400);
    await signIn(email, 'the newer link was used').expect(200);
  });

  it('when the link has run out, then 400 and the old password still works', async () => {
    const email = 'start-official@frostbarrow.test';
    const token = await resetToken(email);
    await database.db
      .update(passwordResets)
      .set({ expiresAt: new Date(Date.now() - 60_000) })
      .where(eq(passwordResets.userId, await userIdOf(email)));
    const response = await confirm(token, 'too late for this link').expect(400);
    expect(errorOf(response.body).details).toEqual([{ field: 'token', message: 'ask for a new password reset link' }]);
    await signIn(email, demoPassword).expect(200);
  });

  it('when the new password is too short, then 400 names the field and the link still works', async () => {
    const email = 'organiser@frostbarrow.test';
    const token = await resetToken(email);
    const response = await confirm(token, 'short').expect(400);
    expect(errorOf(response.body).details[0]!.field).toBe('password');
    await confirm(token, 'long enough this time').expect(204);
  });
});
