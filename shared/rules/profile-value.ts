import { z } from 'zod';
import { measureUnits, formatTenths, type MeasureUnit } from './measurement';
import { RulesInputError } from './rules-error';

/** Where a profile value comes from; shown beside every verdict that used it. */
export const sourceKinds = ['trade-practice', 'secondary-published', 'from-memory', 'entered-by-organiser', 'demo-value'] as const;
export type SourceKind = (typeof sourceKinds)[number];

export const sourceKindLabels: Record<SourceKind, string> = {
  'trade-practice': 'trade practice, no published source',
  'secondary-published': 'secondary published sources',
  'from-memory': 'from memory',
  'entered-by-organiser': 'entered by the organiser',
  'demo-value': 'demo value, not a rule value',
};

export const valueSourceSchema = z.strictObject({
  kind: z.enum(sourceKinds),
  note: z.string().max(300).optional(),
  /** True only when the value is vouched for: agreed practice, agreeing published sources or the organiser. */
  verified: z.boolean(),
});
export type ValueSource = z.infer<typeof valueSourceSchema>;

/** Units of profile values: measured units hold tenths; the others are whole numbers. */
export const profileUnits = [...measureUnits, 'minutes', 'count', 'percent', 'gram'] as const;
export type ProfileUnit = (typeof profileUnits)[number];

export const profileValueSchema = z.strictObject({
  label: z.string().min(1).max(120),
  /** null = nobody could vouch for a value; the competition cannot open until it is filled in. */
  value: z.number().int().safe().nullable(),
  unit: z.enum(profileUnits),
  source: valueSourceSchema,
});
export type ProfileValue = z.infer<typeof profileValueSchema>;

/** A profile value as used by a verdict, so the delegate can show where each number came from. */
export interface UsedValue {
  path: string;
  label: string;
  value: number;
  unit: ProfileUnit;
  text: string;
  source: ValueSource;
}

const isMeasureUnit = (unit: ProfileUnit): unit is MeasureUnit => (measureUnits as readonly string[]).includes(unit);

export function formatProfileValue(value: number, unit: ProfileUnit): string {
  if (isMeasureUnit(unit)) return formatTenths(value, unit, { signed: unit === 'celsius' });
  const suffix: Record<Exclude<ProfileUnit, MeasureUnit>, string> = { minutes: ' min', count: '', percent: ' %', gram: ' g' };
  return `${value}${suffix[unit]}`;
}

/**
 * Reads a profile value for a verdict: its number, and a record of its use.
 * An unset value is a profile gap, never a default.
 */
export function useValue(used: UsedValue[], path: string, item: ProfileValue | undefined, unit: ProfileUnit): number {
  if (!item || item.value === null) {
    const label = item?.label ?? path;
    throw new RulesInputError('profile-gap', `The rules profile has no value for "${label}". The organiser must fill it in.`, [path]);
  }
  if (item.unit !== unit) {
    throw new RulesInputError('wrong-unit', `The profile value "${item.label}" is in ${item.unit}, expected ${unit}.`, [path]);
  }
  used.push({ path, label: item.label, value: item.value, unit, text: formatProfileValue(item.value, unit), source: item.source });
  return item.value;
}

/** Short-hands for writing shipped profiles. */
export const tradePractice = (note?: string): ValueSource => ({ kind: 'trade-practice', verified: true, ...(note ? { note } : {}) });
export const publishedAgreed = (note: string): ValueSource => ({ kind: 'secondary-published', verified: true, note });
export const publishedDisputed = (note: string): ValueSource => ({ kind: 'secondary-published', verified: false, note });
export const fromMemory = (note: string): ValueSource => ({ kind: 'from-memory', verified: false, note });
export const unsetSource = (note: string): ValueSource => ({ kind: 'entered-by-organiser', verified: false, note });

export const pv = (label: string, value: number | null, unit: ProfileUnit, source: ValueSource): ProfileValue => ({
  label,
  value,
  unit,
  source,
});
