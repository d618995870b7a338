import { profileValueSchema, type ProfileValue, type ValueSource } from './profile-value';
import { RulesInputError } from './rules-error';
import { rulesProfileSchema, type RulesProfile } from './rules-profile';

export interface ProfileValueAt {
  /** Dotted path; array items are named by their kind or id, e.g. "dimensions.steel-angle.min". */
  path: string;
  item: ProfileValue;
}

const isProfileValue = (node: unknown): node is ProfileValue => profileValueSchema.safeParse(node).success;

function keyOf(node: unknown, index: number): string {
  if (node && typeof node === 'object') {
    const named = node as { kind?: unknown; id?: unknown };
    if (typeof named.kind === 'string') return named.kind;
    if (typeof named.id === 'string') return named.id;
  }
  return String(index);
}

function collect(node: unknown, path: string, into: ProfileValueAt[]): void {
  if (isProfileValue(node)) {
    into.push({ path, item: node });
  } else if (Array.isArray(node)) {
    node.forEach((child, index) => collect(child, `${path}.${keyOf(child, index)}`, into));
  } else if (node && typeof node === 'object') {
    for (const [key, child] of Object.entries(node)) collect(child, path ? `${path}.${key}` : key, into);
  }
}

/** Every limit, interval and table entry of a profile, with its path. */
export function profileValues(profile: RulesProfile): ProfileValueAt[] {
  const found: ProfileValueAt[] = [];
  collect(profile, '', found);
  return found;
}

/** Values nobody has filled in yet: each one keeps the competition from opening. */
export function findProfileGaps(profile: RulesProfile): ProfileValueAt[] {
  return profileValues(profile).filter(({ item }) => item.value === null);
}

/** A copy of the profile with one value set, and the source that vouches for it. */
export function withProfileValue(profile: RulesProfile, path: string, value: number, source: ValueSource): RulesProfile {
  if (!Number.isSafeInteger(value)) {
    throw new RulesInputError('invalid-input', `A profile value must be a whole number of its unit's steps, not ${value}.`, [path]);
  }
  const copy = structuredClone(profile);
  const target = profileValues(copy).find((entry) => entry.path === path);
  if (!target) throw new RulesInputError('invalid-input', `The profile has no value at "${path}".`, [path]);
  target.item.value = value;
  target.item.source = source;
  return copy;
}

/**
 * Demo values: invented, for the demo race only, never rule values. Each is labelled as such
 * wherever it is used, and only fills a value that is still unset.
 */
export const demoValues: Readonly<Record<string, number>> = {
  'controlSteel.grace': 2,
  'weights.sledMax.singles-women': 220,
  'weights.sledMax.singles-men': 220,
  'weights.sledMax.doubles': 260,
  'weights.extraWeight.shareOfShortfall': 50,
  'scale.division': 100,
  'finishPlan.drawWeights.none': 80,
  'finishPlan.drawWeights.remeasure': 15,
  'finishPlan.drawWeights.detailed': 5,
  'dimensions.handguard-height.min': 1200,
  'dimensions.handguard-height.max': 2000,
  'dimensions.handguard-width.min': 3000,
  'dimensions.handguard-width.max': 4500,
  'dimensions.full-width.min': 3500,
  'dimensions.full-width.max': 5000,
  'dimensions.steel-angle.min': 0,
  'dimensions.steel-angle.max': 200,
  'dimensions.steel-distance.min': 3000,
  'dimensions.steel-distance.max': 4500,
  'dimensions.runner-spacing.min': 3200,
  'dimensions.runner-spacing.max': 4500,
  'dimensions.bridge-thickness.min': 100,
  'dimensions.bridge-thickness.max': 400,
  'dimensions.overall-height.min': 1000,
  'dimensions.overall-height.max': 2500,
};

const demoSource: ValueSource = { kind: 'demo-value', verified: false, note: 'invented for the demo race' };

/** Fills every gap that has a demo value, labelled as a demo value. Junior weights etc. may remain. */
export function acceptDemoValues(profile: RulesProfile): RulesProfile {
  return findProfileGaps(profile).reduce((filled, { path }) => {
    const value = demoValues[path];
    return value === undefined ? filled : withProfileValue(filled, path, value, demoSource);
  }, profile);
}

export interface FrozenProfile {
  frozenAt: string;
  profile: RulesProfile;
}

function deepFreeze<T>(value: T): T {
  if (value && typeof value === 'object') {
    Object.values(value).forEach(deepFreeze);
    Object.freeze(value);
  }
  return value;
}

/**
 * The copy of the profile a competition keeps when it opens: complete, validated, and immutable,
 * so later edits of the profile never change a verdict already given.
 */
export function freezeProfileForOpening(profile: RulesProfile, at: Date): FrozenProfile {
  const parsed = rulesProfileSchema.safeParse(profile);
  if (!parsed.success) {
    throw new RulesInputError('invalid-input', 'The rules profile is not valid.', parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`));
  }
  const gaps = findProfileGaps(parsed.data);
  if (gaps.length > 0) {
    throw new RulesInputError(
      'profile-gap',
      `The competition cannot open: ${gaps.length} rules value(s) are not filled in. Enter them from the rulebook in force, or accept the labelled demo values for a demo.`,
      gaps.map(({ path, item }) => `${item.label} (${path})`),
    );
  }
  return deepFreeze({ frozenAt: at.toISOString(), profile: structuredClone(parsed.data) });
}
