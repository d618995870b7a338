import { Injectable, signal } from '@angular/core';
import { z } from 'zod';
import { meSchema, type Me } from '../../../shared/auth/auth-api';
import { forget, keep, readKept } from './local-json';
import { pinVerifierSchema, type PinVerifier } from './pin-verifier-schema';

const pinsKey = 'rimelog.device-pins';
const triesKey = 'rimelog.pin-tries';

/** After this many wrong PINs for one official on this device, PIN tries stop for `pinLockMs`. */
export const maxWrongPins = 5;
export const pinLockMs = 5 * 60 * 1000;

const devicePinSchema = z.object({ me: meSchema, verifier: pinVerifierSchema });
export type DevicePin = z.infer<typeof devicePinSchema>;
const devicePinsSchema = z.record(z.string(), devicePinSchema);

const pinTriesSchema = z.record(z.string(), z.object({ wrong: z.number().int().min(0), lockedUntil: z.number().nullable() }));
type PinTries = z.infer<typeof pinTriesSchema>;

/**
 * The officials who can take over this device with a PIN and no network: for each, the PIN verifier
 * and their last known profile (name and roles), plus the count of wrong tries. Kept in localStorage
 * so a restart on the mountain changes nothing, and so a reload does not reset the lock.
 */
@Injectable({ providedIn: 'root' })
export class DevicePins {
  private readonly pins = signal<Record<string, DevicePin>>(readKept(pinsKey, devicePinsSchema) ?? {});
  readonly all = this.pins.asReadonly();
  private tries: PinTries = readKept(triesKey, pinTriesSchema) ?? {};

  get(userId: string): DevicePin | undefined {
    return this.pins()[userId];
  }

  save(me: Me, verifier: PinVerifier): void {
    this.write({ ...this.pins(), [me.user.id]: { me, verifier } });
  }

  /** Keeps the cached profile of an official up to date whenever the server describes them. */
  refreshProfile(me: Me): void {
    const pin = this.get(me.user.id);
    if (pin) this.write({ ...this.pins(), [me.user.id]: { ...pin, me } });
  }

  remove(userId: string): void {
    const { [userId]: _removed, ...rest } = this.pins();
    this.write(rest);
  }

  /** Drops the verifiers of officials whose PIN the server no longer holds for this device. */
  keepOnly(userIds: readonly string[]): void {
    const wanted = new Set(userIds);
    this.write(Object.fromEntries(Object.entries(this.pins()).filter(([id]) => wanted.has(id))));
  }

  /** When PIN tries for this official are refused until, or null when they may try. */
  lockedUntil(userId: string, now: number): number | null {
    const until = this.tries[userId]?.lockedUntil ?? null;
    return until !== null && until > now ? until : null;
  }

  /** Counts a wrong PIN; the fifth in a row locks tries for five minutes. Answers the tries left. */
  recordWrongPin(userId: string, now: number): number {
    const wrong = (this.tries[userId]?.wrong ?? 0) + 1;
    const locked = wrong >= maxWrongPins;
    this.writeTries({ ...this.tries, [userId]: { wrong: locked ? 0 : wrong, lockedUntil: locked ? now + pinLockMs : null } });
    return locked ? 0 : maxWrongPins - wrong;
  }

  clearWrongPins(userId: string): void {
    const { [userId]: _cleared, ...rest } = this.tries;
    this.writeTries(rest);
  }

  private write(pins: Record<string, DevicePin>): void {
    this.pins.set(pins);
    if (Object.keys(pins).length === 0) forget(pinsKey);
    else keep(pinsKey, pins);
  }

  private writeTries(tries: PinTries): void {
    this.tries = tries;
    keep(triesKey, tries);
  }
}
