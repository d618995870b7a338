import { z } from 'zod';
import { disciplines } from '../rules/rules-profile';

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
  })
  .refine((entry) => (entry.discipline === 'doubles') === (entry.secondAthlete !== null), {
    message: 'A doubles sled has two athletes; a singles sled has one.',
    path: ['secondAthlete'],
  });
export type StartListEntry = z.infer<typeof startListEntrySchema>;

/** The athletes of an entry as one line: "Ann Example" or "Ann Example / Bea Example". */
export function athletesOf(entry: Pick<StartListEntry, 'athlete' | 'secondAthlete'>): string {
  return entry.secondAthlete === null ? entry.athlete : `${entry.athlete} / ${entry.secondAthlete}`;
}
