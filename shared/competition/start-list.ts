import { z } from 'zod';
import { measurement, type Measurement } from '../rules/measurement';
import { disciplines } from '../rules/rules-profile';

const bodyWeight = z.int('A body weight is kept in whole tenths of a kg.').min(1).max(3000).nullable().default(null);
const athleteName = z.string().trim().min(1, 'Enter the athlete’s name.').max(120);

/** One sled in the start list: its bib, when it starts, and who rides it (doubles: both athletes). */
export const startListEntrySchema = z
  .object({
    bib: z.int('A bib is a whole number.').min(1, 'A bib is 1 or more.').max(999),
    startOrder: z.int().min(1).max(999),
    discipline: z.enum(disciplines, { error: 'choose singles women, singles men or doubles' }),
    athlete: athleteName,
    /** The second athlete of a doubles sled; null for singles. */
    secondAthlete: athleteName.nullable(),
    /**
     * Artificial track: the official body weight in tenths of a kg (weighed at the official weigh-in),
     * from which the upper bound on the scale is worked out; null while it is not known.
     */
    officialBodyWeight: bodyWeight,
    /** The second athlete's official body weight in doubles; null for singles or while not known. */
    secondOfficialBodyWeight: bodyWeight,
  })
  .refine((entry) => (entry.discipline === 'doubles') === (entry.secondAthlete !== null), {
    message: 'A doubles sled has two athletes; a singles sled has one.',
    path: ['secondAthlete'],
  })
  .refine((entry) => entry.secondAthlete !== null || entry.secondOfficialBodyWeight === null, {
    message: 'A singles sled has no second body weight.',
    path: ['secondOfficialBodyWeight'],
  });
export type StartListEntry = z.infer<typeof startListEntrySchema>;

/** The athletes of an entry as one line: "Ann Example" or "Ann Example / Bea Example". */
export function athletesOf(entry: Pick<StartListEntry, 'athlete' | 'secondAthlete'>): string {
  return entry.secondAthlete === null ? entry.athlete : `${entry.athlete} / ${entry.secondAthlete}`;
}

/** The official body weights of an entry as the rules engine takes them, or null when any is unknown. */
export function officialBodyWeightsOf(entry: Pick<StartListEntry, 'discipline' | 'officialBodyWeight' | 'secondOfficialBodyWeight'>): Measurement[] | null {
  const tenths = entry.discipline === 'doubles' ? [entry.officialBodyWeight, entry.secondOfficialBodyWeight] : [entry.officialBodyWeight];
  if (tenths.some((one) => one === null)) return null;
  return tenths.map((one) => measurement(one ?? 0, 'kilogram'));
}
