import { z } from 'zod';
import { apiErrorBodySchema } from '../../../../shared/api/api-error';
import { pullResponseSchema, pushResponseSchema, type SyncOp } from '../../../../shared/sync/sync-api';
import { SyncTransportError, type SyncTransport } from './sync-transport';
import type { UploadTransport } from './upload-photos';

const heartbeatSchema = z.object({ serverTime: z.iso.datetime({ offset: true }) });
const uploadReceiptSchema = z.object({ sha256: z.string() });

export interface HttpTransportOptions {
  /** '' for the same origin as the app. */
  baseUrl?: string;
  fetch?: typeof fetch;
}

/**
 * The sync API over fetch. Every call bypasses the service worker (`ngsw-bypass`), so an answer always
 * means the server itself answered, and sends the session cookie of this origin only.
 */
export function createHttpTransport({ baseUrl = '', fetch: fetchFn = (input, init) => globalThis.fetch(input, init) }: HttpTransportOptions = {}): SyncTransport & UploadTransport {
  async function send(path: string, init: RequestInit = {}, contentType: string | null = init.body ? 'application/json' : null): Promise<Response> {
    try {
      return await fetchFn(`${baseUrl}/api${path}`, {
        ...init,
        credentials: 'same-origin',
        cache: 'no-store',
        headers: { accept: 'application/json', 'ngsw-bypass': 'true', ...(contentType ? { 'content-type': contentType } : {}) },
      });
    } catch {
      // fetch rejects only when no HTTP answer came back at all.
      throw new SyncTransportError('unreachable', 'The server cannot be reached from here. Records stay on this device and are sent later.');
    }
  }

  async function call<T>(path: string, schema: z.ZodType<T>, init: RequestInit = {}): Promise<T> {
    const response = await send(path, init);
    const body: unknown = await response.json().catch(() => undefined);
    if (!response.ok) throw failureOf(response.status, body);
    const parsed = schema.safeParse(body);
    if (!parsed.success) {
      // A 200 that is not our JSON comes from something in between, such as a Wi-Fi login page.
      throw notOurServer(response.status);
    }
    return parsed.data;
  }

  return {
    heartbeat: () => call('/health', heartbeatSchema),
    push: (ops: readonly SyncOp[]) => call('/sync/push', pushResponseSchema, { method: 'POST', body: JSON.stringify({ ops }) }),
    pull: (after: number) => call(`/sync/pull?after=${encodeURIComponent(String(after))}`, pullResponseSchema),
    async hasFile(sha256: string): Promise<boolean> {
      const response = await send(`/uploads/${encodeURIComponent(sha256)}`, { method: 'HEAD' });
      if (response.status === 404) return false;
      if (!response.ok) throw failureOf(response.status, undefined);
      // The server names each file by its fingerprint; a 200 without it came from something in between.
      if (response.headers.get('etag') !== `"${sha256}"`) throw notOurServer(response.status);
      return true;
    },
    async putFile(sha256: string, mediaType: string, data: ArrayBuffer): Promise<void> {
      const response = await send(`/uploads/${encodeURIComponent(sha256)}`, { method: 'PUT', body: data }, mediaType);
      const body: unknown = await response.json().catch(() => undefined);
      if (!response.ok) throw failureOf(response.status, body);
      if (uploadReceiptSchema.safeParse(body).data?.sha256 !== sha256) throw notOurServer(response.status);
    },
  };
}

function notOurServer(status: number): SyncTransportError {
  return new SyncTransportError('unreachable', 'Something answered, but not the Rimelog server (a Wi-Fi login page?). Records stay on this device.', status);
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
