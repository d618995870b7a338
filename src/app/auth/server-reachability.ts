import { HttpErrorResponse } from '@angular/common/http';
import { DOCUMENT, Injectable, computed, inject, signal } from '@angular/core';

export type Reachability = 'unknown' | 'reachable' | 'unreachable';

/**
 * Whether the server answered the last request. `navigator.onLine` is true on a hut Wi-Fi with no
 * server behind it, so only real answers count; the browser's "offline" event is believed at once.
 */
@Injectable({ providedIn: 'root' })
export class ServerReachability {
  private readonly window = inject(DOCUMENT).defaultView;
  readonly state = signal<Reachability>(this.window?.navigator.onLine === false ? 'unreachable' : 'unknown');
  /** True only when we know the server cannot be reached; "unknown" still lets the official try. */
  readonly isOffline = computed(() => this.state() === 'unreachable');

  constructor() {
    this.window?.addEventListener('offline', () => this.state.set('unreachable'));
    this.window?.addEventListener('online', () => this.state.set('unknown'));
  }

  answered(): void {
    this.state.set('reachable');
  }

  /** Any HTTP answer, even an error, means the server is there; only status 0 means it is not. */
  failed(error: unknown): void {
    this.state.set(isNoConnection(error) ? 'unreachable' : 'reachable');
  }
}

/** Status 0: the request never reached the server (no signal, server down, Wi-Fi without a server). */
export function isNoConnection(error: unknown): boolean {
  return error instanceof HttpErrorResponse && error.status === 0;
}

export function isStatus(error: unknown, status: number): boolean {
  return error instanceof HttpErrorResponse && error.status === status;
}
