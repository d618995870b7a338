import { Injectable, computed, inject } from '@angular/core';
import { AuthStore } from '../auth/auth-store';
import { DeviceUsers } from '../auth/device-users';

/** Names for the user ids on records, from who is signed in and who set a PIN on this device (works offline). */
@Injectable({ providedIn: 'root' })
export class OfficialNames {
  private readonly auth = inject(AuthStore);
  private readonly deviceUsers = inject(DeviceUsers);
  private readonly known = computed(() => {
    const names = new Map(this.deviceUsers.list().map((user) => [user.id, user.displayName]));
    for (const user of [this.auth.serverUser(), this.auth.user()]) if (user) names.set(user.id, user.displayName);
    return names;
  });

  /** The official's name, or "another official" when this device has never seen them. */
  nameOf(userId: string): string {
    return this.known().get(userId) ?? 'another official';
  }
}
