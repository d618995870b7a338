import { Component, provideZonelessChangeDetection, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { By } from '@angular/platform-browser';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatInputHarness } from '@angular/material/input/testing';
import { GloveKeypad } from './glove-keypad';
import { KEYPAD_DRAFT_CLOCK } from './keypad-draft-clock';

@Component({
  imports: [GloveKeypad],
  template: `
    <rl-glove-keypad
      label="Steel temperature"
      unit="°C"
      [minTenths]="minTenths()"
      [maxTenths]="maxTenths()"
      [allowNegative]="allowNegative()"
      [initialTenths]="initialTenths()"
      [draftKey]="draftKey()"
      (committed)="values.push($event)"
    />
  `,
})
class Host {
  readonly minTenths = signal<number | null>(-200);
  readonly maxTenths = signal<number | null>(50);
  readonly allowNegative = signal(true);
  readonly initialTenths = signal<number | null>(null);
  readonly draftKey = signal<string | null>(null);
  readonly values: number[] = [];
}

/** The keypad's clock, set by each spec so a draft can age without timers. */
const clock = { now: Date.parse('2027-01-09T09:00:00.000Z') };

function setUp(change: (host: Host) => void = () => {}) {
  TestBed.configureTestingModule({
    providers: [provideZonelessChangeDetection(), { provide: KEYPAD_DRAFT_CLOCK, useValue: () => clock.now }],
  });
  return mount(change);
}

/** Shows a new keypad in the module already set up: after `fixture.destroy()`, like the app started again. */
function mount(change: (host: Host) => void = () => {}) {
  const fixture = TestBed.createComponent(Host);
  change(fixture.componentInstance);
  fixture.detectChanges();
  const element = fixture.nativeElement as HTMLElement;
  const key = (label: string) =>
    [...element.querySelectorAll<HTMLButtonElement>('.keys button')].find((b) => b.textContent?.trim() === label);
  const press = (...labels: string[]) => {
    for (const label of labels) {
      const button = key(label);
      if (!button) throw new Error(`no key "${label}"`);
      button.click();
      fixture.detectChanges();
    }
  };
  const display = () => element.querySelector('output')?.textContent?.replace(/\s+/g, ' ').trim() ?? '';
  const problem = () => element.querySelector('.problem')?.textContent?.replace(/\s+/g, ' ').trim() ?? '';
  const typeKeys = (...keys: string[]) => {
    for (const name of keys) {
      element.querySelector('output')!.dispatchEvent(new KeyboardEvent('keydown', { key: name, bubbles: true, cancelable: true }));
      fixture.detectChanges();
    }
  };
  const values = () => fixture.componentInstance.values;
  const restoredLine = () => element.querySelector('[data-section="restored"]')?.textContent?.replace(/\s+/g, ' ').trim() ?? null;
  return { fixture, element, key, press, display, problem, typeKeys, values, restoredLine };
}

describe('GloveKeypad', () => {
  it('when the host has saved a value and clears the keypad, then the next value starts from nothing', () => {
    const { fixture, press, display, values } = setUp();
    press('1', '.', '2', 'OK');
    expect(values()).toEqual([12]);
    fixture.debugElement.query((node) => node.componentInstance instanceof GloveKeypad).componentInstance.clear();
    fixture.detectChanges();
    expect(display()).toBe('No value yet');
  });

  it('when shown, then it names the value, its range and unit, and no text field is there to open the phone keyboard', () => {
    const { element, display } = setUp();
    expect(element.querySelector('.label')?.textContent).toBe('Steel temperature');
    expect(element.querySelector('.range')?.textContent).toBe('From −20.0 °C to +5.0 °C');
    expect(display()).toBe('No value yet');
    expect(element.querySelector('input')).toBeNull();
    expect(document.activeElement?.tagName).not.toBe('INPUT');
  });

  it('when digits, a point and ± are pressed, then the display shows them with the unit and OK hands over tenths', () => {
    const { press, display, values } = setUp();
    press('3', '.', '4');
    expect(display()).toBe('3.4 °C');
    press('±');
    expect(display()).toBe('−3.4 °C');
    press('±', '±', 'OK');
    expect(values()).toEqual([-34]);
  });

  it('when the point is pressed twice or a second decimal is keyed, then it is refused in words and the entry stays', () => {
    const { press, display, problem, values } = setUp();
    press('4', '.', '.');
    expect(display()).toBe('4. °C');
    expect(problem()).toContain('One decimal point only');
    press('9', '5');
    expect(display()).toBe('4.9 °C');
    expect(problem()).toBe('⚠ One decimal only: press ⌫ to change the last digit.');
    press('OK');
    expect(values()).toEqual([49]);
  });

  it('when the entry can no longer come into range, then the message says so while typing and OK refuses it', () => {
    const { press, problem, values } = setUp();
    press('1');
    expect(problem()).toBe('');
    press('2');
    expect(problem()).toBe('⚠ Too high: above the highest allowed, at most +5.0 °C here.');
    press('OK');
    expect(values()).toEqual([]);
  });

  it('when a partial entry could still grow into range, then there is no message until OK, which refuses it as too low', () => {
    const { fixture, press, problem, values } = setUp((host) => {
      host.minTenths.set(100);
      host.maxTenths.set(500);
      host.allowNegative.set(false);
    });
    expect(fixture.nativeElement.querySelector('.range').textContent).toBe('From +10.0 °C to +50.0 °C');
    press('5');
    expect(problem()).toBe('');
    press('OK');
    expect(problem()).toBe('⚠ Too low: below the lowest allowed, at least +10.0 °C here.');
    expect(values()).toEqual([]);
    press('0');
    expect(problem()).toBe('');
    press('OK');
    expect(values()).toEqual([500]);
  });

  it('when OK is pressed with nothing keyed, then it asks for a value', () => {
    const { press, problem, values } = setUp();
    press('OK');
    expect(problem()).toBe('⚠ Key in a value first, then press OK.');
    expect(values()).toEqual([]);
  });

  it('when ⌫ is pressed, then the last key goes; when Clear is pressed, then everything goes', () => {
    const { press, display } = setUp();
    press('±', '1', '.', '5', '⌫');
    expect(display()).toBe('−1. °C');
    press('⌫', '⌫');
    expect(display()).toBe('− °C');
    press('3', '.', '2', 'Clear');
    expect(display()).toBe('No value yet');
  });

  it('when negatives are not used, then there is no ± key and 0 takes its place', () => {
    const { key } = setUp((host) => host.allowNegative.set(false));
    expect(key('±')).toBeUndefined();
    expect(key('0')?.classList).toContain('is-wide');
  });

  it('when a value was recorded before, then it is shown and OK hands it over unchanged', () => {
    const { press, display, values } = setUp((host) => host.initialTenths.set(-49));
    expect(display()).toBe('−4.9 °C');
    press('OK');
    expect(values()).toEqual([-49]);
  });

  it('when "Type instead" is chosen, then a focused text field reads a comma and a true minus, and Enter hands over tenths', async () => {
    const { fixture, element, display, values } = setUp();
    const toggle = element.querySelector<HTMLButtonElement>('.type-toggle')!;
    toggle.click();
    await fixture.whenStable();
    const field = element.querySelector('input')!;
    expect(document.activeElement).toBe(field);
    expect(field.getAttribute('inputmode')).toBe('text');
    expect(toggle.getAttribute('aria-pressed')).toBe('true');

    const input = await TestbedHarnessEnvironment.loader(fixture).getHarness(MatInputHarness);
    await input.setValue('−3,4');
    expect(display()).toBe('−3.4 °C');
    field.dispatchEvent(new KeyboardEvent('keydown', { key: 'Enter', bubbles: true }));
    expect(values()).toEqual([-34]);
  });

  it('when the typed text has two decimals or is out of range, then the same words appear and OK refuses it', async () => {
    const { fixture, element, press, problem, values } = setUp();
    element.querySelector<HTMLButtonElement>('.type-toggle')!.click();
    await fixture.whenStable();
    const input = await TestbedHarnessEnvironment.loader(fixture).getHarness(MatInputHarness);
    await input.setValue('3.45');
    expect(problem()).toBe('⚠ One decimal only: "3.45" has 2 digits after the point.');
    press('OK');
    expect(values()).toEqual([]);
    await input.setValue('7');
    expect(problem()).toBe('⚠ Too high: above the highest allowed, at most +5.0 °C here.');
    press('OK');
    expect(values()).toEqual([]);
    press('⌫', '2');
    expect(await input.getValue()).toBe('2');
    press('OK');
    expect(values()).toEqual([20]);
  });

  it('when negatives are not used, then the typed field asks the phone for its decimal keyboard', async () => {
    const { fixture, element } = setUp((host) => host.allowNegative.set(false));
    element.querySelector<HTMLButtonElement>('.type-toggle')!.click();
    await fixture.whenStable();
    expect(element.querySelector('input')?.getAttribute('inputmode')).toBe('decimal');
  });

  it('when a hardware keyboard types digits, a comma, a minus, Backspace and Enter, then they work like the keys', () => {
    const { display, typeKeys, values } = setUp();
    typeKeys('-', '2', ',', '5');
    expect(display()).toBe('−2.5 °C');
    typeKeys('Backspace', '7', 'Enter');
    expect(values()).toEqual([-27]);
    typeKeys('Delete');
    expect(display()).toBe('No value yet');
  });

  it('when Enter is pressed on the "Type instead" toggle, then nothing is handed over; Enter on a key is OK', () => {
    const { fixture, element, key, press, values } = setUp();
    press('2');
    element.querySelector('.type-toggle')!.dispatchEvent(new KeyboardEvent('keydown', { key: 'Enter', bubbles: true }));
    expect(values()).toEqual([]);
    key('7')!.dispatchEvent(new KeyboardEvent('keydown', { key: 'Enter', bubbles: true, cancelable: true }));
    fixture.detectChanges();
    expect(values()).toEqual([20]);
  });

  it('when shown, then every key is a button in phone order, ⌫ is named in words and the display is a live region', () => {
    const { element } = setUp();
    const keys = [...element.querySelectorAll<HTMLButtonElement>('.keys button')];
    expect(keys.map((k) => k.textContent?.trim())).toEqual(['1', '2', '3', '4', '5', '6', '7', '8', '9', '±', '0', '.', 'Clear', '⌫', 'OK']);
    expect(keys.every((k) => k.type === 'button')).toBe(true);
    expect(element.querySelector('.backspace')?.getAttribute('aria-label')).toBe('Delete the last key');
    expect(element.querySelector('.sign')?.getAttribute('aria-label')).toBe('Change the sign, plus or minus');
    const output = element.querySelector('output')!;
    expect(output.getAttribute('aria-live')).toBe('polite');
    expect(output.getAttribute('role')).toBe('status');
    expect(element.querySelector('.problem')?.getAttribute('aria-live')).toBe('polite');
  });
});

describe('GloveKeypad drafts', () => {
  const spotKey = 'check:7:steel:left:1';
  const stored = (draftKey: string) => localStorage.getItem(`rimelog.keypad-draft.${draftKey}`);
  const withKey = (draftKey: string | null) => (host: Host) => host.draftKey.set(draftKey);

  beforeEach(() => {
    localStorage.clear();
    clock.now = Date.parse('2027-01-09T09:00:00.000Z');
  });

  it('when a value is half keyed and the app is killed, then a new keypad with the same key shows it, sign and point included, marked not saved', () => {
    const first = setUp(withKey(spotKey));
    first.press('4', '±', '.');
    expect(first.display()).toBe('−4. °C');
    expect(first.restoredLine()).toBeNull();
    expect(JSON.parse(stored(spotKey)!)).toEqual({
      entry: { isNegative: true, whole: '4', hasPoint: true, tenth: '' },
      isTyping: false,
      typedText: '',
      savedAt: clock.now,
    });
    first.fixture.destroy();

    const again = mount(withKey(spotKey));
    expect(again.display()).toBe('−4. °C');
    expect(again.restoredLine()).toBe('◌ Restored: not saved yet');
    const restoredId = again.element.querySelector('[data-section="restored"]')!.id;
    expect(again.element.querySelector('output')?.getAttribute('aria-labelledby')).toContain(restoredId);
    again.press('5', 'OK');
    expect(again.values()).toEqual([-45]);
  });

  it('when every key is written, then ⌫ and Clear are kept too, and back at the start there is nothing to restore', () => {
    const first = setUp(withKey(spotKey));
    first.press('1', '2', '⌫');
    expect(JSON.parse(stored(spotKey)!).entry).toEqual({ isNegative: false, whole: '1', hasPoint: false, tenth: '' });
    first.press('Clear');
    expect(stored(spotKey)).toBeNull();
    first.fixture.destroy();
    expect(mount(withKey(spotKey)).restoredLine()).toBeNull();
  });

  it('when the text field was open, then it comes back open with the typed text, its problem and the entry', async () => {
    const first = setUp(withKey(spotKey));
    first.element.querySelector<HTMLButtonElement>('.type-toggle')!.click();
    await first.fixture.whenStable();
    expect(JSON.parse(stored(spotKey)!)).toMatchObject({ isTyping: true, typedText: '' });
    const input = await TestbedHarnessEnvironment.loader(first.fixture).getHarness(MatInputHarness);
    await input.setValue('−3,4');
    await input.setValue('−3,45');
    expect(JSON.parse(stored(spotKey)!)).toMatchObject({ isTyping: true, typedText: '−3,45' });
    first.fixture.destroy();

    const again = mount(withKey(spotKey));
    await again.fixture.whenStable();
    expect(again.element.querySelector('.type-toggle')?.getAttribute('aria-pressed')).toBe('true');
    expect(again.element.querySelector('input')?.value).toBe('−3,45');
    expect(again.display()).toBe('−3.4 °C');
    expect(again.problem()).toBe('⚠ One decimal only: "−3,45" has 2 digits after the point.');
    expect(again.restoredLine()).toBe('◌ Restored: not saved yet');
    // Restored, the text field waits for the official: the phone keyboard does not open by itself.
    expect(document.activeElement?.tagName).not.toBe('INPUT');
  });

  it('when OK hands the value over, then the draft is gone and a new keypad starts from nothing', () => {
    const first = setUp(withKey(spotKey));
    first.press('2', '.', '5', 'OK');
    expect(first.values()).toEqual([25]);
    expect(stored(spotKey)).toBeNull();
    first.fixture.destroy();
    const again = mount(withKey(spotKey));
    expect(again.display()).toBe('No value yet');
    expect(again.restoredLine()).toBeNull();
  });

  it('when OK is refused, then the draft stays', () => {
    const { press } = setUp(withKey(spotKey));
    press('9', '9', 'OK');
    expect(JSON.parse(stored(spotKey)!).entry.whole).toBe('99');
  });

  it('when a restored value is handed over, then the "not saved yet" line goes', () => {
    const first = setUp(withKey(spotKey));
    first.press('3', '±');
    first.fixture.destroy();
    const again = mount(withKey(spotKey));
    expect(again.restoredLine()).toBe('◌ Restored: not saved yet');
    again.press('OK');
    expect(again.values()).toEqual([-30]);
    expect(again.restoredLine()).toBeNull();
  });

  it('when the host clears the keypad, then the draft is gone too', () => {
    const { fixture, press, display } = setUp(withKey(spotKey));
    press('7');
    (fixture.debugElement.query(By.directive(GloveKeypad)).componentInstance as GloveKeypad).clear();
    fixture.detectChanges();
    expect(display()).toBe('No value yet');
    expect(stored(spotKey)).toBeNull();
  });

  it('when a draft is older than 12 hours, then it is dropped and the recorded value shows instead', () => {
    const first = setUp(withKey(spotKey));
    first.press('1', '±');
    first.fixture.destroy();
    clock.now += 12 * 60 * 60_000 + 1;
    const again = mount((host) => {
      host.draftKey.set(spotKey);
      host.initialTenths.set(-49);
    });
    expect(again.display()).toBe('−4.9 °C');
    expect(again.restoredLine()).toBeNull();
    expect(stored(spotKey)).toBeNull();
  });

  it('when a draft is just under 12 hours old, then it still wins over the recorded value', () => {
    const first = setUp(withKey(spotKey));
    first.press('1', '±');
    first.fixture.destroy();
    clock.now += 12 * 60 * 60_000 - 60_000;
    const again = mount((host) => {
      host.draftKey.set(spotKey);
      host.initialTenths.set(-49);
    });
    expect(again.display()).toBe('−1 °C');
    expect(again.restoredLine()).toBe('◌ Restored: not saved yet');
  });

  it('when a recorded value was cleared with the Clear key, then the empty entry is restored, not the recorded value', () => {
    const first = setUp((host) => {
      host.draftKey.set(spotKey);
      host.initialTenths.set(-49);
    });
    first.press('Clear');
    first.fixture.destroy();
    const again = mount((host) => {
      host.draftKey.set(spotKey);
      host.initialTenths.set(-49);
    });
    expect(again.display()).toBe('No value yet');
    expect(again.restoredLine()).toBe('◌ Restored: not saved yet');
  });

  it('when the keypad has no draft key, then nothing is written to the device', async () => {
    const { fixture, element, press } = setUp();
    press('±', '4', '.', '2');
    element.querySelector<HTMLButtonElement>('.type-toggle')!.click();
    await fixture.whenStable();
    const input = await TestbedHarnessEnvironment.loader(fixture).getHarness(MatInputHarness);
    await input.setValue('3');
    press('OK');
    expect(localStorage.length).toBe(0);
  });

  it('when the draft key is another one, then its own draft shows and no other; switching keys brings each back', () => {
    const first = setUp(withKey('check:7:steel:left:1'));
    first.press('6', '±');
    first.fixture.destroy();

    const other = mount(withKey('check:7:steel:right:1'));
    expect(other.display()).toBe('No value yet');
    expect(other.restoredLine()).toBeNull();
    other.press('2');
    other.fixture.componentInstance.draftKey.set('check:7:steel:left:1');
    other.fixture.detectChanges();
    expect(other.display()).toBe('−6 °C');
    expect(other.restoredLine()).toBe('◌ Restored: not saved yet');
    other.fixture.componentInstance.draftKey.set('check:7:steel:right:1');
    other.fixture.detectChanges();
    expect(other.display()).toBe('2 °C');
  });

  it('when the device storage is full or blocked, then keying and OK still work', () => {
    const setItem = vi.spyOn(Storage.prototype, 'setItem').mockImplementation(() => {
      throw new DOMException('The quota has been exceeded.', 'QuotaExceededError');
    });
    try {
      const { press, display, values } = setUp(withKey(spotKey));
      press('±', '1', '.', '5');
      expect(display()).toBe('−1.5 °C');
      expect(setItem).toHaveBeenCalled();
      press('OK');
      expect(values()).toEqual([-15]);
    } finally {
      setItem.mockRestore();
    }
  });
});
