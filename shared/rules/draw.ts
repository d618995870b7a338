import { hmac } from '@noble/hashes/hmac.js';
import { sha256 } from '@noble/hashes/sha2.js';
import { bytesToHex, hexToBytes, utf8ToBytes } from '@noble/hashes/utils.js';
import { z } from 'zod';
import { useValue, type UsedValue } from './profile-value';
import { RulesInputError } from './rules-error';
import { drawOutcomes, type DrawOutcome, type RulesProfile } from './rules-profile';

/*
 * The finish draw, version 1. Precise enough to re-implement from this comment alone.
 *
 * 1. Before the first run the technical delegate's device makes a seed of 32 random bytes and
 *    publishes its commitment: SHA-256 (FIPS 180-4) of the 32 seed bytes, as 64 lower-case hex digits.
 * 2. The message of a draw is the UTF-8 text "rimelog-draw-v1|<competition id>|<run>|<bib>", run
 *    and bib written in decimal without leading zeros; the competition id never contains "|".
 *    Round 0 uses the message as it is; round k (k = 1, 2, ...) appends "|<k>".
 *    mac = HMAC-SHA-256 (RFC 2104) with key = the 32 seed bytes over the message of the round.
 * 3. total = none + remeasure + detailed (whole numbers, each 0 or more, 1 <= total <= 2^48);
 *    limit = 2^48 - (2^48 mod total), the largest multiple of total that is not above 2^48.
 * 4. The mac's bytes 0-5, 6-11, 12-17, 18-23 and 24-29 are read in this order, each as a big-endian
 *    48-bit whole number (chunk); bytes 30 and 31 are not used. The first chunk below limit is
 *    accepted; when all five are rejected, the next round's mac is read the same way.
 *    (Rejecting the top of the range keeps every outcome exactly as likely as its weight says.)
 * 5. value = accepted chunk mod total. The outcome is "none" when value < none, "remeasure" when
 *    value < none + remeasure, otherwise "detailed".
 * After the races the seed is revealed: anyone can check SHA-256(seed) against the commitment and
 * recompute every draw.
 */

export const drawMessagePrefix = 'rimelog-draw-v1';
export const drawSeedBytes = 32;
const chunkBytes = 6;
const chunksPerMac = 5;
const chunkRange = 2 ** 48;

export const drawOutcomeLabels: Record<DrawOutcome, string> = {
  none: 'no inspection',
  remeasure: 're-measure',
  detailed: 'detailed check',
};

export interface DrawWeights {
  none: number;
  remeasure: number;
  detailed: number;
}

const hexSchema = (what: string) =>
  z
    .string()
    .regex(/^[0-9a-fA-F]{64}$/, `${what} must be 64 hex digits (0-9, a-f).`)
    .transform((hex) => hex.toLowerCase());

const weightSchema = z
  .number()
  .int('A draw weight must be a whole number.')
  .min(0, 'A draw weight cannot be negative.')
  .max(chunkRange, 'A draw weight is too large.');

const weightsSchema = z
  .strictObject({ none: weightSchema, remeasure: weightSchema, detailed: weightSchema })
  .refine((w) => w.none + w.remeasure + w.detailed > 0, 'The draw weights add up to 0: give at least one outcome a weight above 0.')
  .refine((w) => w.none + w.remeasure + w.detailed <= chunkRange, 'The draw weights add up to more than 2^48.');

const drawInputSchema = z.strictObject({
  seedHex: hexSchema('The draw seed'),
  competitionId: z
    .string()
    .min(1, 'The competition id is missing.')
    .max(200)
    .refine((id) => !id.includes('|'), 'The competition id may not contain "|".'),
  run: z.number().int('The run is a whole number.').min(1, 'Runs are numbered from 1.').safe(),
  bib: z.number().int('A start number is a whole number.').min(1, 'Start numbers begin at 1.').safe(),
  weights: weightsSchema,
});
export type DrawInput = z.input<typeof drawInputSchema>;

function parseOrThrow<T extends z.ZodType>(schema: T, input: unknown, what: string): z.output<T> {
  const parsed = schema.safeParse(input);
  if (!parsed.success) {
    const details = parsed.error.issues.map((issue) => issue.message);
    throw new RulesInputError('invalid-input', `${what}: ${details.join(' ')}`, details);
  }
  return parsed.data;
}

/** HMAC-SHA-256 (RFC 2104, SHA-256 of FIPS 180-4) as lower-case hex. */
export const hmacSha256Hex = (key: Uint8Array, message: Uint8Array): string => bytesToHex(hmac(sha256, key, message));

/** SHA-256 (FIPS 180-4) as lower-case hex. */
export const sha256Hex = (bytes: Uint8Array): string => bytesToHex(sha256(bytes));

/** A fresh seed from the caller's random source (crypto.getRandomValues on the device). */
export function createDrawSeed(randomBytes: (n: number) => Uint8Array): string {
  const bytes = randomBytes(drawSeedBytes);
  if (!(bytes instanceof Uint8Array) || bytes.length !== drawSeedBytes) {
    throw new RulesInputError('invalid-input', `The random source must give exactly ${drawSeedBytes} bytes for a draw seed.`);
  }
  // All zeros means the random source did not fill the buffer; such a seed would be guessable.
  if (bytes.every((byte) => byte === 0)) {
    throw new RulesInputError('invalid-input', 'The random source gave only zeros: the draw seed would not be random.');
  }
  return bytesToHex(bytes);
}

const seedBytes = (seedHex: string): Uint8Array => hexToBytes(parseOrThrow(hexSchema('The draw seed'), seedHex, 'Draw seed'));

/** The commitment published before the first run: SHA-256 of the seed bytes, in hex. */
export const commitToSeed = (seedHex: string): string => sha256Hex(seedBytes(seedHex));

/** True when the revealed seed is the one committed to before the first run. */
export function verifySeedReveal(seedHex: string, commitmentHex: string): boolean {
  const commitment = parseOrThrow(hexSchema('The commitment'), commitmentHex, 'Draw commitment');
  return commitToSeed(seedHex) === commitment;
}

/** The draw weights of the profile's finish plan, each recorded as used. */
export function drawWeightsFrom(profile: RulesProfile, used: UsedValue[]): DrawWeights {
  const { drawWeights } = profile.finishPlan;
  const weights = {
    none: useValue(used, 'finishPlan.drawWeights.none', drawWeights.none, 'count'),
    remeasure: useValue(used, 'finishPlan.drawWeights.remeasure', drawWeights.remeasure, 'count'),
    detailed: useValue(used, 'finishPlan.drawWeights.detailed', drawWeights.detailed, 'count'),
  };
  return parseOrThrow(weightsSchema, weights, 'Finish draw weights in the rules profile');
}

/** Values at or above this are rejected, so every value mod total is equally likely. */
export const acceptanceLimit = (total: number): number => chunkRange - (chunkRange % total);

/** The value an accepted 48-bit chunk stands for, or null when the chunk is rejected. */
export function valueFromChunk(chunk: number, total: number): number | null {
  return chunk < acceptanceLimit(total) ? chunk % total : null;
}

/** Maps a value in 0..total-1 onto the outcomes in the order none, remeasure, detailed. */
export function outcomeForValue(value: number, weights: DrawWeights): DrawOutcome {
  const w = parseOrThrow(weightsSchema, weights, 'Finish draw weights');
  const total = w.none + w.remeasure + w.detailed;
  if (!Number.isSafeInteger(value) || value < 0 || value >= total) {
    throw new RulesInputError('invalid-input', `A draw value must be a whole number from 0 to ${total - 1}, not ${value}.`);
  }
  if (value < w.none) return 'none';
  return value < w.none + w.remeasure ? 'remeasure' : 'detailed';
}

export interface DrawResult {
  outcome: DrawOutcome;
  /** The MAC the accepted chunk came from. */
  macHex: string;
  /** Accepted chunk mod total: 0 <= value < total. */
  value: number;
  total: number;
  /** The exact text the MAC was computed over. */
  message: string;
  /** 0 unless every chunk of the first MAC was rejected. */
  round: number;
  /** Which 6-byte chunk (0-4) was accepted, and its value. */
  chunkIndex: number;
  chunk: number;
}

function chunkAt(mac: Uint8Array, index: number): number {
  let chunk = 0;
  for (let i = index * chunkBytes; i < (index + 1) * chunkBytes; i++) chunk = chunk * 256 + mac[i];
  return chunk;
}

/** One athlete's draw at the finish, reproducible by anyone who knows the revealed seed. */
export function drawOutcome(input: DrawInput): DrawResult {
  const { seedHex, competitionId, run, bib, weights } = parseOrThrow(drawInputSchema, input, 'Finish draw');
  const key = hexToBytes(seedHex);
  const total = weights.none + weights.remeasure + weights.detailed;
  const base = `${drawMessagePrefix}|${competitionId}|${run}|${bib}`;
  // Ends with probability 1: each chunk is accepted with probability above one half.
  for (let round = 0; ; round++) {
    const message = round === 0 ? base : `${base}|${round}`;
    const mac = hmac(sha256, key, utf8ToBytes(message));
    for (let chunkIndex = 0; chunkIndex < chunksPerMac; chunkIndex++) {
      const chunk = chunkAt(mac, chunkIndex);
      const value = valueFromChunk(chunk, total);
      if (value !== null) {
        const outcome = outcomeForValue(value, weights);
        return { outcome, macHex: bytesToHex(mac), value, total, message, round, chunkIndex, chunk };
      }
    }
  }
}

export interface DrawVerification {
  isSeedCommitted: boolean;
  isOutcomeMatching: boolean;
  isVerified: boolean;
  recomputed: DrawResult;
  /** Plain words for the published verification. */
  reason: string;
}

/** Recomputes a recorded draw from the revealed seed and checks the seed against its commitment. */
export function verifyDraw(
  input: DrawInput & { commitmentHex: string; recordedOutcome: DrawOutcome },
): DrawVerification {
  const { commitmentHex, recordedOutcome, ...drawInput } = input;
  const recorded = parseOrThrow(z.enum(drawOutcomes), recordedOutcome, 'Recorded draw outcome');
  const isSeedCommitted = verifySeedReveal(drawInput.seedHex, commitmentHex);
  const recomputed = drawOutcome(drawInput);
  const isOutcomeMatching = recomputed.outcome === recorded;
  const which = `bib ${drawInput.bib}, run ${drawInput.run}`;
  const reason = !isSeedCommitted
    ? 'Not verified: the revealed seed does not match the commitment published before the first run.'
    : isOutcomeMatching
      ? `Verified: the revealed seed matches its commitment and gives "${drawOutcomeLabels[recomputed.outcome]}" for ${which}, as recorded.`
      : `Not verified: the seed gives "${drawOutcomeLabels[recomputed.outcome]}" for ${which}, but "${drawOutcomeLabels[recorded]}" was recorded.`;
  return { isSeedCommitted, isOutcomeMatching, isVerified: isSeedCommitted && isOutcomeMatching, recomputed, reason };
}
