import { Component, provideZonelessChangeDetection, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatInputHarness } from '@angular/material/input/testing';
import { GloveKeypad } from './glove-keypad';

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
      (committed)="values.push($event)"
    />
  `,
})
class Host {
  readonly minTenths = signal<number | null>(-200);
  readonly maxTenths = signal<number | null>(50);
  readonly allowNegative = signal(true);
  readonly initialTenths = signal<number | null>(null);
  readonly values: number[] = [];
}

function setUp(change: (host: Host) => void = () => {}) {
  TestBed.configureTestingModule({ providers: [provideZonelessChangeDetection()] });
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
  return { fixture, element, key, press, display, problem, typeKeys, values };
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
