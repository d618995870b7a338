import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { CheckSession } from '../check-session';
import { EquipmentStep, type EquipmentAnswers } from '../../steps/equipment-step';
import { SaveNotice, SaveNoticeView } from './save-notice';

/** The equipment and bib step on the check screen: each answer saved in the check record as it is given. */
@Component({
  selector: 'rl-check-equipment',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [EquipmentStep, SaveNoticeView],
  template: `
    @if (session.profile(); as profile) {
      @if (session.check(); as check) {
        <fieldset class="entry" [disabled]="!session.isOpen()">
          <!-- Afresh after a refused or failed save, so no unsaved value stays on screen. -->
          @for (key of [notice.round()]; track key) {
            <rl-equipment-step
              [profile]="profile"
              [bib]="check.bib"
              [saved]="session.answers()?.equipment ?? null"
              [savedBibConfirmed]="session.answers()?.bibConfirmed ?? null"
              (answered)="save($event)"
            />
          }
        </fieldset>
      }
    }
    <rl-save-notice [notice]="notice" />
  `,
  styleUrl: './check-host.scss',
})
export class CheckEquipment {
  protected readonly session = inject(CheckSession);
  protected readonly notice = new SaveNotice();

  protected save(answers: EquipmentAnswers): Promise<boolean> {
    const fields = { equipment: answers.present, bibConfirmed: answers.bibConfirmed };
    return this.notice.run(() => this.session.store.updateRecord(this.session.checkId(), fields), 'Equipment saved on this device');
  }
}
