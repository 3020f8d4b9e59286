import { describe, expect, it } from 'vitest';
import { bootstrapCi } from '@/lib/stats/bootstrap';
import { makeRng } from '@/lib/stats/rng';
import { mean, median, quantileSorted } from '@/lib/stats/summary';
import { bootstrapCenters, clusterBootstrap } from '@/lib/ordering/cluster-bootstrap';

function sample(n: number, seed: number): Float64Array {
  const rng = makeRng(seed);
  return Float64Array.from({ length: n }, () => rng.normal() + 0.3);
}

describe('cluster bootstrap', () => {
  it('with one value per cluster equals the plain percentile bootstrap of lib/stats', () => {
    for (const n of [1, 2, 7, 40, 101]) {
      const xs = sample(n, n);
      const ours = bootstrapCenters(xs, 2000, 9)!;
      const med = bootstrapCi(xs, 'median', { resamples: 2000, seed: 9 });
      const avg = bootstrapCi(xs, 'mean', { resamples: 2000, seed: 9 });
      // brute-force oracle: the same draws resampled value by value (lib/stats/bootstrap)
      expect(ours.median).toBeCloseTo(med.estimate, 12);
      expect(ours.medianCi[0]).toBeCloseTo(med.lo, 12);
      expect(ours.medianCi[1]).toBeCloseTo(med.hi, 12);
      expect(ours.mean).toBeCloseTo(avg.estimate, 12);
      expect(ours.meanCi[0]).toBeCloseTo(avg.lo, 12);
      expect(ours.meanCi[1]).toBeCloseTo(avg.hi, 12);
    }
  });

  it('resamples whole clusters: matches expanding each resampled cluster by brute force', () => {
    const values = sample(60, 3);
    const cluster = Int32Array.from(values, (_, i) => 100 + Math.floor(i / 4) * 3);
    const resamples = 2000;
    const ours = clusterBootstrap(values, cluster, resamples, 21)!;
    const ids = [...new Set(cluster)];
    const rng = makeRng(21);
    const medians = new Float64Array(resamples);
    const means = new Float64Array(resamples);
    for (let r = 0; r < resamples; r++) {
      const drawn: number[] = [];
      for (let k = 0; k < ids.length; k++) {
        const id = ids[Math.floor(rng.next() * ids.length)];
        values.forEach((v, i) => {
          if (cluster[i] === id) drawn.push(v);
        });
      }
      medians[r] = median(drawn);
      means[r] = mean(drawn);
    }
    medians.sort();
    means.sort();
    // brute-force oracle: resampled clusters expanded to their members, type-7 quantiles
    expect(ours.medianCi[0]).toBeCloseTo(quantileSorted(medians, 0.025), 12);
    expect(ours.medianCi[1]).toBeCloseTo(quantileSorted(medians, 0.975), 12);
    expect(ours.meanCi[0]).toBeCloseTo(quantileSorted(means, 0.025), 12);
    expect(ours.meanCi[1]).toBeCloseTo(quantileSorted(means, 0.975), 12);
    expect(ours.median).toBeCloseTo(median(values), 12); // lib/stats/summary median
  });

  it('is empty-safe and rejects bad input with the position', () => {
    expect(bootstrapCenters(new Float64Array(0), 2000, 1)).toBeNull();
    expect(() => bootstrapCenters(Float64Array.of(1, NaN), 2000, 1)).toThrow(/value 2 is NaN/);
    expect(() => clusterBootstrap(Float64Array.of(1), new Int32Array(2), 2000, 1)).toThrow(
      /differ/,
    );
  });
});
