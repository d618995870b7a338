import { acceptDemoValues } from '../../../../shared/rules/profile-values';
import type { DimensionRule, RulesProfile } from '../../../../shared/rules/rules-profile';
import { shippedProfile } from '../../../../shared/rules/shipped-profiles';
import { profileWith } from '../../../../shared/rules/test-profiles';
import { verdict } from '../../../../shared/rules/verdict';
import {
  allowedRangeText,
  dimensionJudgements,
  dimensionPlaces,
  dimensionsSummary,
  type DimensionJudgement,
  type SavedDimensions,
  type StepSummary,
} from './dimension-readings';
import type { StepJudgement } from './step-judgement';

// Demo values, invented for the demo race, not rule values: handguard height 120.0–200.0 mm, steel angle 0.0–20.0°.
const demo = acceptDemoValues(shippedProfile('natural', 'national'));
const rule = (profile: RulesProfile, kind: string): DimensionRule => {
  const found = profile.dimensions.find((candidate) => candidate.kind === kind);
  if (!found) throw new Error(`No dimension ${kind}`);
  return found;
};
const judgementOf = (profile: RulesProfile, saved: Partial<SavedDimensions>, kind: string): StepJudgement => {
  const found = dimensionJudgements(profile, { values: {}, byEye: {}, ...saved }).find((one) => one.rule.kind === kind);
  if (!found) throw new Error(`No judgement for ${kind}`);
  return found.judgement;
};
const allAngles = (tenths: number) => ({
  'steel-angle:left:1': tenths,
  'steel-angle:left:2': tenths,
  'steel-angle:right:1': tenths,
  'steel-angle:right:2': tenths,
});

describe('dimensionPlaces', () => {
  it('when a dimension is read once, then it has one place keyed by its kind', () => {
    expect(dimensionPlaces(rule(demo, 'handguard-height'))).toEqual([
      { key: 'handguard-height', kind: 'handguard-height', place: null, label: 'Handguard height' },
    ]);
  });

  it('when the steel angle is read at 2 places per steel, then it has 4 places, left steel first, counted from 1', () => {
    const places = dimensionPlaces(rule(demo, 'steel-angle'));
    expect(places.map((place) => place.key)).toEqual(['steel-angle:left:1', 'steel-angle:left:2', 'steel-angle:right:1', 'steel-angle:right:2']);
    expect(places.map((place) => place.place)).toEqual(['left:1', 'left:2', 'right:1', 'right:2']);
    expect(places.map((place) => place.label)).toEqual(['Left steel, place 1', 'Left steel, place 2', 'Right steel, place 1', 'Right steel, place 2']);
  });

  it('when the profile asks for 3 places per steel, then there are 3 on each steel', () => {
    const three = { ...rule(demo, 'steel-angle'), placesPerSteel: 3 };
    expect(dimensionPlaces(three).map((place) => place.place)).toEqual(['left:1', 'left:2', 'left:3', 'right:1', 'right:2', 'right:3']);
  });

  it('when a dimension is judged by eye, then there is no place to measure', () => {
    expect(dimensionPlaces(rule(demo, 'front-pin-height'))).toEqual([]);
  });
});

describe('dimensionJudgements', () => {
  it('when nothing is measured, then every rule waits, minimum set first, with words for what to do', () => {
    const judgements = dimensionJudgements(demo, { values: {}, byEye: {} });
    expect(judgements.map((one) => [one.rule.kind, one.rule.minimumCheck])).toEqual([
      ['handguard-height', true],
      ['handguard-width', true],
      ['full-width', true],
      ['steel-angle', true],
      ['steel-distance', false],
      ['runner-spacing', false],
      ['bridge-thickness', false],
      ['front-pin-height', false],
      ['overall-height', false],
    ]);
    expect(judgements.every((one) => one.judgement.kind === 'waiting')).toBe(true);
    expect(judgementOf(demo, {}, 'handguard-height')).toEqual({ kind: 'waiting', words: 'No verdict yet: measure the handguard height.' });
    expect(judgementOf(demo, {}, 'front-pin-height')).toEqual({
      kind: 'waiting',
      words: 'No verdict yet: say whether the front-pin height looks right.',
    });
  });

  it('when a minimum check is last in the profile, then it still comes before the rest', () => {
    const reordered = { ...demo, dimensions: [...demo.dimensions].reverse() };
    const kinds = dimensionJudgements(reordered, { values: {}, byEye: {} }).map((one) => one.rule.kind);
    expect(kinds.slice(0, 4).sort()).toEqual(['full-width', 'handguard-height', 'handguard-width', 'steel-angle']);
  });

  it('when some steel-angle places are still to measure, then the words name exactly those places', () => {
    const saved = { values: { 'steel-angle:left:1': 10, 'steel-angle:right:2': 10 } };
    expect(judgementOf(demo, saved, 'steel-angle')).toEqual({
      kind: 'waiting',
      words: 'No verdict yet: measure the steel angle at left steel, place 2; right steel, place 1.',
    });
  });

  it('when every steel-angle place is within the demo range, then it passes at all 4 places', () => {
    const judgement = judgementOf(demo, { values: allAngles(15) }, 'steel-angle');
    expect(judgement.kind).toBe('judged');
    if (judgement.kind !== 'judged') return;
    expect(judgement.verdict.outcome).toBe('pass');
    expect(judgement.verdict.reason).toBe('Steel angle within the limits (0.0 ° to 20.0 °) at all 4 places.');
    expect(judgement.verdict.numbers.map((n) => n.label)).toEqual([
      'Left steel, place 1',
      'Left steel, place 2',
      'Right steel, place 1',
      'Right steel, place 2',
      'Minimum',
      'Maximum',
    ]);
  });

  it('when one steel-angle place is over, then the verdict names that place', () => {
    const judgement = judgementOf(demo, { values: { ...allAngles(15), 'steel-angle:right:1': 201 } }, 'steel-angle');
    expect(judgement.kind === 'judged' && judgement.verdict.outcome).toBe('fail');
    expect(judgement.kind === 'judged' && judgement.verdict.reason).toContain('right steel, place 1: 20.1 ° is above the maximum 20.0 °');
  });

  it('when the handguard height is in range, then it passes with the number measured', () => {
    const judgement = judgementOf(demo, { values: { 'handguard-height': 1500 } }, 'handguard-height');
    expect(judgement.kind === 'judged' && judgement.verdict.outcome).toBe('pass');
    expect(judgement.kind === 'judged' && judgement.verdict.numbers[0]).toEqual({ label: 'Handguard height', text: '150.0 mm' });
  });

  it('when the handguard height is 0.1 mm below the minimum, then it fails and says so', () => {
    const judgement = judgementOf(demo, { values: { 'handguard-height': 1199 } }, 'handguard-height');
    expect(judgement.kind === 'judged' && judgement.verdict.outcome).toBe('fail');
    expect(judgement.kind === 'judged' && judgement.verdict.reason).toContain('119.9 mm is below the minimum 120.0 mm');
  });

  it('when the front pin looks right, then it passes; when it does not, then it fails', () => {
    const yes = judgementOf(demo, { byEye: { 'front-pin-height': true } }, 'front-pin-height');
    const no = judgementOf(demo, { byEye: { 'front-pin-height': false } }, 'front-pin-height');
    expect(yes.kind === 'judged' && yes.verdict.outcome).toBe('pass');
    expect(no.kind === 'judged' && no.verdict.outcome).toBe('fail');
    expect(no.kind === 'judged' && no.verdict.reason).toContain('does not look acceptable');
  });

  it('when the organiser left the limits unset, then a measured value gets no verdict, never a pass', () => {
    const judgement = judgementOf(shippedProfile('natural', 'national'), { values: { 'handguard-height': 1500 } }, 'handguard-height');
    expect(judgement.kind).toBe('no-verdict');
    expect(judgement.kind === 'no-verdict' && judgement.words).toMatch(/^No verdict: The rules profile has no value for ".+"\. .+ Refer to the technical delegate\.$/);
  });

  it('when only the maximum is unset, then the measured value still gets no verdict', () => {
    // The minimum 120.0 mm is this spec's own assumption, not a rule value.
    const halfSet = profileWith('natural', 'national', { 'dimensions.handguard-height.min': 1200 });
    expect(judgementOf(halfSet, { values: { 'handguard-height': 1500 } }, 'handguard-height').kind).toBe('no-verdict');
  });
});

describe('dimensionsSummary', () => {
  const waiting: DimensionJudgement['judgement'] = { kind: 'waiting', words: 'No verdict yet.' };
  const noVerdict: DimensionJudgement['judgement'] = { kind: 'no-verdict', words: 'No verdict: gap.' };
  const outcome = (o: 'pass' | 'fail' | 'refer-to-delegate' | 'not-judged'): StepJudgement => ({
    kind: 'judged',
    verdict: verdict('dimension', o, 'A reason.'),
  });
  const summary = (...judgements: StepJudgement[]): StepSummary =>
    dimensionsSummary(judgements.map((judgement) => ({ rule: rule(demo, 'full-width'), judgement })));

  it('when every rule passes, then the step passes', () => {
    expect(summary(outcome('pass'), outcome('pass'))).toBe('pass');
  });

  it('when any rule waits and none is worse, then the step waits', () => {
    expect(summary(outcome('pass'), waiting)).toBe('waiting');
  });

  it('when a rule is referred to the delegate, then that beats waiting', () => {
    expect(summary(waiting, outcome('refer-to-delegate'), outcome('pass'))).toBe('refer');
  });

  it('when a rule got no verdict, then that beats a referral and waiting', () => {
    expect(summary(outcome('refer-to-delegate'), noVerdict, waiting)).toBe('no-verdict');
  });

  it('when a rule fails, then that beats everything else', () => {
    expect(summary(noVerdict, outcome('refer-to-delegate'), waiting, outcome('fail'), outcome('pass'))).toBe('fail');
  });

  it('when a verdict says not judged, then the step has no verdict, never a pass', () => {
    expect(summary(outcome('pass'), outcome('not-judged'))).toBe('no-verdict');
  });

  it('when there is nothing to check, then the step has no verdict, never a pass', () => {
    expect(dimensionsSummary([])).toBe('no-verdict');
  });

  it('when the demo sled is fully measured within the demo ranges, then the whole step passes', () => {
    const values = {
      'handguard-height': 1500,
      'handguard-width': 3500,
      'full-width': 4000,
      ...allAngles(10),
      'steel-distance': 3500,
      'runner-spacing': 3500,
      'bridge-thickness': 200,
      'overall-height': 1500,
    };
    expect(dimensionsSummary(dimensionJudgements(demo, { values, byEye: {} }))).toBe('waiting');
    expect(dimensionsSummary(dimensionJudgements(demo, { values, byEye: { 'front-pin-height': true } }))).toBe('pass');
    expect(dimensionsSummary(dimensionJudgements(demo, { values, byEye: { 'front-pin-height': false } }))).toBe('fail');
  });
});

describe('allowedRangeText', () => {
  it('when both limits are set, then it shows the range in the rule unit', () => {
    expect(allowedRangeText(rule(demo, 'handguard-height'))).toBe('Allowed: 120.0 mm to 200.0 mm');
    expect(allowedRangeText(rule(demo, 'steel-angle'))).toBe('Allowed: 0.0 ° to 20.0 °');
  });

  it('when only one limit exists, then it says at least or at most', () => {
    expect(allowedRangeText({ ...rule(demo, 'handguard-height'), max: null })).toBe('Allowed: at least 120.0 mm');
    expect(allowedRangeText({ ...rule(demo, 'handguard-height'), min: null })).toBe('Allowed: at most 200.0 mm');
  });

  it('when a limit is still unset, then it says the organiser has not set it', () => {
    const shipped = shippedProfile('natural', 'national');
    expect(allowedRangeText(rule(shipped, 'handguard-height'))).toBe('Allowed range: not set by the organiser');
  });

  it('when the rule is judged by eye, then it says so', () => {
    expect(allowedRangeText(rule(demo, 'front-pin-height'))).toBe('Judged by eye');
  });
});
