import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiErrorBodySchema } from '../../shared/api/api-error';
import { competitionListSchema } from '../../shared/competition/competition';
import { demoCompetitions, seedDemoScenario } from '../../server/ops/demo-scenario';
import { createTestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

let database: TestDatabase;

beforeAll(async () => {
  database = await createTestDatabase();
  await seedDemoScenario(database.db);
});
afterAll(() => database.drop());

describe('GET /api/competitions', () => {
  it('when the demo is seeded, then every competition comes back in first-run order', async () => {
    const response = await request(createTestApp(database)).get('/api/competitions').expect(200);
    const body = competitionListSchema.parse(response.body);
    expect(body.competitions.map((c) => c.name)).toEqual(
      [...demoCompetitions].sort((a, b) => a.firstRunOn.localeCompare(b.firstRunOn)).map((c) => c.name),
    );
    expect(response.headers['cache-control']).toBe('no-store');
  });

  it('when filtered by track type, then only that track type comes back', async () => {
    const response = await request(createTestApp(database))
      .get('/api/competitions?trackType=artificial')
      .expect(200);
    const body = competitionListSchema.parse(response.body);
    const expected = demoCompetitions.filter((c) => c.trackType === 'artificial').length;
    expect(body.competitions).toHaveLength(expected);
    expect(body.competitions.every((c) => c.trackType === 'artificial')).toBe(true);
  });

  it('when the track type is unknown, then 400 names the field and what to choose', async () => {
    const response = await request(createTestApp(database))
      .get('/api/competitions?trackType=bobsleigh')
      .expect(400);
    const body = apiErrorBodySchema.parse(response.body);
    expect(body.error.code).toBe('bad_request');
    expect(body.error.message).toBe('trackType: choose natural or artificial');
    expect(body.error.details).toEqual([{ field: 'trackType', message: 'choose natural or artificial' }]);
  });

  it('when an unknown parameter is sent, then 400 rather than a silently ignored filter', async () => {
    const response = await request(createTestApp(database)).get('/api/competitions?sort=name').expect(400);
    expect(apiErrorBodySchema.parse(response.body).error.message).toMatch(/sort/);
  });
});

describe('seedDemoScenario', () => {
  it('when run again, then nothing is added twice', async () => {
    expect(await seedDemoScenario(database.db)).toBe(0);
    const response = await request(createTestApp(database)).get('/api/competitions').expect(200);
    expect(competitionListSchema.parse(response.body).competitions).toHaveLength(demoCompetitions.length);
  });
});
