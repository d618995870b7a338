import { localRecord } from '../../core/device-store/testing/local-record';
import { courtesyCheckOf, courtesyLines } from './courtesy-check';

describe('courtesyCheckOf', () => {
  // ../shared/docs/job.md §5 (trade practice, no published source): a second pyrometer at natural-track
  // international races; a spare scale at artificial-track races.
  it('when the race is natural international, then athletes may check their steel temperature', () => {
    expect(courtesyCheckOf({ trackType: 'natural', level: 'international' })).toBe('steel temperature');
  });

  it('when the race is on an artificial track, then athletes may weigh themselves with the sled', () => {
    expect(courtesyCheckOf({ trackType: 'artificial', level: 'junior' })).toBe('athlete with sled');
    expect(courtesyCheckOf({ trackType: 'artificial', level: 'international' })).toBe('athlete with sled');
  });

  it('when the race is a natural-track national race, then no courtesy check is offered', () => {
    expect(courtesyCheckOf({ trackType: 'natural', level: 'national' })).toBeNull();
  });
});

describe('courtesyLines', () => {
  const record = (id: string, fields: Record<string, unknown>, version: number | null = null) => localRecord('courtesy-reading', id, fields, { version });

  it('when readings are on the device, then they read newest first with their value and whether the server has them', () => {
    const lines = courtesyLines([
      record('a', { bib: 4, what: 'steel temperature', value: { tenths: -32, unit: 'celsius' }, takenAt: '2027-01-14T09:00:00.000Z' }, 2),
      record('b', { bib: 7, what: 'steel temperature', value: { tenths: 5, unit: 'celsius' }, takenAt: '2027-01-14T09:05:00.000Z' }),
      record('c', { bib: 'not a bib' }),
    ]);
    expect(lines.map((l) => [l.bib, l.valueText, l.onlyHere])).toEqual([
      [7, '+0.5 °C', true],
      [4, '−3.2 °C', false],
    ]);
  });
});
