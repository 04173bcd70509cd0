import { useSyncExternalStore } from 'react';

export type Theme = 'daylight' | 'night';

export const THEME_STORAGE_KEY = 'holdfire.theme';

export const THEME_LABELS: Record<Theme, string> = {
  daylight: 'Daylight',
  night: 'Night',
};

/** Browser chrome colour per theme, so the phone's status bar does not glare at night. */
const THEME_COLOR: Record<Theme, string> = {
  daylight: '#faf6ec',
  night: '#0c0604',
};

const listeners = new Set<() => void>();

function isTheme(value: unknown): value is Theme {
  return value === 'daylight' || value === 'night';
}

/** The remembered theme; Daylight when nothing (or something unreadable) is stored. */
export function readStoredTheme(): Theme {
  try {
    const stored = window.localStorage.getItem(THEME_STORAGE_KEY);
    return isTheme(stored) ? stored : 'daylight';
  } catch {
    // Storage can be blocked (private mode, strict settings); the theme still works for this page.
    return 'daylight';
  }
}

/** Put the theme on <html> (CSS reads [data-theme]) and on the theme-color meta. */
export function applyTheme(theme: Theme): void {
  document.documentElement.dataset.theme = theme;
  document.querySelector('meta[name="theme-color"]')?.setAttribute('content', THEME_COLOR[theme]);
}

export function currentTheme(): Theme {
  const value = document.documentElement.dataset.theme;
  return isTheme(value) ? value : readStoredTheme();
}

export function setTheme(theme: Theme): void {
  try {
    window.localStorage.setItem(THEME_STORAGE_KEY, theme);
  } catch {
    // Not remembered, but still applied.
  }
  applyTheme(theme);
  listeners.forEach((listener) => listener());
}

function subscribe(listener: () => void): () => void {
  listeners.add(listener);
  // Another tab changing the theme should change this one too.
  const onStorage = (event: StorageEvent) => {
    if (event.key === THEME_STORAGE_KEY) {
      applyTheme(readStoredTheme());
      listener();
    }
  };
  window.addEventListener('storage', onStorage);
  return () => {
    listeners.delete(listener);
    window.removeEventListener('storage', onStorage);
  };
}

export function useTheme(): [Theme, (theme: Theme) => void] {
  const theme = useSyncExternalStore(subscribe, currentTheme, () => 'daylight' as Theme);
  return [theme, setTheme];
}
