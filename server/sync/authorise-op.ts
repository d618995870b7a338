import { roleLabels, rolesIn, type RoleAssignment } from '../../shared/auth/roles';
import type { SyncOp } from '../../shared/sync/sync-api';

export interface PushContext {
  /** The signed-in user and device sending the batch. */
  sessionUserId: string;
  sessionDeviceId: string;
  sessionRoles: RoleAssignment[];
  /** Current roles of every user named by an op in the batch. */
  rolesByUser: ReadonlyMap<string, RoleAssignment[]>;
  /** "userId|deviceId" pairs: users who signed in or set a PIN on that device and have not been signed out everywhere. */
  deviceMembers: ReadonlySet<string>;
  displayNames: ReadonlyMap<string, string>;
}

const areaWords = (area: string) => (area === 'start' ? 'the start' : 'the finish');

/**
 * SPEC.md §6: whether the op's author may make it, judged on their roles now. Null when allowed,
 * otherwise the reason in words; a refused op is rejected with that reason, never dropped.
 */
export function refuseOp(op: SyncOp, context: PushContext): string | null {
  const name = context.displayNames.get(op.userId) ?? 'This official';
  const sessionIsAuthor = op.userId === context.sessionUserId;
  const authorOnDevice = context.deviceMembers.has(`${op.userId}|${op.deviceId}`);
  const leaderUpload = rolesIn(context.sessionRoles, op.competitionId).some((r) => r.role === 'area-leader' && r.area === op.area);
  if (!sessionIsAuthor && !(authorOnDevice && (op.deviceId === context.sessionDeviceId || leaderUpload))) {
    return `${name} has not signed in on the device this record came from, or has been signed out everywhere since; it cannot be accepted in their name.`;
  }

  const roles = rolesIn(context.rolesByUser.get(op.userId) ?? [], op.competitionId);
  const inArea = roles.some((r) => (r.role === 'official' || r.role === 'area-leader') && r.area === op.area);
  const leader = roles.some((r) => r.role === 'area-leader' && r.area === op.area);
  const delegate = roles.some((r) => r.role === 'technical-delegate');

  if (op.action === 'settle') {
    return leader ? null : `${name} is not the area leader at ${areaWords(op.area)} now; only the area leader settles clashing records.`;
  }
  if (op.recordKind === 'violation' && delegate) return null;
  if (inArea) return null;
  const held = roles.map((r) => roleLabels[r.role].toLowerCase()).join(', ');
  return `${name} no longer holds an official's role at ${areaWords(op.area)} of this competition${held ? ` (now: ${held})` : ''}, so this record was not accepted.`;
}
