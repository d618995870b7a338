import { date, index, jsonb, pgEnum, pgTable, primaryKey, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core';
import { areas, roles, type RoleAssignment } from '../../shared/auth/roles';
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

// --- Sign-in and roles (server/auth) ---

export const role = pgEnum('role', roles);
export const area = pgEnum('area', areas);

export const users = pgTable('users', {
  id: text('id').primaryKey(),
  email: text('email').notNull().unique(),
  displayName: text('display_name').notNull(),
  passwordHash: text('password_hash').notNull(),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});

export const sessions = pgTable(
  'sessions',
  {
    id: text('id').primaryKey(),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    expiresAt: timestamp('expires_at', { withTimezone: true, mode: 'date' }).notNull(),
    /** The device the session was made on: records from that device are authorised through it. */
    deviceId: uuid('device_id').notNull(),
  },
  (table) => [index('sessions_user_idx').on(table.userId), index('sessions_device_idx').on(table.deviceId)],
);

export const roleAssignments = pgTable(
  'role_assignments',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    /** null: an organiser of every competition. */
    competitionId: uuid('competition_id').references(() => competitions.id, { onDelete: 'cascade' }),
    role: role('role').notNull(),
    area: area('area'),
  },
  (table) => [unique('role_assignments_unique').on(table.userId, table.competitionId, table.role, table.area).nullsNotDistinct()],
);

/** PINs for switching officials on a shared device; Argon2id hashes like passwords. */
export const devicePins = pgTable(
  'device_pins',
  {
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    deviceId: uuid('device_id').notNull(),
    pinHash: text('pin_hash').notNull(),
    setAt: timestamp('set_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [primaryKey({ columns: [table.userId, table.deviceId] })],
);

/** Invitations and password resets: one-time tokens, stored only as SHA-256 hashes. */
export const invitations = pgTable('invitations', {
  tokenHash: text('token_hash').primaryKey(),
  email: text('email').notNull(),
  displayName: text('display_name').notNull(),
  assignment: jsonb('assignment').$type<RoleAssignment>().notNull(),
  invitedBy: text('invited_by')
    .notNull()
    .references(() => users.id, { onDelete: 'cascade' }),
  expiresAt: timestamp('expires_at', { withTimezone: true, mode: 'date' }).notNull(),
  acceptedAt: timestamp('accepted_at', { withTimezone: true, mode: 'date' }),
});

export const passwordResets = pgTable('password_resets', {
  tokenHash: text('token_hash').primaryKey(),
  userId: text('user_id')
    .notNull()
    .references(() => users.id, { onDelete: 'cascade' }),
  expiresAt: timestamp('expires_at', { withTimezone: true, mode: 'date' }).notNull(),
  usedAt: timestamp('used_at', { withTimezone: true, mode: 'date' }),
});

/** What the local fake mail server received: read by organisers on the mailbox page. */
export const fakeMailMessages = pgTable('fake_mail_messages', {
  id: uuid('id').primaryKey().defaultRandom(),
  receivedAt: timestamp('received_at', { withTimezone: true }).notNull().defaultNow(),
  from: text('from_address').notNull(),
  to: text('to_addresses').array().notNull(),
  subject: text('subject').notNull(),
  text: text('text').notNull(),
});
