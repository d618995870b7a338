import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiErrorBodySchema } from '../../shared/api/api-error';
import { competitionRulesProfileSchema } from '../../shared/rules/competition-profile';
import { acceptDemoValues, withProfileValue } from '../../shared/rules/profile-values';
import { RulesInputError } from '../../shared/rules/rules-error';
import { shippedProfile } from '../../shared/rules/shipped-profiles';
import { openCompetition } from '../../server/db/open-competition';
import { demoCompetitions, demoOpenCompetitionId, seedDemoScenario } from '../../server/ops/demo-scenario';
import { createTestApp } from '../support/test-app';
import { signInAs } from '../support/sign-in';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

let database: TestDatabase;
let app: ReturnType<typeof createTestApp>;
let organiser: string;
const planned = demoCompetitions.find((c) => c.id !== demoOpenCompetitionId && c.trackType === 'natural')!;
const profileUrl = (id: string) => `/api/competitions/${id}/rules-profile`;

beforeAll(async () => {
  database = await createTestDatabase();
  await seedDemoScenario(database.db);
  app = createTestApp(database);
  organiser = await signInAs(app, 'organiser@frostbarrow.test');
});
const getProfile = (id: string) => request(app).get(profileUrl(id)).set('Cookie', organiser);
afterAll(() => database.drop());

describe('a competition keeps the rules profile it opened with', () => {
  it('when the demo race is open, then its frozen profile comes back with labelled demo values and no gaps', async () => {
    const response = await getProfile(demoOpenCompetitionId).expect(200);
    const body = competitionRulesProfileSchema.parse(response.body);
    expect(body.profile.trackType).toBe('natural');
    expect(body.profile.weights.sledMax['singles-men'].source.kind).toBe('demo-value');
    expect(body.frozenAt).toBe('2027-01-09T07:00:00.000Z');
  });

  it('when a competition has not opened, then 409 says its profile is frozen only when it opens', async () => {
    const response = await getProfile(planned.id).expect(409);
    expect(apiErrorBodySchema.parse(response.body).error.message).toContain('has not opened yet');
  });

  it('when the id is not a uuid, then 400; when it is unknown, then 404', async () => {
    await getProfile('frostbarrow').expect(400);
    await getProfile('0193a5c0-0000-7000-8000-0000000000ff').expect(404);
  });

  it('when opened with a profile that still has gaps, then it is refused with every gap named and stays planned', async () => {
    const gappy = shippedProfile('natural', 'international');
    await expect(openCompetition(database.db, planned.id, gappy, new Date())).rejects.toMatchObject({ code: 'profile-gap' });
    await getProfile(planned.id).expect(409);
  });

  it('when opened with a profile for the other track type, then it is refused', async () => {
    const artificial = acceptDemoValues(shippedProfile('artificial', 'international'));
    await expect(openCompetition(database.db, planned.id, artificial, new Date())).rejects.toBeInstanceOf(RulesInputError);
  });

  it('when the profile is edited after opening, then the frozen copy does not change and opening again is refused', async () => {
    const profile = acceptDemoValues(shippedProfile('natural', 'international'));
    await openCompetition(database.db, planned.id, profile, new Date('2027-01-23T07:00:00Z'));
    withProfileValue(profile, 'temperature.margin', 40, { kind: 'entered-by-organiser', verified: true });
    profile.temperature.margin.value = 30;
    const response = await getProfile(planned.id).expect(200);
    expect(competitionRulesProfileSchema.parse(response.body).profile.temperature.margin.value).toBe(50); // trade practice, no published source: 5.0 °C
    await expect(openCompetition(database.db, planned.id, profile, new Date())).rejects.toMatchObject({ code: 'conflict' });
  });
});
