import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { celsius, shortSpotName, type SpotReading } from '../../steel-temperatures/steel-spots';
import { SteelTemperatureStep } from '../../steel-temperatures/steel-temperature-step';
import { CheckInstrumentPicker } from '../check-instrument-picker';
import { CheckSession } from '../check-session';
import { firstSledPlan, samePlan } from '../check-steel';
import { saveSteelReading } from '../check-steel-writer';
import { chosenInstrument } from './chosen-instrument';
import { SaveNotice, SaveNoticeView } from './save-notice';

/**
 * The steel temperature step on the check screen: each reading saved as a measurement with the pyrometer
 * that took it, judged at once against the latest control steel reading.
 */
@Component({
  selector: 'rl-check-steel-temperatures',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [CheckInstrumentPicker, SaveNoticeView, SteelTemperatureStep],
  template: `
    <rl-check-instrument-picker heading="Sled pyrometer" section="pyrometer" [choices]="pyrometer.choices()" [chosenId]="pyrometer.chosen()?.id ?? null" (chosen)="pyrometer.choose($event)" />
    @if (lock(); as words) {
      <p class="notice" role="note" data-section="steel-lock"><span aria-hidden="true">◌</span> {{ words }}</p>
    }
    <!-- Readable but not enterable while locked: the saved readings and verdicts stay on screen. -->
    <fieldset class="entry" [disabled]="lock() !== null">
      <!-- One step per check (and a fresh one after a failed save): its spots and keypad start anew. -->
      @for (key of [stepKey()]; track key) {
        <rl-steel-temperature-step
          [profile]="session.profile()!"
          [controlReadings]="session.controlReadings()"
          [preset]="preset()"
          [readings]="session.steelReadings()"
          [draftScope]="draftScope()"
          (readingEntered)="enter($event)"
        />
      }
    </fieldset>
    <rl-save-notice [notice]="notice" />
  `,
  styleUrl: './check-host.scss',
})
export class CheckSteelTemperatures {
  protected readonly session = inject(CheckSession);
  protected readonly draftScope = this.session.draftScope;
  protected readonly pyrometer = chosenInstrument(this.session, ['sled-pyrometer']);
  protected readonly notice = new SaveNotice();

  /** Where the athlete's first sled in this run was read; kept the same object while it does not change, so the step keeps its place. */
  protected readonly preset = computed(
    () => {
      const record = this.session.checkRecord();
      return record ? firstSledPlan(record, this.session.checks() ?? [], this.session.measurements() ?? []) : null;
    },
    { equal: samePlan },
  );
  /** Why no steel reading can be entered now, or null when one can. */
  protected readonly lock = computed(() => {
    if (!this.session.isOpen()) return 'This check is finished. Open this check again to read the steels again.';
    return this.pyrometer.chosen() ? null : 'Choose a calibrated sled pyrometer issued to you first.';
  });
  /** A new step for each check, and a fresh one after a failed save so no unsaved reading stays on screen. */
  protected readonly stepKey = computed(() => `${this.session.checkId()}#${this.notice.round()}`);
  private saving: Promise<unknown> = Promise.resolve();

  /** Saves each reading in turn, in the order it was keyed. */
  protected enter(reading: SpotReading): void {
    const pyrometerId = this.pyrometer.chosen()?.id ?? null;
    this.saving = this.saving.then(() => this.save(reading, pyrometerId));
  }

  private async save(reading: SpotReading, pyrometerId: string | null): Promise<void> {
    const what = `${shortSpotName(reading)}: ${celsius(reading.tenths)}`;
    if (pyrometerId === null || !this.session.mayUse(pyrometerId, ['sled-pyrometer'], reading.takenAt)) {
      this.notice.refuse(`${what}. Choose a calibrated sled pyrometer issued to you first. Key the reading again.`);
      return;
    }
    const saved = await this.notice.run(
      () => saveSteelReading(this.session.store, { competitionId: this.session.competitionId(), checkId: this.session.checkId(), reading, instrumentId: pyrometerId }),
      `${what} saved on this device`,
    );
    if (!saved) this.notice.refuse(`${what}. ${this.notice.problem()} Key the reading again.`);
  }
}
