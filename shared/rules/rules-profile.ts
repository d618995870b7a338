import { z } from 'zod';
import { competitionLevels, trackTypes } from '../competition/competition';
import { profileValueSchema } from './profile-value';

export const disciplines = ['singles-women', 'singles-men', 'doubles'] as const;
export type Discipline = (typeof disciplines)[number];
export const disciplineLabels: Record<Discipline, string> = {
  'singles-women': 'Singles women',
  'singles-men': 'Singles men',
  doubles: 'Doubles',
};

const perDiscipline = z.strictObject({
  'singles-women': profileValueSchema,
  'singles-men': profileValueSchema,
  doubles: profileValueSchema,
});

/** Artificial track: permitted extra weight for athletes lighter than the reference body weight. */
const extraWeightSchema = z.strictObject({
  referenceBodyWeight: z.strictObject({ 'singles-women': profileValueSchema, 'singles-men': profileValueSchema }),
  /** Share of the shortfall below the reference that may be added, in percent. */
  shareOfShortfall: profileValueSchema,
  cap: perDiscipline,
  /** Doubles may add weight only when the pair together weighs less than this. */
  doublesPairReference: profileValueSchema,
});

const dimensionSchema = z.strictObject({
  kind: z.string().regex(/^[a-z0-9-]{2,40}$/, 'Use lower-case letters, digits and dashes.'),
  label: z.string().min(1).max(80),
  unit: z.enum(['millimetre', 'degree']),
  min: profileValueSchema.nullable(),
  max: profileValueSchema.nullable(),
  /** Part of the minimum set checked first at a natural-track start. */
  minimumCheck: z.boolean(),
  /** For values read on each steel (the steel angle): how many places per steel at least. */
  placesPerSteel: z.number().int().min(1).max(10).optional(),
  /** Judged by eye (front-pin height): recorded as a yes/no, no number. */
  byEye: z.boolean().default(false),
});
export type DimensionRule = z.infer<typeof dimensionSchema>;

const equipmentItemSchema = z.strictObject({
  id: z.string().regex(/^[a-z0-9-]{2,40}$/),
  label: z.string().min(1).max(80),
});
export type EquipmentItem = z.infer<typeof equipmentItemSchema>;

export const finishTiers = ['remeasure', 'detailed'] as const;
export type FinishTier = (typeof finishTiers)[number];
export const drawOutcomes = ['none', ...finishTiers] as const;
export type DrawOutcome = (typeof drawOutcomes)[number];

const finishPlanSchema = z.strictObject({
  /** Places always inspected, e.g. places 1 to 3 in the detailed tier. */
  always: z.array(
    z.strictObject({ fromPlace: z.number().int().min(1), toPlace: z.number().int().min(1), tier: z.enum(finishTiers) }),
  ),
  /** Relative weights of the draw's outcomes for every other finisher; whole numbers, no floats. */
  drawWeights: z.strictObject({ none: profileValueSchema, remeasure: profileValueSchema, detailed: profileValueSchema }),
  /** Tier for a sled flagged by the gap probe at the start. */
  gapProbeFollowUp: z.enum(finishTiers),
});
export type FinishPlan = z.infer<typeof finishPlanSchema>;

export const rulesProfileSchema = z.strictObject({
  id: z.string().regex(/^[a-z0-9-]{3,60}$/),
  name: z.string().min(1).max(120),
  trackType: z.enum(trackTypes),
  levels: z.array(z.enum(competitionLevels)).min(1),
  /** Which edition of the rulebook in force the organiser checked the values against, in their words. */
  rulebookNote: z.string().max(300),
  temperature: z.strictObject({ margin: profileValueSchema, floor: profileValueSchema }),
  controlSteel: z.strictObject({
    interval: profileValueSchema,
    /** How much later than due a control reading may still be used before verdicts stop. */
    grace: profileValueSchema,
    minHeight: profileValueSchema.nullable(),
    maxHeight: profileValueSchema.nullable(),
    minLength: profileValueSchema.nullable(),
    mountedBeforeFirstStart: profileValueSchema,
    inShade: z.boolean(),
    awayFromDrafts: z.boolean(),
    /** Ice and air temperature logged with every reading. */
    recordIceAndAir: z.boolean(),
  }),
  weights: z.strictObject({
    /** Natural track: the sled alone. Artificial track: the athlete carrying the sled. */
    weighing: z.enum(['sled-alone', 'athlete-with-sled']),
    sledMax: perDiscipline,
    extraWeight: extraWeightSchema.nullable(),
  }),
  scale: z.strictObject({
    controlWeightMin: profileValueSchema,
    controlWeightMinCount: profileValueSchema,
    /** Verification scale interval e of the scale in use. */
    division: profileValueSchema,
    /** Use in-service tolerances (twice those at initial verification). */
    inService: z.boolean(),
  }),
  dimensions: z.array(dimensionSchema),
  gapProbe: z.strictObject({ feeler: profileValueSchema }).nullable(),
  equipment: z.array(equipmentItemSchema).min(1),
  startArea: z.strictObject({ maxWaitingSleds: profileValueSchema }),
  finishPlan: finishPlanSchema,
});
export type RulesProfile = z.infer<typeof rulesProfileSchema>;
