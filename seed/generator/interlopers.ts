/**
 * Interlopers: sources in no complex, spread over an exponential disc regardless of the arms,
 * each class in its own layer thickness. They give the cross-match its chance alignments and the
 * ordering analysis its background.
 */
import { fromGalactocentric, polarToXy } from '@/lib/astro/galactocentric';
import type { GalaxyModel } from './model';
import { sigmaFromHwhm, TRACERS, type Tracer } from './params';
import { uniform, type Rng } from './random';

/**
 * Splits `total` interlopers among the classes by their shares (largest-remainder rounding, so
 * the counts sum to total exactly).
 */
export function splitInterlopers(model: GalaxyModel, total: number): Record<Tracer, number> {
  const raw = TRACERS.map((t) => model.params.tracers[t].interloperShare * total);
  const counts = raw.map(Math.floor);
  let left = total - counts.reduce((a, b) => a + b, 0);
  const byRemainder = TRACERS.map((_, k) => k).sort(
    (a, b) => raw[b] - counts[b] - (raw[a] - counts[a]) || a - b,
  );
  for (let k = 0; left > 0; k = (k + 1) % byRemainder.length, left--) counts[byRemainder[k]]++;
  return Object.fromEntries(TRACERS.map((t, k) => [t, counts[k]])) as Record<Tracer, number>;
}

/**
 * Position (kpc) of one interloper of class `tracer`: radius from a surface density
 * ∝ exp(−R/h) between the configured radii (rejection sampling of R e^(−R/h)), uniform azimuth,
 * Gaussian height with the class's half-thickness; redrawn when closer to the Sun than minDistKpc.
 */
export function drawInterloperPosition(
  model: GalaxyModel,
  rng: Rng,
  tracer: Tracer,
): { xKpc: number; yKpc: number; zKpc: number } {
  const p = model.params;
  const h = p.interloperScaleLengthKpc;
  const lo = p.interloperMinRKpc;
  const hi = p.interloperMaxRKpc;
  const density = (R: number) => R * Math.exp(-R / h);
  const peak = density(Math.min(Math.max(h, lo), hi));
  const zSigmaKpc = sigmaFromHwhm(p.tracers[tracer].interloperHwhmPc) / 1000;
  for (;;) {
    const RKpc = uniform(rng, lo, hi);
    if (rng.next() * peak > density(RKpc)) continue;
    const { xKpc, yKpc } = polarToXy(RKpc, uniform(rng, -180, 180));
    const zKpc = zSigmaKpc * rng.normal();
    if (fromGalactocentric(xKpc, yKpc, zKpc, model.R0Kpc).distKpc < p.minDistKpc) continue;
    return { xKpc, yKpc, zKpc };
  }
}
