import { InjectionToken } from '@angular/core';

/** The time now in milliseconds, behind a token so specs can say when a steel was read. */
export const STEEL_READING_CLOCK = new InjectionToken<() => number>('SteelReadingClock', {
  providedIn: 'root',
  factory: () => () => Date.now(),
});
