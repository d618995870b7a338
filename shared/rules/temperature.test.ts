import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { measurement } from './measurement';
import { expectRulesError } from './expect-rules-error';
import { judgeSledSteels, judgeSteelTemperature, steelTemperatureLimit, type TimedReading } from './temperature';
import { profileWith } from './test-profiles';

// The grace after a control reading falls due ships unset; 2 min is this test's own assumption.
const natural = profileWith('natural', 'international', { 'controlSteel.grace': 2 });
const artificial = profileWith('artificial', 'international', { 'controlSteel.grace': 2 });
const limitFor = (profile: typeof natural, control: number) => steelTemperatureLimit(profile, measurement(control, 'celsius')).limit;

const control = (tenths: number, takenAt: string): TimedReading => ({ reading: measurement(tenths, 'celsius'), takenAt });
const steelAt = (tenths: number, takenAt: string) => ({ reading: measurement(tenths, 'celsius'), takenAt });
const readings = [control(-49, '2027-01-09T09:00:00Z')];

describe('steel temperature limit, worked examples', () => {
  it.each([
    [-73, 0], // trade practice, no published source: natural, control −7.3 → limit 0.0
    [-50, 0], // trade practice, no published source: natural, control −5.0 → limit 0.0
    [-49, 1], // trade practice, no published source: natural, control −4.9 → limit +0.1
    [-20, 30], // trade practice, no published source: natural, control −2.0 → limit +3.0
  ])('when the natural-track control reads %i tenths, then the limit is %i tenths', (controlTenths, expected) => {
    expect(limitFor(natural, controlTenths)).toBe(expected);
  });

  it.each([
    [-90, 10], // trade practice, no published source: artificial, control −9.0 → limit +1.0
    [-40, 10], // trade practice, no published source: artificial, control −4.0 → limit +1.0
    [-39, 11], // trade practice, no published source: artificial, control −3.9 → limit +1.1
    [5, 55], // trade practice, no published source: artificial, control +0.5 → limit +5.5
  ])('when the artificial-track control reads %i tenths, then the limit is %i tenths', (controlTenths, expected) => {
    expect(limitFor(artificial, controlTenths)).toBe(expected);
  });

  it('when the limit is worked out, then the steps show the sum and the floor in words', () => {
    const { steps } = steelTemperatureLimit(natural, measurement(-73, 'celsius'));
    expect(steps).toEqual([
      'Control −7.3 °C + 5.0 °C = −2.3 °C',
      'That is below the floor of 0.0 °C for natural track, so the limit is 0.0 °C',
    ]);
  });
});

describe('steel temperature limit, properties', () => {
  const controls = fc.integer({ min: -400, max: 200 });

  it('when the control warms by a tenth, then the limit rises by nothing or exactly one tenth (continuous, never falls)', () => {
    for (const profile of [natural, artificial]) {
      fc.assert(
        fc.property(controls, (c) => {
          const step = limitFor(profile, c + 1) - limitFor(profile, c);
          return step === 0 || step === 1;
        }),
      );
    }
  });

  it('when any control is given, then the limit is whole tenths, at least the floor and at least control + 5.0 °C', () => {
    fc.assert(
      fc.property(controls, (c) => {
        const limit = limitFor(artificial, c);
        return Number.isInteger(limit) && limit >= 10 && limit >= c + 50; // trade practice, no published source
      }),
    );
  });
});

describe('judging a steel reading', () => {
  it('when the steel is exactly at the limit, then it passes; a tenth over fails (natural, control −4.9 °C)', () => {
    // trade practice, no published source: control −4.9 → limit +0.1
    const atLimit = judgeSteelTemperature({ profile: natural, steel: steelAt(1, '2027-01-09T09:05:00Z'), controlReadings: readings });
    const over = judgeSteelTemperature({ profile: natural, steel: steelAt(2, '2027-01-09T09:05:00Z'), controlReadings: readings });
    expect(atLimit.outcome).toBe('pass');
    expect(over.outcome).toBe('fail');
    expect(over.reason).toBe('Steel +0.2 °C is 0.1 °C over the limit of +0.1 °C.');
    expect(over.numbers.map((n) => n.text)).toEqual(['+0.2 °C', '−4.9 °C, read 5 min before', '+0.1 °C']);
  });

  it('when the control sits on −5.0 / −4.9 (natural) and −4.0 / −3.9 (artificial), then a steel at +0.1 / +1.1 flips', () => {
    // trade practice, no published source: natural floor 0.0 °C applies at −5.0 or colder
    const judge = (profile: typeof natural, controlTenths: number, steelTenths: number) =>
      judgeSteelTemperature({
        profile,
        steel: steelAt(steelTenths, '2027-01-09T09:01:00Z'),
        controlReadings: [control(controlTenths, '2027-01-09T09:00:00Z')],
      }).outcome;
    expect(judge(natural, -50, 1)).toBe('fail');
    expect(judge(natural, -49, 1)).toBe('pass');
    // trade practice, no published source: artificial floor +1.0 °C applies at −4.0 or colder
    expect(judge(artificial, -40, 11)).toBe('fail');
    expect(judge(artificial, -39, 11)).toBe('pass');
  });

  it('when a newer control reading exists after the steel reading, then the earlier one is used', () => {
    const twoReadings = [control(-49, '2027-01-09T09:00:00Z'), control(-100, '2027-01-09T09:10:00Z')];
    const result = judgeSteelTemperature({ profile: natural, steel: steelAt(1, '2027-01-09T09:09:59Z'), controlReadings: twoReadings });
    expect(result.outcome).toBe('pass');
    expect(result.numbers[1]!.text).toBe('−4.9 °C, read 9 min before');
  });

  it('when the control reading is older than 15 + 2 min, then the verdict is "control reading overdue", never a pass', () => {
    // trade practice, no published source: a control reading every 15 min
    const inTime = judgeSteelTemperature({ profile: natural, steel: steelAt(-100, '2027-01-09T09:17:00Z'), controlReadings: readings });
    const late = judgeSteelTemperature({ profile: natural, steel: steelAt(-100, '2027-01-09T09:17:01Z'), controlReadings: readings });
    expect(inTime.outcome).toBe('pass');
    expect(late.outcome).toBe('not-judged');
    expect(late.reason).toMatch(/^Control reading overdue: the latest was read 17 min before/);
  });

  it('when no control reading precedes the steel reading, then it is not judged', () => {
    const result = judgeSteelTemperature({ profile: natural, steel: steelAt(-100, '2027-01-09T08:59:00Z'), controlReadings: readings });
    expect(result.outcome).toBe('not-judged');
    expect(result.reason).toContain('Read the control steel first');
  });

  it('when the verdict is given, then it lists the profile values it used with their sources', () => {
    const result = judgeSteelTemperature({ profile: artificial, steel: steelAt(0, '2027-01-09T09:01:00Z'), controlReadings: readings });
    expect(result.used.map((u) => [u.path, u.text, u.source.kind])).toEqual([
      ['controlSteel.interval', '15 min', 'trade-practice'],
      ['controlSteel.grace', '2 min', 'entered-by-organiser'],
      ['temperature.margin', '+5.0 °C', 'trade-practice'],
      ['temperature.floor', '+1.0 °C', 'trade-practice'],
    ]);
  });

  it('when four steels are read and one is over, then the sled fails and each position keeps its own verdict', () => {
    const result = judgeSledSteels({
      profile: natural,
      controlReadings: readings,
      steels: [
        { ...steelAt(-10, '2027-01-09T09:02:00Z'), position: 'left-front' },
        { ...steelAt(0, '2027-01-09T09:02:00Z'), position: 'left-rear' },
        { ...steelAt(3, '2027-01-09T09:02:00Z'), position: 'right-front' },
        { ...steelAt(1, '2027-01-09T09:02:00Z'), position: 'right-rear' },
      ],
    });
    expect(result.outcome).toBe('fail');
    expect(result.verdicts.map((v) => v.outcome)).toEqual(['pass', 'pass', 'fail', 'pass']);
    expect(result.verdicts[2]!.numbers[0]!.label).toBe('Steel (right, front)');
  });
});

describe('bad input is refused with a clear error', () => {
  it('when the control readings are missing altogether, then it refuses with missing-control-reading', () => {
    expectRulesError(() => judgeSteelTemperature({ profile: natural, steel: steelAt(0, '2027-01-09T09:00:00Z'), controlReadings: undefined }), 'missing-control-reading');
  });

  it('when a steel reading comes in kilograms, then it refuses with wrong-unit', () => {
    expectRulesError(
      () => judgeSteelTemperature({ profile: natural, steel: { reading: measurement(5, 'kilogram'), takenAt: '2027-01-09T09:01:00Z' }, controlReadings: readings }),
      'wrong-unit',
    );
  });

  it('when the profile has no grace value (a gap), then it refuses with profile-gap instead of assuming one', () => {
    const gappy = profileWith('natural', 'national');
    expectRulesError(() => judgeSteelTemperature({ profile: gappy, steel: steelAt(0, '2027-01-09T09:01:00Z'), controlReadings: readings }), 'profile-gap');
  });

  it('when a reading has half a tenth, then it refuses rather than round', () => {
    expectRulesError(() => judgeSteelTemperature({ profile: natural, steel: steelAt(0.5, '2027-01-09T09:01:00Z'), controlReadings: readings }), 'invalid-input');
  });
});

