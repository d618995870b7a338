import type { CompetitionLevel, TrackType } from '../competition/competition';
import { publishedAgreed, publishedDisputed, pv, tradePractice, unsetSource, type ProfileValue } from './profile-value';
import type { DimensionRule, EquipmentItem, RulesProfile } from './rules-profile';

// The values shipped with Rimelog. Every one names its kind of source; a value nobody can vouch for
// ships unset (null) and the competition cannot open until the organiser fills it in. The rulebook
// in force always wins: organisers edit these, and each competition freezes its own copy.

const unset = (label: string, unit: ProfileValue['unit'], note = 'No agreed published value: enter it from the rulebook in force.') =>
  pv(label, null, unit, unsetSource(note));

const graceNote = 'How late a control reading may be and still be used: the organiser and technical delegate decide.';
const finishNote = 'Set from the finish-inspection table of the rulebook in force for this type of race.';

function naturalDimension(kind: string, label: string, unit: DimensionRule['unit'], minimumCheck: boolean): DimensionRule {
  const byEye = kind === 'front-pin-height';
  return {
    kind,
    label,
    unit,
    // Judged by eye: no numbers to fill in.
    min: byEye ? null : unset(`${label}, minimum`, unit),
    max: byEye ? null : unset(`${label}, maximum`, unit),
    minimumCheck,
    ...(kind === 'steel-angle' ? { placesPerSteel: 2 } : {}),
    byEye,
  };
}

// The minimum set first, in the order officials work (trade practice), then the rest.
const naturalDimensions = (): DimensionRule[] => [
  naturalDimension('handguard-height', 'Handguard height', 'millimetre', true),
  naturalDimension('handguard-width', 'Handguard width', 'millimetre', true),
  naturalDimension('full-width', 'Full width', 'millimetre', true),
  naturalDimension('steel-angle', 'Steel angle', 'degree', true),
  naturalDimension('steel-distance', 'Distance between the steels', 'millimetre', false),
  naturalDimension('runner-spacing', 'Runner spacing', 'millimetre', false),
  naturalDimension('bridge-thickness', 'Bridge thickness', 'millimetre', false),
  naturalDimension('front-pin-height', 'Front-pin height', 'millimetre', false),
  naturalDimension('overall-height', 'Overall height', 'millimetre', false),
];

const naturalEquipment: EquipmentItem[] = [
  { id: 'gloves', label: 'Gloves' },
  { id: 'helmet', label: 'Helmet' },
  { id: 'braking-shoes', label: 'Braking shoes' },
  { id: 'ankle-braces', label: 'Ankle braces' },
  { id: 'attachment-releases', label: 'Any attachment to the sled releases by itself in a crash' },
  { id: 'bib-fixed', label: 'Start-number bib fixed' },
];

const artificialEquipment: EquipmentItem[] = [
  { id: 'race-equipment', label: 'Race equipment' },
  { id: 'bib-fixed', label: 'Start-number bib fixed' },
];

// Values both track types share (trade practice), and the ones both leave to the organiser.
const rulebookNote = 'Check every value against the rulebook in force before opening the competition.';
const steelMargin = () => pv('Steel may be warmer than the control steel by at most', 50, 'celsius', tradePractice());
const controlInterval = () => pv('Control steel reading every', 15, 'minutes', tradePractice());
const controlGrace = () => unset('Control reading still usable after it is due for', 'minutes', graceNote);
const maxWaitingSleds = () => pv('Controlled sleds waiting in the start area, at most', 2, 'count', tradePractice());
const unsetDrawWeights = () => ({
  none: unset('Finish draw: weight of "no inspection"', 'count', finishNote),
  remeasure: unset('Finish draw: weight of "re-measure"', 'count', finishNote),
  detailed: unset('Finish draw: weight of "detailed check"', 'count', finishNote),
});

function naturalProfile(id: string, name: string, levels: CompetitionLevel[]): RulesProfile {
  return {
    id,
    name,
    trackType: 'natural',
    levels,
    rulebookNote,
    temperature: {
      margin: steelMargin(),
      floor: pv('Steel limit never below (natural track)', 0, 'celsius', tradePractice()),
    },
    controlSteel: {
      interval: controlInterval(),
      grace: controlGrace(),
      minHeight: pv('Control steel height above ground, at least', 500, 'centimetre', tradePractice()),
      maxHeight: pv('Control steel height above ground, at most', 1000, 'centimetre', tradePractice()),
      minLength: null,
      mountedBeforeFirstStart: pv('Control steel mounted before the first start, at least', 30, 'minutes', tradePractice()),
      inShade: true,
      awayFromDrafts: false,
      recordIceAndAir: false,
    },
    weights: {
      weighing: 'sled-alone',
      sledMax: {
        'singles-women': unset('Sled maximum weight, singles women', 'kilogram'),
        'singles-men': unset('Sled maximum weight, singles men', 'kilogram'),
        doubles: unset('Sled maximum weight, doubles', 'kilogram'),
      },
      extraWeight: null,
    },
    scale: {
      controlWeightMin: pv('Calibrated check weight at the start, at least', 10, 'kilogram', publishedAgreed('National rule text following the international rules; trade practice agrees')),
      controlWeightMinCount: pv('Calibrated check weights at the start, at least', 1, 'count', tradePractice()),
      division: pv('Scale reads in steps of', 100, 'gram', publishedAgreed('National rule text following the international rules')),
      inService: true,
    },
    dimensions: naturalDimensions(),
    gapProbe: null,
    equipment: naturalEquipment.map((item) => ({ ...item })),
    startArea: { maxWaitingSleds: maxWaitingSleds() },
    finishPlan: {
      always: [],
      drawWeights: unsetDrawWeights(),
      gapProbeFollowUp: 'detailed',
    },
  };
}

function artificialProfile(id: string, name: string, levels: CompetitionLevel[], seniorWeights: boolean): RulesProfile {
  const weight = (label: string, tenths: number, note: string, agreed = true) =>
    seniorWeights
      ? pv(label, tenths, 'kilogram', agreed ? publishedAgreed(note) : publishedDisputed(note))
      : unset(label, 'kilogram', 'Published values found cover senior races only: enter the junior and youth values from the rulebook in force.');
  const published = 'Several published rule summaries agree';
  return {
    id,
    name,
    trackType: 'artificial',
    levels,
    rulebookNote,
    temperature: {
      margin: steelMargin(),
      floor: pv('Steel limit never below (artificial track)', 10, 'celsius', tradePractice()),
    },
    controlSteel: {
      interval: controlInterval(),
      grace: controlGrace(),
      minHeight: null,
      maxHeight: null,
      minLength: pv('Control steel length, at least', 200, 'centimetre', tradePractice()),
      mountedBeforeFirstStart: pv('Control steel mounted before the first start, at least', 240, 'minutes', tradePractice()),
      inShade: true,
      awayFromDrafts: true,
      recordIceAndAir: true,
    },
    weights: {
      weighing: 'athlete-with-sled',
      sledMax: {
        'singles-women': weight('Sled maximum weight, singles women', 230, published),
        'singles-men': weight('Sled maximum weight, singles men', 230, published),
        doubles: weight('Sled maximum weight, doubles', 270, published),
      },
      extraWeight: {
        referenceBodyWeight: {
          'singles-women': weight('Reference body weight, women', 750, published),
          'singles-men': weight('Reference body weight, men', 900, published),
        },
        shareOfShortfall: pv(
          'Share of the shortfall below the reference that may be added',
          null,
          'percent',
          unsetSource('Published summaries disagree: enter it from the rulebook in force.'),
        ),
        cap: {
          'singles-women': weight('Extra weight, at most, women', 100, published),
          'singles-men': weight('Extra weight, at most, men', 130, published),
          doubles: weight('Extra weight, at most, doubles', 100, published),
        },
        doublesPairReference: weight(
          'Doubles may add weight only when the pair weighs less than',
          1800,
          'Two published summaries agree; another gives 190 kg',
          false,
        ),
      },
    },
    scale: {
      controlWeightMin: pv('Each control weight at the scale, at least', 200, 'kilogram', tradePractice()),
      controlWeightMinCount: pv('Control weights at the scale, at least', 5, 'count', tradePractice()),
      division: unset('Scale verification interval e', 'gram', 'The scale in use: read it from its data plate.'),
      inService: true,
    },
    dimensions: [],
    gapProbe: { feeler: pv('Gap probe feeler thickness', 5, 'millimetre', tradePractice()) },
    equipment: artificialEquipment.map((item) => ({ ...item })),
    startArea: { maxWaitingSleds: maxWaitingSleds() },
    finishPlan: {
      always: [],
      drawWeights: unsetDrawWeights(),
      gapProbeFollowUp: 'remeasure',
    },
  };
}

/** The profiles Rimelog ships; organisers copy and edit them. */
export function shippedProfiles(): RulesProfile[] {
  return [
    naturalProfile('natural-international', 'Natural track, international', ['international']),
    naturalProfile('natural-national', 'Natural track, national', ['national', 'junior', 'youth']),
    artificialProfile('artificial-senior', 'Artificial track, senior', ['international', 'national'], true),
    artificialProfile('artificial-junior-youth', 'Artificial track, junior and youth', ['junior', 'youth'], false),
  ];
}

export function shippedProfile(trackType: TrackType, level: CompetitionLevel): RulesProfile {
  const profile = shippedProfiles().find((p) => p.trackType === trackType && p.levels.includes(level));
  if (!profile) throw new Error(`No shipped profile for ${trackType} track, ${level} level.`);
  return profile;
}
