import { Component, provideZonelessChangeDetection, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import type { RulesProfile } from '../../../../shared/rules/rules-profile';
import type { TimedReading } from '../../../../shared/rules/temperature';
import { profileWith } from '../../../../shared/rules/test-profiles';
import { KEYPAD_DRAFT_CLOCK } from '../../ui/glove-keypad/keypad-draft-clock';
import { STEEL_READING_CLOCK } from './steel-reading-clock';
import type { SpotPlan, SpotReading } from './steel-spots';
import { SteelTemperatureStep } from './steel-temperature-step';

// The grace after a control reading falls due ships unset; 2 min is this spec's own assumption.
// Margin +5.0 °C, natural floor 0.0 °C and the 15 min interval: trade practice, no published source.
const natural = profileWith('natural', 'international', { 'controlSteel.grace': 2 });
const control = (tenths: number, takenAt: string): TimedReading => ({ reading: { tenths, unit: 'celsius' }, takenAt });
const at = (minute: number) => `2027-01-09T09:${String(minute).padStart(2, '0')}:00.000Z`;

@Component({
  imports: [SteelTemperatureStep],
  template: `
    <rl-steel-temperature-step
      [profile]="profile()"
      [controlReadings]="controls()"
      [preset]="preset()"
      [readings]="saved()"
      [draftScope]="draftScope()"
      (readingEntered)="onEntered($event)"
    />
  `,
})
class Host {
  readonly profile = signal<RulesProfile>(natural);
  readonly controls = signal<TimedReading[]>([control(-49, at(0))]);
  readonly preset = signal<SpotPlan | null>(null);
  readonly saved = signal<SpotReading[]>([]);
  readonly draftScope = signal<string | null>(null);
  readonly emitted: SpotReading[] = [];
  /** Like the real host: keep each reading and pass the saved ones back in. */
  savesAtOnce = true;

  onEntered(reading: SpotReading): void {
    this.emitted.push(reading);
    if (this.savesAtOnce) this.saved.update((saved) => [...saved, reading]);
  }
}

function setUp(change: (host: Host) => void = () => {}, { minute = 5 } = {}) {
  localStorage.clear();
  const clock = { now: Date.parse(at(minute)) };
  TestBed.configureTestingModule({
    providers: [
      provideZonelessChangeDetection(),
      { provide: STEEL_READING_CLOCK, useValue: () => clock.now },
      { provide: KEYPAD_DRAFT_CLOCK, useValue: () => clock.now },
    ],
  });
  return { ...mount(change), clock };
}

/** Shows a new step in the module already set up: after `fixture.destroy()`, like the app started again. */
function mount(change: (host: Host) => void = () => {}) {
  const fixture = TestBed.createComponent(Host);
  change(fixture.componentInstance);
  fixture.detectChanges();
  const element = fixture.nativeElement as HTMLElement;
  const squash = (text: string | null | undefined) => text?.replace(/\s+/g, ' ').trim() ?? '';
  const text = (selector: string) => {
    fixture.detectChanges();
    return squash(element.querySelector(selector)?.textContent);
  };
  const spot = (key: string) => {
    fixture.detectChanges();
    const button = element.querySelector<HTMLButtonElement>(`button[data-spot="${key}"]`);
    if (!button) throw new Error(`No spot ${key}`);
    return button;
  };
  const tap = (key: string) => {
    spot(key).click();
    fixture.detectChanges();
  };
  const keys = (...labels: string[]) => {
    for (const label of labels) {
      fixture.detectChanges();
      const key = [...element.querySelectorAll<HTMLButtonElement>('.keys button')].find((b) => b.textContent?.trim() === label);
      if (!key) throw new Error(`No key "${label}"`);
      key.click();
    }
    fixture.detectChanges();
  };
  const card = (key: string) => text(`rl-verdict-card[data-spot="${key}"]`);
  const host = fixture.componentInstance;
  return { fixture, element, text, spot, tap, keys, card, host, squash };
}

describe('SteelTemperatureStep', () => {
  it('when a spot is tapped and a value keyed, then the reading lands on that spot with the time and shows there at once', () => {
    const { tap, keys, host, spot, text, squash } = setUp((h) => (h.savesAtOnce = false));
    expect(text('[data-section="prompt"]')).toBe('Tap a spot on the sled to read it.');
    tap('left-1');
    expect(spot('left-1').getAttribute('aria-pressed')).toBe('true');
    expect(squash(spot('left-1').textContent)).toBe('▶ Spot 2');
    expect(text('.glove-keypad .label')).toBe('Left steel, spot 2: steel temperature');
    keys('6', '.', '2', '±', 'Save');
    expect(host.emitted).toEqual([{ steel: 'left', spot: 1, tenths: -62, takenAt: at(5) }]);
    // Not saved by the host yet, and still shown with its verdict.
    expect(squash(spot('left-1').textContent)).toBe('Spot 2 −6.2 °C ✓ within');
    expect(spot('left-1').getAttribute('aria-label')).toBe('Left steel, spot 2 of 5, from the front, read −6.2 °C, within the limit');
    expect(text('[data-section="entered"]')).toBe('Left steel, spot 2: −6.2 °C entered.');
  });

  it('when a reading is saved, then the keypad starts empty for the next spot', () => {
    const { tap, keys, text } = setUp();
    tap('right-0');
    keys('3', 'Save');
    tap('right-4');
    expect(text('.glove-keypad output')).toBe('No value yet');
  });

  it('when the athlete’s first sled set a plan, then its spots say "read here", the first is selected and each save moves on', () => {
    const { spot, squash, text, keys, host } = setUp((h) => h.preset.set({ left: [1, 3], right: [0, 4] }));
    expect(squash(spot('left-3').textContent)).toBe('Spot 4 ◌ read here');
    expect(spot('left-3').classList).toContain('is-preset');
    expect(spot('left-2').classList).not.toContain('is-preset');
    expect(spot('right-4').getAttribute('aria-label')).toBe('Right steel, spot 5 of 5, from the front, read here, as on the first sled');
    expect(text('.legend')).toContain('◌ read here: where this athlete’s first sled in the run was read');
    expect(squash(spot('left-1').textContent)).toBe('▶ Spot 2 ◌ read here');
    keys('5', '±', 'Save');
    expect(spot('left-3').getAttribute('aria-pressed')).toBe('true');
    keys('4', '±', 'Save', '3', '±', 'Save', '2', '±', 'Save');
    expect(host.emitted.map((r) => `${r.steel}-${r.spot}`)).toEqual(['left-1', 'left-3', 'right-0', 'right-4']);
    expect(text('[data-section="prompt"]')).toBe('Tap a spot on the sled to read it.');
  });

  it('when a spot off the preset is chosen, then it says where the first sled was read', () => {
    const { tap, text } = setUp((h) => h.preset.set({ left: [1, 3], right: [0, 4] }));
    tap('left-2');
    expect(text('[data-section="off-preset"]')).toContain('read at spot 2 and 4 of the left steel');
  });

  it('when a reading is over the limit, then its card and the sled say so in words and numbers', () => {
    // trade practice, no published source: natural, control −4.9 °C → limit +0.1 °C
    const { tap, keys, card, text, spot } = setUp();
    tap('right-0');
    keys('0', '.', '2', 'Save');
    expect(card('right-0')).toContain('⚠ Fails the check: violation to report');
    expect(card('right-0')).toContain('Steel +0.2 °C is 0.1 °C over the limit of +0.1 °C.');
    expect(card('right-0')).toContain('Control steel: −4.9 °C, read 5 min before');
    expect(card('right-0')).toContain('Limit: +0.1 °C');
    expect(spot('right-0').textContent).toContain('⚠ over');
    expect(text('[data-section="summary"] .outcome')).toBe('⚠ Fails the check: violation to report');
    expect(text('[data-section="summary"] .detail')).toBe('1 reading of 4 taken; 3 readings still needed (2 on the left steel and 1 on the right steel).');
    expect(text('[data-section="summary"] .decides')).toBe('The rulebook in force and the technical delegate decide.');
  });

  it('when all four are read within the limit, then each card names its spot and position and the sled is within the limit', () => {
    const { tap, keys, text, card } = setUp();
    for (const key of ['left-0', 'left-4', 'right-1', 'right-3']) {
      tap(key);
      keys('1', '±', 'Save');
    }
    expect(card('left-4')).toMatch(/^Left steel, spot 5 \(rear\) ✓ Within the limit/);
    expect(card('right-1')).toContain('Steel (right, front): −1.0 °C');
    expect(text('[data-section="summary"] .outcome')).toBe('✓ Within the limit');
    expect(text('[data-section="summary"] .detail')).toBe('All 4 readings taken.');
  });

  it('when readings are within the limit but some are missing, then the sled is "not complete", never within the limit', () => {
    const { tap, keys, text } = setUp();
    tap('left-0');
    keys('5', '±', 'Save');
    expect(text('[data-section="summary"] .outcome')).toBe('… Not complete yet');
    expect(text('[data-section="summary"]')).not.toContain('✓');
  });

  it('when the control reading is stale, then the reading is "Not judged" with the engine’s reason, never a pass', () => {
    const { tap, keys, card, text, spot } = setUp(() => {}, { minute: 18 });
    tap('left-0');
    keys('5', '±', 'Save');
    expect(card('left-0')).toContain('? Not judged');
    expect(card('left-0')).toContain('Control reading overdue: the latest was read 18 min before this steel reading');
    expect(spot('left-0').textContent).toContain('? not judged');
    expect(text('[data-section="summary"] .outcome')).toBe('? Not judged');
  });

  it('when no control reading was taken, then it is "Not judged" and asks for the control steel first', () => {
    const { tap, keys, card } = setUp((h) => h.controls.set([]));
    tap('left-0');
    keys('5', '±', 'Save');
    expect(card('left-0')).toContain('? Not judged');
    expect(card('left-0')).toContain('Read the control steel first');
    expect(card('left-0')).not.toContain('✓');
  });

  it('when the profile has a gap, then the sled is not judged and the engine’s words say why', () => {
    const { tap, keys, text, element } = setUp((h) => h.profile.set(profileWith('natural', 'international')));
    tap('left-0');
    keys('5', '±', 'Save');
    expect(text('[data-section="summary"] .outcome')).toBe('? Not judged');
    expect(text('[data-section="summary"] .detail')).toMatch(/^The rules profile has no value for ".+"\. The organiser must fill it in\.$/);
    expect(element.querySelector('rl-verdict-card')).toBeNull();
  });

  it('when a steel is read at two spots and a third is tapped, then it asks which one the new spot replaces', () => {
    const { tap, keys, text, host, spot, element } = setUp((h) => h.saved.set([
      { steel: 'left', spot: 1, tenths: -30, takenAt: at(2) },
      { steel: 'left', spot: 3, tenths: -31, takenAt: at(2) },
    ]));
    tap('left-2');
    expect(text('[data-section="replace-question"] p')).toBe(
      'Each steel is read at two spots. The left steel is read at spot 2 and spot 4 already: which reading does spot 3 replace?',
    );
    expect(element.querySelector('rl-glove-keypad')).toBeNull();
    const choices = [...element.querySelectorAll<HTMLButtonElement>('[data-section="replace-question"] button')];
    expect(choices.map((b) => b.textContent?.trim())).toEqual(['Replace spot 2 (−3.0 °C)', 'Replace spot 4 (−3.1 °C)', 'Keep both, do not read spot 3']);
    choices[1]!.click();
    expect(text('.glove-keypad .label')).toBe('Left steel, spot 3 (replaces spot 4): steel temperature');
    keys('2', '±', 'Save');
    expect(host.emitted).toEqual([{ steel: 'left', spot: 2, tenths: -20, takenAt: at(5), replacesSpot: 3 }]);
    expect(spot('left-3').textContent).not.toContain('°C');
    expect(spot('left-2').textContent).toContain('−2.0 °C');
    expect(spot('left-1').textContent).toContain('−3.0 °C');
  });

  it('when the official keeps both readings, then nothing is entered and no keypad is open', () => {
    const { tap, text, host, element } = setUp((h) => h.saved.set([
      { steel: 'right', spot: 0, tenths: -30, takenAt: at(2) },
      { steel: 'right', spot: 4, tenths: -31, takenAt: at(2) },
    ]));
    tap('right-2');
    [...element.querySelectorAll<HTMLButtonElement>('[data-section="replace-question"] button')].at(-1)!.click();
    expect(text('[data-section="prompt"]')).toBe('Tap a spot on the sled to read it.');
    expect(host.emitted).toEqual([]);
  });

  it('when a read spot is tapped again, then it is read again without a question', () => {
    const { tap, keys, host, spot, element } = setUp((h) => h.saved.set([
      { steel: 'right', spot: 0, tenths: -30, takenAt: at(2) },
      { steel: 'right', spot: 4, tenths: -31, takenAt: at(2) },
    ]));
    tap('right-4');
    expect(element.querySelector('[data-section="replace-question"]')).toBeNull();
    keys('4', '±', 'Save');
    expect(host.emitted[0]).toEqual({ steel: 'right', spot: 4, tenths: -40, takenAt: at(5) });
    expect(spot('right-4').textContent).toContain('−4.0 °C');
  });

  it('when the screen comes back with saved readings, then they are on the sled with their verdicts', () => {
    const { spot, card, text } = setUp((h) => h.saved.set([
      { steel: 'left', spot: 0, tenths: -12, takenAt: at(3) },
      { steel: 'left', spot: 2, tenths: 3, takenAt: at(3) },
    ]));
    expect(spot('left-0').textContent).toContain('−1.2 °C');
    expect(card('left-2')).toContain('⚠ Fails the check: violation to report');
    expect(card('left-0')).toMatch(/^Left steel, spot 1 \(front\) ✓ Within the limit/);
    expect(text('[data-section="summary"] .outcome')).toBe('⚠ Fails the check: violation to report');
  });

  it('when the keypad is shown, then the caution about steel edges stands beside it', () => {
    const { tap, text } = setUp();
    tap('left-0');
    expect(text('.caution')).toBe('⚠ Touch the pyrometer to the side of the steel, never the edge.');
  });

  it('when a spot is tapped, then the keypad below the sled is brought into view', async () => {
    const { tap, fixture } = setUp();
    const scrolled: Element[] = [];
    const original = Object.getOwnPropertyDescriptor(Element.prototype, 'scrollIntoView');
    // jsdom has no layout (and no scrollIntoView); record which element asked to be shown.
    Element.prototype.scrollIntoView = function (this: Element) {
      scrolled.push(this);
    };
    try {
      tap('right-2');
      await fixture.whenStable();
      expect(scrolled.map((e) => e.getAttribute('data-section'))).toEqual(['entry']);
    } finally {
      if (original) Object.defineProperty(Element.prototype, 'scrollIntoView', original);
      else delete (Element.prototype as Partial<Element>).scrollIntoView;
    }
  });

  it('when a reading is half keyed and the app is killed, then the same check opens on the same spot and shows it again, marked not saved', () => {
    const inCheck = (h: Host) => h.draftScope.set('check:c1');
    const first = setUp(inCheck);
    first.tap('left-1');
    first.keys('4', '±', '.');
    expect(localStorage.getItem('rimelog.keypad-draft.check:c1:steel:left:1')).not.toBeNull();
    first.fixture.destroy();

    const again = mount(inCheck);
    // It opens on the spot that was being read, with no tap.
    expect(again.text('.glove-keypad output')).toBe('−4. °C');
    expect(again.text('.glove-keypad')).toContain('Left steel, spot 2');
    again.tap('right-0');
    expect(again.text('.glove-keypad output')).toBe('No value yet');
    again.tap('left-1');
    expect(again.text('.glove-keypad output')).toBe('−4. °C');
    expect(again.text('.glove-keypad [data-section="restored"]')).toBe('◌ Restored: not saved yet');
    again.keys('2', 'Save');
    expect(again.host.emitted).toEqual([{ steel: 'left', spot: 1, tenths: -42, takenAt: at(5) }]);
    expect(localStorage.getItem('rimelog.keypad-draft.check:c1:steel:left:1')).toBeNull();
  });

  it('when another check reads the same spot, then it does not see this check’s draft', () => {
    const first = setUp((h) => h.draftScope.set('check:c1'));
    first.tap('left-1');
    first.keys('7', '±');
    first.fixture.destroy();

    const other = mount((h) => h.draftScope.set('check:c2'));
    other.tap('left-1');
    expect(other.text('.glove-keypad output')).toBe('No value yet');
    expect(other.element.querySelector('[data-section="restored"]')).toBeNull();
  });

  it('when the host names no check, then no draft is kept on the device', () => {
    const { tap, keys } = setUp();
    tap('left-1');
    keys('4', '±', '.');
    expect(localStorage.length).toBe(0);
  });

  it('when the diagram is drawn, then every spot is a button with its name for screen readers', () => {
    const { element } = setUp();
    const buttons = [...element.querySelectorAll<HTMLButtonElement>('rl-sled-diagram button.spot')];
    expect(buttons).toHaveLength(10);
    expect(buttons[1]!.getAttribute('aria-label')).toBe('Left steel, spot 2 of 5, from the front, not read');
    expect(buttons[9]!.getAttribute('aria-label')).toBe('Right steel, spot 5 of 5, from the front, not read');
  });
});
