import { eq } from 'drizzle-orm';
import type { RoleAssignment } from '../../shared/auth/roles';
import { generateUserId } from '../auth/user-ids';
import { hashSecret } from '../auth/passwords';
import { grantRole } from '../auth/role-store';
import type { Database } from '../db/client';
import { users } from '../db/schema';

/** Printed by the start command: a demo, not a secret. */
export const demoPassword = 'snowline-demo-2027';

// The open demo races (demo-scenario.ts): Frostbarrow Night Sprint and Glimmerdale Junior Cup.
const openRaces = ['0193a5c0-0000-7000-8000-000000000001', '0193a5c0-0000-7000-8000-000000000003'] as const;
/** The same role in every open demo race. */
const inOpenRaces = (role: RoleAssignment['role'], area: RoleAssignment['area']): RoleAssignment[] =>
  openRaces.map((competitionId) => ({ role, competitionId, area }));

// People of our own invention, one for each role in the open demo races.
export const demoUsers: readonly { email: string; displayName: string; roles: RoleAssignment[] }[] = [
  { email: 'organiser@frostbarrow.test', displayName: 'Ilse Marrow', roles: [{ role: 'organiser', competitionId: null, area: null }] },
  { email: 'delegate@frostbarrow.test', displayName: 'Teodor Vance', roles: inOpenRaces('technical-delegate', null) },
  { email: 'start-leader@frostbarrow.test', displayName: 'Runa Holt', roles: inOpenRaces('area-leader', 'start') },
  { email: 'start-official@frostbarrow.test', displayName: 'Pim Aldous', roles: inOpenRaces('official', 'start') },
  { email: 'start-official-2@frostbarrow.test', displayName: 'Kaja Brenn', roles: inOpenRaces('official', 'start') },
  { email: 'finish-leader@frostbarrow.test', displayName: 'Oskar Fenn', roles: inOpenRaces('area-leader', 'finish') },
  { email: 'finish-official@frostbarrow.test', displayName: 'Mira Sol', roles: inOpenRaces('official', 'finish') },
];

/** Adds the demo users once; safe at every start. */
export async function seedDemoUsers(db: Database): Promise<void> {
  const passwordHash = await hashSecret(demoPassword);
  for (const demo of demoUsers) {
    await db
      .insert(users)
      .values({ id: generateUserId(), email: demo.email, displayName: demo.displayName, passwordHash })
      .onConflictDoNothing({ target: users.email });
    const [user] = await db.select({ id: users.id }).from(users).where(eq(users.email, demo.email));
    for (const assignment of demo.roles) await grantRole(db, user!.id, assignment);
  }
}
