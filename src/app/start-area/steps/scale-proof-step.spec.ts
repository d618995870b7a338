import { Component, signal } from '@angular/core';
import { acceptDemoValues } from '../../../../shared/rules/profile-values';
import type { RulesProfile } from '../../../../shared/rules/rules-profile';
import { shippedProfile } from '../../../../shared/rules/shipped-profiles';
import type { ControlWeight, ScaleProofEntry } from './scale-proof';
import { ScaleProofStep, type ScaleProved } from './scale-proof-step';
import { mountStep } from './testing/mount-step';

// Natural track: one calibrated weight of at least 1 kg, a scale reading in 100 g steps.
// secondary published: national luge rules (Russian Ministry of Sport), items 2.1–2.2
const natural = acceptDemoValues(shippedProfile('natural', 'national'));
// Artificial track: at least five control weights of at least 20 kg each (trade practice, no published source);
// the scale interval ships unset and acceptDemoValues fills e = 100 g, an invented demo value.
const artificial = acceptDemoValues(shippedProfile('artificial', 'national'));

// Invented control weights.
const weight = (n: number, nominalMass: number | null): ControlWeight => ({ id: `cw-${n}`, label: `CW-0${n}`, nominalMass });
const fiveOfTwenty = [1, 2, 3, 4, 5].map((n) => weight(n, 200));

@Component({
  imports: [ScaleProofStep],
  template: `
    <rl-scale-proof-step
      [profile]="profile()"
      [scaleLabel]="scaleLabel()"
      [controlWeights]="weights()"
      [saved]="saved()"
      (proved)="onProved($event)"
    />
  `,
})
class Host {
  readonly profile = signal<RulesProfile>(artificial);
  readonly scaleLabel = signal('SC-02');
  readonly weights = signal<readonly ControlWeight[]>(fiveOfTwenty);
  readonly saved = signal<ScaleProofEntry | null>(null);
  readonly emitted: ScaleProved[] = [];

  /** Like the real host: keep the proof and pass it back in. */
  onProved(proved: ScaleProved): void {
    this.emitted.push(proved);
    this.saved.set({ controlWeightIds: proved.controlWeightIds, readingTenths: proved.readingTenths });
  }
}

function setUp(change: (host: Host) => void = () => {}) {
  const { fixture, element, text, has } = mountStep(Host, change);
  const weightButton = (label: string) => {
    fixture.detectChanges();
    const found = element.querySelector<HTMLButtonElement>(`button[data-weight="${label}"]`);
    if (!found) throw new Error(`No button for control weight ${label}`);
    return found;
  };
  const toggle = (label: string) => {
    weightButton(label).click();
    fixture.detectChanges();
  };
  /** Presses keys on the "Scale reads" keypad, e.g. keys('1', '0', '0', 'Save'). */
  const keys = (...labels: string[]) => {
    for (const label of labels) {
      fixture.detectChanges();
      const buttons = element.querySelectorAll<HTMLButtonElement>('rl-glove-keypad .keys button');
      const key = [...buttons].find((b) => b.textContent?.trim() === label);
      if (!key) throw new Error(`No key "${label}" on the keypad`);
      key.click();
    }
    fixture.detectChanges();
  };
  const outcome = (section: string) => {
    fixture.detectChanges();
    return element.querySelector(`[data-section="${section}"]`)?.getAttribute('data-outcome') ?? null;
  };
  return { fixture, element, text, has, weightButton, toggle, keys, outcome, host: fixture.componentInstance };
}

describe('ScaleProofStep', () => {
  it('shows the heading, that it is due before weighing in this run, and the keypad for the reading', () => {
    const { text } = setUp();
    expect(text('h2')).toBe('Prove the scale');
    expect(text('[data-section="due"]')).toBe(
      'Due before weighing in this run: put calibrated control weights on scale SC-02 and key in what it reads.',
    );
    expect(text('rl-glove-keypad .label')).toBe('Scale reads');
    expect(text('rl-glove-keypad .range')).toBe('From 0.1 kg to 3000.0 kg');
  });

  it('when five 20.0 kg weights are issued at an artificial-track scale, then the weights verdict passes with its numbers', () => {
    const { outcome, text } = setUp();
    expect(outcome('weights-verdict')).toBe('pass');
    expect(text('[data-section="weights-verdict"] .what')).toBe('Control weights at scale SC-02');
    expect(text('[data-section="weights-verdict"] .numbers')).toContain('Control weights of at least 20.0 kg: 5 of at least 5');
  });

  it('when only four are issued, then the weights verdict fails saying one more is needed', () => {
    const { outcome, text } = setUp((h) => h.weights.set(fiveOfTwenty.slice(1)));
    expect(outcome('weights-verdict')).toBe('fail');
    expect(text('[data-section="weights-verdict"] .reason')).toContain('1 more weight of at least 20.0 kg needed (at least 5 in all)');
  });

  it('chooses every weight at first, and choosing weights changes the known total', () => {
    const { weightButton, toggle, text } = setUp();
    for (const w of fiveOfTwenty) expect(weightButton(w.label).getAttribute('aria-pressed')).toBe('true');
    expect(text('button[data-weight="CW-01"]')).toBe('✓ CW-01, 20.0 kg: on the scale');
    expect(text('[data-section="known"]')).toBe('Known total on the scale: 100.0 kg');

    toggle('CW-02');
    toggle('CW-04');
    expect(weightButton('CW-02').getAttribute('aria-pressed')).toBe('false');
    expect(text('button[data-weight="CW-02"]')).toBe('◌ CW-02, 20.0 kg: not on the scale');
    expect(text('[data-section="known"]')).toBe('Known total on the scale: 60.0 kg');

    toggle('CW-02');
    expect(text('[data-section="known"]')).toBe('Known total on the scale: 80.0 kg');
  });

  it('when no weight is chosen, then it asks for a choice instead of a total', () => {
    const { toggle, text } = setUp((h) => h.weights.set([weight(1, 10)]));
    toggle('CW-01');
    expect(text('[data-section="known"]')).toBe('⚠ Choose the control weights you put on the scale.');
  });

  it('when the reading is keyed and saved, then it emits the chosen ids, the known total and the reading, and passes within tolerance', () => {
    // 60.0 kg = 600 e at e = 100 g (demo value): ±1 e, doubled in service to ±2 e = ±200 g.
    // from memory: OIML R 76-1, class III maximum permissible errors, doubled in service
    const { toggle, keys, host, outcome, text } = setUp();
    toggle('CW-02');
    toggle('CW-04');
    expect(text('[data-section="reading-judgement"]')).toBe(
      '◌ No verdict yet: put the chosen control weights on the scale and key in what it reads.',
    );
    keys('6', '0', '.', '2', 'Save');
    expect(host.emitted).toEqual([{ controlWeightIds: ['cw-1', 'cw-3', 'cw-5'], knownTenths: 600, readingTenths: 602 }]);
    expect(text('[data-section="entered"]')).toBe('Saved: the scale reads 60.2 kg with 60.0 kg on it.');
    expect(outcome('reading-verdict')).toBe('pass');
    expect(text('[data-section="reading-verdict"] .numbers')).toContain('Tolerance: ±200 g (±2 e)');
  });

  it('when the reading is outside tolerance, then it fails and the working steps are shown', () => {
    // 1.0 kg on a 100 g scale in service: ±0.5 e doubled = ±100 g; 0.8 kg is 200 g off.
    // from memory: OIML R 76-1, class III maximum permissible errors, doubled in service
    const { keys, outcome, text, element, host } = setUp((h) => {
      h.profile.set(natural);
      h.weights.set([weight(1, 10)]);
    });
    expect(outcome('weights-verdict')).toBe('pass');
    keys('0', '.', '8', 'Save');
    expect(host.emitted).toEqual([{ controlWeightIds: ['cw-1'], knownTenths: 10, readingTenths: 8 }]);
    expect(outcome('reading-verdict')).toBe('fail');
    expect(text('[data-section="reading-verdict"] .outcome')).toBe('⚠ Fails the check: violation to report');
    expect(text('[data-section="reading-verdict"] .reason')).toContain('error −200 g, outside ±100 g (±1 e). Do not weigh with this scale');
    const steps = [...element.querySelectorAll('[data-section="reading-verdict"] .steps li')].map((li) => li.textContent?.trim());
    expect(steps).toContain('Reading 0.8 kg − known weight 1.0 kg = error −200 g');
    expect(steps).toContain('Error 200 g is outside ±100 g (±1 e)');
  });

  it('when a weight has no certified mass, then the weights verdict and the known total say so in words, never a pass', () => {
    const { text, has, keys, host } = setUp((h) => h.weights.set([...fiveOfTwenty.slice(0, 4), weight(5, null)]));
    expect(has('[data-section="weights-verdict"]')).toBe(false);
    expect(text('[data-section="weights-judgement"] p')).toBe(
      '⚠ No verdict: The certified mass of control weight CW-05 is not known: its certificate must give the mass. Refer to the technical delegate.',
    );
    expect(text('[data-section="weights-judgement"] .decides')).toBe('The rulebook in force and the technical delegate decide.');
    expect(text('button[data-weight="CW-05"]')).toBe('✓ CW-05, certified mass not known: on the scale');
    expect(text('[data-section="known"]')).toBe(
      '⚠ The certified mass of control weight CW-05 is not known: its certificate must give the mass.',
    );

    keys('1', '0', '0', 'Save');
    expect(host.emitted).toEqual([]);
    expect(text('[data-section="entered"]')).toMatch(/^Not saved: The certified mass of control weight CW-05 is not known/);
    expect(has('[data-section="reading-verdict"]')).toBe(false);
    expect(text('[data-section="reading-judgement"] p')).toMatch(/^⚠ No verdict: The certified mass of control weight CW-05 .+ Refer to the technical delegate\.$/);
  });

  it('when the weight without a mass is left off the scale, then the reading is judged on the others', () => {
    const { toggle, keys, host, outcome } = setUp((h) => h.weights.set([...fiveOfTwenty.slice(0, 4), weight(5, null)]));
    toggle('CW-05');
    keys('8', '0', 'Save');
    expect(host.emitted).toEqual([{ controlWeightIds: ['cw-1', 'cw-2', 'cw-3', 'cw-4'], knownTenths: 800, readingTenths: 800 }]);
    expect(outcome('reading-verdict')).toBe('pass');
  });

  it('when the weights on the scale change after a reading, then the old reading no longer stands', () => {
    const { toggle, keys, has, text, element } = setUp();
    keys('1', '0', '0', 'Save');
    expect(has('[data-section="reading-verdict"]')).toBe(true);
    toggle('CW-01');
    expect(has('[data-section="reading-verdict"]')).toBe(false);
    expect(text('[data-section="reading-judgement"]')).toContain('No verdict yet');
    expect(element.querySelector('rl-glove-keypad output')?.textContent).toContain('No value yet');
  });

  it('restores a saved proof: its weights, its reading and its verdict, without emitting', () => {
    const { host, weightButton, text, outcome } = setUp((h) => h.saved.set({ controlWeightIds: ['cw-1', 'cw-2'], readingTenths: 401 }));
    expect(host.emitted).toEqual([]);
    expect(weightButton('CW-01').getAttribute('aria-pressed')).toBe('true');
    expect(weightButton('CW-03').getAttribute('aria-pressed')).toBe('false');
    expect(text('[data-section="known"]')).toBe('Known total on the scale: 40.0 kg');
    expect(text('rl-glove-keypad output')).toBe('40.1 kg');
    expect(outcome('reading-verdict')).toBe('pass');
  });
});
