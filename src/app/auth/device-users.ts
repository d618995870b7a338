import { Injectable, inject, signal } from '@angular/core';
import { AuthApi, deviceUsersSchema, type DeviceUser } from './auth-api';
import { DevicePins } from './device-pins';
import { keep, readKept } from './local-json';
import { ServerReachability } from './server-reachability';

const deviceUsersKey = 'rimelog.device-users';

/** The officials who set a PIN on this device, as the server last listed them (kept for offline use). */
@Injectable({ providedIn: 'root' })
export class DeviceUsers {
  private readonly api = inject(AuthApi);
  private readonly pins = inject(DevicePins);
  private readonly reachability = inject(ServerReachability);
  private readonly users = signal<DeviceUser[]>(readKept(deviceUsersKey, deviceUsersSchema)?.users ?? []);
  readonly list = this.users.asReadonly();

  /** Asks the server again; an official it no longer lists loses their offline PIN on this device too. */
  async refresh(): Promise<void> {
    try {
      const users = await this.api.deviceUsers();
      this.reachability.answered();
      this.users.set(users);
      keep(deviceUsersKey, { users });
      this.pins.keepOnly(users.map((user) => user.id));
    } catch (error) {
      // Offline or signed out: the kept list stays, so officials can still switch by PIN.
      this.reachability.failed(error);
    }
  }

  forget(userId: string): void {
    const users = this.users().filter((user) => user.id !== userId);
    this.users.set(users);
    keep(deviceUsersKey, { users });
  }
}
