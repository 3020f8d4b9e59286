import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  buildComplexes,
  matchMany,
  MatchInputError,
  type ComplexSet,
  type MatchParams,
} from '@/lib/match';
import { atSeam, catalogPair, nearPoles } from './arbitraries';
import { bruteForceComponents } from './oracle';

type RawPair = { catA: number; catB: number; links: Array<[number, number]> };

const linkGraph = fc
  .array(fc.integer({ min: 1, max: 12 }), { minLength: 2, maxLength: 4 })
  .chain((counts) => {
    const pair = fc
      .tuple(
        fc.integer({ min: 0, max: counts.length - 1 }),
        fc.integer({ min: 0, max: counts.length - 1 }),
      )
      .filter(([x, y]) => x !== y)
      .chain(([catA, catB]) =>
        fc
          .array(fc.tuple(fc.nat({ max: counts[catA] - 1 }), fc.nat({ max: counts[catB] - 1 })), {
            maxLength: 15,
          })
          .map((links) => ({ catA, catB, links })),
      );
    return fc.tuple(fc.constant(counts), fc.array(pair, { maxLength: 5 }));
  });

function toPairs(raw: RawPair[]) {
  return raw.map(({ catA, catB, links }) => ({
    catA,
    catB,
    links: {
      count: links.length,
      indexA: Uint32Array.from(links, (x) => x[0]),
      indexB: Uint32Array.from(links, (x) => x[1]),
    },
  }));
}

function componentsOf(set: ComplexSet): string[][] {
  const components: string[][] = [];
  for (let c = 0; c < set.count; c++) {
    const members: string[] = [];
    for (let k = set.memberOffset[c]; k < set.memberOffset[c + 1]; k++) {
      members.push(`${set.memberCatalog[k]}:${set.memberIndex[k]}`);
    }
    components.push(members.sort());
  }
  return components.sort((x, y) => (x[0] < y[0] ? -1 : 1));
}

function checkAgainstBfs(counts: number[], raw: RawPair[], maxSize: number): void {
  const set = buildComplexes(counts, toPairs(raw), { maxSize });
  const expected = bruteForceComponents(raw);
  expect(componentsOf(set)).toEqual(expected); // brute-force BFS oracle
  for (let c = 0; c < set.count; c++) {
    expect(set.size[c]).toBe(set.memberOffset[c + 1] - set.memberOffset[c]);
    for (let k = set.memberOffset[c]; k < set.memberOffset[c + 1]; k++) {
      expect(set.complexOf[set.memberCatalog[k]][set.memberIndex[k]]).toBe(c);
    }
  }
  const linkedNodes = new Set(expected.flat());
  counts.forEach((n, cat) => {
    for (let i = 0; i < n; i++) {
      if (!linkedNodes.has(`${cat}:${i}`)) expect(set.complexOf[cat][i]).toBe(-1);
    }
  });
  const linksPerComplex = new Array<number>(set.count).fill(0);
  for (const { catA, links } of raw)
    for (const [i] of links) linksPerComplex[set.complexOf[catA][i]]++;
  expect(Array.from(set.linkCount)).toEqual(linksPerComplex); // counted from the input links
  const over = expected.filter((members) => members.length > maxSize).map((m) => m.length);
  expect(set.capped.map((x) => x.size).sort()).toEqual(over.sort()); // brute-force BFS oracle
  for (const { complex, size } of set.capped) {
    expect(set.overCap[complex]).toBe(1);
    expect(set.size[complex]).toBe(size);
  }
  expect(Array.from(set.overCap).filter((x) => x === 1).length).toBe(over.length);
}

describe('buildComplexes', { timeout: 60_000 }, () => {
  it('equals the connected components of the links, and reports complexes over the cap', () => {
    fc.assert(
      fc.property(linkGraph, fc.integer({ min: 2, max: 6 }), ([counts, raw], maxSize) =>
        checkAgainstBfs(counts, raw, maxSize),
      ),
      { numRuns: 300 },
    );
  });

  it('keeps a complex over the cap whole and flags it', () => {
    // A chain A0–B0–A1–B1 (4 members) and a pair A2–B2; cap 3
    const set = buildComplexes(
      [3, 3],
      toPairs([
        {
          catA: 0,
          catB: 1,
          links: [
            [0, 0],
            [1, 0],
            [1, 1],
            [2, 2],
          ],
        },
      ]),
      {
        maxSize: 3,
      },
    );
    expect(set.count).toBe(2); // by construction
    expect(Array.from(set.size)).toEqual([4, 2]); // by construction
    expect(set.capped).toEqual([{ complex: 0, size: 4 }]); // by construction
    expect(Array.from(set.overCap)).toEqual([1, 0]); // by construction
  });

  it('names a link outside its catalog', () => {
    expect(() =>
      buildComplexes([2, 2], toPairs([{ catA: 0, catB: 1, links: [[0, 5]] }]), { maxSize: 10 }),
    ).toThrow(MatchInputError);
    expect(() => buildComplexes([2, 2], [], { maxSize: 1 })).toThrow('maxSize must be ≥ 2, got 1.');
  });

  it('on real links across three catalogs equals the BFS components', async () => {
    const params: MatchParams = {
      radius: { mode: 'fixed', arcsec: 600 },
      velocity: { mode: 'fixed', kms: 8 },
      linkMode: 'all',
      missingVelocity: 'position-only',
    };
    await fc.assert(
      fc.asyncProperty(
        catalogPair(fc.oneof(atSeam, nearPoles), { missingVelocityRate: 0.2 }),
        catalogPair(fc.oneof(atSeam, nearPoles)),
        fc.integer({ min: 2, max: 8 }),
        async (first, second, maxSize) => {
          const catalogs = [first.a, first.b, second.a];
          const { pairs } = await matchMany(catalogs, params);
          const raw = pairs.map(({ catA, catB, links }) => ({
            catA,
            catB,
            links: Array.from(links.indexA, (i, k) => [i, links.indexB[k]] as [number, number]),
          }));
          checkAgainstBfs(
            catalogs.map((c) => c.lDeg.length),
            raw,
            maxSize,
          );
        },
      ),
      { numRuns: 60 },
    );
  });
});
