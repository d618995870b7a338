import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import type { InstrumentChoices } from './check-instruments';

let nextId = 0;

/**
 * Which instrument takes a step's readings. Only a calibrated instrument of the right kind issued to the
 * official can be chosen; the others are listed with the reason, as text, never as a button.
 */
@Component({
  selector: 'rl-check-instrument-picker',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule],
  template: `
    <section class="stack" [attr.aria-labelledby]="headingId" [attr.data-section]="section()">
      <h3 [id]="headingId">{{ heading() }}</h3>
      @if (choices().usable.length === 0) {
        <p class="notice" role="note">No {{ heading().toLowerCase() }} is issued to you with a calibration that holds today. Ask the area leader for one.</p>
      } @else {
        <div class="results" role="group" [attr.aria-label]="'The ' + heading().toLowerCase() + ' you use'">
          @for (instrument of choices().usable; track instrument.id) {
            <button
              mat-stroked-button
              type="button"
              class="choice"
              [class.is-chosen]="instrument.id === chosenId()"
              [attr.aria-pressed]="instrument.id === chosenId()"
              [attr.data-instrument]="instrument.label"
              (click)="chosen.emit(instrument.id)"
            >
              {{ instrument.id === chosenId() ? '●' : '○' }} {{ instrument.label }} · calibrated until {{ instrument.calibratedUntil }}
            </button>
          }
        </div>
      }
      @if (choices().refused.length > 0) {
        <ul class="refused" [attr.aria-label]="'Instruments you cannot use here'">
          @for (instrument of choices().refused; track instrument.id) {
            <li [attr.data-refused]="instrument.label"><span aria-hidden="true">✕</span> {{ instrument.refusal }}</li>
          }
        </ul>
      }
    </section>
  `,
  styleUrls: ['./start-checks.scss', './start-check-page.scss'],
})
export class CheckInstrumentPicker {
  /** What is picked, e.g. "Sled pyrometer", "Scale". */
  readonly heading = input.required<string>();
  /** Names the picker for tests and styles, e.g. "pyrometer", "scale". */
  readonly section = input.required<string>();
  readonly choices = input.required<InstrumentChoices>();
  readonly chosenId = input<string | null>(null);
  readonly chosen = output<string>();
  protected readonly headingId = `rl-instrument-picker-${nextId++}`;
}
