import { InjectionToken } from '@angular/core';

/** The time now in milliseconds, behind a token so specs can age a keypad draft without timers. */
export const KEYPAD_DRAFT_CLOCK = new InjectionToken<() => number>('KeypadDraftClock', {
  providedIn: 'root',
  factory: () => () => Date.now(),
});
