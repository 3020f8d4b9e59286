/**
 * The generated catalogs as columns (one flat typed array per quantity, index = row), with the
 * observed quantities that go into the files and the truth that goes into the truth files.
 */
import type { Tracer } from './params';

/** How an independent distance was obtained (stored as a small integer). */
export const DIST_METHOD = { none: 0, parallax: 1, photometric: 2 } as const;

/** One tracer catalog. Angles in degrees, distances in kpc, velocities in km/s. */
export type TracerCatalog = {
  tracer: Tracer;
  count: number;
  // Observed.
  /** Galactic longitude [0, 360) and latitude, deg (the true position: no centroid error is injected). */
  lDeg: Float64Array;
  bDeg: Float64Array;
  /** Observed LSR velocity, radio convention (true velocity plus measurement error). */
  vLsrKms: Float64Array;
  /** 1σ velocity measurement error. */
  vErrKms: Float64Array;
  /** Angular diameter, arcmin. */
  sizeArcmin: Float64Array;
  /** Line width, km/s: FWHM for HI and HII, 1σ dispersion for CO, NaN for OB. */
  lineWidthKms: Float64Array;
  /** Independent distance and its 1σ error (NaN when none), and {@link DIST_METHOD}. */
  indepDistKpc: Float64Array;
  indepDistErrKpc: Float64Array;
  distMethod: Uint8Array;
  // Truth.
  /** Galactocentric position (frame of `@/lib/astro/galactocentric`). */
  xKpc: Float64Array;
  yKpc: Float64Array;
  zKpc: Float64Array;
  RKpc: Float64Array;
  betaDeg: Float64Array;
  /** True line-of-sight distance from the Sun. */
  distKpc: Float64Array;
  /** Nearest arm (index into the truth's arms) and offsets from its ridge, from `offsetFromArms`. */
  armIndex: Int8Array;
  perpOffsetKpc: Float64Array;
  azimuthOffsetDeg: Float64Array;
  /** Complex the source belongs to, −1 for an interloper. */
  complexId: Int32Array;
  /** Phase of the source's complex (Myr relative to the ridge crossing), NaN for an interloper. */
  phaseMyr: Float64Array;
  /** Line-of-sight velocity parts: circular rotation (as `vLsrAtKms`), streaming, random. */
  vCircKms: Float64Array;
  vStreamKms: Float64Array;
  vRandomKms: Float64Array;
  /** Physical diameter, pc. */
  sizePc: Float64Array;
};

/** An empty catalog of n rows. */
export function allocateCatalog(tracer: Tracer, n: number): TracerCatalog {
  const f = () => new Float64Array(n);
  return {
    tracer,
    count: n,
    lDeg: f(),
    bDeg: f(),
    vLsrKms: f(),
    vErrKms: f(),
    sizeArcmin: f(),
    lineWidthKms: f(),
    indepDistKpc: f().fill(NaN),
    indepDistErrKpc: f().fill(NaN),
    distMethod: new Uint8Array(n),
    xKpc: f(),
    yKpc: f(),
    zKpc: f(),
    RKpc: f(),
    betaDeg: f(),
    distKpc: f(),
    armIndex: new Int8Array(n),
    perpOffsetKpc: f(),
    azimuthOffsetDeg: f(),
    complexId: new Int32Array(n),
    phaseMyr: f(),
    vCircKms: f(),
    vStreamKms: f(),
    vRandomKms: f(),
    sizePc: f(),
  };
}

/**
 * The catalog reordered by `order` (row k of the result is row order[k] of the input), used to
 * sort each catalog by longitude as survey catalogs usually are.
 */
export function permuteCatalog(cat: TracerCatalog, order: Uint32Array): TracerCatalog {
  const out = allocateCatalog(cat.tracer, cat.count);
  for (const key of Object.keys(cat) as (keyof TracerCatalog)[]) {
    const src = cat[key];
    const dst = out[key];
    if (ArrayBuffer.isView(src) && ArrayBuffer.isView(dst)) {
      const s = src as Float64Array;
      const d = dst as Float64Array;
      for (let k = 0; k < order.length; k++) d[k] = s[order[k]];
    }
  }
  return out;
}

/** Row order that sorts a catalog by Galactic longitude (ties by latitude). */
export function longitudeOrder(cat: TracerCatalog): Uint32Array {
  const idx = Array.from({ length: cat.count }, (_, i) => i);
  idx.sort((a, b) => cat.lDeg[a] - cat.lDeg[b] || cat.bDeg[a] - cat.bDeg[b]);
  return Uint32Array.from(idx);
}
