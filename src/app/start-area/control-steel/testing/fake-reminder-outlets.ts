import type { Provider } from '@angular/core';
import { REMINDER_OUTLETS, type ReminderOutlets, type ReminderPermission } from '../reminder-outlets';

/**
 * Stands in for the browser's notification, sound and vibration in specs: records each attempt, and
 * answers a permission request as the spec sets it. `supports` false makes every outlet unavailable.
 */
export class FakeReminderOutlets implements ReminderOutlets {
  allowed: ReminderPermission = 'default';
  /** What the official answers when asked. */
  answer: NotificationPermission = 'granted';
  supports = true;
  readonly notifications: { title: string; options: NotificationOptions }[] = [];
  beeps = 0;
  readonly vibrations: number[][] = [];
  requests = 0;
  unlocks = 0;

  permission(): ReminderPermission {
    return this.supports ? this.allowed : 'unsupported';
  }
  async requestPermission(): Promise<ReminderPermission> {
    this.requests++;
    if (!this.supports) return 'unsupported';
    this.allowed = this.answer;
    return this.allowed;
  }
  notify(title: string, options: NotificationOptions): boolean {
    if (!this.supports || this.allowed !== 'granted') return false;
    this.notifications.push({ title, options });
    return true;
  }
  beep(): boolean {
    if (!this.supports) return false;
    this.beeps++;
    return true;
  }
  vibrate(pattern: number[]): boolean {
    if (!this.supports) return false;
    this.vibrations.push(pattern);
    return true;
  }
  unlockSound(): void {
    this.unlocks++;
  }
}

export function fakeReminderOutlets(): { outlets: FakeReminderOutlets; providers: Provider[] } {
  const outlets = new FakeReminderOutlets();
  return { outlets, providers: [{ provide: REMINDER_OUTLETS, useValue: outlets }] };
}
