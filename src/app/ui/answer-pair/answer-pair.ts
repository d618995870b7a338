import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';

/** One side of a yes/no question: its words, the mark beside them, and its name for tests (`data-answer`). */
export interface AnswerSide {
  label: string;
  mark: string;
  name: string;
}

/**
 * A yes/no question answered with two glove-sized buttons: the chosen one is pressed (aria-pressed, a
 * thick frame and bold words as well as its mark, never colour alone). Tapping the chosen answer again
 * changes nothing, so only a change is emitted.
 */
@Component({
  selector: 'rl-answer-pair',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule],
  template: `
    @for (side of [{ value: true, words: yes() }, { value: false, words: no() }]; track side.value) {
      <button
        mat-stroked-button
        type="button"
        class="toggle"
        [attr.data-answer]="side.words.name"
        [class.pressed]="answer() === side.value"
        [attr.aria-pressed]="answer() === side.value"
        (click)="choose(side.value)"
      >
        <span aria-hidden="true">{{ side.words.mark }}</span>&ngsp;{{ side.words.label }}
      </button>
    }
  `,
  styleUrl: './answer-pair.scss',
})
export class AnswerPair {
  /** The answer given so far; null or undefined while not answered. */
  readonly answer = input<boolean | null | undefined>(null);
  readonly yes = input<AnswerSide>({ label: 'Yes', mark: '✓', name: 'yes' });
  readonly no = input<AnswerSide>({ label: 'No', mark: '✕', name: 'no' });
  readonly answered = output<boolean>();

  protected choose(value: boolean): void {
    if (this.answer() !== value) this.answered.emit(value);
  }
}
