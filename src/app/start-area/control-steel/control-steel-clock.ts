import { InjectionToken } from '@angular/core';

/** The time now in milliseconds, behind a token so specs can say what time it is. */
export const CONTROL_STEEL_CLOCK = new InjectionToken<() => number>('ControlSteelClock', {
  providedIn: 'root',
  factory: () => () => Date.now(),
});
