import { acceptDemoValues } from '../../shared/rules/profile-values';
import { shippedProfile } from '../../shared/rules/shipped-profiles';
import type { Database } from '../db/client';
import { openCompetition } from '../db/open-competition';
import { competitions } from '../db/schema';
import { seedDemoUsers } from './demo-users';

// A race series of our own invention. Fixed ids, so seeding again changes nothing.
export const demoCompetitions = [
  {
    id: '0193a5c0-0000-7000-8000-000000000001',
    name: 'Frostbarrow Night Sprint',
    trackType: 'natural',
    level: 'national',
    venue: 'Frostbarrow Forest Road',
    firstRunOn: '2027-01-09',
    status: 'planned',
  },
  {
    id: '0193a5c0-0000-7000-8000-000000000002',
    name: 'Hollin Ridge Open',
    trackType: 'natural',
    level: 'international',
    venue: 'Hollin Ridge Track',
    firstRunOn: '2027-01-23',
    status: 'planned',
  },
  {
    id: '0193a5c0-0000-7000-8000-000000000003',
    name: 'Glimmerdale Junior Cup',
    trackType: 'artificial',
    level: 'junior',
    venue: 'Glimmerdale Ice Channel',
    firstRunOn: '2027-02-06',
    status: 'planned',
  },
] as const satisfies readonly (typeof competitions.$inferInsert)[];

/** The demo race that is under way: opened with the shipped profile and its labelled demo values. */
export const demoOpenCompetitionId = demoCompetitions[0].id;
const demoOpenedAt = new Date('2027-01-09T07:00:00Z');

/** Seeds the demo scenario; safe to run at every start. Returns how many rows were new. */
export async function seedDemoScenario(db: Database): Promise<number> {
  const inserted = await db
    .insert(competitions)
    .values([...demoCompetitions])
    .onConflictDoNothing({ target: competitions.id })
    .returning({ id: competitions.id });
  if (inserted.some(({ id }) => id === demoOpenCompetitionId)) {
    const { trackType, level } = demoCompetitions[0];
    await openCompetition(db, demoOpenCompetitionId, acceptDemoValues(shippedProfile(trackType, level)), demoOpenedAt);
  }
  await seedDemoUsers(db);
  return inserted.length;
}
