import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import type { PyrometerChoices } from './check-instruments';

/**
 * Which sled pyrometer takes this sled's steel readings. Only a calibrated sled pyrometer issued to the
 * official can be chosen; the others are listed with the reason, as text, never as a button.
 */
@Component({
  selector: 'rl-check-pyrometer-picker',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule],
  template: `
    <section class="stack" aria-labelledby="pyrometer-title" data-section="pyrometer">
      <h2 id="pyrometer-title">Sled pyrometer</h2>
      @if (choices().usable.length === 0) {
        <p class="notice" role="note">No sled pyrometer is issued to you with a calibration that holds today. Ask the area leader for one.</p>
      } @else {
        <div class="results" role="group" aria-label="The pyrometer you read the steels with">
          @for (pyrometer of choices().usable; track pyrometer.id) {
            <button
              mat-stroked-button
              type="button"
              class="choice"
              [class.is-chosen]="pyrometer.id === chosenId()"
              [attr.aria-pressed]="pyrometer.id === chosenId()"
              [attr.data-instrument]="pyrometer.label"
              (click)="chosen.emit(pyrometer.id)"
            >
              {{ pyrometer.id === chosenId() ? '●' : '○' }} {{ pyrometer.label }} · calibrated until {{ pyrometer.calibratedUntil }}
            </button>
          }
        </div>
      }
      @if (choices().refused.length > 0) {
        <ul class="refused" aria-label="Pyrometers you cannot use">
          @for (pyrometer of choices().refused; track pyrometer.id) {
            <li [attr.data-refused]="pyrometer.label"><span aria-hidden="true">✕</span> {{ pyrometer.refusal }}</li>
          }
        </ul>
      }
    </section>
  `,
  styleUrls: ['./start-checks.scss', './start-check-page.scss'],
})
export class CheckPyrometerPicker {
  readonly choices = input.required<PyrometerChoices>();
  readonly chosenId = input<string | null>(null);
  readonly chosen = output<string>();
}
