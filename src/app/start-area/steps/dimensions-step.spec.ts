import { Component, signal } from '@angular/core';
import { acceptDemoValues } from '../../../../shared/rules/profile-values';
import type { RulesProfile } from '../../../../shared/rules/rules-profile';
import { shippedProfile } from '../../../../shared/rules/shipped-profiles';
import type { SavedDimensions } from './dimension-readings';
import { DimensionsStep, type MeasuredDimension, type SeenDimension } from './dimensions-step';
import { mountStep, squash } from './testing/mount-step';

// Demo values, invented for the demo race, not rule values: handguard height 120.0–200.0 mm,
// handguard width 300.0–450.0 mm, steel angle 0.0–20.0°.
const demo = acceptDemoValues(shippedProfile('natural', 'national'));

@Component({
  imports: [DimensionsStep],
  template: `<rl-dimensions-step [profile]="profile()" [saved]="saved()" (measured)="onMeasured($event)" (seen)="onSeen($event)" />`,
})
class Host {
  readonly profile = signal<RulesProfile>(demo);
  readonly saved = signal<SavedDimensions>({ values: {}, byEye: {} });
  readonly measured: MeasuredDimension[] = [];
  readonly seen: SeenDimension[] = [];

  /** Like the real host: keep each value under its place key and pass the saved ones back in. */
  onMeasured(measured: MeasuredDimension): void {
    this.measured.push(measured);
    const key = measured.place === null ? measured.kind : `${measured.kind}:${measured.place}`;
    this.saved.update((saved) => ({ ...saved, values: { ...saved.values, [key]: measured.tenths } }));
  }

  onSeen(seen: SeenDimension): void {
    this.seen.push(seen);
    this.saved.update((saved) => ({ ...saved, byEye: { ...saved.byEye, [seen.kind]: seen.acceptable } }));
  }
}

function setUp(change: (host: Host) => void = () => {}) {
  const { fixture, element, text } = mountStep(Host, change);
  const all = <T extends Element = HTMLElement>(selector: string) => {
    fixture.detectChanges();
    return [...element.querySelectorAll<T & Element>(selector)];
  };
  /** The place key the one keypad on screen is open on. */
  const keypadPlace = () => {
    const pads = all('rl-glove-keypad');
    expect(pads).toHaveLength(1);
    return pads[0]!.getAttribute('data-keypad-for');
  };
  /** Presses keys on the one keypad on screen, e.g. keys('1', '5', 'Save'). */
  const keys = (...labels: string[]) => {
    for (const label of labels) {
      const key = all<HTMLButtonElement>('rl-glove-keypad .keys button').find((b) => b.textContent?.trim() === label);
      if (!key) throw new Error(`No key "${label}" on the keypad`);
      key.click();
    }
    fixture.detectChanges();
  };
  const click = (selector: string) => {
    const found = all<HTMLButtonElement>(selector)[0];
    if (!found) throw new Error(`Nothing to click at ${selector}`);
    found.click();
    fixture.detectChanges();
  };
  const outcome = (kind: string) => element.querySelector(`[data-dimension="${kind}"] rl-verdict-card`)?.getAttribute('data-outcome') ?? null;
  return { fixture, element, text, all, keys, click, keypadPlace, outcome, host: fixture.componentInstance };
}

describe('DimensionsStep', () => {
  it('when the step opens, then it shows the caution, the minimum set first and then the rest, with their ranges', () => {
    const { text, all } = setUp();
    expect(text('h2')).toBe('Dimensions');
    expect(text('.caution')).toBe('⚠ Sled upside down on the table. Be gentle with the steel edges. Calibrated instruments only.');
    expect(all('h3[id^="dimensions-"]').map((h) => h.textContent?.trim())).toEqual(['Minimum checks first', 'Then the rest']);
    expect(all('[data-section="minimum"] [data-dimension]').map((block) => block.getAttribute('data-dimension'))).toEqual([
      'handguard-height',
      'handguard-width',
      'full-width',
      'steel-angle',
    ]);
    expect(all('[data-section="rest"] [data-dimension]').map((block) => block.getAttribute('data-dimension'))).toEqual([
      'steel-distance',
      'runner-spacing',
      'bridge-thickness',
      'front-pin-height',
      'overall-height',
    ]);
    expect(text('[data-dimension="handguard-height"] [data-section="range"]')).toBe('Allowed: 120.0 mm to 200.0 mm');
    expect(text('[data-place="handguard-height"]')).toBe('not measured ▸ On the keypad');
    expect(text('[data-place="overall-height"]')).toBe('not measured Tap to measure');
    expect(text('[data-place="steel-angle:left:2"]')).toBe('Left steel, place 2 not measured Tap to measure');
  });

  it('when a minimum check is last in the profile, then it is still shown in the minimum set', () => {
    const { all } = setUp((h) => h.profile.set({ ...demo, dimensions: [...demo.dimensions].reverse() }));
    const minimum = all('[data-section="minimum"] [data-dimension]').map((block) => block.getAttribute('data-dimension'));
    expect(minimum).toEqual(['steel-angle', 'full-width', 'handguard-width', 'handguard-height']);
  });

  it('when a value is keyed, then it is emitted for its place and the keypad moves to the next place still unmeasured', () => {
    const { keys, keypadPlace, text, host } = setUp();
    expect(keypadPlace()).toBe('handguard-height');
    expect(text('rl-glove-keypad .label')).toBe('Handguard height');
    keys('1', '5', '0', 'Save');
    expect(host.measured).toEqual([{ kind: 'handguard-height', place: null, tenths: 1500 }]);
    expect(text('[data-place="handguard-height"] .place-value')).toBe('150.0 mm');
    expect(keypadPlace()).toBe('handguard-width');
    expect(text('[data-section="entered"]')).toBe('Handguard height: 150.0 mm entered. Next: handguard width.');
    expect(text('rl-glove-keypad output')).toBe('No value yet');
  });

  it('when the steel angle is measured, then it asks for 2 places on each steel and emits each place', () => {
    const { keys, keypadPlace, all, text, host } = setUp((h) =>
      h.saved.set({ values: { 'handguard-height': 1500, 'handguard-width': 3500, 'full-width': 4000 }, byEye: {} }),
    );
    expect(all('[data-dimension="steel-angle"] button[data-place]').map((b) => b.getAttribute('data-place'))).toEqual([
      'steel-angle:left:1',
      'steel-angle:left:2',
      'steel-angle:right:1',
      'steel-angle:right:2',
    ]);
    expect(keypadPlace()).toBe('steel-angle:left:1');
    expect(text('rl-glove-keypad .label')).toBe('Steel angle, left steel, place 1');
    expect(text('rl-glove-keypad .range')).toContain('0.1');
    keys('1', '.', '5', 'Save');
    expect(keypadPlace()).toBe('steel-angle:left:2');
    // A fresh keypad for the new place: the last value does not carry over.
    expect(text('rl-glove-keypad output')).toBe('No value yet');
    keys('1', 'Save');
    expect(keypadPlace()).toBe('steel-angle:right:1');
    expect(host.measured).toEqual([
      { kind: 'steel-angle', place: 'left:1', tenths: 15 },
      { kind: 'steel-angle', place: 'left:2', tenths: 10 },
    ]);
    expect(text('[data-dimension="steel-angle"] [data-section="judgement"]')).toBe(
      '◌ No verdict yet: measure the steel angle at right steel, place 1; right steel, place 2.',
    );
  });

  it('when a place is tapped, then the keypad opens there with its saved value, and moves on after saving', () => {
    const { click, keys, keypadPlace, text, host } = setUp((h) => h.saved.set({ values: { 'handguard-height': 1500 }, byEye: {} }));
    expect(keypadPlace()).toBe('handguard-width');
    click('[data-place="handguard-height"]');
    expect(keypadPlace()).toBe('handguard-height');
    expect(text('[data-place="handguard-height"] .hint')).toBe('▸ On the keypad');
    expect(text('rl-glove-keypad output')).toBe('150.0 mm');
    keys('⌫', '6', 'Save');
    expect(host.measured).toEqual([{ kind: 'handguard-height', place: null, tenths: 1506 }]);
    expect(keypadPlace()).toBe('handguard-width');
  });

  it('when every place of a rule is in, then its verdict card appears, and not before', () => {
    const threePlaces = { 'steel-angle:left:1': 10, 'steel-angle:left:2': 10, 'steel-angle:right:1': 10 };
    const { keys, outcome, click, text } = setUp((h) => h.saved.set({ values: threePlaces, byEye: {} }));
    expect(outcome('steel-angle')).toBeNull();
    click('[data-place="steel-angle:right:2"]');
    keys('1', '2', 'Save');
    expect(outcome('steel-angle')).toBe('pass');
    expect(text('[data-dimension="steel-angle"] rl-verdict-card .reason')).toBe(
      'Steel angle within the limits (0.0 ° to 20.0 °) at all 4 places.',
    );
    expect(text('[data-dimension="steel-angle"] rl-verdict-card .decides')).toBe('The rulebook in force and the technical delegate decide.');
  });

  it('when the handguard height is below the minimum, then its card shows the fail outcome with the numbers', () => {
    const { keys, outcome, text } = setUp();
    keys('1', '1', '9', '.', '9', 'Save');
    expect(outcome('handguard-height')).toBe('fail');
    expect(text('[data-dimension="handguard-height"] rl-verdict-card .outcome')).toBe('⚠ Fails the check: violation to report');
    expect(text('[data-dimension="handguard-height"] rl-verdict-card .reason')).toContain('119.9 mm is below the minimum 120.0 mm');
  });

  it('when the front pin is judged by eye, then the answer is emitted, pressed, and judged', () => {
    const { click, outcome, all, host, text } = setUp();
    expect(all('[data-dimension="front-pin-height"] button[data-place]')).toHaveLength(0);
    expect(text('[data-dimension="front-pin-height"] [data-section="range"]')).toBe('Judged by eye');
    const looksRight = '[data-dimension="front-pin-height"] button[data-answer="looks-right"]';
    const doesNot = '[data-dimension="front-pin-height"] button[data-answer="does-not-look-right"]';
    expect(all(looksRight)[0]?.getAttribute('aria-pressed')).toBe('false');
    expect(text(looksRight)).toBe('✓ Looks right');
    expect(text(doesNot)).toBe('✕ Does not look right');

    click(doesNot);
    expect(host.seen).toEqual([{ kind: 'front-pin-height', acceptable: false }]);
    expect(all(doesNot)[0]?.getAttribute('aria-pressed')).toBe('true');
    expect(all(looksRight)[0]?.getAttribute('aria-pressed')).toBe('false');
    expect(outcome('front-pin-height')).toBe('fail');

    click(looksRight);
    expect(host.seen).toEqual([
      { kind: 'front-pin-height', acceptable: false },
      { kind: 'front-pin-height', acceptable: true },
    ]);
    expect(outcome('front-pin-height')).toBe('pass');
  });

  it('when the organiser left the limits unset, then the range says so and a measured value gets no verdict', () => {
    const { keys, text, outcome } = setUp((h) => h.profile.set(shippedProfile('natural', 'national')));
    expect(text('[data-dimension="handguard-height"] [data-section="range"]')).toBe('Allowed range: not set by the organiser');
    keys('1', '5', '0', 'Save');
    expect(outcome('handguard-height')).toBeNull();
    const judgement = '[data-dimension="handguard-height"] [data-section="judgement"]';
    expect(text(`${judgement} p`)).toMatch(/^⚠ No verdict: .+ Refer to the technical delegate\.$/);
    expect(text(`${judgement} .decides`)).toBe('The rulebook in force and the technical delegate decide.');
  });

  it('when every place is measured, then no keypad is left open', () => {
    const values = {
      'handguard-height': 1500,
      'handguard-width': 3500,
      'full-width': 4000,
      'steel-angle:left:1': 10,
      'steel-angle:left:2': 10,
      'steel-angle:right:1': 10,
      'steel-angle:right:2': 10,
      'steel-distance': 3500,
      'runner-spacing': 3500,
      'bridge-thickness': 200,
    };
    const { keys, all, keypadPlace } = setUp((h) => h.saved.set({ values, byEye: {} }));
    expect(keypadPlace()).toBe('overall-height');
    keys('1', '5', '0', 'Save');
    expect(all('rl-glove-keypad')).toHaveLength(0);
  });
});
