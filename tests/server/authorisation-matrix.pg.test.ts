import { eq } from 'drizzle-orm';
import type { Express, Router } from 'express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiRoutes } from '../../server/api-routes';
import { grantRole } from '../../server/auth/role-store';
import { roleAssignments, users } from '../../server/db/schema';
import { demoCompetitions, demoOpenCompetitionId, seedDemoScenario } from '../../server/ops/demo-scenario';
import { sameOrigin, signInAs } from '../support/sign-in';
import { createTestApp, testApiDeps } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

// SPEC.md §5, route by route. Every principal calls every route with an empty body; a 400 means the
// guard let the request through to input validation. A route missing here fails the first test.
const principals = ['nobody', 'official', 'area-leader', 'delegate', 'organiser', 'official-elsewhere'] as const;
type Principal = (typeof principals)[number];
const signedInAll = (status: number): Record<Principal, number> => ({
  nobody: 401, official: status, 'area-leader': status, delegate: status, organiser: status, 'official-elsewhere': status,
});
const everyone = (status: number): Record<Principal, number> => ({ ...signedInAll(status), nobody: status });

const expected: Record<string, Record<Principal, number>> = {
  'GET /health': everyone(200),
  'GET /competitions': everyone(200),
  'GET /competitions/:id/rules-profile': { ...signedInAll(200), 'official-elsewhere': 403 },
  'GET /competitions/:id/field-data': { ...signedInAll(200), 'official-elsewhere': 403 },
  'POST /auth/sign-in': everyone(400),
  'GET /auth/me': signedInAll(200),
  'POST /auth/sign-out': signedInAll(204),
  'POST /auth/sign-out-everywhere': signedInAll(204),
  'POST /auth/pin': signedInAll(400),
  'GET /auth/device-users': signedInAll(200),
  'POST /auth/switch': signedInAll(400),
  'POST /auth/password-reset': everyone(400),
  'POST /auth/password-reset/confirm': everyone(400),
  // An organiser of every competition may invite; without a competition in the body only they pass.
  'POST /invitations': { nobody: 401, official: 403, 'area-leader': 403, delegate: 403, organiser: 400, 'official-elsewhere': 403 },
  'POST /invitations/accept': everyone(400),
  'POST /sync/push': signedInAll(400),
  'GET /sync/pull': signedInAll(200),
  'GET /mailbox': { nobody: 401, official: 403, 'area-leader': 403, delegate: 403, organiser: 200, 'official-elsewhere': 403 },
  // The empty body is JSON, not a photo or PDF (415); nothing was uploaded under the hash (404).
  'PUT /uploads/:sha256': signedInAll(415),
  'GET /uploads/:sha256': signedInAll(404),
};

/** A well-formed SHA-256 that names no stored upload, for the `:sha256` of the upload routes. */
const unknownSha256 = 'c0ffee'.padEnd(64, '0');

const emails: Record<Exclude<Principal, 'nobody'>, string> = {
  official: 'start-official@frostbarrow.test',
  'area-leader': 'start-leader@frostbarrow.test',
  delegate: 'delegate@frostbarrow.test',
  organiser: 'organiser@frostbarrow.test',
  'official-elsewhere': 'finish-official@frostbarrow.test',
};

let database: TestDatabase;
let app: Express;

beforeAll(async () => {
  database = await createTestDatabase();
  await seedDemoScenario(database.db);
  // The "elsewhere" official holds their role only in a competition that is not the one asked about.
  const [elsewhere] = await database.db.select().from(users).where(eq(users.email, emails['official-elsewhere']));
  await database.db.delete(roleAssignments).where(eq(roleAssignments.userId, elsewhere!.id));
  const other = demoCompetitions.find((c) => c.id !== demoOpenCompetitionId)!.id;
  await grantRole(database.db, elsewhere!.id, { role: 'official', competitionId: other, area: 'start' });
  app = createTestApp(database);
});
afterAll(() => database.drop());

function declaredRoutes() {
  return apiRoutes(testApiDeps(database));
}

/** Routes as Express actually serves them under /api, read from the router itself. */
function servedRoutes(): string[] {
  const apiLayer = (app as unknown as { router: Router }).router.stack.find((layer) => (layer.handle as { stack?: unknown }).stack);
  const apiRouter = apiLayer!.handle as unknown as Router;
  return apiRouter.stack.flatMap((layer) => {
    const route = layer.route as { path: string; methods: Record<string, boolean> } | undefined;
    if (!route) return [];
    return Object.keys(route.methods).map((method) => `${method.toUpperCase()} ${route.path}`);
  });
}

describe('authorisation matrix', () => {
  it('when the router is read, then every served route is declared, and every declared route has expectations here', () => {
    const declared = declaredRoutes().map((r) => `${r.method.toUpperCase()} ${r.path}`);
    expect(servedRoutes().sort()).toEqual([...declared].sort());
    expect(Object.keys(expected).sort()).toEqual([...declared].sort());
  });

  const cells = Object.entries(expected).flatMap(([route, statuses]) => principals.map((p) => [route, p, statuses[p]] as const));
  it.each(cells)('%s as %s answers %i', async (route, principal, status) => {
    const [method, pathPattern] = route.split(' ') as [string, string];
    const path = `/api${pathPattern.replace(':id', demoOpenCompetitionId).replace(':sha256', unknownSha256)}`;
    const cookie = principal === 'nobody' ? undefined : await signInAs(app, emails[principal]);
    let call =
      method === 'GET'
        ? request(app).get(path)
        : (method === 'PUT' ? request(app).put(path) : request(app).post(path)).set(sameOrigin).send({});
    if (cookie) call = call.set('Cookie', cookie);
    const response = await call;
    expect(response.status, JSON.stringify(response.body)).toBe(status);
  });
});
