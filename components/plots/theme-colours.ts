'use client';

import { useEffect, useState } from 'react';

/** The figure colours of the current theme as the canvas needs them (resolved `rgb(…)` values). */
export interface ThemeColours {
  background: string;
  ink: string;
  inkSoft: string;
  rule: string;
}

const VARIABLES: Record<keyof ThemeColours, string> = {
  background: '--color-plot-bg',
  ink: '--color-plot-ink',
  inkSoft: '--color-plot-ink-soft',
  rule: '--color-plot-rule',
};

/** The light theme's figure colours (app/globals.css), for the first render and the server. */
const LIGHT: ThemeColours = {
  background: '#fffdf8',
  ink: '#1d2327',
  inkSoft: '#4a545b',
  rule: '#bdb4a0',
};

/**
 * Reads the theme's figure colours at `el`. The variables hold light-dark(…) pairs, which only a
 * property that is painted resolves, so each is read back through the `color` of a probe.
 */
function readColours(el: Element): ThemeColours {
  const probe = document.createElement('span');
  probe.style.display = 'none';
  el.append(probe);
  const out = { ...LIGHT };
  for (const key of Object.keys(VARIABLES) as (keyof ThemeColours)[]) {
    probe.style.color = `var(${VARIABLES[key]})`;
    out[key] = getComputedStyle(probe).color || LIGHT[key];
  }
  probe.remove();
  return out;
}

/**
 * The figure colours at the element behind `ref`, read again when the reader switches the theme
 * (a class on <html>) or the system's preference changes.
 */
export function useThemeColours(ref: React.RefObject<Element | null>): ThemeColours {
  const [colours, setColours] = useState<ThemeColours>(LIGHT);
  useEffect(() => {
    const read = () => ref.current && setColours(readColours(ref.current));
    read();
    const observer = new MutationObserver(read);
    observer.observe(document.documentElement, { attributes: true, attributeFilter: ['class'] });
    const media = window.matchMedia('(prefers-color-scheme: dark)');
    media.addEventListener('change', read);
    return () => {
      observer.disconnect();
      media.removeEventListener('change', read);
    };
  }, [ref]);
  return colours;
}

/** `#rrggbb` or `rgb(r, g, b)` as three 0–255 channels. */
export function rgbChannels(colour: string): [number, number, number] {
  if (colour.startsWith('#')) {
    const n = parseInt(colour.slice(1), 16);
    return [(n >> 16) & 255, (n >> 8) & 255, n & 255];
  }
  const m = /rgba?\(\s*([\d.]+)[ ,]+([\d.]+)[ ,]+([\d.]+)/.exec(colour);
  if (!m) throw new RangeError(`rgbChannels: cannot read colour ${colour}`);
  return [Number(m[1]), Number(m[2]), Number(m[3])];
}
