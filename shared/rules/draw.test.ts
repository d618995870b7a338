import { createHash, createHmac } from 'node:crypto';
import chi2gof from '@stdlib/stats-chi2gof';
import fc from 'fast-check';
import { beforeAll, describe, expect, it } from 'vitest';
import {
  acceptanceLimit,
  commitToSeed,
  createDrawSeed,
  drawOutcome,
  drawOutcomeLabels,
  drawWeightsFrom,
  hmacSha256Hex,
  outcomeForValue,
  sha256Hex,
  valueFromChunk,
  verifyDraw,
  verifySeedReveal,
  type DrawResult,
  type DrawWeights,
} from './draw';
import { expectRulesError } from './expect-rules-error';
import type { UsedValue } from './profile-value';
import { drawOutcomes, type DrawOutcome } from './rules-profile';
import { profileWith } from './test-profiles';

const bytes = (length: number, fill: number) => new Uint8Array(length).fill(fill);
const text = (value: string) => new TextEncoder().encode(value);

// A fixed seed so every run of these tests draws the same numbers.
const seedHex = '9f3c2a71d04e8b56a1c7e2f09d3b4a5c6e7f8091a2b3c4d5e6f708192a3b4c5d';
const otherSeedHex = '0f3c2a71d04e8b56a1c7e2f09d3b4a5c6e7f8091a2b3c4d5e6f708192a3b4c5d';
const competitionId = '0193a5c0-0000-7000-8000-000000000001';
// Demo values (the demo race's 80/15/5), not rule values: this test's own assumption.
const demoWeights: DrawWeights = { none: 80, remeasure: 15, detailed: 5 };

/**
 * The draw re-implemented from the comment in draw.ts alone, with Node's own HMAC and BigInt
 * arithmetic, so the module is checked against a second, independent implementation.
 */
function referenceDraw(seed: string, id: string, run: number, bib: number, w: DrawWeights) {
  const total = BigInt(w.none + w.remeasure + w.detailed);
  const range = 1n << 48n;
  const limit = range - (range % total);
  for (let round = 0; ; round++) {
    const message = `rimelog-draw-v1|${id}|${run}|${bib}${round === 0 ? '' : `|${round}`}`;
    const mac = createHmac('sha256', Buffer.from(seed, 'hex')).update(message, 'utf8').digest();
    for (let i = 0; i < 5; i++) {
      const chunk = BigInt(`0x${mac.subarray(i * 6, i * 6 + 6).toString('hex')}`);
      if (chunk < limit) {
        const value = Number(chunk % total);
        const outcome: DrawOutcome = value < w.none ? 'none' : value < w.none + w.remeasure ? 'remeasure' : 'detailed';
        return { outcome, value, round, chunkIndex: i, macHex: mac.toString('hex') };
      }
    }
  }
}

describe('HMAC-SHA-256 and SHA-256 against published test vectors', () => {
  it('when the key is 20 bytes of 0x0b and the data "Hi There", then the MAC is the published one', () => {
    // RFC 4231, test case 1
    expect(hmacSha256Hex(bytes(20, 0x0b), text('Hi There'))).toBe('b0344c61d8db38535ca8afceaf0bf12b881dc200c9833da726e9376c2e32cff7');
  });

  it('when the key is shorter than the MAC, then the MAC is the published one', () => {
    // RFC 4231, test case 2
    expect(hmacSha256Hex(text('Jefe'), text('what do ya want for nothing?'))).toBe(
      '5bdcc146bf60754e6a042426089575c75a003f089d2739839dec58b964ec3843',
    );
  });

  it('when key and data are repeated bytes, then the MAC is the published one', () => {
    // RFC 4231, test case 3
    expect(hmacSha256Hex(bytes(20, 0xaa), bytes(50, 0xdd))).toBe('773ea91e36800e46854db8ebd09181a72959098b3ef8c122d9635514ced565fe');
  });

  it('when the key is longer than a hash block, then the MAC is the published one', () => {
    // RFC 4231, test case 6
    expect(hmacSha256Hex(bytes(131, 0xaa), text('Test Using Larger Than Block-Size Key - Hash Key First'))).toBe(
      '60e431591ee0b67f0d8a26aacbf5b77f8e0bc6213728c5140546040f0ee37f54',
    );
  });

  it('when "abc" is hashed, then the digest is the published one', () => {
    // FIPS 180-4 (NIST example values)
    expect(sha256Hex(text('abc'))).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
  });

  it('when the 448-bit two-block message is hashed, then the digest is the published one', () => {
    // FIPS 180-4 (NIST example values)
    expect(sha256Hex(text('abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq'))).toBe(
      '248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1',
    );
  });
});

describe('seed, commitment and reveal', () => {
  it('when a seed is made, then it asks for 32 bytes and writes exactly those as lower-case hex', () => {
    const asked: number[] = [];
    const seed = createDrawSeed((n) => {
      asked.push(n);
      return Uint8Array.from({ length: n }, (_, i) => 0xf0 + (i % 16));
    });
    expect(asked).toEqual([32]);
    expect(seed).toBe('f0f1f2f3f4f5f6f7f8f9fafbfcfdfeff'.repeat(2));
  });

  it('when two seeds come from the platform random source, then they differ', () => {
    const random = (n: number) => crypto.getRandomValues(new Uint8Array(n));
    expect(createDrawSeed(random)).toMatch(/^[0-9a-f]{64}$/);
    expect(createDrawSeed(random)).not.toBe(createDrawSeed(random));
  });

  it('when the random source gives the wrong length or only zeros, then no seed is made', () => {
    expectRulesError(() => createDrawSeed((n) => bytes(n - 1, 7)), 'invalid-input');
    expectRulesError(() => createDrawSeed((n) => bytes(n, 0)), 'invalid-input');
  });

  it('when a seed is committed to, then the commitment is SHA-256 of its 32 bytes', () => {
    expect(commitToSeed(seedHex)).toBe(createHash('sha256').update(Buffer.from(seedHex, 'hex')).digest('hex'));
  });

  it('when the same seed is revealed, then the reveal is accepted, also in capitals', () => {
    const commitment = commitToSeed(seedHex);
    expect(verifySeedReveal(seedHex, commitment)).toBe(true);
    expect(verifySeedReveal(seedHex.toUpperCase(), commitment.toUpperCase())).toBe(true);
  });

  it('when a different seed is revealed, then the reveal is rejected', () => {
    const commitment = commitToSeed(seedHex);
    expect(verifySeedReveal(otherSeedHex, commitment)).toBe(false);
    expect(verifySeedReveal(seedHex, commitToSeed(otherSeedHex))).toBe(false);
  });

  it('when the seed or the commitment is not 64 hex digits, then it is refused as bad input', () => {
    expectRulesError(() => commitToSeed(seedHex.slice(1)), 'invalid-input');
    expectRulesError(() => verifySeedReveal(seedHex, `${commitToSeed(seedHex).slice(2)}zz`), 'invalid-input');
  });
});

describe('draw weights from the rules profile', () => {
  const weightsProfile = (none: number, remeasure: number, detailed: number) =>
    // The shipped profiles leave the weights unset; these are the test's own assumption.
    profileWith('artificial', 'international', {
      'finishPlan.drawWeights.none': none,
      'finishPlan.drawWeights.remeasure': remeasure,
      'finishPlan.drawWeights.detailed': detailed,
    });

  it('when the shipped profile leaves the weights unset, then it is a profile gap, never a default', () => {
    expectRulesError(() => drawWeightsFrom(profileWith('natural', 'international'), []), 'profile-gap');
  });

  it('when the weights are set, then they are read and each is recorded as used', () => {
    const used: UsedValue[] = [];
    expect(drawWeightsFrom(weightsProfile(80, 15, 5), used)).toEqual({ none: 80, remeasure: 15, detailed: 5 });
    expect(used.map((u) => [u.path, u.value])).toEqual([
      ['finishPlan.drawWeights.none', 80],
      ['finishPlan.drawWeights.remeasure', 15],
      ['finishPlan.drawWeights.detailed', 5],
    ]);
  });

  it('when a weight is negative or all add up to 0, then it is refused as bad input', () => {
    expectRulesError(() => drawWeightsFrom(weightsProfile(80, -1, 5), []), 'invalid-input');
    const zero = expectRulesError(() => drawWeightsFrom(weightsProfile(0, 0, 0), []), 'invalid-input');
    expect(zero.message).toContain('add up to 0');
  });

  it('when only one weight is above 0, then the weights are accepted', () => {
    expect(drawWeightsFrom(weightsProfile(0, 0, 1), [])).toEqual({ none: 0, remeasure: 0, detailed: 1 });
  });
});

describe('mapping a value onto the outcomes', () => {
  it.each([
    [0, 'none'],
    [79, 'none'],
    [80, 'remeasure'],
    [94, 'remeasure'],
    [95, 'detailed'],
    [99, 'detailed'],
  ] as const)('when the value is %i of 0–99 with weights 80/15/5, then the outcome is %s', (value, expected) => {
    expect(outcomeForValue(value, demoWeights)).toBe(expected);
  });

  it('when the value is outside 0 to total − 1, then it is refused', () => {
    expectRulesError(() => outcomeForValue(100, demoWeights), 'invalid-input');
    expectRulesError(() => outcomeForValue(-1, demoWeights), 'invalid-input');
  });

  it.each([3, 7, 100, 2 ** 47 + 1, 2 ** 48])('when the total is %i, then the limit is 2^48 minus 2^48 mod total', (total) => {
    const range = 1n << 48n;
    const expected = range - (range % BigInt(total));
    expect(BigInt(acceptanceLimit(total))).toBe(expected);
    expect(acceptanceLimit(total) % total).toBe(0);
  });

  it('when a chunk is one below the limit, then it is accepted; at the limit, then it is rejected', () => {
    const limit = acceptanceLimit(100);
    expect(valueFromChunk(limit - 1, 100)).toBe(99);
    expect(valueFromChunk(limit, 100)).toBeNull();
    expect(valueFromChunk(2 ** 48 - 1, 100)).toBeNull();
  });
});

describe('drawing an outcome', () => {
  const draw = (run: number, bib: number, weights = demoWeights) => drawOutcome({ seedHex, competitionId, run, bib, weights });

  it('when the same inputs are drawn twice, then the outcome and its working are the same', () => {
    expect(draw(2, 17)).toEqual(draw(2, 17));
  });

  it('when the MAC is checked independently, then it is HMAC-SHA-256 of the documented message', () => {
    const result = draw(2, 17);
    expect(result.message).toBe(`rimelog-draw-v1|${competitionId}|2|17`);
    expect(result.macHex).toBe(createHmac('sha256', Buffer.from(seedHex, 'hex')).update(result.message).digest('hex'));
  });

  it('when the bib or the run differs, then the MAC differs and outcomes vary', () => {
    expect(draw(1, 18).macHex).not.toBe(draw(1, 17).macHex);
    expect(draw(2, 17).macHex).not.toBe(draw(1, 17).macHex);
    const even = { none: 1, remeasure: 1, detailed: 0 };
    const outcomes = new Set(Array.from({ length: 40 }, (_, bib) => draw(1, bib + 1, even).outcome));
    expect(outcomes).toEqual(new Set(['none', 'remeasure']));
  });

  it('when drawn for many athletes, then every result equals the independent re-implementation', () => {
    for (let bib = 1; bib <= 200; bib++) {
      const { outcome, value, round, chunkIndex, macHex } = draw(1 + (bib % 3), bib);
      expect({ outcome, value, round, chunkIndex, macHex }).toEqual(referenceDraw(seedHex, competitionId, 1 + (bib % 3), bib, demoWeights));
    }
  });

  it('when the total is just above 2^47 so that about half the chunks are rejected, then later chunks and rounds follow the rule', () => {
    const heavy = { none: 2 ** 47, remeasure: 1, detailed: 0 };
    const results = Array.from({ length: 300 }, (_, i) => draw(1, i + 1, heavy));
    expect(results.some((r) => r.chunkIndex > 0)).toBe(true);
    const secondRound = results.filter((r) => r.round > 0);
    expect(secondRound.length).toBeGreaterThan(0);
    expect(secondRound[0]!.message).toMatch(/\|\d+\|1$/);
    results.forEach((r, i) => {
      const { outcome, value, round, chunkIndex, macHex } = r;
      expect({ outcome, value, round, chunkIndex, macHex }).toEqual(referenceDraw(seedHex, competitionId, 1, i + 1, heavy));
    });
  });

  it.each([
    ['a competition id with "|"', { competitionId: 'a|1' }],
    ['an empty competition id', { competitionId: '' }],
    ['run 0', { run: 0 }],
    ['a bib of 1.5', { bib: 1.5 }],
    ['a short seed', { seedHex: seedHex.slice(2) }],
    ['weights adding up to 0', { weights: { none: 0, remeasure: 0, detailed: 0 } }],
    ['a negative weight', { weights: { none: 80, remeasure: -15, detailed: 5 } }],
    ['a weight of 2.5', { weights: { none: 80, remeasure: 2.5, detailed: 5 } }],
  ])('when the draw is given %s, then it is refused as bad input', (_, change) => {
    expectRulesError(() => drawOutcome({ seedHex, competitionId, run: 1, bib: 1, weights: demoWeights, ...change }), 'invalid-input');
  });
});

describe('verifying a recorded draw', () => {
  const commitmentHex = commitToSeed(seedHex);
  const drawn = { seedHex, competitionId, run: 1, bib: 23, weights: demoWeights };
  const base = { ...drawn, commitmentHex };
  const actual = drawOutcome(drawn).outcome;
  const wrong = drawOutcomes.find((o) => o !== actual)!;

  it('when the recorded outcome is the one the revealed seed gives, then the draw is verified', () => {
    const result = verifyDraw({ ...base, recordedOutcome: actual });
    expect(result).toMatchObject({ isSeedCommitted: true, isOutcomeMatching: true, isVerified: true });
    expect(result.reason).toMatch(/^Verified: .*bib 23, run 1, as recorded\.$/);
  });

  it('when a different outcome was recorded, then the draw is not verified and the reason names both', () => {
    const result = verifyDraw({ ...base, recordedOutcome: wrong });
    expect(result).toMatchObject({ isSeedCommitted: true, isOutcomeMatching: false, isVerified: false });
    expect(result.reason).toContain('Not verified');
    expect(result.reason).toContain(`"${drawOutcomeLabels[actual]}"`);
    expect(result.reason).toContain(`"${drawOutcomeLabels[wrong]}" was recorded`);
  });

  it('when the revealed seed is not the committed one, then the draw is not verified whatever was recorded', () => {
    const other = drawOutcome({ ...drawn, seedHex: otherSeedHex }).outcome;
    const result = verifyDraw({ ...base, seedHex: otherSeedHex, recordedOutcome: other });
    expect(result).toMatchObject({ isSeedCommitted: false, isOutcomeMatching: true, isVerified: false });
    expect(result.reason).toContain('does not match the commitment');
  });

  it('when the recorded outcome is not a draw outcome, then it is refused as bad input', () => {
    expectRulesError(() => verifyDraw({ ...base, recordedOutcome: 'maybe' as DrawOutcome }), 'invalid-input');
  });
});

describe('fairness of the draw', () => {
  // Demo weights 80/15/5, not rule values. Bias check: chi-square goodness-of-fit test, computed with a
  // general-purpose statistics package from npm.
  const expected = [0.8, 0.15, 0.05];
  const draws = 100_000;
  let results: DrawResult[] = [];
  beforeAll(() => {
    results = Array.from({ length: draws }, (_, i) =>
      drawOutcome({ seedHex, competitionId, run: 1 + (i % 4), bib: 1 + Math.floor(i / 4), weights: demoWeights }),
    );
  });
  const countOf = (outcomes: DrawOutcome[]) => drawOutcomes.map((o) => outcomes.filter((x) => x === o).length);

  it('when 100,000 draws are counted, then the chi-square test does not reject the weights at alpha 0.001', () => {
    const observed = countOf(results.map((r) => r.outcome));
    expect(observed.reduce((a, b) => a + b, 0)).toBe(draws);
    const test = chi2gof(observed, expected, { alpha: 0.001 });
    expect(test.rejected).toBe(false);
    expect(test.pValue).toBeGreaterThan(0.001);
  });

  it('when the same MACs are mapped with a plain modulo of one byte, then the test rejects that bias', () => {
    // 256 is not a multiple of 100: values 0–55 come up 3 times in 256, the rest twice.
    const biased = results.map((r) => outcomeForValue(Number.parseInt(r.macHex.slice(0, 2), 16) % 100, demoWeights));
    expect(chi2gof(countOf(biased), expected, { alpha: 0.001 }).rejected).toBe(true);
  });

  it('when the true draws are tested against slightly shifted weights 81/14/5, then the test rejects them', () => {
    const observed = countOf(results.map((r) => r.outcome));
    expect(chi2gof(observed, [0.81, 0.14, 0.05], { alpha: 0.001 }).rejected).toBe(true);
  });
});

describe('draw properties', () => {
  const weightsArb = fc
    .record({ none: fc.nat({ max: 1000 }), remeasure: fc.nat({ max: 1000 }), detailed: fc.nat({ max: 1000 }) })
    .filter((w) => w.none + w.remeasure + w.detailed > 0);
  const inputArb = fc.record({
    seedHex: fc.uint8Array({ minLength: 32, maxLength: 32 }).map((b) => Buffer.from(b).toString('hex')),
    competitionId: fc.string({ minLength: 1, maxLength: 40 }).filter((id) => !id.includes('|')),
    run: fc.integer({ min: 1, max: 10 }),
    bib: fc.integer({ min: 1, max: 999 }),
    weights: weightsArb,
  });

  it('when any inputs are drawn, then the outcome lies within the weights and never has weight 0', () => {
    fc.assert(
      fc.property(inputArb, (input) => {
        const result = drawOutcome(input);
        const index = drawOutcomes.indexOf(result.outcome);
        const total = input.weights.none + input.weights.remeasure + input.weights.detailed;
        expect(index).toBeGreaterThanOrEqual(0);
        expect(index).toBeLessThan(3);
        expect(input.weights[result.outcome]).toBeGreaterThan(0);
        expect(result.total).toBe(total);
        expect(Number.isSafeInteger(result.value) && result.value >= 0 && result.value < total).toBe(true);
      }),
    );
  });

  it('when any inputs are drawn, then the result equals the independent re-implementation', () => {
    fc.assert(
      fc.property(inputArb, (input) => {
        const { seedHex: seed, competitionId: id, run, bib, weights } = input;
        expect(drawOutcome(input).outcome).toBe(referenceDraw(seed, id, run, bib, weights).outcome);
      }),
    );
  });
});
