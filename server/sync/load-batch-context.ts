import { and, inArray } from 'drizzle-orm';
import type { RoleAssignment } from '../../shared/auth/roles';
import type { SyncOp } from '../../shared/sync/sync-api';
import type { Database } from '../db/client';
import { devicePins, roleAssignments, sessions, users } from '../db/schema';

export interface AuthorData {
  rolesByUser: Map<string, RoleAssignment[]>;
  deviceMembers: Set<string>;
  displayNames: Map<string, string>;
}

/** Roles, device memberships and names of every author in a batch, in three queries. */
export async function loadAuthors(tx: Database, ops: readonly SyncOp[]): Promise<AuthorData> {
  const userIds = [...new Set(ops.map((op) => op.userId))];
  const deviceIds = [...new Set(ops.map((op) => op.deviceId))];
  const data: AuthorData = { rolesByUser: new Map(), deviceMembers: new Set(), displayNames: new Map() };
  if (userIds.length === 0) return data;

  const roleRows = await tx
    .select({ userId: roleAssignments.userId, role: roleAssignments.role, competitionId: roleAssignments.competitionId, area: roleAssignments.area })
    .from(roleAssignments)
    .where(inArray(roleAssignments.userId, userIds));
  for (const { userId, ...assignment } of roleRows) {
    data.rolesByUser.set(userId, [...(data.rolesByUser.get(userId) ?? []), assignment]);
  }

  const member = and(inArray(sessions.userId, userIds), inArray(sessions.deviceId, deviceIds));
  const sessionRows = await tx.select({ userId: sessions.userId, deviceId: sessions.deviceId }).from(sessions).where(member);
  const pinRows = await tx
    .select({ userId: devicePins.userId, deviceId: devicePins.deviceId })
    .from(devicePins)
    .where(and(inArray(devicePins.userId, userIds), inArray(devicePins.deviceId, deviceIds)));
  for (const row of [...sessionRows, ...pinRows]) data.deviceMembers.add(`${row.userId}|${row.deviceId}`);

  const nameRows = await tx.select({ id: users.id, displayName: users.displayName }).from(users).where(inArray(users.id, userIds));
  for (const row of nameRows) data.displayNames.set(row.id, row.displayName);
  return data;
}

/** True when the user exists at all; ops by unknown users are rejected. */
export const knownUser = (data: AuthorData, userId: string) => data.displayNames.has(userId);
