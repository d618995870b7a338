import { Component, signal } from '@angular/core';
import type { RulesProfile } from '../../../../shared/rules/rules-profile';
import { shippedProfile } from '../../../../shared/rules/shipped-profiles';
import { EquipmentStep, type EquipmentAnswers } from './equipment-step';
import { mountStep, squash } from './testing/mount-step';

// Equipment lists of the shipped profiles: trade practice, no published source.
const natural = shippedProfile('natural', 'international');
const artificial = shippedProfile('artificial', 'international');

@Component({
  imports: [EquipmentStep],
  template: `
    <rl-equipment-step
      [profile]="profile()"
      [bib]="bib()"
      [saved]="saved()"
      [savedBibConfirmed]="savedBib()"
      (answered)="onAnswered($event)"
    />
  `,
})
class Host {
  readonly profile = signal<RulesProfile>(artificial);
  readonly bib = signal(17);
  readonly saved = signal<Record<string, boolean> | null>(null);
  readonly savedBib = signal<boolean | null>(null);
  readonly emitted: EquipmentAnswers[] = [];

  /** Like the real host: keep every change and pass the saved answers back in. */
  onAnswered(answers: EquipmentAnswers): void {
    this.emitted.push(answers);
    this.saved.set(answers.present);
    this.savedBib.set(answers.bibConfirmed);
  }
}

function setUp(change: (host: Host) => void = () => {}) {
  const { fixture, element, text } = mountStep(Host, change);
  const button = (item: string, answer: 'present' | 'missing') => {
    fixture.detectChanges();
    const found = element.querySelector<HTMLButtonElement>(`[data-item="${item}"] button[data-answer="${answer}"]`);
    if (!found) throw new Error(`No ${answer} button for ${item}`);
    return found;
  };
  const mark = (item: string, answer: 'present' | 'missing') => {
    button(item, answer).click();
    fixture.detectChanges();
  };
  const markAll = (profile: RulesProfile) => {
    mark('bib', 'present');
    for (const item of profile.equipment) mark(item.id, 'present');
  };
  return { fixture, element, text, button, mark, markAll, host: fixture.componentInstance };
}

describe('EquipmentStep', () => {
  it('shows the caution, the bib first and one row per equipment item with both answers in words', () => {
    const { element, text, button } = setUp();
    expect(text('.caution')).toContain('A sled without its safety equipment does not start.');
    const rows = [...element.querySelectorAll('[data-item]')].map((row) => row.getAttribute('data-item'));
    expect(rows).toEqual(['bib', 'race-equipment', 'bib-fixed']);
    expect(text('[data-item="bib"] .label')).toBe('Bib 17 worn and readable');
    expect(text('[data-item="race-equipment"] .label')).toBe('Race equipment');
    expect(text('[data-item="race-equipment"] [data-section="state"]')).toBe('Not answered yet');
    expect(button('bib', 'present').textContent).toContain('Present');
    expect(button('bib', 'missing').textContent).toContain('Missing');
    expect(button('bib', 'present').getAttribute('aria-pressed')).toBe('false');
  });

  it('when nothing is answered yet, shows no verdict and says what is still to answer', () => {
    const { element, text } = setUp();
    expect(element.querySelector('rl-verdict-card')).toBeNull();
    expect(text('[data-section="to-answer"]')).toBe('? Still to answer: Bib 17 worn and readable, Race equipment, Start-number bib fixed.');
  });

  it('when one item is still unanswered, shows no verdict and names only that item', () => {
    const { element, text, mark } = setUp();
    mark('bib', 'present');
    mark('bib-fixed', 'present');
    expect(element.querySelector('rl-verdict-card')).toBeNull();
    expect(text('[data-section="to-answer"]')).toBe('? Still to answer: Race equipment.');
  });

  it('when the bib and every item are present, the verdict passes in words', () => {
    const { element, text, markAll, button } = setUp((host) => host.profile.set(natural));
    markAll(natural);
    expect(element.querySelector('[data-section="to-answer"]')).toBeNull();
    expect(element.querySelector('[data-section="bib-missing"]')).toBeNull();
    const card = text('rl-verdict-card');
    expect(card).toContain('Within the limit');
    expect(card).toContain('All 6 equipment items confirmed present.');
    expect(card).toContain('Confirmed present: 6 of 6');
    expect(button('helmet', 'present').getAttribute('aria-pressed')).toBe('true');
    expect(button('helmet', 'missing').getAttribute('aria-pressed')).toBe('false');
    expect(text('[data-item="helmet"] [data-section="state"]')).toBe('Marked present');
  });

  it('when one item is missing, the verdict fails and names it', () => {
    const { element, text, markAll, mark, button } = setUp((host) => host.profile.set(natural));
    markAll(natural);
    mark('helmet', 'missing');
    const card = text('rl-verdict-card');
    expect(card).toContain('Fails the check: violation to report');
    expect(card).toContain('No start without safety equipment: missing Helmet');
    expect(card).toContain('Confirmed present: 5 of 6');
    expect(button('helmet', 'missing').getAttribute('aria-pressed')).toBe('true');
    expect(text('[data-item="helmet"] [data-section="state"]')).toBe('Marked missing');
    expect(element.querySelector('[data-section="bib-missing"]')).toBeNull();
  });

  it('when the bib is marked missing, says in its own line that the sled does not start', () => {
    const { text, markAll, mark } = setUp();
    markAll(artificial);
    mark('bib', 'missing');
    expect(text('[data-section="bib-missing"]')).toBe('✕ Bib not confirmed: the sled does not start until the bib is right.');
    expect(text('rl-verdict-card')).toContain('All 2 equipment items confirmed present.');
  });

  it('emits the answers so far on each change, and not when the same answer is tapped again', () => {
    const { host, mark } = setUp();
    mark('race-equipment', 'present');
    mark('race-equipment', 'present');
    mark('bib', 'present');
    mark('bib-fixed', 'missing');
    expect(host.emitted).toEqual([
      { present: { 'race-equipment': true }, bibConfirmed: null },
      { present: { 'race-equipment': true }, bibConfirmed: true },
      { present: { 'race-equipment': true, 'bib-fixed': false }, bibConfirmed: true },
    ]);
  });

  it('restores saved answers and judges them without a tap', () => {
    const { host, element, text, button } = setUp((host) => {
      host.saved.set({ 'race-equipment': true, 'bib-fixed': false });
      host.savedBib.set(true);
    });
    expect(host.emitted).toEqual([]);
    expect(button('bib', 'present').getAttribute('aria-pressed')).toBe('true');
    expect(button('bib-fixed', 'missing').getAttribute('aria-pressed')).toBe('true');
    expect(element.querySelector('[data-section="to-answer"]')).toBeNull();
    expect(text('rl-verdict-card')).toContain('No start without safety equipment: missing Start-number bib fixed');
  });

  it('brings a bib not answered yet back as still to answer, and ignores saved items not on the list', () => {
    const { element, text } = setUp((host) => {
      host.saved.set({ 'race-equipment': true, 'bib-fixed': true, helmet: true });
      host.savedBib.set(null);
    });
    expect(element.querySelector('rl-verdict-card')).toBeNull();
    expect(text('[data-section="to-answer"]')).toBe('? Still to answer: Bib 17 worn and readable.');
  });

  it('brings a saved wrong bib back as marked missing', () => {
    const { text, button } = setUp((host) => {
      host.saved.set({ 'race-equipment': true, 'bib-fixed': true });
      host.savedBib.set(false);
    });
    expect(button('bib', 'missing').getAttribute('aria-pressed')).toBe('true');
    expect(text('[data-section="bib-missing"]')).toBe('✕ Bib not confirmed: the sled does not start until the bib is right.');
  });
});
