import { sha256 } from '@noble/hashes/sha2.js';
import { bytesToHex } from '@noble/hashes/utils.js';
import type { Table } from 'dexie';
import { v7 as uuidv7 } from 'uuid';
import type { z } from 'zod';
import { summariseFieldProblems, toFieldProblems } from '../../../../shared/api/field-problems';
import type { Area } from '../../../../shared/auth/roles';
import { formatHybridTime, parseHybridTime, tick } from '../../../../shared/sync/hybrid-clock';
import { appendOnlyKinds, recordFieldSchemas, recordKinds, type RecordKind } from '../../../../shared/sync/record-kinds';
import { syncOpSchema, type SyncOp } from '../../../../shared/sync/sync-api';
import { deviceMetaKey, readDeviceMeta, type DeviceDb, type FieldValue, type FieldValues, type LocalRecord, type OutboxEntry, type PhotoFile } from './device-db';
import { sameJson } from './same-json';
import { RecordRefusedError, storageFailure } from './store-errors';

export interface RecordWriterOptions {
  db: DeviceDb;
  now?: () => number;
  /** Called after each commit, e.g. to wake the sync loop. */
  onCommitted?: () => void;
}

/** What a write saved: the record as the device now sees it, and the op queued for the server (none when nothing changed). */
export interface WriteResult {
  record: LocalRecord;
  op: SyncOp | null;
}

/** Who, where and when, stamped on one op inside its transaction. */
interface Stamp {
  deviceId: string;
  seq: number;
  hlc: string;
  madeAt: string;
  opId: string;
}

export type RecordWriter = ReturnType<typeof createRecordWriter>;

/** A file ready to keep: its bytes and, for pictures, the size in pixels. */
export type PhotoFileInput = Pick<PhotoFile, 'mediaType' | 'width' | 'height'> & { data: ArrayBuffer };

/** The server's default upload limit (RIMELOG_UPLOAD_LIMIT_MB); a resized photo is far below it. */
export const maxPhotoBytes = 10 * 1024 * 1024;

/**
 * Every change an official makes: the record and its outbox entry are written in one Dexie transaction,
 * and each function resolves only after that transaction has committed, so "saved on this device" is
 * true when the UI says it. A full disk becomes StorageFullError; no failure is swallowed.
 */
export function createRecordWriter({ db, now = () => Date.now(), onCommitted }: RecordWriterOptions) {
  /**
   * Runs `change` in one transaction with the device's seq and clock, then writes the record, the op
   * and the advanced seq and clock together.
   */
  async function writeWithOp(
    extraTables: readonly Table[],
    change: (stamp: Stamp) => Promise<{ record: LocalRecord; op: SyncOp } | { record: LocalRecord; op: null }>,
  ): Promise<WriteResult> {
    let result: WriteResult;
    try {
      result = await db.transaction('rw', [db.records, db.outbox, db.meta, ...extraTables], async () => {
        const meta = await readDeviceMeta(db);
        const wallMs = now();
        const hlc = tick(parseHybridTime(meta.hlc), wallMs);
        const stamp: Stamp = { deviceId: meta.deviceId, seq: meta.nextSeq, hlc: formatHybridTime(hlc), madeAt: new Date(wallMs).toISOString(), opId: uuidv7() };
        const made = await change(stamp);
        if (!made.op) return made;
        const op = checkedOp(made.op);
        const entry: OutboxEntry = { opId: op.opId, seq: op.seq, deviceId: op.deviceId, recordId: op.recordId, op, queuedAt: stamp.madeAt, lastAnswer: null };
        await db.records.put(made.record);
        await db.outbox.add(entry);
        await db.meta.put({ ...meta, key: deviceMetaKey, nextSeq: stamp.seq + 1, hlc: stamp.hlc });
        return { record: made.record, op };
      });
    } catch (error) {
      if (error instanceof RecordRefusedError) throw error;
      throw storageFailure(error);
    }
    if (result.op) onCommitted?.();
    return result;
  }

  async function existing(id: string): Promise<LocalRecord> {
    const record = await db.records.get(id);
    if (!record) throw new RecordRefusedError('This record is not on this device. Sync, then try again.');
    return record;
  }

  return {
    /** A new record of `kind`, made by `user` (the official active on the device). */
    async createRecord(kind: RecordKind, competitionId: string, area: Area, fields: Record<string, unknown>, user: string): Promise<WriteResult> {
      const valid = parseFields(kind, fields);
      if (valid['supersedes'] !== undefined && valid['supersedes'] !== null) {
        throw new RecordRefusedError('A correction names the value it replaces and why: use "correct" on that value.');
      }
      return writeWithOp([], async (stamp) => {
        const id = uuidv7();
        return { record: newRecord(id, kind, competitionId, area, valid, user, stamp), op: { ...opBase(stamp, user), competitionId, area, action: 'create', recordKind: kind, recordId: id, fields: valid, base: {} } };
      });
    },

    /**
     * A photo record for the record `of`, and its file, in one transaction: the file is kept once per
     * SHA-256 however many records show it, and waits in the photo queue until it is uploaded.
     */
    async attachPhoto(of: string, input: PhotoFileInput, details: { purpose: string; caption?: string }, user: string): Promise<WriteResult> {
      if (input.data.byteLength > maxPhotoBytes) {
        throw new RecordRefusedError(`This file is ${(input.data.byteLength / 1048576).toFixed(1)} MB; files of at most ${maxPhotoBytes / 1048576} MB are kept. Take the photo again or scan the certificate smaller.`);
      }
      const file = { ...input, sha256: bytesToHex(sha256(new Uint8Array(input.data))) };
      return writeWithOp([db.photos, db.photoBytes], async (stamp) => {
        const target = await existing(of);
        const id = uuidv7();
        const fields = parseFields('photo', {
          of,
          sha256: file.sha256,
          purpose: details.purpose,
          mediaType: file.mediaType,
          bytes: file.data.byteLength,
          width: file.width,
          height: file.height,
          takenAt: stamp.madeAt,
          caption: details.caption ?? '',
        });
        const kept = await db.photos.get(file.sha256);
        if (kept) {
          await db.photos.put({ ...kept, recordIds: [...kept.recordIds, id] });
        } else {
          const { data, ...described } = file;
          await db.photos.add({ ...described, bytes: data.byteLength, addedAt: stamp.madeAt, recordIds: [id], upload: 'waiting', attempts: 0, lastError: null, lastTriedAt: null });
          await db.photoBytes.put({ sha256: file.sha256, data });
        }
        return {
          record: newRecord(id, 'photo', target.competitionId, target.area, fields, user, stamp),
          op: { ...opBase(stamp, user), competitionId: target.competitionId, area: target.area, action: 'create', recordKind: 'photo', recordId: id, fields, base: {} },
        };
      });
    },

    /**
     * Changes some fields of an editable record. The op carries each changed field's value as this
     * device last saw it (its own unsent edits included), so successive edits on one device chain.
     */
    async updateRecord(id: string, changes: Record<string, unknown>, user: string): Promise<WriteResult> {
      return writeWithOp([], async (stamp) => {
        const current = await existing(id);
        refuseIfAppendOnly(current.kind, 'changed');
        if (current.deleted) throw new RecordRefusedError('This record was removed; it cannot be changed.');
        const merged = parseFields(current.kind, { ...current.fields, ...changes });
        const changed = Object.keys(changes).filter((field) => !sameJson(current.fields[field] ?? null, merged[field] ?? null));
        if (changed.length === 0) return { record: current, op: null };
        const fields = pick(merged, changed);
        const base = pick(current.fields, changed);
        const record: LocalRecord = { ...current, fields: merged, hlc: stamp.hlc, version: null, lastLocalChange: localChange(stamp, user) };
        return { record, op: { ...opBase(stamp, user), ...placeOf(current), action: 'update', recordId: id, fields, base } };
      });
    },

    /** Marks an editable record as removed (a tombstone: the values stay). */
    async deleteRecord(id: string, user: string): Promise<WriteResult> {
      return writeWithOp([], async (stamp) => {
        const current = await existing(id);
        refuseIfAppendOnly(current.kind, 'removed');
        if (current.deleted) return { record: current, op: null };
        const record: LocalRecord = { ...current, deleted: true, hlc: stamp.hlc, version: null, lastLocalChange: localChange(stamp, user) };
        // The base is everything the device saw when it removed the record.
        return { record, op: { ...opBase(stamp, user), ...placeOf(current), action: 'delete', recordId: id, fields: {}, base: { ...current.fields } } };
      });
    },

    /**
     * For append-only kinds (readings, measurements): a new record with the old one's fields, changed
     * by `newFields`, that names the record it supersedes and why. The old record stays as it was.
     */
    async correctRecord(id: string, newFields: Record<string, unknown>, reason: string, user: string): Promise<WriteResult> {
      const why = reason.trim();
      if (why.length === 0) throw new RecordRefusedError('Say why the value is corrected.');
      return writeWithOp([], async (stamp) => {
        const old = await existing(id);
        if (!appendOnlyKinds.has(old.kind)) throw new RecordRefusedError('Only readings and measurements are corrected; change this record instead.');
        if (old.kind === 'control-reading' && (await isInSignedLog(db, old))) {
          throw new RecordRefusedError('This reading is in the signed log; a change needs the technical delegate.');
        }
        if ((await db.records.where('supersedes').equals(id).count()) > 0) {
          throw new RecordRefusedError('This value was already corrected; correct the newest value instead.');
        }
        const fields = parseFields(old.kind, { ...old.fields, ...newFields, supersedes: id, reason: why });
        const newId = uuidv7();
        return {
          record: newRecord(newId, old.kind, old.competitionId, old.area, fields, user, stamp),
          op: { ...opBase(stamp, user), ...placeOf(old), action: 'create', recordId: newId, fields, base: {} },
        };
      });
    },

    /**
     * The area leader's choice for a conflict: a value for a clashing field, or for two records of the
     * same check the id of the one to keep. It is an op like any other and reaches every device.
     */
    async settleConflict(conflictId: string, value: unknown, reason: string, user: string): Promise<WriteResult> {
      const why = reason.trim();
      if (why.length === 0) throw new RecordRefusedError('Say why this value is kept.');
      return writeWithOp([db.conflicts], async (stamp) => {
        const conflict = await db.conflicts.get(conflictId);
        if (!conflict) throw new RecordRefusedError('This clash is not on this device. Sync, then try again.');
        if (conflict.status === 'settled' || conflict.localSettlement) throw new RecordRefusedError('This clash is already settled.');
        const record = await existing(conflict.recordId);
        let fields: FieldValues;
        let updated = record;
        if (conflict.kind === 'duplicate-record') {
          if (value !== conflict.kept.value && value !== conflict.incoming.value) throw new RecordRefusedError('Keep one of the two records of this clash.');
          fields = { keep: value as string };
        } else {
          const field = conflict.field ?? '';
          const merged = parseFields(record.kind, { ...record.fields, [field]: value });
          fields = { [field]: merged[field] ?? null };
          updated = { ...record, fields: merged, hlc: stamp.hlc, version: null, lastLocalChange: localChange(stamp, user) };
        }
        const settledValue = fields[conflict.field ?? 'keep'] as FieldValue;
        await db.conflicts.put({ ...conflict, localSettlement: { value: settledValue, reason: why, userId: user, opId: stamp.opId } });
        return {
          record: updated,
          op: {
            ...opBase(stamp, user),
            competitionId: conflict.competitionId,
            area: conflict.area,
            action: 'settle',
            recordKind: record.kind,
            recordId: conflict.recordId,
            fields,
            base: {},
            settlement: { conflictId, reason: why },
          },
        };
      });
    },
  };
}

function opBase(stamp: Stamp, user: string) {
  return { opId: stamp.opId, deviceId: stamp.deviceId, seq: stamp.seq, userId: user, hlc: stamp.hlc, madeAt: stamp.madeAt };
}

function placeOf(record: LocalRecord) {
  return { competitionId: record.competitionId, area: record.area, recordKind: record.kind };
}

function localChange(stamp: Stamp, user: string): LocalRecord['lastLocalChange'] {
  return { opId: stamp.opId, userId: user, madeAt: stamp.madeAt };
}

function newRecord(id: string, kind: RecordKind, competitionId: string, area: Area, fields: FieldValues, user: string, stamp: Stamp): LocalRecord {
  const supersedes = fields['supersedes'];
  return {
    id,
    kind,
    competitionId,
    area,
    fields,
    createdBy: user,
    deviceId: stamp.deviceId,
    hlc: stamp.hlc,
    deleted: false,
    version: null,
    supersedes: typeof supersedes === 'string' ? supersedes : null,
    lastLocalChange: localChange(stamp, user),
  };
}

/**
 * Signing a log freezes its readings: some log signature on this device lists this one. Read leniently,
 * so a signature written by a newer app version still freezes what it lists.
 */
async function isInSignedLog(db: DeviceDb, reading: LocalRecord): Promise<boolean> {
  const signatures = await db.records.where('[competitionId+kind]').equals([reading.competitionId, 'log-signature']).toArray();
  return signatures.some((signature) => {
    const listed = signature.fields['readingIds'];
    return !signature.deleted && Array.isArray(listed) && listed.includes(reading.id);
  });
}

function refuseIfAppendOnly(kind: RecordKind, what: 'changed' | 'removed'): void {
  if (appendOnlyKinds.has(kind)) {
    throw new RecordRefusedError(`Readings and measurements are never ${what}; record a correction with a reason instead.`);
  }
}

function parseFields(kind: RecordKind, fields: Record<string, unknown>): FieldValues {
  if (!recordKinds.includes(kind)) throw new RecordRefusedError(`"${String(kind)}" is not a kind of record this app keeps.`);
  const parsed = (recordFieldSchemas[kind] as z.ZodType).safeParse(fields);
  if (!parsed.success) {
    const problems = toFieldProblems(parsed.error, 'fields');
    throw new RecordRefusedError(summariseFieldProblems(problems), problems);
  }
  return parsed.data as FieldValues;
}

/** The op as the server will read it; a failure here is a bug in this file, reported rather than queued. */
function checkedOp(op: SyncOp): SyncOp {
  const parsed = syncOpSchema.safeParse(op);
  if (!parsed.success) {
    const problems = toFieldProblems(parsed.error, 'op');
    throw new RecordRefusedError(`This change cannot be sent to the server: ${summariseFieldProblems(problems)}`, problems);
  }
  return parsed.data;
}

function pick(fields: FieldValues, names: readonly string[]): FieldValues {
  return Object.fromEntries(names.map((name) => [name, fields[name] ?? null]));
}
