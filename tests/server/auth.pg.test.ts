import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiErrorBodySchema } from '../../shared/api/api-error';
import { meSchema } from '../../shared/auth/auth-api';
import { sessions, users } from '../../server/db/schema';
import { demoPassword } from '../../server/ops/demo-users';
import { seedDemoScenario } from '../../server/ops/demo-scenario';
import { sameOrigin, sessionCookieFrom, signInAs } from '../support/sign-in';
import { createTestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

let database: TestDatabase;
let app: ReturnType<typeof createTestApp>;

beforeAll(async () => {
  database = await createTestDatabase();
  await seedDemoScenario(database.db);
  app = createTestApp(database);
});
afterAll(() => database.drop());

const official = 'start-official@frostbarrow.test';
const signIn = (body: object) => request(app).post('/api/auth/sign-in').set(sameOrigin).send({ deviceId: randomUUID(), ...body });
const me = (cookie: string) => request(app).get('/api/auth/me').set('Cookie', cookie);
const errorOf = (body: unknown) => apiErrorBodySchema.parse(body).error;

describe('signing in', () => {
  it('when the password is right, then a Secure, HttpOnly, SameSite session cookie is set and the roles come back (SPEC §2, §5)', async () => {
    const response = await signIn({ email: official, password: demoPassword }).expect(200);
    const cookie = ([] as string[]).concat(response.headers['set-cookie'] ?? []).find((c) => c.startsWith('rimelog_session='))!;
    expect(cookie).toMatch(/; HttpOnly/);
    expect(cookie).toMatch(/; Secure/);
    expect(cookie).toMatch(/; SameSite=Lax/);
    expect(cookie).toMatch(/; Path=\//);
    const body = meSchema.parse(response.body);
    expect(body.user.displayName).toBe('Pim Aldous');
    expect(body.roles).toEqual([
      { role: 'official', competitionId: '0193a5c0-0000-7000-8000-000000000001', area: 'start' },
      { role: 'official', competitionId: '0193a5c0-0000-7000-8000-000000000003', area: 'start' },
    ]);
    // SPEC §2: three days
    const lifetimeHours = (Date.parse(body.sessionExpiresAt) - Date.now()) / 3_600_000;
    expect(lifetimeHours).toBeGreaterThan(71.9);
    expect(lifetimeHours).toBeLessThanOrEqual(72);
  });

  it('when the e-mail is written in capitals, then it still signs in', async () => {
    await signIn({ email: official.toUpperCase(), password: demoPassword }).expect(200);
  });

  it('when the password is wrong or the account unknown, then both get the same 401 and words (SPEC §4)', async () => {
    const wrong = await signIn({ email: 'start-leader@frostbarrow.test', password: 'not the password' }).expect(401);
    const unknown = await signIn({ email: 'nobody@frostbarrow.test', password: 'not the password' }).expect(401);
    expect(errorOf(wrong.body)).toEqual(errorOf(unknown.body));
    expect(errorOf(wrong.body).message).toBe('The e-mail address or the password is not right.');
  });

  it('when the e-mail is malformed or the device id missing, then 400 names the field in words', async () => {
    const response = await signIn({ email: 'pim at frostbarrow', password: 'x' }).expect(400);
    expect(errorOf(response.body).details[0]).toEqual({ field: 'email', message: 'Enter a valid e-mail address, like name@example.org.' });
    await request(app).post('/api/auth/sign-in').set(sameOrigin).send({ email: official, password: demoPassword }).expect(400);
  });

  it('when the password is stored, then it is an Argon2id hash with m=19456, t=2, p=1 (SPEC §1)', async () => {
    const [row] = await database.db.select({ hash: users.passwordHash }).from(users).where(eq(users.email, official));
    // OWASP Password Storage Cheat Sheet, Argon2id: m=19456 (19 MiB), t=2, p=1
    expect(row!.hash).toMatch(/^\$argon2id\$v=19\$m=19456,t=2,p=1\$/);
  });
});

describe('failed sign-ins are limited (SPEC §4)', () => {
  it('when an account has 5 failures, then even the right password gets 429, and another account is not affected', async () => {
    const limited = createTestApp(database);
    const attempt = (email: string, password: string) =>
      request(limited).post('/api/auth/sign-in').set(sameOrigin).send({ email, password, deviceId: randomUUID() });
    for (let i = 0; i < 5; i += 1) await attempt('finish-official@frostbarrow.test', 'wrong password').expect(401);
    const blocked = await attempt('finish-official@frostbarrow.test', demoPassword).expect(429);
    expect(errorOf(blocked.body).message).toMatch(/^Too many failed attempts\. Wait 15 min/);
    await attempt('finish-leader@frostbarrow.test', demoPassword).expect(200);
  });
});

describe('the Origin check (SPEC §3)', () => {
  it('when a state-changing request has no Origin or another site as Origin, then 403 before anything else', async () => {
    const body = { email: official, password: demoPassword, deviceId: randomUUID() };
    const none = await request(app).post('/api/auth/sign-in').send(body).expect(403);
    expect(errorOf(none.body).code).toBe('forbidden');
    await request(app).post('/api/auth/sign-in').set({ Host: 'rimelog.test', Origin: 'https://elsewhere.example' }).send(body).expect(403);
  });

  it('when a read-only request has no Origin, then it is served', async () => {
    await request(app).get('/api/competitions').expect(200);
  });
});

describe('sessions end', () => {
  it('when the session has expired, then the cookie no longer works and is cleared (SPEC §2)', async () => {
    const cookie = await signInAs(app, official);
    const id = cookie.split('=')[1]!;
    await database.db.update(sessions).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(sessions.id, id));
    const response = await me(cookie).expect(401);
    expect(([] as string[]).concat(response.headers['set-cookie'] ?? [])[0]).toMatch(/^rimelog_session=;/);
  });

  it('when an official signs out, then that cookie is dead but their other device still works (SPEC §7)', async () => {
    const phone = await signInAs(app, official);
    const tablet = await signInAs(app, official);
    await request(app).post('/api/auth/sign-out').set(sameOrigin).set('Cookie', phone).expect(204);
    await me(phone).expect(401);
    await me(tablet).expect(200);
  });

  it('when an official signs out everywhere, then every session of theirs ends (SPEC §7)', async () => {
    const phone = await signInAs(app, official);
    const tablet = await signInAs(app, official);
    await request(app).post('/api/auth/sign-out-everywhere').set(sameOrigin).set('Cookie', phone).expect(204);
    await me(phone).expect(401);
    await me(tablet).expect(401);
  });
});

describe('switching officials on a shared device by PIN (SPEC §6)', () => {
  it('when a second official set a PIN on this device, then the first hands over with it and the server session follows', async () => {
    const deviceId = randomUUID();
    const second = await signInAs(app, 'start-official-2@frostbarrow.test', { deviceId });
    await request(app).post('/api/auth/pin').set(sameOrigin).set('Cookie', second).send({ password: 'wrong password', pin: '4711' }).expect(401);
    await request(app).post('/api/auth/pin').set(sameOrigin).set('Cookie', second).send({ password: demoPassword, pin: '4711' }).expect(204);
    expect(meSchema.parse((await me(second).expect(200)).body).hasPin).toBe(true);

    const first = await signInAs(app, official, { deviceId });
    const listed = await request(app).get('/api/auth/device-users').set('Cookie', first).expect(200);
    const secondUser = (listed.body as { users: { id: string; displayName: string }[] }).users.find((u) => u.displayName === 'Kaja Brenn')!;
    expect(secondUser).toBeDefined();

    const switchTo = (cookie: string, pin: string) =>
      request(app).post('/api/auth/switch').set(sameOrigin).set('Cookie', cookie).send({ userId: secondUser.id, pin });
    const refused = await switchTo(first, '1234').expect(401);
    expect(errorOf(refused.body).message).toBe('That PIN is not right for this official on this device.');
    const switched = await switchTo(first, '4711').expect(200);
    expect(meSchema.parse(switched.body).user.displayName).toBe('Kaja Brenn');
    const newCookie = sessionCookieFrom(switched.headers['set-cookie']);
    expect(meSchema.parse((await me(newCookie).expect(200)).body).deviceId).toBe(deviceId);

    const elsewhere = await signInAs(app, official);
    await switchTo(elsewhere, '4711').expect(401);
  });

  it('when the PIN is not 4 to 6 digits, then 400 says so', async () => {
    const cookie = await signInAs(app, official);
    const response = await request(app).post('/api/auth/pin').set(sameOrigin).set('Cookie', cookie).send({ password: demoPassword, pin: '12a' }).expect(400);
    expect(errorOf(response.body).details[0]!.message).toBe('A PIN is 4 to 6 digits.');
  });
});
