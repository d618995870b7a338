import { z } from 'zod';
import { RulesInputError } from './rules-error';

/** Physical units; a measured value is always an integer number of tenths of its unit. */
export const measureUnits = ['celsius', 'kilogram', 'millimetre', 'centimetre', 'degree'] as const;
export type MeasureUnit = (typeof measureUnits)[number];

export const unitSymbols: Record<MeasureUnit, string> = {
  celsius: '°C',
  kilogram: 'kg',
  millimetre: 'mm',
  centimetre: 'cm',
  degree: '°',
};

export const measurementSchema = z.strictObject({
  tenths: z.number().int('Measured values are kept in whole tenths (one decimal).').safe(),
  unit: z.enum(measureUnits),
});
export type Measurement = z.infer<typeof measurementSchema>;

export const measurement = (tenths: number, unit: MeasureUnit): Measurement => ({ tenths, unit });

/** The value in tenths, or a clear error when it was measured in another unit or is not whole tenths. */
export function tenthsIn(value: Measurement | undefined, unit: MeasureUnit, what: string): number {
  if (value === undefined) {
    throw new RulesInputError('missing-value', `${what} is missing.`);
  }
  if (value.unit !== unit) {
    throw new RulesInputError('wrong-unit', `${what} must be in ${unitSymbols[unit]}, not ${unitSymbols[value.unit] ?? value.unit}.`);
  }
  if (!Number.isSafeInteger(value.tenths)) {
    throw new RulesInputError('invalid-input', `${what} must have at most one decimal (got ${value.tenths} tenths).`);
  }
  return value.tenths;
}

/** "−4.9 °C", "+1.0 °C" (signed units), "23.0 kg". Uses the true minus sign so it reads in glare. */
export function formatTenths(tenths: number, unit: MeasureUnit, options: { signed?: boolean } = {}): string {
  const signed = options.signed ?? unit === 'celsius';
  const magnitude = Math.abs(tenths);
  const text = `${Math.trunc(magnitude / 10)}.${magnitude % 10}`;
  const sign = tenths < 0 ? '−' : signed && tenths > 0 ? '+' : '';
  return `${sign}${text} ${unitSymbols[unit]}`;
}

/**
 * Reads what an official keyed ("-4.9", "−4,9", "+12", "23.0") as tenths. More than one decimal is
 * refused, so no value between two tenths can ever enter a record.
 */
export function parseTenths(text: string, unit: MeasureUnit): number {
  const normalised = text.trim().replace(/\s+/g, '').replace('−', '-').replace(',', '.');
  const match = /^([+-]?)(\d{1,5})(?:\.(\d))?$/.exec(normalised);
  if (!match) {
    throw new RulesInputError('invalid-input', `"${text}" is not a reading in ${unitSymbols[unit]} with at most one decimal.`);
  }
  const [, sign, whole, tenth] = match;
  const tenths = Number(whole) * 10 + Number(tenth ?? '0');
  return sign === '-' && tenths !== 0 ? -tenths : tenths;
}
