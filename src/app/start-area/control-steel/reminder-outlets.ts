import { DOCUMENT, InjectionToken, inject } from '@angular/core';

/** What the browser lets the app do about notifications; 'unsupported' where it has none. */
export type ReminderPermission = NotificationPermission | 'unsupported';

/**
 * The three ways a reminder reaches the official, behind one small seam so a spec can see each attempt.
 * Each says whether it was attempted: false where the browser cannot do it (never an error).
 */
export interface ReminderOutlets {
  permission(): ReminderPermission;
  requestPermission(): Promise<ReminderPermission>;
  /** A notification through the service worker, shown even while the app is in the background. */
  notify(title: string, options: NotificationOptions): boolean;
  /** A short beep through the Web Audio API. */
  beep(): boolean;
  vibrate(pattern: number[]): boolean;
  /** Lets sound start later: browsers allow audio only once the page has been touched. Call on a tap. */
  unlockSound(): void;
}

/** The parts of `window` the outlets use; every one may be missing. */
export interface ReminderWindow {
  Notification?: { readonly permission: NotificationPermission; requestPermission(): Promise<NotificationPermission> };
  navigator: {
    serviceWorker?: { readonly ready: Promise<{ showNotification(title: string, options?: NotificationOptions): Promise<void> }> };
    vibrate?: (pattern: number[]) => boolean;
  };
  AudioContext?: new () => AudioContext;
  /** Safari before 14.1 names it so. */
  webkitAudioContext?: new () => AudioContext;
}

const beepHz = 880;
const beepSeconds = 0.35;

/** The outlets on a real (or a spec's fake) browser window; null (no window) does nothing. */
export function browserReminderOutlets(win: ReminderWindow | null): ReminderOutlets {
  let audio: AudioContext | null = null;
  const audioContext = (): AudioContext | null => {
    const Context = win?.AudioContext ?? win?.webkitAudioContext;
    if (!Context) return null;
    try {
      audio ??= new Context();
    } catch {
      // Some browsers refuse an audio context (too many open, or audio turned off): stay silent.
      return null;
    }
    return audio;
  };
  const permissionNow = (): ReminderPermission => win?.Notification?.permission ?? 'unsupported';
  return {
    permission: permissionNow,
    async requestPermission() {
      if (!win?.Notification) return 'unsupported';
      try {
        return await win.Notification.requestPermission();
      } catch {
        // Old browsers take a callback instead of returning a promise: read what was decided.
        return permissionNow();
      }
    },
    notify(title, options) {
      const serviceWorker = win?.navigator.serviceWorker;
      if (permissionNow() !== 'granted' || !serviceWorker) return false;
      // `ready` waits for an active service worker; with none registered (a dev build) it never settles,
      // which costs nothing here. A refused notification leaves the beep and the screen.
      void serviceWorker.ready.then((registration) => registration.showNotification(title, options)).catch(() => undefined);
      return true;
    },
    beep() {
      const context = audioContext();
      if (!context) return false;
      try {
        if (context.state === 'suspended') void context.resume().catch(() => undefined);
        const tone = context.createOscillator();
        const volume = context.createGain();
        const start = context.currentTime;
        tone.type = 'square';
        tone.frequency.value = beepHz;
        // A quick fade in and out, so the beep does not click.
        volume.gain.setValueAtTime(0.0001, start);
        volume.gain.exponentialRampToValueAtTime(0.4, start + 0.02);
        volume.gain.exponentialRampToValueAtTime(0.0001, start + beepSeconds);
        tone.connect(volume).connect(context.destination);
        tone.start(start);
        tone.stop(start + beepSeconds);
        return true;
      } catch {
        // An audio context closed by the browser: stay silent, the screen still says it.
        return false;
      }
    },
    vibrate(pattern) {
      const navigator = win?.navigator;
      const vibrate = navigator?.vibrate;
      if (!navigator || typeof vibrate !== 'function') return false;
      try {
        return vibrate.call(navigator, pattern);
      } catch {
        // Vibration is a bonus (Chromium on Android only); a refusal changes nothing.
        return false;
      }
    },
    unlockSound() {
      const context = audioContext();
      if (context?.state === 'suspended') void context.resume().catch(() => undefined);
    },
  };
}

/** The reminder outlets of this browser window; a spec provides its own. */
export const REMINDER_OUTLETS = new InjectionToken<ReminderOutlets>('reminder outlets', {
  providedIn: 'root',
  factory: () => browserReminderOutlets((inject(DOCUMENT).defaultView as ReminderWindow | null) ?? null),
});
