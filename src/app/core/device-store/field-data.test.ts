// First: Dexie reads the global indexedDB once when it loads, and liveQuery stays silent without it.
import 'fake-indexeddb/auto';
import { Dexie } from 'dexie';
import { IDBFactory, IDBKeyRange } from 'fake-indexeddb';
import { afterEach, describe, expect, it } from 'vitest';
import { fieldDataFor } from '../field-data/testing/field-data-fixture';
import { openDeviceDb, type DeviceDb } from './device-db';
import { keepFieldData, readFieldData } from './field-data';
import { competitionId, openTestDevice, startCheck } from './testing/test-device';

const otherCompetitionId = '0190a7e2-0000-7000-8000-000000000002';
const now = () => Date.parse('2027-01-09T06:30:00Z');

describe('field data on the device', () => {
  const open: DeviceDb[] = [];
  afterEach(() => open.splice(0).forEach((db) => db.close()));
  async function device(): Promise<DeviceDb> {
    const db = await openTestDevice();
    open.push(db);
    return db;
  }

  it('when the server’s answer is kept, then it reads back as it came, with when this device kept it', async () => {
    const db = await device();
    const result = await keepFieldData(db, fieldDataFor(competitionId), now);
    expect(result.kept).toBe(true);
    expect(await readFieldData(db, competitionId)).toEqual(fieldDataFor(competitionId));
    expect((await db.fieldData.get(competitionId))?.keptAt).toBe('2027-01-09T06:30:00.000Z');
  });

  it('when a newer answer is kept, then it replaces the old copy whole: an instrument taken away is gone', async () => {
    const db = await device();
    await keepFieldData(db, fieldDataFor(competitionId), now);
    const newer = { ...fieldDataFor(competitionId, '2027-01-09T07:00:00.000Z'), instruments: fieldDataFor(competitionId).instruments.slice(1) };
    await keepFieldData(db, newer, now);
    const kept = await readFieldData(db, competitionId);
    expect(kept?.fetchedAt).toBe('2027-01-09T07:00:00.000Z');
    expect(kept?.instruments.map((i) => i.label)).toEqual(['PYR-02']);
  });

  it('when the answer does not parse, then it is refused in words and the old copy stays', async () => {
    const db = await device();
    await keepFieldData(db, fieldDataFor(competitionId), now);
    const broken = { ...fieldDataFor(competitionId, '2027-01-09T07:00:00.000Z'), startList: [{ bib: 'seven' }] };
    const result = await keepFieldData(db, broken, now);
    expect(result).toEqual({ kept: false, problem: expect.stringContaining('could not be read by this version of the app (startList.0.bib)') });
    expect((await readFieldData(db, competitionId))?.fetchedAt).toBe('2027-01-09T06:00:00.000Z');
  });

  it('when the answer is not field data at all (a Wi-Fi login page), then nothing is kept', async () => {
    const db = await device();
    expect((await keepFieldData(db, '<html>Sign in to the hut Wi-Fi</html>', now)).kept).toBe(false);
    expect(await db.fieldData.count()).toBe(0);
  });

  it('when two competitions are kept, then each keeps its own copy', async () => {
    const db = await device();
    await keepFieldData(db, fieldDataFor(competitionId), now);
    await keepFieldData(db, fieldDataFor(otherCompetitionId), now);
    expect((await readFieldData(db, competitionId))?.competitionId).toBe(competitionId);
    expect((await readFieldData(db, otherCompetitionId))?.competitionId).toBe(otherCompetitionId);
    expect(await readFieldData(db, '0190a7e2-0000-7000-8000-000000000009')).toBeNull();
  });

  it('when a kept copy no longer fits the shape (kept by an earlier app), then it reads as none rather than a wrong one', async () => {
    const db = await device();
    const old = { ...fieldDataFor(competitionId), instruments: [{ label: 'PYR-01' }] } as unknown as ReturnType<typeof fieldDataFor>;
    await db.fieldData.put({ competitionId, data: old, keptAt: '2026-12-01T10:00:00.000Z' });
    expect(await readFieldData(db, competitionId)).toBeNull();
  });
});

describe('device schema version 3', () => {
  it('when a device on version 2 opens version 3, then its records, outbox, photos and sync state stay and field data can be kept', async () => {
    const indexedDB = new IDBFactory();
    const name = 'rimelog-field-data-upgrade';
    const deviceId = '5b0e6f0c-3c1d-4c4e-9d1a-2f6b8a7c9e01';
    // The schema as versions 1 and 2 shipped it (device-db.ts), written out so this test pins the old shape.
    const version2 = new Dexie(name, { indexedDB, IDBKeyRange });
    version2.version(1).stores({
      serverRecords: 'id',
      conflicts: 'id, status, recordId',
      syncState: 'key',
      records: 'id, [competitionId+kind], supersedes',
      outbox: 'opId, seq, recordId',
      rejections: 'opId, recordId',
      meta: 'key',
    });
    version2.version(2).stores({ photos: 'sha256, upload', photoBytes: 'sha256' });
    await version2.open();
    await version2.table('records').put({ id: 'record-7', kind: 'start-check', competitionId, fields: startCheck(7) });
    await version2.table('outbox').put({ opId: 'op-7', seq: 1, recordId: 'record-7' });
    await version2.table('photos').put({ sha256: 'ab'.repeat(32), upload: 'waiting' });
    await version2.table('syncState').put({ key: 'sync', cursor: 42, lastSyncAt: '2027-01-09T06:00:00.000Z', lastError: null });
    version2.close();

    const upgraded = await openDeviceDb({ name, deviceId, indexedDB, IDBKeyRange });
    try {
      expect(upgraded.verno).toBe(3);
      expect((await upgraded.records.get('record-7'))?.fields).toMatchObject({ bib: 7 });
      expect(await upgraded.outbox.count()).toBe(1);
      expect(await upgraded.photos.count()).toBe(1);
      expect((await upgraded.syncState.get('sync'))?.cursor).toBe(42);
      expect((await keepFieldData(upgraded, fieldDataFor(competitionId), now)).kept).toBe(true);
      expect((await readFieldData(upgraded, competitionId))?.startList).toHaveLength(3);
    } finally {
      upgraded.close();
    }
  });
});
