import type { LocalRecord } from '../../core/device-store/device-db';
import { localRecord } from '../../core/device-store/testing/local-record';
import { countdownClock } from './clock-time';
import { controlLog, currentReadings } from './control-log';

const competitionId = '0190a7e2-0000-7000-8000-000000000001';
const local = (hours: number, minutes: number) => new Date(2027, 0, 14, hours, minutes).toISOString();

const record = (id: string, hlc: string, fields: Record<string, unknown>, more: Partial<LocalRecord> = {}): LocalRecord =>
  localRecord('control-reading', id, fields, { competitionId, hlc, version: 3, ...more });

const first = '0190a7e2-0000-7000-8000-0000000000d1';
const second = '0190a7e2-0000-7000-8000-0000000000d2';
const fix = '0190a7e2-0000-7000-8000-0000000000d3';
const base = { instrumentId: 'P-7', ice: null, air: null };

describe('controlLog', () => {
  it('when readings and a correction are logged, then the newest comes first and a correction sits above the reading it replaces', () => {
    const log = controlLog([
      record(first, '000000000000001-00000-a', { ...base, reading: { tenths: -62, unit: 'celsius' }, takenAt: local(9, 5) }),
      record(fix, '000000000000003-00000-a', { ...base, reading: { tenths: -64, unit: 'celsius' }, takenAt: local(9, 5), supersedes: first, reason: 'misread' }, { version: null }),
      record(second, '000000000000002-00000-a', { ...base, reading: { tenths: 5, unit: 'celsius' }, takenAt: local(9, 20), ice: { tenths: -81, unit: 'celsius' }, air: { tenths: -20, unit: 'celsius' } }),
    ]);

    expect(log.entries.map((e) => [e.readingText, e.timeText, e.isCorrected, e.isOnlyOnDevice])).toEqual([
      ['+0.5 °C', '09:20', false, false],
      ['−6.4 °C', '09:05', false, true],
      ['−6.2 °C', '09:05', true, false],
    ]);
    expect(log.entries[0]).toMatchObject({ iceText: '−8.1 °C', airText: '−2.0 °C', correction: null });
    expect(log.entries[1]?.correction).toEqual({ ofTimeText: '09:05', reason: 'misread' });
    // The replaced value no longer counts for the countdown or for verdicts.
    expect(currentReadings(log.entries).map((r) => r.reading.tenths)).toEqual([5, -64]);
  });

  it('when a record cannot be read by this version of the app, then it is counted, not silently dropped', () => {
    const log = controlLog([record(first, '000000000000001-00000-a', { reading: 'warm', takenAt: local(9, 5) })]);
    expect(log).toEqual({ entries: [], unreadable: 1 });
  });
});

describe('countdownClock', () => {
  it('when under an hour, then minutes and seconds; from an hour on, hours too', () => {
    expect(countdownClock(0)).toBe('0:00');
    expect(countdownClock(599)).toBe('9:59');
    expect(countdownClock(3729)).toBe('1:02:09');
  });
});
