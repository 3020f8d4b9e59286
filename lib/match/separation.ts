/**
 * Great-circle separation by the Vincenty form (Vincenty 1975, special case of the sphere):
 * atan2(√((cos b₂ sin Δl)² + (cos b₁ sin b₂ − sin b₁ cos b₂ cos Δl)²),
 *       sin b₁ sin b₂ + cos b₁ cos b₂ cos Δl),
 * which is accurate at all angles, unlike the law of cosines (small angles) or haversine (near 180°).
 */

export const DEG_TO_RAD = Math.PI / 180;
export const RAD_TO_ARCSEC = (180 / Math.PI) * 3600;

/**
 * Separation in arcsec from the precomputed sines and cosines of both positions
 * (`cl = cos l`, `sl = sin l`, `cb = cos b`, `sb = sin b`). Uses sin Δl and cos Δl from the angle
 * sum formulas so the hot path needs no trigonometry per pair.
 */
export function separationFromTrigArcsec(
  cl1: number,
  sl1: number,
  cb1: number,
  sb1: number,
  cl2: number,
  sl2: number,
  cb2: number,
  sb2: number,
): number {
  const sinDl = sl2 * cl1 - cl2 * sl1;
  const cosDl = cl1 * cl2 + sl1 * sl2;
  const x = cb2 * sinDl;
  const y = cb1 * sb2 - sb1 * cb2 * cosDl;
  const z = sb1 * sb2 + cb1 * cb2 * cosDl;
  return Math.atan2(Math.sqrt(x * x + y * y), z) * RAD_TO_ARCSEC;
}

/**
 * Great-circle separation in arcsec between (l₁, b₁) and (l₂, b₂), Galactic degrees (any
 * spherical frame works). Bit-for-bit the value the matcher computes for the same pair.
 */
export function separationArcsec(
  l1Deg: number,
  b1Deg: number,
  l2Deg: number,
  b2Deg: number,
): number {
  return separationFromTrigArcsec(
    Math.cos(l1Deg * DEG_TO_RAD),
    Math.sin(l1Deg * DEG_TO_RAD),
    Math.cos(b1Deg * DEG_TO_RAD),
    Math.sin(b1Deg * DEG_TO_RAD),
    Math.cos(l2Deg * DEG_TO_RAD),
    Math.sin(l2Deg * DEG_TO_RAD),
    Math.cos(b2Deg * DEG_TO_RAD),
    Math.sin(b2Deg * DEG_TO_RAD),
  );
}
