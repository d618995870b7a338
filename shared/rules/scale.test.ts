import { describe, expect, it } from 'vitest';
import { measurement, type Measurement } from './measurement';
import type { ValueSource } from './profile-value';
import { withProfileValue } from './profile-values';
import type { RulesProfile } from './rules-profile';
import { judgeControlWeights, judgeScaleReading, scaleTolerance } from './scale';
import { shippedProfile } from './shipped-profiles';
import { errorCodeOf } from './expect-rules-error';

const kgTenths = (tenths: number): Measurement => measurement(tenths, 'kilogram');
const organiser: ValueSource = { kind: 'entered-by-organiser', verified: true };

const withInService = (profile: RulesProfile, inService: boolean): RulesProfile => ({
  ...profile,
  scale: { ...profile.scale, inService },
});

describe('judgeControlWeights', () => {
  describe('natural track start', () => {
    const natural = shippedProfile('natural', 'international');

    it('when one calibrated weight of exactly 1.0 kg is shown, then it passes', () => {
      // secondary published: national luge rules (Russian Ministry of Sport), items 2.1–2.2; trade practice agrees (≥ 1 kg)
      const result = judgeControlWeights({ profile: natural, weights: [kgTenths(10)] });
      expect(result.check).toBe('control-weights');
      expect(result.outcome).toBe('pass');
      expect(result.used.map((u) => u.value)).toEqual([10, 1]);
    });

    it('when the only weight is 0.9 kg, then it fails, naming it as too light and one weight missing', () => {
      // secondary published: national luge rules (Russian Ministry of Sport), items 2.1–2.2 (at least 1 kg)
      const result = judgeControlWeights({ profile: natural, weights: [kgTenths(9)] });
      expect(result.outcome).toBe('fail');
      expect(result.reason).toContain('Too light (under 1.0 kg): weight 1 (0.9 kg).');
      expect(result.reason).toContain('1 more weight of at least 1.0 kg needed');
    });

    it('when no weight is shown, then it fails saying one is missing', () => {
      const result = judgeControlWeights({ profile: natural, weights: [] }); // trade practice, no published source: a calibrated weight proves the scale at the start
      expect(result.outcome).toBe('fail');
      expect(result.numbers).toContainEqual({ label: 'Missing', text: '1 weight' });
    });
  });

  describe('artificial track scale', () => {
    const artificial = shippedProfile('artificial', 'international');
    const twenty = Array.from({ length: 5 }, () => kgTenths(200));

    it('when five weights of exactly 20.0 kg stand at the scale, then it passes', () => {
      expect(judgeControlWeights({ profile: artificial, weights: twenty }).outcome).toBe('pass'); // trade practice, no published source: each ≥ 20 kg, ≥ 5 in total
    });

    it('when only four are there, then it fails saying one more is needed', () => {
      const result = judgeControlWeights({ profile: artificial, weights: twenty.slice(1) }); // trade practice, no published source: ≥ 5 in total
      expect(result.outcome).toBe('fail');
      expect(result.reason).toContain('1 more weight of at least 20.0 kg needed (at least 5 in all)');
    });

    it('when one of five weighs 19.9 kg, then it fails naming that weight', () => {
      const weights = [...twenty.slice(0, 2), kgTenths(199), ...twenty.slice(3)]; // trade practice, no published source: each ≥ 20 kg
      const result = judgeControlWeights({ profile: artificial, weights });
      expect(result.outcome).toBe('fail');
      expect(result.numbers).toContainEqual({ label: 'Too light', text: 'weight 3 (19.9 kg)' });
      expect(result.numbers).toContainEqual({ label: 'Control weights of at least 20.0 kg', text: '4 of at least 5' });
    });
  });

  it('when a weight is entered in °C, then it is refused as the wrong unit', () => {
    const run = () => judgeControlWeights({ profile: shippedProfile('natural', 'national'), weights: [measurement(10, 'celsius')] });
    expect(errorCodeOf(run)).toBe('wrong-unit');
  });
});

describe('scaleTolerance', () => {
  // The natural-track scale reads in 100 g steps, so e = 100 g:
  // secondary published: national luge rules (Russian Ministry of Sport), items 2.1–2.2
  const natural = shippedProfile('natural', 'international');
  const atVerification = withInService(natural, false);
  const halves = (profile: RulesProfile, loadTenths: number) => scaleTolerance({ profile, load: kgTenths(loadTenths) }).halfDivisions;

  it.each([
    // from memory: OIML R 76-1, class III maximum permissible errors
    [500, 1, 'exactly 500 e (50.0 kg): ±0.5 e'],
    [501, 2, '500 e + one step (50.1 kg): ±1 e'],
    [2000, 2, 'exactly 2 000 e (200.0 kg): ±1 e'],
    [2001, 3, '2 000 e + one step (200.1 kg): ±1.5 e'],
  ])('when the load is %i tenths of a kg at initial verification, then it allows %i half divisions (%s)', (load, expected) => {
    expect(halves(atVerification, load)).toBe(expected); // from memory: OIML R 76-1, class III maximum permissible errors
  });

  it.each([
    [500, 2],
    [501, 4],
    [2000, 4],
    [2001, 6],
  ])('when the scale is in service and the load is %i tenths, then the tolerance is doubled to %i half divisions', (load, expected) => {
    expect(halves(natural, load)).toBe(expected); // from memory: OIML R 76-1, class III maximum permissible errors, doubled in service
  });

  it('when the band is worked out, then the steps say which band and the interval', () => {
    const result = scaleTolerance({ profile: atVerification, load: kgTenths(501) });
    expect(result.steps).toEqual([
      'Scale interval e = 100 g',
      'Load 50.1 kg is above 500 e and at most 2 000 e (2 000 e = 200.0 kg): ±1 e at verification',
      'At initial verification: ±100 g (±1 e)',
    ]);
  });

  it('when e is an odd number of grams, then half a division is written exactly, without rounding', () => {
    // e = 5 g is this test's own assumption (the artificial-track scale interval ships unset).
    const profile = withInService(withProfileValue(shippedProfile('artificial', 'international'), 'scale.division', 5, organiser), false);
    expect(scaleTolerance({ profile, load: kgTenths(10) }).toleranceText).toBe('±2.5 g (±0.5 e)'); // from memory: OIML R 76-1, class III maximum permissible errors
  });

  it('when the load is more than 10 000 e, then it is refused as beyond a class III scale', () => {
    const profile = withProfileValue(shippedProfile('artificial', 'international'), 'scale.division', 5, organiser); // test's own assumption
    expect(errorCodeOf(() => scaleTolerance({ profile, load: kgTenths(500) }))).toBeUndefined(); // 50.0 kg = 10 000 e
    expect(errorCodeOf(() => scaleTolerance({ profile, load: kgTenths(501) }))).toBe('invalid-input'); // from memory: OIML R 76-1, class III has at most 10 000 e
  });

  it('when the artificial-track scale interval is still unset, then it is a profile gap', () => {
    const profile = shippedProfile('artificial', 'international');
    expect(errorCodeOf(() => scaleTolerance({ profile, load: kgTenths(200) }))).toBe('profile-gap');
  });
});

describe('judgeScaleReading', () => {
  const natural = shippedProfile('natural', 'international');
  const read = (profile: RulesProfile, known: number, reading: number) =>
    judgeScaleReading({ profile, knownWeight: kgTenths(known), reading: kgTenths(reading) });

  // The natural-track start: a 1 kg calibrated weight on a 100 g scale, in service: ±0.5 e doubled = ±100 g.
  // secondary published: national luge rules (Russian Ministry of Sport), items 2.1–2.2 (100 g steps, ≥ 1 kg weight)
  // trade practice, no published source: a calibrated weight of at least 1 kg proves the scale at the start
  it('when the 1.0 kg weight reads 1.1 kg, then the 100 g error is exactly the in-service tolerance and passes', () => {
    const result = read(natural, 10, 11); // from memory: OIML R 76-1, class III maximum permissible errors
    expect(result.check).toBe('scale-reading');
    expect(result.outcome).toBe('pass');
    expect(result.numbers).toContainEqual({ label: 'Error', text: '+100 g' });
    expect(result.numbers).toContainEqual({ label: 'Tolerance', text: '±100 g (±1 e)' });
  });

  it('when the 1.0 kg weight reads 0.8 kg, then the 200 g error fails', () => {
    const result = read(natural, 10, 8); // from memory: OIML R 76-1, class III maximum permissible errors
    expect(result.outcome).toBe('fail');
    expect(result.reason).toContain('error −200 g, outside ±100 g (±1 e)');
  });

  it('when the same scale is at initial verification, then even 100 g off fails (±50 g)', () => {
    const profile = withInService(natural, false);
    expect(read(profile, 10, 10).outcome).toBe('pass');
    expect(read(profile, 10, 11).outcome).toBe('fail'); // from memory: OIML R 76-1, class III maximum permissible errors
  });

  it('when the known weight is 50.1 kg in service, then ±200 g passes and 300 g fails', () => {
    expect(read(natural, 501, 503).outcome).toBe('pass'); // from memory: OIML R 76-1, ±1 e above 500 e, doubled in service
    expect(read(natural, 501, 504).outcome).toBe('fail');
  });

  it('when the known weight is 200.1 kg in service, then ±300 g passes and 400 g fails', () => {
    expect(read(natural, 2001, 1998).outcome).toBe('pass'); // from memory: OIML R 76-1, ±1.5 e above 2 000 e, doubled in service
    expect(read(natural, 2001, 1997).outcome).toBe('fail');
  });

  it('when the reading is in °C, then it is refused as the wrong unit', () => {
    const run = () => judgeScaleReading({ profile: natural, knownWeight: kgTenths(10), reading: measurement(10, 'celsius') });
    expect(errorCodeOf(run)).toBe('wrong-unit');
  });
});
