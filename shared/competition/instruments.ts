import { z } from 'zod';
import { RulesInputError } from '../rules/rules-error';

/** What an instrument is for; one instrument has one purpose (a control steel pyrometer never reads sleds). */
export const instrumentPurposes = [
  'control-steel-pyrometer',
  'sled-pyrometer',
  'scale',
  'control-weight',
  'gap-probe',
  'caliper',
  'steel-rule',
  'angle-gauge',
] as const;
export type InstrumentPurpose = (typeof instrumentPurposes)[number];

export const instrumentPurposeSchema = z.enum(instrumentPurposes, {
  error: 'choose what the instrument is for: a pyrometer, scale, control weight, gap probe, caliper, steel rule or angle gauge',
});

interface PurposeWords {
  /** With its article, as in "PYR-03 is a sled pyrometer". */
  aName: string;
  /** The job only an instrument of this purpose does. */
  job: string;
}

const purposeWords: Record<InstrumentPurpose, PurposeWords> = {
  'control-steel-pyrometer': { aName: 'a control steel pyrometer', job: 'the control steel is read with a control steel pyrometer' },
  'sled-pyrometer': { aName: 'a sled pyrometer', job: "a sled's steels are read with a sled pyrometer" },
  scale: { aName: 'a scale', job: 'weighing is done on a scale' },
  'control-weight': { aName: 'a control weight', job: 'a scale is proved with a control weight' },
  'gap-probe': { aName: 'a gap probe', job: 'the gap between runner and steel is checked with a gap probe' },
  caliper: { aName: 'a caliper', job: 'widths and thicknesses are measured with a caliper' },
  'steel-rule': { aName: 'a steel rule', job: 'lengths and heights are measured with a steel rule' },
  'angle-gauge': { aName: 'an angle gauge', job: 'the angle of the steels is measured with an angle gauge' },
};

/** "Control steel pyrometer", "Scale": for lists and pickers. */
export function instrumentPurposeLabel(purpose: InstrumentPurpose): string {
  const name = purposeWords[purpose].aName.replace(/^an? /, '');
  return name.charAt(0).toUpperCase() + name.slice(1);
}

/** One instrument of a competition, as the server keeps it and the device copies it. */
export const instrumentSchema = z.object({
  id: z.uuid(),
  /** What is written on it, e.g. "PYR-07". */
  label: z.string().trim().min(1, 'Enter what is written on the instrument, e.g. PYR-07.').max(40),
  purpose: instrumentPurposeSchema,
  /** The last day its calibration holds (inclusive). */
  calibratedUntil: z.iso.date('Enter the date as YYYY-MM-DD.'),
  /** The official who alone may use it; null while nobody has been issued it. */
  assignedTo: z.string().min(1).nullable(),
  /** A control weight's certified mass in tenths of a kg; null for every other instrument. */
  nominalMass: z.int('A certified mass is kept in whole tenths of a kg.').min(1).max(10000).nullable().default(null),
  /** The calibration certificate, kept as an upload under this SHA-256. */
  certificateSha256: z
    .string()
    .regex(/^[0-9a-f]{64}$/, 'A certificate is named by its SHA-256: 64 lower-case hex characters.')
    .nullable(),
});
export type Instrument = z.infer<typeof instrumentSchema>;

/** Who wants to use an instrument, for what, and on which local calendar day (YYYY-MM-DD). */
export interface InstrumentUse {
  userId: string;
  purpose: InstrumentPurpose;
  on: string;
}

const isoDay = /^\d{4}-\d{2}-\d{2}$/;

/**
 * Why `instrument` may not be used for this reading, in words an official can act on, or null when it
 * may. Checked in the order an official would fix it: the right kind of instrument, then a calibrated
 * one, then one issued to them.
 */
export function instrumentRefusal(
  instrument: Pick<Instrument, 'label' | 'purpose' | 'calibratedUntil' | 'assignedTo'>,
  use: InstrumentUse,
): string | null {
  if (!isoDay.test(use.on)) {
    throw new RulesInputError('invalid-input', `The day of use must be a date like 2027-01-09, not "${use.on}".`);
  }
  const { label } = instrument;
  if (instrument.purpose !== use.purpose) {
    return `${label} is ${purposeWords[instrument.purpose].aName}; ${purposeWords[use.purpose].job}.`;
  }
  // Both are YYYY-MM-DD, so comparing the text compares the days; the last calibrated day still counts.
  if (use.on > instrument.calibratedUntil) {
    return `${label} was calibrated until ${instrument.calibratedUntil}; use a calibrated instrument.`;
  }
  if (instrument.assignedTo === null) {
    return `${label} is not issued to any official yet; ask the area leader to assign it to you.`;
  }
  if (instrument.assignedTo !== use.userId) return `${label} is assigned to another official.`;
  return null;
}
