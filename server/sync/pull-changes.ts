import { and, asc, gt, inArray, type SQL } from 'drizzle-orm';
import type { RoleAssignment } from '../../shared/auth/roles';
import type { PullResponse, SyncChange } from '../../shared/sync/sync-api';
import type { Database } from '../db/client';
import { syncConflicts, syncRecords } from '../db/schema';

/** Competitions whose records the user may read; null means all (an organiser of every competition). */
export function readableCompetitions(roles: readonly RoleAssignment[]): string[] | null {
  if (roles.some((r) => r.role === 'organiser' && r.competitionId === null)) return null;
  return [...new Set(roles.flatMap((r) => (r.competitionId ? [r.competitionId] : [])))];
}

/**
 * One page of changes after the cursor, in change-number order (SPEC.md §8). Change numbers are
 * handed out under a row lock held to commit, so every number below a visible one is visible too.
 */
export async function pullChanges(db: Database, roles: readonly RoleAssignment[], after: number, limit: number): Promise<PullResponse> {
  const competitions = readableCompetitions(roles);
  if (competitions && competitions.length === 0) return { changes: [], cursor: after, hasMore: false };
  const scope = (column: typeof syncRecords.competitionId | typeof syncConflicts.competitionId): SQL | undefined =>
    competitions ? inArray(column, competitions) : undefined;

  // Both reads see one snapshot: read apart, a batch committing between them would show its conflicts
  // (numbered after its records) without its records, and the cursor would pass those records for ever.
  const { records, conflicts } = await db.transaction(
    async (tx) => ({
      records: await tx
        .select()
        .from(syncRecords)
        .where(and(gt(syncRecords.changeSeq, after), scope(syncRecords.competitionId)))
        .orderBy(asc(syncRecords.changeSeq))
        .limit(limit + 1),
      conflicts: await tx
        .select()
        .from(syncConflicts)
        .where(and(gt(syncConflicts.changeSeq, after), scope(syncConflicts.competitionId)))
        .orderBy(asc(syncConflicts.changeSeq))
        .limit(limit + 1),
    }),
    { isolationLevel: 'repeatable read', accessMode: 'read only' },
  );

  const changes: SyncChange[] = [
    ...records.map((r): SyncChange => ({
      seq: r.changeSeq,
      type: 'record',
      record: {
        id: r.id,
        kind: r.kind,
        competitionId: r.competitionId,
        area: r.area,
        fields: r.fields,
        createdBy: r.createdBy,
        deviceId: r.deviceId,
        hlc: r.hlc,
        deleted: r.deleted,
        version: r.version,
      },
    })),
    ...conflicts.map((c): SyncChange => ({
      seq: c.changeSeq,
      type: 'conflict',
      conflict: {
        id: c.id,
        competitionId: c.competitionId,
        area: c.area,
        kind: c.kind,
        recordId: c.recordId,
        field: c.field,
        base: c.base ?? null,
        kept: c.kept,
        incoming: c.incoming,
        status: c.status,
        settlement: c.settlement,
      },
    })),
  ].sort((a, b) => a.seq - b.seq);

  const page = changes.slice(0, limit);
  return { changes: page, cursor: page.at(-1)?.seq ?? after, hasMore: changes.length > limit };
}
