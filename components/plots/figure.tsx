'use client';

import { useRef, useState } from 'react';
import { Button } from '@/components/ui/button';
import { PNG_SCALES, savePng, saveSvg, type PngScale } from './download';

/**
 * Colours of the inline plots: theme variables (app/globals.css), so figures follow the light or
 * dark theme on screen; a saved SVG gets the colours written out (components/plots/download.ts).
 */
export const PLOT_COLOURS = {
  background: 'var(--color-plot-bg)',
  ink: 'var(--color-plot-ink)',
  inkSoft: 'var(--color-plot-ink-soft)',
  rule: 'var(--color-plot-rule)',
  faint: 'var(--color-plot-faint)',
  accent: 'var(--color-plot-accent)',
} as const;

/** Font attributes for SVG text; a saved SVG carries the font itself. */
export const PLOT_FONT = { fontFamily: 'Inter, ui-sans-serif, sans-serif', fontSize: 11 } as const;

/** A number with a true minus sign for axis labels. */
export function axisNumber(v: number, decimals: number): string {
  const s = v.toFixed(decimals);
  return Number(s) === 0 ? s.replace(/^-/, '') : s.replace(/^-/, '−');
}

/** What a download button asks for: the SVG, or a PNG at 1×, 2× or 4×. */
export type FigureFormat = 'svg' | PngScale;

/**
 * The download buttons of a figure: SVG and PNG at 1×, 2× and 4×. `save` does the work (the
 * shared helpers for an inline SVG, see {@link svgSaver}); a failure is shown beside them.
 */
export function FigureDownloads({
  title,
  save,
  disabled = false,
}: {
  title: string;
  save: (format: FigureFormat) => Promise<void>;
  disabled?: boolean;
}) {
  const [error, setError] = useState<string | null>(null);
  const run = (format: FigureFormat) => {
    setError(null);
    save(format).catch((e: Error) =>
      setError(`${format === 'svg' ? 'SVG' : 'PNG'} not saved: ${e.message}.`),
    );
  };
  const small = 'px-2 py-0.5 text-xs';
  return (
    <span className="flex flex-wrap items-center gap-1">
      <Button
        type="button"
        variant="quiet"
        className={small}
        disabled={disabled}
        aria-label={`Download SVG of ${title}`}
        onClick={() => run('svg')}
      >
        SVG
      </Button>
      {PNG_SCALES.map((scale) => (
        <Button
          key={scale}
          type="button"
          variant="quiet"
          className={small}
          disabled={disabled}
          aria-label={
            scale === 1 ? `Download PNG of ${title}` : `Download PNG at ${scale}× of ${title}`
          }
          onClick={() => run(scale)}
        >
          {scale === 1 ? 'PNG' : `${scale}×`}
        </Button>
      ))}
      {error && (
        <span role="alert" className="text-xs text-danger">
          {error}
        </span>
      )}
    </span>
  );
}

/** Saves an inline `<svg>` figure in `format` (the `save` of {@link FigureDownloads}). */
export async function saveSvgFigure(
  svg: SVGSVGElement | null,
  fileStem: string,
  format: FigureFormat,
): Promise<void> {
  if (!svg) return;
  if (format === 'svg') await saveSvg(svg, `${fileStem}.svg`);
  else await savePng(svg, fileStem, format);
}

/**
 * A titled inline-SVG figure with its downloads. `children` draws inside an `<svg>` of
 * `width` × `height` user units (CSS pixels).
 */
export function SvgFigure({
  title,
  fileStem,
  width,
  height,
  children,
  caption,
  testId,
}: {
  title: string;
  fileStem: string;
  width: number;
  height: number;
  children: React.ReactNode;
  caption?: React.ReactNode;
  testId?: string;
}) {
  const ref = useRef<SVGSVGElement>(null);
  return (
    <figure className="min-w-0 space-y-1.5" data-testid={testId}>
      <figcaption className="flex flex-wrap items-center justify-between gap-2">
        <span className="text-sm font-medium">{title}</span>
        <FigureDownloads title={title} save={(f) => saveSvgFigure(ref.current, fileStem, f)} />
      </figcaption>
      <svg
        ref={ref}
        role="img"
        aria-label={title}
        viewBox={`0 0 ${width} ${height}`}
        width={width}
        height={height}
        className="h-auto max-w-full rounded border border-rule"
        data-figure=""
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
