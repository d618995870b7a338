import { createHash } from 'node:crypto';
import { readdir, readFile, rm, stat } from 'node:fs/promises';
import path from 'node:path';
import { deflateSync, crc32 } from 'node:zlib';
import { eq } from 'drizzle-orm';
import type { Express } from 'express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiErrorBodySchema } from '../../shared/api/api-error';
import { createApp } from '../../server/app';
import { uploads, users } from '../../server/db/schema';
import { uploadPath } from '../../server/uploads/upload-files';
import { createLogger } from '../../server/logger';
import { seedDemoScenario } from '../../server/ops/demo-scenario';
import { discardingMailer } from '../support/fake-mail';
import { sameOrigin, signInAs } from '../support/sign-in';
import { createTestApp, temporaryUploadsDir, testPublicUrl } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

// A 2 × 2 pixel JPEG as a browser canvas encodes it (its colour profile segment removed).
const tinyJpeg = Buffer.from(
  '/9j/4AAQSkZJRgABAQAAAQABAAD/2wBDABALDA4MChAODQ4SERATGCgaGBYWGDEjJR0oOjM9PDkzODdASFxOQERXRTc4UG1RV19iZ2hnPk1xeXBkeFxlZ2P/2wBDARESEhgVGC8aGi9jQjhCY2NjY2NjY2NjY2NjY2NjY2NjY2NjY2NjY2NjY2NjY2NjY2NjY2NjY2NjY2NjY2NjY2P/wAARCAACAAIDASIAAhEBAxEB/8QAFQABAQAAAAAAAAAAAAAAAAAAAAX/xAAUEAEAAAAAAAAAAAAAAAAAAAAA/8QAFAEBAAAAAAAAAAAAAAAAAAAABf/EABQRAQAAAAAAAAAAAAAAAAAAAAD/2gAMAwEAAhEDEQA/AIoBYU//2Q==',
  'base64',
);

/** A real PNG of one pixel in the given grey, built by the format's rules, so each grey is a different file. */
function onePixelPng(grey: number): Buffer {
  const chunk = (type: string, data: Buffer) => {
    const typed = Buffer.concat([Buffer.from(type, 'ascii'), data]);
    const length = Buffer.alloc(4);
    length.writeUInt32BE(data.length);
    const crc = Buffer.alloc(4);
    crc.writeUInt32BE(crc32(typed));
    return Buffer.concat([length, typed, crc]);
  };
  const header = Buffer.alloc(13);
  header.writeUInt32BE(1, 0); // width
  header.writeUInt32BE(1, 4); // height
  header.set([8, 0, 0, 0, 0], 8); // 8-bit greyscale, no interlace
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', header),
    chunk('IDAT', deflateSync(Buffer.from([0, grey]))),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

const tinyPdf = Buffer.from('%PDF-1.4\n1 0 obj << /Type /Catalog /Pages 2 0 R >> endobj\n2 0 obj << /Type /Pages /Kids [] /Count 0 >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n');

const sha256Of = (bytes: Buffer) => createHash('sha256').update(bytes).digest('hex');

/** Reads any response body as bytes, whatever its type (in Node, superagent hands the parser the stream). */
const asBytes = (res: request.Response, done: (error: Error | null, body: Buffer) => void) => {
  const stream = res as unknown as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on('data', (chunk: Buffer) => chunks.push(chunk));
  stream.on('end', () => done(null, Buffer.concat(chunks)));
};

let database: TestDatabase;
let scratch: string;
let uploadsDir: string;
let app: Express;
let cookie: string;
let officialId: string;

beforeAll(async () => {
  database = await createTestDatabase();
  await seedDemoScenario(database.db);
  // Like production's `.data/uploads`: a dot folder on the way must not stop downloads.
  scratch = temporaryUploadsDir();
  uploadsDir = path.join(scratch, '.data', 'uploads');
  app = createTestApp(database, undefined, { uploadsDir });
  cookie = await signInAs(app, 'start-official@frostbarrow.test');
  const [official] = await database.db.select().from(users).where(eq(users.email, 'start-official@frostbarrow.test'));
  officialId = official!.id;
});
afterAll(async () => {
  await rm(scratch, { recursive: true, force: true });
  await database.drop();
});

function put(sha256: string, bytes: Buffer, contentType = 'image/jpeg', on: Express = app) {
  return request(on).put(`/api/uploads/${sha256}`).set(sameOrigin).set('Cookie', cookie).set('Content-Type', contentType).send(bytes);
}

function errorOf(response: request.Response) {
  return apiErrorBodySchema.parse(response.body).error;
}

/** Every file under the uploads folder, as paths relative to it. */
async function filesOnDisk(folder = uploadsDir): Promise<string[]> {
  const entries = await readdir(folder, { recursive: true, withFileTypes: true }).catch(() => []);
  return entries.filter((e) => e.isFile()).map((e) => path.relative(folder, path.join(e.parentPath, e.name))).sort();
}

async function rowsFor(sha256: string) {
  return database.db.select().from(uploads).where(eq(uploads.sha256, sha256));
}

describe('PUT /api/uploads/:sha256', () => {
  it('when an official uploads a JPEG, then it answers 201 and the file lies under its hash with a row naming the uploader', async () => {
    const sha256 = sha256Of(tinyJpeg);
    const response = await put(sha256, tinyJpeg).expect(201);
    expect(response.body).toMatchObject({ sha256, contentType: 'image/jpeg', sizeBytes: tinyJpeg.length });
    expect(await readFile(path.join(uploadsDir, sha256.slice(0, 2), sha256))).toEqual(tinyJpeg);
    const [row] = await rowsFor(sha256);
    expect(row).toMatchObject({ contentType: 'image/jpeg', sizeBytes: tinyJpeg.length, uploadedBy: officialId });
    expect((await filesOnDisk()).filter((f) => f.startsWith('incoming'))).toEqual([]);
  });

  it('when the same file is sent again, then it answers 200 with the same body and the stored file is not written again', async () => {
    const png = onePixelPng(20);
    const sha256 = sha256Of(png);
    const first = await put(sha256, png, 'image/png').expect(201);
    const file = path.join(uploadsDir, sha256.slice(0, 2), sha256);
    const before = await stat(file);
    const again = await put(sha256, png, 'image/png').expect(200);
    expect(again.body).toEqual(first.body);
    const after = await stat(file);
    expect([after.ino, after.mtimeMs]).toEqual([before.ino, before.mtimeMs]);
    expect((await filesOnDisk()).filter((f) => f.endsWith(sha256))).toEqual([path.join(sha256.slice(0, 2), sha256)]);
    expect(await rowsFor(sha256)).toHaveLength(1);
  });

  it('when two devices send the same file at the same moment, then one gets 201, the other 200, and one file is kept', async () => {
    const png = onePixelPng(30);
    const sha256 = sha256Of(png);
    const statuses = (await Promise.all([put(sha256, png, 'image/png'), put(sha256, png, 'image/png')])).map((r) => r.status);
    expect(statuses.sort()).toEqual([200, 201]);
    expect((await filesOnDisk()).filter((f) => f.includes(sha256))).toHaveLength(1);
    expect(await rowsFor(sha256)).toHaveLength(1);
  });

  it('when the body does not match the hash in the address, then it answers 400 in words and keeps nothing', async () => {
    const png = onePixelPng(40);
    const sha256 = sha256Of(png);
    const damaged = Buffer.from(png);
    damaged[damaged.length - 5]! ^= 0xff;
    const response = await put(sha256, damaged, 'image/png').expect(400);
    expect(errorOf(response)).toMatchObject({ code: 'bad_request', message: 'The file arrived damaged; the device will send it again.' });
    expect((await filesOnDisk()).filter((f) => f.includes(sha256))).toEqual([]);
    expect(await rowsFor(sha256)).toEqual([]);
    await request(app).head(`/api/uploads/${sha256}`).set('Cookie', cookie).expect(404);
  });

  it('when the file is larger than the 10 MB default, then it answers 413 in words and keeps nothing', async () => {
    const big = Buffer.concat([tinyJpeg, Buffer.alloc(10 * 1024 * 1024)]);
    const sha256 = sha256Of(big);
    const defaultLimitApp = createTestApp(database, undefined, { uploadsDir });
    const response = await put(sha256, big, 'image/jpeg', defaultLimitApp).expect(413);
    expect(errorOf(response).code).toBe('payload_too_large');
    expect(errorOf(response).message).toContain('larger than 10 MB');
    expect((await filesOnDisk()).filter((f) => f.includes(sha256))).toEqual([]);
    expect(await rowsFor(sha256)).toEqual([]);
  });

  it('when the server is set to a smaller limit, then a file just over it is refused and one at it is kept', async () => {
    const atLimit = Buffer.concat([tinyJpeg, Buffer.alloc(2048 - tinyJpeg.length)]);
    const overLimit = Buffer.concat([atLimit, Buffer.alloc(1)]);
    const smallApp = createTestApp(database, undefined, { uploadsDir, uploadLimitBytes: 2048 });
    await put(sha256Of(overLimit), overLimit, 'image/jpeg', smallApp).expect(413);
    await put(sha256Of(atLimit), atLimit, 'image/jpeg', smallApp).expect(201);
  });

  it('when the file is not a photo or PDF, then it answers 415 in words and keeps nothing', async () => {
    const text = Buffer.from('not a photo');
    const response = await put(sha256Of(text), text, 'text/html').expect(415);
    expect(errorOf(response)).toMatchObject({ code: 'unsupported_media_type' });
    expect(errorOf(response).message).toContain('JPEG');
    expect(await rowsFor(sha256Of(text))).toEqual([]);
  });

  it('when a file is sent as a kind it is not, then it answers 415 and keeps nothing', async () => {
    const png = onePixelPng(50);
    const sha256 = sha256Of(png);
    const response = await put(sha256, png, 'image/jpeg').expect(415);
    expect(errorOf(response).message).toBe('This file is not the JPEG photo it was sent as, so it was not kept.');
    expect((await filesOnDisk()).filter((f) => f.includes(sha256))).toEqual([]);
    expect(await rowsFor(sha256)).toEqual([]);
  });

  it('when nobody is signed in, then PUT, GET and HEAD answer 401 and nothing is stored', async () => {
    const png = onePixelPng(60);
    const sha256 = sha256Of(png);
    const response = await request(app).put(`/api/uploads/${sha256}`).set(sameOrigin).set('Content-Type', 'image/png').send(png).expect(401);
    expect(errorOf(response).code).toBe('unauthenticated');
    await request(app).get(`/api/uploads/${sha256Of(tinyJpeg)}`).expect(401);
    await request(app).head(`/api/uploads/${sha256Of(tinyJpeg)}`).expect(401);
    expect(await rowsFor(sha256)).toEqual([]);
  });

  it('when the request comes from another site, then it is refused (403) before anything is stored', async () => {
    const png = onePixelPng(70);
    const sha256 = sha256Of(png);
    await request(app).put(`/api/uploads/${sha256}`).set('Cookie', cookie).set('Content-Type', 'image/png').send(png).expect(403);
    expect(await rowsFor(sha256)).toEqual([]);
  });

  it('when the server was started without an uploads folder, then uploads answer 503 so the device tries later', async () => {
    const withoutFolder = createApp({ db: database.db, logger: createLogger('silent'), mailer: discardingMailer(), publicUrl: testPublicUrl });
    const png = onePixelPng(80);
    const response = await put(sha256Of(png), png, 'image/png', withoutFolder).expect(503);
    expect(errorOf(response).code).toBe('unavailable');
  });
});

describe('HEAD and GET /api/uploads/:sha256', () => {
  it('when a device asks before and after uploading, then HEAD answers 404, then 200 with the size', async () => {
    const png = onePixelPng(90);
    const sha256 = sha256Of(png);
    await request(app).head(`/api/uploads/${sha256}`).set('Cookie', cookie).expect(404);
    await put(sha256, png, 'image/png').expect(201);
    const response = await request(app).head(`/api/uploads/${sha256}`).set('Cookie', cookie).expect(200);
    expect(response.headers['content-length']).toBe(String(png.length));
  });

  it('when a photo is downloaded, then the bytes match and it is served inline, immutable and unsniffed', async () => {
    const sha256 = sha256Of(tinyJpeg);
    await put(sha256, tinyJpeg);
    const response = await request(app).get(`/api/uploads/${sha256}`).set('Cookie', cookie).buffer(true).parse(asBytes).expect(200);
    expect(Buffer.compare(response.body as Buffer, tinyJpeg)).toBe(0);
    expect(response.headers['content-type']).toBe('image/jpeg');
    expect(response.headers['cache-control']).toBe('private, max-age=31536000, immutable');
    expect(response.headers['x-content-type-options']).toBe('nosniff');
    expect(response.headers['content-disposition']).toBe('inline');
  });

  it('when a PDF certificate is downloaded, then the bytes match and it comes as an attachment', async () => {
    const sha256 = sha256Of(tinyPdf);
    await put(sha256, tinyPdf, 'application/pdf').expect(201);
    const response = await request(app).get(`/api/uploads/${sha256}`).set('Cookie', cookie).buffer(true).parse(asBytes).expect(200);
    expect(Buffer.compare(response.body as Buffer, tinyPdf)).toBe(0);
    expect(response.headers['content-type']).toBe('application/pdf');
    expect(response.headers['content-disposition']).toMatch(/^attachment; filename="certificate-[0-9a-f]{12}\.pdf"$/);
  });

  it('when another signed-in user asks for a file that was never uploaded, then it answers 404 in words', async () => {
    const leader = await signInAs(app, 'start-leader@frostbarrow.test');
    const response = await request(app).get(`/api/uploads/${sha256Of(Buffer.from('never sent'))}`).set('Cookie', leader).expect(404);
    expect(errorOf(response).message).toContain('does not have this file yet');
  });
});

describe('the hash in the address', () => {
  const goodHash = sha256Of(tinyJpeg);
  const badHashes = [
    '..%2F..%2F..%2Fetc%2Fpasswd',
    '%2e%2e%2f%2e%2e%2fpackage.json',
    `..%5C${goodHash.slice(3)}`,
    `${goodHash.slice(0, 62)}%2F.`,
    `${goodHash}%00`,
    goodHash.toUpperCase(),
    goodHash.slice(1),
    `${goodHash}0`,
  ];

  it.each(badHashes)('when it is %s, then PUT and GET answer 400 and nothing is written', async (bad) => {
    const before = await filesOnDisk();
    const putResponse = await request(app).put(`/api/uploads/${bad}`).set(sameOrigin).set('Cookie', cookie).set('Content-Type', 'image/jpeg').send(tinyJpeg).expect(400);
    expect(errorOf(putResponse).details[0]).toMatchObject({ field: 'sha256' });
    await request(app).get(`/api/uploads/${bad}`).set('Cookie', cookie).expect(400);
    expect(await filesOnDisk()).toEqual(before);
  });

  it.each(badHashes.map((bad) => decodeURIComponent(bad)))('when the file store itself is handed %j, then it refuses to name a file', (bad) => {
    expect(() => uploadPath(uploadsDir, bad)).toThrow('Not a SHA-256');
  });
});
