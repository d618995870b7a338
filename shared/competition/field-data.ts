import { z } from 'zod';
import { areas, roles } from '../auth/roles';
import { competitionRulesProfileSchema } from '../rules/competition-profile';
import { competitionSummarySchema } from './competition';
import { instrumentSchema } from './instruments';
import { startListEntrySchema } from './start-list';

/** Someone with a role in the competition, so the device can name them with no signal. */
export const fieldOfficialSchema = z.object({
  userId: z.string().min(1),
  displayName: z.string(),
  role: z.enum(roles),
  /** start or finish for officials and area leaders; null for delegates and organisers. */
  area: z.enum(areas).nullable(),
});
export type FieldOfficial = z.infer<typeof fieldOfficialSchema>;

/**
 * `GET /api/competitions/:id/field-data`: what a device needs to work a competition offline. Kept on the
 * device as one copy per competition and replaced whole by the next good answer.
 */
export const fieldDataSchema = z.object({
  competitionId: z.uuid(),
  competition: competitionSummarySchema,
  /** The rules profile frozen when the competition opened, as the rules-profile route answers it; null until it opens. */
  profile: competitionRulesProfileSchema.nullable(),
  /** In start order. */
  startList: z.array(startListEntrySchema),
  /** Sorted by label. */
  instruments: z.array(instrumentSchema),
  /** One row per role, global organisers included; sorted by name. */
  officials: z.array(fieldOfficialSchema),
  fetchedAt: z.iso.datetime({ offset: true }),
}).refine((data) => data.competition.id === data.competitionId && (data.profile === null || data.profile.competitionId === data.competitionId), {
  message: 'The start list, instruments and rules are not all of the same competition.',
  path: ['competitionId'],
});
export type FieldData = z.infer<typeof fieldDataSchema>;
