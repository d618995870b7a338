import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { formatTenths } from '../../../../../shared/rules/measurement';
import { DimensionsStep } from '../../steps/dimensions-step';
import { CheckInstrumentPicker } from '../check-instrument-picker';
import { dimensioned } from '../check-records';
import { savedDimensions } from '../check-progress';
import { CheckSession } from '../check-session';
import { saveMeasurement } from '../check-step-writers';
import { chosenInstrument, type ChosenInstrument } from './chosen-instrument';
import { SaveNotice, SaveNoticeView } from './save-notice';

/**
 * The dimensions step (natural track): lengths taken with a caliper or steel rule, the steel angle with an
 * angle gauge, each saved as a measurement; by-eye answers saved in the check record.
 */
@Component({
  selector: 'rl-check-dimensions',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [CheckInstrumentPicker, DimensionsStep, SaveNoticeView],
  template: `
    <rl-check-instrument-picker heading="Caliper or steel rule" section="length-gauge" [choices]="lengths.choices()" [chosenId]="lengths.chosen()?.id ?? null" (chosen)="lengths.choose($event)" />
    @if (hasAngles()) {
      <rl-check-instrument-picker heading="Angle gauge" section="angle-gauge" [choices]="angles.choices()" [chosenId]="angles.chosen()?.id ?? null" (chosen)="angles.choose($event)" />
    }
    <fieldset class="entry" [disabled]="!session.isOpen()">
      <!-- Afresh after a refused or failed save, so no unsaved value stays on screen. -->
      @for (key of [notice.round()]; track key) {
        <rl-dimensions-step [profile]="session.profile()!" [saved]="saved()" [draftScope]="draftScope()" (measured)="measure($event)" (seen)="see($event)" />
      }
    </fieldset>
    <rl-save-notice [notice]="notice" />
  `,
  styleUrl: './check-host.scss',
})
export class CheckDimensions {
  protected readonly session = inject(CheckSession);
  protected readonly draftScope = this.session.draftScope;
  protected readonly lengths = chosenInstrument(this.session, ['caliper', 'steel-rule']);
  protected readonly angles = chosenInstrument(this.session, ['angle-gauge']);
  protected readonly notice = new SaveNotice();
  protected readonly hasAngles = computed(() => this.session.profile()?.dimensions.some((rule) => rule.unit === 'degree' && !rule.byEye) ?? false);
  protected readonly saved = computed(() => {
    const answers = this.session.answers();
    return answers ? savedDimensions(this.session.dimensions(), answers) : { values: {}, byEye: {} };
  });

  protected measure({ kind, place, tenths }: { kind: string; place: string | null; tenths: number }): Promise<boolean> {
    const rule = this.session.profile()?.dimensions.find((r) => r.kind === kind);
    if (!rule) return Promise.resolve(false);
    const gauge: ChosenInstrument = rule.unit === 'degree' ? this.angles : this.lengths;
    const takenAt = new Date(this.session.clock()).toISOString();
    const instrumentId = gauge.chosen()?.id ?? null;
    if (instrumentId === null || !this.session.mayUse(instrumentId, gauge.purposes, takenAt)) {
      const gaugeName = rule.unit === 'degree' ? 'angle gauge' : 'caliper or steel rule';
      this.notice.refuse(`Choose a calibrated ${gaugeName} issued to you first, then measure ${rule.label.toLowerCase()} again.`);
      return Promise.resolve(false);
    }
    const key = place === null ? kind : `${kind}:${place}`;
    const m = { competitionId: this.session.competitionId(), checkId: this.session.checkId(), what: dimensioned, place: key, value: { tenths, unit: rule.unit }, instrumentId, takenAt };
    return this.notice.run(() => saveMeasurement(this.session.store, m), `${rule.label}: ${formatTenths(tenths, rule.unit)} saved on this device`);
  }

  protected see({ kind, acceptable }: { kind: string; acceptable: boolean }): Promise<boolean> {
    const byEye = { ...(this.session.answers()?.byEye ?? {}), [kind]: acceptable };
    const label = this.session.profile()?.dimensions.find((r) => r.kind === kind)?.label ?? kind;
    return this.notice.run(() => this.session.store.updateRecord(this.session.checkId(), { byEye }), `${label}: ${acceptable ? 'looks right' : 'does not look right'}, saved on this device`);
  }
}
