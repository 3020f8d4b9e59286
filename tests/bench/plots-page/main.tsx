/**
 * The catalog page's two canvas plots with N generated points (`?points=N`), for
 * tests/bench/plots.ts. Points are interleaved (l, b, v) Float32 triples, as the `/points`
 * endpoint sends them: a thin Galactic disc with a rough l–v pattern (invented, deterministic).
 */
import { createRoot } from 'react-dom/client';
import { CatalogPlots } from '@/components/plots/catalog-plots';

const n = Number(new URLSearchParams(location.search).get('points') ?? 1_000_000);
let seed = 7;
const rnd = () => (seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0) / 2 ** 32;
const points = new Float32Array(3 * n);
for (let i = 0; i < n; i++) {
  const l = rnd() * 360;
  points[3 * i] = l;
  points[3 * i + 1] = (rnd() + rnd() + rnd() - 1.5) * 2;
  points[3 * i + 2] = 120 * Math.sin((l * Math.PI) / 180) * rnd() + (rnd() - 0.5) * 20;
}

// Input times, so the benchmark can tell how long after a release the zoomed plot was drawn.
const w = window as unknown as { pointerUps: number[] };
w.pointerUps = [];
document.addEventListener('pointerup', (e) => w.pointerUps.push(e.timeStamp), true);

createRoot(document.getElementById('root')!).render(
  <main>
    <CatalogPlots points={points} kind="co" name="bench" />
  </main>,
);
