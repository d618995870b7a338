import type { LocalRecord } from '../../core/device-store/device-db';
import { localRecord } from '../../core/device-store/testing/local-record';
import { steelTemperature } from '../checks/check-steel';
import { highestSteelTemperature, highestSteelWords } from './highest-steel';

const local = (hours: number, minutes: number) => new Date(2027, 0, 14, hours, minutes).toISOString();
const id = (n: number) => `0190a7e2-0000-7000-8000-${n.toString(16).padStart(12, '0')}`;

const check = (n: number, bib: number, more: Partial<LocalRecord> = {}) =>
  localRecord('start-check', id(n), { run: 1, bib, sled: 1, status: 'cleared', beganAt: local(9, 0) }, more);
const steel = (n: number, checkId: string, tenths: number, takenAt: string, fields: Record<string, unknown> = {}, more: Partial<LocalRecord> = {}) =>
  localRecord('measurement', id(n), { checkId, what: steelTemperature, place: 'left:1', value: { tenths, unit: 'celsius' }, takenAt, instrumentId: 'P-1', ...fields }, more);

describe('highestSteelTemperature', () => {
  it('when sleds were read, then the warmest live steel reading is named with the bib of its check and its time', () => {
    const checks = [check(1, 12), check(2, 7)];
    const highest = highestSteelTemperature(
      [steel(11, id(1), -12, local(9, 10)), steel(12, id(1), 4, local(9, 14)), steel(13, id(2), -3, local(9, 20))],
      checks,
    );
    expect(highest).toEqual({ tenths: 4, bib: 12, takenAt: local(9, 14), measurementId: id(12) });
    expect(highestSteelWords(highest)).toBe('Highest sled steel temperature so far: +0.4 °C (bib 12, 09:14)');
  });

  it('when the warmest reading was corrected or removed, then it no longer counts; nor do other measurements, courtesy-like values or a removed check', () => {
    const checks = [check(1, 12), check(2, 7), check(3, 30, { deleted: true })];
    const highest = highestSteelTemperature(
      [
        steel(11, id(1), 25, local(9, 10)),
        // The 09:10 reading corrected to −0.5 °C: the correction counts, the replaced value does not.
        steel(12, id(1), -5, local(9, 10), { supersedes: id(11), reason: 'misread' }),
        steel(13, id(2), 31, local(9, 12), {}, { deleted: true }),
        steel(14, id(2), -21, local(9, 20)),
        localRecord('measurement', id(15), { checkId: id(2), what: 'sled weight', place: null, value: { tenths: 215, unit: 'kilogram' }, takenAt: local(9, 21) }),
        steel(16, id(3), 40, local(9, 25)),
        steel(17, id(2), 'warm' as unknown as number, local(9, 26)),
      ],
      checks,
    );
    expect(highest).toMatchObject({ tenths: -5, bib: 12, measurementId: id(12) });
  });

  it('when two readings tie, then the earlier one is named; a check not on this device leaves the bib unknown; no reading says so', () => {
    const highest = highestSteelTemperature([steel(11, id(9), 2, local(9, 30)), steel(12, id(1), 2, local(9, 5))], [check(1, 4)]);
    expect(highest).toMatchObject({ bib: 4, takenAt: local(9, 5) });
    const unknownBib = highestSteelTemperature([steel(11, id(9), 2, local(9, 30))], [check(1, 4)]);
    expect(highestSteelWords(unknownBib)).toBe('Highest sled steel temperature so far: +0.2 °C (bib not on this device, 09:30)');
    expect(highestSteelWords(highestSteelTemperature([], []))).toBe('Highest sled steel temperature so far: no sled steel read yet.');
  });
});
