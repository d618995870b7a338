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
  untracked,
  viewChild,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { unitSymbols } from '../../../../shared/rules/measurement';
import { KEYPAD_DRAFT_CLOCK } from './keypad-draft-clock';
import { clearKeypadDraft, readKeypadDraft, writeKeypadDraft, type KeypadDraft } from './keypad-drafts';
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

/** Where the entry starts: the host's value, unless a draft kept under the draft key wins. */
interface KeypadStart {
  readonly initialEntry: KeypadEntry;
  readonly draft: KeypadDraft | null;
}

const isSameEntry = (a: KeypadEntry, b: KeypadEntry) =>
  a.isNegative === b.isNegative && a.whole === b.whole && a.hasPoint === b.hasPoint && a.tenth === b.tenth;

let nextId = 0;

/**
 * The app's own number keypad for a measured value, so the phone's keyboard (often without a minus)
 * never opens over gloves. Checks the range as the official keys and hands over whole tenths on OK.
 * "Type instead" opens a text field for whoever cannot use the keys. With a `draftKey`, every change is
 * kept on the device at once and comes back, marked as not saved, if the app is killed before OK.
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
  /**
   * Names this entry on the device (unique per check and value, e.g. "check:42:steel:left:1"): each
   * change is kept under it until OK or `clear()`, and a kept draft wins over `initialTenths`. Null keeps
   * nothing.
   */
  readonly draftKey = input<string | null>(null);
  /** The value in whole tenths, once OK is pressed on a complete value in range. */
  readonly committed = output<number>();

  protected readonly digitRows = digitKeys.slice(0, 9);
  protected readonly labelId = `rl-glove-keypad-${nextId++}`;
  private readonly now = inject(KEYPAD_DRAFT_CLOCK);
  // Read again whenever the draft key or the host's value changes, never on the keypad's own writes
  // (reading may drop a stale draft from the device: harmless to repeat).
  private readonly start = computed<KeypadStart>(() => {
    const draftKey = this.draftKey();
    return {
      initialEntry: entryFromTenths(this.initialTenths()),
      draft: draftKey === null ? null : readKeypadDraft(draftKey, this.now()),
    };
  });
  protected readonly entry = linkedSignal(() => this.start().draft?.entry ?? this.start().initialEntry);
  /** The entry shown is a draft from before the app was closed, not a saved value. */
  protected readonly isRestored = linkedSignal(() => this.start().draft !== null);
  /** Why the last key or OK was refused; gone as soon as the entry changes. */
  protected readonly refusal = linkedSignal<KeypadEntry, string | null>({ source: this.entry, computation: () => null });
  // A new start without a draft leaves the text field as the official left it, showing the new entry.
  protected readonly isTyping = linkedSignal<KeypadStart, boolean>({
    source: this.start,
    computation: (start, previous) => start.draft?.isTyping ?? previous?.value ?? false,
  });
  protected readonly typedText = linkedSignal(() => this.start().draft?.typedText ?? entryText(this.start().initialEntry));
  protected readonly typedProblem = linkedSignal(() => {
    const draft = this.start().draft;
    return draft?.isTyping ? readTypedEntry(draft.typedText, untracked(this.allowNegative)).problem : null;
  });

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
    this.applyKey(key);
    this.keepDraft();
  }

  /** Empties the entry for the next value and drops its draft (a host calls it once the last value is saved). */
  clear(): void {
    this.applyKey('clear');
    this.forgetDraft();
  }

  protected ok(): void {
    if (this.typedProblem()) return;
    const { tenths, problem } = commitEntry(this.entry(), this.range(), this.unit());
    if (tenths === null) {
      this.refusal.set(problem);
      return;
    }
    this.forgetDraft();
    this.committed.emit(tenths);
  }

  protected toggleTyping(): void {
    const isTyping = !this.isTyping();
    this.isTyping.set(isTyping);
    this.typedProblem.set(null);
    if (isTyping) this.typedText.set(entryText(this.entry()));
    this.keepDraft();
    if (!isTyping) return;
    // Only now, because the official asked for it, may the phone's keyboard open.
    afterNextRender(() => this.typedInput()?.nativeElement.focus(), { injector: this.injector });
  }

  protected onTyped(event: Event): void {
    const text = (event.target as HTMLInputElement).value;
    this.typedText.set(text);
    const reading = readTypedEntry(text, this.allowNegative());
    this.typedProblem.set(reading.problem);
    if (reading.entry) this.entry.set(reading.entry);
    this.keepDraft();
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

  private applyKey(key: KeypadKey): void {
    const { entry, refusal } = pressKey(this.entry(), key, this.allowNegative());
    this.entry.set(entry);
    this.refusal.set(refusal);
    if (this.isTyping()) {
      this.typedText.set(entryText(entry));
      this.typedProblem.set(null);
    }
  }

  /** Written at once, not in an effect: the phone may kill the app before the next render. */
  private keepDraft(): void {
    const draftKey = this.draftKey();
    if (draftKey === null) return;
    const state = { entry: this.entry(), isTyping: this.isTyping(), typedText: this.typedText() };
    // Back where it started, there is nothing to restore.
    if (!state.isTyping && isSameEntry(state.entry, this.start().initialEntry)) this.forgetDraft();
    else writeKeypadDraft(draftKey, state, this.now());
  }

  private forgetDraft(): void {
    const draftKey = this.draftKey();
    if (draftKey !== null) clearKeypadDraft(draftKey);
    this.isRestored.set(false);
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
