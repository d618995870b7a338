import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { Router, RouterLink } from '@angular/router';
import { describeLoadError } from '../core/describe-load-error';
import { DeviceStore } from '../core/sync/device-store';
import { AuthStore } from './auth-store';
import { DeviceUsers } from './device-users';
import { rolesInWords } from './role-words';
import { ServerReachability } from './server-reachability';

/**
 * The header's part: who is using the device and in which role, switching, signing out. The sign-out
 * choices open in place, as big buttons, rather than in a small overlay menu.
 */
@Component({
  selector: 'rl-user-bar',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, RouterLink],
  templateUrl: './user-bar.html',
  styleUrl: './user-bar.scss',
  host: { '(keydown.escape)': 'isSignOutOpen.set(false)' },
})
export class UserBar {
  private readonly auth = inject(AuthStore);
  private readonly deviceUsers = inject(DeviceUsers);
  private readonly router = inject(Router);
  private readonly isOffline = inject(ServerReachability).isOffline;
  private readonly deviceStore = inject(DeviceStore);

  protected readonly user = this.auth.user;
  protected readonly rolesText = computed(() => rolesInWords(this.auth.roles()));
  protected readonly isOrganiser = computed(() => this.auth.can('organiser'));
  /** Why "Sign out everywhere" cannot run now, or null when it can. */
  protected readonly everywhereBlocked = computed(() => {
    if (this.isOffline()) return 'needs a signal';
    if (this.auth.isHandOverPending()) return 'after the server has caught up';
    return null;
  });
  /**
   * What signing out means for the records still waiting on this device, or null when none wait.
   * Signing out never deletes them: the outbox keeps them until someone signs in and they are sent.
   */
  protected readonly unsentWarning = computed(() => {
    if (this.deviceStore.dbState() === 'failed') return null;
    const pending = this.deviceStore.pendingCount();
    if (pending === null) return 'Checking whether records on this device still wait to be sent…';
    if (pending === 0) return null;
    const records = pending === 1 ? '1 record is' : `${pending} records are`;
    return `${records} only on this device. They stay here and are sent when someone signs in again — sync first if you can.`;
  });
  protected readonly hasUnsent = computed(() => (this.deviceStore.pendingCount() ?? 0) > 0);
  protected readonly isSignOutOpen = signal(false);
  protected readonly busy = signal(false);
  protected readonly problem = signal<string | null>(null);

  protected async signOutHere(): Promise<void> {
    this.busy.set(true);
    this.problem.set(null);
    try {
      await this.auth.signOut();
    } finally {
      this.busy.set(false);
    }
    this.isSignOutOpen.set(false);
    await this.router.navigateByUrl('/sign-in');
  }

  protected async signOutEverywhere(): Promise<void> {
    const userId = this.auth.serverUser()?.id;
    this.busy.set(true);
    this.problem.set(null);
    try {
      await this.auth.signOutEverywhere();
    } catch (error) {
      this.problem.set(describeLoadError(error));
      return;
    } finally {
      this.busy.set(false);
    }
    if (userId) this.deviceUsers.forget(userId);
    this.isSignOutOpen.set(false);
    await this.router.navigateByUrl('/sign-in');
  }
}
