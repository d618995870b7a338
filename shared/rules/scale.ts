import { formatTenths, tenthsIn, type Measurement } from './measurement';
import { useValue, type UsedValue } from './profile-value';
import { RulesInputError } from './rules-error';
import type { RulesProfile } from './rules-profile';
import { verdict, type Verdict, type VerdictNumber } from './verdict';
import { weightInTenths } from './weights';

const kg = (tenths: number): string => formatTenths(tenths, 'kilogram');
const plural = (count: number, one: string, many: string): string => `${count} ${count === 1 ? one : many}`;

/**
 * Every control weight at the scale must reach the minimum, and there must be enough of them
 * (natural track: one of at least 1 kg; artificial track: five of at least 20 kg each).
 */
export function judgeControlWeights(input: { profile: RulesProfile; weights: readonly Measurement[] }): Verdict {
  const weights = input.weights.map((weight, index) => weightInTenths(weight, `Control weight ${index + 1}`));
  const used: UsedValue[] = [];
  const min = useValue(used, 'scale.controlWeightMin', input.profile.scale.controlWeightMin, 'kilogram');
  const minCount = useValue(used, 'scale.controlWeightMinCount', input.profile.scale.controlWeightMinCount, 'count');

  const tooLight = weights.flatMap((tenths, index) => (tenths < min ? [`weight ${index + 1} (${kg(tenths)})`] : []));
  const heavyEnough = weights.length - tooLight.length;
  const missing = Math.max(0, minCount - heavyEnough);
  const numbers: VerdictNumber[] = [
    { label: `Control weights of at least ${kg(min)}`, text: `${heavyEnough} of at least ${minCount}` },
    ...(tooLight.length > 0 ? [{ label: 'Too light', text: tooLight.join(', ') }] : []),
    ...(missing > 0 ? [{ label: 'Missing', text: plural(missing, 'weight', 'weights') }] : []),
  ];
  if (tooLight.length === 0 && missing === 0) {
    const reason = `${plural(heavyEnough, 'control weight', 'control weights')} of at least ${kg(min)}: enough (at least ${minCount} needed).`;
    return verdict('control-weights', 'pass', reason, { numbers, used });
  }
  const problems = [
    ...(tooLight.length > 0 ? [`Too light (under ${kg(min)}): ${tooLight.join(', ')}.`] : []),
    ...(missing > 0 ? [`${plural(missing, 'more weight', 'more weights')} of at least ${kg(min)} needed (at least ${minCount} in all).`] : []),
  ];
  return verdict('control-weights', 'fail', problems.join(' '), { numbers, used });
}

/** "2.5 e" from a count of half divisions. */
const formatHalves = (halves: number, unit: string): string =>
  halves % 2 === 0 ? `${halves / 2} ${unit}` : `${(halves - 1) / 2}.5 ${unit}`;

/** "50.0 kg", "1.25 kg": grams written as kg with one to three decimals. */
function gramsAsKg(grams: number): string {
  const rest = grams % 1000;
  const decimals = String(rest).padStart(3, '0').replace(/0{1,2}$/, '');
  return `${(grams - rest) / 1000}.${decimals} kg`;
}

/** "+100 g", "−200 g", "0 g", with the true minus sign. */
const signedGrams = (grams: number): string => `${grams < 0 ? '−' : grams > 0 ? '+' : ''}${Math.abs(grams)} g`;

export interface ScaleTolerance {
  /** Verification scale interval e, in grams. */
  divisionGrams: number;
  loadGrams: number;
  /** Maximum permissible error as a whole number of half divisions (1 = ±0.5 e). */
  halfDivisions: number;
  /** "±50 g (±0.5 e)" */
  toleranceText: string;
  steps: string[];
  used: UsedValue[];
}

// Class III bands: loads up to 500 e, up to 2 000 e, up to 10 000 e (the most divisions a class III
// scale has), allowing ±0.5 e, ±1 e and ±1.5 e at initial verification.
const bands = [
  { upToDivisions: 500, limit: '500 e', halfDivisions: 1, words: 'at most 500 e' },
  { upToDivisions: 2000, limit: '2 000 e', halfDivisions: 2, words: 'above 500 e and at most 2 000 e' },
  { upToDivisions: 10000, limit: '10 000 e', halfDivisions: 3, words: 'above 2 000 e and at most 10 000 e' },
] as const;

/**
 * Maximum permissible error of a class III scale for a load, doubled in service. Kept in whole half
 * divisions so no fraction of a gram decides anything.
 */
export function scaleTolerance(input: { profile: RulesProfile; load: Measurement }): ScaleTolerance {
  const loadTenths = weightInTenths(input.load, 'Load on the scale');
  const used: UsedValue[] = [];
  const division = useValue(used, 'scale.division', input.profile.scale.division, 'gram');
  if (division <= 0) {
    throw new RulesInputError('invalid-input', `The scale interval e must be more than 0 g, not ${division} g.`, ['scale.division']);
  }
  const loadGrams = loadTenths * 100;
  const band = bands.find((b) => loadGrams <= b.upToDivisions * division);
  if (!band) {
    throw new RulesInputError(
      'invalid-input',
      `${kg(loadTenths)} is more than 10 000 e (${gramsAsKg(10000 * division)}) for e = ${division} g: beyond what a class III scale weighs.`,
    );
  }
  const isInService = input.profile.scale.inService;
  const halfDivisions = band.halfDivisions * (isInService ? 2 : 1);
  const toleranceText = `±${formatHalves(halfDivisions * division, 'g')} (±${formatHalves(halfDivisions, 'e')})`;
  const steps = [
    `Scale interval e = ${division} g`,
    `Load ${kg(loadTenths)} is ${band.words} (${band.limit} = ${gramsAsKg(band.upToDivisions * division)}): ±${formatHalves(band.halfDivisions, 'e')} at verification`,
    isInService ? `In service the tolerance is doubled: ${toleranceText}` : `At initial verification: ${toleranceText}`,
  ];
  return { divisionGrams: division, loadGrams, halfDivisions, toleranceText, steps, used };
}

/** A known (calibrated) weight on the scale: is the reading within the maximum permissible error? */
export function judgeScaleReading(input: { profile: RulesProfile; knownWeight: Measurement; reading: Measurement }): Verdict {
  const known = weightInTenths(input.knownWeight, 'Known weight');
  const reading = tenthsIn(input.reading, 'kilogram', 'Scale reading');
  if (reading < 0) throw new RulesInputError('invalid-input', `Scale reading cannot be below 0.0 kg (got ${kg(reading)}).`);
  const tolerance = scaleTolerance({ profile: input.profile, load: input.knownWeight });
  const errorGrams = (reading - known) * 100;
  // |error| ≤ halfDivisions × e / 2, doubled on both sides to stay in whole grams.
  const isWithin = 2 * Math.abs(errorGrams) <= tolerance.halfDivisions * tolerance.divisionGrams;
  const steps = [
    ...tolerance.steps,
    `Reading ${kg(reading)} − known weight ${kg(known)} = error ${signedGrams(errorGrams)}`,
    `Error ${Math.abs(errorGrams)} g ${isWithin ? 'is within' : 'is outside'} ${tolerance.toleranceText}`,
  ];
  const numbers: VerdictNumber[] = [
    { label: 'Known weight', text: kg(known) },
    { label: 'Scale reading', text: kg(reading) },
    { label: 'Error', text: signedGrams(errorGrams) },
    { label: 'Tolerance', text: tolerance.toleranceText },
  ];
  const parts = { numbers, steps, used: tolerance.used };
  const says = `The scale reads ${kg(reading)} for the ${kg(known)} weight: error ${signedGrams(errorGrams)}`;
  return isWithin
    ? verdict('scale-reading', 'pass', `${says}, within ${tolerance.toleranceText}.`, parts)
    : verdict(
        'scale-reading',
        'fail',
        `${says}, outside ${tolerance.toleranceText}. Do not weigh with this scale: tell the technical delegate.`,
        parts,
      );
}
