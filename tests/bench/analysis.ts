/**
 * Benchmark of the ordering analysis: 10 000 complexes of the synthetic demo galaxy with 2 000
 * bootstrap resamples / sign-flip permutations and 200 Monte Carlo distance draws per complex.
 * Prints one JSON line with the sizes and wall-clock seconds of runOrderingAnalysis (galaxy
 * generation not included). Target on a 2-core machine: ≤ 10 s. Run with
 * `npm run bench:analysis` (tsx tests/bench/analysis.ts).
 */
import { performance } from 'node:perf_hooks';
import { runOrderingAnalysis } from '@/lib/ordering';
import { generateGalaxy } from '@/seed/generator';
import { complexesFromGalaxy, settingsFromGalaxy } from '../unit/ordering/from-generator';

const COMPLEXES = 10_000;
const RESAMPLES = 2000;
const MC_DRAWS = 200;

const galaxy = generateGalaxy({ seed: 2024, complexes: COMPLEXES, interlopers: 0 });
const { complexes } = complexesFromGalaxy(galaxy);
const settings = settingsFromGalaxy(galaxy, { resamples: RESAMPLES, mcDraws: MC_DRAWS });
const members = complexes.reduce((s, c) => s + c.members.length, 0);

const t0 = performance.now();
const result = runOrderingAnalysis(complexes, settings);
const seconds = (performance.now() - t0) / 1000;

console.log(
  JSON.stringify({
    complexes: COMPLEXES,
    members,
    resamples: RESAMPLES,
    mcDraws: MC_DRAWS,
    used: result.exclusions.used,
    gasToStarsN: result.gasToStars.n,
    seconds: Number(seconds.toFixed(3)),
    targetSeconds: 10,
  }),
);
