import { acceptDemoValues } from '../../../../shared/rules/profile-values';
import { shippedProfile } from '../../../../shared/rules/shipped-profiles';
import { resultAdvice, type StepState } from './check-plan';
import { stepStates, type ProgressInput } from './check-progress';
import type { SavedScaleProof } from './check-records';

// Demo values fill what the shipped profiles leave unset (sled maximum 22.0 kg, scale interval e = 100 g):
// invented for our demo race, used here only to exercise our own step logic.
const natural = acceptDemoValues(shippedProfile('natural', 'national'));
const artificial = acceptDemoValues(shippedProfile('artificial', 'national'));
const checkId = '0190a7e2-0000-7000-8000-0000000000c1';
const otherCheck = '0190a7e2-0000-7000-8000-0000000000c2';
const weight = { id: 'cw-1', label: 'CWT-01', nominalMass: 20 };

function input(changes: Partial<ProgressInput> = {}): ProgressInput {
  return {
    profile: natural,
    checkId,
    run: 1,
    discipline: 'singles-women',
    officialBodyWeights: null,
    answers: { equipment: null, bibConfirmed: null, byEye: {}, gapProbe: null },
    weights: [],
    dimensions: [],
    scaleProofs: [],
    controlWeights: [weight],
    steel: { kind: 'none' },
    savedSteel: [],
    ...changes,
  };
}

const proof = (changes: Partial<SavedScaleProof>): SavedScaleProof => ({
  id: 'proof-1',
  run: 1,
  scaleId: 'scale-1',
  controlWeightIds: [weight.id],
  knownTenths: 20,
  readingTenths: 20,
  takenAt: '2027-01-09T09:00:00.000Z',
  checkId: otherCheck,
  ...changes,
});

const ids = (states: StepState[]) => states.map((s) => s.id);
const summaryOf = (states: StepState[], id: string) => states.find((s) => s.id === id)?.summary;

describe('stepStates', () => {
  it('lists the natural-track steps in working order, the scale proof first while the run has none', () => {
    expect(ids(stepStates(input()))).toEqual(['equipment', 'scale-proof', 'weight', 'dimensions', 'steel']);
  });

  it('lists the gap probe instead of dimensions on artificial track', () => {
    expect(ids(stepStates(input({ profile: artificial })))).toEqual(['equipment', 'scale-proof', 'weight', 'gap-probe', 'steel']);
  });

  it('leaves the scale proof out once another check of the run proved the scale, keeps it in the check that proved it, and asks again in the next run', () => {
    const proved = [proof({})];
    expect(ids(stepStates(input({ scaleProofs: proved })))).not.toContain('scale-proof');
    expect(summaryOf(stepStates(input({ scaleProofs: [proof({ checkId })] })), 'scale-proof')).toBe('pass');
    expect(ids(stepStates(input({ scaleProofs: proved, run: 2 })))).toContain('scale-proof');
  });

  it('keeps asking for the scale proof while the last one of the run failed', () => {
    // 1.0 kg read for a 2.0 kg weight is far outside any class III tolerance at e = 100 g.
    const states = stepStates(input({ scaleProofs: [proof({ readingTenths: 10 })] }));
    expect(summaryOf(states, 'scale-proof')).toBe('fail');
    expect(resultAdvice(states)).toMatchObject({ kind: 'refer' });
  });

  it('fails the equipment step when the bib is not right, even with every item present', () => {
    const equipment = Object.fromEntries(natural.equipment.map((item) => [item.id, true]));
    const states = stepStates(input({ answers: { equipment, bibConfirmed: false, byEye: {}, gapProbe: null } }));
    const step = states.find((s) => s.id === 'equipment')!;
    expect(step.summary).toBe('fail');
    expect(step.failed[0]?.reason).toContain('Bib not confirmed');
    expect(resultAdvice(states)).toMatchObject({ kind: 'report', failed: [{ id: 'equipment' }] });
  });

  it('has no weight verdict when the bib is not on the start list, and says why', () => {
    const step = stepStates(input({ discipline: null })).find((s) => s.id === 'weight')!;
    expect(step).toMatchObject({ summary: 'no-verdict', reason: 'The bib is not on the start list on this device, so its discipline is not known.' });
  });

  it('fails the weight over the sled maximum with the measurement and scale behind it', () => {
    // Demo sled maximum for singles women 22.0 kg (invented for the demo race).
    const weights = [{ id: 'm-1', place: 'sled', tenths: 231, instrumentId: 'scale-1', takenAt: '2027-01-09T09:01:00.000Z' }];
    const step = stepStates(input({ weights })).find((s) => s.id === 'weight')!;
    expect(step).toMatchObject({ summary: 'fail', measurementIds: ['m-1'], instrumentId: 'scale-1' });
  });
});

describe('resultAdvice', () => {
  const step = (id: StepState['id'], summary: StepState['summary']): StepState => ({ id, label: id, summary, reason: null, failed: [], measurementIds: [], instrumentId: null });

  it('with no steps on this device leaves the decision to the official and the delegate', () => {
    expect(resultAdvice([])).toEqual({ kind: 'unjudged' });
  });

  it('asks for a report when a step failed, before anything else', () => {
    expect(resultAdvice([step('weight', 'fail'), step('steel', 'no-verdict'), step('equipment', 'waiting')])).toMatchObject({ kind: 'report' });
  });

  it('refers when a step has no verdict or is for the delegate, and names them', () => {
    expect(resultAdvice([step('gap-probe', 'refer'), step('steel', 'pass')])).toEqual({ kind: 'refer', unsure: [step('gap-probe', 'refer')] });
  });

  it('names the steps still to do, and clears only when every step passed', () => {
    expect(resultAdvice([step('equipment', 'pass'), step('steel', 'waiting')])).toEqual({ kind: 'waiting', left: [step('steel', 'waiting')] });
    expect(resultAdvice([step('equipment', 'pass'), step('steel', 'pass')])).toEqual({ kind: 'clear' });
  });
});
