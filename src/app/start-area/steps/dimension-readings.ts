import { dimensionChecklist, judgeDimension, steels, type DimensionReadings, type Steel } from '../../../../shared/rules/dimensions';
import { formatTenths, measurement } from '../../../../shared/rules/measurement';
import type { ProfileValue } from '../../../../shared/rules/profile-value';
import type { DimensionRule, RulesProfile } from '../../../../shared/rules/rules-profile';
import { attempt, judged, summaryOf, worstOf, type StepJudgement, type StepSummary } from './step-judgement';

/** What has been measured of one sled's dimensions so far. */
export interface SavedDimensions {
  /** Whole tenths in the rule's unit, by place key (`handguard-height`, `steel-angle:left:1`). */
  values: Readonly<Record<string, number>>;
  /** By-eye answers by dimension kind: true = looks right. */
  byEye: Readonly<Record<string, boolean>>;
}

export const noDimensions: SavedDimensions = { values: {}, byEye: {} };

/** One place where a dimension is read: the dimension itself, or one place on one steel. */
export interface DimensionPlace {
  key: string;
  kind: string;
  /** null for a plain dimension; `left:1`, `right:2`… (counted from 1) for one read on each steel. */
  place: string | null;
  /** "Handguard height", or "Left steel, place 1". */
  label: string;
}

export interface DimensionJudgement {
  rule: DimensionRule;
  judgement: StepJudgement;
}

/** The whole step at a glance; the verdicts themselves stay with each rule. */
export type { StepSummary };

const capitalise = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);
const lowerFirst = (text: string) => text.charAt(0).toLowerCase() + text.slice(1);

/** Every place the rule is read at, in working order: left steel first. None for a rule judged by eye. */
export function dimensionPlaces(rule: DimensionRule): DimensionPlace[] {
  if (rule.byEye) return [];
  const perSteel = rule.placesPerSteel;
  if (perSteel === undefined) return [{ key: rule.kind, kind: rule.kind, place: null, label: rule.label }];
  return steels.flatMap((steel) =>
    Array.from({ length: perSteel }, (_, index) => {
      const place = `${steel}:${index + 1}`;
      return { key: `${rule.kind}:${place}`, kind: rule.kind, place, label: `${capitalise(steel)} steel, place ${index + 1}` };
    }),
  );
}

/** Each rule of the profile in working order (minimum set first), judged once all its places are in. */
export function dimensionJudgements(profile: RulesProfile, saved: SavedDimensions): DimensionJudgement[] {
  return dimensionChecklist(profile).map((rule) => ({ rule, judgement: judgeRule(profile, rule, saved) }));
}

function judgeRule(profile: RulesProfile, rule: DimensionRule, saved: SavedDimensions): StepJudgement {
  const judge = (readings: DimensionReadings) => judged(attempt(() => judgeDimension({ profile, kind: rule.kind, readings })));
  if (rule.byEye) {
    const acceptable = saved.byEye[rule.kind];
    if (acceptable === undefined) {
      return { kind: 'waiting', words: `No verdict yet: say whether the ${lowerFirst(rule.label)} looks right.` };
    }
    return judge({ acceptable });
  }

  const places = dimensionPlaces(rule);
  const missing = places.filter((place) => saved.values[place.key] === undefined);
  if (missing.length > 0) {
    const words =
      rule.placesPerSteel === undefined
        ? `No verdict yet: measure the ${lowerFirst(rule.label)}.`
        : `No verdict yet: measure the ${lowerFirst(rule.label)} at ${missing.map((place) => lowerFirst(place.label)).join('; ')}.`;
    return { kind: 'waiting', words };
  }
  const valueAt = (key: string) => measurement(saved.values[key] ?? 0, rule.unit);
  if (rule.placesPerSteel === undefined) return judge([valueAt(rule.kind)]);
  return judge(places.map((place) => ({ steel: steelOf(place), value: valueAt(place.key) })));
}

const steelOf = (place: DimensionPlace): Steel => (place.place?.startsWith('left:') ? 'left' : 'right');

/** The whole dimensions step in one word. Nothing to check is no verdict, never a pass. */
export function dimensionsSummary(judgements: readonly DimensionJudgement[]): StepSummary {
  if (judgements.length === 0) return 'no-verdict';
  return worstOf(judgements.map(({ judgement }) => summaryOf(judgement)));
}

/**
 * The allowed range as the profile gives it, to show before measuring: "120.0 mm to 200.0 mm",
 * "at least …", "at most …", or that the organiser has not set it. The verdict itself comes from the engine.
 */
export function allowedRangeText(rule: DimensionRule): string {
  if (rule.byEye) return 'Judged by eye';
  const bound = (value: ProfileValue | null) => (value === null ? null : value.value === null ? 'unset' : formatTenths(value.value, rule.unit));
  const min = bound(rule.min);
  const max = bound(rule.max);
  if (min === 'unset' || max === 'unset' || (min === null && max === null)) return 'Allowed range: not set by the organiser';
  if (min !== null && max !== null) return `Allowed: ${min} to ${max}`;
  return min !== null ? `Allowed: at least ${min}` : `Allowed: at most ${max}`;
}
