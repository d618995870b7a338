import { pullResponseSchema, type PullResponse } from '../../../shared/sync/sync-api';
import type { Random } from './prng';
import type { SimServer } from './sim-server';

export type Fault = 'request-lost' | 'response-lost' | 'duplicated' | 'reordered';
export const faults: readonly Fault[] = ['request-lost', 'response-lost', 'duplicated', 'reordered'];

export interface DeviceLink {
  /** The device's session, as a Cookie header value. */
  cookie: string;
  /** Draws this device's faults. */
  random: Random;
  /** Every pull page the device received (its answer reached the device). */
  onPullPage(after: number, page: PullResponse): void;
}

/** A fetch failure as the browser reports one: no HTTP answer at all. */
const networkFailure = (what: string) => new TypeError(`fetch failed (simulated: ${what})`);

/**
 * The network between the devices and the server, with faults injected per request:
 * - request-lost: the request never reaches the server;
 * - response-lost: the server handles it (and commits) but the answer never comes back;
 * - duplicated: the request reaches the server twice at once, the device gets one of the answers;
 * - reordered: the request is held back (the device sees a timeout) and reaches the server only after
 *   the next request of any device, so the server sees the two in the opposite order.
 * Each request suffers at most one fault; each fault has the same rate.
 */
export class SimNetwork {
  faultsOn = true;
  readonly counts: Record<Fault | 'requests', number> = { requests: 0, 'request-lost': 0, 'response-lost': 0, duplicated: 0, reordered: 0 };
  private held: (() => Promise<void>)[] = [];

  constructor(
    private readonly server: SimServer,
    private readonly faultRate: number,
  ) {}

  /** The fetch a device's HTTP transport uses: adds its session cookie and a same-site Origin. */
  fetchFor(link: DeviceLink): typeof fetch {
    return async (input, init) => {
      const path = String(input);
      // The server's address is read when the request goes out: after a restart it is another port.
      const send = () => {
        const origin = this.server.origin();
        const headers = new Headers(init?.headers);
        headers.set('cookie', link.cookie);
        headers.set('origin', origin);
        return globalThis.fetch(`${origin}${path}`, { ...init, headers }).then(buffered);
      };
      this.counts.requests++;
      const fault = this.faultsOn ? this.draw(link.random) : null;
      if (fault) this.counts[fault]++;
      if (fault === 'request-lost') throw networkFailure('request lost');
      if (fault === 'reordered') {
        this.held.push(() => send().then(() => undefined, () => undefined));
        throw networkFailure('request delayed; the device gave up waiting');
      }
      let answer: Response;
      try {
        if (fault === 'duplicated') {
          const [first, second] = await Promise.allSettled([send(), send()]);
          const chosen = link.random.chance(0.5) ? [first, second] : [second, first];
          const delivered = chosen.find((copy) => copy.status === 'fulfilled');
          if (!delivered || delivered.status !== 'fulfilled') throw networkFailure('both copies failed');
          answer = delivered.value;
        } else {
          answer = await send();
        }
      } finally {
        await this.deliverHeld();
      }
      if (fault === 'response-lost') throw networkFailure('response lost after the server answered');
      if (path.startsWith('/api/sync/pull') && answer.ok) {
        const page = pullResponseSchema.safeParse(await answer.clone().json());
        if (page.success) link.onPullPage(Number(new URL(path, 'http://x').searchParams.get('after')), page.data);
      }
      return answer;
    };
  }

  /** Sends every held-back request now, oldest first (they reach the server late). */
  async deliverHeld(): Promise<void> {
    while (this.held.length > 0) await this.held.shift()!();
  }

  private draw(random: Random): Fault | null {
    const point = random.next();
    const index = Math.floor(point / this.faultRate);
    return index < faults.length ? faults[index]! : null;
  }
}

/** The whole answer read off the wire, so "answered" means the server finished and sent it. */
async function buffered(response: Response): Promise<Response> {
  const body = await response.arrayBuffer();
  return new Response(body, { status: response.status, statusText: response.statusText, headers: response.headers });
}
