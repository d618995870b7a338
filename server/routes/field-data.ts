import { and, asc, eq, isNull, or } from 'drizzle-orm';
import { z } from 'zod';
import { roles } from '../../shared/auth/roles';
import type { FieldData } from '../../shared/competition/field-data';
import { competitionInPath, competitionRole } from '../auth/access';
import type { Database } from '../db/client';
import { competitions, instruments, roleAssignments, startListEntries, users } from '../db/schema';
import { ApiError } from '../http/api-error';
import type { ApiRoute } from '../http/api-route';
import { parseInput } from '../http/parse-input';

const competitionParamsSchema = z.strictObject({ id: z.uuid('The competition id is not valid.') });

/**
 * `GET /api/competitions/:id/field-data`: the start list, instruments, officials and frozen rules of one
 * competition in one answer, which the device keeps to work with no signal.
 */
export function fieldDataRoutes(db: Database): ApiRoute[] {
  return [
    {
      method: 'get',
      path: '/competitions/:id/field-data',
      access: competitionRole([...roles], competitionInPath),
      handle: async (req, res) => {
        const { id } = parseInput(competitionParamsSchema, req.params, 'params');
        const body = await loadFieldData(db, id);
        if (!body) throw new ApiError('not_found', 'There is no such competition.');
        res.json(body);
      },
    },
  ];
}

async function loadFieldData(db: Database, competitionId: string): Promise<FieldData | null> {
  const [competition] = await db.select().from(competitions).where(eq(competitions.id, competitionId));
  if (!competition) return null;
  const [startList, kit, officials] = await Promise.all([
    db
      .select({
        bib: startListEntries.bib,
        startOrder: startListEntries.startOrder,
        discipline: startListEntries.discipline,
        athlete: startListEntries.athlete,
        secondAthlete: startListEntries.secondAthlete,
        officialBodyWeight: startListEntries.officialBodyWeight,
        secondOfficialBodyWeight: startListEntries.secondOfficialBodyWeight,
      })
      .from(startListEntries)
      .where(eq(startListEntries.competitionId, competitionId))
      .orderBy(asc(startListEntries.startOrder)),
    db
      .select({
        id: instruments.id,
        label: instruments.label,
        purpose: instruments.purpose,
        calibratedUntil: instruments.calibratedUntil,
        assignedTo: instruments.assignedTo,
        nominalMass: instruments.nominalMass,
        certificateSha256: instruments.certificateSha256,
      })
      .from(instruments)
      .where(eq(instruments.competitionId, competitionId))
      .orderBy(asc(instruments.label)),
    // Global organisers hold a role in every competition, so they are named here too.
    db
      .select({ userId: users.id, displayName: users.displayName, role: roleAssignments.role, area: roleAssignments.area })
      .from(roleAssignments)
      .innerJoin(users, eq(users.id, roleAssignments.userId))
      .where(
        or(
          eq(roleAssignments.competitionId, competitionId),
          and(isNull(roleAssignments.competitionId), eq(roleAssignments.role, 'organiser')),
        ),
      )
      .orderBy(asc(users.displayName), asc(users.id), asc(roleAssignments.role), asc(roleAssignments.area)),
  ]);
  const { rulesProfile, rulesProfileFrozenAt } = competition;
  return {
    competitionId,
    competition: {
      id: competition.id,
      name: competition.name,
      trackType: competition.trackType,
      level: competition.level,
      venue: competition.venue,
      firstRunOn: competition.firstRunOn,
      status: competition.status,
    },
    profile:
      rulesProfile && rulesProfileFrozenAt
        ? { competitionId, frozenAt: new Date(rulesProfileFrozenAt).toISOString(), profile: rulesProfile }
        : null,
    startList,
    instruments: kit,
    officials,
    fetchedAt: new Date().toISOString(),
  };
}
