import { acceptDemoValues } from '../../../../shared/rules/profile-values';
import { shippedProfile } from '../../../../shared/rules/shipped-profiles';
import { verdict, type Outcome } from '../../../../shared/rules/verdict';
import {
  knownTotal,
  scaleProofJudgement,
  scaleProofSummary,
  scaleReadingWaitingWords,
  type ControlWeight,
  type ScaleProofJudgement,
} from './scale-proof';
import type { StepJudgement } from './step-judgement';

// Natural track: one calibrated weight of at least 1 kg, a scale reading in 100 g steps.
// secondary published: national luge rules (Russian Ministry of Sport), items 2.1–2.2
const natural = acceptDemoValues(shippedProfile('natural', 'national'));
// Artificial track: at least five control weights of at least 20 kg each (trade practice, no published source).
// Its scale interval ships unset; acceptDemoValues fills e = 100 g, an invented demo value, not a rule value.
const artificial = acceptDemoValues(shippedProfile('artificial', 'national'));

const weight = (n: number, nominalMass: number | null): ControlWeight => ({ id: `cw-${n}`, label: `CW-0${n}`, nominalMass });
const fiveOfTwenty = [1, 2, 3, 4, 5].map((n) => weight(n, 200));
const allIds = (weights: readonly ControlWeight[]) => weights.map((w) => w.id);

const outcomeOf = (judgement: StepJudgement): Outcome | StepJudgement['kind'] =>
  judgement.kind === 'judged' ? judgement.verdict.outcome : judgement.kind;
const verdictOf = (judgement: StepJudgement) => {
  if (judgement.kind !== 'judged') throw new Error(`Expected a verdict, got ${judgement.kind}: ${judgement.words}`);
  return judgement.verdict;
};
const wordsOf = (judgement: StepJudgement) => (judgement.kind === 'judged' ? judgement.verdict.reason : judgement.words);

describe('scaleProofJudgement: the control weights at the scale', () => {
  it('when a natural-track start has one weight of exactly 1.0 kg, then the weights pass', () => {
    const j = scaleProofJudgement(natural, [weight(1, 10)], null);
    expect(outcomeOf(j.weights)).toBe('pass');
    expect(verdictOf(j.weights).numbers).toContainEqual({ label: 'Control weights of at least 1.0 kg', text: '1 of at least 1' });
  });

  it('when a natural-track start has only a 0.9 kg weight, then the weights fail as too light', () => {
    const j = scaleProofJudgement(natural, [weight(1, 9)], null);
    expect(outcomeOf(j.weights)).toBe('fail');
    expect(wordsOf(j.weights)).toContain('Too light (under 1.0 kg): weight 1 (0.9 kg).');
  });

  it('when an artificial-track scale has five weights of exactly 20.0 kg, then the weights pass', () => {
    expect(outcomeOf(scaleProofJudgement(artificial, fiveOfTwenty, null).weights)).toBe('pass');
  });

  it('when an artificial-track scale has only four, then the weights fail saying one more is needed', () => {
    const j = scaleProofJudgement(artificial, fiveOfTwenty.slice(1), null);
    expect(outcomeOf(j.weights)).toBe('fail');
    expect(wordsOf(j.weights)).toContain('1 more weight of at least 20.0 kg needed (at least 5 in all)');
  });

  it('when one of five is 19.9 kg, then the weights fail naming it by its place in the list', () => {
    const weights = [...fiveOfTwenty.slice(0, 2), weight(3, 199), ...fiveOfTwenty.slice(3)];
    const j = scaleProofJudgement(artificial, weights, null);
    expect(outcomeOf(j.weights)).toBe('fail');
    expect(verdictOf(j.weights).numbers).toContainEqual({ label: 'Too light', text: 'weight 3 (19.9 kg)' });
  });

  it('when no weight is issued at the scale, then the weights fail, never pass', () => {
    expect(outcomeOf(scaleProofJudgement(natural, [], null).weights)).toBe('fail');
  });

  it('when a weight has no certified mass, then there is no verdict and its label is named', () => {
    const weights = [...fiveOfTwenty.slice(0, 4), weight(5, null)];
    const j = scaleProofJudgement(artificial, weights, null);
    expect(j.weights).toEqual({
      kind: 'no-verdict',
      words: 'No verdict: The certified mass of control weight CW-05 is not known: its certificate must give the mass. Refer to the technical delegate.',
    });
  });

  it('when two weights have no certified mass, then both are named', () => {
    const j = scaleProofJudgement(artificial, [...fiveOfTwenty.slice(0, 3), weight(4, null), weight(5, null)], null);
    expect(wordsOf(j.weights)).toContain('The certified masses of control weights CW-04, CW-05 are not known');
  });
});

describe('scaleProofJudgement: the reading', () => {
  it('when nothing is entered yet, then the reading waits and no known total is claimed', () => {
    const j = scaleProofJudgement(natural, [weight(1, 10)], null);
    expect(j.reading).toEqual({ kind: 'waiting', words: scaleReadingWaitingWords });
    expect(j.known).toEqual({ problem: 'Choose the control weights you put on the scale.' });
  });

  // Tolerances: from memory: OIML R 76-1, class III maximum permissible errors (±0.5 e up to 500 e,
  // ±1 e up to 2 000 e), doubled in service.
  it('when the 1.0 kg weight reads 1.1 kg on a natural-track start, then 100 g is within ±100 g and passes', () => {
    const j = scaleProofJudgement(natural, [weight(1, 10)], { controlWeightIds: ['cw-1'], readingTenths: 11 });
    expect(j.known).toEqual({ tenths: 10 });
    expect(outcomeOf(j.reading)).toBe('pass');
    expect(verdictOf(j.reading).numbers).toContainEqual({ label: 'Tolerance', text: '±100 g (±1 e)' });
  });

  it('when the 1.0 kg weight reads 0.8 kg, then 200 g off fails', () => {
    const j = scaleProofJudgement(natural, [weight(1, 10)], { controlWeightIds: ['cw-1'], readingTenths: 8 });
    expect(outcomeOf(j.reading)).toBe('fail');
    expect(wordsOf(j.reading)).toContain('error −200 g, outside ±100 g (±1 e)');
  });

  it('when all five 20.0 kg weights are on the scale, then the known total is 100.0 kg and ±200 g is allowed', () => {
    // 100.0 kg = 1 000 e at e = 100 g (demo value): ±1 e, doubled in service to ±2 e = ±200 g.
    const entry = (readingTenths: number) => ({ controlWeightIds: allIds(fiveOfTwenty), readingTenths });
    const within = scaleProofJudgement(artificial, fiveOfTwenty, entry(1002));
    expect(within.known).toEqual({ tenths: 1000 });
    expect(outcomeOf(within.reading)).toBe('pass');
    expect(outcomeOf(scaleProofJudgement(artificial, fiveOfTwenty, entry(998)).reading)).toBe('pass');
    const outside = scaleProofJudgement(artificial, fiveOfTwenty, entry(1003));
    expect(outcomeOf(outside.reading)).toBe('fail');
    expect(wordsOf(outside.reading)).toContain('error +300 g, outside ±200 g (±2 e)');
    expect(verdictOf(outside.reading).steps).toContain('Reading 100.3 kg − known weight 100.0 kg = error +300 g');
  });

  it('when only one 20.0 kg weight is on the scale, then the known total is 20.0 kg and only ±100 g is allowed', () => {
    // 20.0 kg = 200 e at e = 100 g (demo value): ±0.5 e, doubled in service to ±1 e = ±100 g.
    const entry = (readingTenths: number) => ({ controlWeightIds: ['cw-2'], readingTenths });
    expect(scaleProofJudgement(artificial, fiveOfTwenty, entry(201)).known).toEqual({ tenths: 200 });
    expect(outcomeOf(scaleProofJudgement(artificial, fiveOfTwenty, entry(201)).reading)).toBe('pass');
    expect(outcomeOf(scaleProofJudgement(artificial, fiveOfTwenty, entry(202)).reading)).toBe('fail');
  });

  it('when a chosen weight has no certified mass, then neither the known total nor the reading is judged', () => {
    const weights = [...fiveOfTwenty.slice(0, 4), weight(5, null)];
    const j = scaleProofJudgement(artificial, weights, { controlWeightIds: allIds(weights), readingTenths: 1000 });
    expect(j.known).toEqual({ problem: 'The certified mass of control weight CW-05 is not known: its certificate must give the mass.' });
    expect(j.reading).toEqual({
      kind: 'no-verdict',
      words: 'No verdict: The certified mass of control weight CW-05 is not known: its certificate must give the mass. Refer to the technical delegate.',
    });
  });

  it('when the weight without a mass stays off the scale, then the reading is still judged on the others', () => {
    const weights = [...fiveOfTwenty.slice(0, 4), weight(5, null)];
    const j = scaleProofJudgement(artificial, weights, { controlWeightIds: ['cw-1', 'cw-2'], readingTenths: 400 });
    expect(j.known).toEqual({ tenths: 400 });
    expect(outcomeOf(j.reading)).toBe('pass');
    expect(outcomeOf(j.weights)).toBe('no-verdict');
  });

  it('when the entry names no weight, then the reading has no verdict and says to choose them', () => {
    const j = scaleProofJudgement(natural, [weight(1, 10)], { controlWeightIds: [], readingTenths: 10 });
    expect(j.reading).toEqual({
      kind: 'no-verdict',
      words: 'No verdict: Choose the control weights you put on the scale. Refer to the technical delegate.',
    });
  });

  it('when the artificial-track scale interval is still unset, then the reading is a profile gap, never a pass', () => {
    const j = scaleProofJudgement(shippedProfile('artificial', 'national'), fiveOfTwenty, { controlWeightIds: ['cw-1'], readingTenths: 200 });
    expect(outcomeOf(j.reading)).toBe('no-verdict');
    expect(wordsOf(j.reading)).toMatch(/^No verdict: The rules profile has no value for "Scale verification interval e"\./);
  });
});

describe('knownTotal', () => {
  it('adds the certified masses of the chosen weights only', () => {
    const weights = [weight(1, 200), weight(2, 199), weight(3, 10)];
    expect(knownTotal(weights, ['cw-1', 'cw-3'])).toEqual({ tenths: 210 });
    expect(knownTotal(weights, allIds(weights))).toEqual({ tenths: 409 });
  });

  it('when a chosen id is not at this scale, then it says so rather than leaving it out', () => {
    expect(knownTotal([weight(1, 200)], ['cw-1', 'cw-9'])).toEqual({
      problem: 'A chosen control weight is not among those issued at this scale: choose the weights again.',
    });
  });
});

describe('scaleProofSummary', () => {
  const judgedAs = (outcome: Outcome): StepJudgement => ({ kind: 'judged', verdict: verdict('scale-reading', outcome, 'A reason.') });
  const waiting: StepJudgement = { kind: 'waiting', words: 'Waiting.' };
  const noVerdict: StepJudgement = { kind: 'no-verdict', words: 'No verdict: x. Refer to the technical delegate.' };
  const proof = (weights: StepJudgement, reading: StepJudgement): ScaleProofJudgement => ({ weights, known: { tenths: 10 }, reading });

  it.each<[string, StepJudgement, StepJudgement, ReturnType<typeof scaleProofSummary>]>([
    ['both pass', judgedAs('pass'), judgedAs('pass'), 'pass'],
    ['weights pass, reading waiting', judgedAs('pass'), waiting, 'waiting'],
    ['reading passes, weights refer', judgedAs('refer-to-delegate'), judgedAs('pass'), 'refer'],
    ['refer beats waiting', judgedAs('refer-to-delegate'), waiting, 'refer'],
    ['no-verdict beats refer', noVerdict, judgedAs('refer-to-delegate'), 'no-verdict'],
    ['no-verdict beats waiting', noVerdict, waiting, 'no-verdict'],
    ['fail beats no-verdict', noVerdict, judgedAs('fail'), 'fail'],
    ['fail beats no-verdict, either side', judgedAs('fail'), noVerdict, 'fail'],
    ['fail beats waiting', judgedAs('fail'), waiting, 'fail'],
    ['not judged counts as no verdict', judgedAs('pass'), judgedAs('not-judged'), 'no-verdict'],
  ])('when %s, then the summary is the more serious part', (_, weights, reading, expected) => {
    expect(scaleProofSummary(proof(weights, reading))).toBe(expected);
  });

  it('when real judgements are summed up, then a reading outside tolerance fails the proof even with good weights', () => {
    const j = scaleProofJudgement(natural, [weight(1, 10)], { controlWeightIds: ['cw-1'], readingTenths: 8 });
    expect(scaleProofSummary(j)).toBe('fail');
    expect(scaleProofSummary(scaleProofJudgement(natural, [weight(1, 10)], { controlWeightIds: ['cw-1'], readingTenths: 10 }))).toBe('pass');
    expect(scaleProofSummary(scaleProofJudgement(natural, [weight(1, 10)], null))).toBe('waiting');
  });
});
