import { z } from 'zod';
import { areas } from '../auth/roles';
import { recordKinds } from './record-kinds';

export const maxOpsPerPush = 500;
export const maxChangesPerPull = 1000;

const json = z.json();
const fieldValues = z.record(z.string().min(1).max(60), json);

/**
 * One change made on a device, in the outbox until the server has a receipt for it (SPEC.md §1–§4).
 */
export const syncOpSchema = z.strictObject({
  opId: z.uuid(),
  deviceId: z.uuid(),
  /** 1, 2, 3 ... per device, in the order the device made its changes. */
  seq: z.number().int().min(1).safe(),
  /** Who made the change: the official active on the device at the time. */
  userId: z.string().min(1).max(64),
  hlc: z.string().min(1).max(100),
  madeAt: z.iso.datetime({ offset: true }),
  competitionId: z.uuid(),
  area: z.enum(areas),
  action: z.enum(['create', 'update', 'delete', 'settle']),
  recordKind: z.enum(recordKinds as [string, ...string[]]),
  recordId: z.uuid(),
  /** create: every field; update: the changed fields; settle: the settled field's value under its name. */
  fields: fieldValues.default({}),
  /** update and delete: each changed field's value as the device last saw it. */
  base: fieldValues.default({}),
  /** settle: which conflict, and why this value. */
  settlement: z.strictObject({ conflictId: z.uuid(), reason: z.string().trim().min(1).max(500) }).optional(),
});
export type SyncOp = z.infer<typeof syncOpSchema>;
export type SyncOpInput = z.input<typeof syncOpSchema>;

/** `POST /api/sync/push`: ops are checked one by one, so one bad op never sinks the others. */
export const pushRequestSchema = z.strictObject({
  ops: z.array(z.unknown()).min(1).max(maxOpsPerPush, `Send at most ${maxOpsPerPush} records at once.`),
});

export const opStatuses = ['applied', 'duplicate', 'rejected', 'conflict', 'deferred'] as const;
export type OpStatus = (typeof opStatuses)[number];

export const opResultSchema = z.object({
  /** Position in the batch, for ops too malformed to have an id. */
  index: z.number().int(),
  opId: z.string().nullable(),
  status: z.enum(opStatuses),
  /** For rejected and deferred: why, in words; for applied and conflict: what happened. */
  reason: z.string(),
  conflictIds: z.array(z.uuid()),
});
export type OpResult = z.infer<typeof opResultSchema>;

export const pushResponseSchema = z.object({ results: z.array(opResultSchema), serverTime: z.iso.datetime({ offset: true }) });
export type PushResponse = z.infer<typeof pushResponseSchema>;

export const syncRecordSchema = z.object({
  id: z.uuid(),
  kind: z.enum(recordKinds as [string, ...string[]]),
  competitionId: z.uuid(),
  area: z.enum(areas),
  fields: z.record(z.string(), json),
  createdBy: z.string(),
  deviceId: z.uuid(),
  hlc: z.string(),
  deleted: z.boolean(),
  version: z.number().int(),
});
export type SyncRecord = z.infer<typeof syncRecordSchema>;

/** Who set a value, from which device, with which op. */
export const fieldSourceSchema = z.object({ userId: z.string(), deviceId: z.string(), opId: z.string(), hlc: z.string() });
export type FieldSource = z.infer<typeof fieldSourceSchema>;
const side = fieldSourceSchema.extend({ value: json });
export type ConflictSide = z.infer<typeof side>;
const settlementSchema = z.object({ value: json, reason: z.string(), userId: z.string(), opId: z.string() });
export type ConflictSettlement = z.infer<typeof settlementSchema>;
export const syncConflictSchema = z.object({
  id: z.uuid(),
  competitionId: z.uuid(),
  area: z.enum(areas),
  kind: z.enum(['field', 'duplicate-record']),
  recordId: z.uuid(),
  field: z.string().nullable(),
  /** The value both sides started from (field conflicts). */
  base: json,
  /** What the server had, and what arrived. For duplicate records: the two record ids. */
  kept: side,
  incoming: side,
  status: z.enum(['open', 'settled']),
  settlement: settlementSchema.nullable(),
});
export type SyncConflict = z.infer<typeof syncConflictSchema>;

export const pullQuerySchema = z.strictObject({
  after: z.coerce.number().int().min(0).default(0),
  limit: z.coerce.number().int().min(1).max(maxChangesPerPull).default(maxChangesPerPull),
});

export const syncChangeSchema = z.discriminatedUnion('type', [
  z.object({ seq: z.number().int(), type: z.literal('record'), record: syncRecordSchema }),
  z.object({ seq: z.number().int(), type: z.literal('conflict'), conflict: syncConflictSchema }),
]);
export type SyncChange = z.infer<typeof syncChangeSchema>;

/** `GET /api/sync/pull?after=<cursor>` */
export const pullResponseSchema = z.object({ changes: z.array(syncChangeSchema), cursor: z.number().int(), hasMore: z.boolean() });
export type PullResponse = z.infer<typeof pullResponseSchema>;
