/** fast-check generators of small catalogs and match parameters for the oracle tests. */
import fc from 'fast-check';
import type { MatchParams, SourceArrays } from '@/lib/match';

type Row = { l: number; b: number; v: number; r: number; e: number; s: number };

const num = (min: number, max: number) => fc.double({ min, max, noNaN: true });

/** Positions anywhere on the sky. */
export const anywhere = fc.tuple(num(0, 360), num(-90, 90));
/** Positions piled at the l = 0°/360° seam (including l = 360 and slightly negative l). */
export const atSeam = fc.tuple(
  fc.oneof(num(359.9, 360), num(0, 0.1), num(-0.1, 0), fc.constantFrom(0, 360, 359.99999999, 1e-9)),
  num(-0.2, 0.2),
);
/** A crowded high-latitude patch, where 1/cos b widens the longitude span of a cap a lot. */
export const highLatitude = fc.tuple(num(10, 40), fc.oneof(num(70, 89.9), num(-89.9, -70)));
/** Positions within 0.1° of either Galactic pole, at any longitude. */
export const nearPoles = fc.tuple(num(-720, 720), fc.oneof(num(89.9, 90), num(-90, -89.9)));

function rowArb(
  position: fc.Arbitrary<[number, number]>,
  missingVelocityRate: number,
): fc.Arbitrary<Row> {
  const velocity =
    missingVelocityRate > 0
      ? fc.oneof(
          { weight: Math.round(100 * (1 - missingVelocityRate)), arbitrary: num(-20, 20) },
          { weight: Math.round(100 * missingVelocityRate), arbitrary: fc.constant(NaN) },
        )
      : num(-20, 20);
  return fc
    .record({
      pos: position,
      v: velocity,
      r: num(0, 600),
      e: num(0, 60),
      s: num(0, 10),
    })
    .map(({ pos, v, r, e, s }) => ({ l: pos[0], b: pos[1], v, r, e, s }));
}

function toArrays(rows: Row[]): SourceArrays {
  return {
    lDeg: Float64Array.from(rows, (x) => x.l),
    bDeg: Float64Array.from(rows, (x) => x.b),
    vKms: Float64Array.from(rows, (x) => x.v),
    radiusArcsec: Float64Array.from(rows, (x) => x.r),
    posErrArcsec: Float64Array.from(rows, (x) => x.e),
    lineWidthKms: Float64Array.from(rows, (x) => x.s),
  };
}

/**
 * Two catalogs of up to `maxRows` rows each from `position` (lengths spread over the whole range, so
 * the k-d tree has several levels), with exact duplicates: some rows of A are copied into B and
 * some rows are repeated within A.
 */
export function catalogPair(
  position: fc.Arbitrary<[number, number]>,
  { maxRows = 80, missingVelocityRate = 0 } = {},
): fc.Arbitrary<{ a: SourceArrays; b: SourceArrays }> {
  const row = rowArb(position, missingVelocityRate);
  return fc
    .record({
      rowsA: fc.array(row, { maxLength: maxRows, size: 'max' }),
      rowsB: fc.array(row, { maxLength: maxRows, size: 'max' }),
      copyToB: fc.array(fc.nat(), { maxLength: 8 }),
      repeatInA: fc.array(fc.nat(), { maxLength: 4 }),
    })
    .map(({ rowsA, rowsB, copyToB, repeatInA }) => {
      const a = [...rowsA];
      const b = [...rowsB];
      if (rowsA.length > 0) {
        for (const k of copyToB) b.push(rowsA[k % rowsA.length]);
        for (const k of repeatInA) a.push(rowsA[k % rowsA.length]);
      }
      return { a: toArrays(a), b: toArrays(b) };
    });
}

export const fixedRadius = (arcsec: fc.Arbitrary<number>) =>
  arcsec.map((x) => ({ mode: 'fixed' as const, arcsec: x }));
export const scaledRadius = fc
  .record({ factor: num(0, 3), minArcsec: num(0, 600) })
  .map((x) => ({ mode: 'scaled' as const, ...x }));

export const anyVelocity: fc.Arbitrary<MatchParams['velocity']> = fc.oneof(
  num(0, 20).map((kms) => ({ mode: 'fixed' as const, kms })),
  num(0, 3).map((factor) => ({ mode: 'scaled' as const, factor })),
  fc.constant({ mode: 'ignore' as const }),
);

export const missingPolicy = fc.constantFrom('exclude' as const, 'position-only' as const);

/** Match parameters with the given radius rule and link mode, any velocity rule and policy. */
export function paramsWith(
  radius: fc.Arbitrary<MatchParams['radius']>,
  linkMode: MatchParams['linkMode'] = 'all',
): fc.Arbitrary<MatchParams> {
  return fc.record({
    radius,
    velocity: anyVelocity,
    linkMode: fc.constant(linkMode),
    missingVelocity: missingPolicy,
  });
}
