import { mkdtemp, mkdir, rm, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

let database: TestDatabase;
let clientDir: string;

beforeAll(async () => {
  database = await createTestDatabase();
  clientDir = await mkdtemp(path.join(os.tmpdir(), 'rimelog-client-'));
  await mkdir(path.join(clientDir, 'media'));
  await writeFile(path.join(clientDir, 'index.html'), '<!doctype html><title>shell</title>');
  await writeFile(path.join(clientDir, 'ngsw.json'), '{}');
  await writeFile(path.join(clientDir, 'ngsw-worker.js'), '// worker');
  await writeFile(path.join(clientDir, 'main-AB12CD34.js'), '// app');
  await writeFile(path.join(clientDir, 'media', 'font-EF56GH78.woff2'), 'font');
});
afterAll(async () => {
  await database.drop();
  await rm(clientDir, { recursive: true, force: true });
});

describe('serving the built app', () => {
  it.each(['/index.html', '/ngsw.json', '/ngsw-worker.js'])(
    'when %s is fetched, then it must be revalidated every time',
    async (url) => {
      const response = await request(createTestApp(database, clientDir)).get(url).expect(200);
      expect(response.headers['cache-control']).toBe('no-cache');
    },
  );

  it.each(['/main-AB12CD34.js', '/media/font-EF56GH78.woff2'])(
    'when the hashed file %s is fetched, then it may be cached for good',
    async (url) => {
      const response = await request(createTestApp(database, clientDir)).get(url).expect(200);
      expect(response.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    },
  );

  it('when an in-app route is opened directly, then the shell is served, not cached', async () => {
    const response = await request(createTestApp(database, clientDir)).get('/start-area/queue').expect(200);
    expect(response.text).toContain('<title>shell</title>');
    expect(response.headers['cache-control']).toBe('no-cache');
  });

  it('when a missing file is asked for, then 404 instead of the shell', async () => {
    await request(createTestApp(database, clientDir)).get('/missing-ZZ99ZZ99.js').expect(404);
  });

  it('when an unknown API route is asked for, then the JSON error, never the shell', async () => {
    const response = await request(createTestApp(database, clientDir)).get('/api/nothing').expect(404);
    expect(response.body.error.code).toBe('not_found');
  });
});
