export interface BackoffPolicy {
  /** The wait ceiling after the first failure. */
  baseMs: number;
  /** The wait never grows beyond this. */
  capMs: number;
}

export const defaultBackoff: BackoffPolicy = { baseMs: 5_000, capMs: 5 * 60_000 };

/**
 * The wait before the next try after `failures` failed rounds in a row: the ceiling doubles each time up
 * to the cap, and the wait is a random point in its upper half ("equal jitter"), so devices that lost
 * the hut Wi-Fi together do not all come back in the same second, yet none retries almost at once.
 */
export function backoffDelayMs(failures: number, random: () => number, policy: BackoffPolicy = defaultBackoff): number {
  const ceiling = Math.min(policy.capMs, policy.baseMs * 2 ** Math.max(0, failures - 1));
  return Math.round(ceiling / 2 + (random() * ceiling) / 2);
}
