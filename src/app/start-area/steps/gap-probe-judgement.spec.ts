import { gapProbeResults, type GapProbeResult } from '../../../../shared/rules/gap-probe';
import { acceptDemoValues } from '../../../../shared/rules/profile-values';
import type { RulesProfile } from '../../../../shared/rules/rules-profile';
import { shippedProfile } from '../../../../shared/rules/shipped-profiles';
import { profileWith } from '../../../../shared/rules/test-profiles';
import type { StepJudgement } from './step-judgement';
import { feelerThicknessText, gapProbeJudgement, gapProbeWaitingWords } from './gap-probe-judgement';

// trade practice, no published source: a 0.5 mm feeler run along the runner-to-steel joint on artificial track;
// up to half the steel width → tell the delegate, extra finish inspections; right across → violation on the spot.
const artificial = acceptDemoValues(shippedProfile('artificial', 'national'));
const natural = acceptDemoValues(shippedProfile('natural', 'national'));

const outcomeOf = (judgement: StepJudgement) => (judgement.kind === 'judged' ? judgement.verdict.outcome : judgement.kind);
const verdictOf = (judgement: StepJudgement) => {
  if (judgement.kind !== 'judged') throw new Error(`Expected a verdict, got ${judgement.kind}: ${judgement.words}`);
  return judgement.verdict;
};

describe('gapProbeJudgement', () => {
  it('when nothing is chosen yet, then it waits in words and gives no verdict', () => {
    expect(gapProbeJudgement(artificial, null)).toEqual({ kind: 'waiting', words: gapProbeWaitingWords });
    expect(gapProbeWaitingWords).toBe('No verdict yet: choose how far the feeler went into the joint.');
  });

  it.each<[GapProbeResult, string]>([
    ['no-entry', 'pass'],
    ['enters-up-to-half', 'refer-to-delegate'],
    ['enters-beyond-half', 'refer-to-delegate'],
    ['passes-across', 'fail'],
  ])('when the feeler result is %s on artificial track, then the verdict is %s', (result, outcome) => {
    expect(outcomeOf(gapProbeJudgement(artificial, result))).toBe(outcome);
  });

  it('when the feeler enters up to half the steel width, then the reason says extra finish inspections and the flag is set', () => {
    const verdict = verdictOf(gapProbeJudgement(artificial, 'enters-up-to-half'));
    expect(verdict.reason).toContain('tell the technical delegate; this sled gets extra finish inspections');
    expect(verdict.flags).toEqual(['extra-finish-inspection']);
    expect(verdict.numbers).toContainEqual({ label: 'Feeler thickness', text: '0.5 mm' });
  });

  it('when the feeler passes right across, then it is a violation with no extra-inspection flag', () => {
    const verdict = verdictOf(gapProbeJudgement(artificial, 'passes-across'));
    expect(verdict.reason).toContain('a violation on the spot');
    expect(verdict.flags).toEqual([]);
  });

  it('when the competition is on natural track, then the engine refuses and it is never a pass', () => {
    const judgement = gapProbeJudgement(natural, 'no-entry');
    expect(judgement).toEqual({
      kind: 'no-verdict',
      words: 'No verdict: The gap probe is an artificial-track check: this competition is on natural track. Refer to the technical delegate.',
    });
  });

  it('when the profile has no gap probe settings, then the gap is named and there is no verdict', () => {
    const withoutProbe: RulesProfile = { ...artificial, gapProbe: null };
    const judgement = gapProbeJudgement(withoutProbe, 'no-entry');
    expect(judgement.kind).toBe('no-verdict');
    expect(judgement.kind === 'no-verdict' && judgement.words).toMatch(/^No verdict: The rules profile has no gap probe settings\..+Refer to the technical delegate\.$/);
  });

  it('covers every result the engine knows', () => {
    expect(gapProbeResults.map((result) => gapProbeJudgement(artificial, result).kind)).toEqual(['judged', 'judged', 'judged', 'judged']);
  });
});

describe('feelerThicknessText', () => {
  it('when the profile names the feeler, then it is written with its unit', () => {
    expect(feelerThicknessText(artificial)).toBe('0.5 mm');
  });

  it('when the organiser set another feeler, then that thickness is written', () => {
    // 0.4 mm is this test's own assumption, not a rule value.
    expect(feelerThicknessText(profileWith('artificial', 'national', { 'gapProbe.feeler': 4 }))).toBe('0.4 mm');
  });

  it('when there are no gap probe settings, then there is no thickness to show', () => {
    expect(feelerThicknessText(natural)).toBeNull();
  });
});
