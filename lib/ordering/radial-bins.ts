/**
 * The gas→stars across-arm offset in rings of Galactocentric radius, NOT signed by the flow:
 * positive means the young stars lie ahead of the gas in the sense of rotation, so the reversal
 * expected at corotation (ahead inside, behind outside; Roberts 1969) shows directly. Bins are
 * 1 kpc wide on whole kiloparsecs, from the smallest to the largest R of the used complexes with
 * a gas→stars vector; a bin is inside corotation when Ω > Ω_p at its middle.
 */
import { angularSpeedKmsKpc } from '@/lib/astro/pattern-speed';
import type { RotationCurve } from '@/lib/astro/rotation-curves';
import { bootstrapCenters } from './cluster-bootstrap';
import type { OrderingResult } from './types';

/** Width (kpc) of the radial bins. */
export const RADIAL_BIN_KPC = 1;

/** Radial bins of the used complexes' across-arm offsets (kpc, positive ahead); bin b is seeded by seedOf(b). */
export function radialBins(
  acrossKpc: Float64Array,
  RKpc: Float64Array,
  used: Uint8Array,
  curve: RotationCurve,
  patternSpeedKmsKpc: number,
  resamples: number,
  seedOf: (bin: number) => number,
): OrderingResult['radialBins'] {
  const idx: number[] = [];
  for (let c = 0; c < acrossKpc.length; c++)
    if (used[c] && acrossKpc[c] === acrossKpc[c] && RKpc[c] === RKpc[c]) idx.push(c);
  if (idx.length === 0) return [];
  let lo = Infinity;
  let hi = -Infinity;
  for (const c of idx) {
    lo = Math.min(lo, RKpc[c]);
    hi = Math.max(hi, RKpc[c]);
  }
  const first = Math.floor(lo / RADIAL_BIN_KPC);
  const count = Math.floor(hi / RADIAL_BIN_KPC) - first + 1;
  const members: number[][] = Array.from({ length: count }, () => []);
  for (const c of idx) members[Math.floor(RKpc[c] / RADIAL_BIN_KPC) - first].push(acrossKpc[c]);
  return members.map((values, b) => {
    const RminKpc = (first + b) * RADIAL_BIN_KPC;
    const RmaxKpc = RminKpc + RADIAL_BIN_KPC;
    const s = bootstrapCenters(Float64Array.from(values), resamples, seedOf(b));
    return {
      RminKpc,
      RmaxKpc,
      n: values.length,
      medianAcrossKpc: s ? s.median : null,
      ci95: s ? s.medianCi : null,
      insideCorotation: angularSpeedKmsKpc(0.5 * (RminKpc + RmaxKpc), curve) > patternSpeedKmsKpc,
    };
  });
}
