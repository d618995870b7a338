import { asc, sql } from 'drizzle-orm';
import { v7 as uuidv7 } from 'uuid';
import type { ZodSafeParseResult } from 'zod';
import type { RoleAssignment } from '../../shared/auth/roles';
import { appendOnlyKinds, naturalKey, recordFieldSchemas, recordKinds, type RecordKind } from '../../shared/sync/record-kinds';
import { syncOpSchema, type ConflictSide, type FieldSource, type OpResult, type SyncOp } from '../../shared/sync/sync-api';
import type { Database } from '../db/client';
import { deviceCursors, opReceipts, syncConflicts, syncCounter, syncRecords } from '../db/schema';
import { refuseOp, type PushContext } from './authorise-op';
import { insertRows, updateRows, writeTogether, type Shift } from './bulk-rows';
import { isAnyOf, loadBatchContext, type StoredOutcome } from './load-batch-context';
import { mergeFields } from './merge-fields';
import { hasUnstorableText, maxOpNesting, nestedTooDeep } from './storable-json';

type RecordRow = typeof syncRecords.$inferSelect;
type ConflictRow = typeof syncConflicts.$inferSelect;
type Json = ConflictSide['value'];
type Outcome = StoredOutcome;

export interface PushSession {
  userId: string;
  deviceId: string;
  roles: RoleAssignment[];
}

const rejected = (reason: string): Outcome => ({ status: 'rejected', reason, conflictIds: [] });

/**
 * Runs pure work while the database answers a query already sent, so the two work at once instead of
 * in turn. The work runs as a promise job: if it throws, the query is still awaited.
 */
const meanwhile = <T, U>(query: Promise<T>, work: () => U): Promise<[T, U]> => Promise.all([query, Promise.resolve().then(work)]);

/** The natural keys of the new records, each once and in order (the order the batch locks them in). */
function naturalKeysOf(ops: readonly SyncOp[]): string[] {
  const keys = ops.flatMap((op) => {
    const key = op.action === 'create' ? naturalKey(op.recordKind as RecordKind, op.competitionId, op.fields) : null;
    return key ? [key] : [];
  });
  return [...new Set(keys)].sort();
}

/** What an edit or a settlement may set, per kind: built once, as building a zod schema costs more than using it. */
const editSchemas = Object.fromEntries(recordKinds.map((kind) => [kind, recordFieldSchemas[kind].partial().strict()])) as {
  [K in RecordKind]: ReturnType<(typeof recordFieldSchemas)[K]['partial']>;
};

/** The op, or why it cannot be read at all: then it gets no receipt, as its id and number cannot be trusted. */
function readOp(raw: unknown): { op: SyncOp } | { problem: string } {
  if (nestedTooDeep(raw)) return { problem: `record: values nested more than ${maxOpNesting} levels deep` };
  const parsed = syncOpSchema.safeParse(raw);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    return { problem: `${issue?.path.join('.') || 'record'}: ${issue?.message}` };
  }
  // The receipt keeps the author's id, so an id PostgreSQL cannot store makes the op unreadable.
  if (hasUnstorableText(parsed.data.userId)) return { problem: 'userId: not an official this server can know' };
  return { op: parsed.data };
}

/**
 * Applies one pushed batch in one transaction (SPEC.md §1–§7): each device's ops in sequence order,
 * each op's effect and its receipt together. Throws only for failures of the database itself, which the
 * route answers with 503 so the device sends the same ops again.
 */
export async function pushOps(db: Database, session: PushSession, rawOps: readonly unknown[]): Promise<OpResult[]> {
  const results: OpResult[] = [];
  const valid: { index: number; op: SyncOp }[] = [];
  rawOps.forEach((raw, index) => {
    const read = readOp(raw);
    if ('op' in read) valid.push({ index, op: read.op });
    else {
      const opId = typeof raw === 'object' && raw && typeof (raw as { opId?: unknown }).opId === 'string' ? (raw as { opId: string }).opId : null;
      results.push({ index, opId, ...rejected(`This record is not complete or not readable (${read.problem}).`) });
    }
  });
  valid.sort((a, b) => (a.op.deviceId < b.op.deviceId ? -1 : a.op.deviceId > b.op.deviceId ? 1 : a.op.seq - b.op.seq));
  if (valid.length === 0) return results.sort((a, b) => a.index - b.index);

  await db.transaction(async (tx) => {
    const batch = new Batch(tx as unknown as Database, session);
    await batch.load(valid.map((v) => v.op));
    for (const { index, op } of valid) results.push({ index, opId: op.opId, ...batch.apply(op) });
    await batch.write();
  });
  return results.sort((a, b) => a.index - b.index);
}

/**
 * The op was authorised for the competition, area and kind it names (SPEC.md §6), so a change to a
 * record of another competition, area or kind would slip past that check.
 */
const namesAnotherRecord = (op: SyncOp, record: RecordRow) =>
  record.competitionId !== op.competitionId || record.area !== op.area || record.kind !== op.recordKind;
const namesAnotherRecordReason = 'This change names another competition, area or kind of record than the record it changes.';

/**
 * Who last set each field of the record: the ones listed in field_sources, any other field by the op that
 * made the record. Rows from before created_op_id was kept list every field themselves.
 */
function fieldSourcesOf(record: RecordRow): Record<string, FieldSource> {
  if (!record.createdOpId) return record.fieldSources;
  const creation: FieldSource = { userId: record.createdBy, deviceId: record.deviceId, opId: record.createdOpId, hlc: record.hlc };
  return { ...Object.fromEntries(Object.keys(record.fields).map((f) => [f, creation])), ...record.fieldSources };
}

class Batch {
  private receipts = new Map<string, Outcome>();
  private cursors = new Map<string, number>();
  private records = new Map<string, RecordRow>();
  private byNaturalKey = new Map<string, string>();
  private conflicts = new Map<string, ConflictRow>();
  private authors!: PushContext;
  /** Ops holding text PostgreSQL cannot store: looked for once per op, as it is a walk through all of it. */
  private unstorable = new Set<SyncOp>();
  /** Each create's and edit's fields as its kind's schema read them (readFields). */
  private fieldsRead = new Map<SyncOp, ZodSafeParseResult<Record<string, unknown>>>();
  /** Rows changed by this batch, in the order their change numbers are handed out. */
  private changedRecords = new Set<string>();
  private changedConflicts = new Set<string>();
  private newRecords = new Set<string>();
  private newConflicts = new Set<string>();
  private newReceipts: (typeof opReceipts.$inferInsert)[] = [];

  constructor(
    private readonly tx: Database,
    private readonly session: PushSession,
  ) {}

  async load(ops: SyncOp[]): Promise<void> {
    const { tx } = this;
    // Each device's cursor, made when new and locked to commit in device order (so two batches never
    // deadlock): the upsert answers the cursor as the batch that held it last committed it.
    const deviceIds = [...new Set(ops.map((op) => op.deviceId))].sort();
    const cursorsLocked = tx
      .insert(deviceCursors)
      .values(deviceIds.map((deviceId) => ({ deviceId, lastSeq: 0 })))
      .onConflictDoUpdate({ target: deviceCursors.deviceId, set: { lastSeq: sql`${deviceCursors.lastSeq}` } })
      .returning()
      .execute();
    const [cursorRows, keys] = await meanwhile(cursorsLocked, () => {
      for (const op of ops) if (hasUnstorableText(op)) this.unstorable.add(op);
      return naturalKeysOf(ops.filter((op) => !this.unstorable.has(op)));
    });
    for (const row of cursorRows) this.cursors.set(row.deviceId, row.lastSeq);

    // A push runs a few small queries; JIT compiling them costs more than it saves (measured by bench:sync).
    // One batch at a time per sled and run (held to commit), so two devices syncing the same check at the
    // same moment still meet as a duplicate; keys in order, so two batches never deadlock.
    await tx.execute(sql`select set_config('jit', 'off', true),
      (select count(pg_advisory_xact_lock(hashtextextended(key, 0))) from unnest(${sql.param(keys)}::text[]) as t(key))`);

    const settled = ops.flatMap((op) => (op.settlement ? [op.settlement.conflictId] : []));
    if (settled.length > 0) {
      const rows = await tx.select().from(syncConflicts).where(isAnyOf(syncConflicts.id, settled, 'uuid')).orderBy(asc(syncConflicts.id)).for('update');
      for (const row of rows) this.conflicts.set(row.id, row);
    }
    // A duplicate-record settlement may tombstone either record of the clash, so both are loaded.
    const clashRecords = [...this.conflicts.values()].flatMap((c) => (c.kind === 'duplicate-record' ? [c.recordId, String(c.incoming.value)] : [c.recordId]));
    const recordIds = [...new Set([...ops.map((op) => op.recordId), ...clashRecords])];
    // Read after the locks, so it sees every batch that held them before (SPEC.md §2, §5).
    const [context] = await meanwhile(loadBatchContext(tx, ops, { recordIds, naturalKeys: keys }), () => this.readFields(ops));
    for (const row of context.records) this.records.set(row.id, row);
    this.receipts = context.receipts;
    this.byNaturalKey = context.firstByNaturalKey;
    const { userId, deviceId, roles } = this.session;
    this.authors = { ...context, sessionUserId: userId, sessionDeviceId: deviceId, sessionRoles: roles };
  }

  /**
   * Each create's and edit's fields read by the schema of the kind it names: they depend on the op alone,
   * so this runs while the database loads the batch. An edit's kind must be its record's (checked first).
   */
  private readFields(ops: readonly SyncOp[]): void {
    for (const op of ops) {
      const kind = op.recordKind as RecordKind;
      if (op.action === 'create') this.fieldsRead.set(op, recordFieldSchemas[kind].safeParse(op.fields));
      if (op.action === 'update') this.fieldsRead.set(op, editSchemas[kind].safeParse(op.fields));
    }
  }

  apply(op: SyncOp): Outcome {
    const stored = this.receipts.get(op.opId);
    if (stored) return stored;
    const last = this.cursors.get(op.deviceId) ?? 0;
    if (op.seq > last + 1) {
      return { status: 'deferred', reason: `Waiting for this device's earlier records (number ${last + 1} has not arrived yet).`, conflictIds: [] };
    }
    const outcome =
      op.seq <= last
        ? rejected(`This device already sent a different record numbered ${op.seq}; its outbox was probably restored from an old copy.`)
        : this.decide(op);
    if (op.seq === last + 1) this.cursors.set(op.deviceId, op.seq);
    this.receipts.set(op.opId, outcome);
    this.newReceipts.push({ opId: op.opId, deviceId: op.deviceId, seq: op.seq, userId: op.userId, ...outcome, status: outcome.status as 'applied' });
    return outcome;
  }

  private decide(op: SyncOp): Outcome {
    if (this.unstorable.has(op)) {
      return rejected('This record holds a character the server cannot store (an invisible control character or half of an emoji); correct the text and save it again.');
    }
    if (!this.authors.displayNames.has(op.userId)) return rejected('This record names an official this server does not know.');
    const refusal = refuseOp(op, this.authors);
    if (refusal) return rejected(refusal);
    const source: FieldSource = { userId: op.userId, deviceId: op.deviceId, opId: op.opId, hlc: op.hlc };
    const existing = this.records.get(op.recordId);
    switch (op.action) {
      case 'create':
        return this.create(op, source, existing);
      case 'update':
        return this.update(op, source, existing);
      case 'delete':
        return this.remove(op, existing);
      case 'settle':
        return this.settle(op, source);
    }
  }

  private create(op: SyncOp, source: FieldSource, existing: RecordRow | undefined): Outcome {
    const kind = op.recordKind as RecordKind;
    if (existing) return { status: 'duplicate', reason: 'This record was already saved on the server.', conflictIds: [] };
    const parsed = this.fieldsRead.get(op)!;
    if (!parsed.success) return rejected(`The ${kind.replace('-', ' ')} is not complete: ${parsed.error.issues[0]?.path.join('.')}: ${parsed.error.issues[0]?.message}.`);
    const fields = parsed.data as Record<string, Json>;
    const key = naturalKey(kind, op.competitionId, fields);
    const row: RecordRow = {
      id: op.recordId,
      kind,
      competitionId: op.competitionId,
      area: op.area,
      fields,
      // Every field's source is the creating op, which the row keeps once (fieldSourcesOf).
      fieldSources: {},
      createdBy: op.userId,
      deviceId: op.deviceId,
      hlc: op.hlc,
      createdOpId: op.opId,
      naturalKey: key,
      deleted: false,
      version: 1,
      changeSeq: 0,
    };
    this.records.set(row.id, row);
    this.newRecords.add(row.id);
    this.touchRecord(row.id);
    const twin = key ? this.byNaturalKey.get(key) : undefined;
    if (!twin) {
      if (key) this.byNaturalKey.set(key, row.id);
      return { status: 'applied', reason: 'Saved.', conflictIds: [] };
    }
    const first = this.records.get(twin);
    const conflictId = this.addConflict({
      competitionId: op.competitionId,
      area: op.area,
      kind: 'duplicate-record',
      recordId: twin,
      field: null,
      base: null,
      kept: { value: twin, userId: first?.createdBy ?? 'unknown', deviceId: first?.deviceId ?? 'unknown', opId: 'unknown', hlc: first?.hlc ?? '' },
      incoming: { value: row.id, ...source },
    });
    return { status: 'conflict', reason: 'Another device recorded this check too; both are kept for the area leader to settle.', conflictIds: [conflictId] };
  }

  private update(op: SyncOp, source: FieldSource, existing: RecordRow | undefined): Outcome {
    if (!existing) return rejected('The record this change belongs to has not reached the server.');
    if (namesAnotherRecord(op, existing)) return rejected(namesAnotherRecordReason);
    const kind = existing.kind as RecordKind;
    if (appendOnlyKinds.has(kind)) return rejected('Readings and measurements are never changed; record a correction instead.');
    const parsed = this.fieldsRead.get(op)!;
    if (!parsed.success) return rejected(`The change is not valid: ${parsed.error.issues[0]?.path.join('.')}: ${parsed.error.issues[0]?.message}.`);
    const unknown: FieldSource = { userId: existing.createdBy, deviceId: existing.deviceId, opId: 'unknown', hlc: existing.hlc };
    const merge = mergeFields(existing.fields, fieldSourcesOf(existing), { fields: op.fields, base: op.base }, source, unknown);
    this.setFields(existing, merge.apply, source);
    const conflictIds = merge.conflicts.map((c) =>
      this.addConflict({ competitionId: existing.competitionId, area: existing.area, kind: 'field', recordId: existing.id, field: c.field, base: c.base, kept: c.kept, incoming: c.incoming }),
    );
    return conflictIds.length > 0
      ? { status: 'conflict', reason: `Changed on another device too: ${merge.conflicts.map((c) => c.field).join(', ')}; both values are kept for the area leader.`, conflictIds }
      : { status: 'applied', reason: 'Saved.', conflictIds: [] };
  }

  private remove(op: SyncOp, existing: RecordRow | undefined): Outcome {
    if (!existing) return rejected('The record to remove has not reached the server.');
    if (namesAnotherRecord(op, existing)) return rejected(namesAnotherRecordReason);
    if (!existing.deleted) {
      existing.deleted = true;
      existing.version += 1;
      this.touchRecord(existing.id);
    }
    return { status: 'applied', reason: 'Marked as removed; the values are kept.', conflictIds: [] };
  }

  private settle(op: SyncOp, source: FieldSource): Outcome {
    const conflict = op.settlement ? this.conflicts.get(op.settlement.conflictId) : undefined;
    if (!conflict || !op.settlement) return rejected('The clash to settle is not known to the server.');
    if (conflict.status === 'settled') return rejected('This clash was already settled.');
    // The settler was authorised for the op's competition and area, so the clash must lie there.
    if (conflict.competitionId !== op.competitionId || conflict.area !== op.area) {
      return rejected('This settlement names another competition or area than the clash it settles.');
    }
    const record = this.records.get(conflict.recordId);
    if (!record) return rejected('The record of this clash is missing.');
    const value = conflict.field ? op.fields[conflict.field] : op.fields['keep'];
    if (value === undefined) return rejected(`Say which value to keep (${conflict.field ?? 'keep'}).`);
    if (conflict.kind === 'duplicate-record') {
      const ids = [conflict.kept.value, conflict.incoming.value];
      if (!ids.includes(value)) return rejected('Keep one of the two records of this clash.');
      const drop = this.records.get(String(ids.find((id) => id !== value)));
      if (drop && !drop.deleted) {
        drop.deleted = true;
        drop.version += 1;
        this.touchRecord(drop.id);
      }
    } else {
      const parsed = editSchemas[record.kind as RecordKind].safeParse({ [conflict.field!]: value });
      if (!parsed.success) return rejected(`The settled value is not valid: ${parsed.error.issues[0]?.message}.`);
      this.setFields(record, { [conflict.field!]: value }, source);
    }
    conflict.status = 'settled';
    conflict.settlement = { value, reason: op.settlement.reason, userId: op.userId, opId: op.opId };
    this.touchConflict(conflict.id);
    return { status: 'applied', reason: 'Settled.', conflictIds: [conflict.id] };
  }

  private setFields(record: RecordRow, apply: Record<string, Json>, source: FieldSource): void {
    if (Object.keys(apply).length === 0) return;
    record.fields = { ...record.fields, ...apply };
    record.fieldSources = { ...record.fieldSources, ...Object.fromEntries(Object.keys(apply).map((f) => [f, source])) };
    record.version += 1;
    this.touchRecord(record.id);
  }

  private addConflict(values: Omit<ConflictRow, 'id' | 'status' | 'settlement' | 'changeSeq'>): string {
    const row: ConflictRow = { id: uuidv7(), status: 'open', settlement: null, changeSeq: 0, ...values };
    this.conflicts.set(row.id, row);
    this.newConflicts.add(row.id);
    this.touchConflict(row.id);
    return row.id;
  }

  private touchRecord(id: string): void {
    this.changedRecords.add(id);
  }

  private touchConflict(id: string): void {
    this.changedConflicts.add(id);
  }

  async write(): Promise<void> {
    const changes = this.changedRecords.size + this.changedConflicts.size;
    // Each changed row's place among the batch's changes (1, 2, 3 ...); it is stored counted on from the
    // last change number handed out before (`taken`).
    let place = 1;
    for (const id of this.changedRecords) this.records.get(id)!.changeSeq = place++;
    for (const id of this.changedConflicts) this.conflicts.get(id)!.changeSeq = place++;
    const changeSeq: Shift = { field: 'changeSeq', by: sql`(select taken from counter)` };
    const records = [...this.changedRecords].map((id) => this.records.get(id)!);
    const conflicts = [...this.changedConflicts].map((id) => this.conflicts.get(id)!);
    // All in one statement (bulk-rows.ts). Taking the numbers locks the counter row until commit: a later
    // batch cannot commit a higher number first, so a pull never skips a change (SPEC.md §8).
    await writeTogether(this.tx, {
      counter:
        changes > 0
          ? sql`update ${syncCounter} set ${sql.identifier(syncCounter.value.name)} = ${syncCounter.value} + ${changes} where ${syncCounter.id} = 1
              returning ${syncCounter.value} - ${changes} as taken`
          : undefined,
      newRecords: insertRows(syncRecords, records.filter((r) => this.newRecords.has(r.id)), changeSeq),
      changedRecords: updateRows(syncRecords, 'id', ['fields', 'fieldSources', 'deleted', 'version', 'changeSeq'], records.filter((r) => !this.newRecords.has(r.id)), changeSeq),
      newConflicts: insertRows(syncConflicts, conflicts.filter((c) => this.newConflicts.has(c.id)), changeSeq),
      changedConflicts: updateRows(syncConflicts, 'id', ['status', 'settlement', 'changeSeq'], conflicts.filter((c) => !this.newConflicts.has(c.id)), changeSeq),
      receipts: insertRows(opReceipts, this.newReceipts),
      cursors: updateRows(deviceCursors, 'deviceId', ['lastSeq'], [...this.cursors].map(([deviceId, lastSeq]) => ({ deviceId, lastSeq }))),
    });
  }
}
