// First: Dexie reads the global indexedDB once when it loads, and liveQuery stays silent without it.
// Each test database still gets its own fake factory (testing/test-device.ts).
import 'fake-indexeddb/auto';
import { Dexie } from 'dexie';
import { afterEach, describe, expect, it } from 'vitest';
import { parseHybridTime, compareHybridTimes } from '../../../../shared/sync/hybrid-clock';
import { canUpgradeDestructively, readDeviceMeta, type DeviceDb } from './device-db';
import { createRecordWriter } from './record-writer';
import { isQuotaError, RecordRefusedError, StorageFullError } from './store-errors';
import { competitionId, leader, measurement, official, openTestDevice, otherOfficial, startCheck } from './testing/test-device';

const quotaError = () => new DOMException('The quota has been exceeded.', 'QuotaExceededError');

describe('record writer', () => {
  let db: DeviceDb;
  afterEach(() => db?.close());

  // server/sync/SPEC.md §1
  it('when a record is created, then the record and its outbox entry are stored with a v7 op id, seq 1, the user and a clock', async () => {
    db = await openTestDevice();
    const writer = createRecordWriter({ db, now: () => Date.parse('2027-01-14T09:30:05Z') });
    const { record, op } = await writer.createRecord('start-check', competitionId, 'start', startCheck(12), official);

    expect(await db.records.get(record.id)).toEqual(record);
    const entry = await db.outbox.get(op!.opId);
    expect(entry?.op).toEqual(op);
    expect(op).toMatchObject({ seq: 1, userId: official, action: 'create', recordId: record.id, madeAt: '2027-01-14T09:30:05.000Z', deviceId: (await readDeviceMeta(db)).deviceId });
    expect(op!.opId).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-7/);
    expect(op!.fields['note']).toBe(''); // the schema's default is filled in before it is stored
  });

  // server/sync/SPEC.md §1
  it('when writing the outbox entry fails, then the record is not stored either and the seq is not used', async () => {
    db = await openTestDevice();
    const writer = createRecordWriter({ db });
    db.outbox.hook('creating', () => {
      throw new Error('disk went away');
    });

    await expect(writer.createRecord('start-check', competitionId, 'start', startCheck(12), official)).rejects.toThrow('disk went away');
    expect(await db.records.count()).toBe(0);
    expect(await db.outbox.count()).toBe(0);
    expect((await readDeviceMeta(db)).nextSeq).toBe(1);
  });

  it('when the disk is full, then the write fails with StorageFullError saying to sync or export, and nothing is stored', async () => {
    db = await openTestDevice();
    const writer = createRecordWriter({ db });
    db.outbox.hook('creating', () => {
      throw quotaError();
    });

    const failure = await writer.createRecord('start-check', competitionId, 'start', startCheck(3), official).catch((e: unknown) => e);
    expect(failure).toBeInstanceOf(StorageFullError);
    expect((failure as Error).message).toMatch(/sync now, or export a backup/i);
    expect(await db.records.count()).toBe(0);
  });

  it('when Dexie wraps the quota error as the inner error of an AbortError, then it is still recognised', () => {
    expect(isQuotaError(new Dexie.AbortError('Transaction aborted', quotaError()))).toBe(true);
    expect(isQuotaError(new Dexie.AbortError('Transaction aborted', new Error('other')))).toBe(false);
  });

  // server/sync/SPEC.md §5
  it('when one field is edited twice offline, then each op carries the value the device saw before it as its base', async () => {
    db = await openTestDevice();
    const writer = createRecordWriter({ db });
    const { record } = await writer.createRecord('start-check', competitionId, 'start', startCheck(7), official);
    const first = await writer.updateRecord(record.id, { note: 'runner bent' }, official);
    const second = await writer.updateRecord(record.id, { note: 'runner bent, replaced' }, otherOfficial);

    expect(first.op).toMatchObject({ action: 'update', seq: 2, fields: { note: 'runner bent' }, base: { note: '' } });
    expect(second.op).toMatchObject({ seq: 3, userId: otherOfficial, fields: { note: 'runner bent, replaced' }, base: { note: 'runner bent' } });
    expect((await db.records.get(record.id))?.fields['note']).toBe('runner bent, replaced');
    expect(compareHybridTimes(parseHybridTime(second.op!.hlc), parseHybridTime(first.op!.hlc))).toBeGreaterThan(0);
  });

  it('when an edit changes nothing, then no op is queued', async () => {
    db = await openTestDevice();
    const writer = createRecordWriter({ db });
    const { record } = await writer.createRecord('start-check', competitionId, 'start', startCheck(7, 'ok'), official);
    const same = await writer.updateRecord(record.id, { note: 'ok' }, official);
    expect(same.op).toBeNull();
    expect(await db.outbox.count()).toBe(1);
  });

  it('when the fields do not fit the kind, then the write is refused with the field named and nothing is stored', async () => {
    db = await openTestDevice();
    const writer = createRecordWriter({ db });
    const failure = await writer.createRecord('measurement', competitionId, 'start', { ...measurement(231), value: { tenths: 23.15, unit: 'kilogram' } }, official).catch((e: unknown) => e);
    expect(failure).toBeInstanceOf(RecordRefusedError);
    expect((failure as RecordRefusedError).problems[0]?.field).toBe('value.tenths');
    expect(await db.records.count()).toBe(0);
  });

  // server/sync/SPEC.md §5
  it('when a measurement is edited or removed, then it is refused, and a correction adds a new record that supersedes it with the reason', async () => {
    db = await openTestDevice();
    const writer = createRecordWriter({ db });
    const { record: old } = await writer.createRecord('measurement', competitionId, 'start', measurement(231), official);

    await expect(writer.updateRecord(old.id, { value: { tenths: 232, unit: 'kilogram' } }, official)).rejects.toBeInstanceOf(RecordRefusedError);
    await expect(writer.deleteRecord(old.id, official)).rejects.toBeInstanceOf(RecordRefusedError);
    const { record: fixed, op } = await writer.correctRecord(old.id, { value: { tenths: 241, unit: 'kilogram' } }, ' scale was not zeroed ', official);

    expect(fixed.id).not.toBe(old.id);
    expect(fixed.supersedes).toBe(old.id);
    expect(op).toMatchObject({ action: 'create', recordKind: 'measurement', fields: { supersedes: old.id, reason: 'scale was not zeroed', value: { tenths: 241, unit: 'kilogram' }, what: 'sled weight' } });
    expect(await db.records.get(old.id)).toEqual(old);
    await expect(writer.correctRecord(old.id, {}, 'again', official)).rejects.toThrow(/already corrected/);
    await expect(writer.correctRecord(fixed.id, {}, '   ', official)).rejects.toThrow(/why/);
  });

  it('when a control reading is in a log signature on this device, then its correction is refused in words and nothing is queued; an unsigned one is still corrected', async () => {
    db = await openTestDevice();
    const writer = createRecordWriter({ db });
    const reading = (tenths: number) => ({ reading: { tenths, unit: 'celsius' }, takenAt: '2027-01-14T09:05:00.000Z', instrumentId: 'P-7' });
    const { record: signed } = await writer.createRecord('control-reading', competitionId, 'start', reading(-62), official);
    const { record: unsigned } = await writer.createRecord('control-reading', competitionId, 'start', reading(-58), official);
    await writer.createRecord(
      'log-signature',
      competitionId,
      'start',
      { log: 'control-steel', readingIds: [signed.id], signedAt: '2027-01-14T09:10:00.000Z', statement: 'I took these readings.' },
      official,
    );
    const queued = await db.outbox.count();

    await expect(writer.correctRecord(signed.id, { reading: { tenths: -64, unit: 'celsius' } }, 'misread', official)).rejects.toThrow(
      new RecordRefusedError('This reading is in the signed log; a change needs the technical delegate.'),
    );
    expect(await db.outbox.count()).toBe(queued);
    expect(await db.records.where('supersedes').equals(signed.id).count()).toBe(0);

    const { record: fixed } = await writer.correctRecord(unsigned.id, { reading: { tenths: -59, unit: 'celsius' } }, 'misread', official);
    expect(fixed.supersedes).toBe(unsigned.id);
  });

  it('when a log signature is edited, removed or corrected, then it is refused: a signature is never changed', async () => {
    db = await openTestDevice();
    const writer = createRecordWriter({ db });
    const { record: reading } = await writer.createRecord('control-reading', competitionId, 'start', { reading: { tenths: -62, unit: 'celsius' }, takenAt: '2027-01-14T09:05:00.000Z', instrumentId: 'P-7' }, official);
    const { record: signature } = await writer.createRecord(
      'log-signature',
      competitionId,
      'start',
      { log: 'control-steel', readingIds: [reading.id], signedAt: '2027-01-14T09:10:00.000Z', statement: 'I took these readings.' },
      official,
    );

    await expect(writer.updateRecord(signature.id, { readingIds: [] }, official)).rejects.toBeInstanceOf(RecordRefusedError);
    await expect(writer.deleteRecord(signature.id, official)).rejects.toBeInstanceOf(RecordRefusedError);
    await expect(writer.correctRecord(signature.id, { readingIds: [] }, 'wrong', official)).rejects.toBeInstanceOf(RecordRefusedError);
    expect(await db.records.get(signature.id)).toEqual(signature);
  });

  it('when an editable record is corrected, then it is refused: it is changed instead', async () => {
    db = await openTestDevice();
    const writer = createRecordWriter({ db });
    const { record } = await writer.createRecord('start-check', competitionId, 'start', startCheck(4), official);
    await expect(writer.correctRecord(record.id, { note: 'x' }, 'typo', official)).rejects.toBeInstanceOf(RecordRefusedError);
  });

  // server/sync/SPEC.md §5
  it('when a record is removed, then it stays as a tombstone and the op carries what the device saw', async () => {
    db = await openTestDevice();
    const writer = createRecordWriter({ db });
    const { record } = await writer.createRecord('start-check', competitionId, 'start', startCheck(4, 'seen'), official);
    const { op } = await writer.deleteRecord(record.id, official);
    expect(op).toMatchObject({ action: 'delete', fields: {}, base: { note: 'seen', bib: 4 } });
    expect(await db.records.get(record.id)).toMatchObject({ deleted: true, fields: { note: 'seen' } });
    await expect(writer.updateRecord(record.id, { note: 'x' }, official)).rejects.toThrow(/removed/);
  });

  // server/sync/SPEC.md §7
  it('when the area leader settles a field conflict, then a settle op carries the value and reason and the conflict no longer waits', async () => {
    db = await openTestDevice();
    const writer = createRecordWriter({ db });
    const { record } = await writer.createRecord('start-check', competitionId, 'start', startCheck(9), official);
    const conflictId = '0190a7e2-0000-7000-8000-00000000cf01';
    const side = { userId: official, deviceId: record.deviceId, opId: 'x', hlc: record.hlc };
    await db.conflicts.put({
      id: conflictId, competitionId, area: 'start', kind: 'field', recordId: record.id, field: 'note', base: '',
      kept: { ...side, value: 'a' }, incoming: { ...side, value: 'b' }, status: 'open', settlement: null, localSettlement: null,
    });

    await expect(writer.settleConflict(conflictId, 'both', '  ', leader)).rejects.toThrow(/why/);
    const { op } = await writer.settleConflict(conflictId, 'a and b', 'both were seen', leader);

    expect(op).toMatchObject({ action: 'settle', recordId: record.id, fields: { note: 'a and b' }, settlement: { conflictId, reason: 'both were seen' }, userId: leader });
    expect((await db.conflicts.get(conflictId))?.localSettlement).toMatchObject({ value: 'a and b', opId: op!.opId });
    expect((await db.records.get(record.id))?.fields['note']).toBe('a and b');
    await expect(writer.settleConflict(conflictId, 'c', 'again', leader)).rejects.toThrow(/already settled/);
  });

  it('when the outbox holds an op, then a destructive upgrade must wait; when it is empty, it may run', async () => {
    db = await openTestDevice();
    expect(await canUpgradeDestructively(db)).toBe(true);
    await createRecordWriter({ db }).createRecord('start-check', competitionId, 'start', startCheck(1), official);
    expect(await canUpgradeDestructively(db)).toBe(false);
  });

  it('when a write commits, then onCommitted is called after the entry is readable', async () => {
    db = await openTestDevice();
    const seen: number[] = [];
    const writer = createRecordWriter({ db, onCommitted: () => void db.outbox.count().then((n) => seen.push(n)) });
    await writer.createRecord('start-check', competitionId, 'start', startCheck(1), official);
    await new Promise((resolve) => setTimeout(resolve, 10));
    expect(seen).toEqual([1]);
  });
});
