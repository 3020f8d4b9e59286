'use client';

import { useEffect, useMemo, useRef, useState } from 'react';
import { markerPath, type MarkerShape } from '@/lib/tracers';
import { Button } from '@/components/ui/button';

/** One axis of a scatter plot. */
export interface AxisSpec {
  /** Symbol for the cursor readout, e.g. `l`. */
  symbol: string;
  /** Axis title without unit, e.g. `Galactic longitude l`. */
  label: string;
  /** Unit shown in brackets after the title and after readout values, e.g. `°`, `km/s`. */
  unit: string;
  /** Values grow to the left (x) or downwards (y), as Galactic longitude is drawn. */
  reversed?: boolean;
  /** Maps a plotted value to the value shown in ticks and readout (e.g. −10° → 350°). */
  toDisplay?: (v: number) => number;
}

type Range = [number, number];
type View = { x: Range; y: Range };

type Props = {
  /** Plotted x and y values, one pair per point; pairs with a NaN are skipped. */
  xs: Float32Array;
  ys: Float32Array;
  x: AxisSpec;
  y: AxisSpec;
  /** Point colour, `#rrggbb`. */
  colour: string;
  /** Marker shape for the legend and the SVG export. */
  shape: MarkerShape;
  /** Legend text, e.g. the catalog's name and class. */
  legend: string;
  /** Accessible name of the plot and stem of downloaded file names. */
  title: string;
  fileStem: string;
  /** Height over width of the plot; the height is kept between 260 and 620 CSS px. */
  aspect?: number;
  testId?: string;
};

const MARGIN = { left: 64, right: 16, top: 14, bottom: 46 };
const BACKGROUND = '#fffdf8';
const INK = '#1d2327';
const INK_SOFT = '#4a545b';
const RULE = '#bdb4a0';
/** Up to this many points in view are drawn as marker shapes; more as density pixels. */
export const MARKER_LIMIT = 5_000;
/** Name of the performance measure each redraw records. */
export const DRAW_MEASURE = 'lanewise:scatter-draw';
/** Points kept in the SVG download; the rest are left out by taking every k-th point. */
export const SVG_POINT_LIMIT = 20_000;

/**
 * "Nice" tick values (1, 2 or 5 × 10ⁿ apart) covering [lo, hi] with at most about `maxCount`
 * ticks, and the number of decimals that prints them exactly.
 */
export function niceTicks(
  lo: number,
  hi: number,
  maxCount: number,
): { ticks: number[]; decimals: number } {
  const span = hi - lo;
  if (!(span > 0) || !Number.isFinite(span)) return { ticks: [lo], decimals: 2 };
  const raw = span / Math.max(1, maxCount);
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? 10 * mag;
  const ticks: number[] = [];
  for (let t = Math.ceil(lo / step) * step; t <= hi + step * 1e-9; t += step)
    ticks.push(+t.toPrecision(12));
  return { ticks, decimals: Math.max(0, -Math.floor(Math.log10(step) + 1e-9)) };
}

/** A number with a true minus sign, as printed on axes. */
function fmt(v: number, decimals: number): string {
  const s = (Object.is(v, -0) ? 0 : v).toFixed(decimals);
  return s.startsWith('-') && Number(s) !== 0 ? `−${s.slice(1)}` : s.replace(/^-/, '');
}

/** The finite extent of the pairs, padded by 3 % on each side (a unit on each side if flat). */
function dataView(xs: Float32Array, ys: Float32Array): View | null {
  let x0 = Infinity;
  let x1 = -Infinity;
  let y0 = Infinity;
  let y1 = -Infinity;
  for (let i = 0; i < xs.length; i++) {
    const x = xs[i];
    const y = ys[i];
    if (x !== x || y !== y) continue;
    if (x < x0) x0 = x;
    if (x > x1) x1 = x;
    if (y < y0) y0 = y;
    if (y > y1) y1 = y;
  }
  if (x0 > x1) return null;
  const pad = (a: number, b: number): Range =>
    b > a ? [a - (b - a) * 0.03, b + (b - a) * 0.03] : [a - 1, b + 1];
  return { x: pad(x0, x1), y: pad(y0, y1) };
}

/** Plot-area geometry in CSS pixels and the data ↔ pixel transforms for one view. */
function frame(view: View, width: number, height: number, x: AxisSpec, y: AxisSpec) {
  const w = Math.max(1, width - MARGIN.left - MARGIN.right);
  const h = Math.max(1, height - MARGIN.top - MARGIN.bottom);
  const [xLo, xHi] = view.x;
  const [yLo, yHi] = view.y;
  const sx = (x.reversed ? -w : w) / (xHi - xLo);
  const ox = x.reversed ? w : 0;
  const sy = (y.reversed ? h : -h) / (yHi - yLo);
  const oy = y.reversed ? 0 : h;
  return {
    w,
    h,
    /** Data → x pixel offset inside the plot area. */
    px: (v: number) => ox + (v - xLo) * sx,
    py: (v: number) => oy + (v - yLo) * sy,
    /** Pixel offset inside the plot area → data. */
    dx: (p: number) => xLo + (p - ox) / sx,
    dy: (p: number) => yLo + (p - oy) / sy,
    xLo,
    yLo,
    sx,
    sy,
    ox,
    oy,
  };
}

type Frame = ReturnType<typeof frame>;

/**
 * Counts the points falling in each CSS-pixel cell of the plot area (a w × h grid, row-major).
 * One pass over flat arrays with no allocation per point, so a million points take a few ms.
 */
function binPoints(xs: Float32Array, ys: Float32Array, f: Frame, w: number, h: number) {
  const counts = new Uint32Array(w * h);
  let max = 0;
  let shown = 0;
  const { xLo, yLo, sx, sy, ox, oy } = f;
  for (let i = 0; i < xs.length; i++) {
    const cx = Math.floor(ox + (xs[i] - xLo) * sx);
    const cy = Math.floor(oy + (ys[i] - yLo) * sy);
    // NaN fails both comparisons, so points without a value drop out here too.
    if (!(cx >= 0 && cx < w && cy >= 0 && cy < h)) continue;
    const c = ++counts[cy * w + cx];
    if (c > max) max = c;
    shown++;
  }
  return { counts, max, shown };
}

function rgb(hex: string): [number, number, number] {
  const n = parseInt(hex.slice(1), 16);
  return [(n >> 16) & 255, (n >> 8) & 255, n & 255];
}

/**
 * Paints the binned points into an ImageData of the plot area at device resolution: each
 * occupied cell is one CSS pixel in the point colour, darker where more points pile up (opacity
 * grows with log count), so dense lanes stay readable without one draw call per point.
 */
function paintPoints(
  ctx: CanvasRenderingContext2D,
  binned: ReturnType<typeof binPoints>,
  w: number,
  h: number,
  dpr: number,
  colour: string,
): ImageData {
  const dw = Math.round(w * dpr);
  const dh = Math.round(h * dpr);
  const img = ctx.createImageData(dw, dh);
  const px = new Uint32Array(img.data.buffer);
  const [r, g, b] = rgb(colour);
  const [br, bg, bb] = rgb(BACKGROUND);
  // Little-endian RGBA packed as one 32-bit word; a 256-step table of blends by opacity.
  const lut = new Uint32Array(256);
  for (let k = 0; k < 256; k++) {
    const a = k / 255;
    const mix = (c: number, base: number) => Math.round(base + (c - base) * a);
    lut[k] = (255 << 24) | (mix(b, bb) << 16) | (mix(g, bg) << 8) | mix(r, br);
  }
  const { counts, max } = binned;
  const logMax = Math.log1p(Math.max(1, max));
  const colOf = new Int32Array(dw);
  for (let i = 0; i < dw; i++) colOf[i] = Math.min(w - 1, Math.floor(i / dpr));
  for (let j = 0; j < dh; j++) {
    const row = Math.min(h - 1, Math.floor(j / dpr)) * w;
    const out = j * dw;
    for (let i = 0; i < dw; i++) {
      const c = counts[row + colOf[i]];
      px[out + i] =
        c === 0 ? lut[0] : lut[Math.round(255 * (0.6 + (0.4 * Math.log1p(c)) / logMax))];
    }
  }
  return img;
}

/**
 * Draws each point in view as the class's marker shape, for catalogs small enough that single
 * pixels would be lost. All markers go into one path and one fill.
 */
function drawMarkers(
  ctx: CanvasRenderingContext2D,
  xs: Float32Array,
  ys: Float32Array,
  f: Frame,
  colour: string,
  shape: MarkerShape,
) {
  const parts: string[] = [];
  for (let i = 0; i < xs.length; i++) {
    const X = f.px(xs[i]);
    const Y = f.py(ys[i]);
    if (X >= 0 && X <= f.w && Y >= 0 && Y <= f.h) {
      parts.push(markerPath(shape, MARGIN.left + X, MARGIN.top + Y, 2.5));
    }
  }
  ctx.save();
  ctx.beginPath();
  ctx.rect(MARGIN.left, MARGIN.top, f.w, f.h);
  ctx.clip();
  ctx.globalAlpha = 0.8;
  ctx.fillStyle = colour;
  ctx.fill(new Path2D(parts.join('')));
  ctx.restore();
}

type Axes = {
  xTicks: ReturnType<typeof niceTicks>;
  yTicks: ReturnType<typeof niceTicks>;
};

function ticksFor(view: View, f: Frame): Axes {
  return {
    xTicks: niceTicks(view.x[0], view.x[1], Math.max(2, Math.floor(f.w / 80))),
    yTicks: niceTicks(view.y[0], view.y[1], Math.max(2, Math.floor(f.h / 50))),
  };
}

const axisTitle = (a: AxisSpec) => `${a.label} (${a.unit})`;
const shown = (a: AxisSpec, v: number, decimals: number) =>
  fmt(a.toDisplay ? a.toDisplay(v) : v, decimals);

/** Frame, ticks, tick labels, axis titles and legend, drawn over the painted points. */
function drawAxes(
  ctx: CanvasRenderingContext2D,
  f: Frame,
  axes: Axes,
  p: Pick<Props, 'x' | 'y' | 'colour' | 'shape' | 'legend'>,
  legendCount: string,
) {
  const L = MARGIN.left;
  const T = MARGIN.top;
  ctx.strokeStyle = RULE;
  ctx.lineWidth = 1;
  ctx.strokeRect(L + 0.5, T + 0.5, f.w - 1, f.h - 1);
  ctx.fillStyle = INK;
  ctx.strokeStyle = INK_SOFT;
  ctx.font = '11px ui-monospace, monospace';
  ctx.textAlign = 'center';
  ctx.textBaseline = 'top';
  ctx.beginPath();
  for (const t of axes.xTicks.ticks) {
    const X = Math.round(L + f.px(t)) + 0.5;
    ctx.moveTo(X, T + f.h);
    ctx.lineTo(X, T + f.h + 5);
    ctx.fillText(shown(p.x, t, axes.xTicks.decimals), X, T + f.h + 7);
  }
  ctx.textAlign = 'right';
  ctx.textBaseline = 'middle';
  for (const t of axes.yTicks.ticks) {
    const Y = Math.round(T + f.py(t)) + 0.5;
    ctx.moveTo(L - 5, Y);
    ctx.lineTo(L, Y);
    ctx.fillText(shown(p.y, t, axes.yTicks.decimals), L - 7, Y);
  }
  ctx.stroke();
  ctx.font = '12px ui-sans-serif, system-ui, sans-serif';
  ctx.textAlign = 'center';
  ctx.textBaseline = 'bottom';
  ctx.fillText(axisTitle(p.x), L + f.w / 2, T + f.h + MARGIN.bottom - 4);
  ctx.save();
  ctx.translate(14, T + f.h / 2);
  ctx.rotate(-Math.PI / 2);
  ctx.textBaseline = 'middle';
  ctx.fillText(axisTitle(p.y), 0, 0);
  ctx.restore();
  const text = `${p.legend} · ${legendCount}`;
  const tw = ctx.measureText(text).width;
  const bx = L + f.w - tw - 34;
  ctx.fillStyle = 'rgba(255,253,248,0.9)';
  ctx.fillRect(bx, T + 6, tw + 28, 20);
  ctx.fillStyle = p.colour;
  ctx.fill(new Path2D(markerPath(p.shape, bx + 11, T + 16, 5)));
  ctx.fillStyle = INK;
  ctx.textAlign = 'left';
  ctx.textBaseline = 'middle';
  ctx.fillText(text, bx + 21, T + 16);
}

const escapeXml = (s: string) =>
  s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

/**
 * The plot as a standalone SVG: frame, ticks, titles and legend as vector elements, and the
 * points inside the view as the class's marker shape. A vector file of a million markers is
 * too heavy to open, so above {@link SVG_POINT_LIMIT} points in view every k-th point is kept
 * (k = ⌈n / limit⌉, a deterministic thinning that keeps the density pattern) and the legend
 * says so; the PNG download keeps every point.
 */
function buildSvg(p: Props, view: View, width: number, height: number): string {
  const f = frame(view, width, height, p.x, p.y);
  const axes = ticksFor(view, f);
  const inView: number[] = [];
  for (let i = 0; i < p.xs.length; i++) {
    const X = f.px(p.xs[i]);
    const Y = f.py(p.ys[i]);
    if (X >= 0 && X <= f.w && Y >= 0 && Y <= f.h) inView.push(i);
  }
  const k = Math.max(1, Math.ceil(inView.length / SVG_POINT_LIMIT));
  const L = MARGIN.left;
  const T = MARGIN.top;
  const out: string[] = [];
  out.push(
    `<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" font-family="Helvetica, Arial, sans-serif">`,
    `<title>${escapeXml(p.title)}</title>`,
    `<defs><clipPath id="area"><rect x="${L}" y="${T}" width="${f.w}" height="${f.h}"/></clipPath>`,
    `<path id="m" d="${markerPath(p.shape, 0, 0, inView.length <= MARKER_LIMIT ? 2.5 : 1.6)}"/></defs>`,
    `<rect width="${width}" height="${height}" fill="${BACKGROUND}"/>`,
    `<g clip-path="url(#area)" fill="${p.colour}" fill-opacity="0.75">`,
  );
  for (let j = 0; j < inView.length; j += k) {
    const i = inView[j];
    out.push(
      `<use xlink:href="#m" href="#m" x="${(L + f.px(p.xs[i])).toFixed(2)}" y="${(T + f.py(p.ys[i])).toFixed(2)}"/>`,
    );
  }
  out.push(
    '</g>',
    `<rect x="${L + 0.5}" y="${T + 0.5}" width="${f.w - 1}" height="${f.h - 1}" fill="none" stroke="${RULE}"/>`,
  );
  out.push(
    `<g stroke="${INK_SOFT}" fill="${INK}" font-size="11" font-family="Menlo, Consolas, monospace">`,
  );
  for (const t of axes.xTicks.ticks) {
    const X = (L + f.px(t)).toFixed(2);
    out.push(
      `<line x1="${X}" x2="${X}" y1="${T + f.h}" y2="${T + f.h + 5}"/>`,
      `<text x="${X}" y="${T + f.h + 17}" text-anchor="middle" stroke="none">${shown(p.x, t, axes.xTicks.decimals)}</text>`,
    );
  }
  for (const t of axes.yTicks.ticks) {
    const Y = (T + f.py(t)).toFixed(2);
    out.push(
      `<line x1="${L - 5}" x2="${L}" y1="${Y}" y2="${Y}"/>`,
      `<text x="${L - 7}" y="${Y}" dy="0.35em" text-anchor="end" stroke="none">${shown(p.y, t, axes.yTicks.decimals)}</text>`,
    );
  }
  out.push('</g>', `<g fill="${INK}" font-size="12">`);
  out.push(
    `<text x="${L + f.w / 2}" y="${T + f.h + MARGIN.bottom - 6}" text-anchor="middle">${escapeXml(axisTitle(p.x))}</text>`,
    `<text transform="translate(14 ${T + f.h / 2}) rotate(-90)" dy="0.35em" text-anchor="middle">${escapeXml(axisTitle(p.y))}</text>`,
  );
  const count = k === 1 ? `${inView.length} points` : `every ${k}th of ${inView.length} points`;
  out.push(
    `<path d="${markerPath(p.shape, L + 12, T + 16, 5)}" fill="${p.colour}"/>`,
    `<text x="${L + 22}" y="${T + 16}" dy="0.35em">${escapeXml(`${p.legend} · ${count}`)}</text>`,
    '</g></svg>',
  );
  return out.join('\n');
}

function download(blob: Blob, fileName: string) {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

/**
 * A scatter plot of up to millions of points on a `<canvas>`: above {@link MARKER_LIMIT} points
 * in view they are binned into CSS-pixel cells and painted into one ImageData (opacity by log
 * count); fewer are drawn as marker shapes. Axes, ticks and a legend are drawn over them. Drag a box to zoom, "Reset zoom" to see everything; the cursor's coordinates
 * are read out below the plot. Downloads: PNG of the canvas as shown, SVG with vector axes and
 * at most {@link SVG_POINT_LIMIT} markers.
 */
export function ScatterCanvas(p: Props) {
  const { xs, ys, x, y, colour, shape, legend, title, fileStem, aspect = 0.5, testId } = p;
  const boxRef = useRef<HTMLDivElement>(null);
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const [width, setWidth] = useState(0);
  const [zoom, setZoom] = useState<View | null>(null);
  const [hover, setHover] = useState<{ x: number; y: number } | null>(null);
  const [drag, setDrag] = useState<{ x0: number; y0: number; x1: number; y1: number } | null>(null);
  const full = useMemo(() => dataView(xs, ys), [xs, ys]);
  const view = zoom ?? full;
  const height = Math.round(Math.min(620, Math.max(260, width * aspect)));
  const f = view && width > 0 ? frame(view, width, height, x, y) : null;

  useEffect(() => {
    const el = boxRef.current;
    if (!el) return;
    const ro = new ResizeObserver(([e]) => setWidth(Math.floor(e.contentRect.width)));
    ro.observe(el);
    return () => ro.disconnect();
  }, []);

  useEffect(() => {
    const canvas = canvasRef.current;
    if (!canvas || !view || width === 0) return;
    const dpr = window.devicePixelRatio || 1;
    canvas.width = Math.round(width * dpr);
    canvas.height = Math.round(height * dpr);
    const ctx = canvas.getContext('2d');
    if (!ctx) return;
    const started = performance.now();
    const fr = frame(view, width, height, x, y);
    const w = Math.round(fr.w);
    const h = Math.round(fr.h);
    ctx.setTransform(1, 0, 0, 1, 0, 0);
    ctx.fillStyle = BACKGROUND;
    ctx.fillRect(0, 0, canvas.width, canvas.height);
    const binned = binPoints(xs, ys, fr, w, h);
    if (binned.shown > MARKER_LIMIT) {
      const img = paintPoints(ctx, binned, w, h, dpr, colour);
      ctx.putImageData(img, Math.round(MARGIN.left * dpr), Math.round(MARGIN.top * dpr));
    }
    ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
    if (binned.shown <= MARKER_LIMIT) drawMarkers(ctx, xs, ys, fr, colour, shape);
    drawAxes(
      ctx,
      fr,
      ticksFor(view, fr),
      { x, y, colour, shape, legend },
      `${binned.shown.toLocaleString('en-US')} points`,
    );
    // Visible in the browser's performance panel; `npm run bench:plots` reads it.
    performance.measure(DRAW_MEASURE, { start: started, detail: { points: binned.shown, testId } });
  }, [xs, ys, view, width, height, x, y, colour, shape, legend, testId]);

  const local = (e: React.PointerEvent) => {
    const r = e.currentTarget.getBoundingClientRect();
    return { x: e.clientX - r.left - MARGIN.left, y: e.clientY - r.top - MARGIN.top };
  };
  const inside = (q: { x: number; y: number }) =>
    !!f && q.x >= 0 && q.x <= f.w && q.y >= 0 && q.y <= f.h;
  const readoutDecimals = (span: number, pixels: number) =>
    Math.max(0, Math.ceil(-Math.log10(Math.abs(span) / pixels)));

  return (
    <figure className="space-y-2">
      <div
        ref={boxRef}
        className="relative w-full select-none"
        style={{ height: width ? height : 300 }}
      >
        <canvas
          ref={canvasRef}
          data-testid={testId}
          role="img"
          aria-label={title}
          className="block cursor-crosshair touch-none"
          style={{ width: '100%', height }}
          onPointerDown={(e) => {
            const q = local(e);
            if (!inside(q)) return;
            e.currentTarget.setPointerCapture(e.pointerId);
            setDrag({ x0: q.x, y0: q.y, x1: q.x, y1: q.y });
          }}
          onPointerMove={(e) => {
            const q = local(e);
            setHover(inside(q) && f ? { x: f.dx(q.x), y: f.dy(q.y) } : null);
            if (drag)
              setDrag({
                ...drag,
                x1: Math.max(0, Math.min(f?.w ?? 0, q.x)),
                y1: Math.max(0, Math.min(f?.h ?? 0, q.y)),
              });
          }}
          onPointerLeave={() => setHover(null)}
          onPointerUp={() => {
            if (drag && f && Math.abs(drag.x1 - drag.x0) > 4 && Math.abs(drag.y1 - drag.y0) > 4) {
              const xa = f.dx(drag.x0);
              const xb = f.dx(drag.x1);
              const ya = f.dy(drag.y0);
              const yb = f.dy(drag.y1);
              setZoom({
                x: [Math.min(xa, xb), Math.max(xa, xb)],
                y: [Math.min(ya, yb), Math.max(ya, yb)],
              });
            }
            setDrag(null);
          }}
        />
        {drag && (
          <div
            aria-hidden
            className="pointer-events-none absolute border border-accent bg-accent/10"
            style={{
              left: MARGIN.left + Math.min(drag.x0, drag.x1),
              top: MARGIN.top + Math.min(drag.y0, drag.y1),
              width: Math.abs(drag.x1 - drag.x0),
              height: Math.abs(drag.y1 - drag.y0),
            }}
          />
        )}
        {!view && (
          <p className="absolute inset-0 flex items-center justify-center text-sm text-ink-soft">
            No points with both values to plot.
          </p>
        )}
      </div>
      <figcaption className="flex flex-wrap items-center gap-3 text-xs">
        <span
          className="num min-w-64 text-left text-ink-soft"
          aria-live="polite"
          data-testid={testId && `${testId}-readout`}
        >
          {hover && f
            ? `${x.symbol} = ${shown(x, hover.x, readoutDecimals(f.w / f.sx, f.w))} ${x.unit}   ${y.symbol} = ${shown(
                y,
                hover.y,
                readoutDecimals(f.h / f.sy, f.h),
              )} ${y.unit}`
            : 'Point at the plot to read coordinates; drag a box to zoom.'}
        </span>
        <span className="ml-auto flex gap-2">
          <Button
            variant="quiet"
            className="px-2 py-1 text-xs"
            disabled={!zoom}
            onClick={() => setZoom(null)}
          >
            Reset zoom
          </Button>
          <Button
            variant="quiet"
            className="px-2 py-1 text-xs"
            disabled={!view}
            onClick={() =>
              canvasRef.current?.toBlob((b) => b && download(b, `${fileStem}.png`), 'image/png')
            }
          >
            Download PNG
          </Button>
          <Button
            variant="quiet"
            className="px-2 py-1 text-xs"
            disabled={!view}
            onClick={() =>
              view &&
              download(
                new Blob([buildSvg(p, view, width, height)], { type: 'image/svg+xml' }),
                `${fileStem}.svg`,
              )
            }
          >
            Download SVG
          </Button>
        </span>
      </figcaption>
    </figure>
  );
}
