import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiErrorBodySchema } from '../../shared/api/api-error';
import { createTestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

let database: TestDatabase;

beforeAll(async () => {
  database = await createTestDatabase();
});
afterAll(() => database.drop());

describe('API error answers', () => {
  it('when the route does not exist, then 404 in the shared error shape', async () => {
    const response = await request(createTestApp(database)).get('/api/no-such-thing').expect(404);
    const body = apiErrorBodySchema.parse(response.body);
    expect(body.error).toEqual({
      code: 'not_found',
      message: 'There is no API route GET /no-such-thing.',
      details: [],
    });
  });

  it('when the body is not JSON, then 400 says so', async () => {
    const response = await request(createTestApp(database))
      .post('/api/competitions')
      .set('Content-Type', 'application/json')
      .send('{"name": ')
      .expect(400);
    expect(apiErrorBodySchema.parse(response.body).error.message).toBe('The request body is not valid JSON.');
  });

  it('when the body is over the limit, then 413 tells the device to send less', async () => {
    const big = JSON.stringify({ filler: 'x'.repeat(1024 * 1024 + 10) });
    const response = await request(createTestApp(database))
      .post('/api/competitions')
      .set('Content-Type', 'application/json')
      .send(big)
      .expect(413);
    expect(apiErrorBodySchema.parse(response.body).error.code).toBe('payload_too_large');
  });
});

describe('GET /api/health', () => {
  it('when the database answers, then 200 with the server time', async () => {
    const response = await request(createTestApp(database)).get('/api/health').expect(200);
    expect(response.body.status).toBe('ok');
    expect(Number.isNaN(Date.parse(response.body.serverTime))).toBe(false);
  });

  it('when the database is gone, then 503 in words', async () => {
    const gone = await createTestDatabase();
    const app = createTestApp(gone);
    await gone.drop();
    const response = await request(app).get('/api/health').expect(503);
    expect(apiErrorBodySchema.parse(response.body).error.code).toBe('unavailable');
  });
});

describe('security headers', () => {
  it('when any page is served, then helmet headers are set and no HTTPS upgrade is forced', async () => {
    const response = await request(createTestApp(database)).get('/api/health');
    expect(response.headers['x-content-type-options']).toBe('nosniff');
    expect(response.headers['content-security-policy']).toContain("default-src 'self'");
    expect(response.headers['content-security-policy']).not.toContain('upgrade-insecure-requests');
    // Photos kept on the device are shown from blob: addresses; nothing else widens the policy.
    expect(response.headers['content-security-policy']).toContain("img-src 'self' data: blob:");
    expect(response.headers['content-security-policy']).toContain("script-src 'self'");
    expect(response.headers['x-powered-by']).toBeUndefined();
  });
});
