import { eq } from 'drizzle-orm';
import type { Express } from 'express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiErrorBodySchema } from '../../shared/api/api-error';
import { meSchema, type InvitationRequest } from '../../shared/auth/auth-api';
import type { RoleAssignment } from '../../shared/auth/roles';
import { mailboxSchema } from '../../shared/mail/mailbox';
import { hashToken } from '../../server/auth/one-time-tokens';
import { hashSecret } from '../../server/auth/passwords';
import { grantRole, loadRoles } from '../../server/auth/role-store';
import { generateUserId } from '../../server/auth/user-ids';
import { fakeMailMessages, invitations, users } from '../../server/db/schema';
import { startFakeMailServer } from '../../server/mail/fake-mail-server';
import { fakeServerMailer } from '../../server/mail/mailer';
import { demoCompetitions, demoOpenCompetitionId, seedDemoScenario } from '../../server/ops/demo-scenario';
import { demoPassword } from '../../server/ops/demo-users';
import { startTestMail, tokenFromLink, type TestMail } from '../support/fake-mail';
import { sameOrigin, signInAs } from '../support/sign-in';
import { createTestApp, testPublicUrl } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

let database: TestDatabase;
let mail: TestMail;
let app: Express;
let organiser: string;

const openRace = demoCompetitions[0];
const otherRace = demoCompetitions[1];
const startOfficial: RoleAssignment = { role: 'official', competitionId: openRace.id, area: 'start' };
const dayMs = 24 * 60 * 60 * 1000;

beforeAll(async () => {
  database = await createTestDatabase();
  await seedDemoScenario(database.db);
  mail = await startTestMail(database);
  app = createTestApp(database, undefined, { mailer: mail.mailer });
  organiser = await signInAs(app, 'organiser@frostbarrow.test');
});
afterAll(async () => {
  await mail.close();
  await database.drop();
});

const invite = (cookie: string | undefined, body: InvitationRequest | Record<string, unknown>) => {
  const call = request(app).post('/api/invitations').set(sameOrigin).send(body);
  return cookie ? call.set('Cookie', cookie) : call;
};
const accept = (token: string, password = 'a long sled run at night') =>
  request(app).post('/api/invitations/accept').set(sameOrigin).send({ token, password });
const errorOf = (body: unknown) => apiErrorBodySchema.parse(body).error;

/** Invites someone new as the demo organiser and returns the token from the mail they received. */
async function invitedToken(email: string, assignment: RoleAssignment = startOfficial): Promise<string> {
  await invite(organiser, { email, displayName: 'Someone New', assignment }).expect(201);
  const [message] = await mail.messagesTo(email);
  return tokenFromLink(message!.text, testPublicUrl, '/accept-invitation');
}

describe('inviting someone new', () => {
  it('when an organiser invites, then the mail arrives with a one-time link, and accepting it makes an account that signs in with the role', async () => {
    const response = await invite(organiser, { email: 'Ada.Quill@Example.org', displayName: 'Ada Quill', assignment: startOfficial }).expect(201);
    expect(Object.keys(response.body)).toEqual(['expiresAt']);
    const daysValid = (Date.parse(response.body.expiresAt) - Date.now()) / dayMs;
    expect(daysValid).toBeGreaterThan(6.99);
    expect(daysValid).toBeLessThanOrEqual(7);

    const stored = await mail.messagesTo('ada.quill@example.org');
    expect(stored).toHaveLength(1);
    expect(stored[0]!.subject).toBe('You are invited to Rimelog');
    expect(stored[0]!.from).toContain('no-reply@rimelog.test');
    expect(stored[0]!.text).toContain('Hello Ada Quill,');
    expect(stored[0]!.text).toContain('Ilse Marrow has invited you');
    expect(stored[0]!.text).toContain(`Official at the start of ${openRace.name}`);
    const token = tokenFromLink(stored[0]!.text, testPublicUrl, '/accept-invitation');
    expect(JSON.stringify(response.body)).not.toContain(token);

    // Only the SHA-256 of the token is kept.
    const [row] = await database.db.select().from(invitations).where(eq(invitations.email, 'ada.quill@example.org'));
    expect(row!.tokenHash).toBe(hashToken(token));
    expect(JSON.stringify(row)).not.toContain(token);

    const accepted = await accept(token, 'ice on the runners tonight').expect(201);
    expect(accepted.body).toEqual({ email: 'ada.quill@example.org' });

    const cookie = await signInAs(app, 'ada.quill@example.org', { password: 'ice on the runners tonight' });
    const me = meSchema.parse((await request(app).get('/api/auth/me').set('Cookie', cookie).expect(200)).body);
    expect(me.user.displayName).toBe('Ada Quill');
    expect(me.roles).toEqual([startOfficial]);
    const [user] = await database.db.select({ hash: users.passwordHash }).from(users).where(eq(users.email, 'ada.quill@example.org'));
    expect(user!.hash).toMatch(/^\$argon2id\$/);
  });

  it('when the invitation mail has arrived, then organisers read it in the mailbox, newest first', async () => {
    await invitedToken('first.reader@example.org');
    await invitedToken('second.reader@example.org');
    const response = await request(app).get('/api/mailbox').set('Cookie', organiser).expect(200);
    const { messages } = mailboxSchema.parse(response.body);
    expect(messages[0]!.to).toEqual(['second.reader@example.org']);
    expect(messages[1]!.to).toEqual(['first.reader@example.org']);
    expect(messages[0]!.text).toContain(`${testPublicUrl}/accept-invitation?token=`);
    const times = messages.map((m) => Date.parse(m.receivedAt));
    expect(times).toEqual([...times].sort((a, b) => b - a));
  });

  it('when an invitation is used a second time, then 400 says to ask the organiser for a new one', async () => {
    const token = await invitedToken('twice@example.org');
    await accept(token).expect(201);
    const again = await accept(token, 'another password entirely').expect(400);
    expect(errorOf(again.body).message).toMatch(/already used.*Ask the organiser for a new invitation\.$/);
    await signInAs(app, 'twice@example.org', { password: 'a long sled run at night' });
  });

  it('when an invitation has run out, then it is refused and no account is made', async () => {
    const token = await invitedToken('late@example.org');
    await database.db
      .update(invitations)
      .set({ expiresAt: new Date(Date.now() - 60_000) })
      .where(eq(invitations.email, 'late@example.org'));
    const response = await accept(token).expect(400);
    expect(errorOf(response.body).message).toMatch(/run out.*Ask the organiser for a new invitation\.$/);
    expect(await database.db.select().from(users).where(eq(users.email, 'late@example.org'))).toEqual([]);
  });

  it('when the token is made up, then 400 with the same words', async () => {
    const response = await accept('x'.repeat(43)).expect(400);
    expect(errorOf(response.body).details).toEqual([{ field: 'token', message: 'ask the organiser for a new invitation' }]);
  });

  it('when the password for the new account is too short, then 400 names the field and nothing is used up', async () => {
    const token = await invitedToken('short@example.org');
    const response = await accept(token, 'sled').expect(400);
    expect(errorOf(response.body).details[0]!.field).toBe('password');
    await accept(token).expect(201);
  });
});

describe('who may invite', () => {
  const body = (email: string, assignment: RoleAssignment = startOfficial) => ({ email, displayName: 'Someone', assignment });

  it('when an official invites, then 403, and no invitation or mail is made', async () => {
    const official = await signInAs(app, 'start-official@frostbarrow.test');
    const response = await invite(official, body('by-official@example.org')).expect(403);
    expect(errorOf(response.body).code).toBe('forbidden');
    expect(await mail.messagesTo('by-official@example.org')).toEqual([]);
    expect(await database.db.select().from(invitations).where(eq(invitations.email, 'by-official@example.org'))).toEqual([]);
  });

  it('when nobody is signed in, then 401', async () => {
    const response = await invite(undefined, body('by-nobody@example.org')).expect(401);
    expect(errorOf(response.body).code).toBe('unauthenticated');
  });

  it('when the organiser of one competition invites, then only for that competition, never for another or for all', async () => {
    const email = 'one-race-organiser@example.org';
    const id = generateUserId();
    await database.db.insert(users).values({ id, email, displayName: 'Wenna Stroud', passwordHash: await hashSecret(demoPassword) });
    await grantRole(database.db, id, { role: 'organiser', competitionId: openRace.id, area: null });
    const cookie = await signInAs(app, email);

    await invite(cookie, body('here@example.org')).expect(201);
    await invite(cookie, body('elsewhere@example.org', { role: 'official', competitionId: otherRace.id, area: 'start' })).expect(403);
    await invite(cookie, body('everywhere@example.org', { role: 'organiser', competitionId: null, area: null })).expect(403);
    expect(await mail.messagesTo('elsewhere@example.org')).toEqual([]);
    expect(await mail.messagesTo('everywhere@example.org')).toEqual([]);
  });

  it('when a global organiser invites another global organiser, then it is allowed', async () => {
    await invite(organiser, body('co-organiser@example.org', { role: 'organiser', competitionId: null, area: null })).expect(201);
    const [message] = await mail.messagesTo('co-organiser@example.org');
    expect(message!.text).toContain('Organiser of every competition');
  });
});

describe('bad invitations', () => {
  it('when the e-mail address is malformed, then 400 says how to write one', async () => {
    const response = await invite(organiser, { email: 'ada at example', displayName: 'Ada', assignment: startOfficial }).expect(400);
    expect(errorOf(response.body).details).toEqual([{ field: 'email', message: 'Enter a valid e-mail address, like name@example.org.' }]);
  });

  it('when an official is invited without an area, then 400 explains that officials need one', async () => {
    const response = await invite(organiser, {
      email: 'no-area@example.org',
      displayName: 'No Area',
      assignment: { role: 'official', competitionId: openRace.id, area: null },
    }).expect(400);
    expect(errorOf(response.body).details).toEqual([
      { field: 'assignment.area', message: 'Officials and area leaders need an area (start or finish); other roles have none.' },
    ]);
  });

  it('when the competition does not exist, then 404 and no mail', async () => {
    const missing = '0193a5c0-0000-7000-8000-0000000000ff';
    const assignment = { ...startOfficial, competitionId: missing };
    const response = await invite(organiser, { email: 'nowhere@example.org', displayName: 'Nowhere', assignment }).expect(404);
    expect(errorOf(response.body).message).toMatch(/no competition with that id/);
    expect(await mail.messagesTo('nowhere@example.org')).toEqual([]);
  });
});

describe('mail that cannot be sent', () => {
  it('when the mail server is gone, then 503 says nothing was changed, and no invitation is left behind', async () => {
    const gone = await startFakeMailServer({ db: database.db, port: 0 });
    await gone.close();
    const unreachable = fakeServerMailer(gone.host, gone.port, 'Rimelog <no-reply@rimelog.test>');
    const withoutMail = createTestApp(database, undefined, { mailer: unreachable });
    const cookie = await signInAs(withoutMail, 'organiser@frostbarrow.test');
    const response = await request(withoutMail)
      .post('/api/invitations')
      .set(sameOrigin)
      .set('Cookie', cookie)
      .send({ email: 'unsent@example.org', displayName: 'Unsent', assignment: startOfficial })
      .expect(503);
    expect(errorOf(response.body).message).toBe('The e-mail could not be sent, so nothing was changed. Check the mail settings and try again.');
    expect(await database.db.select().from(invitations).where(eq(invitations.email, 'unsent@example.org'))).toEqual([]);
  });
});

describe('inviting someone who already has an account', () => {
  it('when the address has an account, then the answer looks the same, the role is added and the mail says so', async () => {
    const email = 'start-official-2@frostbarrow.test';
    const finishOfficial: RoleAssignment = { role: 'official', competitionId: openRace.id, area: 'finish' };
    const response = await invite(organiser, { email, displayName: 'Whoever', assignment: finishOfficial }).expect(201);
    expect(Object.keys(response.body)).toEqual(['expiresAt']);

    expect(await database.db.select().from(invitations).where(eq(invitations.email, email))).toEqual([]);
    const [user] = await database.db.select({ id: users.id }).from(users).where(eq(users.email, email));
    expect(await loadRoles(database.db, user!.id)).toContainEqual(finishOfficial);
    const [message] = await mail.messagesTo(email);
    expect(message!.subject).toBe('Your Rimelog account has a new role');
    expect(message!.text).toContain('Hello Kaja Brenn,');
    expect(message!.text).toContain(`Official at the finish of ${openRace.name}`);
    expect(message!.text).not.toContain('token=');
  });

  it('when an account was made from one invitation and a second one is accepted, then its role is added and the password kept', async () => {
    const email = 'two-invitations@example.org';
    const first = await invitedToken(email);
    const leader: RoleAssignment = { role: 'area-leader', competitionId: otherRace.id, area: 'finish' };
    await invite(organiser, { email, displayName: 'Two', assignment: leader }).expect(201);
    const second = tokenFromLink((await mail.messagesTo(email))[0]!.text, testPublicUrl, '/accept-invitation');
    await accept(first, 'the first password chosen').expect(201);
    const response = await accept(second, 'a second password tried').expect(409);
    expect(errorOf(response.body).message).toMatch(/already an account.*role of this invitation is now added/);
    const cookie = await signInAs(app, email, { password: 'the first password chosen' });
    const me = meSchema.parse((await request(app).get('/api/auth/me').set('Cookie', cookie).expect(200)).body);
    expect(me.roles).toEqual(expect.arrayContaining([startOfficial, leader]));
  });
});

describe('the mailbox', () => {
  it('when an official or nobody asks for the mailbox, then 403 and 401', async () => {
    const official = await signInAs(app, 'finish-official@frostbarrow.test');
    await request(app).get('/api/mailbox').set('Cookie', official).expect(403);
    await request(app).get('/api/mailbox').expect(401);
  });

  it('when more than 200 messages are kept, then the newest 200 come back', async () => {
    const before = Date.now();
    await database.db.insert(fakeMailMessages).values(
      Array.from({ length: 205 }, (_, i) => ({
        receivedAt: new Date(before + (i + 1) * 1000),
        from: 'filler@example.org',
        to: ['filler@example.org'],
        subject: `Filler ${i}`,
        text: 'filler',
      })),
    );
    const { messages } = mailboxSchema.parse((await request(app).get('/api/mailbox').set('Cookie', organiser).expect(200)).body);
    expect(messages).toHaveLength(200);
    expect(messages[0]!.subject).toBe('Filler 204');
    expect(messages[199]!.subject).toBe('Filler 5');
  });
});
