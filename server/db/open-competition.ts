import { and, eq } from 'drizzle-orm';
import { freezeProfileForOpening } from '../../shared/rules/profile-values';
import { RulesInputError } from '../../shared/rules/rules-error';
import type { RulesProfile } from '../../shared/rules/rules-profile';
import { ApiError } from '../http/api-error';
import type { Database } from './client';
import { competitions } from './schema';

/**
 * Opens a planned competition with a frozen copy of its rules profile. A profile with gaps, or one for
 * another track type or level, is refused; an open competition keeps the profile it opened with.
 */
export async function openCompetition(db: Database, competitionId: string, profile: RulesProfile, at: Date): Promise<void> {
  const [competition] = await db.select().from(competitions).where(eq(competitions.id, competitionId));
  if (!competition) throw new ApiError('not_found', 'There is no such competition.');
  if (profile.trackType !== competition.trackType || !profile.levels.includes(competition.level)) {
    throw new RulesInputError(
      'wrong-track-type',
      `The rules profile "${profile.name}" is not for a ${competition.level} race on ${competition.trackType} track.`,
    );
  }
  const frozen = freezeProfileForOpening(profile, at);
  const updated = await db
    .update(competitions)
    .set({ status: 'open', rulesProfile: frozen.profile, rulesProfileFrozenAt: frozen.frozenAt })
    .where(and(eq(competitions.id, competitionId), eq(competitions.status, 'planned')))
    .returning({ id: competitions.id });
  if (updated.length === 0) {
    throw new ApiError('conflict', `"${competition.name}" is already ${competition.status}; its rules profile was frozen when it opened.`);
  }
}
