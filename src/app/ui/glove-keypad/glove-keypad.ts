import {
  afterNextRender,
  ChangeDetectionStrategy,
  Component,
  computed,
  ElementRef,
  inject,
  Injector,
  input,
  linkedSignal,
  output,
  signal,
  viewChild,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { unitSymbols } from '../../../../shared/rules/measurement';
import {
  commitEntry,
  describeRange,
  digitKeys,
  entryFromTenths,
  entryText,
  measureUnitOf,
  pressKey,
  rangeProblemWhileTyping,
  readTypedEntry,
  type KeypadEntry,
  type KeypadKey,
  type KeypadUnit,
} from './keypad-entry';

let nextId = 0;

/**
 * The app's own number keypad for a measured value, so the phone's keyboard (often without a minus)
 * never opens over gloves. Checks the range as the official keys and hands over whole tenths on OK.
 * "Type instead" opens a text field for whoever cannot use the keys.
 */
@Component({
  selector: 'rl-glove-keypad',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatFormFieldModule, MatInputModule],
  templateUrl: './glove-keypad.html',
  styleUrl: './glove-keypad.scss',
  host: { class: 'glove-keypad', '(keydown)': 'onKey($event)' },
})
export class GloveKeypad {
  readonly label = input.required<string>();
  readonly unit = input.required<KeypadUnit>();
  readonly minTenths = input<number | null>(null);
  readonly maxTenths = input<number | null>(null);
  readonly allowNegative = input(false);
  /** The value shown at first (e.g. the one recorded before); the entry starts over when it changes. */
  readonly initialTenths = input<number | null>(null);
  readonly okLabel = input('OK');
  /** The value in whole tenths, once OK is pressed on a complete value in range. */
  readonly committed = output<number>();

  protected readonly digitRows = digitKeys.slice(0, 9);
  protected readonly labelId = `rl-glove-keypad-${nextId++}`;
  protected readonly entry = linkedSignal(() => entryFromTenths(this.initialTenths()));
  /** Why the last key or OK was refused; gone as soon as the entry changes. */
  protected readonly refusal = linkedSignal<KeypadEntry, string | null>({ source: this.entry, computation: () => null });
  protected readonly isTyping = signal(false);
  protected readonly typedText = signal('');
  protected readonly typedProblem = signal<string | null>(null);

  protected readonly unitSymbol = computed(() => unitSymbols[measureUnitOf(this.unit())]);
  protected readonly range = computed(() => ({ minTenths: this.minTenths(), maxTenths: this.maxTenths() }));
  protected readonly rangeText = computed(() => describeRange(this.range(), this.unit()));
  protected readonly shownText = computed(() => entryText(this.entry()));
  protected readonly problem = computed(
    () => this.typedProblem() ?? this.refusal() ?? rangeProblemWhileTyping(this.entry(), this.range(), this.unit()),
  );
  // iOS and Samsung decimal keyboards have no minus key, so a field that takes negatives asks for text.
  protected readonly typedInputMode = computed(() => (this.allowNegative() ? 'text' : 'decimal'));

  private readonly typedInput = viewChild<ElementRef<HTMLInputElement>>('typedInput');
  private readonly injector = inject(Injector);

  protected press(key: KeypadKey): void {
    const { entry, refusal } = pressKey(this.entry(), key, this.allowNegative());
    this.entry.set(entry);
    this.refusal.set(refusal);
    if (this.isTyping()) {
      this.typedText.set(entryText(entry));
      this.typedProblem.set(null);
    }
  }

  /** Empties the entry for the next value (a host calls it once the last value is saved). */
  clear(): void {
    this.press('clear');
  }

  protected ok(): void {
    if (this.typedProblem()) return;
    const { tenths, problem } = commitEntry(this.entry(), this.range(), this.unit());
    if (tenths === null) this.refusal.set(problem);
    else this.committed.emit(tenths);
  }

  protected toggleTyping(): void {
    const isTyping = !this.isTyping();
    this.isTyping.set(isTyping);
    this.typedProblem.set(null);
    if (!isTyping) return;
    this.typedText.set(entryText(this.entry()));
    // Only now, because the official asked for it, may the phone's keyboard open.
    afterNextRender(() => this.typedInput()?.nativeElement.focus(), { injector: this.injector });
  }

  protected onTyped(event: Event): void {
    const text = (event.target as HTMLInputElement).value;
    this.typedText.set(text);
    const reading = readTypedEntry(text, this.allowNegative());
    this.typedProblem.set(reading.problem);
    if (reading.entry) this.entry.set(reading.entry);
  }

  /** A hardware keyboard works too, whenever the keypad has focus. */
  protected onKey(event: KeyboardEvent): void {
    const target = event.target as HTMLElement;
    // The text field reads its own keys; Enter on the "Type instead" toggle presses the toggle.
    if (target instanceof HTMLInputElement) return;
    const key = keyboardKeys[event.key] ?? (/^\d$/.test(event.key) ? (event.key as KeypadKey) : undefined);
    if (key) this.press(key);
    else if (event.key === 'Enter' && !target.closest('.type-toggle')) this.ok();
    else return;
    event.preventDefault();
  }
}

const keyboardKeys: Readonly<Record<string, KeypadKey>> = {
  '.': '.',
  ',': '.',
  '-': '±',
  '−': '±',
  Backspace: 'backspace',
  Delete: 'clear',
};
