import { Component, provideZonelessChangeDetection, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { PinPad } from './pin-pad';

@Component({
  imports: [PinPad],
  template: `<rl-pin-pad submitLabel="Switch" [disabled]="disabled()" (entered)="pins.push($event)" />`,
})
class Host {
  readonly disabled = signal(false);
  readonly pins: string[] = [];
}

function setUp() {
  TestBed.configureTestingModule({ providers: [provideZonelessChangeDetection()] });
  const fixture = TestBed.createComponent(Host);
  fixture.detectChanges();
  const element = fixture.nativeElement as HTMLElement;
  const key = (label: string) =>
    [...element.querySelectorAll<HTMLButtonElement>('button')].find((b) => b.textContent?.trim() === label)!;
  const press = (...labels: string[]) => {
    for (const label of labels) {
      key(label).click();
      fixture.detectChanges();
    }
  };
  const display = () => element.querySelector('output')?.textContent ?? '';
  return { fixture, element, key, press, display };
}

describe('PinPad', () => {
  it('when digits are pressed, then it counts them in words and never shows them', () => {
    const { press, display } = setUp();
    press('2', '4', '6');
    expect(display()).toContain('3 digits entered');
    expect(display()).not.toMatch(/[246]/);
  });

  it('when fewer than 4 digits are in, then the submit key stays disabled', () => {
    const { press, key } = setUp();
    press('1', '3', '5');
    expect(key('Switch').disabled).toBe(true);
    press('7');
    expect(key('Switch').disabled).toBe(false);
  });

  it('when Delete is pressed, then the last digit goes', () => {
    const { fixture, press } = setUp();
    press('1', '2', '3', '4', 'Delete', '9', 'Switch');
    expect(fixture.componentInstance.pins).toEqual(['1239']);
  });

  it('when Clear is pressed, then every digit goes', () => {
    const { press, display } = setUp();
    press('1', '2', '3', 'Clear');
    expect(display()).toContain('No digits yet');
  });

  it('when submitted, then the PIN is handed over and the pad empties', () => {
    const { fixture, press, display } = setUp();
    press('8', '6', '4', '2', 'Switch');
    expect(fixture.componentInstance.pins).toEqual(['8642']);
    expect(display()).toContain('No digits yet');
  });

  it('when 6 digits are in, then further digits are refused', () => {
    const { fixture, press, key } = setUp();
    press('1', '2', '3', '4', '5', '6');
    expect(key('7').disabled).toBe(true);
    press('Switch');
    expect(fixture.componentInstance.pins).toEqual(['123456']);
  });

  it('when disabled, then no key adds a digit', () => {
    const { fixture, key, display } = setUp();
    fixture.componentInstance.disabled.set(true);
    fixture.detectChanges();
    expect(key('5').disabled).toBe(true);
    expect(key('Switch').disabled).toBe(true);
    expect(display()).toContain('No digits yet');
  });

  it('when a hardware keyboard types digits and Enter, then they count like the keys', () => {
    const { fixture, element } = setUp();
    const pad = element.querySelector('rl-pin-pad')!;
    for (const key of ['5', '0', '5', '0', 'Enter']) pad.dispatchEvent(new KeyboardEvent('keydown', { key, bubbles: true }));
    expect(fixture.componentInstance.pins).toEqual(['5050']);
  });

  it('when shown, then every key is a button labelled in words, like a phone keypad', () => {
    const { element } = setUp();
    const keys = element.querySelectorAll('.keys button');
    expect([...keys].map((k) => k.textContent?.trim())).toEqual(['1', '2', '3', '4', '5', '6', '7', '8', '9', 'Clear', '0', 'Delete', 'Switch']);
    expect(element.querySelector('.keys button.delete')?.getAttribute('aria-label')).toBe('Delete the last digit');
  });
});
