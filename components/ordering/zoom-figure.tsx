'use client';

import { useEffect, useId, useRef, useState } from 'react';
import { niceTicks } from '@/components/plots/scatter-canvas';
import {
  FigureDownloads,
  PLOT_COLOURS,
  PLOT_FONT,
  axisNumber,
  saveSvgFigure,
} from '@/components/plots/figure';
import { Button } from '@/components/ui/button';

/** A rectangle of data space: x from x0 to x1, y from y0 to y1 (x0 < x1, y0 < y1). */
export type Domain = { x0: number; x1: number; y0: number; y1: number };

/** Something the reader can point at: its data position and what the readout says about it. */
export type HoverTarget = { x: number; y: number; text: string };

/** Data-to-pixel maps of the current view, for the drawing inside the plot area. */
export interface Scales {
  px: (x: number) => number;
  py: (y: number) => number;
  view: Domain;
  /** Pixels per data unit along x (for sizes given in data units). */
  unitPx: number;
}

type Margin = { left: number; right: number; top: number; bottom: number };

const ZOOM_STEP = 1.6;
const HOVER_PX = 9;

function zoomAbout(v: Domain, cx: number, cy: number, f: number, zoomY: boolean): Domain {
  return {
    x0: cx - (cx - v.x0) * f,
    x1: cx + (v.x1 - cx) * f,
    y0: zoomY ? cy - (cy - v.y0) * f : v.y0,
    y1: zoomY ? cy + (v.y1 - cy) * f : v.y1,
  };
}

/**
 * An interactive inline-SVG plot: axes with ticks and labels (units in the labels), the drawing
 * clipped to the plot area, zoom by the mouse wheel or the +/− buttons, pan by dragging, a
 * readout of the nearest point under the pointer, and downloads as SVG or PNG of what is shown.
 * With `zoomY` false only the x axis zooms and pans (histograms). Zooming both axes by the same
 * factor keeps an equal-aspect map equal.
 */
export function ZoomFigure({
  title,
  fileStem,
  width,
  height,
  margin = { left: 58, right: 14, top: 14, bottom: 44 },
  domain,
  zoomY = true,
  xLabel,
  yLabel,
  xReversed = false,
  formatX = axisNumber,
  targets = [],
  children,
  overlay,
  caption,
  testId,
}: {
  title: string;
  fileStem: string;
  width: number;
  height: number;
  margin?: Margin;
  domain: Domain;
  zoomY?: boolean;
  xLabel: string;
  yLabel: string;
  xReversed?: boolean;
  formatX?: (x: number, decimals: number) => string;
  targets?: HoverTarget[];
  children: (s: Scales) => React.ReactNode;
  overlay?: (s: Scales) => React.ReactNode;
  caption?: React.ReactNode;
  testId?: string;
}) {
  const svgRef = useRef<SVGSVGElement>(null);
  const clipId = `clip-${useId().replace(/[^a-zA-Z0-9]/g, '')}`;
  const [zoom, setZoom] = useState<{ of: Domain; view: Domain }>({ of: domain, view: domain });
  const view = zoom.of === domain ? zoom.view : domain;
  const [hover, setHover] = useState<{ x: number; y: number; target: HoverTarget | null } | null>(
    null,
  );
  const drag = useRef<{ sx: number; sy: number; view: Domain } | null>(null);

  const w = width - margin.left - margin.right;
  const h = height - margin.top - margin.bottom;
  const spanX = view.x1 - view.x0;
  const spanY = view.y1 - view.y0;
  const px = (x: number) =>
    xReversed
      ? margin.left + ((view.x1 - x) / spanX) * w
      : margin.left + ((x - view.x0) / spanX) * w;
  const py = (y: number) => margin.top + h - ((y - view.y0) / spanY) * h;
  const scales: Scales = { px, py, view, unitPx: w / spanX };

  // Pointer position in the SVG's own units, and the data point under it.
  const toSvg = (e: { clientX: number; clientY: number }) => {
    const r = svgRef.current!.getBoundingClientRect();
    return {
      sx: ((e.clientX - r.left) * width) / r.width,
      sy: ((e.clientY - r.top) * height) / r.height,
    };
  };
  const toData = (sx: number, sy: number, v: Domain) => {
    const fx = (sx - margin.left) / w;
    return {
      x: xReversed ? v.x1 - fx * (v.x1 - v.x0) : v.x0 + fx * (v.x1 - v.x0),
      y: v.y0 + ((margin.top + h - sy) / h) * (v.y1 - v.y0),
    };
  };
  const setView = (next: (v: Domain) => Domain) =>
    setZoom((z) => ({ of: domain, view: next(z.of === domain ? z.view : domain) }));

  // React's wheel listener is passive; a native one may stop the page from scrolling.
  const wheelRef = useRef<(e: WheelEvent) => void>(() => undefined);
  useEffect(() => {
    wheelRef.current = (e: WheelEvent) => {
      e.preventDefault();
      const { sx, sy } = toSvg(e);
      const f = Math.exp(Math.max(-0.5, Math.min(0.5, e.deltaY * 0.0015)));
      setView((v) => {
        const c = toData(sx, sy, v);
        return zoomAbout(v, c.x, c.y, f, zoomY);
      });
    };
  });
  useEffect(() => {
    const svg = svgRef.current;
    if (!svg) return;
    const onWheel = (e: WheelEvent) => wheelRef.current(e);
    svg.addEventListener('wheel', onWheel, { passive: false });
    return () => svg.removeEventListener('wheel', onWheel);
  }, []);

  const onPointerMove = (e: React.PointerEvent<SVGSVGElement>) => {
    const { sx, sy } = toSvg(e);
    const d = drag.current;
    if (d) {
      const a = toData(d.sx, d.sy, d.view);
      const b = toData(sx, sy, d.view);
      const dx = a.x - b.x;
      const dy = zoomY ? a.y - b.y : 0;
      setView(() => ({
        x0: d.view.x0 + dx,
        x1: d.view.x1 + dx,
        y0: d.view.y0 + dy,
        y1: d.view.y1 + dy,
      }));
      return;
    }
    if (sx < margin.left || sx > margin.left + w || sy < margin.top || sy > margin.top + h) {
      setHover(null);
      return;
    }
    const c = toData(sx, sy, view);
    let best: HoverTarget | null = null;
    let bestD2 = HOVER_PX * HOVER_PX;
    for (const t of targets) {
      const d2 = (px(t.x) - sx) ** 2 + (py(t.y) - sy) ** 2;
      if (d2 < bestD2) {
        bestD2 = d2;
        best = t;
      }
    }
    setHover({ x: c.x, y: c.y, target: best });
  };

  const xt = niceTicks(view.x0, view.x1, Math.max(3, Math.round(w / 90)));
  const yt = niceTicks(view.y0, view.y1, Math.max(3, Math.round(h / 60)));
  const zoomed = view !== domain;
  const centre = () => ({ x: (view.x0 + view.x1) / 2, y: (view.y0 + view.y1) / 2 });

  return (
    <figure className="min-w-0 space-y-1.5" data-testid={testId}>
      <figcaption className="flex flex-wrap items-center justify-between gap-2">
        <span className="text-sm font-medium">{title}</span>
        <span className="flex flex-wrap items-center gap-1">
          <Button
            type="button"
            variant="quiet"
            className="px-2 py-0.5 text-xs"
            aria-label={`Zoom in on ${title}`}
            onClick={() =>
              setView((v) => zoomAbout(v, centre().x, centre().y, 1 / ZOOM_STEP, zoomY))
            }
          >
            +
          </Button>
          <Button
            type="button"
            variant="quiet"
            className="px-2 py-0.5 text-xs"
            aria-label={`Zoom out of ${title}`}
            onClick={() => setView((v) => zoomAbout(v, centre().x, centre().y, ZOOM_STEP, zoomY))}
          >
            −
          </Button>
          <Button
            type="button"
            variant="quiet"
            className="px-2 py-0.5 text-xs"
            disabled={!zoomed}
            aria-label={`Reset the view of ${title}`}
            onClick={() => setZoom({ of: domain, view: domain })}
          >
            Reset
          </Button>
          <FigureDownloads title={title} save={(f) => saveSvgFigure(svgRef.current, fileStem, f)} />
        </span>
      </figcaption>
      <svg
        ref={svgRef}
        role="img"
        aria-label={title}
        viewBox={`0 0 ${width} ${height}`}
        width={width}
        height={height}
        data-figure=""
        className="h-auto max-w-full cursor-grab touch-none select-none rounded border border-rule active:cursor-grabbing"
        {...PLOT_FONT}
        onPointerDown={(e) => {
          e.currentTarget.setPointerCapture(e.pointerId);
          drag.current = { ...toSvg(e), view };
          setHover(null);
        }}
        onPointerUp={() => {
          drag.current = null;
        }}
        onPointerCancel={() => {
          drag.current = null;
        }}
        onPointerMove={onPointerMove}
        onPointerLeave={() => setHover(null)}
        onDoubleClick={() => setZoom({ of: domain, view: domain })}
      >
        <title>{title}</title>
        <defs>
          <clipPath id={clipId}>
            <rect x={margin.left} y={margin.top} width={w} height={h} />
          </clipPath>
        </defs>
        <rect width={width} height={height} fill={PLOT_COLOURS.background} />
        {xt.ticks.map((t) => (
          <line
            key={`gx${t}`}
            x1={px(t)}
            x2={px(t)}
            y1={margin.top}
            y2={margin.top + h}
            stroke={PLOT_COLOURS.faint}
            strokeWidth={0.6}
          />
        ))}
        {yt.ticks.map((t) => (
          <line
            key={`gy${t}`}
            x1={margin.left}
            x2={margin.left + w}
            y1={py(t)}
            y2={py(t)}
            stroke={PLOT_COLOURS.faint}
            strokeWidth={0.6}
          />
        ))}
        <g clipPath={`url(#${clipId})`}>
          {children(scales)}
          {hover?.target && (
            <circle
              cx={px(hover.target.x)}
              cy={py(hover.target.y)}
              r={7}
              fill="none"
              stroke={PLOT_COLOURS.ink}
              strokeWidth={1.2}
            />
          )}
        </g>
        <rect
          x={margin.left}
          y={margin.top}
          width={w}
          height={h}
          fill="none"
          stroke={PLOT_COLOURS.ink}
          strokeWidth={0.8}
        />
        {xt.ticks.map((t) => (
          <g key={`x${t}`}>
            <line
              x1={px(t)}
              x2={px(t)}
              y1={margin.top + h}
              y2={margin.top + h + 4}
              stroke={PLOT_COLOURS.ink}
            />
            <text x={px(t)} y={margin.top + h + 15} textAnchor="middle" fill={PLOT_COLOURS.inkSoft}>
              {formatX(t, xt.decimals)}
            </text>
          </g>
        ))}
        {yt.ticks.map((t) => (
          <g key={`y${t}`}>
            <line
              x1={margin.left - 4}
              x2={margin.left}
              y1={py(t)}
              y2={py(t)}
              stroke={PLOT_COLOURS.ink}
            />
            <text
              x={margin.left - 7}
              y={py(t)}
              dy="0.35em"
              textAnchor="end"
              fill={PLOT_COLOURS.inkSoft}
            >
              {axisNumber(t, yt.decimals)}
            </text>
          </g>
        ))}
        <text x={margin.left + w / 2} y={height - 8} textAnchor="middle" fill={PLOT_COLOURS.ink}>
          {xLabel}
        </text>
        <text
          transform={`translate(14 ${margin.top + h / 2}) rotate(-90)`}
          textAnchor="middle"
          fill={PLOT_COLOURS.ink}
        >
          {yLabel}
        </text>
        {overlay?.(scales)}
      </svg>
      <p
        className="min-h-5 text-xs text-ink-soft"
        aria-live="polite"
        data-testid={testId ? `${testId}-readout` : undefined}
      >
        {hover
          ? hover.target
            ? hover.target.text
            : `${xLabel} ${formatX(hover.x, xt.decimals + 1)}, ${yLabel} ${axisNumber(hover.y, yt.decimals + 1)}`
          : 'Point at the plot for a readout; wheel or +/− to zoom, drag to pan, double-click to reset.'}
      </p>
      {caption && <div className="text-xs text-ink-soft">{caption}</div>}
    </figure>
  );
}
