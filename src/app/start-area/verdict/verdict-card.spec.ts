import { Component, provideZonelessChangeDetection, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { judgeSteelTemperature, type TimedReading } from '../../../../shared/rules/temperature';
import { profileWith } from '../../../../shared/rules/test-profiles';
import { verdict, type Verdict } from '../../../../shared/rules/verdict';
import { VerdictCard } from './verdict-card';

// The grace after a control reading falls due ships unset; 2 min is this spec's own assumption.
// Margin +5.0 °C and natural floor 0.0 °C: trade practice, no published source.
const natural = profileWith('natural', 'international', { 'controlSteel.grace': 2 });
const controls: TimedReading[] = [{ reading: { tenths: -49, unit: 'celsius' }, takenAt: '2027-01-09T09:00:00Z' }];
const steelVerdict = (tenths: number, takenAt: string) =>
  judgeSteelTemperature({ profile: natural, steel: { reading: { tenths, unit: 'celsius' }, takenAt, position: 'right-front' }, controlReadings: controls });

@Component({
  imports: [VerdictCard],
  template: `<rl-verdict-card [verdict]="verdict()" [heading]="heading()" />`,
})
class Host {
  readonly verdict = signal<Verdict>(steelVerdict(2, '2027-01-09T09:05:00Z'));
  readonly heading = signal('');
}

function setUp(change: (host: Host) => void = () => {}) {
  TestBed.configureTestingModule({ providers: [provideZonelessChangeDetection()] });
  const fixture = TestBed.createComponent(Host);
  change(fixture.componentInstance);
  fixture.detectChanges();
  const element = fixture.nativeElement as HTMLElement;
  const text = (selector: string) => element.querySelector(selector)?.textContent?.replace(/\s+/g, ' ').trim() ?? '';
  const all = (selector: string) => [...element.querySelectorAll(selector)].map((e) => e.textContent?.replace(/\s+/g, ' ').trim() ?? '');
  return { fixture, element, text, all };
}

describe('VerdictCard', () => {
  it('when a steel is over the limit, then it shows the mark and words, the reason and every number with its label', () => {
    // trade practice, no published source: natural, control −4.9 °C → limit +0.1 °C
    const { text, all } = setUp();
    expect(text('.outcome')).toBe('⚠ Fails the check: violation to report');
    expect(text('.reason')).toBe('Steel +0.2 °C is 0.1 °C over the limit of +0.1 °C.');
    expect(all('.number')).toEqual(['Steel (right, front): +0.2 °C', 'Control steel: −4.9 °C, read 5 min before', 'Limit: +0.1 °C']);
  });

  it('when the limit was worked out, then the steps sit in a collapsible part, closed at first', () => {
    const { element, all } = setUp();
    const details = element.querySelector('details.steps') as HTMLDetailsElement;
    expect(details.open).toBe(false);
    expect(details.querySelector('summary')?.textContent).toContain('How the limit was worked out');
    expect(all('.steps li')).toEqual(['Control −4.9 °C + 5.0 °C = +0.1 °C', 'Not below the floor of 0.0 °C, so the limit is +0.1 °C']);
  });

  it('when profile values were used, then each shows its value and its source, as the rules page words them', () => {
    const { all } = setUp();
    const used = all('.used li');
    expect(used).toHaveLength(4);
    expect(used[0]).toBe('Control steel reading every: 15 min (trade practice, no published source · verified)');
    expect(used[1]).toMatch(/: 2 min \(entered by the organiser: set by a test · verified\)$/);
    expect(used.some((line) => line.includes('+5.0 °C (trade practice, no published source · verified)'))).toBe(true);
  });

  it('when any verdict is shown, then it says that the rulebook in force and the technical delegate decide', () => {
    const { text, fixture } = setUp();
    expect(text('.decides')).toBe('The rulebook in force and the technical delegate decide.');
    fixture.componentInstance.verdict.set(verdict('steel-temperature', 'pass', 'Steel −1.0 °C is within the limit of +0.1 °C.'));
    fixture.detectChanges();
    expect(text('.decides')).toBe('The rulebook in force and the technical delegate decide.');
  });

  it('when the control reading is stale, then it says "Not judged" with the engine’s reason and no pass mark', () => {
    const { text, element } = setUp((host) => host.verdict.set(steelVerdict(-100, '2027-01-09T09:18:00Z')));
    expect(text('.outcome')).toBe('? Not judged');
    expect(text('.reason')).toMatch(/^Control reading overdue: the latest was read 18 min before this steel reading/);
    expect(element.textContent).not.toContain('✓');
    expect(element.querySelector('details.steps')).toBeNull();
  });

  it.each([
    ['pass', '✓ Within the limit'],
    ['fail', '⚠ Fails the check: violation to report'],
    ['refer-to-delegate', '⚑ Refer to the technical delegate'],
    ['not-judged', '? Not judged'],
  ] as const)('when the outcome is %s, then mark and words both show, and the mark alone is hidden from screen readers', (outcome, words) => {
    const { text, element } = setUp((host) => host.verdict.set(verdict('gap-probe', outcome, 'A reason.')));
    expect(text('.outcome')).toBe(words);
    expect(element.querySelector('.mark')?.getAttribute('aria-hidden')).toBe('true');
    expect(element.querySelector('rl-verdict-card')?.getAttribute('data-outcome')).toBe(outcome);
  });

  it('when a heading is given, then it names the card for screen readers together with the outcome', () => {
    const { element } = setUp((host) => host.heading.set('Right steel, spot 1 (front)'));
    const article = element.querySelector('article')!;
    const heading = element.querySelector(`#${article.getAttribute('aria-labelledby')}`);
    expect(heading?.textContent?.replace(/\s+/g, ' ').trim()).toBe('Right steel, spot 1 (front) ⚠ Fails the check: violation to report');
  });
});
