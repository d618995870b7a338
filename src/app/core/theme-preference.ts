import { DOCUMENT, Injectable, effect, inject, signal } from '@angular/core';

export type ThemeName = 'glare' | 'dark';

const storageKey = 'rimelog.theme';

function readStoredTheme(): ThemeName {
  try {
    return localStorage.getItem(storageKey) === 'dark' ? 'dark' : 'glare';
  } catch {
    // Storage can be blocked (private mode); the high-contrast glare theme is the safe default.
    return 'glare';
  }
}

/** The high-contrast "glare" theme for snow and sun, or the dark theme for dusk and night runs. */
@Injectable({ providedIn: 'root' })
export class ThemePreference {
  private readonly document = inject(DOCUMENT);
  readonly theme = signal<ThemeName>(readStoredTheme());

  constructor() {
    effect(() => {
      const theme = this.theme();
      const root = this.document.documentElement;
      root.classList.toggle('theme-glare', theme === 'glare');
      root.classList.toggle('theme-dark', theme === 'dark');
      try {
        localStorage.setItem(storageKey, theme);
      } catch {
        // Not remembered across restarts when storage is blocked; the switch still works now.
      }
    });
  }

  toggle(): void {
    this.theme.update((theme) => (theme === 'glare' ? 'dark' : 'glare'));
  }
}
