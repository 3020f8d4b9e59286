/**
 * The order in which a catalog's sources query an index: grouped into small sky cells, visited
 * strip by strip in a serpentine (a counting sort). Neighbouring queries then share tree nodes
 * that are still in the CPU cache, and the queries of one cell can share one tree search. The
 * plan changes speed only, never the result.
 */
import { wrapLongitudeDeg } from './skyIndex';
import type { SourceArrays } from './types';

/** Sources per cell on average (of the denser catalog). */
const SOURCES_PER_CELL = 8;
const MAX_CELLS = 1 << 22;

/**
 * The sources of A in cell order: `order[q]` is the row of the q-th query, cell c holds queries
 * `cellStart[c] … cellStart[c + 1] − 1`, and `lDeg`, `bDeg`, `vKms` are A's columns gathered in
 * query order (`vKms` NaN where missing).
 */
export type QueryPlan = {
  order: Uint32Array;
  cells: number;
  cellStart: Uint32Array;
  lDeg: Float64Array;
  bDeg: Float64Array;
  vKms: Float64Array;
};

/**
 * Plans the queries of catalog A (Galactic degrees) on a grid of about `densest / 16` cells of
 * equal size over all longitudes and A's latitude range, `densest` being the larger catalog size.
 */
export function planQueries(a: SourceArrays, densest: number): QueryPlan {
  const { lDeg, bDeg, vKms } = a;
  const n = lDeg.length;
  let bMin = Infinity;
  let bMax = -Infinity;
  for (let i = 0; i < n; i++) {
    if (bDeg[i] < bMin) bMin = bDeg[i];
    if (bDeg[i] > bMax) bMax = bDeg[i];
  }
  const bSpan = Math.max(bMax - bMin, 1e-9);
  const cellsWanted = Math.max(1, Math.min(MAX_CELLS, Math.ceil(densest / SOURCES_PER_CELL)));
  const side = Math.sqrt((360 * bSpan) / cellsWanted);
  const strips = Math.max(1, Math.min(cellsWanted, Math.ceil(360 / side)));
  const bands = Math.max(1, Math.min(Math.floor(MAX_CELLS / strips), Math.ceil(bSpan / side)));
  const cells = strips * bands;

  const cellOf = new Uint32Array(n);
  const cellStart = new Uint32Array(cells + 1);
  for (let i = 0; i < n; i++) {
    const strip = Math.min(strips - 1, Math.floor((wrapLongitudeDeg(lDeg[i]) / 360) * strips));
    let band = Math.min(bands - 1, Math.floor(((bDeg[i] - bMin) / bSpan) * bands));
    if (strip & 1) band = bands - 1 - band;
    const cell = strip * bands + band;
    cellOf[i] = cell;
    cellStart[cell + 1]++;
  }
  for (let c = 0; c < cells; c++) cellStart[c + 1] += cellStart[c];

  const next = cellStart.slice(0, cells);
  const order = new Uint32Array(n);
  const lInOrder = new Float64Array(n);
  const bInOrder = new Float64Array(n);
  const vInOrder = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const q = next[cellOf[i]]++;
    order[q] = i;
    lInOrder[q] = lDeg[i];
    bInOrder[q] = bDeg[i];
    vInOrder[q] = vKms ? vKms[i] : NaN;
  }
  return { order, cells, cellStart, lDeg: lInOrder, bDeg: bInOrder, vKms: vInOrder };
}
