import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { formatTenths } from '../../../../../shared/rules/measurement';
import { ScaleProofStep } from '../../steps/scale-proof-step';
import { CheckInstrumentPicker } from '../check-instrument-picker';
import { latestProofOfRun } from '../check-progress';
import { CheckSession } from '../check-session';
import { saveScaleProof } from '../check-step-writers';
import { chosenInstrument } from './chosen-instrument';
import { SaveNotice, SaveNoticeView } from './save-notice';

/** Proving the scale before the first weighing of a run, with the control weights at the scale. */
@Component({
  selector: 'rl-check-scale-proof',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [CheckInstrumentPicker, SaveNoticeView, ScaleProofStep],
  template: `
    <rl-check-instrument-picker heading="Scale" section="scale" [choices]="scale.choices()" [chosenId]="scale.chosen()?.id ?? null" (chosen)="scale.choose($event)" />
    @if (scale.chosen(); as chosen) {
      <fieldset class="entry" [disabled]="!session.isOpen()">
        <!-- Afresh after a refused or failed save, so no unsaved value stays on screen. -->
        @for (key of [notice.round()]; track key) {
          <rl-scale-proof-step
            [profile]="session.profile()!"
            [scaleLabel]="chosen.label"
            [controlWeights]="session.controlWeights()"
            [saved]="saved()"
            [draftScope]="draftScope()"
            (proved)="save($event)"
          />
        }
      </fieldset>
    }
    <rl-save-notice [notice]="notice" />
  `,
  styleUrl: './check-host.scss',
})
export class CheckScaleProof {
  protected readonly session = inject(CheckSession);
  protected readonly draftScope = this.session.draftScope;
  protected readonly scale = chosenInstrument(this.session, ['scale']);
  protected readonly notice = new SaveNotice();
  private readonly latest = computed(() => latestProofOfRun(this.session.scaleProofs(), this.session.check()?.run ?? 0));
  protected readonly saved = computed(() => {
    const proof = this.latest();
    return proof ? { controlWeightIds: proof.controlWeightIds, readingTenths: proof.readingTenths } : null;
  });

  protected save(proved: { controlWeightIds: string[]; knownTenths: number; readingTenths: number }): Promise<boolean> {
    const takenAt = new Date(this.session.clock()).toISOString();
    const scaleId = this.scale.chosen()?.id ?? null;
    if (scaleId === null || !this.session.mayUse(scaleId, ['scale'], takenAt)) {
      this.notice.refuse('Choose a calibrated scale issued to you first, then prove it again.');
      return Promise.resolve(false);
    }
    const check = this.session.check();
    const proof = { ...proved, competitionId: this.session.competitionId(), checkId: this.session.checkId(), run: check?.run ?? 1, scaleId, takenAt };
    return this.notice.run(() => saveScaleProof(this.session.store, proof), `Scale proof (${formatTenths(proved.readingTenths, 'kilogram')}) saved on this device`);
  }
}
