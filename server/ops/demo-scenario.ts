import { eq, inArray, sql } from 'drizzle-orm';
import type { InstrumentPurpose } from '../../shared/competition/instruments';
import type { StartListEntry } from '../../shared/competition/start-list';
import { acceptDemoValues, withProfileValue } from '../../shared/rules/profile-values';
import type { RulesProfile } from '../../shared/rules/rules-profile';
import { shippedProfile } from '../../shared/rules/shipped-profiles';
import type { Database } from '../db/client';
import { openCompetition } from '../db/open-competition';
import { competitions, instruments, startListEntries, users } from '../db/schema';
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
/** Every demo race that opens at seeding, with when its profile was frozen (the morning of its first run). */
const demoOpenings = [
  { competition: demoCompetitions[0], at: new Date('2027-01-09T07:00:00Z') },
  { competition: demoCompetitions[2], at: new Date('2027-02-06T07:00:00Z') },
] as const;

type DemoEmail = `${string}@frostbarrow.test`;
const startOfficial: DemoEmail = 'start-official@frostbarrow.test';
const startOfficial2: DemoEmail = 'start-official-2@frostbarrow.test';
const finishOfficial: DemoEmail = 'finish-official@frostbarrow.test';

/**
 * Athletes of our own invention, bibs and start order alike: singles women, singles men, then doubles pairs.
 * On artificial track each comes with an official body weight (tenths of a kg, invented like the names).
 */
function startList(women: string[], men: string[], pairs: [string, string][], bodyWeights: number[] = []): StartListEntry[] {
  const sleds = [
    ...women.map((athlete) => ({ discipline: 'singles-women' as const, athlete, secondAthlete: null })),
    ...men.map((athlete) => ({ discipline: 'singles-men' as const, athlete, secondAthlete: null })),
    ...pairs.map(([athlete, secondAthlete]) => ({ discipline: 'doubles' as const, athlete, secondAthlete })),
  ];
  let next = 0;
  const weigh = () => bodyWeights[next++] ?? null;
  return sleds.map((sled, i) => ({
    bib: i + 1,
    startOrder: i + 1,
    ...sled,
    officialBodyWeight: weigh(),
    secondOfficialBodyWeight: sled.secondAthlete === null ? null : weigh(),
  }));
}

export const demoStartLists: Record<string, StartListEntry[]> = {
  [demoCompetitions[0].id]: startList(
    ['Alva Frennick', 'Brisa Tollomey', 'Corra Vintisk', 'Dalla Heverin'],
    ['Evert Quillane', 'Fenno Strask', 'Gavril Ostermoor', 'Hallam Drewick', 'Isko Penterby'],
    [['Jory Kettleby', 'Kalle Brusvik'], ['Lenn Ashgrove', 'Mattis Ovenden'], ['Nils Harrowmere', 'Orrin Teelby']],
  ),
  [demoCompetitions[2].id]: startList(
    ['Pella Ruskwell', 'Quinna Dovemarsh', 'Rosk Aldervane', 'Sanna Welkby'],
    ['Tobin Larchmere', 'Ulf Crannock', 'Vesko Pindarel', 'Wenzel Thornaby', 'Yarro Fellgate'],
    [['Zeno Brackley', 'Anwe Skerrit'], ['Birk Hollowell', 'Cato Renfrith'], ['Dree Mossop', 'Elan Quarrington']],
    // Women, men, then each pair's two athletes; some below the demo reference weights, so extra weight applies.
    [598, 641, 662, 705, 702, 748, 763, 781, 719, 688, 742, 701, 736, 765, 693],
  ),
};

interface DemoInstrument {
  id: string;
  label: string;
  purpose: InstrumentPurpose;
  /** Days after the race's first run its calibration holds; negative: it ran out before the race. */
  calibratedForDays: number;
  assignedTo: DemoEmail | null;
  /** Control weights: the certified mass in tenths of a kg. */
  nominalMass?: number;
}

// One sled pyrometer in each race ran out of calibration four months before the race, to show the refusal
// on race day and in the weeks of trying the demo before it. The first start official holds a full start kit,
// so one person can try a whole start check; the second holds a sled pyrometer of their own.
export const demoInstruments: Record<string, DemoInstrument[]> = {
  [demoCompetitions[0].id]: [
    { id: '0193a5c0-0001-7000-8000-000000000101', label: 'PYR-01', purpose: 'control-steel-pyrometer', calibratedForDays: 180, assignedTo: startOfficial },
    { id: '0193a5c0-0001-7000-8000-000000000102', label: 'PYR-02', purpose: 'sled-pyrometer', calibratedForDays: 180, assignedTo: startOfficial },
    { id: '0193a5c0-0001-7000-8000-000000000103', label: 'PYR-03', purpose: 'sled-pyrometer', calibratedForDays: 180, assignedTo: startOfficial2 },
    { id: '0193a5c0-0001-7000-8000-000000000104', label: 'PYR-04', purpose: 'sled-pyrometer', calibratedForDays: -120, assignedTo: startOfficial },
    { id: '0193a5c0-0001-7000-8000-000000000105', label: 'SCL-01', purpose: 'scale', calibratedForDays: 365, assignedTo: startOfficial },
    { id: '0193a5c0-0001-7000-8000-000000000106', label: 'CWT-01', purpose: 'control-weight', calibratedForDays: 365, assignedTo: startOfficial, nominalMass: 20 },
    { id: '0193a5c0-0001-7000-8000-000000000107', label: 'GAP-01', purpose: 'gap-probe', calibratedForDays: 365, assignedTo: startOfficial },
    { id: '0193a5c0-0001-7000-8000-000000000108', label: 'CAL-01', purpose: 'caliper', calibratedForDays: 365, assignedTo: startOfficial },
    { id: '0193a5c0-0001-7000-8000-000000000109', label: 'ANG-01', purpose: 'angle-gauge', calibratedForDays: 365, assignedTo: startOfficial },
    { id: '0193a5c0-0001-7000-8000-00000000010a', label: 'RUL-01', purpose: 'steel-rule', calibratedForDays: 365, assignedTo: startOfficial },
  ],
  [demoCompetitions[2].id]: [
    { id: '0193a5c0-0001-7000-8000-000000000301', label: 'PYR-11', purpose: 'control-steel-pyrometer', calibratedForDays: 180, assignedTo: startOfficial },
    { id: '0193a5c0-0001-7000-8000-000000000302', label: 'PYR-12', purpose: 'sled-pyrometer', calibratedForDays: 180, assignedTo: startOfficial },
    { id: '0193a5c0-0001-7000-8000-000000000303', label: 'PYR-13', purpose: 'sled-pyrometer', calibratedForDays: 180, assignedTo: startOfficial2 },
    { id: '0193a5c0-0001-7000-8000-000000000304', label: 'PYR-14', purpose: 'sled-pyrometer', calibratedForDays: -120, assignedTo: startOfficial },
    { id: '0193a5c0-0001-7000-8000-000000000305', label: 'SCL-11', purpose: 'scale', calibratedForDays: 365, assignedTo: startOfficial },
    // Where an artificial-track scale stands: at least five control weights.
    ...[1, 2, 3, 4, 5].map((n) => ({
      id: `0193a5c0-0001-7000-8000-00000000031${n}`,
      label: `CWT-1${n}`,
      purpose: 'control-weight' as const,
      calibratedForDays: 365,
      assignedTo: startOfficial,
      nominalMass: 200,
    })),
    { id: '0193a5c0-0001-7000-8000-000000000306', label: 'GAP-11', purpose: 'gap-probe', calibratedForDays: 365, assignedTo: startOfficial },
    // On artificial track the sled's dimensions are measured at the finish.
    { id: '0193a5c0-0001-7000-8000-000000000307', label: 'CAL-11', purpose: 'caliper', calibratedForDays: 365, assignedTo: finishOfficial },
  ],
};

/**
 * The junior extra-weight values the shipped profile leaves unset (published values cover senior races
 * only), invented for the demo race and labelled so, like every other demo value. Tenths of a kilogram.
 */
const juniorDemoValues: Readonly<Record<string, number>> = {
  'weights.extraWeight.referenceBodyWeight.singles-women': 650,
  'weights.extraWeight.referenceBodyWeight.singles-men': 750,
  'weights.extraWeight.cap.singles-women': 80,
  'weights.extraWeight.cap.singles-men': 100,
  'weights.extraWeight.cap.doubles': 80,
  'weights.extraWeight.doublesPairReference': 1500,
};

/** The shipped profile with the labelled demo values, and for a junior race the invented junior ones. */
function demoProfile(competition: (typeof demoCompetitions)[number]): RulesProfile {
  const profile = acceptDemoValues(shippedProfile(competition.trackType, competition.level));
  if (competition.level !== 'junior') return profile;
  return Object.entries(juniorDemoValues).reduce(
    (filled, [path, value]) => withProfileValue(filled, path, value, { kind: 'demo-value', verified: false, note: 'invented for the demo race' }),
    profile,
  );
}

/** The day `days` after an ISO date (before it when negative). */
export function daysAfter(isoDate: string, days: number): string {
  const at = new Date(`${isoDate}T00:00:00Z`);
  at.setUTCDate(at.getUTCDate() + days);
  return at.toISOString().slice(0, 10);
}

/** Seeds the demo scenario; safe to run at every start. Returns how many competitions were new. */
export async function seedDemoScenario(db: Database): Promise<number> {
  const inserted = await db
    .insert(competitions)
    .values([...demoCompetitions])
    .onConflictDoNothing({ target: competitions.id })
    .returning({ id: competitions.id });
  for (const { competition, at } of demoOpenings) {
    // Also opens a race a demo database from before it was opened still holds as planned.
    const [row] = await db.select({ status: competitions.status }).from(competitions).where(eq(competitions.id, competition.id));
    if (row?.status !== 'planned') continue;
    await openCompetition(db, competition.id, demoProfile(competition), at);
  }
  await seedDemoUsers(db);
  await seedDemoStartListsAndInstruments(db);
  return inserted.length;
}

async function seedDemoStartListsAndInstruments(db: Database): Promise<void> {
  const emails = [...new Set(Object.values(demoInstruments).flatMap((list) => list.map((i) => i.assignedTo)))].filter((e) => e !== null);
  const userRows = await db.select({ id: users.id, email: users.email }).from(users).where(inArray(users.email, emails));
  const userIdOf = new Map(userRows.map((u) => [u.email, u.id]));
  for (const { competition } of demoOpenings) {
    const entries = demoStartLists[competition.id] ?? [];
    // A row there already keeps its place; a demo database from before body weights were kept gets them.
    if (entries.length > 0) {
      await db
        .insert(startListEntries)
        .values(entries.map((entry) => ({ competitionId: competition.id, ...entry })))
        .onConflictDoUpdate({
          target: [startListEntries.competitionId, startListEntries.bib],
          set: { officialBodyWeight: sql`excluded.official_body_weight`, secondOfficialBodyWeight: sql`excluded.second_official_body_weight` },
        });
    }
    const kit = demoInstruments[competition.id] ?? [];
    if (kit.length === 0) continue;
    await db
      .insert(instruments)
      .values(
        kit.map(({ calibratedForDays, assignedTo, nominalMass, ...instrument }) => ({
          ...instrument,
          nominalMass: nominalMass ?? null,
          competitionId: competition.id,
          calibratedUntil: daysAfter(competition.firstRunOn, calibratedForDays),
          assignedTo: assignedTo === null ? null : (userIdOf.get(assignedTo) ?? null),
          certificateSha256: null,
        })),
      )
      // An older demo database gets the kit as the demo now issues it (who holds what, certified masses).
      .onConflictDoUpdate({
        target: instruments.id,
        set: { assignedTo: sql`excluded.assigned_to`, nominalMass: sql`excluded.nominal_mass` },
      });
  }
}
