import { Dexie, type DexieOptions, type Table, type Transaction } from 'dexie';
import type { Area } from '../../../../shared/auth/roles';
import type { FieldData } from '../../../../shared/competition/field-data';
import { formatHybridTime } from '../../../../shared/sync/hybrid-clock';
import type { PhotoMediaType, RecordKind } from '../../../../shared/sync/record-kinds';
import type { ConflictSettlement, SyncConflict, SyncOp, SyncRecord } from '../../../../shared/sync/sync-api';

export type FieldValues = SyncOp['fields'];
export type FieldValue = FieldValues[string];

/** The device's view of one record: the server's copy, or the device's own change not yet acknowledged. */
export interface LocalRecord {
  id: string;
  kind: RecordKind;
  competitionId: string;
  area: Area;
  fields: FieldValues;
  createdBy: string;
  /** The device that created the record. */
  deviceId: string;
  /** Hybrid clock of the last change this copy carries. */
  hlc: string;
  deleted: boolean;
  /** The server version this copy is, or null while it carries a change of this device. */
  version: number | null;
  /** For corrections of append-only kinds: the record this one supersedes. */
  supersedes: string | null;
  /** The last change made on this device: who, when (device wall clock) and by which op. */
  lastLocalChange: { opId: string; userId: string; madeAt: string } | null;
}

/** One op waiting for the server's answer. Ops imported from a backup keep their own device and seq. */
export interface OutboxEntry {
  opId: string;
  seq: number;
  deviceId: string;
  recordId: string;
  op: SyncOp;
  queuedAt: string;
  /** The server's last answer when it was "deferred": kept so the sync screen can say why it waits. */
  lastAnswer: { status: 'deferred'; reason: string; at: string } | null;
}

/** An op the server refused, with its reason: the official's values stay visible until dismissed. */
export interface Rejection {
  opId: string;
  recordId: string;
  reason: string;
  op: SyncOp;
  rejectedAt: string;
  /** Set when an official put the refusal away (after entering the values again the right way); the row stays as evidence. */
  dismissed?: { userId: string; at: string } | null;
}

/** Refusals still shown to the officials. */
export function isShownRejection(rejection: Rejection): boolean {
  return !rejection.dismissed;
}

/** A conflict as the server sent it, plus this device's settlement while it is still in the outbox. */
export interface StoredConflict extends SyncConflict {
  localSettlement: (Omit<ConflictSettlement, 'opId'> & { opId: string }) | null;
}

/**
 * A photo or certificate file kept on this device, named by its SHA-256. Photo records point at it;
 * the file goes up from its own queue once one of those records has reached the server.
 */
export interface PhotoFile {
  sha256: string;
  mediaType: PhotoMediaType;
  bytes: number;
  width: number | null;
  height: number | null;
  addedAt: string;
  /** The photo records that show this file. */
  recordIds: string[];
  upload: 'waiting' | 'sent';
  attempts: number;
  /** Why the last upload try failed, in words; null when it has not failed. */
  lastError: string | null;
  lastTriedAt: string | null;
}

/** A photo file's bytes, apart from its row so lists and counts never load them. */
export interface PhotoBytes {
  sha256: string;
  /** An ArrayBuffer stores reliably in every browser's IndexedDB. */
  data: ArrayBuffer;
}

/**
 * The device's copy of one competition's start list, instruments, officials and frozen rules
 * (field-data.ts), replaced whole by the next good answer from the server.
 */
export interface KeptFieldData {
  competitionId: string;
  /** As the server sent it; parsed again when read, so a copy an earlier version of the app kept is never trusted blindly. */
  data: FieldData;
  /** When this device kept it (device clock). */
  keptAt: string;
}

export const syncStateKey = 'sync';
export interface SyncState {
  key: typeof syncStateKey;
  /** The server change number this device has applied everything up to; it never goes down. */
  cursor: number;
  lastSyncAt: string | null;
  /** In words, for the status strip; null after a successful round. */
  lastError: string | null;
}

export const deviceMetaKey = 'device';
export interface DeviceMeta {
  key: typeof deviceMetaKey;
  deviceId: string;
  /** The seq the next op of this device gets (1, 2, 3 ...). */
  nextSeq: number;
  /** The hybrid clock state, as formatHybridTime writes it. */
  hlc: string;
}

export const defaultDeviceDbName = 'rimelog-device';

/**
 * The local schema, one entry per version, oldest first. Keep every old entry that has an upgrade
 * function: Dexie runs them in order for a device that skipped versions.
 *
 * A destructive upgrade (one that deletes a table or rewrites records so old values are lost) must
 * only ship behind `canUpgradeDestructively(db)`: the app update waits (no reload) until the outbox is
 * empty, because the outbox may hold the only copy of a morning's readings.
 */
const versions: { version: number; stores: Record<string, string>; upgrade?: (tx: Transaction) => Promise<void> }[] = [
  {
    version: 1,
    stores: {
      // pulled from the server
      serverRecords: 'id',
      conflicts: 'id, status, recordId',
      syncState: 'key',
      // made on this device
      records: 'id, [competitionId+kind], supersedes',
      outbox: 'opId, seq, recordId',
      rejections: 'opId, recordId',
      meta: 'key',
    },
  },
  {
    version: 2,
    stores: {
      // made on this device or imported from a backup; uploaded after their record
      photos: 'sha256, upload',
      photoBytes: 'sha256',
    },
  },
  {
    version: 3,
    stores: {
      // pulled from the server for work with no signal; one copy per competition
      fieldData: 'competitionId',
    },
  },
];

export class DeviceDb extends Dexie {
  declare serverRecords: Table<SyncRecord, string>;
  declare conflicts: Table<StoredConflict, string>;
  declare syncState: Table<SyncState, string>;
  declare records: Table<LocalRecord, string>;
  declare outbox: Table<OutboxEntry, string>;
  declare rejections: Table<Rejection, string>;
  declare meta: Table<DeviceMeta, string>;
  declare photos: Table<PhotoFile, string>;
  declare photoBytes: Table<PhotoBytes, string>;
  declare fieldData: Table<KeptFieldData, string>;

  constructor(name: string, options: IndexedDbBackend = {}) {
    super(name, {
      ...(options.indexedDB ? { indexedDB: options.indexedDB } : {}),
      ...(options.IDBKeyRange ? { IDBKeyRange: options.IDBKeyRange } : {}),
      // A phone dying in the cold must not lose a write the UI called saved.
      chromeTransactionDurability: 'strict',
    });
    for (const { version, stores, upgrade } of versions) {
      const declared = this.version(version).stores(stores);
      if (upgrade) declared.upgrade(upgrade);
    }
  }
}

/** Tests pass fake-indexeddb's factory here so each test database stands alone. */
export type IndexedDbBackend = Pick<DexieOptions, 'indexedDB' | 'IDBKeyRange'>;

export interface OpenDeviceDbOptions extends IndexedDbBackend {
  name?: string;
  /** This device's id (the one its sessions use); kept on first open, the stored one wins after. */
  deviceId: string;
  /** Another tab opened a newer schema: Dexie closes this connection; the app should ask for a reload. */
  onVersionChange?: () => void;
}

/**
 * Opens the device database and makes sure it knows its device id, seq and clock. When the browser
 * closes the connection (storage pressure, a crash of the IndexedDB process), Dexie 4 reopens it on
 * the next operation by itself.
 */
export async function openDeviceDb(options: OpenDeviceDbOptions): Promise<DeviceDb> {
  const db = new DeviceDb(options.name ?? defaultDeviceDbName, options);
  if (options.onVersionChange) {
    const notify = options.onVersionChange;
    db.on('versionchange', () => {
      notify();
      // false keeps Dexie's default: close this connection so the other tab's upgrade can run.
      return false;
    });
  }
  await db.open();
  await db.transaction('rw', db.meta, db.syncState, async () => {
    if (!(await db.meta.get(deviceMetaKey))) {
      await db.meta.add({ key: deviceMetaKey, deviceId: options.deviceId, nextSeq: 1, hlc: formatHybridTime({ wallMs: 0, counter: 0, node: options.deviceId }) });
    }
    if (!(await db.syncState.get(syncStateKey))) {
      await db.syncState.add({ key: syncStateKey, cursor: 0, lastSyncAt: null, lastError: null });
    }
  });
  return db;
}

export async function readDeviceMeta(db: DeviceDb): Promise<DeviceMeta> {
  const meta = await db.meta.get(deviceMetaKey);
  if (!meta) throw new Error('The device database was not opened with openDeviceDb.');
  return meta;
}

export async function readSyncState(db: DeviceDb): Promise<SyncState> {
  return (await db.syncState.get(syncStateKey)) ?? { key: syncStateKey, cursor: 0, lastSyncAt: null, lastError: null };
}

/** True when nothing waits in the outbox, so a schema version that drops data may run. */
export async function canUpgradeDestructively(db: DeviceDb): Promise<boolean> {
  return (await db.outbox.count()) === 0;
}

/** Whether the record has changes of this device (or imported ones) the server has not answered yet. */
export async function hasPendingOps(db: DeviceDb, recordId: string): Promise<boolean> {
  return (await db.outbox.where('recordId').equals(recordId).count()) > 0;
}

/** The device's view of a record the server sent. */
export function localFromServer(record: SyncRecord): LocalRecord {
  const supersedes = record.fields['supersedes'];
  return {
    id: record.id,
    kind: record.kind as RecordKind,
    competitionId: record.competitionId,
    area: record.area,
    fields: record.fields,
    createdBy: record.createdBy,
    deviceId: record.deviceId,
    hlc: record.hlc,
    deleted: record.deleted,
    version: record.version,
    supersedes: typeof supersedes === 'string' ? supersedes : null,
    lastLocalChange: null,
  };
}
