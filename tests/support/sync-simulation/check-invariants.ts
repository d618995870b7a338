import { syncConflictSchema, syncRecordSchema, type SyncConflict, type SyncRecord } from '../../../shared/sync/sync-api';
import { appendOnlyKinds, type RecordKind } from '../../../shared/sync/record-kinds';
import type { Database } from '../../../server/db/client';
import { opReceipts, syncConflicts, syncCounter, syncRecords } from '../../../server/db/schema';
import { localFromServer } from '../../../src/app/core/device-store/device-db';
import { canonical, concurrent, type FieldEdit, type Ledger } from './ledger';
import type { SimDevice } from './sim-device';

export interface ConflictScore {
  /** Pairs of edits of one field where neither device had seen the other's value (ground truth). */
  clashPairs: number;
  /** ... of which the server's conflict rows show (see fieldConflicts below). */
  found: number;
  /** Field conflict rows, and how many of them join two edits that really were concurrent. */
  rows: number;
  trueRows: number;
  recall: number;
  precision: number;
}

export interface Verdict {
  problems: string[];
  receipts: Record<string, number>;
  fieldConflicts: ConflictScore;
  duplicateConflicts: { groups: number; expectedRows: number; rows: number };
  records: number;
}

type ReceiptRow = typeof opReceipts.$inferSelect;
type RecordRow = typeof syncRecords.$inferSelect;
type ConflictRow = typeof syncConflicts.$inferSelect;

/**
 * Everything the issue promises after quiescence, checked against the ledger (what the devices did)
 * and the database itself (not the pull endpoint). Returns every broken promise in words.
 */
export async function checkInvariants(db: Database, ledger: Ledger, devices: readonly SimDevice[]): Promise<Verdict> {
  const problems: string[] = [];
  const receipts = await db.select().from(opReceipts);
  const records = await db.select().from(syncRecords);
  const conflicts = await db.select().from(syncConflicts);
  const [counter] = await db.select().from(syncCounter);

  const receiptCounts = checkReceipts(ledger, receipts, problems);
  const recordById = checkRecords(ledger, records, problems);
  const fieldConflicts = checkFieldConflicts(ledger, recordById, conflicts.filter((c) => c.kind === 'field'), problems);
  const duplicateConflicts = checkDuplicateRecords(ledger, conflicts.filter((c) => c.kind === 'duplicate-record'), problems);
  await checkDeviceViews(devices, records, conflicts, counter?.value ?? 0, problems);
  return { problems, receipts: receiptCounts, fieldConflicts, duplicateConflicts, records: records.length };
}

/** SPEC.md §2, §4: every op any outbox held has exactly one receipt, and every device's numbers are 1..n. */
function checkReceipts(ledger: Ledger, receipts: ReceiptRow[], problems: string[]): Record<string, number> {
  const counts: Record<string, number> = {};
  const byOp = new Map<string, ReceiptRow[]>();
  for (const receipt of receipts) {
    counts[receipt.status] = (counts[receipt.status] ?? 0) + 1;
    byOp.set(receipt.opId, [...(byOp.get(receipt.opId) ?? []), receipt]);
  }
  for (const { op, device } of ledger.ops.values()) {
    const found = byOp.get(op.opId) ?? [];
    const what = `op ${op.opId} (device ${device}, number ${op.seq}, ${op.action} ${op.recordKind})`;
    if (found.length === 0) problems.push(`${what} has no receipt: it was lost`);
    if (found.length > 1) problems.push(`${what} has ${found.length} receipts`);
    const receipt = found[0];
    if (!receipt) continue;
    if (receipt.deviceId !== op.deviceId || receipt.seq !== op.seq) problems.push(`${what} has a receipt for device ${receipt.deviceId}, number ${receipt.seq}`);
    if (receipt.status === 'rejected' || receipt.status === 'duplicate') problems.push(`${what} was ${receipt.status}: ${receipt.reason}`);
  }
  for (const receipt of receipts) if (!ledger.ops.has(receipt.opId)) problems.push(`a receipt for op ${receipt.opId}, which no device made`);
  const seqsByDevice = new Map<string, number[]>();
  for (const { op } of ledger.ops.values()) seqsByDevice.set(op.deviceId, [...(seqsByDevice.get(op.deviceId) ?? []), op.seq]);
  for (const [deviceId, seqs] of seqsByDevice) {
    const sorted = [...seqs].sort((a, b) => a - b);
    if (sorted.some((seq, i) => seq !== i + 1)) problems.push(`device ${deviceId} numbered its ops ${sorted.slice(0, 10).join(', ')} ... instead of 1, 2, 3 ...`);
  }
  return counts;
}

/** Every record created exists once, as created (append-only kinds and start checks nobody edited). */
function checkRecords(ledger: Ledger, records: RecordRow[], problems: string[]): Map<string, RecordRow> {
  const byId = new Map<string, RecordRow>();
  for (const row of records) {
    if (byId.has(row.id)) problems.push(`record ${row.id} is stored twice`);
    byId.set(row.id, row);
  }
  const edited = new Set([...ledger.ops.values()].filter(({ op }) => op.action === 'update').map(({ op }) => op.recordId));
  for (const [id, { op, device }] of ledger.createdRecords) {
    const row = byId.get(id);
    if (!row) {
      problems.push(`record ${id} (${op.recordKind} by device ${device}) never reached the server`);
      continue;
    }
    if (row.kind !== op.recordKind || row.createdBy !== op.userId || row.deviceId !== op.deviceId) problems.push(`record ${id} is stored as another kind, author or device`);
    if ((appendOnlyKinds.has(op.recordKind as RecordKind) || !edited.has(id)) && canonical(row.fields) !== canonical(op.fields)) {
      problems.push(`record ${id} (${op.recordKind}, never edited) holds ${canonical(row.fields)} instead of ${canonical(op.fields)}`);
    }
    if (row.deleted !== ledger.deletedRecords.has(id)) problems.push(`record ${id} is ${row.deleted ? '' : 'not '}marked removed`);
  }
  for (const id of byId.keys()) if (!ledger.createdRecords.has(id)) problems.push(`record ${id} is on the server but no device created it`);
  return byId;
}

/**
 * SPEC.md §5. Ground truth: two edits of one field clash when neither device had seen the other's
 * value (their values always differ here). Each late edit gets one row against the value the server
 * held, so with three or more concurrent values two late ones are joined through the value both met:
 * a clash of X and Y counts as found when a row has Y incoming against X or a value on X's causal line
 * (or the other way round), or when both were kept as incoming values. A row is true when its two
 * sides clash and it shows their values and the incoming edit's base. Recall and precision must be 1.
 */
function checkFieldConflicts(ledger: Ledger, records: Map<string, RecordRow>, rows: ConflictRow[], problems: string[]): ConflictScore {
  const rowsByIncoming = new Map<string, FieldEdit[]>();
  const keptValues = new Map<string, Set<string>>();
  const seenIncoming = new Set<string>();
  let trueRows = 0;
  for (const row of rows) {
    const field = row.field ?? '';
    const kept = ledger.edit(row.kept.opId, field);
    const incoming = ledger.edit(row.incoming.opId, field);
    const where = `conflict ${row.id} on ${field} of ${row.recordId}`;
    const values = keptValues.get(`${row.recordId}|${field}`) ?? new Set<string>();
    values.add(canonical(row.kept.value)).add(canonical(row.incoming.value));
    keptValues.set(`${row.recordId}|${field}`, values);
    if (!kept || !incoming) {
      problems.push(`${where} names an op no device made for that field (kept ${row.kept.opId}, incoming ${row.incoming.opId})`);
      continue;
    }
    const incomingKey = `${incoming.opId}|${field}`;
    if (seenIncoming.has(incomingKey)) problems.push(`${where}: the edit ${incoming.opId} clashes in more than one row`);
    seenIncoming.add(incomingKey);
    rowsByIncoming.set(incomingKey, [...(rowsByIncoming.get(incomingKey) ?? []), kept]);
    const faithful =
      kept.recordId === row.recordId &&
      incoming.recordId === row.recordId &&
      canonical(row.kept.value) === canonical(kept.value) &&
      canonical(row.incoming.value) === canonical(incoming.value) &&
      canonical(row.base) === canonical(incoming.base);
    if (kept.device === incoming.device) problems.push(`${where} sets two edits of device ${kept.device} against each other (its own edits must chain)`);
    else if (!concurrent(kept, incoming)) problems.push(`${where}: device ${incoming.device} had already seen the kept value (${canonical(kept.value)}), so this is no clash`);
    else if (!faithful) problems.push(`${where} does not show the two values and the base as they were entered`);
    else trueRows++;
  }

  let clashPairs = 0;
  let found = 0;
  const fieldsEdited = new Set([...ledger.edits.values()].filter((e) => e.base !== null).map((e) => `${e.recordId}|${e.field}`));
  for (const key of fieldsEdited) {
    const [recordId, field] = key.split('|') as [string, string];
    const edits = ledger.editsOf(recordId, field);
    const comparable = (a: FieldEdit, b: FieldEdit) => a.opId === b.opId || !concurrent(a, b);
    const againstLineOf = (incoming: FieldEdit, other: FieldEdit) => (rowsByIncoming.get(`${incoming.opId}|${field}`) ?? []).some((kept) => comparable(kept, other));
    const keptIncoming = (edit: FieldEdit) => rowsByIncoming.has(`${edit.opId}|${field}`);
    for (let i = 0; i < edits.length; i++) {
      for (let j = i + 1; j < edits.length; j++) {
        const [x, y] = [edits[i]!, edits[j]!];
        if (!concurrent(x, y)) continue;
        clashPairs++;
        if (againstLineOf(y, x) || againstLineOf(x, y) || (keptIncoming(x) && keptIncoming(y))) found++;
        else problems.push(`edits ${x.opId} (device ${x.device}: ${canonical(x.value)}) and ${y.opId} (device ${y.device}: ${canonical(y.value)}) of ${field} of ${recordId} clash, but no conflict shows it`);
      }
    }
    checkValuesKept(ledger, records.get(recordId), field, edits, keptValues.get(key) ?? new Set(), problems);
  }
  return { clashPairs, found, rows: rows.length, trueRows, recall: clashPairs === 0 ? 1 : found / clashPairs, precision: rows.length === 0 ? 1 : trueRows / rows.length };
}

/** No value is silently lost: each is the field's value now, kept in a conflict, or knowingly replaced by the value now. */
function checkValuesKept(ledger: Ledger, row: RecordRow | undefined, field: string, edits: FieldEdit[], inConflicts: Set<string>, problems: string[]): void {
  if (!row) return;
  const now = row.fields[field] ?? null;
  const producer = ledger.producerOf(row.id, field, now);
  const current = producer ? ledger.edit(producer, field) : undefined;
  if (!current) {
    problems.push(`${field} of ${row.id} is ${canonical(now)}, a value no device entered`);
    return;
  }
  for (const edit of edits) {
    if (edit.opId === current.opId || current.history.has(edit.opId) || inConflicts.has(canonical(edit.value))) continue;
    problems.push(`${field} of ${row.id}: the value ${canonical(edit.value)} of device ${edit.device} was neither applied nor kept in a conflict`);
  }
}

/** SPEC.md §5: n start checks of one sled and run are kept as n − 1 duplicate-record conflicts against one of them. */
function checkDuplicateRecords(ledger: Ledger, rows: ConflictRow[], problems: string[]) {
  const groupOf = new Map<string, string>();
  for (const [key, ids] of ledger.naturalKeyGroups) for (const id of ids) groupOf.set(id, key);
  const rowsByGroup = new Map<string, ConflictRow[]>();
  for (const row of rows) {
    const [kept, incoming] = [String(row.kept.value), String(row.incoming.value)];
    const group = groupOf.get(kept);
    if (!group || group !== groupOf.get(incoming) || kept === incoming || row.recordId !== kept) {
      problems.push(`duplicate-record conflict ${row.id} joins ${kept} and ${incoming}, which are not two checks of one sled and run`);
      continue;
    }
    rowsByGroup.set(group, [...(rowsByGroup.get(group) ?? []), row]);
  }
  let groups = 0;
  let expectedRows = 0;
  for (const [key, ids] of ledger.naturalKeyGroups) {
    if (ids.length < 2) continue;
    groups++;
    expectedRows += ids.length - 1;
    const found = rowsByGroup.get(key) ?? [];
    const kept = new Set(found.map((r) => String(r.kept.value)));
    const incoming = new Set(found.map((r) => String(r.incoming.value)));
    const covered = new Set([...kept, ...incoming]);
    if (found.length !== ids.length - 1 || kept.size !== 1 || incoming.size !== ids.length - 1 || ids.some((id) => !covered.has(id))) {
      problems.push(`${ids.length} checks of ${key} should be ${ids.length - 1} duplicate-record conflicts against one of them; found ${found.length} against ${kept.size} different checks, showing ${covered.size} of the ${ids.length}`);
    }
  }
  return { groups, expectedRows, rows: rows.length };
}

/** SPEC.md §8: after quiescence every device holds exactly the server's records and conflicts, and its outbox is empty. */
async function checkDeviceViews(devices: readonly SimDevice[], records: RecordRow[], conflicts: ConflictRow[], lastChange: number, problems: string[]): Promise<void> {
  const serverRecords = new Map<string, SyncRecord>(records.map((r) => [r.id, syncRecordSchema.parse(r)]));
  const serverConflicts = new Map<string, SyncConflict>(conflicts.map((c) => [c.id, syncConflictSchema.parse({ ...c, base: c.base ?? null })]));
  for (const device of devices) {
    const { db } = device;
    const mismatches: string[] = [];
    const differ = (what: string, mine: Map<string, string>, theirs: Map<string, string>) => {
      for (const [id, value] of theirs) if (mine.get(id) !== value) mismatches.push(`${what} ${id} ${mine.has(id) ? 'differs' : 'is missing'}`);
      for (const id of mine.keys()) if (!theirs.has(id)) mismatches.push(`${what} ${id} is not on the server`);
    };
    const outbox = await db.outbox.count();
    if (outbox > 0) problems.push(`device ${device.index} still has ${outbox} ops in its outbox`);
    for (const rejection of await db.rejections.toArray()) problems.push(`device ${device.index} holds a rejection: ${rejection.reason}`);
    const state = await db.syncState.toArray();
    if (state[0]?.cursor !== lastChange) problems.push(`device ${device.index} pulled up to change ${state[0]?.cursor}, the server is at ${lastChange}`);

    const canonicalMap = <T>(items: Map<string, T>) => new Map([...items].map(([id, item]) => [id, canonical(item)]));
    differ('server copy of record', new Map((await db.serverRecords.toArray()).map((r) => [r.id, canonical(r)])), canonicalMap(serverRecords));
    differ('local record', new Map((await db.records.toArray()).map((r) => [r.id, canonical(r)])), new Map([...serverRecords].map(([id, r]) => [id, canonical(localFromServer(r))])));
    const stored = await db.conflicts.toArray();
    for (const c of stored) if (c.localSettlement !== null) mismatches.push(`conflict ${c.id} still carries a local settlement`);
    differ('conflict', new Map(stored.map(({ localSettlement: _, ...c }) => [c.id, canonical(c)])), canonicalMap(serverConflicts));
    if (mismatches.length > 0) problems.push(`device ${device.index} differs from the server in ${mismatches.length} places: ${mismatches.slice(0, 5).join('; ')}`);
  }
}
