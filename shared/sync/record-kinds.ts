import { z } from 'zod';
import { gapProbeResults } from '../rules/gap-probe';
import { measurementSchema } from '../rules/measurement';

/**
 * What officials record, and how each kind changes. Append-only kinds are never edited: a correction is
 * a new record naming the one it supersedes, with a reason. Editable kinds merge field by field.
 */
const isoTime = z.iso.datetime({ offset: true });
export const photoPurposes = ['evidence', 'certificate', 'signature'] as const;
export type PhotoPurpose = (typeof photoPurposes)[number];
/** What the server's upload route accepts (server/uploads/file-kinds.ts keeps the byte signatures). */
export const photoMediaTypes = ['image/jpeg', 'image/png', 'image/webp', 'application/pdf'] as const;
export type PhotoMediaType = (typeof photoMediaTypes)[number];
const correction = { supersedes: z.uuid().nullable().default(null), reason: z.string().max(500).nullable().default(null) };

export const recordFieldSchemas = {
  'control-reading': z.strictObject({
    reading: measurementSchema,
    takenAt: isoTime,
    instrumentId: z.string().min(1).max(64),
    ice: measurementSchema.nullable().default(null),
    air: measurementSchema.nullable().default(null),
    ...correction,
  }),
  'start-check': z.strictObject({
    run: z.number().int().min(1).max(20),
    bib: z.number().int().min(1).max(9999),
    /** An athlete may present more than one sled in a run (natural track); most present one. */
    sled: z.number().int().min(1).max(9).default(1),
    status: z.enum(['in-progress', 'cleared', 'referred', 'violation', 'withdrawn']),
    /** When the check began: from then on the sled is closed to preparation. */
    beganAt: isoTime,
    /** When the sled left the start; until then a cleared sled counts as waiting at the start. */
    startedAt: isoTime.nullable().default(null),
    /** The equipment checklist: each item of the rules' list confirmed present (true) or missing (false). */
    equipment: z.record(z.string().max(40), z.boolean()).nullable().default(null),
    /** The bib worn and readable (true), wrong or missing (false), not looked at yet (null). */
    bibConfirmed: z.boolean().nullable().default(null),
    /** Dimensions judged by eye (front-pin height), by dimension kind: looks right (true) or not (false). */
    byEye: z.record(z.string().max(40), z.boolean()).nullable().default(null),
    /** Artificial track: how far the feeler went into the joint between runner and steel, with which probe. */
    gapProbe: z
      .strictObject({ result: z.enum(gapProbeResults), instrumentId: z.string().min(1).max(64), takenAt: isoTime })
      .nullable()
      .default(null),
    note: z.string().max(2000).default(''),
  }),
  measurement: z.strictObject({
    checkId: z.uuid(),
    what: z.string().min(1).max(80),
    /** Where on the sled, when it matters (a steel temperature's steel and spot, e.g. "left:2"). */
    place: z.string().max(40).nullable().default(null),
    value: measurementSchema,
    takenAt: isoTime,
    instrumentId: z.string().min(1).max(64).nullable().default(null),
    ...correction,
  }),
  violation: z.strictObject({
    checkId: z.uuid(),
    rule: z.string().min(1).max(200),
    measured: z.string().max(200),
    /** The measurements the verdict was reached on, and the instrument that took them. */
    measurementIds: z.array(z.uuid()).max(20).default([]),
    instrumentId: z.string().min(1).max(64).nullable().default(null),
    note: z.string().max(2000).default(''),
    decision: z.enum(['pending', 'upheld', 'dismissed']).default('pending'),
  }),
  /**
   * An athlete's own check before the official one (a steel temperature on a natural track, a weight on
   * the spare scale on an artificial track): shown to the athlete, never counted as a violation.
   */
  'courtesy-reading': z.strictObject({
    bib: z.number().int().min(1).max(9999),
    what: z.enum(['steel temperature', 'athlete with sled']),
    value: measurementSchema,
    takenAt: isoTime,
    instrumentId: z.string().min(1).max(64).nullable().default(null),
    note: z.string().max(500).default(''),
    ...correction,
  }),
  /**
   * The scale proved with control weights of known mass, before weighing in a run: which scale, which
   * weights, their certified total and what the scale read. `checkId` names the check it was done in, if any.
   */
  'scale-proof': z.strictObject({
    run: z.number().int().min(1).max(20),
    scaleId: z.string().min(1).max(64),
    controlWeightIds: z.array(z.string().min(1).max(64)).min(1).max(20),
    knownWeight: measurementSchema,
    reading: measurementSchema,
    takenAt: isoTime,
    checkId: z.uuid().nullable().default(null),
    ...correction,
  }),
  /** The control steel mounting checklist before the first start; which items apply comes from the profile. */
  'control-steel-mounting': z.strictObject({
    height: measurementSchema.nullable().default(null),
    length: measurementSchema.nullable().default(null),
    inShade: z.boolean(),
    awayFromDrafts: z.boolean().nullable().default(null),
    mountedAt: isoTime,
    firstStartAt: isoTime,
    ...correction,
  }),
  /** A photo or certificate attached to a record; the file itself goes up separately, named by its SHA-256. */
  photo: z.strictObject({
    of: z.uuid(),
    sha256: z.string().regex(/^[0-9a-f]{64}$/, 'must be the 64-character fingerprint of the file'),
    purpose: z.enum(photoPurposes),
    mediaType: z.enum(photoMediaTypes),
    bytes: z.number().int().min(1),
    width: z.number().int().min(1).nullable().default(null),
    height: z.number().int().min(1).nullable().default(null),
    takenAt: isoTime,
    caption: z.string().max(500).default(''),
    ...correction,
  }),
  /**
   * The measuring official's signature under a log: exactly the readings signed (those on the device not
   * yet signed, corrections included) and the words shown when signing. The picture is a `photo` of it
   * with purpose 'signature'. A signed reading is no longer corrected on the device.
   */
  'log-signature': z.strictObject({
    log: z.literal('control-steel'),
    readingIds: z.array(z.uuid()).min(1).max(500),
    signedAt: isoTime,
    statement: z.string().min(1).max(1000),
  }),
} as const;

export type RecordKind = keyof typeof recordFieldSchemas;
export const recordKinds = Object.keys(recordFieldSchemas) as RecordKind[];
export const appendOnlyKinds: ReadonlySet<RecordKind> = new Set([
  'control-reading',
  'measurement',
  'courtesy-reading',
  'scale-proof',
  'control-steel-mounting',
  'photo',
  'log-signature',
]);

/** Records that must be unique: a second one is kept, but as a conflict for the area leader. */
export function naturalKey(kind: RecordKind, competitionId: string, fields: Record<string, unknown>): string | null {
  if (kind === 'start-check') return `start-check|${competitionId}|${String(fields['run'])}|${String(fields['bib'])}|${String(fields['sled'] ?? 1)}`;
  return null;
}
