import { Component, signal } from '@angular/core';
import type { GapProbeResult } from '../../../../shared/rules/gap-probe';
import { acceptDemoValues } from '../../../../shared/rules/profile-values';
import type { RulesProfile } from '../../../../shared/rules/rules-profile';
import { shippedProfile } from '../../../../shared/rules/shipped-profiles';
import { profileWith } from '../../../../shared/rules/test-profiles';
import { GapProbeStep } from './gap-probe-step';
import { mountStep } from './testing/mount-step';

// trade practice, no published source: a 0.5 mm feeler, sled reclined, nobody touching the steels; up to half
// the steel width → tell the delegate and extra finish inspections; right across → violation on the spot.
const artificial = acceptDemoValues(shippedProfile('artificial', 'national'));
const natural = acceptDemoValues(shippedProfile('natural', 'national'));

@Component({
  imports: [GapProbeStep],
  template: `<rl-gap-probe-step [profile]="profile()" [saved]="saved()" (probed)="onProbed($event)" />`,
})
class Host {
  readonly profile = signal<RulesProfile>(artificial);
  readonly saved = signal<GapProbeResult | null>(null);
  /** Off in one test: a host that has not saved yet. */
  passBack = true;
  readonly emitted: GapProbeResult[] = [];

  onProbed(result: GapProbeResult): void {
    this.emitted.push(result);
    if (this.passBack) this.saved.set(result);
  }
}

function setUp(change: (host: Host) => void = () => {}) {
  const { fixture, element, text } = mountStep(Host, change);
  const button = (result: GapProbeResult) => {
    fixture.detectChanges();
    const found = element.querySelector<HTMLButtonElement>(`button[data-result="${result}"]`);
    if (!found) throw new Error(`No button for ${result}`);
    return found;
  };
  const choose = (result: GapProbeResult) => {
    button(result).click();
    fixture.detectChanges();
  };
  const outcome = () => {
    fixture.detectChanges();
    return element.querySelector('rl-verdict-card')?.getAttribute('data-outcome') ?? null;
  };
  return { fixture, element, text, button, choose, outcome, host: fixture.componentInstance };
}

describe('GapProbeStep', () => {
  it('shows the heading, how to probe with the feeler thickness from the profile, and the caution', () => {
    const { text } = setUp();
    expect(text('h2')).toBe('Gap between runner and steel');
    expect(text('[data-section="how"]')).toBe(
      'Recline the sled; nobody touches the steels. Run the 0.5 mm feeler along the joint between runner and steel.',
    );
    expect(text('[data-section="caution"]')).toBe('⚠ Be gentle with the steel edges. Use the calibrated gap probe only.');
  });

  it('when the organiser set another feeler, then the how-to names that thickness', () => {
    // 0.4 mm is this spec's own assumption, not a rule value.
    const { text } = setUp((h) => h.profile.set(profileWith('artificial', 'national', { 'gapProbe.feeler': 4 })));
    expect(text('[data-section="how"]')).toContain('Run the 0.4 mm feeler along the joint');
  });

  it('offers the four results as toggle buttons with a mark and words, none pressed, and waits for a choice', () => {
    const { element, text, button } = setUp();
    const results = [...element.querySelectorAll('button[data-result]')].map((b) => b.getAttribute('data-result'));
    expect(results).toEqual(['no-entry', 'enters-up-to-half', 'enters-beyond-half', 'passes-across']);
    expect(text('button[data-result="no-entry"]')).toBe('✓ Does not enter');
    expect(text('button[data-result="enters-up-to-half"]')).toBe('⚑ Enters up to half the steel width');
    expect(text('button[data-result="passes-across"]')).toBe('⚠ Passes right across');
    for (const result of results) expect(button(result as GapProbeResult).getAttribute('aria-pressed')).toBe('false');
    expect(element.querySelector('rl-verdict-card')).toBeNull();
    expect(text('[data-section="judgement"]')).toBe('◌ No verdict yet: choose how far the feeler went into the joint.');
    expect(text('[data-section="chosen"]')).toBe('Nothing chosen yet.');
  });

  it('when the feeler does not enter, then it emits the result, presses the button and passes', () => {
    const { host, button, choose, outcome, text } = setUp();
    choose('no-entry');
    expect(host.emitted).toEqual(['no-entry']);
    expect(button('no-entry').getAttribute('aria-pressed')).toBe('true');
    expect(outcome()).toBe('pass');
    expect(text('rl-verdict-card .reason')).toBe('The 0.5 mm feeler does not enter the joint between runner and steel.');
    expect(text('rl-verdict-card .decides')).toBe('The rulebook in force and the technical delegate decide.');
    expect(text('[data-section="chosen"]')).toBe('Chosen: Does not enter.');
  });

  it('when the feeler enters up to half the steel width, then it refers to the delegate and says extra finish inspections follow', () => {
    const { choose, outcome, text } = setUp();
    choose('enters-up-to-half');
    expect(outcome()).toBe('refer-to-delegate');
    expect(text('rl-verdict-card .outcome')).toBe('⚑ Refer to the technical delegate');
    expect(text('rl-verdict-card .reason')).toContain('this sled gets extra finish inspections');
  });

  it('when the feeler passes right across, then it is a violation to report', () => {
    const { choose, outcome, text, button } = setUp();
    choose('no-entry');
    choose('passes-across');
    expect(outcome()).toBe('fail');
    expect(text('rl-verdict-card .reason')).toContain('a violation on the spot');
    expect(button('passes-across').getAttribute('aria-pressed')).toBe('true');
    expect(button('no-entry').getAttribute('aria-pressed')).toBe('false');
  });

  it('emits once per change, not when the same result is tapped again', () => {
    const { host, choose } = setUp();
    choose('enters-beyond-half');
    choose('enters-beyond-half');
    choose('no-entry');
    expect(host.emitted).toEqual(['enters-beyond-half', 'no-entry']);
  });

  it('keeps the choice made here while the host has not passed it back yet', () => {
    const { host, choose, button, outcome } = setUp((h) => (h.passBack = false));
    choose('passes-across');
    expect(host.saved()).toBeNull();
    expect(button('passes-across').getAttribute('aria-pressed')).toBe('true');
    expect(outcome()).toBe('fail');
  });

  it('restores a saved result with its verdict, without emitting', () => {
    const { host, button, outcome } = setUp((h) => h.saved.set('enters-up-to-half'));
    expect(host.emitted).toEqual([]);
    expect(button('enters-up-to-half').getAttribute('aria-pressed')).toBe('true');
    expect(outcome()).toBe('refer-to-delegate');
  });

  it('when the competition is on natural track, then the engine refuses in words, never a pass', () => {
    const { choose, element, text } = setUp((h) => h.profile.set(natural));
    expect(text('[data-section="how"]')).toContain('Run the feeler along the joint');
    expect(text('button[data-result="no-entry"]')).toBe('? Does not enter');
    choose('no-entry');
    expect(element.querySelector('rl-verdict-card')).toBeNull();
    expect(text('[data-section="judgement"] p')).toBe(
      '⚠ No verdict: The gap probe is an artificial-track check: this competition is on natural track. Refer to the technical delegate.',
    );
    expect(text('[data-section="judgement"] .decides')).toBe('The rulebook in force and the technical delegate decide.');
  });
});
