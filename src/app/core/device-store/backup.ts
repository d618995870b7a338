import { z } from 'zod';
import { areas } from '../../../../shared/auth/roles';
import { sha256 } from '@noble/hashes/sha2.js';
import { bytesToHex } from '@noble/hashes/utils.js';
import { photoMediaTypes, recordKinds, type RecordKind } from '../../../../shared/sync/record-kinds';
import { syncOpSchema } from '../../../../shared/sync/sync-api';
import { readDeviceMeta, type DeviceDb, type LocalRecord, type OutboxEntry, type PhotoFile } from './device-db';
import { storageFailure } from './store-errors';

const backupFormat = 'rimelog-device-backup';

const localRecordSchema = z.strictObject({
  id: z.uuid(),
  kind: z.enum(recordKinds as [RecordKind, ...RecordKind[]]),
  competitionId: z.uuid(),
  area: z.enum(areas),
  fields: z.record(z.string(), z.json()),
  createdBy: z.string(),
  deviceId: z.string(),
  hlc: z.string(),
  deleted: z.boolean(),
  version: z.number().int().nullable(),
  supersedes: z.string().nullable(),
  lastLocalChange: z.strictObject({ opId: z.string(), userId: z.string(), madeAt: z.string() }).nullable(),
});

const backupPhotoSchema = z.strictObject({
  sha256: z.string().regex(/^[0-9a-f]{64}$/),
  mediaType: z.enum(photoMediaTypes),
  width: z.number().int().nullable(),
  height: z.number().int().nullable(),
  addedAt: z.string(),
  recordIds: z.array(z.string()),
  base64: z.base64(),
});

/**
 * The backup file: every op still in the outbox, unchanged, the device's view of the records they touch,
 * and every photo file not uploaded yet. Version 1 files (before photos) still import.
 */
export const backupFileSchema = z.strictObject({
  format: z.literal(backupFormat),
  formatVersion: z.union([z.literal(1), z.literal(2)]),
  deviceId: z.string(),
  exportedAt: z.iso.datetime({ offset: true }),
  ops: z.array(syncOpSchema),
  records: z.array(localRecordSchema),
  photos: z.array(backupPhotoSchema).default([]),
});
export type BackupFile = z.infer<typeof backupFileSchema>;

export class BackupFileError extends Error {
  override readonly name = 'BackupFileError';
}

/** `rimelog-backup-<deviceId>-20270114T093012Z.json`: sortable, and safe on every file system. */
export function backupFileName(deviceId: string, atMs: number): string {
  const utc = new Date(atMs).toISOString().replace(/\.\d{3}Z$/, 'Z').replace(/[-:]/g, '');
  return `rimelog-backup-${deviceId}-${utc}.json`;
}

/**
 * The way out when this device cannot reach the server: one JSON file with every unsent op. It can be
 * imported on another device, which sends the same ops (same op ids) for this one.
 */
export async function exportBackup(
  db: DeviceDb,
  options: { now?: () => number } = {},
): Promise<{ fileName: string; contents: string; opCount: number; recordCount: number; photoCount: number }> {
  const atMs = (options.now ?? Date.now)();
  const { meta, entries, records, photos } = await db.transaction('r', [db.meta, db.outbox, db.records, db.photos, db.photoBytes], async () => {
    const entries = await db.outbox.orderBy('seq').toArray();
    const recordIds = [...new Set(entries.map((e) => e.recordId))];
    const records = (await db.records.bulkGet(recordIds)).filter((r): r is LocalRecord => r !== undefined);
    const waiting = await db.photos.where('upload').equals('waiting').toArray();
    const bytes = await db.photoBytes.bulkGet(waiting.map((p) => p.sha256));
    const photos = waiting.flatMap((photo, i) => {
      const data = bytes[i]?.data;
      if (!data) return [];
      const { sha256, mediaType, width, height, addedAt, recordIds } = photo;
      return [{ sha256, mediaType, width, height, addedAt, recordIds, base64: toBase64(data) }];
    });
    return { meta: await readDeviceMeta(db), entries, records, photos };
  });
  const file: BackupFile = {
    format: backupFormat,
    formatVersion: 2,
    deviceId: meta.deviceId,
    exportedAt: new Date(atMs).toISOString(),
    ops: entries.map((e) => e.op),
    records,
    photos,
  };
  return {
    fileName: backupFileName(meta.deviceId, atMs),
    contents: JSON.stringify(file, null, 1),
    opCount: entries.length,
    recordCount: records.length,
    photoCount: photos.length,
  };
}

/**
 * Adds a backup's ops to this device's outbox unchanged. Ops already in the outbox are skipped, and the
 * server answers "duplicate" for any it already has, so importing a file twice changes nothing. Records
 * this device does not have yet are added so the official sees them; existing ones are left alone.
 */
export async function importBackup(db: DeviceDb, contents: string, options: { now?: () => number } = {}): Promise<{ added: number; alreadyHere: number; recordsAdded: number; photosAdded: number }> {
  const file = readBackup(contents);
  const photos = file.photos.map(decodePhoto);
  const queuedAt = new Date((options.now ?? Date.now)()).toISOString();
  const ops = [...file.ops].sort((a, b) => a.seq - b.seq);
  try {
    return await db.transaction('rw', [db.outbox, db.records, db.photos, db.photoBytes], async () => {
      let added = 0;
      let recordsAdded = 0;
      for (const op of ops) {
        if (await db.outbox.get(op.opId)) continue;
        const entry: OutboxEntry = { opId: op.opId, seq: op.seq, deviceId: op.deviceId, recordId: op.recordId, op, queuedAt, lastAnswer: null };
        await db.outbox.add(entry);
        added++;
      }
      for (const record of file.records) {
        if (await db.records.get(record.id)) continue;
        await db.records.add(record);
        recordsAdded++;
      }
      let photosAdded = 0;
      for (const { photo, data } of photos) {
        const kept = await db.photos.get(photo.sha256);
        if (kept) {
          const recordIds = [...new Set([...kept.recordIds, ...photo.recordIds])];
          if (recordIds.length > kept.recordIds.length) await db.photos.put({ ...kept, recordIds });
          continue;
        }
        await db.photos.add(photo);
        await db.photoBytes.put({ sha256: photo.sha256, data });
        photosAdded++;
      }
      return { added, alreadyHere: ops.length - added, recordsAdded, photosAdded };
    });
  } catch (error) {
    throw storageFailure(error);
  }
}

function readBackup(contents: string): BackupFile {
  let json: unknown;
  try {
    json = JSON.parse(contents);
  } catch {
    throw new BackupFileError('This file is not a Rimelog backup (it is not readable JSON).');
  }
  const parsed = backupFileSchema.safeParse(json);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    throw new BackupFileError(`This file is not a complete Rimelog backup (${issue?.path.join('.') || 'file'}: ${issue?.message}). Nothing was imported.`);
  }
  return parsed.data;
}

/** A photo of the file, checked against its fingerprint so a damaged file is refused, not kept as evidence. */
function decodePhoto(photo: BackupFile['photos'][number]): { photo: PhotoFile; data: ArrayBuffer } {
  const data = fromBase64(photo.base64);
  if (bytesToHex(sha256(new Uint8Array(data))) !== photo.sha256) {
    throw new BackupFileError(`A photo in this backup is damaged (its contents do not match its fingerprint ${photo.sha256.slice(0, 12)}…). Nothing was imported.`);
  }
  const { base64: _encoded, ...described } = photo;
  return { photo: { ...described, bytes: data.byteLength, upload: 'waiting', attempts: 0, lastError: null, lastTriedAt: null }, data };
}

function toBase64(data: ArrayBuffer): string {
  const bytes = new Uint8Array(data);
  let binary = '';
  // In slices: String.fromCharCode with a whole photo's bytes as arguments overflows the call stack.
  for (let i = 0; i < bytes.length; i += 0x8000) binary += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
  return btoa(binary);
}

function fromBase64(text: string): ArrayBuffer {
  const binary = atob(text);
  const bytes = new Uint8Array(binary.length);
  for (let i = 0; i < binary.length; i++) bytes[i] = binary.charCodeAt(i);
  return bytes.buffer;
}
