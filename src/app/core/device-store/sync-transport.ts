import type { PullResponse, PushResponse, SyncOp } from '../../../../shared/sync/sync-api';

/** How the sync engine reaches the server; the HTTP one is in http-transport.ts, tests use a fake. */
export interface SyncTransport {
  push(ops: readonly SyncOp[]): Promise<PushResponse>;
  pull(after: number): Promise<PullResponse>;
  /** Proves the server (not just a network) answers, and gives its clock. serverTime is ISO 8601. */
  heartbeat(): Promise<{ serverTime: string }>;
}

/**
 * - `unreachable`: no answer from the server (no signal, a hut Wi-Fi without the server, a login page).
 * - `unavailable`: the server answered "try again later" (503) or failed on its side.
 * - `refused`: the server refused the request itself (signed out, not allowed, malformed); retrying the
 *   same request will not help until someone acts, so the words are shown to the official.
 */
export type TransportFailure = 'unreachable' | 'unavailable' | 'refused';

export class SyncTransportError extends Error {
  override readonly name = 'SyncTransportError';
  constructor(
    readonly failure: TransportFailure,
    message: string,
    readonly status: number | null = null,
  ) {
    super(message);
  }

  /** Worth trying the same request again later without anyone doing anything. */
  get transient(): boolean {
    return this.failure !== 'refused';
  }
}
