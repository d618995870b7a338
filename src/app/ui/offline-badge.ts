import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { OfflineState } from '../core/offline-readiness';

const labels: Record<OfflineState, string> = {
  checking: 'Checking offline readiness…',
  caching: 'Saving the app for offline use…',
  ready: 'Ready offline',
  'dev-build': 'Development build: not available offline',
  unsupported: 'This browser cannot keep the app offline',
};

/** Says in words (never by colour alone) whether the app will open with no signal. */
@Component({
  selector: 'rl-offline-badge',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `<span class="mark" aria-hidden="true">{{ isReady() ? '✓' : '…' }}</span>{{ label() }}`,
  host: {
    role: 'status',
    class: 'offline-badge',
    '[class.is-ready]': 'isReady()',
    '[attr.data-state]': 'state()',
  },
  styles: `
    :host {
      display: inline-flex;
      align-items: center;
      gap: 8px;
      padding: 6px 14px;
      border-radius: 999px;
      border: 2px solid currentColor;
      font-weight: 700;
      font-size: 1rem;
    }
    :host(.is-ready) {
      background: var(--mat-sys-primary);
      color: var(--mat-sys-on-primary);
      border-color: var(--mat-sys-primary);
    }
    .mark {
      font-size: 1.2rem;
    }
  `,
})
export class OfflineBadge {
  readonly state = input.required<OfflineState>();
  protected readonly isReady = computed(() => this.state() === 'ready');
  protected readonly label = computed(() => labels[this.state()]);
}
