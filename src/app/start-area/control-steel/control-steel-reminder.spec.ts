import { TestBed } from '@angular/core/testing';
import { ControlSteelReminder, type ReminderMoment } from './control-steel-reminder';
import { REMINDER_OUTLETS, browserReminderOutlets, type ReminderWindow } from './reminder-outlets';

const dueAt = new Date(2027, 0, 14, 9, 30).toISOString();
const due: ReminderMoment = { kind: 'due', dueAt };
const overdue: ReminderMoment = { kind: 'overdue', dueAt };

/** A browser window with every outlet, each recording what it was asked to do. */
function fullBrowser(permission: NotificationPermission = 'granted') {
  const shown: { title: string; options?: NotificationOptions }[] = [];
  /** The pitch of each tone started. */
  const tones: { value: number }[] = [];
  const vibrations: number[][] = [];
  const resumed: string[] = [];
  const node = () => ({ connect: <T>(next: T) => next });
  class FakeAudioContext {
    state: AudioContextState = 'suspended';
    currentTime = 0;
    destination = node();
    async resume() {
      resumed.push('resume');
      this.state = 'running';
    }
    createOscillator() {
      const frequency = { value: 0 };
      return { ...node(), type: 'sine', frequency, start: () => void tones.push(frequency), stop: () => undefined };
    }
    createGain() {
      return { ...node(), gain: { setValueAtTime: () => undefined, exponentialRampToValueAtTime: () => undefined } };
    }
  }
  const win = {
    Notification: { permission, requestPermission: vi.fn(async () => permission) },
    navigator: {
      serviceWorker: { ready: Promise.resolve({ showNotification: async (title: string, options?: NotificationOptions) => void shown.push({ title, options }) }) },
      vibrate: (pattern: number[]) => vibrations.push(pattern) > 0,
    },
    AudioContext: FakeAudioContext,
  } as unknown as ReminderWindow;
  return { win, shown, tones, vibrations, resumed };
}

function reminderOn(win: ReminderWindow | null): ControlSteelReminder {
  TestBed.configureTestingModule({ providers: [{ provide: REMINDER_OUTLETS, useFactory: () => browserReminderOutlets(win) }] });
  return TestBed.inject(ControlSteelReminder);
}

/** Lets the service worker's `ready` promise hand over its registration. */
const settle = () => new Promise((resolve) => setTimeout(resolve, 0));

describe('ControlSteelReminder', () => {
  it('when a reading falls due, then a notification, a beep and a vibration are each attempted once for that due time', async () => {
    const browser = fullBrowser('granted');
    const reminder = reminderOn(browser.win);

    expect(reminder.remind(due)).toEqual({ notified: true, beeped: true, vibrated: true });
    // The screen ticks every second: the same due time reminds only once.
    expect(reminder.remind(due)).toBeNull();
    expect(reminder.remind(null)).toBeNull();
    await settle();

    expect(browser.shown).toEqual([
      { title: 'Control steel reading due', options: { body: 'Read the control steel now: it was due at 09:30.', tag: 'rimelog-control-steel-due', requireInteraction: false } },
    ]);
    expect(browser.tones).toHaveLength(1);
    expect(browser.tones[0]?.value).toBeGreaterThan(0);
    // A suspended audio context (no tap yet) is asked to resume before the beep.
    expect(browser.resumed).toEqual(['resume']);
    expect(browser.vibrations).toHaveLength(1);
  });

  it('when the reading becomes overdue, then it reminds once more; a new due time reminds again', async () => {
    const browser = fullBrowser('granted');
    const reminder = reminderOn(browser.win);

    reminder.remind(due);
    reminder.remind(overdue);
    reminder.remind(overdue);
    reminder.remind({ kind: 'due', dueAt: new Date(2027, 0, 14, 9, 50).toISOString() });
    await settle();

    expect(browser.shown.map((n) => n.title)).toEqual(['Control steel reading due', 'Control steel reading OVERDUE', 'Control steel reading due']);
    expect(browser.shown[1]?.options).toMatchObject({ body: 'Read the control steel now: it was due at 09:30. Until then, steel temperatures are not judged.', requireInteraction: true });
    expect(browser.tones).toHaveLength(3);
    expect(browser.vibrations).toHaveLength(3);
  });

  it('when notifications are not allowed, then no notification is attempted, but the beep and vibration still are', async () => {
    const browser = fullBrowser('default');
    const reminder = reminderOn(browser.win);

    expect(reminder.permission()).toBe('default');
    expect(reminder.remind(due)).toEqual({ notified: false, beeped: true, vibrated: true });
    await settle();
    expect(browser.shown).toEqual([]);
  });

  it('when the browser has no notifications, no audio and no vibration, then nothing fires and nothing throws', async () => {
    const reminder = reminderOn({ navigator: {} });

    expect(reminder.permission()).toBe('unsupported');
    expect(reminder.remind(due)).toEqual({ notified: false, beeped: false, vibrated: false });
    expect(await reminder.askPermission()).toBe('unsupported');
    // No window at all: every outlet declines too.
    const none = browserReminderOutlets(null);
    expect([none.permission(), none.notify('Control steel reading due', {}), none.beep(), none.vibrate([1])]).toEqual(['unsupported', false, false, false]);
  });

  it('when the official allows reminders, then the browser is asked and its answer is what the screen shows', async () => {
    const browser = fullBrowser('denied');
    const reminder = reminderOn(browser.win);

    expect(await reminder.askPermission()).toBe('denied');
    expect(browser.win.Notification?.requestPermission).toHaveBeenCalledTimes(1);
    expect(reminder.permission()).toBe('denied');
  });
});
