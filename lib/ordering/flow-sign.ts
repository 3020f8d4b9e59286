/**
 * The sense of the flow through the arms at each complex. Material overtakes a pattern of speed
 * Ω_p where Ω(R) = Θ(R)/R > Ω_p (inside corotation) and falls behind it outside, so "downstream"
 * is ahead in rotation inside corotation and behind outside (Roberts 1969; the density-wave
 * picture of Lin & Shu 1964). Ordering statistics are therefore signed by s = sign(Ω(R) − Ω_p).
 */
import { toGalactocentric } from '@/lib/astro/galactocentric';
import { angularSpeedKmsKpc } from '@/lib/astro/pattern-speed';
import type { RotationCurve } from '@/lib/astro/rotation-curves';

const DEG = Math.PI / 180;

function sideAt(RKpc: number, curve: RotationCurve, patternSpeedKmsKpc: number): number {
  return angularSpeedKmsKpc(RKpc, curve) > patternSpeedKmsKpc ? 1 : -1;
}

/**
 * Flow sign of each complex: +1 inside corotation, −1 outside, 0 when its distance interval
 * [loKpc, hiKpc] (line of sight, kpc; NaN = no interval) reaches across corotation, so that the
 * side is not known. The test evaluates R at the distance, at both interval ends and at the
 * tangent point when it lies inside the interval (R is smallest there). NaN distance → 0.
 */
export function flowSigns(
  lDeg: Float64Array,
  bDeg: Float64Array,
  distKpc: Float64Array,
  loKpc: Float64Array,
  hiKpc: Float64Array,
  curve: RotationCurve,
  patternSpeedKmsKpc: number,
): Int8Array {
  const n = lDeg.length;
  const out = new Int8Array(n);
  const R0 = curve.R0Kpc;
  for (let i = 0; i < n; i++) {
    const d = distKpc[i];
    if (!(d === d)) continue;
    const Rat = (dist: number) => toGalactocentric(lDeg[i], bDeg[i], dist, R0).RKpc;
    const s = sideAt(Rat(d), curve, patternSpeedKmsKpc);
    let known = true;
    const lo = loKpc[i];
    const hi = hiKpc[i];
    if (lo === lo && hi === hi) {
      const cosL = Math.cos(lDeg[i] * DEG);
      const tangent = cosL > 0 ? (R0 * cosL) / Math.cos(bDeg[i] * DEG) : NaN;
      const probes = [lo, hi];
      if (tangent > lo && tangent < hi) probes.push(tangent);
      for (const p of probes) if (sideAt(Rat(p), curve, patternSpeedKmsKpc) !== s) known = false;
    }
    out[i] = known ? s : 0;
  }
  return out;
}
