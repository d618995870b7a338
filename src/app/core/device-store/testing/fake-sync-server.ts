import { sha256 as sha256Of } from '@noble/hashes/sha2.js';
import { bytesToHex } from '@noble/hashes/utils.js';
import { v4 as uuidv4 } from 'uuid';
import { appendOnlyKinds, recordFieldSchemas, type RecordKind } from '../../../../../shared/sync/record-kinds';
import { syncOpSchema, type OpResult, type PullResponse, type PushResponse, type SyncChange, type SyncConflict, type SyncOp, type SyncRecord } from '../../../../../shared/sync/sync-api';
import { sameJson } from '../same-json';
import { SyncTransportError, type SyncTransport } from '../sync-transport';
import type { UploadTransport } from '../upload-photos';

type Outcome = Pick<OpResult, 'status' | 'reason' | 'conflictIds'>;
type Call = 'heartbeat' | 'push' | 'pull' | 'has-file' | 'put-file';

/**
 * An in-memory server that keeps the sync contract (shared/sync/sync-api.ts) the way server/sync does,
 * small enough to read: a receipt per op id (a replay gets the stored answer), each device's ops in seq
 * order (a gap is deferred and not stored), field merge against the op's base with a conflict row for a
 * clash, tombstones, settlements, and a change number per record or conflict for pulls. Everything
 * crosses a JSON round trip, as it would over HTTP.
 */
export class FakeSyncServer {
  readonly records = new Map<string, SyncRecord>();
  readonly conflicts = new Map<string, SyncConflict>();
  readonly receipts = new Map<string, Outcome>();
  private readonly lastSeq = new Map<string, number>();
  /** "record:<id>" or "conflict:<id>" → its latest change number. */
  private readonly changes = new Map<string, number>();
  private changeCounter = 0;

  /** Every op that arrived, in arrival order, and every call. */
  readonly received: SyncOp[] = [];
  readonly batchSizes: number[] = [];
  readonly calls: Call[] = [];
  pageSize = 1000;
  serverTime = () => Date.now();
  /** While set, every call fails this way before reaching the "database". */
  outage: 'unreachable' | 'unavailable' | null = null;
  /** The next push is committed, then its answer is lost on the way back. */
  loseNextPushAnswer = false;
  /** Return a reason to reject an op (e.g. the official lost their assignment). */
  refuse: (op: SyncOp) => string | null = () => null;

  /** Uploaded files by SHA-256, as /api/uploads keeps them. */
  readonly files = new Map<string, { mediaType: string; data: Uint8Array }>();
  /** Return a reason to refuse a file (e.g. it is not the kind it says). */
  refuseFile: (sha256: string) => string | null = () => null;

  uploads(): UploadTransport {
    return {
      hasFile: async (sha256) => this.call('has-file', () => this.files.has(sha256)),
      putFile: async (sha256, mediaType, data) => {
        await this.call('put-file', () => {
          const bytes = new Uint8Array(data.slice(0));
          const refused = this.refuseFile(sha256) ?? (bytesToHex(sha256Of(bytes)) === sha256 ? null : 'The file arrived damaged.');
          if (refused) throw new SyncTransportError('refused', refused, 415);
          this.files.set(sha256, { mediaType, data: bytes });
          return null;
        });
      },
    };
  }

  transport(): SyncTransport {
    return {
      heartbeat: async () => this.call('heartbeat', () => ({ serverTime: new Date(this.serverTime()).toISOString() })),
      push: async (ops) => this.call('push', () => this.push(wire(ops))),
      pull: async (after) => this.call('pull', () => this.pull(after)),
    };
  }

  private async call<T>(call: Call, handle: () => T): Promise<T> {
    await Promise.resolve();
    this.calls.push(call);
    if (this.outage === 'unreachable') throw new SyncTransportError('unreachable', 'The server cannot be reached from here.');
    if (this.outage === 'unavailable') throw new SyncTransportError('unavailable', 'The server cannot take records just now.', 503);
    const answer = wire(handle());
    if (call === 'push' && this.loseNextPushAnswer) {
      this.loseNextPushAnswer = false;
      throw new SyncTransportError('unreachable', 'The connection dropped before the answer arrived.');
    }
    return answer;
  }

  push(ops: readonly unknown[]): PushResponse {
    this.batchSizes.push(ops.length);
    const parsed = ops.map((raw, index) => ({ index, op: syncOpSchema.parse(raw) }));
    this.received.push(...parsed.map((p) => p.op));
    const ordered = [...parsed].sort((a, b) => (a.op.deviceId < b.op.deviceId ? -1 : a.op.deviceId > b.op.deviceId ? 1 : a.op.seq - b.op.seq));
    const results = ordered.map(({ index, op }) => ({ index, opId: op.opId, ...this.apply(op) }));
    return { results: results.sort((a, b) => a.index - b.index), serverTime: new Date(this.serverTime()).toISOString() };
  }

  pull(after: number): PullResponse {
    const due = [...this.changes].filter(([, seq]) => seq > after).sort((a, b) => a[1] - b[1]);
    const page = due.slice(0, this.pageSize).map(([key, seq]): SyncChange => {
      const [type, id] = key.split(':') as ['record' | 'conflict', string];
      return type === 'record' ? { seq, type, record: this.records.get(id)! } : { seq, type, conflict: this.conflicts.get(id)! };
    });
    return { changes: page, cursor: page.at(-1)?.seq ?? after, hasMore: due.length > this.pageSize };
  }

  private apply(op: SyncOp): Outcome {
    const stored = this.receipts.get(op.opId);
    if (stored) return stored;
    const last = this.lastSeq.get(op.deviceId) ?? 0;
    if (op.seq > last + 1) return { status: 'deferred', reason: `Waiting for number ${last + 1} from this device.`, conflictIds: [] };
    const refusal = op.seq <= last ? `Number ${op.seq} was already used by another record.` : this.refuse(op);
    const outcome = refusal ? rejected(refusal) : this.decide(op);
    this.lastSeq.set(op.deviceId, Math.max(last, op.seq));
    this.receipts.set(op.opId, outcome);
    return outcome;
  }

  private decide(op: SyncOp): Outcome {
    const existing = this.records.get(op.recordId);
    if (op.action === 'create') {
      if (existing) return { status: 'duplicate', reason: 'Already saved.', conflictIds: [] };
      const fields = recordFieldSchemas[op.recordKind as RecordKind].parse(op.fields) as SyncRecord['fields'];
      const record: SyncRecord = { id: op.recordId, kind: op.recordKind, competitionId: op.competitionId, area: op.area, fields, createdBy: op.userId, deviceId: op.deviceId, hlc: op.hlc, deleted: false, version: 1 };
      this.touch('record', record.id, record);
      return applied;
    }
    if (!existing) return rejected('The record has not reached the server.');
    if (op.action === 'delete') {
      this.touch('record', existing.id, { ...existing, deleted: true, version: existing.version + 1 });
      return applied;
    }
    if (op.action === 'settle') {
      const conflict = op.settlement ? this.conflicts.get(op.settlement.conflictId) : undefined;
      if (!conflict || conflict.status === 'settled' || !conflict.field) return rejected('Nothing to settle.');
      const value = op.fields[conflict.field] ?? null;
      this.touch('record', existing.id, { ...existing, fields: { ...existing.fields, [conflict.field]: value }, version: existing.version + 1 });
      this.touch('conflict', conflict.id, { ...conflict, status: 'settled', settlement: { value, reason: op.settlement!.reason, userId: op.userId, opId: op.opId } });
      return { ...applied, conflictIds: [conflict.id] };
    }
    if (appendOnlyKinds.has(existing.kind as RecordKind)) return rejected('Append-only records are never changed.');
    const apply: SyncRecord['fields'] = {};
    const conflictIds: string[] = [];
    for (const [field, value] of Object.entries(op.fields)) {
      const now = existing.fields[field] ?? null;
      if (sameJson(now, value)) continue;
      if (field in op.base && sameJson(now, op.base[field])) {
        apply[field] = value;
        continue;
      }
      const conflict: SyncConflict = {
        id: uuidv4(),
        competitionId: existing.competitionId,
        area: existing.area,
        kind: 'field',
        recordId: existing.id,
        field,
        base: op.base[field] ?? null,
        kept: { value: now, userId: existing.createdBy, deviceId: existing.deviceId, opId: 'unknown', hlc: existing.hlc },
        incoming: { value, userId: op.userId, deviceId: op.deviceId, opId: op.opId, hlc: op.hlc },
        status: 'open',
        settlement: null,
      };
      this.touch('conflict', conflict.id, conflict);
      conflictIds.push(conflict.id);
    }
    if (Object.keys(apply).length > 0) this.touch('record', existing.id, { ...existing, fields: { ...existing.fields, ...apply }, version: existing.version + 1 });
    return conflictIds.length > 0 ? { status: 'conflict', reason: 'Changed elsewhere too.', conflictIds } : applied;
  }

  private touch(type: 'record', id: string, row: SyncRecord): void;
  private touch(type: 'conflict', id: string, row: SyncConflict): void;
  private touch(type: 'record' | 'conflict', id: string, row: SyncRecord | SyncConflict): void {
    if (type === 'record') this.records.set(id, row as SyncRecord);
    else this.conflicts.set(id, row as SyncConflict);
    this.changes.set(`${type}:${id}`, ++this.changeCounter);
  }
}

const applied: Outcome = { status: 'applied', reason: 'Saved.', conflictIds: [] };
const rejected = (reason: string): Outcome => ({ status: 'rejected', reason, conflictIds: [] });

function wire<T>(value: T): T {
  return JSON.parse(JSON.stringify(value)) as T;
}
