import { ChangeDetectionStrategy, Component, computed, input, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';

const digitKeys = ['1', '2', '3', '4', '5', '6', '7', '8', '9'] as const;

/**
 * Big digit keys for a PIN, so the phone's own keyboard never opens over gloves. Shows how many digits
 * are in (never the digits), and hands the PIN over when the official presses the last key.
 */
@Component({
  selector: 'rl-pin-pad',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule],
  templateUrl: './pin-pad.html',
  styleUrl: './pin-pad.scss',
  host: { '(keydown)': 'onKey($event)' },
})
export class PinPad {
  readonly submitLabel = input('OK');
  readonly disabled = input(false);
  readonly minDigits = input(4);
  readonly maxDigits = input(6);
  /** The PIN, once the official presses the submit key; the pad then empties itself. */
  readonly entered = output<string>();

  protected readonly digitKeys = digitKeys;
  protected readonly digits = signal('');
  protected readonly isFull = computed(() => this.digits().length >= this.maxDigits());
  protected readonly canSubmit = computed(() => !this.disabled() && this.digits().length >= this.minDigits());
  protected readonly dots = computed(() =>
    Array.from({ length: this.maxDigits() }, (_, i) => (i < this.digits().length ? '●' : '○')).join(' '),
  );
  protected readonly countText = computed(() => {
    const count = this.digits().length;
    return count === 0 ? 'No digits yet' : `${count} ${count === 1 ? 'digit' : 'digits'} entered`;
  });

  protected press(digit: string): void {
    if (!this.disabled() && !this.isFull()) this.digits.update((digits) => digits + digit);
  }

  protected clear(): void {
    this.digits.set('');
  }

  protected deleteLast(): void {
    this.digits.update((digits) => digits.slice(0, -1));
  }

  protected submit(): void {
    if (!this.canSubmit()) return;
    const pin = this.digits();
    this.digits.set('');
    this.entered.emit(pin);
  }

  /** A hardware keyboard works too, for whoever has one. */
  protected onKey(event: KeyboardEvent): void {
    if (/^\d$/.test(event.key)) this.press(event.key);
    else if (event.key === 'Backspace') this.deleteLast();
    else if (event.key === 'Enter') this.submit();
    else return;
    event.preventDefault();
  }
}
