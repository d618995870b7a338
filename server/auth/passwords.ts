import { hash, verify } from '@node-rs/argon2';

/**
 * Argon2id with the OWASP Password Storage Cheat Sheet's first configuration:
 * m = 19 MiB, t = 2, p = 1. Used for passwords and device PINs.
 */
export const argon2Options = { algorithm: 2 /* Argon2id */, memoryCost: 19_456, timeCost: 2, parallelism: 1 } as const;

export function hashSecret(secret: string): Promise<string> {
  return hash(secret, argon2Options);
}

export async function verifySecret(storedHash: string, secret: string): Promise<boolean> {
  try {
    return await verify(storedHash, secret);
  } catch {
    return false;
  }
}

// Verifying against this when the account does not exist keeps the answer time the same, so timing
// does not reveal which e-mail addresses have accounts (SPEC.md §4).
let decoyHash: Promise<string> | undefined;
export async function verifyAgainstDecoy(secret: string): Promise<false> {
  decoyHash ??= hashSecret('decoy password that matches nothing');
  await verifySecret(await decoyHash, secret);
  return false;
}
