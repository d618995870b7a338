import { z } from 'zod';
import { formatTenths, measurementSchema, tenthsIn, type Measurement } from './measurement';
import { useValue, type UsedValue } from './profile-value';
import { RulesInputError } from './rules-error';
import { rulesProfileSchema, type DimensionRule, type RulesProfile } from './rules-profile';
import { verdict, type Verdict, type VerdictNumber } from './verdict';

export const steels = ['left', 'right'] as const;
export type Steel = (typeof steels)[number];

const plainReadingsSchema = z.array(measurementSchema);
const steelReadingsSchema = z.array(z.strictObject({ steel: z.enum(steels), value: measurementSchema }));
const byEyeReadingSchema = z.strictObject({ acceptable: z.boolean() });

/** A value read on one steel (the steel angle), at one place. */
export type SteelReading = z.infer<typeof steelReadingsSchema>[number];
/** A dimension judged by eye (front-pin height): looks right or not. */
export type ByEyeReading = z.infer<typeof byEyeReadingSchema>;
export type DimensionReadings = Measurement[] | SteelReading[] | ByEyeReading;

export interface DimensionInput {
  profile: RulesProfile;
  kind: string;
  readings: DimensionReadings;
}

const dimensionRuleSchema = rulesProfileSchema.shape.dimensions.element;
/** A dimension rule as written by an organiser; `byEye` may be left out (false). */
export type NewDimensionRule = z.input<typeof dimensionRuleSchema>;

/** The profile's dimension rules in working order: the minimum checks first, then the rest. */
export function dimensionChecklist(profile: RulesProfile): DimensionRule[] {
  return [...profile.dimensions.filter((rule) => rule.minimumCheck), ...profile.dimensions.filter((rule) => !rule.minimumCheck)];
}

/** A copy of the profile with one more dimension rule at the end of its list. */
export function withDimension(profile: RulesProfile, rule: NewDimensionRule): RulesProfile {
  const parsed = parseInput(dimensionRuleSchema, rule, 'The dimension rule is not valid.');
  if (profile.dimensions.some((existing) => existing.kind === parsed.kind)) {
    throw new RulesInputError('invalid-input', `The profile already has a dimension "${parsed.kind}": change that one instead.`, [parsed.kind]);
  }
  if (parsed.byEye && (parsed.min !== null || parsed.max !== null || parsed.placesPerSteel !== undefined)) {
    throw new RulesInputError('invalid-input', `${parsed.label} is judged by eye: it takes no minimum, maximum or places per steel.`, [parsed.kind]);
  }
  if (!parsed.byEye && parsed.min === null && parsed.max === null) {
    throw new RulesInputError('invalid-input', `${parsed.label} needs a minimum or a maximum (leave the value unset for the organiser to fill in).`, [parsed.kind]);
  }
  const copy = structuredClone(profile);
  copy.dimensions.push(parsed);
  return copy;
}

/** One sled dimension against the profile's limits, or by eye where the profile says so. */
export function judgeDimension({ profile, kind, readings }: DimensionInput): Verdict {
  const rule = profile.dimensions.find((candidate) => candidate.kind === kind);
  if (!rule) {
    const known = profile.dimensions.map((candidate) => candidate.kind);
    throw new RulesInputError('invalid-input', `This rules profile has no dimension "${kind}".`, known);
  }
  if (rule.byEye) return judgeByEye(rule, readings);

  const used: UsedValue[] = [];
  const bounds = readBounds(rule, used);
  const placed = rule.placesPerSteel === undefined ? plainPlaces(rule, readings) : steelPlaces(rule, rule.placesPerSteel, readings);
  const format = (tenths: number) => formatTenths(tenths, rule.unit);

  const failures = placed.flatMap(({ place, tenths }) => {
    const where = place ? `${place}: ` : '';
    if (bounds.min !== null && tenths < bounds.min) return [`${where}${format(tenths)} is below the minimum ${format(bounds.min)}`];
    if (bounds.max !== null && tenths > bounds.max) return [`${where}${format(tenths)} is above the maximum ${format(bounds.max)}`];
    return [];
  });

  const numbers: VerdictNumber[] = [
    ...placed.map(({ place, tenths }) => ({ label: place ? capitalise(place) : rule.label, text: format(tenths) })),
    ...(bounds.min === null ? [] : [{ label: 'Minimum', text: format(bounds.min) }]),
    ...(bounds.max === null ? [] : [{ label: 'Maximum', text: format(bounds.max) }]),
  ];
  const range = rangeText(bounds, format);
  if (failures.length > 0) {
    return verdict('dimension', 'fail', `${rule.label} outside the limits (${range}): ${failures.join('; ')}.`, { numbers, used });
  }
  const where = placed.length === 1 ? '' : ` at all ${placed.length} places`;
  return verdict('dimension', 'pass', `${rule.label} within the limits (${range})${where}.`, { numbers, used });
}

interface Bounds {
  min: number | null;
  max: number | null;
}

interface PlacedReading {
  /** Where it was read, e.g. "left steel, place 2"; empty for a single reading. */
  place: string;
  tenths: number;
}

function readBounds(rule: DimensionRule, used: UsedValue[]): Bounds {
  const min = rule.min === null ? null : useValue(used, `dimensions.${rule.kind}.min`, rule.min, rule.unit);
  const max = rule.max === null ? null : useValue(used, `dimensions.${rule.kind}.max`, rule.max, rule.unit);
  if (min === null && max === null) {
    // A number with nothing to compare it to would pass every sled: refuse rather than wave it through.
    throw new RulesInputError('profile-gap', `The rules profile gives ${rule.label} neither a minimum nor a maximum. The organiser must fill one in.`, [
      `dimensions.${rule.kind}`,
    ]);
  }
  if (min !== null && max !== null && min > max) {
    throw new RulesInputError('invalid-input', `The rules profile gives ${rule.label} a minimum above its maximum. The organiser must correct it.`, [
      `dimensions.${rule.kind}`,
    ]);
  }
  return { min, max };
}

function plainPlaces(rule: DimensionRule, readings: unknown): PlacedReading[] {
  const parsed = parseInput(plainReadingsSchema, readings, `${rule.label} takes measured values (a number with its unit).`);
  if (parsed.length === 0) throw new RulesInputError('missing-value', `${rule.label}: no reading entered.`, [rule.kind]);
  return parsed.map((value, index) => {
    const place = parsed.length === 1 ? '' : `reading ${index + 1}`;
    return { place, tenths: tenthsIn(value, rule.unit, place ? `${rule.label}, ${place}` : rule.label) };
  });
}

function steelPlaces(rule: DimensionRule, placesPerSteel: number, readings: unknown): PlacedReading[] {
  const parsed = parseInput(steelReadingsSchema, readings, `${rule.label} is read on each steel: give every reading with its steel (left or right).`);
  const shortfalls = steels
    .map((steel) => ({ steel, more: placesPerSteel - parsed.filter((reading) => reading.steel === steel).length }))
    .filter(({ more }) => more > 0);
  if (shortfalls.length > 0) {
    const missing = shortfalls.map(({ steel, more }) => `${more} more on the ${steel} steel`);
    throw new RulesInputError('invalid-input', `${rule.label} is read at ${placesPerSteel} places per steel at least: measure ${missing.join(' and ')}.`, missing);
  }
  const countSoFar: Record<Steel, number> = { left: 0, right: 0 };
  return parsed.map(({ steel, value }) => {
    countSoFar[steel] += 1;
    const place = `${steel} steel, place ${countSoFar[steel]}`;
    return { place, tenths: tenthsIn(value, rule.unit, `${rule.label}, ${place}`) };
  });
}

function judgeByEye(rule: DimensionRule, readings: unknown): Verdict {
  const { acceptable } = parseInput(byEyeReadingSchema, readings, `${rule.label} is judged by eye: record whether it looks acceptable.`);
  const numbers = [{ label: `${rule.label} (by eye)`, text: acceptable ? 'acceptable' : 'not acceptable' }];
  return acceptable
    ? verdict('dimension', 'pass', `${rule.label} looks acceptable (checked by eye).`, { numbers })
    : verdict('dimension', 'fail', `${rule.label} does not look acceptable (checked by eye): report it to the technical delegate.`, { numbers });
}

function rangeText({ min, max }: Bounds, format: (tenths: number) => string): string {
  const atLeast = min === null ? '' : format(min);
  const atMost = max === null ? '' : format(max);
  if (atLeast && atMost) return `${atLeast} to ${atMost}`;
  return atLeast ? `at least ${atLeast}` : `at most ${atMost}`;
}

const capitalise = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);

function parseInput<T>(schema: z.ZodType<T>, input: unknown, message: string): T {
  const result = schema.safeParse(input);
  if (!result.success) {
    throw new RulesInputError('invalid-input', message, result.error.issues.map((issue) => `${issue.path.join('.') || 'input'}: ${issue.message}`));
  }
  return result.data;
}
