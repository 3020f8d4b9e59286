/**
 * Offsets of each tracer class from the arm ridges (SCIENCE.md §6): for the members of the
 * complexes that are used, their perpendicular offsets from the ridge of their complex's arm,
 * signed downstream — multiplied by the complex's flow sign s = sign(Ω(R) − Ω_p), so positive
 * means ahead inside corotation and behind outside it. Complexes whose side of corotation is not
 * known (s = 0) are left out. Median and mean with cluster-bootstrap 95 % intervals (complexes
 * resampled), and the median azimuthal offset signed the same way.
 */
import { median } from '@/lib/stats/summary';
import { clusterBootstrap } from './cluster-bootstrap';
import { TRACER_KINDS } from './members';
import type { ClassSummary } from './types';

/** Member and complex columns the class summaries read. */
export type ClassInputs = {
  memberComplex: Int32Array;
  memberKind: Uint8Array;
  memberPerpKpc: Float64Array;
  memberAzimuthDeg: Float64Array;
  /** Per complex: 1 if used by the statistics, and its flow sign (+1, −1, 0). */
  used: Uint8Array;
  flowSign: Int8Array;
};

/**
 * Summaries of the classes listed in `kinds` (indices into TRACER_KINDS) over the used members
 * whose complex passes `keep` (e.g. one arm). Seeds derive from `seedOf(kind)`.
 */
export function classSummaries(
  input: ClassInputs,
  kinds: number[],
  resamples: number,
  seedOf: (kind: number) => number,
  keep: (complex: number) => boolean = () => true,
): ClassSummary[] {
  const n = input.memberComplex.length;
  return kinds.map((k) => {
    const perp: number[] = [];
    const az: number[] = [];
    const clusters: number[] = [];
    for (let i = 0; i < n; i++) {
      const c = input.memberComplex[i];
      const s = input.flowSign[c];
      if (input.memberKind[i] !== k || !input.used[c] || s === 0 || !keep(c)) continue;
      perp.push(s * input.memberPerpKpc[i]);
      az.push(s * input.memberAzimuthDeg[i]);
      clusters.push(c);
    }
    const b = clusterBootstrap(
      Float64Array.from(perp),
      Int32Array.from(clusters),
      resamples,
      seedOf(k),
    );
    return {
      kind: TRACER_KINDS[k],
      n: perp.length,
      medianOffsetKpc: b ? b.median : null,
      ci95: b ? b.medianCi : null,
      meanOffsetKpc: b ? b.mean : null,
      meanCi95: b ? b.meanCi : null,
      medianAzimuthOffsetDeg: az.length > 0 ? median(az) : null,
    };
  });
}
