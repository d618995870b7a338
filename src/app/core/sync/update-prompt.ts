import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';
import { AppUpdate } from './app-update';
import { DeviceStore } from './device-store';

/**
 * "A new version is ready" or "the app is damaged": the button reloads only when nothing is at risk,
 * and says why it waits.
 */
@Component({
  selector: 'rl-update-prompt',
  host: { class: 'rl-notice-strip' },
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, RouterLink],
  template: `
    @if (store.replacedByNewerTab()) {
      <section class="rl-notice prompt" role="alert">
        <p>
          <strong>This app was updated in another tab.</strong> This tab can no longer save records; reload it. Records
          already saved stay on this device.
        </p>
        <button mat-flat-button type="button" class="primary-action" (click)="update.reloadForNewerTab()">Reload</button>
      </section>
    } @else if (update.damageReason(); as reason) {
      <section class="rl-notice prompt" role="alert" data-notice="damaged">
        <p>
          <strong>⚠ The app on this device is damaged:</strong> the browser has lost some of its files. The records on
          this device are safe in its storage. Reload the app when there is a signal.
        </p>
        <div class="actions">
          @if (update.damagedWaitReason(); as wait) {
            <button mat-flat-button type="button" class="primary-action waiting" disabled>Reload waits: {{ wait }}</button>
            @if ((store.pendingCount() ?? 0) > 0) {
              <a mat-stroked-button routerLink="/sync">Export a backup first</a>
            }
          } @else {
            <button mat-flat-button type="button" class="primary-action" (click)="update.reloadDamaged()">Reload the app</button>
          }
        </div>
        <p class="detail">For whoever looks after the devices: {{ reason }}</p>
      </section>
    } @else if (update.isReady()) {
      <section class="rl-notice prompt" role="status">
        <p><strong>A new version is ready.</strong></p>
        <div class="actions">
          @if (update.waitReason(); as reason) {
            <button mat-flat-button type="button" class="primary-action waiting" disabled>Update waits: {{ reason }}</button>
            @if ((store.pendingCount() ?? 0) > 0) {
              <a mat-stroked-button routerLink="/sync">Open the sync screen</a>
            }
          } @else {
            <button mat-flat-button type="button" class="primary-action" (click)="update.updateNow()">Update now</button>
          }
        </div>
      </section>
    }
  `,
  styles: `
    @use '@angular/material' as mat;
    .prompt p {
      margin: 0 0 12px;
    }
    .prompt .detail {
      margin: 12px 0 0;
      font-size: 1rem;
      overflow-wrap: anywhere;
    }
    .actions {
      display: flex;
      flex-wrap: wrap;
      gap: 12px;
    }
    // A waiting button says why in words; its text keeps full contrast, the dashed edge marks it as not now.
    .waiting {
      @include mat.button-overrides(
        (
          filled-disabled-container-color: var(--mat-sys-surface),
          filled-disabled-label-text-color: var(--mat-sys-on-surface),
        )
      );
      border: 3px dashed var(--mat-sys-on-surface);
      white-space: normal;
      height: auto;
      min-height: 72px;
    }
  `,
})
export class UpdatePrompt {
  protected readonly update = inject(AppUpdate);
  protected readonly store = inject(DeviceStore);
}
