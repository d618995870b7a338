import { Injectable, inject } from '@angular/core';
import type { Me } from '../../../shared/auth/auth-api';
import { describeLoadError } from '../core/describe-load-error';
import { AuthApi } from './auth-api';
import { AuthStore } from './auth-store';
import { DevicePins } from './device-pins';
import { makePinVerifier, pinMatches } from './pin-verifier';
import { isNoConnection, isStatus, ServerReachability } from './server-reachability';

export type SwitchOutcome =
  | { kind: 'switched'; me: Me; offline: boolean }
  | { kind: 'wrong-pin'; triesLeft: number }
  | { kind: 'locked'; until: Date }
  /** No PIN for this official is kept on the device, and the server cannot be asked. */
  | { kind: 'needs-signal' }
  /** The server refused for another reason, in its words. */
  | { kind: 'refused'; message: string };

const sessionEnded: SwitchOutcome = {
  kind: 'refused',
  message: 'The sign-in on this device has ended. Sign in again, then hand the device over.',
};

/**
 * Hands the device to another official who set a PIN on it. Online, the server checks the PIN and
 * starts their session; with no connection the PIN is checked against the verifier kept on the device.
 * Either way five wrong PINs in a row pause tries for that official for five minutes.
 */
@Injectable({ providedIn: 'root' })
export class OfficialSwitch {
  private readonly api = inject(AuthApi);
  private readonly auth = inject(AuthStore);
  private readonly pins = inject(DevicePins);
  private readonly reachability = inject(ServerReachability);

  async switchTo(userId: string, pin: string): Promise<SwitchOutcome> {
    const lockedUntil = this.pins.lockedUntil(userId, Date.now());
    if (lockedUntil !== null) return { kind: 'locked', until: new Date(lockedUntil) };
    if (!this.reachability.isOffline()) {
      try {
        const me = await this.api.switchTo(userId, pin);
        this.reachability.answered();
        this.pins.clearWrongPins(userId);
        this.auth.adoptSession(me);
        if (!this.pins.get(userId)) this.pins.save(me, await makePinVerifier(pin));
        return { kind: 'switched', me, offline: false };
      } catch (error) {
        this.reachability.failed(error);
        if (isStatus(error, 401)) return (await this.isDeviceStillSignedIn()) ? this.wrongPin(userId) : sessionEnded;
        if (!isNoConnection(error)) return { kind: 'refused', message: describeLoadError(error) };
        // No connection: check the PIN on the device below.
      }
    }
    return this.switchOffline(userId, pin);
  }

  private async switchOffline(userId: string, pin: string): Promise<SwitchOutcome> {
    const kept = this.pins.get(userId);
    if (!kept) return { kind: 'needs-signal' };
    if (!(await pinMatches(pin, kept.verifier))) return this.wrongPin(userId);
    this.pins.clearWrongPins(userId);
    this.auth.useLocally(kept.me, pin);
    return { kind: 'switched', me: kept.me, offline: true };
  }

  /** A 401 is a wrong PIN, or the device's own session ended; only the server can tell which. */
  private async isDeviceStillSignedIn(): Promise<boolean> {
    await this.auth.refresh();
    return this.auth.isSignedIn();
  }

  private wrongPin(userId: string): SwitchOutcome {
    const now = Date.now();
    const triesLeft = this.pins.recordWrongPin(userId, now);
    const lockedUntil = this.pins.lockedUntil(userId, now);
    return lockedUntil !== null ? { kind: 'locked', until: new Date(lockedUntil) } : { kind: 'wrong-pin', triesLeft };
  }
}
