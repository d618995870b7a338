import { naturalKey, type RecordKind } from '../../../shared/sync/record-kinds';
import type { SyncOp } from '../../../shared/sync/sync-api';

type Json = SyncOp['fields'][string];

/** Canonical JSON (object keys sorted), so equal values compare equal whatever their key order. */
export function canonical(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonical).join(',')}]`;
  if (value && typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonical(v)}`).join(',')}}`;
  }
  return JSON.stringify(value ?? null);
}

/** One value a device gave one field of an editable record, with everything it was based on. */
export interface FieldEdit {
  opId: string;
  device: number;
  recordId: string;
  field: string;
  value: Json;
  /** The value the device saw before (the op's base); null for the record's creation. */
  base: Json | null;
  /** Op ids of every value this one was made after, on the device that made it, itself included. */
  history: ReadonlySet<string>;
}

export interface LoggedOp {
  op: SyncOp;
  device: number;
}

/**
 * The ground truth of a run, written by the harness as the devices make their changes, never read
 * from the server: every op any outbox ever held, every record created, and for the shared records
 * the causal history of every field value. Edit values are unique per record and field, so a base
 * value names the edit that produced it.
 */
export class Ledger {
  readonly ops = new Map<string, LoggedOp>();
  readonly createdRecords = new Map<string, LoggedOp>();
  readonly deletedRecords = new Set<string>();
  readonly naturalKeyGroups = new Map<string, string[]>();
  /** `${opId}|${field}` → the edit. Creations of editable records are edits too (the roots). */
  readonly edits = new Map<string, FieldEdit>();
  /** `${recordId}|${field}|${value}` → the op that produced the value. */
  private producers = new Map<string, string>();
  /** `${device}|${recordId}|${field}` → op ids this device's view of the field is based on. */
  private lineage = new Map<string, Set<string>>();

  /** Records an op the moment its local transaction has committed (it is now in the outbox). */
  record(device: number, op: SyncOp): void {
    if (this.ops.has(op.opId)) throw new Error(`The harness saw op ${op.opId} twice.`);
    const logged = { op, device };
    this.ops.set(op.opId, logged);
    if (op.action === 'create') {
      this.createdRecords.set(op.recordId, logged);
      const key = naturalKey(op.recordKind as RecordKind, op.competitionId, op.fields);
      if (key) this.naturalKeyGroups.set(key, [...(this.naturalKeyGroups.get(key) ?? []), op.recordId]);
      if (op.recordKind === 'start-check') {
        for (const [field, value] of Object.entries(op.fields)) this.addEdit({ opId: op.opId, device, recordId: op.recordId, field, value, base: null, history: new Set([op.opId]) });
      }
    }
    if (op.action === 'delete') this.deletedRecords.add(op.recordId);
    if (op.action === 'update') {
      for (const [field, value] of Object.entries(op.fields)) {
        const base = op.base[field] ?? null;
        const producer = this.producerOf(op.recordId, field, base);
        if (!producer) throw new Error(`Device ${device} edited ${field} of ${op.recordId} from a value no op produced: ${canonical(base)}.`);
        const key = `${device}|${op.recordId}|${field}`;
        const history = new Set([...(this.lineage.get(key) ?? []), ...this.edits.get(`${producer}|${field}`)!.history, op.opId]);
        this.lineage.set(key, history);
        this.addEdit({ opId: op.opId, device, recordId: op.recordId, field, value, base, history });
      }
    }
  }

  producerOf(recordId: string, field: string, value: unknown): string | undefined {
    return this.producers.get(`${recordId}|${field}|${canonical(value)}`);
  }

  edit(opId: string, field: string): FieldEdit | undefined {
    return this.edits.get(`${opId}|${field}`);
  }

  /** Every edit of one field of one record, creation first. */
  editsOf(recordId: string, field: string): FieldEdit[] {
    return [...this.edits.values()].filter((e) => e.recordId === recordId && e.field === field);
  }

  private addEdit(edit: FieldEdit): void {
    const key = `${edit.recordId}|${edit.field}|${canonical(edit.value)}`;
    if (this.producers.has(key)) throw new Error(`Two edits gave ${edit.field} of ${edit.recordId} the same value; the harness needs them unique.`);
    this.producers.set(key, edit.opId);
    this.edits.set(`${edit.opId}|${edit.field}`, edit);
  }
}

/** Neither edit was made after seeing the other. */
export const concurrent = (a: FieldEdit, b: FieldEdit) => !a.history.has(b.opId) && !b.history.has(a.opId);
