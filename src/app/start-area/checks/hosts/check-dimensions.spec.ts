// First: Dexie reads the global indexedDB once when it loads (each store still gets its own factory).
import 'fake-indexeddb/auto';
import { acceptDemoValues } from '../../../../../shared/rules/profile-values';
import { shippedProfile } from '../../../../../shared/rules/shipped-profiles';
import {
  anotherOfficials,
  checkFieldsOf,
  checkTime,
  entry,
  expired,
  issued,
  openStep,
  recordsOf,
  until,
  untilSaved,
  untilStored,
  type CheckPage,
} from './testing/check-page-harness';

// Natural track. The dimension list, the steel angle read at 2 places per steel and the front-pin height judged by
// eye ship as trade practice; every limit ships unset and the demo values fill them (invented for the demo race,
// not rule values): handguard height 120.0 mm to 200.0 mm, steel angle 0.0° to 20.0°.
const natural = acceptDemoValues(shippedProfile('natural', 'international'));

const caliper = issued(401, 'caliper', 'CAL-31');
const othersCaliper = anotherOfficials(402, 'caliper', 'CAL-32');
const angleGauge = issued(403, 'angle-gauge', 'ANG-33');
const expiredGauge = expired(404, 'angle-gauge', 'ANG-34');

const openDimensions = () =>
  openStep({ profile: natural, startList: [entry(7)], instruments: [caliper, othersCaliper, angleGauge, expiredGauge] }, 'dimensions');

const steelAngle = (place: string) => `steel-angle:${place}`;
/** Taps a place on the sled and keys its value on the keypad that opens there. */
function measureAt(page: CheckPage, key: string, ...keys: string[]) {
  page.click(`button[data-place="${key}"]`);
  page.keyAndSave(`rl-glove-keypad[data-keypad-for="${key}"]`, ...keys);
}

describe('CheckDimensions on the check page', () => {
  it('the demo limits the verdicts below are worked out from', () => {
    const limits = Object.fromEntries(natural.dimensions.map((rule) => [rule.kind, [rule.min?.value, rule.max?.value, rule.placesPerSteel]]));
    expect(limits['handguard-height']).toEqual([1200, 2000, undefined]);
    expect(limits['steel-angle']).toEqual([0, 200, 2]);
  });

  it('when a plain dimension is measured with the official’s caliper, then it is saved as a dimension measurement at its kind, naming the caliper', async () => {
    const { store, page, id } = await openDimensions();
    expect(page.all('[data-section="length-gauge"] button[data-instrument]').map((b) => b.getAttribute('data-instrument'))).toEqual(['CAL-31']);
    expect(page.refusedIn('length-gauge')).toEqual([['CAL-32', '✕ CAL-32 is assigned to another official.']]);
    expect(page.refusedIn('angle-gauge')).toEqual([['ANG-34', '✕ ANG-34 was calibrated until 2027-01-08; use a calibrated instrument.']]);

    page.pickInstrument('length-gauge', 'CAL-31');
    // The keypad opens on the first dimension of the minimum set.
    page.keyAndSave('rl-glove-keypad[data-keypad-for="handguard-height"]', '1', '5', '0');
    await untilSaved(page, 'Handguard height: 150.0 mm');

    const [measured, ...others] = await recordsOf(store, 'measurement');
    expect(others).toEqual([]);
    expect(measured?.fields).toEqual({
      checkId: id,
      what: 'dimension',
      place: 'handguard-height',
      value: { tenths: 1500, unit: 'millimetre' },
      takenAt: checkTime,
      instrumentId: caliper.id,
      supersedes: null,
      reason: null,
    });
    // 150.0 mm lies within 120.0 mm to 200.0 mm; the other dimensions are still to measure.
    expect(page.text('[data-dimension="handguard-height"] rl-verdict-card')).toContain('Handguard height within the limits (120.0 mm to 200.0 mm).');
    expect(page.summaryOf('dimensions')).toBe('waiting');
  });

  it('when no caliper is chosen, then a length is refused in words and nothing is saved', async () => {
    const { store, page } = await openDimensions();
    page.keyAndSave('rl-glove-keypad[data-keypad-for="handguard-height"]', '1', '5', '0');

    await until(() => page.text('rl-check-dimensions [role="alert"]') !== '', 'the refusal shows');
    expect(page.text('rl-check-dimensions [role="alert"]')).toBe(
      '⚠ Not saved. Choose a calibrated caliper or steel rule issued to you first, then measure handguard height again.',
    );
    expect(await recordsOf(store, 'measurement')).toEqual([]);
  });

  it('when the steel angle is measured, then a caliper is refused, and with the angle gauge each place is saved per steel and judged', async () => {
    const { store, page, id } = await openDimensions();
    page.pickInstrument('length-gauge', 'CAL-31');
    measureAt(page, steelAngle('left:1'), '8', '.', '5');
    await until(() => page.text('rl-check-dimensions [role="alert"]').includes('angle gauge'), 'the caliper is refused for an angle');
    expect(page.text('rl-check-dimensions [role="alert"]')).toBe('⚠ Not saved. Choose a calibrated angle gauge issued to you first, then measure steel angle again.');
    expect(await recordsOf(store, 'measurement')).toEqual([]);

    page.pickInstrument('angle-gauge', 'ANG-33');
    const readings: [string, string[], number][] = [
      ['left:1', ['8', '.', '5'], 85],
      ['left:2', ['9'], 90],
      ['right:1', ['8'], 80],
      ['right:2', ['9', '.', '5'], 95],
    ];
    for (const [place, keys, tenths] of readings) {
      measureAt(page, steelAngle(place), ...keys);
      await untilSaved(page, `Steel angle: ${Math.trunc(tenths / 10)}.${tenths % 10} °`);
    }

    const measurements = await untilStored(() => recordsOf(store, 'measurement'), (ms) => ms.length === 4, 'the four places are saved');
    expect(measurements.map((m) => m.fields).sort((a, b) => String(a['place']).localeCompare(String(b['place'])))).toEqual(
      readings.map(([place, , tenths]) => ({
        checkId: id,
        what: 'dimension',
        place: steelAngle(place),
        value: { tenths, unit: 'degree' },
        takenAt: checkTime,
        instrumentId: angleGauge.id,
        supersedes: null,
        reason: null,
      })),
    );
    // 8.0° to 9.5°, all within 0.0° to 20.0°.
    await until(() => page.text('[data-dimension="steel-angle"] rl-verdict-card').includes('within the limits'), 'the steel angle is judged');
    expect(page.text('[data-dimension="steel-angle"] rl-verdict-card')).toContain('Steel angle within the limits (0.0 ° to 20.0 °) at all 4 places.');
  });

  it('when a dimension is judged by eye, then the answer is kept in the check record and can be changed', async () => {
    const { store, page, id } = await openDimensions();
    expect((await checkFieldsOf(store, id))['byEye']).toBeNull();

    page.click('[data-dimension="front-pin-height"] button[data-answer="looks-right"]');
    let fields = await untilStored(() => checkFieldsOf(store, id), (f) => f['byEye'] !== null, 'the answer is saved');
    expect(fields['byEye']).toEqual({ 'front-pin-height': true });
    await until(() => page.text('[data-dimension="front-pin-height"] rl-verdict-card').includes('looks acceptable'), 'the answer is judged');

    page.click('[data-dimension="front-pin-height"] button[data-answer="does-not-look-right"]');
    fields = await untilStored(() => checkFieldsOf(store, id), (f) => (f['byEye'] as Record<string, boolean>)['front-pin-height'] === false, 'the new answer is saved');
    expect(fields['byEye']).toEqual({ 'front-pin-height': false });
    // Not acceptable by eye fails the dimension, so the whole step fails the check.
    await until(() => page.summaryOf('dimensions') === 'fail', 'the step fails the check');
    expect(page.text('[data-section="check-result"]')).toContain('⚠ Fails the check: Dimensions.');
    // A by-eye answer takes no instrument and no measurement.
    expect(await recordsOf(store, 'measurement')).toEqual([]);
  });
});
