import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';
import { AuthStore } from '../../auth/auth-store';
import { DeviceStore } from './device-store';
import { FileDownload } from './file-download';
import { StorageGuard } from './storage-guard';

/**
 * A refused write for lack of space stays on screen, with the way out, until the browser takes a write
 * again; storage 80 % used gets a gentler warning.
 */
@Component({
  selector: 'rl-storage-banner',
  host: { class: 'rl-notice-strip' },
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, RouterLink],
  template: `
    @if (auth.isSignedIn()) {
      @if (storage.isFull()) {
        <section class="rl-notice banner full" role="alert" aria-labelledby="storage-full-title">
          <p>
            <strong id="storage-full-title">⚠ Storage full: the last record was NOT saved.</strong>
            Sync now so the server holds the records, or export a backup and free some space on this device; then
            enter the record again. This notice stays until the device has room again.
          </p>
          <div class="actions">
            <button mat-flat-button type="button" class="primary-action" (click)="syncNow()" [disabled]="busy()">Sync now</button>
            <button mat-stroked-button type="button" (click)="exportBackup()" [disabled]="busy()">Export backup</button>
          </div>
          @if (message(); as text) {
            <p class="message">{{ text }}</p>
          }
        </section>
      } @else if (storage.isNearlyFull()) {
        <section class="rl-notice banner" role="status">
          <p>
            <strong>⚠ Storage {{ usedPercent() }} % used.</strong> Sync soon; with no signal, export a backup from the
            sync screen.
          </p>
          <a mat-stroked-button routerLink="/sync">Open the sync screen</a>
        </section>
      }
    }
  `,
  styles: `
    .banner.full {
      border-color: var(--mat-sys-error);
      border-width: 4px;
    }
    .banner p {
      margin: 0 0 12px;
    }
    .actions {
      display: flex;
      flex-wrap: wrap;
      gap: 12px;
    }
    .message {
      margin: 12px 0 0;
    }
  `,
})
export class StorageBanner {
  protected readonly auth = inject(AuthStore);
  protected readonly storage = inject(StorageGuard);
  private readonly store = inject(DeviceStore);
  private readonly download = inject(FileDownload);
  protected readonly busy = signal(false);
  protected readonly message = signal<string | null>(null);
  protected readonly usedPercent = computed(() => Math.round((this.storage.usedFraction() ?? 0) * 100));

  protected async syncNow(): Promise<void> {
    await this.run(async () => {
      const result = await this.store.syncNow();
      return result.ok ? 'Synced.' : `Not synced: ${result.error}`;
    });
  }

  protected async exportBackup(): Promise<void> {
    await this.run(async () => {
      const file = await this.store.exportBackup();
      this.download.save(file.fileName, file.contents);
      return `Saved ${file.fileName}. Keep it until these records have reached the server.`;
    });
  }

  private async run(action: () => Promise<string>): Promise<void> {
    this.busy.set(true);
    try {
      this.message.set(await action());
    } catch (error) {
      this.message.set(error instanceof Error ? error.message : String(error));
    } finally {
      this.busy.set(false);
    }
  }
}
