import { sql } from 'drizzle-orm';
import { bigint, boolean, check, date, index, integer, jsonb, pgEnum, pgTable, primaryKey, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core';
import { areas, roles, type RoleAssignment } from '../../shared/auth/roles';
import {
  competitionLevels,
  competitionStatuses,
  trackTypes,
} from '../../shared/competition/competition';
import { instrumentPurposes } from '../../shared/competition/instruments';
import { disciplines } from '../../shared/rules/rules-profile';
import type { RulesProfile } from '../../shared/rules/rules-profile';
import type { ConflictSettlement, ConflictSide, FieldSource } from '../../shared/sync/sync-api';

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

// --- Offline sync (server/sync) ---

/** One row, holding the last change number handed out; its row lock keeps the numbers gap-free. */
export const syncCounter = pgTable('sync_counter', {
  id: integer('id').primaryKey(),
  value: bigint('value', { mode: 'number' }).notNull(),
});

export const syncRecords = pgTable(
  'sync_records',
  {
    id: uuid('id').primaryKey(),
    kind: text('kind').notNull(),
    competitionId: uuid('competition_id')
      .notNull()
      .references(() => competitions.id, { onDelete: 'cascade' }),
    area: area('area').notNull(),
    fields: jsonb('fields').$type<Record<string, ConflictSide['value']>>().notNull(),
    /**
     * Who last set each field, and with which op: what a conflict shows as "kept". Only fields set after
     * the record was made are listed; any other field was set by the creating op (created_by, device_id,
     * hlc, created_op_id). Rows from before created_op_id list every field.
     */
    fieldSources: jsonb('field_sources').$type<Record<string, FieldSource>>().notNull(),
    createdBy: text('created_by').notNull(),
    deviceId: uuid('device_id').notNull(),
    hlc: text('hlc').notNull(),
    /** The op that made the record; null on rows from before it was kept (their field_sources list every field). */
    createdOpId: uuid('created_op_id'),
    naturalKey: text('natural_key'),
    deleted: boolean('deleted').notNull().default(false),
    version: integer('version').notNull(),
    changeSeq: bigint('change_seq', { mode: 'number' }).notNull(),
  },
  (table) => [
    index('sync_records_change_idx').on(table.changeSeq),
    index('sync_records_natural_key_idx').on(table.naturalKey),
    index('sync_records_competition_idx').on(table.competitionId),
  ],
);

export const syncConflicts = pgTable(
  'sync_conflicts',
  {
    id: uuid('id').primaryKey(),
    competitionId: uuid('competition_id')
      .notNull()
      .references(() => competitions.id, { onDelete: 'cascade' }),
    area: area('area').notNull(),
    kind: text('kind').$type<'field' | 'duplicate-record'>().notNull(),
    recordId: uuid('record_id').notNull(),
    field: text('field'),
    base: jsonb('base').$type<ConflictSide['value']>(),
    kept: jsonb('kept').$type<ConflictSide>().notNull(),
    incoming: jsonb('incoming').$type<ConflictSide>().notNull(),
    status: text('status').$type<'open' | 'settled'>().notNull(),
    settlement: jsonb('settlement').$type<ConflictSettlement>(),
    changeSeq: bigint('change_seq', { mode: 'number' }).notNull(),
  },
  (table) => [
    index('sync_conflicts_change_idx').on(table.changeSeq),
    index('sync_conflicts_record_idx').on(table.recordId),
    // The late records of open duplicate-record conflicts, which a new start check must not clash with
    // (server/sync/load-batch-context.ts); without it that lookup reads every conflict ever kept.
    index('sync_conflicts_open_duplicate_idx')
      .on(sql`(${table.incoming}->>'value')`)
      .where(sql`${table.kind} = 'duplicate-record' and ${table.status} = 'open'`),
  ],
);

/** The stored answer to every op, so a replayed op gets the same answer (SPEC.md §2). */
export const opReceipts = pgTable('op_receipts', {
  opId: uuid('op_id').primaryKey(),
  deviceId: uuid('device_id').notNull(),
  seq: integer('seq').notNull(),
  userId: text('user_id').notNull(),
  status: text('status').$type<'applied' | 'duplicate' | 'rejected' | 'conflict'>().notNull(),
  reason: text('reason').notNull(),
  conflictIds: uuid('conflict_ids').array().notNull(),
  receivedAt: timestamp('received_at', { withTimezone: true }).notNull().defaultNow(),
});

/** The last op sequence number taken from each device. */
export const deviceCursors = pgTable('device_cursors', {
  deviceId: uuid('device_id').primaryKey(),
  lastSeq: integer('last_seq').notNull(),
});

// --- Start list and instruments (seeded by the demo until the organiser's set-up screens exist) ---

/** A list of constants as SQL text for a check constraint (constants only: never user input). */
const sqlList = (values: readonly string[]) => sql.raw(values.map((v) => `'${v}'`).join(', '));

export const startListEntries = pgTable(
  'start_list_entries',
  {
    competitionId: uuid('competition_id')
      .notNull()
      .references(() => competitions.id, { onDelete: 'cascade' }),
    bib: integer('bib').notNull(),
    startOrder: integer('start_order').notNull(),
    discipline: text('discipline', { enum: disciplines }).notNull(),
    athlete: text('athlete').notNull(),
    /** The second athlete of a doubles sled; null for singles. */
    secondAthlete: text('second_athlete'),
    /** Official body weights in tenths of a kg (artificial track, for the upper bound on the scale); null while unknown. */
    officialBodyWeight: integer('official_body_weight'),
    secondOfficialBodyWeight: integer('second_official_body_weight'),
  },
  (table) => [
    primaryKey({ name: 'start_list_entries_bib_pk', columns: [table.competitionId, table.bib] }),
    unique('start_list_entries_start_order_unique').on(table.competitionId, table.startOrder),
    check('start_list_entries_discipline_check', sql`${table.discipline} in (${sqlList(disciplines)})`),
    check('start_list_entries_positive_check', sql`${table.bib} > 0 and ${table.startOrder} > 0`),
    check('start_list_entries_doubles_check', sql`(${table.discipline} = 'doubles') = (${table.secondAthlete} is not null)`),
    check(
      'start_list_entries_body_weight_check',
      sql`(${table.officialBodyWeight} is null or ${table.officialBodyWeight} > 0) and (${table.secondOfficialBodyWeight} is null or (${table.secondOfficialBodyWeight} > 0 and ${table.secondAthlete} is not null))`,
    ),
  ],
);

/** Pyrometers, scales, gauges: each reading names one, and only the official it is assigned to may use it. */
export const instruments = pgTable(
  'instruments',
  {
    id: uuid('id').primaryKey(),
    competitionId: uuid('competition_id')
      .notNull()
      .references(() => competitions.id, { onDelete: 'cascade' }),
    /** What is written on it, e.g. "PYR-07". */
    label: text('label').notNull(),
    purpose: text('purpose', { enum: instrumentPurposes }).notNull(),
    /** The last day its calibration holds. */
    calibratedUntil: date('calibrated_until', { mode: 'string' }).notNull(),
    assignedTo: text('assigned_to').references(() => users.id, { onDelete: 'set null' }),
    /** A control weight's certified mass in tenths of a kg; null for every other instrument. */
    nominalMass: integer('nominal_mass'),
    /** The calibration certificate, an upload named by its SHA-256 (it may arrive after the row). */
    certificateSha256: text('certificate_sha256'),
  },
  (table) => [
    unique('instruments_label_unique').on(table.competitionId, table.label),
    check('instruments_purpose_check', sql`${table.purpose} in (${sqlList(instrumentPurposes)})`),
    check('instruments_certificate_check', sql`${table.certificateSha256} ~ '^[0-9a-f]{64}$'`),
    check('instruments_nominal_mass_check', sql`${table.nominalMass} is null or (${table.purpose} = 'control-weight' and ${table.nominalMass} > 0)`),
  ],
);

// --- Uploads: evidence photos and calibration certificates (server/uploads) ---

/** One row per stored file, written after the file itself is safely on disk; the file's name is its SHA-256. */
export const uploads = pgTable('uploads', {
  sha256: text('sha256').primaryKey(),
  contentType: text('content_type').notNull(),
  sizeBytes: integer('size_bytes').notNull(),
  uploadedBy: text('uploaded_by').notNull(),
  uploadedAt: timestamp('uploaded_at', { withTimezone: true }).notNull().defaultNow(),
});
