import { asc, eq } from 'drizzle-orm';
import {
  competitionListQuerySchema,
  type CompetitionList,
} from '../../shared/competition/competition';
import { z } from 'zod';
import type { CompetitionRulesProfile } from '../../shared/rules/competition-profile';
import { competitionInPath, competitionRole, publicAccess } from '../auth/access';
import type { Database } from '../db/client';
import { competitions } from '../db/schema';
import { ApiError } from '../http/api-error';
import type { ApiRoute } from '../http/api-route';
import { parseInput } from '../http/parse-input';

const competitionParamsSchema = z.strictObject({ id: z.uuid('The competition id is not valid.') });

export function competitionRoutes(db: Database): ApiRoute[] {
  return [
    {
      method: 'get',
      path: '/competitions',
      // The list is what the public notice board shows too: names, places and dates only.
      access: publicAccess,
      handle: async (req, res) => {
    const query = parseInput(competitionListQuerySchema, req.query, 'query');
    const rows = await db
      .select({
        id: competitions.id,
        name: competitions.name,
        trackType: competitions.trackType,
        level: competitions.level,
        venue: competitions.venue,
        firstRunOn: competitions.firstRunOn,
        status: competitions.status,
      })
      .from(competitions)
      .where(query.trackType ? eq(competitions.trackType, query.trackType) : undefined)
      .orderBy(asc(competitions.firstRunOn), asc(competitions.name));
    const body: CompetitionList = { competitions: rows };
    res.json(body);
      },
    },
    {
      method: 'get',
      path: '/competitions/:id/rules-profile',
      access: competitionRole(['official', 'area-leader', 'technical-delegate', 'organiser'], competitionInPath),
      handle: async (req, res) => {
    const { id } = parseInput(competitionParamsSchema, req.params, 'params');
    const [row] = await db
      .select({ name: competitions.name, profile: competitions.rulesProfile, frozenAt: competitions.rulesProfileFrozenAt })
      .from(competitions)
      .where(eq(competitions.id, id));
    if (!row) throw new ApiError('not_found', 'There is no such competition.');
    if (!row.profile || !row.frozenAt) {
      throw new ApiError('conflict', `"${row.name}" has not opened yet: its rules profile is frozen when it opens.`);
    }
    const body: CompetitionRulesProfile = { competitionId: id, frozenAt: new Date(row.frozenAt).toISOString(), profile: row.profile };
    res.json(body);
      },
    },
  ];
}
