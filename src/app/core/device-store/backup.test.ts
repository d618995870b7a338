import 'fake-indexeddb/auto';
import { afterEach, describe, expect, it } from 'vitest';
import { BackupFileError, backupFileName, exportBackup, importBackup } from './backup';
import { readDeviceMeta, type DeviceDb } from './device-db';
import { pullChanges } from './pull-changes';
import { pushOutbox } from './push-outbox';
import { createRecordWriter } from './record-writer';
import { FakeSyncServer } from './testing/fake-sync-server';
import { competitionId, measurement, official, openTestDevice, startCheck } from './testing/test-device';

const now = () => Date.parse('2027-01-14T09:30:12.345Z');

describe('local backup', () => {
  const open: DeviceDb[] = [];
  afterEach(() => open.splice(0).forEach((db) => db.close()));
  async function device() {
    const db = await openTestDevice();
    open.push(db);
    return { db, writer: createRecordWriter({ db, now }) };
  }

  it('when a backup is made, then the file is named by device and UTC time and holds every unsent op and the records they touch', async () => {
    const a = await device();
    const { record } = await a.writer.createRecord('start-check', competitionId, 'start', startCheck(4), official);
    await a.writer.updateRecord(record.id, { note: 'bent runner' }, official);
    await a.writer.createRecord('measurement', competitionId, 'start', measurement(231), official);
    const deviceId = (await readDeviceMeta(a.db)).deviceId;

    const backup = await exportBackup(a.db, { now });

    expect(backup.fileName).toBe(`rimelog-backup-${deviceId}-20270114T093012Z.json`);
    expect(backupFileName(deviceId, now())).toBe(backup.fileName);
    expect(backup).toMatchObject({ opCount: 3, recordCount: 2 });
    const file = JSON.parse(backup.contents) as { ops: { opId: string }[] };
    expect(file.ops.map((op) => op.opId)).toEqual((await a.db.outbox.orderBy('seq').toArray()).map((e) => e.opId));
  });

  it('when a backup is imported on another device, then its outbox holds the same ops; importing it again adds nothing', async () => {
    const a = await device();
    const b = await device();
    const { record } = await a.writer.createRecord('start-check', competitionId, 'start', startCheck(4), official);
    await a.writer.updateRecord(record.id, { note: 'bent runner' }, official);
    const { contents } = await exportBackup(a.db, { now });

    const first = await importBackup(b.db, contents, { now });
    const second = await importBackup(b.db, contents, { now });

    expect(first).toEqual({ added: 2, alreadyHere: 0, recordsAdded: 1, photosAdded: 0 });
    expect(second).toEqual({ added: 0, alreadyHere: 2, recordsAdded: 0, photosAdded: 0 });
    const ops = async (db: DeviceDb) => (await db.outbox.orderBy('seq').toArray()).map((e) => e.op);
    expect(await ops(b.db)).toEqual(await ops(a.db));
    expect((await b.db.records.get(record.id))?.fields['note']).toBe('bent runner');
  });

  // server/sync/SPEC.md §2
  it('when both the importing device and the original device upload the same ops, then the server keeps one of each', async () => {
    const a = await device();
    const b = await device();
    const server = new FakeSyncServer();
    const { record } = await a.writer.createRecord('start-check', competitionId, 'start', startCheck(4), official);
    await a.writer.updateRecord(record.id, { note: 'bent runner' }, official);
    await importBackup(b.db, (await exportBackup(a.db, { now })).contents, { now });

    expect((await pushOutbox(b.db, server.transport(), { now })).applied).toBe(2);
    await pushOutbox(a.db, server.transport(), { now });
    await pullChanges(a.db, server.transport(), { now });

    expect(server.receipts.size).toBe(2);
    expect(server.records.size).toBe(1);
    expect(server.records.get(record.id)?.version).toBe(2);
    expect(await a.db.outbox.count()).toBe(0);
    expect((await a.db.records.get(record.id))?.fields['note']).toBe('bent runner');
  });

  it('when the file is not a complete backup, then nothing is imported and the official is told', async () => {
    const a = await device();
    const b = await device();
    await a.writer.createRecord('start-check', competitionId, 'start', startCheck(4), official);
    const { contents } = await exportBackup(a.db, { now });
    const damaged = JSON.parse(contents) as { ops: { seq: unknown }[] };
    damaged.ops[0]!.seq = 'one';

    await expect(importBackup(b.db, JSON.stringify(damaged))).rejects.toBeInstanceOf(BackupFileError);
    await expect(importBackup(b.db, contents.slice(0, 40))).rejects.toThrow(/not a Rimelog backup/);
    expect(await b.db.outbox.count()).toBe(0);
  });

  it('when photos wait to be uploaded, then the backup carries them and another device imports each once, checked against its fingerprint', async () => {
    const a = await device();
    const b = await device();
    const { record } = await a.writer.createRecord('start-check', competitionId, 'start', startCheck(4), official);
    const photo = await a.writer.attachPhoto(record.id, { mediaType: 'image/jpeg', data: new Uint8Array([0xff, 0xd8, 0xff, 1, 2, 3]).buffer, width: 4, height: 3 }, { purpose: 'evidence' }, official);
    const sha = photo.record.fields['sha256'] as string;
    const backup = await exportBackup(a.db, { now });
    expect(backup.photoCount).toBe(1);

    expect(await importBackup(b.db, backup.contents, { now })).toMatchObject({ added: 2, photosAdded: 1 });
    expect(await importBackup(b.db, backup.contents, { now })).toMatchObject({ added: 0, photosAdded: 0 });
    expect(await b.db.photos.get(sha)).toMatchObject({ upload: 'waiting', recordIds: [photo.record.id], bytes: 6, width: 4 });
    expect([...new Uint8Array((await b.db.photoBytes.get(sha))!.data)]).toEqual([0xff, 0xd8, 0xff, 1, 2, 3]);

    const damaged = JSON.parse(backup.contents) as { photos: { base64: string }[] };
    damaged.photos[0]!.base64 = btoa('not the photo');
    const c = await device();
    await expect(importBackup(c.db, JSON.stringify(damaged))).rejects.toThrow(/photo in this backup is damaged/);
    expect(await c.db.outbox.count()).toBe(0);
  });
});
