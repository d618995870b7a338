import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, signal } from '@angular/core';
import { RouterLink } from '@angular/router';
import { AuthStore } from '../../auth/auth-store';
import { DeviceStore } from './device-store';
import { stripItems, type StripItem } from './status-words';

const tickMs = 30_000;

/**
 * Under the header on every screen while someone is signed in: online or not (the sync heartbeat, not
 * navigator.onLine), records only on this device, the last sync, conflicts, refusals, the clock. One big
 * tap target that opens the sync screen.
 */
@Component({
  selector: 'rl-sync-status-strip',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [RouterLink],
  template: `
    @if (auth.isSignedIn()) {
      <nav class="bar" aria-label="Sync status">
        <a class="strip" routerLink="/sync">
          <span class="items">
            @for (item of items(); track item.key) {
              <span class="item" [class.attention]="item.attention" [attr.data-item]="item.key">
                <span class="mark" aria-hidden="true">{{ item.mark }}</span>{{ item.text }}
              </span>
            }
          </span>
          <span class="open">Sync screen ›</span>
        </a>
      </nav>
    }
  `,
  styles: `
    :host {
      display: block;
    }
    .bar {
      border-bottom: 2px solid var(--mat-sys-outline);
      background: var(--mat-sys-surface);
    }
    .strip {
      display: flex;
      flex-wrap: wrap;
      align-items: center;
      justify-content: space-between;
      gap: 8px 16px;
      min-height: 64px;
      box-sizing: border-box;
      max-width: 1100px;
      margin: 0 auto;
      padding: 8px 16px;
      color: var(--mat-sys-on-surface);
      text-decoration: none;
      font-size: 1.1rem;
      font-weight: 700;
    }
    .items {
      display: flex;
      flex-wrap: wrap;
      gap: 8px 20px;
    }
    .item {
      display: inline-flex;
      align-items: center;
      gap: 6px;
    }
    .item.attention {
      padding: 2px 10px;
      border: 3px solid currentColor;
      border-radius: 8px;
    }
    .mark {
      font-size: 1.2rem;
    }
    .open {
      text-decoration: underline;
      text-underline-offset: 4px;
    }
  `,
})
export class SyncStatusStrip {
  protected readonly auth = inject(AuthStore);
  private readonly store = inject(DeviceStore);
  private readonly now = signal(Date.now());

  protected readonly items = computed<StripItem[]>(() => {
    if (this.store.dbState() === 'failed') {
      return [{ key: 'failed', mark: '⚠', text: this.store.openProblem() ?? 'Records cannot be kept on this device.', attention: true }];
    }
    const status = this.store.status();
    if (!status) return [{ key: 'online', mark: '…', text: 'Opening the records on this device', attention: false }];
    return stripItems(status, this.now());
  });

  constructor() {
    // "Synced 3 min ago" must move on by itself; twice a minute is enough and costs nothing.
    const clock = setInterval(() => this.now.set(Date.now()), tickMs);
    inject(DestroyRef).onDestroy(() => clearInterval(clock));
  }
}
