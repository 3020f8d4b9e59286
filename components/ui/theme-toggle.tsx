'use client';

import { useState } from 'react';
import { THEME_KEY, THEMES, themeClass, type Theme } from './theme';

const LABELS: Record<Theme, string> = { light: 'Light', dark: 'Dark', system: 'System' };

/**
 * Light / dark / system. The choice goes into a cookie, so the server renders the next page in
 * it before the first paint (no inline script, which a Content-Security-Policy would have to
 * allow), and into localStorage.
 */
export function ThemeToggle({ initial }: { initial: Theme }) {
  const [theme, setTheme] = useState<Theme>(initial);
  const choose = (t: Theme) => {
    setTheme(t);
    const root = document.documentElement;
    root.classList.remove('light', 'dark');
    const cls = themeClass(t);
    if (cls) root.classList.add(cls);
    document.cookie = `${THEME_KEY}=${t}; path=/; max-age=31536000; samesite=lax`;
    try {
      localStorage.setItem(THEME_KEY, t);
    } catch {
      // Storage may be off (private mode); the cookie still carries the choice.
    }
  };
  return (
    <label className="flex items-center gap-1.5 text-sm text-ink-soft">
      <span className="sr-only min-[900px]:not-sr-only">Theme</span>
      <select
        aria-label="Colour theme"
        value={theme}
        onChange={(e) => choose(e.target.value as Theme)}
        className="rounded-md border border-rule bg-white px-1.5 py-0.5 text-sm text-ink"
        data-testid="theme-toggle"
      >
        {THEMES.map((t) => (
          <option key={t} value={t}>
            {LABELS[t]}
          </option>
        ))}
      </select>
    </label>
  );
}
