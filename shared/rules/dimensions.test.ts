import { describe, expect, it } from 'vitest';
import { dimensionChecklist, judgeDimension, withDimension, type SteelReading } from './dimensions';
import { measurement } from './measurement';
import type { ValueSource } from './profile-value';
import { withProfileValue } from './profile-values';
import type { RulesProfile } from './rules-profile';
import { shippedProfile } from './shipped-profiles';
import { thrownBy } from './expect-rules-error';

const organiser: ValueSource = { kind: 'entered-by-organiser', verified: true };

/** The natural profile with some unset dimension values filled in as the test's own assumptions. */
function naturalWith(values: Record<string, number>): RulesProfile {
  return Object.entries(values).reduce(
    (profile, [path, value]) => withProfileValue(profile, path, value, organiser),
    shippedProfile('natural', 'international'),
  );
}

// The test's own assumption, not a rule value: handguard height 120.0 mm to 200.0 mm.
const handguard = naturalWith({ 'dimensions.handguard-height.min': 1200, 'dimensions.handguard-height.max': 2000 });
const handguardMm = (tenths: number) => judgeDimension({ profile: handguard, kind: 'handguard-height', readings: [measurement(tenths, 'millimetre')] });

// The test's own assumption, not a rule value: steel angle 0.0° to 2.0°.
const angled = naturalWith({ 'dimensions.steel-angle.min': 0, 'dimensions.steel-angle.max': 20 });
const at = (steel: SteelReading['steel'], tenths: number): SteelReading => ({ steel, value: measurement(tenths, 'degree') });
const steelAngle = (readings: SteelReading[]) => judgeDimension({ profile: angled, kind: 'steel-angle', readings });

describe('dimensionChecklist', () => {
  it('when the natural profile is shipped, then the checklist follows the officials working order', () => {
    // trade practice, no published source
    expect(dimensionChecklist(shippedProfile('natural', 'national')).map((rule) => rule.kind)).toEqual([
      'handguard-height',
      'handguard-width',
      'full-width',
      'steel-angle',
      'steel-distance',
      'runner-spacing',
      'bridge-thickness',
      'front-pin-height',
      'overall-height',
    ]);
  });

  it('when the natural profile is shipped, then exactly the four minimum checks are marked as such', () => {
    const minimum = dimensionChecklist(shippedProfile('natural', 'national')).filter((rule) => rule.minimumCheck);
    // trade practice, no published source
    expect(minimum.map((rule) => rule.kind)).toEqual(['handguard-height', 'handguard-width', 'full-width', 'steel-angle']);
  });

  it('when a minimum check is added at the end of the profile, then it comes before every other check', () => {
    const profile = withDimension(shippedProfile('natural', 'national'), {
      kind: 'seat-length',
      label: 'Seat length',
      unit: 'millimetre',
      min: null,
      max: { label: 'Seat length, maximum', value: null, unit: 'millimetre', source: { kind: 'entered-by-organiser', verified: false } },
      minimumCheck: true,
    });
    const kinds = dimensionChecklist(profile).map((rule) => rule.kind);
    expect(kinds.indexOf('seat-length')).toBe(4);
    expect(kinds.indexOf('steel-distance')).toBe(5);
    expect(profile.dimensions.at(-1)?.kind).toBe('seat-length');
  });

  it('when the steel angle is shipped, then it is read at two places per steel at least', () => {
    const angle = shippedProfile('natural', 'international').dimensions.find((rule) => rule.kind === 'steel-angle');
    expect(angle?.placesPerSteel).toBe(2); // trade practice, no published source
    expect(angle?.unit).toBe('degree');
  });
});

describe('judgeDimension: profile values', () => {
  it('when the shipped natural profile is used, then the unset limit is a profile gap, never a pass', () => {
    const error = thrownBy(() =>
      judgeDimension({ profile: shippedProfile('natural', 'international'), kind: 'handguard-height', readings: [measurement(1500, 'millimetre')] }),
    );
    expect(error.code).toBe('profile-gap');
    expect(error.details).toEqual(['dimensions.handguard-height.min']);
  });

  it('when only the minimum is filled in, then the unset maximum is still a profile gap', () => {
    const profile = naturalWith({ 'dimensions.full-width.min': 3500 }); // the test's own assumption, not a rule value
    const error = thrownBy(() => judgeDimension({ profile, kind: 'full-width', readings: [measurement(4000, 'millimetre')] }));
    expect(error.code).toBe('profile-gap');
    expect(error.details).toEqual(['dimensions.full-width.max']);
  });

  it('when a dimension is judged, then both limits used are recorded with their paths and sources', () => {
    const result = handguardMm(1500);
    expect(result.used.map((used) => [used.path, used.value, used.text, used.source.kind])).toEqual([
      ['dimensions.handguard-height.min', 1200, '120.0 mm', 'entered-by-organiser'],
      ['dimensions.handguard-height.max', 2000, '200.0 mm', 'entered-by-organiser'],
    ]);
  });

  it('when the minimum lies above the maximum, then the profile is refused', () => {
    // the test's own assumption, not a rule value: deliberately inverted limits
    const profile = naturalWith({ 'dimensions.overall-height.min': 2500, 'dimensions.overall-height.max': 1000 });
    const error = thrownBy(() => judgeDimension({ profile, kind: 'overall-height', readings: [measurement(1500, 'millimetre')] }));
    expect(error.code).toBe('invalid-input');
  });
});

describe('judgeDimension: one reading', () => {
  it('when the reading is exactly the minimum, then it passes', () => {
    expect(handguardMm(1200).outcome).toBe('pass');
  });

  it('when the reading is one tenth below the minimum, then it fails and names the minimum', () => {
    const result = handguardMm(1199);
    expect(result.outcome).toBe('fail');
    expect(result.reason).toBe('Handguard height outside the limits (120.0 mm to 200.0 mm): 119.9 mm is below the minimum 120.0 mm.');
  });

  it('when the reading is exactly the maximum, then it passes', () => {
    expect(handguardMm(2000).outcome).toBe('pass');
  });

  it('when the reading is one tenth above the maximum, then it fails', () => {
    const result = handguardMm(2001);
    expect(result.outcome).toBe('fail');
    expect(result.reason).toContain('200.1 mm is above the maximum 200.0 mm');
  });

  it('when a reading is judged, then the verdict shows the reading and both limits', () => {
    expect(handguardMm(1500).numbers).toEqual([
      { label: 'Handguard height', text: '150.0 mm' },
      { label: 'Minimum', text: '120.0 mm' },
      { label: 'Maximum', text: '200.0 mm' },
    ]);
  });

  it('when the reading is in centimetres, then it is refused as the wrong unit', () => {
    const error = thrownBy(() => judgeDimension({ profile: handguard, kind: 'handguard-height', readings: [measurement(150, 'centimetre')] }));
    expect(error.code).toBe('wrong-unit');
  });

  it('when no reading is entered, then it is a missing value', () => {
    expect(thrownBy(() => judgeDimension({ profile: handguard, kind: 'handguard-height', readings: [] })).code).toBe('missing-value');
  });

  it('when a reading has more than one decimal, then it is refused', () => {
    const error = thrownBy(() => judgeDimension({ profile: handguard, kind: 'handguard-height', readings: [{ tenths: 1500.5, unit: 'millimetre' }] }));
    expect(error.code).toBe('invalid-input');
  });

  it('when the reading is given as a yes or no, then it is refused for a measured dimension', () => {
    const error = thrownBy(() => judgeDimension({ profile: handguard, kind: 'handguard-height', readings: { acceptable: true } }));
    expect(error.code).toBe('invalid-input');
  });
});

describe('judgeDimension: per-steel readings', () => {
  it('when both steels are read at two places within the limits, then it passes at all four places', () => {
    const result = steelAngle([at('left', 0), at('left', 20), at('right', 5), at('right', 20)]);
    expect(result.outcome).toBe('pass');
    expect(result.reason).toBe('Steel angle within the limits (0.0 ° to 2.0 °) at all 4 places.');
  });

  it('when one place on the right steel is one tenth over, then the failure names the steel and the place', () => {
    const result = steelAngle([at('left', 10), at('left', 20), at('right', 10), at('right', 21)]);
    expect(result.outcome).toBe('fail');
    expect(result.reason).toBe('Steel angle outside the limits (0.0 ° to 2.0 °): right steel, place 2: 2.1 ° is above the maximum 2.0 °.');
  });

  it('when several places fail, then each one is named', () => {
    const result = steelAngle([at('left', -1), at('right', 10), at('left', 10), at('right', 30)]);
    expect(result.reason).toContain('left steel, place 1: −0.1 ° is below the minimum 0.0 °');
    expect(result.reason).toContain('right steel, place 2: 3.0 ° is above the maximum 2.0 °');
  });

  it('when the readings are judged, then each place is shown as a number', () => {
    const result = steelAngle([at('left', 10), at('right', 11), at('left', 12), at('right', 13)]);
    expect(result.numbers.slice(0, 4)).toEqual([
      { label: 'Left steel, place 1', text: '1.0 °' },
      { label: 'Right steel, place 1', text: '1.1 °' },
      { label: 'Left steel, place 2', text: '1.2 °' },
      { label: 'Right steel, place 2', text: '1.3 °' },
    ]);
  });

  it('when the left steel has one place too few, then it says how many more on which steel', () => {
    const error = thrownBy(() => steelAngle([at('left', 10), at('right', 10), at('right', 10)]));
    expect(error.code).toBe('invalid-input');
    expect(error.message).toContain('measure 1 more on the left steel');
  });

  it('when the right steel is not read at all, then it asks for two more there', () => {
    const error = thrownBy(() => steelAngle([at('left', 10), at('left', 10), at('left', 10)]));
    expect(error.code).toBe('invalid-input');
    expect(error.message).toContain('measure 2 more on the right steel'); // two places per steel: trade practice, no published source
  });

  it('when the readings do not say which steel, then they are refused', () => {
    const error = thrownBy(() => judgeDimension({ profile: angled, kind: 'steel-angle', readings: [measurement(10, 'degree')] }));
    expect(error.code).toBe('invalid-input');
  });

  it('when a steel angle is given in millimetres, then it is refused as the wrong unit', () => {
    const error = thrownBy(() =>
      steelAngle([at('left', 10), at('left', 10), at('right', 10), { steel: 'right', value: measurement(10, 'millimetre') }]),
    );
    expect(error.code).toBe('wrong-unit');
    expect(error.message).toContain('right steel, place 2');
  });
});

describe('judgeDimension: by eye and unknown kinds', () => {
  const profile = shippedProfile('natural', 'international');

  it('when the front-pin height looks acceptable, then it passes without any profile value', () => {
    const result = judgeDimension({ profile, kind: 'front-pin-height', readings: { acceptable: true } });
    expect(result.outcome).toBe('pass');
    expect(result.used).toEqual([]);
  });

  it('when the front-pin height does not look acceptable, then it fails', () => {
    expect(judgeDimension({ profile, kind: 'front-pin-height', readings: { acceptable: false } }).outcome).toBe('fail');
  });

  it('when the front-pin height is given as a number, then it is refused: it is judged by eye', () => {
    // trade practice, no published source: front-pin height is checked by eye
    const error = thrownBy(() => judgeDimension({ profile, kind: 'front-pin-height', readings: [measurement(100, 'millimetre')] }));
    expect(error.code).toBe('invalid-input');
  });

  it('when the kind is unknown, then it is refused', () => {
    const error = thrownBy(() => judgeDimension({ profile, kind: 'wing-span', readings: [measurement(100, 'millimetre')] }));
    expect(error.code).toBe('invalid-input');
  });

  it('when a natural-track dimension is asked of the artificial profile, then it is refused', () => {
    // trade practice, no published source: no dimension checks at an artificial-track start except the gap probe
    const error = thrownBy(() =>
      judgeDimension({ profile: shippedProfile('artificial', 'international'), kind: 'full-width', readings: [measurement(4000, 'millimetre')] }),
    );
    expect(error.code).toBe('invalid-input');
  });
});

describe('withDimension', () => {
  const artificial = shippedProfile('artificial', 'international');
  const runnerLength = {
    kind: 'runner-length',
    label: 'Runner length',
    unit: 'millimetre' as const,
    min: null,
    // the test's own assumption, not a rule value: at most 150.0 mm
    max: { label: 'Runner length, maximum', value: 1500, unit: 'millimetre' as const, source: organiser },
    minimumCheck: false,
  };

  it('when a dimension is added to the artificial profile, then it can be judged against its one limit', () => {
    const profile = withDimension(artificial, runnerLength);
    expect(judgeDimension({ profile, kind: 'runner-length', readings: [measurement(1500, 'millimetre')] }).outcome).toBe('pass');
    const over = judgeDimension({ profile, kind: 'runner-length', readings: [measurement(1501, 'millimetre')] });
    expect(over.outcome).toBe('fail');
    expect(over.reason).toContain('(at most 150.0 mm)');
  });

  it('when a dimension is added, then the original profile is left unchanged', () => {
    withDimension(artificial, runnerLength);
    expect(artificial.dimensions).toEqual([]);
  });

  it('when the kind already exists, then it is refused', () => {
    const profile = withDimension(artificial, runnerLength);
    expect(thrownBy(() => withDimension(profile, runnerLength)).code).toBe('invalid-input');
  });

  it('when a measured dimension has neither minimum nor maximum, then it is refused', () => {
    expect(thrownBy(() => withDimension(artificial, { ...runnerLength, max: null })).code).toBe('invalid-input');
  });

  it('when a by-eye dimension is given a limit, then it is refused', () => {
    expect(thrownBy(() => withDimension(artificial, { ...runnerLength, byEye: true })).code).toBe('invalid-input');
  });
});
