'use client';

import { useEffect, useMemo, useRef, useState } from 'react';
import { markerPath, type MarkerShape } from '@/lib/tracers';
import { Button } from '@/components/ui/button';
import { saveBlob, pngFileName } from './download';
import { FigureDownloads, type FigureFormat } from './figure';
import { NearestPicker } from './nearest';
import { rgbChannels, useThemeColours, type ThemeColours } from './theme-colours';

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
  /** One line about point `i` (its row: catalog, row number, coordinates), shown on hover. */
  describe?: (i: number) => string;
  /** More about point `i` (its row as stored, with its name), fetched when it is clicked. */
  lookUp?: (i: number) => Promise<string>;
};

const MARGIN = { left: 64, right: 16, top: 14, bottom: 46 };
/** A source this near the pointer (CSS px) is picked by hover and click. */
const PICK_PX = 12;
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
  background: string,
): ImageData {
  const dw = Math.round(w * dpr);
  const dh = Math.round(h * dpr);
  const img = ctx.createImageData(dw, dh);
  const px = new Uint32Array(img.data.buffer);
  const [r, g, b] = rgbChannels(colour);
  const [br, bg, bb] = rgbChannels(background);
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
  colours: ThemeColours,
) {
  const { ink: INK, inkSoft: INK_SOFT, rule: RULE, background } = colours;
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
  ctx.globalAlpha = 0.9;
  ctx.fillStyle = background;
  ctx.fillRect(bx, T + 6, tw + 28, 20);
  ctx.globalAlpha = 1;
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
function buildSvg(
  p: Props,
  view: View,
  width: number,
  height: number,
  colours: ThemeColours,
): string {
  const { background: BACKGROUND, ink: INK, inkSoft: INK_SOFT, rule: RULE } = colours;
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

/**
 * Draws the whole plot into `canvas` at `dpr` device pixels per CSS pixel: the points (binned or
 * as markers), then axes and legend. The screen and the PNG downloads (at 1×, 2×, 4×) both come
 * from here. Returns the number of points in view.
 */
function drawPlot(
  canvas: HTMLCanvasElement,
  p: Pick<Props, 'xs' | 'ys' | 'x' | 'y' | 'colour' | 'shape' | 'legend'>,
  view: View,
  width: number,
  height: number,
  dpr: number,
  colours: ThemeColours,
): number {
  canvas.width = Math.round(width * dpr);
  canvas.height = Math.round(height * dpr);
  const ctx = canvas.getContext('2d');
  if (!ctx) throw new Error('this browser has no 2-D canvas');
  const fr = frame(view, width, height, p.x, p.y);
  const w = Math.round(fr.w);
  const h = Math.round(fr.h);
  ctx.setTransform(1, 0, 0, 1, 0, 0);
  ctx.fillStyle = colours.background;
  ctx.fillRect(0, 0, canvas.width, canvas.height);
  const binned = binPoints(p.xs, p.ys, fr, w, h);
  if (binned.shown > MARKER_LIMIT) {
    const img = paintPoints(ctx, binned, w, h, dpr, p.colour, colours.background);
    ctx.putImageData(img, Math.round(MARGIN.left * dpr), Math.round(MARGIN.top * dpr));
  }
  ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
  if (binned.shown <= MARKER_LIMIT) drawMarkers(ctx, p.xs, p.ys, fr, p.colour, p.shape);
  drawAxes(
    ctx,
    fr,
    ticksFor(view, fr),
    p,
    `${binned.shown.toLocaleString('en-US')} points`,
    colours,
  );
  return binned.shown;
}

/**
 * Runs one redraw and records it as the {@link DRAW_MEASURE} performance measure, visible in the
 * browser's performance panel; `npm run bench:plots` reads it.
 */
function measuredDraw(testId: string | undefined, draw: () => number) {
  const started = performance.now();
  const points = draw();
  performance.measure(DRAW_MEASURE, { start: started, detail: { points, testId } });
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
  const { describe, lookUp } = p;
  const boxRef = useRef<HTMLDivElement>(null);
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const [width, setWidth] = useState(0);
  const [zoom, setZoom] = useState<View | null>(null);
  const [hover, setHover] = useState<{ x: number; y: number; point: number } | null>(null);
  const [picked, setPicked] = useState<{ point: number; text: string } | null>(null);
  const colours = useThemeColours(boxRef);
  const picker = useMemo(() => new NearestPicker(xs, ys), [xs, ys]);
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
    const plot = { xs, ys, x, y, colour, shape, legend };
    const dpr = window.devicePixelRatio || 1;
    measuredDraw(testId, () => drawPlot(canvas, plot, view, width, height, dpr, colours));
  }, [xs, ys, view, width, height, x, y, colour, shape, legend, testId, colours]);

  const local = (e: React.PointerEvent) => {
    const r = e.currentTarget.getBoundingClientRect();
    return { x: e.clientX - r.left - MARGIN.left, y: e.clientY - r.top - MARGIN.top };
  };
  const inside = (q: { x: number; y: number }) =>
    !!f && q.x >= 0 && q.x <= f.w && q.y >= 0 && q.y <= f.h;
  const readoutDecimals = (span: number, pixels: number) =>
    Math.max(0, Math.ceil(-Math.log10(Math.abs(span) / pixels)));

  const save = async (format: FigureFormat) => {
    if (!view) return;
    if (format === 'svg') {
      const text = buildSvg(p, view, width, height, colours);
      saveBlob(new Blob([text], { type: 'image/svg+xml' }), `${fileStem}.svg`);
      return;
    }
    const canvas = document.createElement('canvas');
    drawPlot(canvas, p, view, width, height, format, colours);
    const blob = await new Promise<Blob | null>((resolve) => canvas.toBlob(resolve, 'image/png'));
    if (!blob) throw new Error('the canvas gave no PNG');
    saveBlob(blob, pngFileName(fileStem, format));
  };

  const pickAt = (q: { x: number; y: number }) =>
    f && inside(q) ? picker.nearest(f, q.x, q.y, PICK_PX) : -1;
  const describeAt = (i: number) =>
    describe?.(i) ??
    `${legend} · point ${i + 1} · ${x.symbol} = ${shown(x, xs[i], 3)} ${x.unit}, ${y.symbol} = ${shown(y, ys[i], 2)} ${y.unit}`;
  const pick = (point: number) => {
    if (point < 0) return setPicked(null);
    setPicked({ point, text: describeAt(point) });
    lookUp?.(point).then(
      (text) => setPicked((c) => (c?.point === point ? { point, text } : c)),
      () => undefined,
    );
  };
  const ring = (i: number) =>
    f && i >= 0 ? { left: MARGIN.left + f.px(xs[i]), top: MARGIN.top + f.py(ys[i]) } : null;
  const marked = ring(hover && hover.point >= 0 ? hover.point : (picked?.point ?? -1));

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
            setHover(inside(q) && f ? { x: f.dx(q.x), y: f.dy(q.y), point: pickAt(q) } : null);
            if (drag)
              setDrag({
                ...drag,
                x1: Math.max(0, Math.min(f?.w ?? 0, q.x)),
                y1: Math.max(0, Math.min(f?.h ?? 0, q.y)),
              });
          }}
          onPointerLeave={() => setHover(null)}
          onPointerUp={() => {
            const dragged =
              !!drag && Math.abs(drag.x1 - drag.x0) > 4 && Math.abs(drag.y1 - drag.y0) > 4;
            if (drag && !dragged) pick(pickAt({ x: drag.x0, y: drag.y0 }));
            if (drag && f && dragged) {
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
        {marked && (
          <div
            aria-hidden
            className="pointer-events-none absolute size-4 -translate-x-1/2 -translate-y-1/2 rounded-full border-2 border-ink"
            style={marked}
            data-testid={testId && `${testId}-marked`}
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
        <span className="ml-auto flex flex-wrap items-center gap-2">
          <Button
            variant="quiet"
            className="px-2 py-0.5 text-xs"
            disabled={!zoom}
            onClick={() => setZoom(null)}
          >
            Reset zoom
          </Button>
          <FigureDownloads title={title} save={save} disabled={!view} />
        </span>
        <span
          className="num w-full text-left text-ink"
          aria-live="polite"
          data-testid={testId && `${testId}-source`}
        >
          {hover && hover.point >= 0
            ? describeAt(hover.point)
            : picked
              ? picked.text
              : 'The source nearest the pointer is named here; click it to keep it.'}
        </span>
      </figcaption>
    </figure>
  );
}
