import { z } from 'zod';
import { formatTenths, tenthsIn, type Measurement } from './measurement';
import { useValue, type UsedValue } from './profile-value';
import { RulesInputError } from './rules-error';
import { disciplineLabels, disciplines, type Discipline, type RulesProfile } from './rules-profile';
import { verdict, type Verdict, type VerdictNumber } from './verdict';

const kg = (tenths: number): string => formatTenths(tenths, 'kilogram');
const sum = (values: readonly number[]): number => values.reduce((total, value) => total + value, 0);

/** A weighed mass in tenths of a kg; refuses other units and anything not above zero. */
export function weightInTenths(value: Measurement | undefined, what: string): number {
  const tenths = tenthsIn(value, 'kilogram', what);
  if (tenths <= 0) {
    throw new RulesInputError('invalid-input', `${what} must be more than 0.0 kg (got ${kg(tenths)}).`);
  }
  return tenths;
}

function checkedDiscipline(discipline: Discipline): Discipline {
  const parsed = z.enum(disciplines).safeParse(discipline);
  if (!parsed.success) {
    throw new RulesInputError('invalid-input', `Unknown discipline "${String(discipline)}": choose singles women, singles men or doubles.`);
  }
  return parsed.data;
}

function requireWeighing(profile: RulesProfile, weighing: RulesProfile['weights']['weighing']): void {
  if (profile.weights.weighing === weighing) return;
  const how = weighing === 'sled-alone' ? 'the sled on its own (natural track)' : 'the athlete carrying the sled (artificial track)';
  const actual = profile.weights.weighing === 'sled-alone' ? 'the sled on its own' : 'the athlete carrying the sled';
  throw new RulesInputError('wrong-track-type', `This check weighs ${how}, but the profile "${profile.name}" weighs ${actual}.`);
}

/** Numbers every weight verdict ends with: how far over, or how much room is left. */
function marginNumber(weighed: number, limit: number, what: string): VerdictNumber {
  return weighed > limit
    ? { label: `${what}: over the limit by`, text: kg(weighed - limit) }
    : { label: `${what}: room left`, text: kg(limit - weighed) };
}

/** Natural track: the sled is weighed on its own against its maximum. */
export function judgeSledWeight(input: { profile: RulesProfile; discipline: Discipline; sled: Measurement }): Verdict {
  const { profile } = input;
  requireWeighing(profile, 'sled-alone');
  const discipline = checkedDiscipline(input.discipline);
  const sled = weightInTenths(input.sled, 'Sled weight');
  const used: UsedValue[] = [];
  const max = useValue(used, `weights.sledMax.${discipline}`, profile.weights.sledMax[discipline], 'kilogram');
  const numbers = [
    { label: 'Sled', text: kg(sled) },
    { label: 'Sled maximum', text: kg(max) },
    marginNumber(sled, max, 'Sled'),
  ];
  return sled <= max
    ? verdict('sled-weight', 'pass', `Sled ${kg(sled)} is within the maximum of ${kg(max)}.`, { numbers, used })
    : verdict('sled-weight', 'fail', `Sled ${kg(sled)} is ${kg(sled - max)} over the maximum of ${kg(max)}.`, { numbers, used });
}

const athleteCount = (discipline: Discipline): number => (discipline === 'doubles' ? 2 : 1);

function officialBodyTenths(discipline: Discipline, weights: readonly Measurement[]): number[] {
  const expected = athleteCount(discipline);
  if (weights.length !== expected) {
    const needed = expected === 1 ? 'one official body weight' : 'two official body weights, one per athlete';
    throw new RulesInputError('invalid-input', `${disciplineLabels[discipline]} needs ${needed}; got ${weights.length}.`);
  }
  return weights.map((weight, index) =>
    weightInTenths(weight, expected === 1 ? 'Official body weight' : `Official body weight of athlete ${index + 1}`),
  );
}

/** "7.575 kg" from thousandths of a kg, to show a share before it is rounded. */
function formatThousandthsKg(thousandths: number): string {
  const rest = thousandths % 1000;
  return `${(thousandths - rest) / 1000}.${String(rest).padStart(3, '0')} kg`;
}

interface ExtraWeight {
  /** The athlete's official body weight, or the pair's combined one in doubles. */
  bodyTenths: number;
  shortfallTenths: number;
  extraTenths: number;
  steps: string[];
}

/**
 * Extra weight = min(cap, share % × max(0, reference − body weight)), rounded down to the tenth of
 * a kg. Doubles compare the pair's combined body weight with the pair reference.
 */
function permittedExtraWeight(profile: RulesProfile, discipline: Discipline, bodies: number[], used: UsedValue[]): ExtraWeight {
  const rules = profile.weights.extraWeight;
  if (!rules) {
    throw new RulesInputError(
      'profile-gap',
      `The rules profile "${profile.name}" has no extra-weight rule. The organiser must fill it in.`,
      ['weights.extraWeight'],
    );
  }
  const isDoubles = discipline === 'doubles';
  const body = sum(bodies);
  const steps = isDoubles ? [`Official body weights ${bodies.map(kg).join(' + ')} = pair weight ${kg(body)}`] : [];
  const reference =
    discipline === 'doubles'
      ? useValue(used, 'weights.extraWeight.doublesPairReference', rules.doublesPairReference, 'kilogram')
      : useValue(used, `weights.extraWeight.referenceBodyWeight.${discipline}`, rules.referenceBodyWeight[discipline], 'kilogram');
  const share = useValue(used, 'weights.extraWeight.shareOfShortfall', rules.shareOfShortfall, 'percent');
  if (share < 0 || share > 100) {
    throw new RulesInputError('invalid-input', `The share of the shortfall must be between 0 % and 100 %, not ${share} %.`, [
      'weights.extraWeight.shareOfShortfall',
    ]);
  }
  const cap = useValue(used, `weights.extraWeight.cap.${discipline}`, rules.cap[discipline], 'kilogram');
  const bodyWords = isDoubles ? 'pair weight' : 'official body weight';
  const referenceWords = isDoubles ? 'Pair reference weight' : 'Reference body weight';

  if (body >= reference) {
    steps.push(`The ${bodyWords} ${kg(body)} is not below the ${referenceWords.toLowerCase()} ${kg(reference)}: no extra weight`);
    return { bodyTenths: body, shortfallTenths: 0, extraTenths: 0, steps };
  }
  const shortfall = reference - body;
  steps.push(`${referenceWords} ${kg(reference)} − ${bodyWords} ${kg(body)} = shortfall ${kg(shortfall)}`);
  // tenths of a kg × percent = thousandths of a kg: whole numbers, rounded down to tenths by integer division.
  const thousandths = shortfall * share;
  const remainder = thousandths % 100;
  const uncapped = (thousandths - remainder) / 100;
  steps.push(
    remainder === 0
      ? `${share} % of the shortfall ${kg(shortfall)} = ${kg(uncapped)}`
      : `${share} % of the shortfall ${kg(shortfall)} = ${formatThousandthsKg(thousandths)}, rounded down to the tenth of a kg: ${kg(uncapped)}`,
  );
  const extra = Math.min(cap, uncapped);
  steps.push(
    uncapped > cap
      ? `That is more than the cap of ${kg(cap)}: permitted extra weight ${kg(extra)}`
      : `Within the cap of ${kg(cap)}: permitted extra weight ${kg(extra)}`,
  );
  return { bodyTenths: body, shortfallTenths: shortfall, extraTenths: extra, steps };
}

export interface PermittedUpperBound {
  boundTenths: number;
  bodyWeightTenths: number;
  sledMaxTenths: number;
  shortfallTenths: number;
  extraTenths: number;
  /** The working in plain words, one line per step. */
  steps: string[];
  used: UsedValue[];
}

/**
 * Artificial track: the most the athlete carrying the sled may weigh = official body weight(s) +
 * sled maximum + permitted extra weight.
 */
export function permittedUpperBound(input: {
  profile: RulesProfile;
  discipline: Discipline;
  officialBodyWeights: readonly Measurement[];
}): PermittedUpperBound {
  const { profile } = input;
  requireWeighing(profile, 'athlete-with-sled');
  const discipline = checkedDiscipline(input.discipline);
  const bodies = officialBodyTenths(discipline, input.officialBodyWeights);
  const used: UsedValue[] = [];
  const sledMax = useValue(used, `weights.sledMax.${discipline}`, profile.weights.sledMax[discipline], 'kilogram');
  const extra = permittedExtraWeight(profile, discipline, bodies, used);
  const bound = extra.bodyTenths + sledMax + extra.extraTenths;
  const bodyWords = discipline === 'doubles' ? 'Pair weight' : 'Official body weight';
  const steps = [
    ...extra.steps,
    `${bodyWords} ${kg(extra.bodyTenths)} + sled maximum ${kg(sledMax)} + extra weight ${kg(extra.extraTenths)} = upper bound ${kg(bound)}`,
  ];
  return {
    boundTenths: bound,
    bodyWeightTenths: extra.bodyTenths,
    sledMaxTenths: sledMax,
    shortfallTenths: extra.shortfallTenths,
    extraTenths: extra.extraTenths,
    steps,
    used,
  };
}

function readingsInTenths(discipline: Discipline, readings: readonly Measurement[], names: readonly [string, string]): number[] {
  const expected = athleteCount(discipline);
  if (readings.length !== expected) {
    const needed = expected === 1 ? `one reading (${names[0]})` : `two readings (${names[0]}, then ${names[1]})`;
    throw new RulesInputError('invalid-input', `${disciplineLabels[discipline]} needs ${needed}; got ${readings.length}.`);
  }
  return readings.map((reading, index) => weightInTenths(reading, names[index] ?? `Reading ${index + 1}`));
}

/**
 * Artificial track start: the athlete steps on the scale carrying the sled. In doubles the first
 * athlete carries the sled and the second is weighed without it; the two readings are added.
 */
export function judgeAthleteWithSled(input: {
  profile: RulesProfile;
  discipline: Discipline;
  officialBodyWeights: readonly Measurement[];
  readings: readonly Measurement[];
}): Verdict {
  const discipline = checkedDiscipline(input.discipline);
  const isDoubles = discipline === 'doubles';
  const names = isDoubles
    ? (['First athlete carrying the sled', 'Second athlete, without the sled'] as const)
    : (['Athlete carrying the sled', 'Second athlete'] as const);
  requireWeighing(input.profile, 'athlete-with-sled');
  const readings = readingsInTenths(discipline, input.readings, names);
  const bound = permittedUpperBound({ ...input, discipline });
  const total = sum(readings);
  const steps = [...bound.steps];
  if (isDoubles) steps.push(`${names[0]} ${kg(readings[0] ?? 0)} + ${names[1].toLowerCase()} ${kg(readings[1] ?? 0)} = ${kg(total)}`);
  const isWithin = total <= bound.boundTenths;
  steps.push(`On the scale ${kg(total)} ${isWithin ? '≤' : '>'} upper bound ${kg(bound.boundTenths)}`);
  const numbers: VerdictNumber[] = [
    ...readings.map((tenths, index) => ({ label: names[index] ?? `Reading ${index + 1}`, text: kg(tenths) })),
    ...(isDoubles ? [{ label: 'Both readings together', text: kg(total) }] : []),
    { label: 'Upper bound', text: kg(bound.boundTenths) },
    marginNumber(total, bound.boundTenths, 'On the scale'),
  ];
  const who = isDoubles ? 'The pair with the sled' : 'The athlete carrying the sled';
  const parts = { numbers, steps, used: bound.used };
  return isWithin
    ? verdict('athlete-with-sled-weight', 'pass', `${who} weighs ${kg(total)}, within the upper bound of ${kg(bound.boundTenths)}.`, parts)
    : verdict(
        'athlete-with-sled-weight',
        'fail',
        `${who} weighs ${kg(total)}: ${kg(total - bound.boundTenths)} over the upper bound of ${kg(bound.boundTenths)}.`,
        parts,
      );
}

/**
 * Artificial track re-measure check at the finish: athlete(s) and sled are weighed apart. The sled
 * must be within its maximum; the athlete(s) within official body weight + permitted extra weight.
 */
export function judgeFinishRemeasureWeight(input: {
  profile: RulesProfile;
  discipline: Discipline;
  officialBodyWeights: readonly Measurement[];
  athlete: readonly Measurement[];
  sled: Measurement;
}): Verdict {
  const { profile } = input;
  requireWeighing(profile, 'athlete-with-sled');
  const discipline = checkedDiscipline(input.discipline);
  const isDoubles = discipline === 'doubles';
  const names = isDoubles ? (['First athlete', 'Second athlete'] as const) : (['Athlete', 'Second athlete'] as const);
  const athletes = readingsInTenths(discipline, input.athlete, names);
  const sled = weightInTenths(input.sled, 'Sled weight');
  const bodies = officialBodyTenths(discipline, input.officialBodyWeights);

  const used: UsedValue[] = [];
  const sledMax = useValue(used, `weights.sledMax.${discipline}`, profile.weights.sledMax[discipline], 'kilogram');
  const extra = permittedExtraWeight(profile, discipline, bodies, used);
  const athleteLimit = extra.bodyTenths + extra.extraTenths;
  const athleteTotal = sum(athletes);
  const isSledWithin = sled <= sledMax;
  const isAthleteWithin = athleteTotal <= athleteLimit;
  const who = isDoubles ? 'Athletes' : 'Athlete';
  const bodyWords = isDoubles ? 'Pair weight' : 'Official body weight';

  const steps = [
    ...extra.steps,
    `${bodyWords} ${kg(extra.bodyTenths)} + extra weight ${kg(extra.extraTenths)} = athlete limit ${kg(athleteLimit)}`,
    ...(isDoubles ? [`${names[0]} ${kg(athletes[0] ?? 0)} + ${names[1].toLowerCase()} ${kg(athletes[1] ?? 0)} = ${kg(athleteTotal)}`] : []),
    `${who} ${kg(athleteTotal)} ${isAthleteWithin ? '≤' : '>'} athlete limit ${kg(athleteLimit)}`,
    `Sled ${kg(sled)} ${isSledWithin ? '≤' : '>'} sled maximum ${kg(sledMax)}`,
  ];
  const numbers: VerdictNumber[] = [
    { label: 'Sled', text: kg(sled) },
    { label: 'Sled maximum', text: kg(sledMax) },
    marginNumber(sled, sledMax, 'Sled'),
    ...athletes.map((tenths, index) => ({ label: isDoubles ? names[index] ?? who : who, text: kg(tenths) })),
    ...(isDoubles ? [{ label: 'Athletes together', text: kg(athleteTotal) }] : []),
    { label: 'Athlete limit (body weight + extra weight)', text: kg(athleteLimit) },
    marginNumber(athleteTotal, athleteLimit, who),
  ];
  const parts = { numbers, steps, used };
  if (isSledWithin && isAthleteWithin) {
    const reason = `Sled ${kg(sled)} and ${who.toLowerCase()} ${kg(athleteTotal)} are both within their limits.`;
    return verdict('finish-remeasure-weight', 'pass', reason, parts);
  }
  const problems = [
    ...(isSledWithin ? [] : [`Sled ${kg(sled)} is ${kg(sled - sledMax)} over the maximum of ${kg(sledMax)}.`]),
    ...(isAthleteWithin
      ? []
      : [`${who} ${kg(athleteTotal)} ${isDoubles ? 'are' : 'is'} ${kg(athleteTotal - athleteLimit)} over the limit of ${kg(athleteLimit)} (body weight + permitted extra weight).`]),
  ];
  return verdict('finish-remeasure-weight', 'fail', problems.join(' '), parts);
}
