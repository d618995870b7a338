import { scryptAsync } from '@noble/hashes/scrypt.js';
import { bytesToHex, hexToBytes } from '@noble/hashes/utils.js';
import type { PinVerifier } from './pin-verifier-schema';

// The cost and the five-try lock are what protect a PIN, which has few possible values.
const cost = { N: 2 ** 15, r: 8, p: 1, dkLen: 32 } as const;

export async function makePinVerifier(pin: string): Promise<PinVerifier> {
  const salt = crypto.getRandomValues(new Uint8Array(16));
  const key = await scryptAsync(pin, salt, cost);
  return { kdf: 'scrypt', ...cost, saltHex: bytesToHex(salt), keyHex: bytesToHex(key) };
}

export async function pinMatches(pin: string, verifier: PinVerifier): Promise<boolean> {
  const { N, r, p, dkLen } = verifier;
  const key = await scryptAsync(pin, hexToBytes(verifier.saltHex), { N, r, p, dkLen });
  return sameBytes(key, hexToBytes(verifier.keyHex));
}

/** Compares every byte, whatever the first difference, so timing says nothing about the PIN. */
function sameBytes(a: Uint8Array, b: Uint8Array): boolean {
  if (a.length !== b.length) return false;
  let difference = 0;
  for (let i = 0; i < a.length; i++) difference |= a[i]! ^ b[i]!;
  return difference === 0;
}
