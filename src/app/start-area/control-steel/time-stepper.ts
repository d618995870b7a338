import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { clockTime, dayWords } from './clock-time';

let nextId = 0;

/** One step of a time stepper: its key, its words on the button and for a screen reader, and its size. */
interface TimeStep {
  text: string;
  words: string;
  minutes: number;
}

const steps: readonly TimeStep[] = [
  { text: '−1 h', words: 'one hour earlier', minutes: -60 },
  { text: '−5 min', words: 'five minutes earlier', minutes: -5 },
  { text: '−1 min', words: 'one minute earlier', minutes: -1 },
  { text: '+1 h', words: 'one hour later', minutes: 60 },
  { text: '+5 min', words: 'five minutes later', minutes: 5 },
  { text: '+1 min', words: 'one minute later', minutes: 1 },
];

/**
 * A time set with large step buttons (no phone keyboard under gloves): the time in big digits with its
 * day, an hour and minutes earlier or later, and "Set to now" where it makes sense. Crossing midnight
 * moves the day, which the day words show.
 */
@Component({
  selector: 'rl-time-stepper',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule],
  templateUrl: './time-stepper.html',
  styleUrl: './time-stepper.scss',
  host: { class: 'time-stepper' },
})
export class TimeStepper {
  readonly label = input.required<string>();
  /** The time shown, in ms on this device's clock. */
  readonly at = input.required<number>();
  /** The time now, for the day words and "Set to now". */
  readonly now = input.required<number>();
  readonly offersNow = input(false);
  /** The new time, whole minutes, after a step or "Set to now". */
  readonly changed = output<number>();

  protected readonly labelId = `rl-time-stepper-${nextId++}`;
  protected readonly steps = steps;
  protected readonly timeText = computed(() => clockTime(this.at()));
  protected readonly dayText = computed(() => dayWords(this.at(), this.now()));

  protected move(minutes: number): void {
    this.changed.emit(this.at() + minutes * 60_000);
  }

  protected setToNow(): void {
    this.changed.emit(Math.floor(this.now() / 60_000) * 60_000);
  }
}
