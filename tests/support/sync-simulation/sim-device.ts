import { IDBFactory, IDBKeyRange } from 'fake-indexeddb';
import { NEVER } from 'rxjs';
import type { PullResponse } from '../../../shared/sync/sync-api';
import { openDeviceDb, type DeviceDb } from '../../../src/app/core/device-store/device-db';
import { createHttpTransport } from '../../../src/app/core/device-store/http-transport';
import { createRecordWriter, type RecordWriter } from '../../../src/app/core/device-store/record-writer';
import { createSyncEngine, type RoundResult, type SyncEngine } from '../../../src/app/core/device-store/sync-engine';
import type { Random } from './prng';
import type { SimNetwork } from './sim-network';

export interface SimDeviceOptions {
  index: number;
  deviceId: string;
  userId: string;
  cookie: string;
  network: SimNetwork;
  random: Random;
  /** The simulated wall clock of the devices. */
  now: () => number;
  /** Where the device reports seeing its cursor or a record's version go backwards. */
  problems: string[];
}

/**
 * One official's phone: its own IndexedDB (a fake-indexeddb factory of its own, which outlives the
 * app, like the browser's storage), the real device store on top, and the real HTTP transport over the
 * simulated network. Killing it drops everything in memory and opens the same storage again.
 */
export class SimDevice {
  readonly index: number;
  readonly deviceId: string;
  readonly userId: string;
  readonly storage = new IDBFactory();
  db!: DeviceDb;
  writer!: RecordWriter;
  private engine!: SyncEngine;
  kills = 0;
  rounds = 0;
  pulledPages = 0;
  /** The highest cursor and record versions this device was ever sent. */
  private seenCursor = 0;
  private seenVersions = new Map<string, number>();

  constructor(private readonly options: SimDeviceOptions) {
    this.index = options.index;
    this.deviceId = options.deviceId;
    this.userId = options.userId;
  }

  async open(): Promise<void> {
    const { network, cookie, random, now } = this.options;
    this.db = await openDeviceDb({ name: `rimelog-sim-device-${this.index}`, deviceId: this.deviceId, indexedDB: this.storage, IDBKeyRange });
    this.watchStoredOrder(this.db);
    this.writer = createRecordWriter({ db: this.db, now });
    const transport = createHttpTransport({ fetch: network.fetchFor({ cookie, random, onPullPage: (after, page) => this.checkPage(after, page) }) });
    this.engine = createSyncEngine({ db: this.db, transport, now, random: random.next, online$: NEVER, lock: (round) => round() });
  }

  /** The app dies between a local write and its push: nothing in memory survives, the storage does. */
  async kill(): Promise<void> {
    this.engine.stop();
    this.db.close();
    this.kills++;
    await this.open();
  }

  /** One sync round of the real engine: heartbeat, push the outbox, pull every page. */
  async sync(): Promise<RoundResult> {
    this.rounds++;
    return this.engine.syncNow();
  }

  close(): void {
    this.engine.stop();
    this.db.close();
  }

  private problem(text: string): void {
    this.options.problems.push(`device ${this.index}: ${text}`);
  }

  /** What the device was sent: pages in order, above the cursor it asked from, never behind what it saw. */
  private checkPage(after: number, page: PullResponse): void {
    this.pulledPages++;
    if (page.cursor < this.seenCursor) this.problem(`was sent cursor ${page.cursor} after cursor ${this.seenCursor}`);
    this.seenCursor = Math.max(this.seenCursor, page.cursor);
    let previous = after;
    for (const change of page.changes) {
      if (change.seq <= previous) this.problem(`was sent change ${change.seq} after ${previous} in a page pulled after ${after}`);
      previous = change.seq;
      if (change.type !== 'record') continue;
      const seen = this.seenVersions.get(change.record.id) ?? 0;
      if (change.record.version < seen) this.problem(`was sent version ${change.record.version} of ${change.record.id} after version ${seen}`);
      this.seenVersions.set(change.record.id, Math.max(seen, change.record.version));
    }
    if (page.changes.length > 0 && page.cursor !== previous) this.problem(`was sent cursor ${page.cursor} with changes up to ${previous}`);
  }

  /** What the device stored: its cursor and each server copy's version never go down. */
  private watchStoredOrder(db: DeviceDb): void {
    db.syncState.hook('updating', (changes, _key, stored) => {
      const cursor = (changes as { cursor?: number }).cursor;
      if (cursor !== undefined && cursor < stored.cursor) this.problem(`stored cursor ${cursor} over ${stored.cursor}`);
      return undefined;
    });
    db.serverRecords.hook('updating', (changes, key, stored) => {
      const version = (changes as { version?: number }).version;
      if (version !== undefined && version < stored.version) this.problem(`stored version ${version} of ${key} over version ${stored.version}`);
      return undefined;
    });
  }
}
