import { z } from 'zod';
import { rulesProfileSchema } from './rules-profile';

/** `GET /api/competitions/:id/rules-profile`: the profile frozen when the competition opened. */
export const competitionRulesProfileSchema = z.object({
  competitionId: z.uuid(),
  frozenAt: z.iso.datetime({ offset: true }),
  profile: rulesProfileSchema,
});
export type CompetitionRulesProfile = z.infer<typeof competitionRulesProfileSchema>;
