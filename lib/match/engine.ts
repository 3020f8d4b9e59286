/**
 * The pair engine shared by `matchCatalogs` and the chance-link estimate: validates a catalog pair
 * once, then runs the match, optionally with catalog A rotated in longitude. For each source of A
 * it asks B's sky index for the candidates within the largest radius that source can have, applies
 * the velocity window, then the exact separation against the pair's own radius.
 */
import { MatchInputError } from './errors';
import { IdBuffer } from './idBuffer';
import { LinkBuffer } from './linkBuffer';
import { planQueries, type QueryPlan } from './queryPlan';
import type { ProgressTracker } from './progress';
import { DEG_TO_RAD, separationFromTrigArcsec } from './separation';
import {
  assertIndexOf,
  BOX_MARGIN_DEG,
  boxSlots,
  buildSkyIndex,
  capCandidates,
  capHalfWidthDeg,
  wrapLongitudeDeg,
  type SkyIndex,
} from './skyIndex';
import { pairRadiusArcsec, velocityWindowKms } from './tolerance';
import type { LinkSet, MatchParams, SourceArrays } from './types';
import { countMissingVelocity, validateCatalog, validateParams } from './validate';

/** Queries between two progress reports / cancellation checks. */
const CHUNK = 4096;

/** A catalog pair checked and indexed, ready to be matched (possibly several times). */
export type PreparedPair = {
  a: SourceArrays;
  b: SourceArrays;
  indexB: SkyIndex;
  params: MatchParams;
  useVelocity: boolean;
  positionOnly: boolean;
  missingA: number;
  missingB: number;
  maxRadiusB: number;
  maxPosErrB: number;
};

function columnMax(column: Float64Array | undefined): number {
  let max = 0;
  if (column) for (let i = 0; i < column.length; i++) if (column[i] > max) max = column[i];
  return max;
}

function firstMissingVelocity(src: SourceArrays): number {
  const { vKms } = src;
  if (!vKms) return 0;
  for (let i = 0; i < vKms.length; i++) if (vKms[i] !== vKms[i]) return i;
  return -1;
}

/**
 * Validates parameters and both catalogs and builds (or checks) B's index. Throws
 * `MatchInputError` when the velocity window is in use, some source lacks a velocity and the
 * caller has not said whether to exclude it or link it on position only.
 */
export function preparePair(
  a: SourceArrays,
  b: SourceArrays,
  params: MatchParams,
  indexB: SkyIndex | undefined,
  labels: [string, string] = ['A', 'B'],
): PreparedPair {
  validateParams(params);
  validateCatalog(a, labels[0], params);
  validateCatalog(b, labels[1], params);
  const useVelocity = params.velocity.mode !== 'ignore';
  const missingA = useVelocity ? countMissingVelocity(a) : 0;
  const missingB = useVelocity ? countMissingVelocity(b) : 0;
  if (missingA + missingB > 0 && params.missingVelocity === undefined) {
    const [label, src, missing] =
      missingA > 0 ? [labels[0], a, missingA] : [labels[1], b, missingB];
    throw new MatchInputError(
      `catalog ${label} has ${missing} source(s) without a velocity (first at row ${firstMissingVelocity(src)}); ` +
        `set missingVelocity to 'exclude' or 'position-only'.`,
    );
  }
  const index = indexB ?? buildSkyIndex(b, labels[1]);
  assertIndexOf(index, b, labels[1]);
  const scaled = params.radius.mode === 'scaled';
  return {
    a,
    b,
    indexB: index,
    params,
    useVelocity,
    positionOnly: params.missingVelocity === 'position-only',
    missingA,
    missingB,
    maxRadiusB: scaled ? columnMax(b.radiusArcsec) : 0,
    maxPosErrB: scaled ? columnMax(b.posErrArcsec) : 0,
  };
}

function isBetter(
  sep: number,
  absDv: number,
  index: number,
  bestSep: number,
  bestAbsDv: number,
  bestIndex: number,
): boolean {
  if (sep !== bestSep) return sep < bestSep;
  if (absDv !== bestAbsDv) return absDv < bestAbsDv;
  return index < bestIndex;
}

/**
 * The state of one match run. The hot loop lives in the synchronous `runCells`, called once per
 * chunk, so the engine optimizes it early (a long loop inside an async function would not be).
 *
 * Queries go cell by cell (queryPlan.ts). When no candidate box of a cell crosses the seam or
 * reaches a pole, the cell makes one tree search over the union of its boxes and each query then
 * keeps the slots inside its own box; otherwise each query searches the tree itself. Either way a
 * query sees every source that can lie within its radius.
 */
class PairRun {
  readonly links: LinkBuffer;
  readonly plan: QueryPlan;
  private readonly cellSlots = new IdBuffer(1024);
  private readonly candidates = new IdBuffer(256);
  private boxes = new Float64Array(4 * 64);
  private readonly keepAll: boolean;
  private readonly mutual: boolean;
  private readonly fixedRadiusArcsec: number;
  readonly bestBofA: Int32Array;
  readonly bestSepOfA: Float64Array;
  readonly bestDvOfA: Float64Array;
  readonly bestAofB: Int32Array;
  private readonly bestSepOfB: Float64Array;
  private readonly bestAbsDvOfB: Float64Array;

  constructor(
    private readonly pair: PreparedPair,
    private readonly shiftLDeg: number,
  ) {
    const { a, b, params } = pair;
    const nA = a.lDeg.length;
    const nB = b.lDeg.length;
    this.plan = planQueries(a, Math.max(nA, nB));
    this.links = new LinkBuffer(Math.min(1 << 16, Math.max(16, nA)));
    this.keepAll = params.linkMode === 'all';
    this.mutual = params.linkMode === 'mutual';
    this.fixedRadiusArcsec = params.radius.mode === 'fixed' ? params.radius.arcsec : -1;
    const perA = this.mutual ? nA : 0;
    const perB = this.mutual ? nB : 0;
    this.bestBofA = new Int32Array(perA).fill(-1);
    this.bestSepOfA = new Float64Array(perA);
    this.bestDvOfA = new Float64Array(perA);
    this.bestAofB = new Int32Array(perB).fill(-1);
    this.bestSepOfB = new Float64Array(perB).fill(Infinity);
    this.bestAbsDvOfB = new Float64Array(perB).fill(Infinity);
  }

  /** Largest radius (arcsec) query q can need: its own size and error against B's largest. */
  private maxRadiusArcsec(q: number): number {
    if (this.fixedRadiusArcsec >= 0) return this.fixedRadiusArcsec;
    const { a, params, maxRadiusB, maxPosErrB } = this.pair;
    const i = this.plan.order[q];
    const ra = a.radiusArcsec ? a.radiusArcsec[i] : 0;
    const ea = a.posErrArcsec ? a.posErrArcsec[i] : 0;
    return pairRadiusArcsec(params.radius, ra, maxRadiusB, ea, maxPosErrB);
  }

  private skips(q: number): boolean {
    const { useVelocity, positionOnly } = this.pair;
    const va = this.plan.vKms[q];
    return useVelocity && va !== va && !positionOnly;
  }

  /** Runs the queries of cells `firstCell … endCell − 1`. */
  runCells(firstCell: number, endCell: number): void {
    const { cellStart, lDeg, bDeg } = this.plan;
    const { tree } = this.pair.indexB;
    const coords = tree.coords as Float64Array;
    const { cellSlots, candidates, shiftLDeg } = this;
    for (let c = firstCell; c < endCell; c++) {
      const qStart = cellStart[c];
      const qEnd = cellStart[c + 1];
      if (qStart === qEnd) continue;
      if (this.boxes.length < 2 * (qEnd - qStart))
        this.boxes = new Float64Array(4 * (qEnd - qStart));
      // Per query: wrapped longitude and radius (deg, with margin); NaN marks a skipped query.
      const boxes = this.boxes;
      let minL = Infinity;
      let maxL = -Infinity;
      let minB = Infinity;
      let maxB = -Infinity;
      let maxAbsB = 0;
      let maxR = 0;
      for (let q = qStart; q < qEnd; q++) {
        const k = 2 * (q - qStart);
        if (this.skips(q)) {
          boxes[k] = NaN;
          continue;
        }
        const l = wrapLongitudeDeg(shiftLDeg === 0 ? lDeg[q] : lDeg[q] + shiftLDeg);
        const b = bDeg[q];
        const r = this.maxRadiusArcsec(q) / 3600 + BOX_MARGIN_DEG;
        boxes[k] = l;
        boxes[k + 1] = r;
        if (l < minL) minL = l;
        if (l > maxL) maxL = l;
        if (b < minB) minB = b;
        if (b > maxB) maxB = b;
        if (Math.abs(b) > maxAbsB) maxAbsB = Math.abs(b);
        if (r > maxR) maxR = r;
      }
      if (minL > maxL) continue;
      const halfWidth = capHalfWidthDeg(maxR, maxAbsB);
      if (qEnd - qStart > 1 && minL - halfWidth >= 0 && maxL + halfWidth < 360) {
        // One tree search for the cell; every query keeps the slots inside its own box, which
        // uses the cell's largest half-width (a superset of its exact box; the exact test decides).
        cellSlots.count = 0;
        boxSlots(tree, minL - halfWidth, minB - maxR, maxL + halfWidth, maxB + maxR, cellSlots);
        const slots = cellSlots.ids;
        for (let q = qStart; q < qEnd; q++) {
          const k = 2 * (q - qStart);
          const l = boxes[k];
          if (l !== l) continue;
          const r = boxes[k + 1];
          const qMinL = l - halfWidth;
          const qMaxL = l + halfWidth;
          const qMinB = bDeg[q] - r;
          const qMaxB = bDeg[q] + r;
          candidates.count = 0;
          for (let s = 0; s < cellSlots.count; s++) {
            const slot = slots[s];
            const x = coords[2 * slot];
            const y = coords[2 * slot + 1];
            if (x >= qMinL && x <= qMaxL && y >= qMinB && y <= qMaxB) candidates.push(slot);
          }
          this.linkQuery(q);
        }
      } else {
        for (let q = qStart; q < qEnd; q++) {
          if (this.skips(q)) continue;
          const l = shiftLDeg === 0 ? lDeg[q] : lDeg[q] + shiftLDeg;
          capCandidates(this.pair.indexB, l, bDeg[q], this.maxRadiusArcsec(q) / 3600, candidates);
          this.linkQuery(q);
        }
      }
    }
  }

  /** Applies the velocity window and the exact separation to query q's candidates; keeps links. */
  private linkQuery(q: number): void {
    const { a, b, indexB, params, useVelocity, positionOnly } = this.pair;
    const { radius, velocity } = params;
    const { links, candidates, keepAll, mutual, fixedRadiusArcsec, shiftLDeg } = this;
    const { bestBofA, bestSepOfA, bestDvOfA, bestAofB, bestSepOfB, bestAbsDvOfB } = this;
    const i = this.plan.order[q];
    const va = this.plan.vKms[q];
    const l = shiftLDeg === 0 ? this.plan.lDeg[q] : this.plan.lDeg[q] + shiftLDeg;
    const bDeg = this.plan.bDeg[q];
    const treeIds = indexB.tree.ids;
    const vInTree = indexB.vKmsInTree;
    const ra = a.radiusArcsec ? a.radiusArcsec[i] : 0;
    const ea = a.posErrArcsec ? a.posErrArcsec[i] : 0;
    const sa = a.lineWidthKms ? a.lineWidthKms[i] : 0;
    const lB = b.lDeg;
    const bB = b.bDeg;
    const radB = b.radiusArcsec;
    const errB = b.posErrArcsec;
    const sigB = b.lineWidthKms;

    // A's sines and cosines are computed only once a candidate passes the velocity window.
    let trigReady = false;
    let cl = 0;
    let sl = 0;
    let cb = 0;
    let sb = 0;
    const firstLink = links.count;
    let bestJ = -1;
    let bestSep = Infinity;
    let bestAbsDv = Infinity;
    let bestDv = NaN;
    const slots = candidates.ids;
    for (let k = 0; k < candidates.count; k++) {
      const slot = slots[k];
      const dv = vInTree[slot] - va;
      if (useVelocity) {
        if (dv !== dv) {
          if (!positionOnly) continue;
        } else if (
          !(Math.abs(dv) <= velocityWindowKms(velocity, sa, sigB ? sigB[treeIds[slot]] : 0))
        ) {
          continue;
        }
      }
      const j = treeIds[slot];
      if (!trigReady) {
        cl = Math.cos(l * DEG_TO_RAD);
        sl = Math.sin(l * DEG_TO_RAD);
        cb = Math.cos(bDeg * DEG_TO_RAD);
        sb = Math.sin(bDeg * DEG_TO_RAD);
        trigReady = true;
      }
      const sep = separationFromTrigArcsec(
        cl,
        sl,
        cb,
        sb,
        Math.cos(lB[j] * DEG_TO_RAD),
        Math.sin(lB[j] * DEG_TO_RAD),
        Math.cos(bB[j] * DEG_TO_RAD),
        Math.sin(bB[j] * DEG_TO_RAD),
      );
      const radiusArcsec =
        fixedRadiusArcsec >= 0
          ? fixedRadiusArcsec
          : pairRadiusArcsec(radius, ra, radB ? radB[j] : 0, ea, errB ? errB[j] : 0);
      if (!(sep <= radiusArcsec)) continue;
      if (keepAll) {
        links.push(i, j, sep, dv);
        continue;
      }
      const absDv = dv === dv ? Math.abs(dv) : Infinity;
      if (isBetter(sep, absDv, j, bestSep, bestAbsDv, bestJ)) {
        bestJ = j;
        bestSep = sep;
        bestAbsDv = absDv;
        bestDv = dv;
      }
      if (mutual && isBetter(sep, absDv, i, bestSepOfB[j], bestAbsDvOfB[j], bestAofB[j])) {
        bestAofB[j] = i;
        bestSepOfB[j] = sep;
        bestAbsDvOfB[j] = absDv;
      }
    }
    if (keepAll) links.sortTailByIndexB(firstLink);
    else if (bestJ >= 0) {
      if (mutual) {
        bestBofA[i] = bestJ;
        bestSepOfA[i] = bestSep;
        bestDvOfA[i] = bestDv;
      } else links.push(i, bestJ, bestSep, bestDv);
    }
  }

  /** Adds the mutual-best pairs once every source of A has been queried. */
  collectMutual(): void {
    const { bestBofA, bestAofB, bestSepOfA, bestDvOfA, links } = this;
    for (let i = 0; i < bestBofA.length; i++) {
      const j = bestBofA[i];
      if (j >= 0 && bestAofB[j] === i) links.push(i, j, bestSepOfA[i], bestDvOfA[i]);
    }
  }
}

/**
 * Runs the match of a prepared pair with catalog A rotated by `shiftLDeg` in longitude (0 for the
 * real match). Links come out sorted by A index then B index.
 */
export async function runPair(
  pair: PreparedPair,
  shiftLDeg: number,
  tracker: ProgressTracker,
): Promise<LinkSet> {
  const nA = pair.a.lDeg.length;
  const run = new PairRun(pair, shiftLDeg);
  const { cells, cellStart } = run.plan;
  let cell = 0;
  while (cell < cells) {
    await tracker.step(nA === 0 ? 0 : cellStart[cell] / nA);
    let end = cell + 1;
    while (end < cells && cellStart[end] - cellStart[cell] < CHUNK) end++;
    run.runCells(cell, end);
    cell = end;
  }
  if (pair.params.linkMode === 'mutual') run.collectMutual();
  await tracker.step(1);
  const { useVelocity, positionOnly } = pair;
  const excluding = useVelocity && !positionOnly;
  return run.links.toLinkSetSortedByA(nA, {
    excludedA: excluding ? pair.missingA : 0,
    excludedB: excluding ? pair.missingB : 0,
    positionOnlyA: useVelocity && positionOnly ? pair.missingA : 0,
    positionOnlyB: useVelocity && positionOnly ? pair.missingB : 0,
  });
}
