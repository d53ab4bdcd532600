'use client';

import { useEffect, useState } from 'react';

type Theme = 'light' | 'dark';

export function ThemeToggle() {
  const [theme, setTheme] = useState<Theme | null>(null);

  useEffect(() => {
    setTheme(document.documentElement.classList.contains('dark') ? 'dark' : 'light');
  }, []);

  function toggle() {
    const next: Theme = theme === 'dark' ? 'light' : 'dark';
    document.documentElement.classList.toggle('dark', next === 'dark');
    try {
      localStorage.setItem('pg-theme', next);
    } catch {
      /* private mode: the choice lasts for this page only */
    }
    setTheme(next);
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
