'use client';

import { useRef } from 'react';
import { Button } from '@/components/ui/button';

/** Colours of the inline plots, as attributes so a downloaded SVG looks the same on its own. */
export const PLOT_COLOURS = {
  background: '#fffdf8',
  ink: '#1d2327',
  inkSoft: '#4a545b',
  rule: '#bdb4a0',
  faint: '#d9d2c1',
  accent: '#16505c',
} as const;

/** Font attributes for SVG text, spelled out so the file stands alone. */
export const PLOT_FONT = { fontFamily: 'Inter, ui-sans-serif, sans-serif', fontSize: 11 } as const;

/** A number with a true minus sign for axis labels. */
export function axisNumber(v: number, decimals: number): string {
  const s = v.toFixed(decimals);
  return Number(s) === 0 ? s.replace(/^-/, '') : s.replace(/^-/, '−');
}

function saveSvg(svg: SVGSVGElement, fileName: string) {
  const copy = svg.cloneNode(true) as SVGSVGElement;
  copy.setAttribute('xmlns', 'http://www.w3.org/2000/svg');
  const text = `<?xml version="1.0" encoding="UTF-8"?>\n${new XMLSerializer().serializeToString(copy)}`;
  const url = URL.createObjectURL(new Blob([text], { type: 'image/svg+xml' }));
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

/**
 * A titled inline-SVG figure with a "Download SVG" button that saves exactly what is drawn.
 * `children` draws inside an `<svg>` of `width` × `height` user units (CSS pixels).
 */
export function SvgFigure({
  title,
  fileStem,
  width,
  height,
  children,
  caption,
}: {
  title: string;
  fileStem: string;
  width: number;
  height: number;
  children: React.ReactNode;
  caption?: React.ReactNode;
}) {
  const ref = useRef<SVGSVGElement>(null);
  return (
    <figure className="space-y-1.5">
      <figcaption className="flex items-center justify-between gap-2">
        <span className="text-sm font-medium">{title}</span>
        <Button
          type="button"
          variant="quiet"
          className="px-2 py-0.5 text-xs"
          aria-label={`Download SVG of ${title}`}
          onClick={() => ref.current && saveSvg(ref.current, `${fileStem}.svg`)}
        >
          Download SVG
        </Button>
      </figcaption>
      <svg
        ref={ref}
        role="img"
        aria-label={title}
        viewBox={`0 0 ${width} ${height}`}
        width={width}
        height={height}
        className="h-auto max-w-full rounded border border-rule"
        {...PLOT_FONT}
      >
        <title>{title}</title>
        <rect width={width} height={height} fill={PLOT_COLOURS.background} />
        {children}
      </svg>
      {caption && <p className="text-xs text-ink-soft">{caption}</p>}
    </figure>
  );
}
