import { z } from 'zod';
import { instrumentRefusal, type Instrument, type InstrumentPurpose } from '../../../../shared/competition/instruments';
import { keep, readKept } from '../../auth/local-json';

/** An instrument the official may take this reading with now. */
export interface UsableInstrument {
  id: string;
  label: string;
  calibratedUntil: string;
  /** A control weight's certified mass in tenths of a kg. */
  nominalMass: number | null;
}

/** One they may not use, with the reason in words (it names the instrument). */
export interface RefusedInstrument {
  id: string;
  label: string;
  refusal: string;
}

export interface InstrumentChoices {
  usable: UsableInstrument[];
  refused: RefusedInstrument[];
}

export const noInstrumentChoices: InstrumentChoices = { usable: [], refused: [] };

/** An instrument of these purposes in the official's own pocket is the likely mix-up, so it is listed with why not. */
const lookAlikes: Partial<Record<InstrumentPurpose, InstrumentPurpose[]>> = {
  'sled-pyrometer': ['control-steel-pyrometer'],
  'control-steel-pyrometer': ['sled-pyrometer'],
};

/**
 * The instruments to offer for a reading of `purposes` (a dimension in millimetres may be taken with a
 * caliper or a steel rule): every instrument of those purposes in the competition, and any look-alike issued
 * to this official. Those the official may not use are listed with the reason, never offered.
 */
export function instrumentChoices(
  instruments: readonly Instrument[],
  userId: string | null,
  purposes: readonly InstrumentPurpose[],
  on: string,
): InstrumentChoices {
  const choices: InstrumentChoices = { usable: [], refused: [] };
  if (userId === null) return choices;
  const mixUps = new Set(purposes.flatMap((purpose) => lookAlikes[purpose] ?? []));
  for (const instrument of instruments) {
    const wanted = purposes.includes(instrument.purpose);
    if (!wanted && !(instrument.assignedTo === userId && mixUps.has(instrument.purpose))) continue;
    const purpose = wanted ? instrument.purpose : purposes[0]!;
    const refusal = instrumentRefusal(instrument, { userId, purpose, on });
    if (refusal === null) {
      choices.usable.push({ id: instrument.id, label: instrument.label, calibratedUntil: instrument.calibratedUntil, nominalMass: instrument.nominalMass });
    } else {
      choices.refused.push({ id: instrument.id, label: instrument.label, refusal });
    }
  }
  return choices;
}

/** The sled pyrometers to offer for steel readings. */
export const pyrometerChoices = (instruments: readonly Instrument[], userId: string | null, on: string): InstrumentChoices =>
  instrumentChoices(instruments, userId, ['sled-pyrometer'], on);

/** The local calendar day (YYYY-MM-DD) of a time: calibration holds to the end of its last day where the official is. */
export function localDay(ms: number): string {
  const day = new Date(ms);
  const two = (n: number) => String(n).padStart(2, '0');
  return `${day.getFullYear()}-${two(day.getMonth() + 1)}-${two(day.getDate())}`;
}

const chosenKey = (purpose: InstrumentPurpose) => `rimelog.start-check.${purpose}`;

/** The instrument of this purpose last chosen on this device (its id), or null. */
export function readChosenInstrument(purpose: InstrumentPurpose): string | null {
  return readKept(chosenKey(purpose), z.string().min(1).max(64));
}

export function keepChosenInstrument(purpose: InstrumentPurpose, id: string): void {
  keep(chosenKey(purpose), id);
}
