import { describe, expect, it } from 'vitest';
import { createHttpTransport } from './http-transport';
import { SyncTransportError } from './sync-transport';

type Seen = { url: string; init: RequestInit };

function answering(status: number, body: unknown, seen: Seen[] = []): typeof fetch {
  return async (input, init) => {
    seen.push({ url: String(input), init: init ?? {} });
    return new Response(typeof body === 'string' ? body : JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });
  };
}

const failure = (promise: Promise<unknown>) => promise.then(() => null, (e: unknown) => e as SyncTransportError);
const pushAnswer = { results: [], serverTime: '2027-01-14T10:00:00.000Z' };

describe('HTTP transport', () => {
  it('when ops are pushed, then they go as JSON to /api/sync/push past the service worker, with this origin\'s cookie only', async () => {
    const seen: Seen[] = [];
    await createHttpTransport({ fetch: answering(200, pushAnswer, seen) }).push([]);
    expect(seen[0]?.url).toBe('/api/sync/push');
    expect(seen[0]?.init).toMatchObject({ method: 'POST', credentials: 'same-origin', body: '{"ops":[]}' });
    expect(seen[0]?.init.headers).toMatchObject({ 'ngsw-bypass': 'true', 'content-type': 'application/json' });
  });

  it('when pulling, then the cursor goes in the query and the heartbeat asks /api/health', async () => {
    const seen: Seen[] = [];
    const transport = createHttpTransport({ fetch: answering(200, { changes: [], cursor: 42, hasMore: false, serverTime: '2027-01-14T10:00:00.000Z' }, seen) });
    await transport.pull(42);
    await transport.heartbeat();
    expect(seen.map((s) => s.url)).toEqual(['/api/sync/pull?after=42', '/api/health']);
  });

  it('when there is no network, then the failure is "unreachable" and worth retrying', async () => {
    const error = await failure(createHttpTransport({ fetch: async () => Promise.reject(new TypeError('Failed to fetch')) }).heartbeat());
    expect(error).toBeInstanceOf(SyncTransportError);
    expect(error).toMatchObject({ failure: 'unreachable', transient: true });
  });

  it('when the server answers 503, then it is "try again later" with the server\'s words', async () => {
    const body = { error: { code: 'unavailable', message: 'The server could not save this batch just now.', details: [] } };
    const error = await failure(createHttpTransport({ fetch: answering(503, body) }).push([]));
    expect(error).toMatchObject({ failure: 'unavailable', transient: true, status: 503, message: 'The server could not save this batch just now.' });
  });

  it('when the server refuses with a 4xx, then it is a reported error, not retried as if the network failed', async () => {
    const body = { error: { code: 'unauthenticated', message: 'Sign in first.', details: [] } };
    const error = await failure(createHttpTransport({ fetch: answering(401, body) }).push([]));
    expect(error).toMatchObject({ failure: 'refused', transient: false, status: 401, message: 'Sign in first.' });
    expect(await failure(createHttpTransport({ fetch: answering(403, 'nope') }).pull(0))).toMatchObject({ failure: 'refused', status: 403 });
  });

  it('when something other than our server answers 200 (a Wi-Fi login page), then the server counts as unreachable', async () => {
    const error = await failure(createHttpTransport({ fetch: answering(200, '<html>Log in to hut Wi-Fi</html>') }).heartbeat());
    expect(error).toMatchObject({ failure: 'unreachable' });
  });

  describe('files', () => {
    const sha = 'a'.repeat(64);
    const headAnswer = (status: number, etag: string | null): typeof fetch => async () =>
      new Response(null, { status, headers: etag ? { etag } : {} });

    it('when the server has the file, then HEAD answers with its fingerprint as ETag and the file counts as there', async () => {
      expect(await createHttpTransport({ fetch: headAnswer(200, `"${sha}"`) }).hasFile(sha)).toBe(true);
      expect(await createHttpTransport({ fetch: headAnswer(404, null) }).hasFile(sha)).toBe(false);
    });

    it('when a 200 comes without the fingerprint (a Wi-Fi login page), then the server counts as unreachable, never as "has the file"', async () => {
      expect(await failure(createHttpTransport({ fetch: headAnswer(200, null) }).hasFile(sha))).toMatchObject({ failure: 'unreachable' });
      const portal = answering(200, '<html>Log in to hut Wi-Fi</html>');
      expect(await failure(createHttpTransport({ fetch: portal }).putFile(sha, 'image/jpeg', new ArrayBuffer(3)))).toMatchObject({ failure: 'unreachable' });
    });

    it('when a file is sent, then it goes as a PUT with its own media type, and the receipt must name it', async () => {
      const seen: Seen[] = [];
      const receipt = { sha256: sha, contentType: 'image/jpeg', sizeBytes: 3, uploadedAt: '2027-01-14T10:00:00.000Z' };
      await createHttpTransport({ fetch: answering(201, receipt, seen) }).putFile(sha, 'image/jpeg', new Uint8Array([0xff, 0xd8, 0xff]).buffer);
      expect(seen[0]?.url).toBe(`/api/uploads/${sha}`);
      expect(seen[0]?.init).toMatchObject({ method: 'PUT', credentials: 'same-origin' });
      expect(seen[0]?.init.headers).toMatchObject({ 'content-type': 'image/jpeg', 'ngsw-bypass': 'true' });
    });

    it('when the server refuses a file, then its words come back as a refusal', async () => {
      const body = { error: { code: 'unsupported_media_type', message: 'This file is not the JPEG photo it was sent as, so it was not kept.', details: [] } };
      expect(await failure(createHttpTransport({ fetch: answering(415, body) }).putFile(sha, 'image/jpeg', new ArrayBuffer(3)))).toMatchObject({
        failure: 'refused',
        status: 415,
        message: 'This file is not the JPEG photo it was sent as, so it was not kept.',
      });
    });
  });
});
