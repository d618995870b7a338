import { formatTenths, measureUnits, parseTenths, unitSymbols, type MeasureUnit } from '../../../../shared/rules/measurement';

/**
 * What an official has keyed so far. The parts stay text so a partial entry ("−", "4.") can be shown
 * and finished; the value leaves the keypad as whole tenths, read by the shared `parseTenths`.
 */
export interface KeypadEntry {
  readonly isNegative: boolean;
  /** Digits before the point; '' while none is keyed. */
  readonly whole: string;
  readonly hasPoint: boolean;
  /** The one digit after the point; '' while none is keyed. */
  readonly tenth: string;
}

export const emptyEntry: KeypadEntry = { isNegative: false, whole: '', hasPoint: false, tenth: '' };

export const digitKeys = ['1', '2', '3', '4', '5', '6', '7', '8', '9', '0'] as const;
export type DigitKey = (typeof digitKeys)[number];
export type KeypadKey = DigitKey | '.' | '±' | 'backspace' | 'clear';

/** The unit as the product names it ('celsius') or as the official reads it ('°C'). */
export type KeypadUnit = MeasureUnit | '°C' | 'kg' | 'mm' | 'cm' | '°';

/** Lowest and highest allowed value in tenths; null = no limit on that side. */
export interface KeypadRange {
  readonly minTenths: number | null;
  readonly maxTenths: number | null;
}

/** The most digits before the point that `parseTenths` reads. */
export const maxWholeDigits = 5;
const largestMagnitude = 10 ** maxWholeDigits * 10 - 1;

export function measureUnitOf(unit: KeypadUnit): MeasureUnit {
  const found = measureUnits.find((known) => known === unit || unitSymbols[known] === unit);
  if (!found) throw new Error(`Unknown keypad unit "${unit}".`);
  return found;
}

/** "−3.4", "12.", "−"; '' when nothing is keyed. Uses the true minus sign so it reads in glare. */
export function entryText(entry: KeypadEntry): string {
  return `${entry.isNegative ? '−' : ''}${entry.whole}${entry.hasPoint ? '.' : ''}${entry.tenth}`;
}

export function entryFromTenths(tenths: number | null): KeypadEntry {
  if (tenths === null || !Number.isSafeInteger(tenths)) return emptyEntry;
  const magnitude = Math.abs(tenths);
  return { isNegative: tenths < 0, whole: String(Math.trunc(magnitude / 10)), hasPoint: true, tenth: String(magnitude % 10) };
}

/** The value in whole tenths, or null while no digit is keyed. "4." counts as 4.0. */
export function entryTenths(entry: KeypadEntry, unit: KeypadUnit): number | null {
  if (entry.whole === '' && entry.tenth === '') return null;
  const text = `${entry.isNegative ? '-' : ''}${entry.whole || '0'}.${entry.tenth || '0'}`;
  return parseTenths(text, measureUnitOf(unit));
}

export interface KeyResult {
  readonly entry: KeypadEntry;
  /** Why the key did nothing, in words; null when it was taken. */
  readonly refusal: string | null;
}

const taken = (entry: KeypadEntry): KeyResult => ({ entry, refusal: null });
const refused = (entry: KeypadEntry, refusal: string): KeyResult => ({ entry, refusal });

export function pressKey(entry: KeypadEntry, key: KeypadKey, allowNegative: boolean): KeyResult {
  switch (key) {
    case 'clear':
      return taken(emptyEntry);
    case 'backspace':
      return taken(withoutLastKey(entry));
    case '±':
      if (!allowNegative) return refused(entry, 'Negative values are not used here.');
      return taken({ ...entry, isNegative: !entry.isNegative });
    case '.':
      if (entry.hasPoint) return refused(entry, 'One decimal point only: it is already in.');
      return taken({ ...entry, whole: entry.whole || '0', hasPoint: true });
    default:
      return pressDigit(entry, key);
  }
}

function pressDigit(entry: KeypadEntry, digit: DigitKey): KeyResult {
  if (entry.hasPoint) {
    if (entry.tenth !== '') return refused(entry, 'One decimal only: press ⌫ to change the last digit.');
    return taken({ ...entry, tenth: digit });
  }
  if (entry.whole === '0') return taken({ ...entry, whole: digit });
  if (entry.whole.length >= maxWholeDigits) return refused(entry, `At most ${maxWholeDigits} digits before the point.`);
  return taken({ ...entry, whole: entry.whole + digit });
}

function withoutLastKey(entry: KeypadEntry): KeypadEntry {
  if (entry.tenth !== '') return { ...entry, tenth: '' };
  if (entry.hasPoint) return { ...entry, hasPoint: false };
  if (entry.whole !== '') return { ...entry, whole: entry.whole.slice(0, -1) };
  return emptyEntry;
}

export type TypedReading = { readonly entry: KeypadEntry; readonly problem: null } | { readonly entry: null; readonly problem: string };

/**
 * Reads what was typed in the text fallback ("-3.4", "−3,4", "+12", "4."), partial entries included,
 * with the same limits as the keys.
 */
export function readTypedEntry(text: string, allowNegative: boolean): TypedReading {
  // Phones' autocorrect turns a hyphen into a dash; a comma is the decimal mark in much of Europe.
  const normalised = text.replace(/\s+/g, '').replace(/[−–]/g, '-').replace(/,/g, '.');
  const problem = (message: string): TypedReading => ({ entry: null, problem: message });
  if (/[^0-9.+-]/.test(normalised)) {
    return problem(`"${text.trim()}" is not a number: use digits, one decimal point${allowNegative ? ' and a minus sign' : ''}.`);
  }
  if (!/^[+-]?[0-9.]*$/.test(normalised)) return problem('Put the minus sign first, and only once.');
  const [signed = '', ...afterPoints] = normalised.split('.');
  if (afterPoints.length > 1) return problem(`One decimal point only: "${text.trim()}" has ${afterPoints.length}.`);
  const tenth = afterPoints[0] ?? '';
  if (tenth.length > 1) return problem(`One decimal only: "${text.trim()}" has ${tenth.length} digits after the point.`);
  const isNegative = signed.startsWith('-');
  if (isNegative && !allowNegative) return problem('Negative values are not used here.');
  const digits = signed.replace(/^[+-]/, '');
  const whole = digits.replace(/^0+(?=\d)/, '');
  if (whole.length > maxWholeDigits) return problem(`At most ${maxWholeDigits} digits before the point.`);
  const hasPoint = afterPoints.length === 1;
  return { entry: { isNegative, whole: whole === '' && hasPoint ? '0' : whole, hasPoint, tenth }, problem: null };
}

/** "From −20.0 °C to +5.0 °C", or null when there is no limit. */
export function describeRange(range: KeypadRange, unit: KeypadUnit): string | null {
  const { minTenths: min, maxTenths: max } = range;
  const format = (tenths: number) => formatTenths(tenths, measureUnitOf(unit));
  if (min !== null && max !== null) return `From ${format(min)} to ${format(max)}`;
  if (min !== null) return `At least ${format(min)}`;
  if (max !== null) return `At most ${format(max)}`;
  return null;
}

/**
 * The range problem to show while the official is still keying: only when no further digit could
 * bring the entry into range ("12" when at most 5.0 is allowed). "1" when at least 10.0 is allowed
 * could still become valid, and a lone "−" is no number yet, so neither is an error yet.
 */
export function rangeProblemWhileTyping(entry: KeypadEntry, range: KeypadRange, unit: KeypadUnit): string | null {
  if (entryTenths(entry, unit) === null) return null;
  const min = range.minTenths ?? -Infinity;
  const max = range.maxTenths ?? Infinity;
  const spans = reachableSpans(entry);
  if (spans.some(([low, high]) => high >= min && low <= max)) return null;
  if (spans.every(([, high]) => high < min)) return tooLow(range, unit);
  if (spans.every(([low]) => low > max)) return tooHigh(range, unit);
  return (entryTenths(entry, unit) ?? 0) < min ? tooLow(range, unit) : tooHigh(range, unit);
}

export type Commit = { readonly tenths: number; readonly problem: null } | { readonly tenths: null; readonly problem: string };

/** What OK does: the value in tenths when it is complete and in range, else why not. */
export function commitEntry(entry: KeypadEntry, range: KeypadRange, unit: KeypadUnit): Commit {
  const tenths = entryTenths(entry, unit);
  if (tenths === null) return { tenths: null, problem: 'Key in a value first, then press OK.' };
  if (range.minTenths !== null && tenths < range.minTenths) return { tenths: null, problem: tooLow(range, unit) };
  if (range.maxTenths !== null && tenths > range.maxTenths) return { tenths: null, problem: tooHigh(range, unit) };
  return { tenths, problem: null };
}

const tooLow = (range: KeypadRange, unit: KeypadUnit) =>
  `Too low: below the lowest allowed, at least ${formatTenths(range.minTenths ?? 0, measureUnitOf(unit))} here.`;
const tooHigh = (range: KeypadRange, unit: KeypadUnit) =>
  `Too high: above the highest allowed, at most ${formatTenths(range.maxTenths ?? 0, measureUnitOf(unit))} here.`;

/**
 * Every value, in tenths, the entry could still become by keying more digits (a change of sign
 * does not count): one span per number of digits still to come.
 */
function reachableSpans(entry: KeypadEntry): (readonly [number, number])[] {
  const whole = Number(entry.whole || '0');
  let magnitudes: [number, number][];
  if (entry.tenth !== '') {
    magnitudes = [[whole * 10 + Number(entry.tenth), whole * 10 + Number(entry.tenth)]];
  } else if (entry.hasPoint) {
    magnitudes = [[whole * 10, whole * 10 + 9]];
  } else if (whole === 0) {
    // A lone 0, which the next digit replaces: anything can follow.
    magnitudes = [[0, largestMagnitude]];
  } else {
    magnitudes = [];
    for (let more = 0; more <= maxWholeDigits - entry.whole.length; more++) {
      const scale = 10 ** more;
      magnitudes.push([whole * scale * 10, ((whole + 1) * scale - 1) * 10 + 9]);
    }
  }
  return entry.isNegative ? magnitudes.map(([low, high]) => [-high, -low] as const) : magnitudes;
}
