import { z } from 'zod';
import { instrumentRefusal, type Instrument } from '../../../../shared/competition/instruments';
import { keep, readKept } from '../../auth/local-json';

const chosenKey = 'rimelog.start-check.sled-pyrometer';

/** A pyrometer the official may read steels with now. */
export interface UsablePyrometer {
  id: string;
  label: string;
  calibratedUntil: string;
}

/** One they may not use, with the reason in words (it names the instrument). */
export interface RefusedPyrometer {
  id: string;
  label: string;
  refusal: string;
}

export interface PyrometerChoices {
  usable: UsablePyrometer[];
  refused: RefusedPyrometer[];
}

/**
 * The pyrometers to offer for steel readings: every sled pyrometer of the competition and every pyrometer
 * issued to this official (a control steel pyrometer in the pocket is the likely mix-up). Those the
 * official may not use are listed with the reason, never offered.
 */
export function pyrometerChoices(instruments: readonly Instrument[], userId: string | null, on: string): PyrometerChoices {
  const choices: PyrometerChoices = { usable: [], refused: [] };
  if (userId === null) return choices;
  for (const instrument of instruments) {
    const mine = instrument.assignedTo === userId;
    if (instrument.purpose !== 'sled-pyrometer' && !(mine && instrument.purpose === 'control-steel-pyrometer')) continue;
    const refusal = instrumentRefusal(instrument, { userId, purpose: 'sled-pyrometer', on });
    if (refusal === null) choices.usable.push({ id: instrument.id, label: instrument.label, calibratedUntil: instrument.calibratedUntil });
    else choices.refused.push({ id: instrument.id, label: instrument.label, refusal });
  }
  return choices;
}

/** The local calendar day (YYYY-MM-DD) of a time: calibration holds to the end of its last day where the official is. */
export function localDay(ms: number): string {
  const day = new Date(ms);
  const two = (n: number) => String(n).padStart(2, '0');
  return `${day.getFullYear()}-${two(day.getMonth() + 1)}-${two(day.getDate())}`;
}

/** The sled pyrometer last chosen on this device (its id), or null. */
export function readChosenPyrometer(): string | null {
  return readKept(chosenKey, z.string().min(1).max(64));
}

export function keepChosenPyrometer(id: string): void {
  keep(chosenKey, id);
}
