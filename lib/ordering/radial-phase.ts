/**
 * The azimuthal offset Δφ between young stars and gas in rings of Galactocentric radius, the
 * input of the pattern-speed fit (docs/methods.md, "Pattern speed and timescale"). A complex
 * belongs to the ring of the median R of its draws on its arm; Δφ is the difference of the
 * young and gas median azimuthal offsets from the ridge at the same R (positive ahead), with
 * replicates from the same nested resamples as every other statistic, so the fit's intervals
 * are joint across rings.
 */
import { angularSpeedKmsKpc, type RotationCurve } from '@/lib/astro/rotation-curves';
import { median } from '@/lib/stats/summary';
import { groupOf, MATRIX, type MemberCounts } from './class-offsets';
import { percentileCi, pooledMedian, type DrawMatrices, type Group } from './nested-bootstrap';
import type { PhaseOffsetBin } from './pattern-fit';
import type { RadialBin } from './types';

const DEG = Math.PI / 180;
/** Fewest complexes with gas and with young stars for a ring's Δφ. */
export const MIN_RING_COMPLEXES = 5;

/** Rings of width binKpc on whole multiples, over the used complexes' radii. */
export type RadialPlan = {
  rings: { RminKpc: number; RmaxKpc: number; keep: Int32Array }[];
  gas: Group[];
  young: Group[];
};

/** Plans the rings of the `used` complexes by their median radius `RKpc`. */
export function radialPlan(
  RKpc: Float64Array,
  used: Int32Array,
  counts: MemberCounts,
  binKpc: number,
): RadialPlan {
  const radii = Array.from(used, (c) => RKpc[c]).filter((R) => R === R);
  if (radii.length === 0) return { rings: [], gas: [], young: [] };
  const first = Math.floor(Math.min(...radii) / binKpc);
  const last = Math.floor(Math.max(...radii) / binKpc);
  const rings: RadialPlan['rings'] = [];
  for (let b = first; b <= last; b++) {
    const lo = b * binKpc;
    const hi = lo + binKpc;
    const keep = used.filter((c) => RKpc[c] >= lo && RKpc[c] < hi);
    rings.push({ RminKpc: lo, RmaxKpc: hi, keep });
  }
  return {
    rings,
    gas: rings.map((r) => groupOf(counts.gas, r.keep, MATRIX.azimuth)),
    young: rings.map((r) => groupOf(counts.young, r.keep, MATRIX.azimuth)),
  };
}

/** Rings as reported, and the fit's input bins (only rings whose every replicate has a Δφ). */
export function radialSummaries(
  m: DrawMatrices,
  plan: RadialPlan,
  gasReps: Float64Array[],
  youngReps: Float64Array[],
  RKpc: Float64Array,
  curve: RotationCurve,
): { bins: RadialBin[]; fitBins: PhaseOffsetBin[]; fitIndex: number[] } {
  const bins: RadialBin[] = [];
  const fitBins: PhaseOffsetBin[] = [];
  const fitIndex: number[] = [];
  plan.rings.forEach((ring, b) => {
    const gas = plan.gas[b];
    const young = plan.young[b];
    const Rmid = ring.keep.length > 0 ? median(Array.from(ring.keep, (c) => RKpc[c])) : NaN;
    const omega = Rmid > 0 ? angularSpeedKmsKpc(Rmid, curve) : NaN;
    const enough =
      gas.complexes.length >= MIN_RING_COMPLEXES && young.complexes.length >= MIN_RING_COMPLEXES;
    const dphiDeg = enough ? pooledMedian(m, young) - pooledMedian(m, gas) : NaN;
    const repsRad = Float64Array.from(youngReps[b], (y, r) => (y - gasReps[b][r]) * DEG);
    const complete = enough && repsRad.every((x) => Number.isFinite(x));
    bins.push({
      RminKpc: ring.RminKpc,
      RmaxKpc: ring.RmaxKpc,
      RKpc: Rmid,
      omegaKmsKpc: omega,
      nGas: gas.weights.reduce((s, w) => s + w, 0),
      nYoung: young.weights.reduce((s, w) => s + w, 0),
      dphiDeg: Number.isFinite(dphiDeg) ? dphiDeg : null,
      ci95: enough ? percentileCi(Float64Array.from(repsRad, (x) => x / DEG)) : null,
      fitted: false,
    });
    if (complete && Number.isFinite(dphiDeg)) {
      fitIndex.push(b);
      fitBins.push({
        RKpc: Rmid,
        omegaKmsKpc: omega,
        dphiRad: dphiDeg * DEG,
        n: gas.complexes.length + young.complexes.length,
        replicatesRad: repsRad,
      });
    }
  });
  return { bins, fitBins, fitIndex };
}
