/** Seeded random catalogs for the matcher tests (Mulberry32 generator). */
import type { SourceArrays } from '@/lib/match';

export function mulberry32(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** n sources uniform in l ∈ [0, 360), b ∈ [−bMax, bMax], v ∈ [vMin, vMax] km/s. */
export function randomPlaneCatalog(
  n: number,
  random: () => number,
  { bMaxDeg = 5, vMinKms = -100, vMaxKms = 150 } = {},
): SourceArrays {
  const lDeg = new Float64Array(n);
  const bDeg = new Float64Array(n);
  const vKms = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    lDeg[i] = random() * 360;
    bDeg[i] = (random() * 2 - 1) * bMaxDeg;
    vKms[i] = vMinKms + random() * (vMaxKms - vMinKms);
  }
  return { lDeg, bDeg, vKms };
}
