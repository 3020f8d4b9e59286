/**
 * Circular cross-correlation of two azimuthal profiles and the lag of its peak. Profiles are
 * counts in n equal azimuth bins; both are smoothed by a wrapped Gaussian of width σ, which in
 * Fourier space multiplies harmonic h by e^(−h²σ²/2) exactly, and
 *   C(L) = Σ_j g(j) · y(j + L)   (indices mod n)
 * is computed with one forward and one inverse FFT (the two real profiles packed as g + i·y).
 * C peaks at the lag L that carries the gas profile g onto the young profile y: y(φ) ≈ g(φ − L).
 * The search is limited to |L| ≤ maxLagRad (π/m for m arms: one arm period); the peak is
 * refined by the parabola through it and its two neighbours.
 */
import { makeFft } from './fft';

/** Lag of the correlation peak (rad; NaN when the profiles are empty) and whether it sits on the search limit. */
export type PeakLag = { lagRad: number; atLimit: boolean };

/** A reusable correlator for one bin count, kernel and lag limit (buffers allocated once). */
export type LagFinder = {
  bins: number;
  /** C(L) for L = 0 … n − 1 of two count profiles of length n. */
  correlation(gas: Float64Array, young: Float64Array): Float64Array;
  /** The peak lag of C within ±maxLagRad. */
  peakLag(gas: Float64Array, young: Float64Array): PeakLag;
};

/** A correlator for `bins` azimuth bins (power of two), kernel σ (rad, ≥ 0) and lag limit (rad). */
export function makeLagFinder(bins: number, kernelRad: number, maxLagRad: number): LagFinder {
  if (!(kernelRad >= 0)) throw new RangeError(`kernel width ${kernelRad} rad must be ≥ 0`);
  if (!(maxLagRad > 0 && maxLagRad <= Math.PI))
    throw new RangeError(`lag limit ${maxLagRad} rad must lie in (0, π]`);
  const fft = makeFft(bins);
  const binRad = (2 * Math.PI) / bins;
  const maxLagBins = Math.min(Math.floor(maxLagRad / binRad + 1e-9), bins / 2);
  const kernel2 = new Float64Array(bins);
  for (let k = 0; k < bins; k++) {
    const h = k <= bins / 2 ? k : k - bins;
    kernel2[k] = Math.exp(-h * h * kernelRad * kernelRad);
  }
  const re = new Float64Array(bins);
  const im = new Float64Array(bins);
  const pr = new Float64Array(bins);
  const pi = new Float64Array(bins);

  const correlate = (gas: Float64Array, young: Float64Array): Float64Array => {
    if (gas.length !== bins || young.length !== bins)
      throw new RangeError(
        `profiles of length ${gas.length}, ${young.length} must have ${bins} bins`,
      );
    re.set(gas);
    im.set(young);
    fft.forward(re, im);
    for (let k = 0; k < bins; k++) {
      const c = (bins - k) % bins;
      const a = re[k];
      const b = im[k];
      const cr = re[c];
      const ci = im[c];
      const gr = (a + cr) / 2;
      const gi = (b - ci) / 2;
      const yr = (b + ci) / 2;
      const yi = (cr - a) / 2;
      pr[k] = (gr * yr + gi * yi) * kernel2[k];
      pi[k] = (gr * yi - gi * yr) * kernel2[k];
    }
    fft.inverse(pr, pi);
    return pr;
  };

  return {
    bins,
    correlation: (gas, young) => Float64Array.from(correlate(gas, young)),
    peakLag(gas, young) {
      const c = correlate(gas, young);
      let best = 0;
      let bestValue = -Infinity;
      let lowest = Infinity;
      for (let L = -maxLagBins; L <= maxLagBins; L++) {
        const v = c[(L + bins) % bins];
        if (v > bestValue) {
          bestValue = v;
          best = L;
        }
        if (v < lowest) lowest = v;
      }
      // A flat correlation (an empty or uniform profile) has no peak; its level is Σg·Σy/n.
      let sumGas = 0;
      let sumYoung = 0;
      for (let j = 0; j < bins; j++) {
        sumGas += gas[j];
        sumYoung += young[j];
      }
      const flat = !(bestValue - lowest > 1e-12 * sumGas * sumYoung);
      if (sumGas === 0 || sumYoung === 0 || flat) return { lagRad: NaN, atLimit: false };
      const before = c[(best - 1 + bins) % bins];
      const after = c[(best + 1 + bins) % bins];
      const curvature = before - 2 * bestValue + after;
      const shift = curvature < 0 ? (0.5 * (before - after)) / curvature : 0;
      const lag = Math.max(-maxLagBins, Math.min(maxLagBins, best + shift));
      return { lagRad: lag * binRad, atLimit: Math.abs(best) === maxLagBins };
    },
  };
}

/** Bin index (0 … bins − 1) of an azimuth in rad (any value; taken mod 2π). */
export function azimuthBin(phiRad: number, bins: number): number {
  const turns = phiRad / (2 * Math.PI);
  const j = Math.floor((turns - Math.floor(turns)) * bins);
  return j >= bins ? 0 : j;
}
