import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { formatTenths } from '../../../../../shared/rules/measurement';
import { CheckInstrumentPicker } from '../check-instrument-picker';
import { weighed } from '../check-records';
import { CheckSession } from '../check-session';
import { saveMeasurement } from '../check-step-writers';
import { WeightStep, type WeighedReading } from '../../steps/weight-step';
import { chosenInstrument } from './chosen-instrument';
import { SaveNotice, SaveNoticeView } from './save-notice';

/** The weight step on the check screen: each weighing saved as a measurement naming the scale. */
@Component({
  selector: 'rl-check-weight',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [CheckInstrumentPicker, SaveNoticeView, WeightStep],
  template: `
    <rl-check-instrument-picker heading="Scale" section="scale" [choices]="scale.choices()" [chosenId]="scale.chosen()?.id ?? null" (chosen)="scale.choose($event)" />
    @if (session.entry(); as entry) {
      <fieldset class="entry" [disabled]="!session.isOpen() || !scale.chosen()">
        <!-- Afresh after a refused or failed save, so no unsaved value stays on screen. -->
        @for (key of [notice.round()]; track key) {
          <rl-weight-step
            [profile]="session.profile()!"
            [trackType]="session.profile()!.trackType"
            [discipline]="entry.discipline"
            [officialBodyWeights]="session.officialBodyWeights()"
            [saved]="session.weightValues()"
            [draftScope]="draftScope()"
            (weighed)="save($event)"
          />
        }
      </fieldset>
    } @else {
      <p class="notice" role="note"><span aria-hidden="true">?</span> Bib {{ session.check()?.bib }} is not on the start list on this device, so its discipline is not known: weigh it and refer to the technical delegate.</p>
    }
    <rl-save-notice [notice]="notice" />
  `,
  styleUrl: './check-host.scss',
})
export class CheckWeight {
  protected readonly session = inject(CheckSession);
  protected readonly draftScope = this.session.draftScope;
  protected readonly scale = chosenInstrument(this.session, ['scale']);
  protected readonly notice = new SaveNotice();

  protected save({ reading, tenths }: WeighedReading): Promise<boolean> {
    const takenAt = new Date(this.session.clock()).toISOString();
    const scaleId = this.scale.chosen()?.id ?? null;
    if (scaleId === null || !this.session.mayUse(scaleId, ['scale'], takenAt)) {
      this.notice.refuse('Choose a calibrated scale issued to you first, then weigh again.');
      return Promise.resolve(false);
    }
    const m = { competitionId: this.session.competitionId(), checkId: this.session.checkId(), what: weighed, place: reading, value: { tenths, unit: 'kilogram' as const }, instrumentId: scaleId, takenAt };
    return this.notice.run(() => saveMeasurement(this.session.store, m), `${formatTenths(tenths, 'kilogram')} saved on this device`);
  }
}
