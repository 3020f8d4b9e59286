/**
 * Brute-force oracles for the matcher tests: every pair of sources is examined, the tolerances are
 * written out again here from their definitions, and graph components come from breadth-first
 * search. Slow and obviously right; used on small catalogs only.
 */
import { separationArcsec, type MatchParams, type SourceArrays } from '@/lib/match';

export type OracleLink = { i: number; j: number; sepArcsec: number; dvKms: number };

function radiusOf(
  params: MatchParams,
  a: SourceArrays,
  b: SourceArrays,
  i: number,
  j: number,
): number {
  if (params.radius.mode === 'fixed') return params.radius.arcsec;
  const ra = a.radiusArcsec?.[i] ?? 0;
  const rb = b.radiusArcsec?.[j] ?? 0;
  const ea = a.posErrArcsec?.[i] ?? 0;
  const eb = b.posErrArcsec?.[j] ?? 0;
  const base = Math.max(params.radius.minArcsec, params.radius.factor * (ra + rb));
  return Math.sqrt(base ** 2 + ea ** 2 + eb ** 2);
}

function windowOf(
  params: MatchParams,
  a: SourceArrays,
  b: SourceArrays,
  i: number,
  j: number,
): number {
  if (params.velocity.mode === 'ignore') return Infinity;
  if (params.velocity.mode === 'fixed') return params.velocity.kms;
  const sa = a.lineWidthKms![i];
  const sb = b.lineWidthKms![j];
  return params.velocity.factor * Math.sqrt(sa ** 2 + sb ** 2);
}

/** Every pair passing both tolerances, in (i, j) order; A optionally rotated by `shiftLDeg`. */
export function bruteForcePairs(
  a: SourceArrays,
  b: SourceArrays,
  params: MatchParams,
  shiftLDeg = 0,
): OracleLink[] {
  const links: OracleLink[] = [];
  const useVelocity = params.velocity.mode !== 'ignore';
  for (let i = 0; i < a.lDeg.length; i++) {
    for (let j = 0; j < b.lDeg.length; j++) {
      const va = a.vKms ? a.vKms[i] : NaN;
      const vb = b.vKms ? b.vKms[j] : NaN;
      const missing = Number.isNaN(va) || Number.isNaN(vb);
      if (useVelocity) {
        if (missing && params.missingVelocity !== 'position-only') continue;
        if (!missing && Math.abs(vb - va) > windowOf(params, a, b, i, j)) continue;
      }
      const l = shiftLDeg === 0 ? a.lDeg[i] : a.lDeg[i] + shiftLDeg;
      const sep = separationArcsec(l, a.bDeg[i], b.lDeg[j], b.bDeg[j]);
      if (sep <= radiusOf(params, a, b, i, j)) links.push({ i, j, sepArcsec: sep, dvKms: vb - va });
    }
  }
  return links;
}

function better(x: OracleLink, y: OracleLink | undefined, by: 'i' | 'j'): boolean {
  if (!y) return true;
  if (x.sepArcsec !== y.sepArcsec) return x.sepArcsec < y.sepArcsec;
  const ax = Number.isNaN(x.dvKms) ? Infinity : Math.abs(x.dvKms);
  const ay = Number.isNaN(y.dvKms) ? Infinity : Math.abs(y.dvKms);
  if (ax !== ay) return ax < ay;
  return x[by] < y[by];
}

/** For each source of A, its best valid partner in B (definition of the `nearest` mode). */
export function bruteForceNearest(all: OracleLink[]): OracleLink[] {
  const best = new Map<number, OracleLink>();
  for (const link of all) if (better(link, best.get(link.i), 'j')) best.set(link.i, link);
  return [...best.values()].sort((x, y) => x.i - y.i);
}

/** Pairs that are each other's best valid partner (definition of the `mutual` mode). */
export function bruteForceMutual(all: OracleLink[]): OracleLink[] {
  const bestOfA = new Map<number, OracleLink>();
  const bestOfB = new Map<number, OracleLink>();
  for (const link of all) {
    if (better(link, bestOfA.get(link.i), 'j')) bestOfA.set(link.i, link);
    if (better(link, bestOfB.get(link.j), 'i')) bestOfB.set(link.j, link);
  }
  return [...bestOfA.values()]
    .filter((link) => bestOfB.get(link.j) === link)
    .sort((x, y) => x.i - y.i);
}

/** Connected components (as sorted "catalog:row" lists, sorted) of the graph of links, by BFS. */
export function bruteForceComponents(
  pairs: Array<{ catA: number; catB: number; links: Array<[number, number]> }>,
): string[][] {
  const adjacency = new Map<string, string[]>();
  const connect = (x: string, y: string) => {
    if (!adjacency.has(x)) adjacency.set(x, []);
    adjacency.get(x)!.push(y);
  };
  for (const { catA, catB, links } of pairs) {
    for (const [i, j] of links) {
      connect(`${catA}:${i}`, `${catB}:${j}`);
      connect(`${catB}:${j}`, `${catA}:${i}`);
    }
  }
  const seen = new Set<string>();
  const components: string[][] = [];
  for (const start of adjacency.keys()) {
    if (seen.has(start)) continue;
    const queue = [start];
    seen.add(start);
    for (let k = 0; k < queue.length; k++) {
      for (const next of adjacency.get(queue[k])!) {
        if (!seen.has(next)) {
          seen.add(next);
          queue.push(next);
        }
      }
    }
    components.push(queue.sort());
  }
  return components.sort((x, y) => (x[0] < y[0] ? -1 : 1));
}
