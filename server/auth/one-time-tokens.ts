import { createHash, randomBytes } from 'node:crypto';

/** A one-time token for an e-mailed link, and the SHA-256 hash that is all the database keeps. */
export function newOneTimeToken(): { token: string; tokenHash: string } {
  const token = randomBytes(32).toString('base64url');
  return { token, tokenHash: hashToken(token) };
}

export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}
