/** The reader's colour theme: fixed light or dark, or whatever the system prefers. */
export const THEMES = ['light', 'dark', 'system'] as const;
export type Theme = (typeof THEMES)[number];

/** Cookie (read by the server, so the first paint has the theme) and localStorage key. */
export const THEME_KEY = 'lanewise-theme';

/** A stored value as a theme; anything unknown follows the system. */
export function parseTheme(value: string | null | undefined): Theme {
  return THEMES.find((t) => t === value) ?? 'system';
}

/** The class on <html> for a theme (none: follow the system's prefers-color-scheme). */
export const themeClass = (theme: Theme) => (theme === 'system' ? undefined : theme);
