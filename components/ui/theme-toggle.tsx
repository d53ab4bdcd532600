'use client';

import { useSyncExternalStore } from 'react';

type Theme = 'light' | 'dark';

// The theme lives on <html> (set before the first paint by the root layout's script); the button
// reads it from there and follows any change to it.
function subscribe(onChange: () => void) {
  const observer = new MutationObserver(onChange);
  observer.observe(document.documentElement, { attributes: true, attributeFilter: ['class'] });
  return () => observer.disconnect();
}
const currentTheme = (): Theme => (document.documentElement.classList.contains('dark') ? 'dark' : 'light');

export function ThemeToggle() {
  const theme = useSyncExternalStore<Theme | null>(subscribe, currentTheme, () => null);

  function toggle() {
    const next: Theme = theme === 'dark' ? 'light' : 'dark';
    document.documentElement.classList.toggle('dark', next === 'dark');
    try {
      localStorage.setItem('pg-theme', next);
    } catch {
      /* private mode: the choice lasts for this page only */
    }
  }

  return (
    <button
      type="button"
      onClick={toggle}
      className="btn-quiet px-3"
      aria-label={theme === 'dark' ? 'Use the light theme' : 'Use the dark theme'}
    >
      <span aria-hidden className="text-xl">
        {theme === 'dark' ? '☀' : '☾'}
      </span>
      <span className="sr-only sm:not-sr-only sm:text-sm">{theme === 'dark' ? 'Light' : 'Dark'}</span>
    </button>
  );
}
