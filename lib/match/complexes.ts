/**
 * Complexes: the connected components of the links across all chosen catalogs, found by
 * union–find with union by size and path halving (Tarjan & van Leeuwen 1984). A source with no link belongs to
 * no complex. A complex larger than the cap is kept whole and flagged: dropping links to break it
 * up would make the result depend on the order of the links, and hiding it would hide the fact
 * that the tolerances chain sources together; the caller reports the flagged complexes so the user
 * can tighten the tolerances.
 */
import { MatchInputError } from './errors';

/** The links of one catalog pair as far as complexes need them. */
export type PairLinks = {
  catA: number;
  catB: number;
  links: { count: number; indexA: Uint32Array; indexB: Uint32Array };
};

/**
 * Complexes in compressed form. Complex `c` has `size[c]` members listed at
 * `memberCatalog/memberIndex[memberOffset[c] … memberOffset[c + 1] − 1]`, sorted by catalog then
 * row; `linkCount[c]` links; `overCap[c]` is 1 when its size exceeds `maxSize`. Complexes are
 * numbered by their first member (catalog order, then row). `complexOf[k][i]` is the complex of
 * row i of catalog k, or −1.
 */
export type ComplexSet = {
  count: number;
  complexOf: Int32Array[];
  size: Uint32Array;
  linkCount: Uint32Array;
  memberOffset: Uint32Array;
  memberCatalog: Uint32Array;
  memberIndex: Uint32Array;
  overCap: Uint8Array;
  maxSize: number;
  capped: Array<{ complex: number; size: number }>;
};

function find(parent: Int32Array, x: number): number {
  while (parent[x] !== x) {
    parent[x] = parent[parent[x]];
    x = parent[x];
  }
  return x;
}

/**
 * Groups linked sources into complexes. `nodeCounts[k]` is the number of rows of catalog k;
 * `pairs` are the links per catalog pair (e.g. `matchMany(...).pairs`); `maxSize` (≥ 2) is the cap
 * on members per complex — complexes above it are kept, flagged in `overCap` and listed in
 * `capped`. Throws `MatchInputError` for a link that points outside its catalog.
 */
export function buildComplexes(
  nodeCounts: ArrayLike<number>,
  pairs: PairLinks[],
  options: { maxSize: number },
): ComplexSet {
  const { maxSize } = options;
  if (!(maxSize >= 2)) throw new MatchInputError(`maxSize must be ≥ 2, got ${maxSize}.`);
  const catalogs = nodeCounts.length;
  const offsets = new Float64Array(catalogs + 1);
  for (let k = 0; k < catalogs; k++) {
    const n = nodeCounts[k];
    if (!Number.isInteger(n) || n < 0) {
      throw new MatchInputError(`nodeCounts[${k}] = ${n} is not a row count.`);
    }
    offsets[k + 1] = offsets[k] + n;
  }
  const total = offsets[catalogs];
  if (total > 0x7fffffff)
    throw new MatchInputError(`${total} sources exceed the 2³¹ − 1 limit of complexes.`);

  const parent = new Int32Array(total);
  const setSize = new Uint32Array(total).fill(1);
  const linked = new Uint8Array(total);
  for (let x = 0; x < total; x++) parent[x] = x;

  for (let p = 0; p < pairs.length; p++) {
    const { catA, catB, links } = pairs[p];
    if (!(catA >= 0 && catA < catalogs && catB >= 0 && catB < catalogs)) {
      throw new MatchInputError(
        `pairs[${p}] names catalogs ${catA} and ${catB}; there are ${catalogs}.`,
      );
    }
    const nA = nodeCounts[catA];
    const nB = nodeCounts[catB];
    for (let k = 0; k < links.count; k++) {
      const i = links.indexA[k];
      const j = links.indexB[k];
      if (i >= nA || j >= nB) {
        throw new MatchInputError(
          `pairs[${p}] link ${k} joins rows ${i} and ${j}, outside catalogs of ${nA} and ${nB} rows.`,
        );
      }
      const x = offsets[catA] + i;
      const y = offsets[catB] + j;
      linked[x] = 1;
      linked[y] = 1;
      let rx = find(parent, x);
      let ry = find(parent, y);
      if (rx === ry) continue;
      if (setSize[rx] < setSize[ry]) [rx, ry] = [ry, rx];
      parent[ry] = rx;
      setSize[rx] += setSize[ry];
    }
  }

  const complexOfRoot = new Int32Array(total).fill(-1);
  const complexOfNode = new Int32Array(total).fill(-1);
  let count = 0;
  for (let x = 0; x < total; x++) {
    if (!linked[x]) continue;
    const root = find(parent, x);
    if (complexOfRoot[root] < 0) complexOfRoot[root] = count++;
    complexOfNode[x] = complexOfRoot[root];
  }

  const size = new Uint32Array(count);
  for (let x = 0; x < total; x++) if (complexOfNode[x] >= 0) size[complexOfNode[x]]++;
  const memberOffset = new Uint32Array(count + 1);
  for (let c = 0; c < count; c++) memberOffset[c + 1] = memberOffset[c] + size[c];
  const members = memberOffset[count];
  const memberCatalog = new Uint32Array(members);
  const memberIndex = new Uint32Array(members);
  const fill = memberOffset.slice(0, count);
  const complexOf: Int32Array[] = [];
  for (let k = 0; k < catalogs; k++) {
    const ofCatalog = complexOfNode.slice(offsets[k], offsets[k + 1]);
    complexOf.push(ofCatalog);
    for (let i = 0; i < ofCatalog.length; i++) {
      const c = ofCatalog[i];
      if (c < 0) continue;
      memberCatalog[fill[c]] = k;
      memberIndex[fill[c]++] = i;
    }
  }

  const linkCount = new Uint32Array(count);
  for (const { catA, links } of pairs) {
    for (let k = 0; k < links.count; k++) linkCount[complexOf[catA][links.indexA[k]]]++;
  }
  const overCap = new Uint8Array(count);
  const capped: Array<{ complex: number; size: number }> = [];
  for (let c = 0; c < count; c++) {
    if (size[c] > maxSize) {
      overCap[c] = 1;
      capped.push({ complex: c, size: size[c] });
    }
  }
  return {
    count,
    complexOf,
    size,
    linkCount,
    memberOffset,
    memberCatalog,
    memberIndex,
    overCap,
    maxSize,
    capped,
  };
}
