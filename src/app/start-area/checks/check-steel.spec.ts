import type { LocalRecord } from '../../core/device-store/device-db';
import { localRecord } from '../../core/device-store/testing/local-record';
import { profileWith } from '../../../../shared/rules/test-profiles';
import type { TimedReading } from '../../../../shared/rules/temperature';
import { judgeSpots } from '../steel-temperatures/steel-spots';
import { isAlreadyReported, placeOf, savedSteelReadings, spotOfPlace, steelOutcome, steelRule, steelViolationFields } from './check-steel';

// The grace after a control reading falls due ships unset; 2 min is this spec's own assumption.
// Margin +5.0 °C, natural floor 0.0 °C and the 15 min interval: trade practice, no published source.
const natural = profileWith('natural', 'international', { 'controlSteel.grace': 2 });
const controls: TimedReading[] = [{ reading: { tenths: -49, unit: 'celsius' }, takenAt: '2027-01-09T09:00:00.000Z' }];
const checkId = '0190a7e2-0000-7000-8000-0000000000c1';
const otherCheckId = '0190a7e2-0000-7000-8000-0000000000c2';
let nextId = 1;

function record(kind: LocalRecord['kind'], fields: Record<string, unknown>, changes: Partial<LocalRecord> = {}): LocalRecord {
  const id = `0190a7e2-0000-7000-8000-${String(nextId++).padStart(12, '0')}`;
  return localRecord(kind, id, fields, { deviceId: 'device', supersedes: null, ...changes });
}

const steelReading = (place: string, tenths: number, minute = 5, changes: Record<string, unknown> = {}) =>
  record('measurement', {
    checkId,
    what: 'steel temperature',
    place,
    value: { tenths, unit: 'celsius' },
    takenAt: `2027-01-09T09:0${minute}:00.000Z`,
    instrumentId: 'pyrometer-2',
    supersedes: null,
    reason: null,
    ...changes,
  });

describe('check steel records', () => {
  it('when a place is read back, then only a real steel and spot count', () => {
    expect(placeOf({ steel: 'right', spot: 4 })).toBe('right:5'); // the rear spot, counted from 1 as on the screen
    expect(spotOfPlace(placeOf({ steel: 'right', spot: 4 }))).toEqual({ steel: 'right', spot: 4 });
    for (const place of ['left:0', 'left:6', 'middle:1', 'left:', 'left:1:2', 'left:1.5', null]) expect(spotOfPlace(place)).toBeNull();
  });

  it('when the saved readings of a check are read, then corrected, removed, other checks’ and other measurements are left out', () => {
    const corrected = steelReading('left:1', -30, 1);
    const correction = steelReading('left:1', -40, 2, { supersedes: corrected.id, reason: 'read again' });
    const records = [
      corrected,
      { ...correction, supersedes: corrected.id },
      steelReading('left:3', -31, 3, { checkId: otherCheckId }),
      steelReading('right:2', -32, 3, {}),
      { ...steelReading('right:4', -33, 4), deleted: true },
      record('measurement', { checkId, what: 'sled weight', place: null, value: { tenths: 241, unit: 'kilogram' }, takenAt: '2027-01-09T09:04:00.000Z', instrumentId: null }),
    ];
    expect(savedSteelReadings(records, checkId).map((s) => [s.id, s.reading.steel, s.reading.spot, s.reading.tenths])).toEqual([
      [correction.id, 'left', 0, -40],
      [records[3]!.id, 'right', 1, -32],
    ]);
  });

  it('when several readings are over the limit, then the measured words fit the record and the note keeps every reason', () => {
    // natural, control −4.9 °C → limit +0.1 °C: trade practice, no published source.
    const records = [steelReading('left:1', 12), steelReading('left:5', 13), steelReading('right:1', 14), steelReading('right:5', 15)];
    const saved = savedSteelReadings(records, checkId);
    const outcome = steelOutcome(judgeSpots(natural, controls, saved.map((s) => s.reading)), saved);
    if (outcome.kind !== 'fail') throw new Error(`expected a fail, got ${outcome.kind}`);
    const fields = steelViolationFields(checkId, outcome.failed);

    expect(fields['measurementIds']).toEqual(records.map((r) => r.id));
    expect(String(fields['measured']).length).toBeLessThanOrEqual(200);
    expect(fields['measured']).toMatch(/^Left steel, spot 1: steel \(left, front\) \+1\.2 °C, control steel −4\.9 °C, read 5 min before, limit \+0\.1 °C; .*and \d more over the limit \(see the note\)$/);
    expect(String(fields['note']).split('\n')).toHaveLength(4);
    expect(fields['note']).toContain('Right steel, spot 5: Steel +1.5 °C is 1.4 °C over the limit of +0.1 °C.');
  });

  it('when a violation was already recorded for the same readings, then it counts as reported; for other readings it does not', () => {
    const records = [steelReading('left:1', 12)];
    const saved = savedSteelReadings(records, checkId);
    const outcome = steelOutcome(judgeSpots(natural, controls, saved.map((s) => s.reading)), saved);
    if (outcome.kind !== 'fail') throw new Error(`expected a fail, got ${outcome.kind}`);
    const violation = record('violation', { ...steelViolationFields(checkId, outcome.failed) });
    expect(isAlreadyReported([violation], checkId, outcome.failed)).toBe(true);
    expect(isAlreadyReported([{ ...violation, deleted: true }], checkId, outcome.failed)).toBe(false);
    expect(isAlreadyReported([record('violation', { ...violation.fields, measurementIds: [] })], checkId, outcome.failed)).toBe(false);
    expect(violation.fields['rule']).toBe(steelRule);
  });

  it('when every reading is within the limit, then the outcome is a pass; with none read, there is none', () => {
    const saved = savedSteelReadings([steelReading('left:1', -12)], checkId);
    expect(steelOutcome(judgeSpots(natural, controls, saved.map((s) => s.reading)), saved)).toEqual({ kind: 'pass' });
    expect(steelOutcome(null, [])).toEqual({ kind: 'none' });
  });
});
