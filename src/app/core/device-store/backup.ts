import { z } from 'zod';
import { areas } from '../../../../shared/auth/roles';
import { recordKinds, type RecordKind } from '../../../../shared/sync/record-kinds';
import { syncOpSchema } from '../../../../shared/sync/sync-api';
import { readDeviceMeta, type DeviceDb, type LocalRecord, type OutboxEntry } from './device-db';
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

/** The backup file: every op still in the outbox, unchanged, and the device's view of the records they touch. */
export const backupFileSchema = z.strictObject({
  format: z.literal(backupFormat),
  formatVersion: z.literal(1),
  deviceId: z.string(),
  exportedAt: z.iso.datetime({ offset: true }),
  ops: z.array(syncOpSchema),
  records: z.array(localRecordSchema),
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
export async function exportBackup(db: DeviceDb, options: { now?: () => number } = {}): Promise<{ fileName: string; contents: string; opCount: number; recordCount: number }> {
  const atMs = (options.now ?? Date.now)();
  const { meta, entries, records } = await db.transaction('r', [db.meta, db.outbox, db.records], async () => {
    const entries = await db.outbox.orderBy('seq').toArray();
    const recordIds = [...new Set(entries.map((e) => e.recordId))];
    const records = (await db.records.bulkGet(recordIds)).filter((r): r is LocalRecord => r !== undefined);
    return { meta: await readDeviceMeta(db), entries, records };
  });
  const file: BackupFile = {
    format: backupFormat,
    formatVersion: 1,
    deviceId: meta.deviceId,
    exportedAt: new Date(atMs).toISOString(),
    ops: entries.map((e) => e.op),
    records,
  };
  return { fileName: backupFileName(meta.deviceId, atMs), contents: JSON.stringify(file, null, 1), opCount: entries.length, recordCount: records.length };
}

/**
 * Adds a backup's ops to this device's outbox unchanged. Ops already in the outbox are skipped, and the
 * server answers "duplicate" for any it already has, so importing a file twice changes nothing. Records
 * this device does not have yet are added so the official sees them; existing ones are left alone.
 */
export async function importBackup(db: DeviceDb, contents: string, options: { now?: () => number } = {}): Promise<{ added: number; alreadyHere: number; recordsAdded: number }> {
  const file = readBackup(contents);
  const queuedAt = new Date((options.now ?? Date.now)()).toISOString();
  const ops = [...file.ops].sort((a, b) => a.seq - b.seq);
  try {
    return await db.transaction('rw', [db.outbox, db.records], async () => {
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
      return { added, alreadyHere: ops.length - added, recordsAdded };
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
