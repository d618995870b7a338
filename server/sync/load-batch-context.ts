import { getTableColumns, sql, type Column } from 'drizzle-orm';
import type { Area, Role, RoleAssignment } from '../../shared/auth/roles';
import type { OpResult, SyncOp } from '../../shared/sync/sync-api';
import type { Database } from '../db/client';
import { devicePins, opReceipts, roleAssignments, sessions, syncConflicts, syncRecords, users } from '../db/schema';

export type StoredOutcome = Pick<OpResult, 'status' | 'reason' | 'conflictIds'>;
export type RecordRow = typeof syncRecords.$inferSelect;

export interface AuthorData {
  rolesByUser: Map<string, RoleAssignment[]>;
  deviceMembers: Set<string>;
  displayNames: Map<string, string>;
}

export interface BatchContext extends AuthorData {
  /** The records the batch names, each locked to commit. */
  records: RecordRow[];
  /** The stored answer of every op of the batch that has one (SPEC.md §2). */
  receipts: Map<string, StoredOutcome>;
  /** For each natural key of the batch, the record a new one with that key clashes with (SPEC.md §5). */
  firstByNaturalKey: Map<string, string>;
}

/** `column = any(values)`: one array parameter, however many values, instead of a list of hundreds. */
export const isAnyOf = (column: Column, values: readonly string[], type: 'uuid' | 'text') => sql`${column} = any(${sql.param(values)}::${sql.raw(type)}[])`;

/** What the one query answers: each part a JSON array of tuples, or null when it found nothing. */
interface ContextRow extends Record<string, unknown> {
  records: Record<string, unknown>[] | null;
  receipts: [opId: string, status: StoredOutcome['status'], reason: string, conflictIds: string[]][] | null;
  twins: [naturalKey: string, recordId: string][] | null;
  roles: [userId: string, role: Role, competitionId: string | null, area: Area | null][] | null;
  members: [userId: string, deviceId: string][] | null;
  names: [userId: string, displayName: string][] | null;
}

/** Column name and field name of every column of sync_records: json_agg names a row's values by column. */
const recordColumns = Object.entries(getTableColumns(syncRecords)).map(([field, column]) => [field, column.name] as const);
/** Every column of sync_records holds what JSON holds as it is (text, uuid, jsonb, boolean, whole numbers). */
const recordFromJson = (json: Record<string, unknown>) => Object.fromEntries(recordColumns.map(([field, name]) => [field, json[name]])) as RecordRow;

/**
 * Everything else a batch reads, in one query (each query costs a round trip, which was a good part of a
 * push): the records it names, locked to commit in id order; the stored receipts of its ops; the records
 * its new start checks clash with; and the roles, device memberships and names of its authors. Run it
 * after the batch holds its other locks (device cursors, natural keys), so it sees every batch that
 * committed before.
 */
export async function loadBatchContext(
  tx: Database,
  ops: readonly SyncOp[],
  { recordIds, naturalKeys }: { recordIds: readonly string[]; naturalKeys: readonly string[] },
): Promise<BatchContext> {
  const opIds = ops.map((op) => op.opId);
  const userIds = [...new Set(ops.map((op) => op.userId))];
  const deviceIds = [...new Set(ops.map((op) => op.deviceId))];
  // twins: a later check of a sled clashes with the first one, not with another late one (those are the
  // incoming side of an open duplicate-record conflict), so a sled's clashes share one record.
  const { rows } = await tx.execute<ContextRow>(sql`select
    (select json_agg(locked) from (select * from ${syncRecords} where ${isAnyOf(syncRecords.id, recordIds, 'uuid')}
      order by ${syncRecords.id} for update) as locked) as records,
    (select json_agg(json_build_array(${opReceipts.opId}, ${opReceipts.status}, ${opReceipts.reason}, ${opReceipts.conflictIds}))
      from ${opReceipts} where ${isAnyOf(opReceipts.opId, opIds, 'uuid')}) as receipts,
    (select json_agg(json_build_array(${syncRecords.naturalKey}, ${syncRecords.id})
      order by exists (select 1 from ${syncConflicts} where ${syncConflicts.kind} = 'duplicate-record' and ${syncConflicts.status} = 'open'
        and ${syncConflicts.incoming}->>'value' = ${syncRecords.id}::text), ${syncRecords.id})
      from ${syncRecords} where ${isAnyOf(syncRecords.naturalKey, naturalKeys, 'text')} and not ${syncRecords.deleted}) as twins,
    (select json_agg(json_build_array(${roleAssignments.userId}, ${roleAssignments.role}, ${roleAssignments.competitionId}, ${roleAssignments.area}))
      from ${roleAssignments} where ${isAnyOf(roleAssignments.userId, userIds, 'text')}) as roles,
    (select json_agg(json_build_array(member.user_id, member.device_id)) from (
      select ${sessions.userId}, ${sessions.deviceId} from ${sessions}
        where ${isAnyOf(sessions.userId, userIds, 'text')} and ${isAnyOf(sessions.deviceId, deviceIds, 'uuid')}
      union all
      select ${devicePins.userId}, ${devicePins.deviceId} from ${devicePins}
        where ${isAnyOf(devicePins.userId, userIds, 'text')} and ${isAnyOf(devicePins.deviceId, deviceIds, 'uuid')}) as member) as members,
    (select json_agg(json_build_array(${users.id}, ${users.displayName})) from ${users} where ${isAnyOf(users.id, userIds, 'text')}) as names`);
  const row = rows[0]!;

  const context: BatchContext = {
    records: (row.records ?? []).map(recordFromJson),
    receipts: new Map(),
    firstByNaturalKey: new Map(),
    rolesByUser: new Map(),
    deviceMembers: new Set(),
    displayNames: new Map(),
  };
  for (const [opId, status, reason, conflictIds] of row.receipts ?? []) context.receipts.set(opId, { status, reason, conflictIds });
  for (const [key, recordId] of row.twins ?? []) if (!context.firstByNaturalKey.has(key)) context.firstByNaturalKey.set(key, recordId);
  for (const [userId, role, competitionId, area] of row.roles ?? []) {
    context.rolesByUser.set(userId, [...(context.rolesByUser.get(userId) ?? []), { role, competitionId, area }]);
  }
  for (const [userId, deviceId] of row.members ?? []) context.deviceMembers.add(`${userId}|${deviceId}`);
  for (const [userId, displayName] of row.names ?? []) context.displayNames.set(userId, displayName);
  return context;
}
