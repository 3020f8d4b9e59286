/**
 * The sky index of one catalog: a `kdbush` k-d tree over (l, b) in degrees with l wrapped to
 * [0, 360). Cap queries return a superset of the sources within a radius; the caller applies the
 * exact great-circle test (separation.ts) to the few candidates that pass its cheaper tests.
 */
import KDBush from 'kdbush';
import { MatchInputError } from './errors';
import { IdBuffer } from './idBuffer';
import { DEG_TO_RAD } from './separation';
import type { SourceArrays } from './types';
import { validatePositions } from './validate';

/** Leaf size of the k-d tree (8–64 all ran within a few per cent on a million plane sources). */
const NODE_SIZE = 32;
/** Widening of every candidate box (deg) so round-off never drops a pair on the radius. */
export const BOX_MARGIN_DEG = 1e-9;
/** Scratch stack of the tree walk: 3 ints per level, 32 levels cover 2³² points. */
const STACK = new Uint32Array(96);

/**
 * A built sky index. `lDeg` and `vKms` are the catalog columns it was built from (used to check
 * reuse); `vKmsInTree[p]` is the velocity of the source in tree slot p (`tree.ids[p]`), kept beside
 * the coordinates so the velocity window is tested without a cache miss. Cap queries return tree
 * slots, not rows.
 */
export type SkyIndex = {
  count: number;
  lDeg: Float64Array;
  vKms: Float64Array | undefined;
  tree: KDBush;
  vKmsInTree: Float64Array;
};

/** Longitude in degrees wrapped to [0, 360). */
export function wrapLongitudeDeg(lDeg: number): number {
  if (lDeg >= 0 && lDeg < 360) return lDeg;
  let l = lDeg % 360;
  if (l < 0) l += 360;
  return l >= 360 ? 0 : l;
}

/**
 * Builds the index of a catalog (positions in Galactic degrees, velocities in km/s). Validates the
 * positions and throws `MatchInputError` naming the row of a bad one. The index copies the
 * velocities: do not change a catalog's columns after indexing it. Memory: 28 bytes per source.
 */
export function buildSkyIndex(src: SourceArrays, label = 'B'): SkyIndex {
  validatePositions(src, label);
  const { lDeg, bDeg, vKms } = src;
  const n = lDeg.length;
  const tree = new KDBush(n, NODE_SIZE, Float64Array);
  for (let i = 0; i < n; i++) tree.add(wrapLongitudeDeg(lDeg[i]), bDeg[i]);
  tree.finish();
  const vKmsInTree = new Float64Array(n);
  const ids = tree.ids;
  for (let p = 0; p < n; p++) vKmsInTree[p] = vKms ? vKms[ids[p]] : NaN;
  return { count: n, lDeg, vKms, tree, vKmsInTree };
}

/** Throws unless `index` was built from this catalog's `lDeg` and `vKms` columns. */
export function assertIndexOf(index: SkyIndex, src: SourceArrays, label: string): void {
  if (index.lDeg !== src.lDeg || index.vKms !== src.vKms || index.count !== src.lDeg.length) {
    throw new MatchInputError(
      `the index given for catalog ${label} was built from another catalog.`,
    );
  }
}

/** Appends to `out` the tree slots of all points in the box [minL, maxL] × [minB, maxB] (inclusive). */
export function boxSlots(
  tree: KDBush,
  minL: number,
  minB: number,
  maxL: number,
  maxB: number,
  out: IdBuffer,
): void {
  const ids = tree.ids;
  const coords = tree.coords as Float64Array;
  const nodeSize = tree.nodeSize;
  if (ids.length === 0) return;
  STACK[0] = 0;
  STACK[1] = ids.length - 1;
  STACK[2] = 0;
  let sp = 3;
  while (sp > 0) {
    const axis = STACK[--sp];
    const right = STACK[--sp];
    const left = STACK[--sp];
    if (right - left <= nodeSize) {
      for (let i = left; i <= right; i++) {
        const x = coords[2 * i];
        const y = coords[2 * i + 1];
        if (x >= minL && x <= maxL && y >= minB && y <= maxB) out.push(i);
      }
      continue;
    }
    const m = (left + right) >> 1;
    const x = coords[2 * m];
    const y = coords[2 * m + 1];
    if (x >= minL && x <= maxL && y >= minB && y <= maxB) out.push(m);
    if (axis === 0 ? minL <= x : minB <= y) {
      STACK[sp++] = left;
      STACK[sp++] = m - 1;
      STACK[sp++] = 1 - axis;
    }
    if (axis === 0 ? maxL >= x : maxB >= y) {
      STACK[sp++] = m + 1;
      STACK[sp++] = right;
      STACK[sp++] = 1 - axis;
    }
  }
}

/**
 * Longitude half-width (degrees, with the safety margin) of the box around a cap of `radiusDeg`
 * centred at latitude `bDeg`: asin(sin r / cos b), or 180 when the cap reaches a pole. It grows
 * with |b| and with r, so the value at the largest |b| and r of a group of caps covers them all.
 */
export function capHalfWidthDeg(radiusDeg: number, bDeg: number): number {
  const r = radiusDeg + BOX_MARGIN_DEG;
  if (Math.abs(bDeg) + r >= 90) return 180;
  const sinHalfWidth = Math.sin(r * DEG_TO_RAD) / Math.cos(bDeg * DEG_TO_RAD);
  return sinHalfWidth >= 1 ? 180 : Math.asin(sinHalfWidth) / DEG_TO_RAD + BOX_MARGIN_DEG;
}

/** `capBox` result: one box, or a box split at the l = 0°/360° seam. */
const ONE_BOX = 1;
const SEAM_BOXES = 2;

/**
 * The candidate box of the cap of `radiusDeg` around (lDeg, bDeg), written into `box` as
 * [minL, maxL, minB, maxB, minL₂, maxL₂] (wrapped longitudes, degrees). The box spans b ± r and
 * l ± asin(sin r / cos b), the exact longitude half-width of a spherical cap that does not contain a
 * pole; a box crossing l = 0°/360° is split in two (the second interval in slots 4–5); a cap that
 * reaches a pole becomes the full-longitude strip beyond b − r (or b + r). Returns the kind.
 */
function capBox(lDeg: number, bDeg: number, radiusDeg: number, box: Float64Array): number {
  const r = radiusDeg + BOX_MARGIN_DEG;
  box[2] = bDeg - r;
  box[3] = bDeg + r;
  const halfWidthDeg = capHalfWidthDeg(radiusDeg, bDeg);
  if (halfWidthDeg >= 180) {
    box[0] = 0;
    box[1] = 360;
    return ONE_BOX;
  }
  const l = wrapLongitudeDeg(lDeg);
  const minL = l - halfWidthDeg;
  const maxL = l + halfWidthDeg;
  if (minL < 0) {
    box[0] = 0;
    box[1] = maxL;
    box[4] = minL + 360;
    box[5] = 360;
    return SEAM_BOXES;
  }
  if (maxL >= 360) {
    box[0] = minL;
    box[1] = 360;
    box[4] = 0;
    box[5] = maxL - 360;
    return SEAM_BOXES;
  }
  box[0] = minL;
  box[1] = maxL;
  return ONE_BOX;
}

const scratchBox = new Float64Array(6);

/**
 * Writes into `out` (after clearing it) the tree slot of every source that may lie within
 * `radiusDeg` of (lDeg, bDeg), each once; the source's row is `index.tree.ids[slot]`. The exact
 * great-circle test is the caller's.
 */
export function capCandidates(
  index: SkyIndex,
  lDeg: number,
  bDeg: number,
  radiusDeg: number,
  out: IdBuffer,
): void {
  out.count = 0;
  const box = scratchBox;
  const kind = capBox(lDeg, bDeg, radiusDeg, box);
  boxSlots(index.tree, box[0], box[2], box[1], box[3], out);
  if (kind === SEAM_BOXES) boxSlots(index.tree, box[4], box[2], box[5], box[3], out);
}
