// First: Dexie reads the global indexedDB once when it loads, and liveQuery stays silent without it.
import 'fake-indexeddb/auto';
import { filter, firstValueFrom, timeout } from 'rxjs';
import { afterEach, describe, expect, it } from 'vitest';
import type { DeviceDb } from './device-db';
import { createRecordWriter, maxPhotoBytes } from './record-writer';
import { createSyncEngine, type SyncEngine } from './sync-engine';
import { FakeSyncServer } from './testing/fake-sync-server';
import { competitionId, official, openTestDevice, startCheck } from './testing/test-device';
import { uploadWaitingPhotos } from './upload-photos';

const now = () => Date.parse('2027-01-14T10:00:00Z');
const bytes = (text: string) => new TextEncoder().encode(text).buffer as ArrayBuffer;
const jpeg = (text: string) => ({ mediaType: 'image/jpeg' as const, data: bytes(text), width: 1600, height: 1200 });
// FIPS 180-4 example (SHA-256 of "abc"), as published in the NIST example values.
const shaOfAbc = 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad';

describe('photos on the device', () => {
  const open: DeviceDb[] = [];
  const engines: SyncEngine[] = [];
  afterEach(() => {
    engines.splice(0).forEach((e) => e.stop());
    open.splice(0).forEach((db) => db.close());
  });
  async function device(server = new FakeSyncServer()) {
    const db = await openTestDevice();
    open.push(db);
    const writer = createRecordWriter({ db, now });
    const engine = createSyncEngine({ db, transport: server.transport(), uploads: server.uploads(), now, random: () => 0.5 });
    engines.push(engine);
    const check = (await writer.createRecord('start-check', competitionId, 'start', startCheck(7), official)).record;
    return { db, writer, engine, server, check };
  }

  it('when a photo is attached, then its record, its outbox entry and the file named by its SHA-256 are saved together', async () => {
    const { db, writer, check } = await device();

    const { record, op } = await writer.attachPhoto(check.id, jpeg('abc'), { purpose: 'evidence', caption: 'burr on the left steel' }, official);

    expect(record.fields).toMatchObject({ of: check.id, sha256: shaOfAbc, purpose: 'evidence', mediaType: 'image/jpeg', bytes: 3, width: 1600, caption: 'burr on the left steel' });
    expect(op).toMatchObject({ action: 'create', recordKind: 'photo', competitionId, area: 'start' });
    expect(await db.outbox.get(op!.opId)).toBeDefined();
    expect(await db.photos.get(shaOfAbc)).toMatchObject({ upload: 'waiting', recordIds: [record.id], bytes: 3, attempts: 0 });
    expect(new TextDecoder().decode((await db.photoBytes.get(shaOfAbc))!.data)).toBe('abc');
  });

  it('when the same file is attached twice, then it is kept once and both photo records point at it', async () => {
    const { db, writer, check } = await device();
    const first = await writer.attachPhoto(check.id, jpeg('same'), { purpose: 'evidence' }, official);
    const second = await writer.attachPhoto(check.id, jpeg('same'), { purpose: 'evidence' }, official);
    expect(await db.photos.count()).toBe(1);
    expect((await db.photos.toArray())[0]?.recordIds).toEqual([first.record.id, second.record.id]);
  });

  it('when the record is not on the device or the file is too big, then nothing is kept and the official is told why', async () => {
    const { db, writer, check } = await device();
    await expect(writer.attachPhoto('0190a7e2-0000-7000-8000-00000000dead', jpeg('x'), { purpose: 'evidence' }, official)).rejects.toThrow(/not on this device/);
    const tooBig = { ...jpeg(''), data: new ArrayBuffer(maxPhotoBytes + 1) };
    await expect(writer.attachPhoto(check.id, tooBig, { purpose: 'evidence' }, official)).rejects.toThrow(/at most 10 MB/);
    expect(await db.photos.count()).toBe(0);
    expect(await db.outbox.count()).toBe(1); // only the start check
  });

  it('when the photo record has not reached the server, then the file waits; after the round that sends the record, it goes up', async () => {
    const { db, writer, engine, server, check } = await device();
    await writer.attachPhoto(check.id, jpeg('abc'), { purpose: 'evidence' }, official);

    expect(await uploadWaitingPhotos(db, server.uploads(), { now })).toEqual({ sent: 0, failed: 0, waiting: 1 });
    expect(server.files.size).toBe(0);

    const round = await engine.syncNow();

    expect(round).toMatchObject({ ok: true, pushed: { applied: 2 }, photos: { sent: 1, failed: 0, waiting: 0 } });
    expect(server.calls.indexOf('put-file')).toBeGreaterThan(server.calls.indexOf('push'));
    expect(new TextDecoder().decode(server.files.get(shaOfAbc)!.data)).toBe('abc');
    expect(await db.photos.get(shaOfAbc)).toMatchObject({ upload: 'sent', lastError: null, attempts: 1 });
  });

  it('when one file is refused, then the others and the records still go, and it waits with the reason in words', async () => {
    const { db, writer, engine, server, check } = await device();
    const bad = await writer.attachPhoto(check.id, jpeg('bad'), { purpose: 'evidence' }, official);
    await writer.attachPhoto(check.id, jpeg('good'), { purpose: 'evidence' }, official);
    server.refuseFile = (sha) => (sha === bad.record.fields['sha256'] ? 'This file is not the JPEG photo it was sent as, so it was not kept.' : null);

    const round = await engine.syncNow();

    expect(round).toMatchObject({ ok: true, pushed: { applied: 3 }, photos: { sent: 1, failed: 1 } });
    expect(server.records.size).toBe(3);
    const status = await firstValueFrom(engine.status$.pipe(filter((s) => s.photosWaiting === 1), timeout(5_000)));
    expect(status).toMatchObject({ pendingCount: 0, lastError: null, photoError: 'This file is not the JPEG photo it was sent as, so it was not kept.' });
    expect(await db.photos.get(bad.record.fields['sha256'] as string)).toMatchObject({ upload: 'waiting', attempts: 1 });
  });

  it('when the queue is resumed and the server already has a file, then it is not sent again', async () => {
    const { db, writer, engine, server, check } = await device();
    await writer.attachPhoto(check.id, jpeg('abc'), { purpose: 'evidence' }, official);
    server.files.set(shaOfAbc, { mediaType: 'image/jpeg', data: new TextEncoder().encode('abc') }); // arrived before the answer was lost

    await engine.syncNow();

    expect(server.calls.filter((c) => c === 'put-file')).toEqual([]);
    expect(server.calls).toContain('has-file');
    expect((await db.photos.get(shaOfAbc))?.upload).toBe('sent');
  });

  it('when the connection drops during the queue, then the rest wait for the next round without a try each', async () => {
    const { db, writer, server, check } = await device();
    for (const text of ['one', 'two', 'three']) await writer.attachPhoto(check.id, jpeg(text), { purpose: 'evidence' }, official);
    await createSyncEngine({ db, transport: server.transport(), now }).syncNow(); // records only: no uploads given
    server.outage = 'unreachable';

    const summary = await uploadWaitingPhotos(db, server.uploads(), { now });

    expect(summary).toEqual({ sent: 0, failed: 1, waiting: 2 });
    expect(server.calls.filter((c) => c === 'has-file')).toHaveLength(1);
    server.outage = null;
    expect(await uploadWaitingPhotos(db, server.uploads(), { now })).toEqual({ sent: 3, failed: 0, waiting: 0 });
  });
});
