import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { gapProbeResultLabels, type GapProbeResult } from '../../../../../shared/rules/gap-probe';
import { GapProbeStep } from '../../steps/gap-probe-step';
import { CheckInstrumentPicker } from '../check-instrument-picker';
import { CheckSession } from '../check-session';
import { chosenInstrument } from './chosen-instrument';
import { SaveNotice, SaveNoticeView } from './save-notice';

/** The gap probe step (artificial track): the result saved in the check record with the probe used. */
@Component({
  selector: 'rl-check-gap-probe',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [CheckInstrumentPicker, GapProbeStep, SaveNoticeView],
  template: `
    <rl-check-instrument-picker heading="Gap probe" section="gap-probe" [choices]="probe.choices()" [chosenId]="probe.chosen()?.id ?? null" (chosen)="probe.choose($event)" />
    <fieldset class="entry" [disabled]="!session.isOpen() || !probe.chosen()">
      <!-- Afresh after a refused or failed save, so no unsaved value stays on screen. -->
      @for (key of [notice.round()]; track key) {
        <rl-gap-probe-step [profile]="session.profile()!" [saved]="session.answers()?.gapProbe?.result ?? null" (probed)="save($event)" />
      }
    </fieldset>
    <rl-save-notice [notice]="notice" />
  `,
  styleUrl: './check-host.scss',
})
export class CheckGapProbe {
  protected readonly session = inject(CheckSession);
  protected readonly probe = chosenInstrument(this.session, ['gap-probe']);
  protected readonly notice = new SaveNotice();

  protected save(result: GapProbeResult): Promise<boolean> {
    const takenAt = new Date(this.session.clock()).toISOString();
    const instrumentId = this.probe.chosen()?.id ?? null;
    if (instrumentId === null || !this.session.mayUse(instrumentId, ['gap-probe'], takenAt)) {
      this.notice.refuse('Choose a calibrated gap probe issued to you first, then run it along the joint again.');
      return Promise.resolve(false);
    }
    const gapProbe = { result, instrumentId, takenAt };
    return this.notice.run(() => this.session.store.updateRecord(this.session.checkId(), { gapProbe }), `${gapProbeResultLabels[result]}: saved on this device`);
  }
}
