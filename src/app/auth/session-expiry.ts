/** Under this much time left, the header gently asks the official to sign in again at the hut. */
export const expiryWarningMs = 2 * 60 * 60 * 1000;

export type SessionExpiry =
  | { kind: 'fine' }
  | { kind: 'ending-soon'; text: string }
  | { kind: 'ended'; text: string };

/** How the sign-in's end is told: nothing while far off, a gentle notice near the end, and after it. */
export function describeSessionExpiry(expiresAt: Date, now: Date): SessionExpiry {
  const leftMs = expiresAt.getTime() - now.getTime();
  const at = expiresAt.toLocaleTimeString(undefined, { hour: '2-digit', minute: '2-digit' });
  if (leftMs <= 0) {
    return {
      kind: 'ended',
      text: `Your sign-in ended at ${at}. What you record stays on this device; sign in again when there is a signal.`,
    };
  }
  if (leftMs < expiryWarningMs) {
    return {
      kind: 'ending-soon',
      text: `Your sign-in ends at ${at} (in ${durationInWords(leftMs)}). Sign in again at the hut while there is a signal.`,
    };
  }
  return { kind: 'fine' };
}

function durationInWords(ms: number): string {
  const minutes = Math.max(1, Math.ceil(ms / 60_000));
  const hours = Math.floor(minutes / 60);
  const rest = minutes % 60;
  const minutePart = `${rest} min`;
  if (hours === 0) return minutePart;
  return rest === 0 ? `${hours} h` : `${hours} h ${minutePart}`;
}
