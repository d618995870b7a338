import { z } from 'zod';

/**
 * What the device keeps to check a PIN with no network: scrypt of the PIN with a random salt. A PIN
 * has few values, so the cost (about 32 MiB and a fifth of a second per try) and the five-try lock are
 * what protect it; the parameters are kept with each verifier so they can be raised later.
 */
export const pinVerifierSchema = z.object({
  kdf: z.literal('scrypt'),
  N: z.number().int().positive(),
  r: z.number().int().positive(),
  p: z.number().int().positive(),
  dkLen: z.number().int().positive(),
  saltHex: z.string().regex(/^[0-9a-f]{32}$/),
  keyHex: z.string().regex(/^[0-9a-f]+$/),
});
export type PinVerifier = z.infer<typeof pinVerifierSchema>;
