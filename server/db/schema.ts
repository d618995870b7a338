import { date, jsonb, pgEnum, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import {
  competitionLevels,
  competitionStatuses,
  trackTypes,
} from '../../shared/competition/competition';
import type { RulesProfile } from '../../shared/rules/rules-profile';

export const trackType = pgEnum('track_type', trackTypes);
export const competitionLevel = pgEnum('competition_level', competitionLevels);
export const competitionStatus = pgEnum('competition_status', competitionStatuses);

export const competitions = pgTable('competitions', {
  id: uuid('id').primaryKey(),
  name: text('name').notNull(),
  trackType: trackType('track_type').notNull(),
  level: competitionLevel('level').notNull(),
  venue: text('venue').notNull(),
  firstRunOn: date('first_run_on', { mode: 'string' }).notNull(),
  status: competitionStatus('status').notNull().default('planned'),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  /** The copy of the rules profile frozen when the competition opened; later edits never change it. */
  rulesProfile: jsonb('rules_profile').$type<RulesProfile>(),
  rulesProfileFrozenAt: timestamp('rules_profile_frozen_at', { withTimezone: true, mode: 'string' }),
});
