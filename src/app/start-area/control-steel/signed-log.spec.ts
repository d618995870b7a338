import type { LocalRecord } from '../../core/device-store/device-db';
import { localRecord } from '../../core/device-store/testing/local-record';
import { controlLog } from './control-log';
import { logSignatures, maxReadingsPerSignature, readingsToSign, signedReadingIds } from './signed-log';

const competitionId = '0190a7e2-0000-7000-8000-000000000001';
const local = (hours: number, minutes: number) => new Date(2027, 0, 14, hours, minutes).toISOString();
const id = (n: number) => `0190a7e2-0000-7000-8000-${n.toString(16).padStart(12, '0')}`;

const record = (kind: LocalRecord['kind'], recordId: string, hlc: string, fields: Record<string, unknown>, more: Partial<LocalRecord> = {}): LocalRecord =>
  localRecord(kind, recordId, fields, { competitionId, hlc, version: 3, ...more });

const reading = (n: number, at: string, more: Record<string, unknown> = {}) =>
  record('control-reading', id(n), `00000000000000${n}-00000-a`, { reading: { tenths: -60 - n, unit: 'celsius' }, takenAt: at, instrumentId: 'P-7', ice: null, air: null, ...more });
const signature = (n: number, readingIds: string[], at: string, more: Partial<LocalRecord> = {}) =>
  record('log-signature', id(100 + n), `00000000000010${n}-00000-a`, { log: 'control-steel', readingIds, signedAt: at, statement: 'I took these readings.' }, more);
const picture = (of: string, purpose = 'signature') =>
  record('photo', id(500), '000000000000200-00000-a', { of, purpose, sha256: 'a'.repeat(64), mediaType: 'image/png', bytes: 71, width: 3, height: 2, takenAt: local(9, 30), caption: '' });

describe('signedReadingIds', () => {
  it('when signatures list readings, then exactly those are signed; a removed signature or another kind of record freezes nothing', () => {
    const signed = signedReadingIds([
      signature(1, [id(1), id(2)], local(9, 30)),
      signature(2, [id(3)], local(9, 45)),
      signature(3, [id(4)], local(9, 50), { deleted: true }),
      reading(5, local(9, 55)),
    ]);
    expect([...signed].sort()).toEqual([id(1), id(2), id(3)]);
  });

  it('when a signature cannot be fully read by this version, then the readings it lists are still frozen', () => {
    const odd = record('log-signature', id(109), '000000000000109-00000-a', { log: 'a log of the future', readingIds: [id(1), 7] });
    expect([...signedReadingIds([odd])]).toEqual([id(1)]);
  });
});

describe('readingsToSign', () => {
  it('when some readings are signed, then the rest are to sign, corrections and corrected readings included, oldest first', () => {
    const log = controlLog([
      reading(1, local(9, 0)),
      reading(2, local(9, 15)),
      reading(3, local(9, 15), { supersedes: id(2), reason: 'misread' }),
      reading(4, local(9, 30)),
    ]);
    const toSign = readingsToSign(log.entries, new Set([id(1)]), 'official-one');
    expect(toSign.readings.map((entry) => entry.id)).toEqual([id(2), id(3), id(4)]);
    expect(toSign.left).toBe(0);
  });

  it('when another official took a reading, then only they can sign it: the statement says "I took these readings"', () => {
    const log = controlLog([reading(1, local(9, 0)), record('control-reading', id(2), '000000000000002-00000-b', { reading: { tenths: -61, unit: 'celsius' }, takenAt: local(9, 15), instrumentId: 'P-8', ice: null, air: null }, { createdBy: 'official-two' })]);
    expect(readingsToSign(log.entries, new Set(), 'official-one').readings.map((entry) => entry.id)).toEqual([id(1)]);
    expect(readingsToSign(log.entries, new Set(), 'official-two').readings.map((entry) => entry.id)).toEqual([id(2)]);
    expect(readingsToSign(log.entries, new Set(), null).readings).toEqual([]);
  });

  it('when more readings wait than one signature covers, then the oldest are signed first', () => {
    const many = Array.from({ length: maxReadingsPerSignature + 2 }, (_, n) => reading(n + 1, new Date(2027, 0, 14, 8, 0, n).toISOString()));
    const toSign = readingsToSign(controlLog(many).entries, new Set(), 'official-one');
    expect(toSign.readings).toHaveLength(maxReadingsPerSignature);
    expect(toSign.readings[0]?.id).toBe(id(1));
    expect(toSign.readings.at(-1)?.id).toBe(id(maxReadingsPerSignature));
    expect(toSign.left).toBe(2);
  });
});

describe('logSignatures', () => {
  it('when signatures are on the device, then the newest comes first with its time, count and whether its picture is here', () => {
    const first = signature(1, [id(1), id(2)], local(9, 30));
    const second = signature(2, [id(3)], local(9, 45), { createdBy: 'official-two', deviceId: 'device-2' });
    const lines = logSignatures([first, second], [picture(first.id), picture(second.id, 'evidence')]);
    expect(lines).toEqual([
      { id: second.id, officialId: 'official-two', timeText: '09:45', readingCount: 1, hasPicture: false, deviceId: 'device-2' },
      { id: first.id, officialId: 'official-one', timeText: '09:30', readingCount: 2, hasPicture: true, deviceId: 'device-1' },
    ]);
  });
});
