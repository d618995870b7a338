import { Router } from 'express';
import { asc, eq } from 'drizzle-orm';
import {
  competitionListQuerySchema,
  type CompetitionList,
} from '../../shared/competition/competition';
import type { Database } from '../db/client';
import { competitions } from '../db/schema';
import { parseInput } from '../http/parse-input';

export function competitionsRouter(db: Database): Router {
  const router = Router();

  router.get('/', async (req, res) => {
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
  });

  return router;
}
