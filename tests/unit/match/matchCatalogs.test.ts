import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  MatchCancelledError,
  MatchInputError,
  buildSkyIndex,
  matchCatalogs,
  type LinkSet,
  type MatchParams,
  type SourceArrays,
} from '@/lib/match';
import {
  anywhere,
  atSeam,
  catalogPair,
  fixedRadius,
  highLatitude,
  nearPoles,
  paramsWith,
  scaledRadius,
} from './arbitraries';
import { bruteForceMutual, bruteForceNearest, bruteForcePairs, type OracleLink } from './oracle';
import { mulberry32, randomPlaneCatalog } from './random';

const num = (min: number, max: number) => fc.double({ min, max, noNaN: true });

function rows(links: LinkSet): OracleLink[] {
  return Array.from({ length: links.count }, (_, k) => ({
    i: links.indexA[k],
    j: links.indexB[k],
    sepArcsec: links.sepArcsec[k],
    dvKms: links.dvKms[k],
  }));
}

async function agreesWithOracle(
  a: SourceArrays,
  b: SourceArrays,
  params: MatchParams,
): Promise<void> {
  const links = await matchCatalogs(a, b, params);
  const all = bruteForcePairs(a, b, params);
  const expected =
    params.linkMode === 'all'
      ? all
      : params.linkMode === 'nearest'
        ? bruteForceNearest(all)
        : bruteForceMutual(all);
  expect(rows(links)).toEqual(expected); // brute-force oracle
}

describe(
  'matchCatalogs against the brute-force oracle (all pairs, exact separation)',
  { timeout: 60_000 },
  () => {
    it('sources piled at the l = 0°/360° seam, radii 0″ … 0.2°', async () => {
      await fc.assert(
        fc.asyncProperty(
          catalogPair(atSeam),
          paramsWith(fixedRadius(num(0, 720))),
          ({ a, b }, params) => agreesWithOracle(a, b, params),
        ),
      );
    });

    it('sources within 0.1° of both poles, radii up to 10°', async () => {
      await fc.assert(
        fc.asyncProperty(
          catalogPair(nearPoles),
          paramsWith(fixedRadius(fc.oneof(num(0, 720), num(0, 36000)))),
          ({ a, b }, params) => agreesWithOracle(a, b, params),
        ),
      );
    });

    it('exact duplicates and a zero radius link only coincident sources', async () => {
      await fc.assert(
        fc.asyncProperty(
          catalogPair(fc.oneof(anywhere, atSeam, nearPoles)),
          paramsWith(fixedRadius(fc.constant(0))),
          async ({ a, b }, params) => {
            await agreesWithOracle(a, b, params);
            const links = await matchCatalogs(a, b, params);
            for (let k = 0; k < links.count; k++) expect(links.sepArcsec[k]).toBe(0); // zero radius: only sep = 0
          },
        ),
      );
    });

    it('high latitudes, radii up to 10° (caps widened by 1/cos b)', async () => {
      await fc.assert(
        fc.asyncProperty(
          catalogPair(highLatitude),
          paramsWith(fixedRadius(fc.oneof(num(0, 3600), num(0, 36000)))),
          ({ a, b }, params) => agreesWithOracle(a, b, params),
        ),
      );
    });

    it('a 10° radius anywhere on the sky', async () => {
      await fc.assert(
        fc.asyncProperty(
          catalogPair(fc.oneof(anywhere, atSeam, nearPoles, highLatitude)),
          paramsWith(fixedRadius(fc.constant(36000))),
          ({ a, b }, params) => agreesWithOracle(a, b, params),
        ),
      );
    });

    it('scaled radii with position errors, scaled velocity windows', async () => {
      await fc.assert(
        fc.asyncProperty(
          catalogPair(fc.oneof(atSeam, nearPoles, anywhere, highLatitude)),
          paramsWith(scaledRadius),
          ({ a, b }, params) => agreesWithOracle(a, b, params),
        ),
      );
    });

    it('missing velocities under both policies, with counts reported', async () => {
      await fc.assert(
        fc.asyncProperty(
          catalogPair(fc.oneof(atSeam, nearPoles), { missingVelocityRate: 0.3 }),
          paramsWith(fc.oneof(fixedRadius(num(0, 36000)), scaledRadius)),
          async ({ a, b }, params) => {
            await agreesWithOracle(a, b, params);
            const links = await matchCatalogs(a, b, params);
            const missingA = a.vKms!.filter(Number.isNaN).length;
            const missingB = b.vKms!.filter(Number.isNaN).length;
            const used = params.velocity.mode !== 'ignore';
            const excluding = used && params.missingVelocity === 'exclude';
            expect([links.excludedA, links.excludedB]).toEqual(
              excluding ? [missingA, missingB] : [0, 0],
            );
            const positionOnly = used && params.missingVelocity === 'position-only';
            expect([links.positionOnlyA, links.positionOnlyB]).toEqual(
              positionOnly ? [missingA, missingB] : [0, 0],
            );
          },
        ),
      );
    });

    it('nearest: each A source to its best partner in B', async () => {
      await fc.assert(
        fc.asyncProperty(
          catalogPair(fc.oneof(atSeam, nearPoles), { missingVelocityRate: 0.2 }),
          paramsWith(fc.oneof(fixedRadius(num(0, 36000)), scaledRadius), 'nearest'),
          ({ a, b }, params) => agreesWithOracle(a, b, params),
        ),
      );
    });

    it('mutual: pairs that are each other’s best partner', async () => {
      await fc.assert(
        fc.asyncProperty(
          catalogPair(fc.oneof(atSeam, nearPoles), { missingVelocityRate: 0.2 }),
          paramsWith(fc.oneof(fixedRadius(num(0, 36000)), scaledRadius), 'mutual'),
          ({ a, b }, params) => agreesWithOracle(a, b, params),
        ),
      );
    });

    it('larger crowded catalogs across the seam and at high latitude (deep trees, shared cell searches)', async () => {
      await fc.assert(
        fc.asyncProperty(
          fc.integer({ min: 1, max: 2 ** 31 - 1 }),
          fc
            .constantFrom('all' as const, 'nearest' as const, 'mutual' as const)
            .chain((mode) => paramsWith(fc.oneof(fixedRadius(num(0, 900)), scaledRadius), mode)),
          async (seed, params) => {
            const random = mulberry32(seed);
            const crowded = (n: number): SourceArrays => {
              const src = {
                lDeg: new Float64Array(n),
                bDeg: new Float64Array(n),
                vKms: new Float64Array(n),
                radiusArcsec: new Float64Array(n),
                posErrArcsec: new Float64Array(n),
                lineWidthKms: new Float64Array(n),
              };
              for (let i = 0; i < n; i++) {
                const polar = random() < 0.2;
                src.lDeg[i] = polar ? random() * 360 : 359 + 2 * random();
                src.bDeg[i] = polar ? 89 + random() : 2 * random() - 1;
                src.vKms[i] = random() < 0.1 ? NaN : 20 * random() - 10;
                src.radiusArcsec[i] = 300 * random();
                src.posErrArcsec[i] = 30 * random();
                src.lineWidthKms[i] = 5 * random();
              }
              return src;
            };
            await agreesWithOracle(crowded(1200), crowded(1200), params);
          },
        ),
        { numRuns: 6 },
      );
    });

    it('reusing a prebuilt index of B gives the same links', async () => {
      await fc.assert(
        fc.asyncProperty(
          catalogPair(atSeam),
          paramsWith(fixedRadius(num(0, 720))),
          async ({ a, b }, params) => {
            const indexB = buildSkyIndex(b);
            expect(await matchCatalogs(a, b, params, { indexB })).toEqual(
              await matchCatalogs(a, b, params),
            );
          },
        ),
      );
    });
  },
);

describe('matchCatalogs on a worked example', () => {
  it('ties break by separation, then |Δv|, then index', async () => {
    // A0 at the seam; B0 and B1 at equal separation (mirror images across l = 0), B1 with smaller |Δv|;
    // B2 and B3 are duplicates of each other: same separation and |Δv|, so the lower index wins.
    const a = {
      lDeg: Float64Array.of(0, 10),
      bDeg: Float64Array.of(0, 0),
      vKms: Float64Array.of(0, 0),
    };
    const b = {
      lDeg: Float64Array.of(1 / 3600, -1 / 3600, 10, 10),
      bDeg: Float64Array.of(0, 0, 2 / 3600, 2 / 3600),
      vKms: Float64Array.of(3, -2, 1, -1),
    };
    const params: MatchParams = {
      radius: { mode: 'fixed', arcsec: 5 },
      velocity: { mode: 'fixed', kms: 5 },
      linkMode: 'nearest',
    };
    const links = await matchCatalogs(a, b, params);
    expect(Array.from(links.indexB)).toEqual([1, 2]); // smaller |Δv| (2 < 3); then lower index (2 < 3)
    expect(links.sepArcsec[0]).toBeCloseTo(1, 9); // 1″ offset along the equator, from the geometry
    expect(links.dvKms[0]).toBe(-2); // v_B − v_A
  });
});

describe('matchCatalogs input checks', () => {
  const params: MatchParams = {
    radius: { mode: 'fixed', arcsec: 60 },
    velocity: { mode: 'fixed', kms: 5 },
    linkMode: 'all',
  };
  const good = {
    lDeg: Float64Array.of(1, 2),
    bDeg: Float64Array.of(0, 0),
    vKms: Float64Array.of(0, 1),
  };

  it('refuses to guess what to do with missing velocities', async () => {
    const b = { ...good, vKms: Float64Array.of(0, NaN) };
    await expect(matchCatalogs(good, b, params)).rejects.toThrow(
      /catalog B has 1 source\(s\) without a velocity \(first at row 1\)/,
    );
  });

  it('names the row and value of a bad latitude', async () => {
    const b = { ...good, bDeg: Float64Array.of(0, 91) };
    await expect(matchCatalogs(good, b, params)).rejects.toThrow(MatchInputError);
    await expect(matchCatalogs(good, b, params)).rejects.toThrow(
      'catalog B: bDeg[1] = 91 is outside [-90, 90].',
    );
  });

  it('rejects a negative radius and mismatched columns', async () => {
    await expect(
      matchCatalogs(good, good, { ...params, radius: { mode: 'fixed', arcsec: -1 } }),
    ).rejects.toThrow('radius.arcsec must be a finite number ≥ 0, got -1.');
    const short = { ...good, vKms: Float64Array.of(0) };
    await expect(matchCatalogs(short, good, params)).rejects.toThrow(
      'catalog A: vKms has 1 rows but lDeg has 2.',
    );
  });

  it('needs line widths for the scaled velocity window', async () => {
    await expect(
      matchCatalogs(good, good, { ...params, velocity: { mode: 'scaled', factor: 1 } }),
    ).rejects.toThrow('catalog A: the scaled velocity window needs lineWidthKms.');
  });

  it('rejects an index built from another catalog', async () => {
    await expect(
      matchCatalogs(good, good, params, { indexB: buildSkyIndex({ ...good }) }),
    ).resolves.toBeDefined();
    const other = { lDeg: Float64Array.of(1, 2), bDeg: Float64Array.of(0, 0) };
    await expect(
      matchCatalogs(good, good, params, { indexB: buildSkyIndex(other) }),
    ).rejects.toThrow('the index given for catalog B was built from another catalog.');
  });
});

describe('matchCatalogs progress and cancellation', { timeout: 60_000 }, () => {
  const random = mulberry32(11);
  const a = randomPlaneCatalog(60_000, random);
  const b = randomPlaneCatalog(60_000, random);
  const params: MatchParams = {
    radius: { mode: 'fixed', arcsec: 60 },
    velocity: { mode: 'fixed', kms: 5 },
    linkMode: 'all',
  };

  it('reports non-decreasing progress that reaches 1', async () => {
    const seen: number[] = [];
    await matchCatalogs(a, b, params, { onProgress: (f) => seen.push(f) });
    expect(seen.length).toBeGreaterThan(2);
    expect(seen.at(-1)).toBe(1);
    for (let k = 1; k < seen.length; k++) expect(seen[k]).toBeGreaterThanOrEqual(seen[k - 1]);
    expect(seen.every((f) => f >= 0 && f <= 1)).toBe(true);
  });

  it('throws MatchCancelledError when aborted from the progress callback', async () => {
    const controller = new AbortController();
    const run = matchCatalogs(a, b, params, {
      signal: controller.signal,
      onProgress: (f) => {
        if (f > 0.3) controller.abort();
      },
    });
    await expect(run).rejects.toThrow(MatchCancelledError);
  });

  it('throws MatchCancelledError when aborted by a timer while running', async () => {
    // big enough to run well past the first two yields (~25 ms apart) on any machine
    const seeded = mulberry32(12);
    const bigA = randomPlaneCatalog(200_000, seeded);
    const bigB = randomPlaneCatalog(200_000, seeded);
    const controller = new AbortController();
    let last = 0;
    setTimeout(() => controller.abort(), 0);
    const run = matchCatalogs(bigA, bigB, params, {
      signal: controller.signal,
      onProgress: (f) => (last = f),
    });
    await expect(run).rejects.toThrow(MatchCancelledError);
    expect(last).toBeLessThan(1);
  });

  it('throws at once for an already aborted signal', async () => {
    await expect(matchCatalogs(a, b, params, { signal: AbortSignal.abort() })).rejects.toThrow(
      MatchCancelledError,
    );
  });
});
