import { DOCUMENT, DestroyRef, inject, signal, type Signal } from '@angular/core';

export type ScreenAwakeState = 'asking' | 'on' | 'not-supported' | 'refused';

/**
 * Keeps the screen on while the calling screen is shown (Screen Wake Lock API), so a phone in a gloved
 * hand does not lock between two sleds. The browser drops the lock when the app is hidden; it is asked
 * for again when the app is shown. Call from a component's constructor.
 */
export function keepScreenAwake(): Signal<ScreenAwakeState> {
  const document = inject(DOCUMENT);
  const wakeLock = document.defaultView?.navigator.wakeLock;
  const state = signal<ScreenAwakeState>(wakeLock ? 'asking' : 'not-supported');
  if (!wakeLock) return state.asReadonly();

  let sentinel: WakeLockSentinel | null = null;
  let active = true;
  const ask = async () => {
    if (!active || document.visibilityState !== 'visible' || (sentinel && !sentinel.released)) return;
    try {
      sentinel = await wakeLock.request('screen');
      if (!active) await sentinel.release();
      else state.set('on');
    } catch {
      // Battery saver, or a browser that asks the user first: the screen just follows the device settings.
      state.set('refused');
    }
  };
  const onVisibility = () => void ask();
  document.addEventListener('visibilitychange', onVisibility);
  void ask();
  inject(DestroyRef).onDestroy(() => {
    active = false;
    document.removeEventListener('visibilitychange', onVisibility);
    void sentinel?.release().catch(() => undefined);
  });
  return state.asReadonly();
}
