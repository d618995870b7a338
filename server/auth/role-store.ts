import { eq } from 'drizzle-orm';
import type { RoleAssignment } from '../../shared/auth/roles';
import type { Database } from '../db/client';
import { roleAssignments } from '../db/schema';

export async function loadRoles(db: Database, userId: string): Promise<RoleAssignment[]> {
  return db
    .select({ role: roleAssignments.role, competitionId: roleAssignments.competitionId, area: roleAssignments.area })
    .from(roleAssignments)
    .where(eq(roleAssignments.userId, userId));
}

export async function grantRole(db: Database, userId: string, assignment: RoleAssignment): Promise<void> {
  await db
    .insert(roleAssignments)
    .values({ userId, ...assignment })
    .onConflictDoNothing();
}
