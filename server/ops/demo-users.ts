import { eq } from 'drizzle-orm';
import type { RoleAssignment } from '../../shared/auth/roles';
import { generateUserId } from '../auth/user-ids';
import { hashSecret } from '../auth/passwords';
import { grantRole } from '../auth/role-store';
import type { Database } from '../db/client';
import { users } from '../db/schema';

/** Printed by the start command: a demo, not a secret. */
export const demoPassword = 'snowline-demo-2027';

const openRace = '0193a5c0-0000-7000-8000-000000000001';

// People of our own invention, one for each role in the open demo race.
export const demoUsers: readonly { email: string; displayName: string; roles: RoleAssignment[] }[] = [
  { email: 'organiser@frostbarrow.test', displayName: 'Ilse Marrow', roles: [{ role: 'organiser', competitionId: null, area: null }] },
  { email: 'delegate@frostbarrow.test', displayName: 'Teodor Vance', roles: [{ role: 'technical-delegate', competitionId: openRace, area: null }] },
  { email: 'start-leader@frostbarrow.test', displayName: 'Runa Holt', roles: [{ role: 'area-leader', competitionId: openRace, area: 'start' }] },
  { email: 'start-official@frostbarrow.test', displayName: 'Pim Aldous', roles: [{ role: 'official', competitionId: openRace, area: 'start' }] },
  { email: 'start-official-2@frostbarrow.test', displayName: 'Kaja Brenn', roles: [{ role: 'official', competitionId: openRace, area: 'start' }] },
  { email: 'finish-leader@frostbarrow.test', displayName: 'Oskar Fenn', roles: [{ role: 'area-leader', competitionId: openRace, area: 'finish' }] },
  { email: 'finish-official@frostbarrow.test', displayName: 'Mira Sol', roles: [{ role: 'official', competitionId: openRace, area: 'finish' }] },
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
