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
});
