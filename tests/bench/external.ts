/**
 * Benchmark of the external-galaxy ordering analysis: 100 000 sources of a synthetic spiral in
 * 10 rings with 2 000 bootstrap resamples (and 2 000 resamples of the arms fit, and the null
 * test's default 999 label permutations). Prints one JSON line with the sizes and the wall-clock
 * seconds of runExternalAnalysis (galaxy generation not included). Target on a 2-core machine:
 * ≤ 10 s. Run with `npm run bench:external` (tsx tests/bench/external.ts).
 */
import { performance } from 'node:perf_hooks';
import { runExternalAnalysis } from '@/lib/external/analysis';
import { generateExternalGalaxy } from '@/seed/external-generator';

const SOURCES = 100_000;
const RESAMPLES = 2000;

const g = generateExternalGalaxy({ seed: 2024, gasCount: SOURCES / 2, youngCount: SOURCES / 2 });
const t0 = performance.now();
const result = runExternalAnalysis({ raDeg: g.raDeg, decDeg: g.decDeg, kind: g.kind }, g.galaxy, {
  arms: 2,
  rings: { minKpc: 2, maxKpc: 12, widthKpc: 1 },
  resamples: RESAMPLES,
  seed: 1,
});
const seconds = (performance.now() - t0) / 1000;

console.log(
  JSON.stringify({
    sources: g.kind.length,
    rings: result.rings.length,
    resamples: RESAMPLES,
    permutations: result.nullTest?.permutations ?? 0,
    timescaleMyr: result.fit?.timescaleMyr ?? null,
    patternSpeedKmsKpc: result.fit?.patternSpeedKmsKpc ?? null,
    seconds: Number(seconds.toFixed(3)),
    targetSeconds: 10,
  }),
);
