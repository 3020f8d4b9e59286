import KDBush from 'kdbush';

/**
 * A linear data → pixel map of one plot view: `px = ox + (x − xLo) · sx`, `py = oy + (y − yLo) · sy`
 * (pixels inside the plot area; sx or sy negative where an axis runs the other way).
 */
export interface PixelMap {
  xLo: number;
  yLo: number;
  sx: number;
  sy: number;
  ox: number;
  oy: number;
}

/**
 * Finds the point nearest a pixel on screen among flat arrays of data coordinates. The KD-tree is
 * built once over the data (points with a NaN are left out); each query asks it for the points
 * in the data-space box that a `radiusPx` square around the pixel covers in the current view,
 * then measures those in pixels, so the answer is the nearest on screen whatever the zoom or the
 * aspect of the axes.
 */
export class NearestPicker {
  private readonly index: KDBush | null;
  /** Position in xs/ys of each point the tree holds. */
  private readonly source: Uint32Array;

  constructor(
    private readonly xs: ArrayLike<number>,
    private readonly ys: ArrayLike<number>,
  ) {
    if (xs.length !== ys.length)
      throw new RangeError(`NearestPicker: xs has ${xs.length} values, ys ${ys.length}`);
    const kept: number[] = [];
    for (let i = 0; i < xs.length; i++) if (xs[i] === xs[i] && ys[i] === ys[i]) kept.push(i);
    this.source = Uint32Array.from(kept);
    if (kept.length === 0) {
      this.index = null;
      return;
    }
    const index = new KDBush(kept.length);
    for (const i of kept) index.add(xs[i], ys[i]);
    this.index = index.finish();
  }

  /**
   * The position (in xs/ys) of the point whose pixel lies nearest (qxPx, qyPx) and at most
   * `radiusPx` away, or −1. Ties go to the earlier point.
   */
  nearest(map: PixelMap, qxPx: number, qyPx: number, radiusPx: number): number {
    if (!this.index || !(radiusPx >= 0)) return -1;
    const xa = map.xLo + (qxPx - radiusPx - map.ox) / map.sx;
    const xb = map.xLo + (qxPx + radiusPx - map.ox) / map.sx;
    const ya = map.yLo + (qyPx - radiusPx - map.oy) / map.sy;
    const yb = map.yLo + (qyPx + radiusPx - map.oy) / map.sy;
    let best = -1;
    let bestD2 = radiusPx * radiusPx;
    for (const k of this.index.range(
      Math.min(xa, xb),
      Math.min(ya, yb),
      Math.max(xa, xb),
      Math.max(ya, yb),
    )) {
      const i = this.source[k];
      const dx = map.ox + (this.xs[i] - map.xLo) * map.sx - qxPx;
      const dy = map.oy + (this.ys[i] - map.yLo) * map.sy - qyPx;
      const d2 = dx * dx + dy * dy;
      if (d2 < bestD2 || (d2 === bestD2 && (best === -1 || i < best))) {
        bestD2 = d2;
        best = i;
      }
    }
    return best;
  }
}
