/**
 * Hybrid logical clock (Kulkarni et al., 2014): a timestamp close to wall time that still orders every
 * event after the ones it has seen, however skewed the device clocks are. The server orders records by
 * these and by its own change sequence, never by device time alone.
 */
export interface HybridTime {
  /** The largest wall time seen, in ms since the epoch (l in the paper). */
  wallMs: number;
  /** Events at the same wall time (c in the paper). */
  counter: number;
  /** The device, to break ties deterministically. */
  node: string;
}

const wallDigits = 15;
const counterDigits = 5;
const maxCounter = 36 ** counterDigits - 1;

/** The next timestamp for a local event (send or record). */
export function tick(previous: HybridTime, physicalMs: number): HybridTime {
  const wallMs = Math.max(previous.wallMs, physicalMs);
  const counter = wallMs === previous.wallMs ? previous.counter + 1 : 0;
  return checked({ wallMs, counter, node: previous.node });
}

/** The timestamp after receiving a remote one: later than both. */
export function receive(local: HybridTime, remote: HybridTime, physicalMs: number): HybridTime {
  const wallMs = Math.max(local.wallMs, remote.wallMs, physicalMs);
  let counter = 0;
  if (wallMs === local.wallMs && wallMs === remote.wallMs) counter = Math.max(local.counter, remote.counter) + 1;
  else if (wallMs === local.wallMs) counter = local.counter + 1;
  else if (wallMs === remote.wallMs) counter = remote.counter + 1;
  return checked({ wallMs, counter, node: local.node });
}

function checked(time: HybridTime): HybridTime {
  if (time.counter > maxCounter) throw new Error('The hybrid clock counter overflowed: the device clock is far behind.');
  return time;
}

/** A text form whose string order is the clock order: "000001736412345-0000a-<node>". */
export function formatHybridTime({ wallMs, counter, node }: HybridTime): string {
  return `${wallMs.toString().padStart(wallDigits, '0')}-${counter.toString(36).padStart(counterDigits, '0')}-${node}`;
}

export function parseHybridTime(text: string): HybridTime {
  const match = /^(\d{15})-([0-9a-z]{5})-(.+)$/.exec(text);
  if (!match) throw new Error(`"${text}" is not a hybrid clock time.`);
  return { wallMs: Number(match[1]), counter: parseInt(match[2]!, 36), node: match[3]! };
}

export function compareHybridTimes(a: HybridTime, b: HybridTime): number {
  return a.wallMs - b.wallMs || a.counter - b.counter || (a.node < b.node ? -1 : a.node > b.node ? 1 : 0);
}

/** How far the device clock is from the server's, from one request's round trip (ms, + = device ahead). */
export function clockOffsetMs(serverTimeMs: number, sentAtMs: number, receivedAtMs: number): number {
  return Math.round((sentAtMs + receivedAtMs) / 2) - serverTimeMs;
}

/** More than this off and the app points it out to the official. */
export const clockWarningMs = 2 * 60_000;
