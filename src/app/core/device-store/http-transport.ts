import { z } from 'zod';
import { apiErrorBodySchema } from '../../../../shared/api/api-error';
import { pullResponseSchema, pushResponseSchema, type SyncOp } from '../../../../shared/sync/sync-api';
import { SyncTransportError, type SyncTransport } from './sync-transport';

const heartbeatSchema = z.object({ serverTime: z.iso.datetime({ offset: true }) });

export interface HttpTransportOptions {
  /** '' for the same origin as the app. */
  baseUrl?: string;
  fetch?: typeof fetch;
}

/**
 * The sync API over fetch. Every call bypasses the service worker (`ngsw-bypass`), so an answer always
 * means the server itself answered, and sends the session cookie of this origin only.
 */
export function createHttpTransport({ baseUrl = '', fetch: fetchFn = (input, init) => globalThis.fetch(input, init) }: HttpTransportOptions = {}): SyncTransport {
  async function call<T>(path: string, schema: z.ZodType<T>, init: RequestInit = {}): Promise<T> {
    let response: Response;
    try {
      response = await fetchFn(`${baseUrl}/api${path}`, {
        ...init,
        credentials: 'same-origin',
        cache: 'no-store',
        headers: { accept: 'application/json', 'ngsw-bypass': 'true', ...(init.body ? { 'content-type': 'application/json' } : {}) },
      });
    } catch {
      // fetch rejects only when no HTTP answer came back at all.
      throw new SyncTransportError('unreachable', 'The server cannot be reached from here. Records stay on this device and are sent later.');
    }
    const body: unknown = await response.json().catch(() => undefined);
    if (!response.ok) throw failureOf(response.status, body);
    const parsed = schema.safeParse(body);
    if (!parsed.success) {
      // A 200 that is not our JSON comes from something in between, such as a Wi-Fi login page.
      throw new SyncTransportError('unreachable', 'Something answered, but not the Rimelog server (a Wi-Fi login page?). Records stay on this device.', response.status);
    }
    return parsed.data;
  }

  return {
    heartbeat: () => call('/health', heartbeatSchema),
    push: (ops: readonly SyncOp[]) => call('/sync/push', pushResponseSchema, { method: 'POST', body: JSON.stringify({ ops }) }),
    pull: (after: number) => call(`/sync/pull?after=${encodeURIComponent(String(after))}`, pullResponseSchema),
  };
}

function failureOf(status: number, body: unknown): SyncTransportError {
  const serverWords = apiErrorBodySchema.safeParse(body);
  const message = serverWords.success ? serverWords.data.error.message : null;
  if (status === 503 || status >= 500) {
    return new SyncTransportError('unavailable', message ?? 'The server cannot take records just now. The device tries again shortly.', status);
  }
  if (status === 401) return new SyncTransportError('refused', message ?? 'Sign in again so this device can send its records.', status);
  if (status === 429) return new SyncTransportError('unavailable', message ?? 'The server asked to slow down. The device tries again shortly.', status);
  return new SyncTransportError('refused', message ?? `The server refused the request (status ${status}).`, status);
}
