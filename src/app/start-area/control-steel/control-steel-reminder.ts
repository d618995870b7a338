import { Injectable, inject, signal } from '@angular/core';
import { clockTime } from './clock-time';
import { REMINDER_OUTLETS, type ReminderPermission } from './reminder-outlets';

/** A moment to remind the official of: a reading fell due, or it is now overdue. */
export interface ReminderMoment {
  kind: 'due' | 'overdue';
  /** When the reading fell due (ISO): one reminder of each kind per due time. */
  dueAt: string;
}

/** What one reminder attempted (false where the browser cannot, or may not, do it). */
export interface ReminderAttempt {
  notified: boolean;
  beeped: boolean;
  vibrated: boolean;
}

const vibration = [300, 150, 300];

/**
 * Reminds the official when a control steel reading falls due, and again when it is overdue: a
 * notification through the service worker (when allowed), a short beep and a vibration (where the
 * browser has them), each once per due time.
 *
 * Honest limits: the screen ticks on a timer, and browsers slow or stop timers while the screen is off
 * or the app is in the background, so a reminder may come late or only when the app is shown again. No
 * push server is involved (there is no signal at the top of a track); a notification shown by the
 * service worker is the best an offline web app can do.
 */
@Injectable({ providedIn: 'root' })
export class ControlSteelReminder {
  private readonly outlets = inject(REMINDER_OUTLETS);
  /** Due times already reminded of, by kind ("due|2027-01-14T08:30:00.000Z"). */
  private readonly reminded = new Set<string>();
  private readonly allowed = signal<ReminderPermission>(this.outlets.permission());
  readonly permission = this.allowed.asReadonly();

  /** Reads the browser's permission again: the official may have changed it in the browser's settings. */
  refreshPermission(): void {
    this.allowed.set(this.outlets.permission());
  }

  /** Asks the browser to allow notifications (call from the official's tap); the answer shows on screen. */
  async askPermission(): Promise<ReminderPermission> {
    this.outlets.unlockSound();
    const answer = await this.outlets.requestPermission();
    this.allowed.set(answer);
    return answer;
  }

  /** Lets the beep play later (browsers allow sound only after a tap): call when the official taps. */
  prepareSound(): void {
    this.outlets.unlockSound();
  }

  /** Reminds of `moment` unless it was reminded of already; null when nothing is due or it was done. */
  remind(moment: ReminderMoment | null): ReminderAttempt | null {
    if (!moment) return null;
    const key = `${moment.kind}|${moment.dueAt}`;
    if (this.reminded.has(key)) return null;
    this.reminded.add(key);
    this.refreshPermission();
    const due = clockTime(moment.dueAt);
    const title = moment.kind === 'due' ? 'Control steel reading due' : 'Control steel reading OVERDUE';
    const body =
      moment.kind === 'due'
        ? `Read the control steel now: it was due at ${due}.`
        : `Read the control steel now: it was due at ${due}. Until then, steel temperatures are not judged.`;
    return {
      notified: this.outlets.notify(title, { body, tag: `rimelog-control-steel-${moment.kind}`, requireInteraction: moment.kind === 'overdue' }),
      beeped: this.outlets.beep(),
      vibrated: this.outlets.vibrate(vibration),
    };
  }
}
