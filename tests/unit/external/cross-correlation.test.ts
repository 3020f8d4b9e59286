import { describe, expect, it } from 'vitest';
import { makeLagFinder } from '@/lib/external/cross-correlation';
import { makeFft } from '@/lib/external/fft';
import { makeRng } from '@/lib/stats/rng';

/** Smoothing by direct circular convolution with a wrapped Gaussian sampled at bin offsets. */
function smoothDirect(counts: Float64Array, sigmaRad: number): Float64Array {
  const n = counts.length;
  const bin = (2 * Math.PI) / n;
  if (sigmaRad === 0) return Float64Array.from(counts);
  const w = new Float64Array(n);
  for (let d = 0; d < n; d++)
    for (let wrap = -5; wrap <= 5; wrap++) {
      const x = d * bin + 2 * Math.PI * wrap;
      w[d] +=
        (Math.exp(-(x * x) / (2 * sigmaRad * sigmaRad)) * bin) /
        (sigmaRad * Math.sqrt(2 * Math.PI));
    }
  const out = new Float64Array(n);
  for (let j = 0; j < n; j++) for (let k = 0; k < n; k++) out[j] += counts[k] * w[(j - k + n) % n];
  return out;
}

/** C(L) = Σ_j g(j) y(j + L) by the direct double sum. */
function correlateDirect(g: Float64Array, y: Float64Array): Float64Array {
  const n = g.length;
  const c = new Float64Array(n);
  for (let L = 0; L < n; L++) for (let j = 0; j < n; j++) c[L] += g[j] * y[(j + L) % n];
  return c;
}

/** Peak within ±maxBins of a correlation, refined by the parabola through its neighbours. */
function peakDirect(c: Float64Array, maxBins: number): number {
  const n = c.length;
  let best = 0;
  for (let L = -maxBins; L <= maxBins; L++) if (c[(L + n) % n] > c[(best + n) % n]) best = L;
  const [a, b, d] = [c[(best - 1 + n) % n], c[(best + n) % n], c[(best + 1 + n) % n]];
  return best + (0.5 * (a - d)) / (a - 2 * b + d);
}

function randomProfile(n: number, seed: number, shiftBins = 0): [Float64Array, Float64Array] {
  const rng = makeRng(seed);
  const g = new Float64Array(n);
  const y = new Float64Array(n);
  for (let k = 0; k < 400; k++) {
    // two bumps per turn (m = 2), plus a flat background
    const at = (Math.floor(rng.next() * 2) * n) / 2 + Math.round(rng.normal() * 4) + n / 4;
    g[((at % n) + n) % n]++;
    y[(((at + shiftBins + Math.round(rng.normal() * 3)) % n) + n) % n]++;
  }
  for (let j = 0; j < n; j++) {
    g[j] += rng.int(3);
    y[j] += rng.int(3);
  }
  return [g, y];
}

describe('circular cross-correlation of azimuthal profiles', () => {
  it('the FFT equals the direct discrete Fourier sum', () => {
    const n = 64;
    const rng = makeRng(5);
    const re = Float64Array.from({ length: n }, () => rng.normal());
    const im = Float64Array.from({ length: n }, () => rng.normal());
    const [r0, i0] = [Float64Array.from(re), Float64Array.from(im)];
    makeFft(n).forward(re, im);
    for (let k = 0; k < n; k++) {
      let sr = 0;
      let si = 0;
      for (let j = 0; j < n; j++) {
        const a = (-2 * Math.PI * j * k) / n;
        sr += r0[j] * Math.cos(a) - i0[j] * Math.sin(a);
        si += r0[j] * Math.sin(a) + i0[j] * Math.cos(a);
      }
      expect(re[k]).toBeCloseTo(sr, 10); // direct sum
      expect(im[k]).toBeCloseTo(si, 10); // direct sum
    }
  });

  it('without smoothing equals the direct double sum to 1e-9', () => {
    for (const n of [16, 64, 256]) {
      const [g, y] = randomProfile(n, n, 7);
      const fft = makeLagFinder(n, 0, Math.PI / 2).correlation(g, y);
      const direct = correlateDirect(g, y);
      const scale = Math.max(...direct);
      for (let L = 0; L < n; L++) expect(Math.abs(fft[L] - direct[L]) / scale).toBeLessThan(1e-9);
    }
  });

  it('with a wrapped-Gaussian kernel equals the direct sum of directly smoothed profiles', () => {
    const n = 256;
    const sigma = (5 * Math.PI) / 180;
    const [g, y] = randomProfile(n, 11, -9);
    const fft = makeLagFinder(n, sigma, Math.PI / 2).correlation(g, y);
    const direct = correlateDirect(smoothDirect(g, sigma), smoothDirect(y, sigma));
    const scale = Math.max(...direct);
    // aliasing of harmonics beyond n/2 is e^(−(n/2)²σ²/2) ≈ 1e-13 here
    for (let L = 0; L < n; L++) expect(Math.abs(fft[L] - direct[L]) / scale).toBeLessThan(1e-9);
  });

  it('finds the same refined peak lag as the direct sum, within ±180°/m', () => {
    const n = 256;
    const binRad = (2 * Math.PI) / n;
    for (let seed = 1; seed <= 20; seed++) {
      const shift = (seed % 13) - 6;
      const sigma = ((2 + (seed % 5)) * Math.PI) / 180;
      const [g, y] = randomProfile(n, seed, shift);
      const finder = makeLagFinder(n, sigma, Math.PI / 2);
      const direct = peakDirect(
        correlateDirect(smoothDirect(g, sigma), smoothDirect(y, sigma)),
        n / 4,
      );
      const lag = finder.peakLag(g, y);
      expect(Math.abs(lag.lagRad / binRad - direct)).toBeLessThan(1e-6); // direct sum
      expect(Math.abs(lag.lagRad / binRad - shift)).toBeLessThan(1.5); // the injected shift
    }
  });

  it('an exactly shifted profile gives the shift exactly (young = gas turned by +s bins)', () => {
    const n = 128;
    const [g] = randomProfile(n, 3);
    for (const s of [-20, -3, 0, 5, 31]) {
      const y = Float64Array.from({ length: n }, (_, j) => g[(j - s + n) % n]);
      const lag = makeLagFinder(n, 0.05, Math.PI / 2).peakLag(g, y);
      expect(lag.lagRad).toBeCloseTo((s * 2 * Math.PI) / n, 12); // exact: autocorrelation is symmetric
      expect(lag.atLimit).toBe(false);
    }
  });

  it('flags a peak pinned at the lag limit and returns NaN for empty profiles', () => {
    const n = 64;
    const g = new Float64Array(n);
    const y = new Float64Array(n);
    g[0] = 1;
    y[20] = 1;
    const lag = makeLagFinder(n, 0.2, Math.PI / 4).peakLag(g, y);
    expect(lag.atLimit).toBe(true);
    expect(lag.lagRad).toBeCloseTo(Math.PI / 4, 12); // the limit: 8 bins of 2π/64
    expect(makeLagFinder(n, 0.02, Math.PI / 4).peakLag(new Float64Array(n), y).lagRad).toBeNaN();
  });
});
