import { liveQuery } from 'dexie';
import { from, retry, type Observable } from 'rxjs';
import { exportBackup, importBackup } from '../device-store/backup';
import type { FieldData } from '../../../../shared/competition/field-data';
import type { RecordKind } from '../../../../shared/sync/record-kinds';
import type { DeviceDb, LocalRecord, Rejection } from '../device-store/device-db';
import { keepFieldData, readFieldData, type KeepFieldDataResult } from '../device-store/field-data';
import { createRecordWriter, type RecordWriter } from '../device-store/record-writer';
import { createSyncEngine, type SyncEngine } from '../device-store/sync-engine';
import type { DeviceStoreBackend } from './device-store-backend';
import { readOutboxSummary, type OutboxSummary } from './outbox-summary';
import { dismissRejection, readRejections } from '../device-store/rejections';

/** Everything that needs Dexie, in one lazily loaded chunk so the first screen does not wait for it. */
export interface DeviceRuntime {
  db: DeviceDb;
  engine: SyncEngine;
  writer: RecordWriter;
  outbox$: Observable<OutboxSummary>;
  rejections$: Observable<Rejection[]>;
  exportBackup: () => ReturnType<typeof exportBackup>;
  importBackup: (contents: string) => ReturnType<typeof importBackup>;
  dismissRejection: (opId: string, userId: string) => Promise<void>;
  /** The records of one kind in a competition as this device sees them, kept up to date. */
  watchRecords: (competitionId: string, kind: RecordKind) => Observable<LocalRecord[]>;
  /** A photo file's bytes when this device has them. */
  photoBytes: (sha256: string) => Promise<ArrayBuffer | null>;
  /** This device's copy of a competition's start list, instruments and rules (null if none), kept up to date. */
  watchFieldData: (competitionId: string) => Observable<FieldData | null>;
  /** Replaces the competition's copy with the server's answer when it parses. */
  keepFieldData: (answer: unknown) => Promise<KeepFieldDataResult>;
}

export function startDeviceRuntime(db: DeviceDb, backend: DeviceStoreBackend): DeviceRuntime {
  const now = backend.now;
  const engine = createSyncEngine({ ...backend.engine, db, transport: backend.transport, ...(backend.uploads ? { uploads: backend.uploads } : {}), now });
  return {
    db,
    engine,
    writer: createRecordWriter({ db, now, onCommitted: () => engine.nudge() }),
    outbox$: live(() => readOutboxSummary(db)),
    rejections$: live(() => readRejections(db)),
    exportBackup: () => exportBackup(db, { now }),
    importBackup: (contents) => importBackup(db, contents, { now }),
    dismissRejection: (opId, userId) => dismissRejection(db, opId, userId, now),
    watchRecords: (competitionId, kind) => live(() => db.records.where('[competitionId+kind]').equals([competitionId, kind]).toArray()),
    photoBytes: async (sha256) => (await db.photoBytes.get(sha256))?.data ?? null,
    watchFieldData: (competitionId) => live(() => readFieldData(db, competitionId)),
    keepFieldData: (answer) => keepFieldData(db, answer, now),
  };
}

/** A Dexie live query as RxJS; a failed read ends a live query, so it starts again after a pause. */
function live<T>(query: () => Promise<T>): Observable<T> {
  return from(liveQuery(query)).pipe(retry({ delay: 2_000 }));
}
