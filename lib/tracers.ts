/**
 * The tracer classes of a catalog and how every screen marks them: one label, one colour and
 * one plot shape per class, shared by tables, plots and legends. Colours are the Okabe & Ito
 * (2008) palette for colour-blind readers (the same hex values as `--color-tracer-*` in
 * app/globals.css); the shape marks the class a second time for readers who cannot tell the
 * colours apart or who print in grey.
 */

/** Catalog tracer classes as the API spells them. */
export const TRACER_KINDS = ['hi', 'co', 'hii', 'ob', 'other'] as const;

export type TracerKind = (typeof TRACER_KINDS)[number];

/** Marker shapes used in plots and legends. */
export type MarkerShape = 'circle' | 'square' | 'triangle' | 'diamond' | 'cross';

export interface TracerStyle {
  /** Short label for badges and legends, e.g. `CO`. */
  label: string;
  /** Longer wording for forms, e.g. `CO (molecular) clouds`. */
  description: string;
  /** `#rrggbb`. */
  colour: string;
  shape: MarkerShape;
}

export const TRACERS: Record<TracerKind, TracerStyle> = {
  hi: {
    label: 'HI',
    description: 'HI (atomic hydrogen) clouds',
    colour: '#0072b2',
    shape: 'circle',
  },
  co: { label: 'CO', description: 'CO (molecular) clouds', colour: '#009e73', shape: 'square' },
  hii: { label: 'HII', description: 'HII regions', colour: '#d55e00', shape: 'triangle' },
  ob: {
    label: 'OB',
    description: 'OB associations and young clusters',
    colour: '#cc79a7',
    shape: 'diamond',
  },
  other: {
    label: 'Other',
    description: 'other tracers (masers, YSOs, …)',
    colour: '#e69f00',
    shape: 'cross',
  },
};

/** True when `s` is one of {@link TRACER_KINDS}. */
export function isTracerKind(s: string): s is TracerKind {
  return (TRACER_KINDS as readonly string[]).includes(s);
}

/** The style of a class; unknown strings fall back to `other` so a new class never breaks a table. */
export function tracerStyle(kind: string): TracerStyle {
  return isTracerKind(kind) ? TRACERS[kind] : TRACERS.other;
}

/**
 * SVG path data of a marker centred on (`x`, `y`) with half-size `r`, in the units of the
 * drawing (pixels on canvas via `Path2D`, user units in SVG). The cross is drawn as an outline
 * of a plus sign so that every shape can be filled.
 */
export function markerPath(shape: MarkerShape, x: number, y: number, r: number): string {
  const f = (n: number) => +n.toFixed(3);
  switch (shape) {
    case 'circle':
      return `M${f(x - r)} ${f(y)}a${f(r)} ${f(r)} 0 1 0 ${f(2 * r)} 0a${f(r)} ${f(r)} 0 1 0 ${f(-2 * r)} 0Z`;
    case 'square': {
      const s = r * 0.9;
      return `M${f(x - s)} ${f(y - s)}h${f(2 * s)}v${f(2 * s)}h${f(-2 * s)}Z`;
    }
    case 'triangle':
      return `M${f(x)} ${f(y - r)}L${f(x + r)} ${f(y + r * 0.8)}L${f(x - r)} ${f(y + r * 0.8)}Z`;
    case 'diamond':
      return `M${f(x)} ${f(y - r)}L${f(x + r)} ${f(y)}L${f(x)} ${f(y + r)}L${f(x - r)} ${f(y)}Z`;
    case 'cross': {
      const t = r * 0.35;
      return (
        `M${f(x - t)} ${f(y - r)}h${f(2 * t)}v${f(r - t)}h${f(r - t)}v${f(2 * t)}h${f(t - r)}` +
        `v${f(r - t)}h${f(-2 * t)}v${f(t - r)}h${f(t - r)}v${f(-2 * t)}h${f(r - t)}Z`
      );
    }
  }
}
