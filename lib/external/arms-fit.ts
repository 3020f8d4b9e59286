/**
 * Log-spiral arms in the disc of a galaxy seen from outside, and their fit to a class's positions
 * by the two-dimensional Fourier method (Kalnajs 1975; Puerari & Dottori 1992, A&AS 93, 469).
 *
 * Convention: φ grows in the sense of rotation, and arm k of m follows
 *   ln(R/R_ref) = −(φ − φ_ref − 2πk/m) tan ψ,
 * so a trailing arm (radius falling along the rotation) has ψ > 0. On such an arm mφ + p ln R
 * is constant with p = m / tan ψ, and the fit maximises the amplitude
 *   |A(p)| = |Σ_j exp(i(m φ_j + p ln R_j))| / N
 * over p; the phase of A at the peak gives φ_ref. Sums run over bins of ln R (exact in φ), so a
 * bootstrap resample costs one pass over its sources plus a fixed grid; intervals are percentile
 * bootstrap intervals over the sources (Efron & Tibshirani 1993, ch. 13).
 */
import { makeRng } from '@/lib/stats/rng';
import { quantileSorted } from '@/lib/stats/summary';
import type { Ci95, LogSpiralArms } from './types';

const DEG = Math.PI / 180;
const TWO_PI = 2 * Math.PI;

/** Azimuth (rad, unwrapped) of the ridge of arm 0 at radius RKpc; the others follow every 2π/m. */
export function ridgeAzimuthRad(arms: LogSpiralArms, RKpc: number): number {
  return arms.phaseDeg * DEG - Math.log(RKpc / arms.RRefKpc) / Math.tan(arms.pitchDeg * DEG);
}

/** Azimuthal offset (rad, in [−π/m, π/m)) of a point from the nearest ridge at the same radius, positive ahead in rotation. */
export function ridgeOffsetRad(arms: LogSpiralArms, RKpc: number, phiRad: number): number {
  return wrapHalfPeriod(phiRad - ridgeAzimuthRad(arms, RKpc), TWO_PI / arms.m);
}

function wrapHalfPeriod(angle: number, period: number): number {
  const t = angle / period + 0.5;
  return (t - Math.floor(t) - 0.5) * period;
}

/** Fitted arms with 95 % bootstrap intervals, the peak amplitude |A| / N and the sources used. */
export type ArmsFit = LogSpiralArms & {
  pitchCi95: Ci95;
  phaseCi95: Ci95;
  amplitude: number;
  n: number;
  resamples: number;
};

/** Options: pitch search |ψ| ≥ minPitchDeg (default 3), ln R bins (default 128), bootstrap resamples and seed. */
export type ArmsFitOptions = {
  resamples: number;
  seed: number;
  minPitchDeg?: number;
  radialBins?: number;
};

const P_STEP = 0.25;

/**
 * Fits m log-spiral arms to positions (R kpc > 0, φ rad in the sense of rotation). R_ref is the
 * geometric mean radius of the sources, where phase and pitch are least correlated. Returns null
 * for fewer than 3 sources.
 */
export function fitLogSpiralArms(
  RKpc: Float64Array,
  phiRad: Float64Array,
  m: number,
  options: ArmsFitOptions,
): ArmsFit | null {
  const n = RKpc.length;
  if (phiRad.length !== n)
    throw new RangeError(`RKpc (${n}) and phiRad (${phiRad.length}) differ in length`);
  if (!Number.isInteger(m) || m < 1)
    throw new RangeError(`arms m = ${m} must be a positive integer`);
  if (n < 3) return null;
  const minPitch = options.minPitchDeg ?? 3;
  const nb = options.radialBins ?? 128;
  let lo = Infinity;
  let hi = -Infinity;
  let meanLn = 0;
  const lnR = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    if (!(RKpc[i] > 0)) throw new RangeError(`arms fit: RKpc[${i}] = ${RKpc[i]} must be positive`);
    lnR[i] = Math.log(RKpc[i]);
    lo = Math.min(lo, lnR[i]);
    hi = Math.max(hi, lnR[i]);
    meanLn += lnR[i] / n;
  }
  const width = (hi - lo) / nb || 1;
  const bin = new Uint16Array(n);
  const cm = new Float64Array(n);
  const sm = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    bin[i] = Math.min(nb - 1, Math.floor((lnR[i] - lo) / width));
    cm[i] = Math.cos(m * phiRad[i]);
    sm[i] = Math.sin(m * phiRad[i]);
  }
  const pMax = m / Math.tan(minPitch * DEG);
  const np = 2 * Math.ceil(pMax / P_STEP) + 1;
  const p0 = -((np - 1) / 2) * P_STEP;
  // e^(i p ln R_b) on the grid, ln R_b at bin centres.
  const er = new Float64Array(np * nb);
  const ei = new Float64Array(np * nb);
  for (let k = 0; k < np; k++)
    for (let b = 0; b < nb; b++) {
      const a = (p0 + k * P_STEP) * (lo + (b + 0.5) * width);
      er[k * nb + b] = Math.cos(a);
      ei[k * nb + b] = Math.sin(a);
    }
  const sumC = new Float64Array(nb);
  const sumS = new Float64Array(nb);
  const amp2 = new Float64Array(np);

  const fitBins = (): { p: number; ar: number; ai: number } => {
    for (let k = 0; k < np; k++) {
      let ar = 0;
      let ai = 0;
      const o = k * nb;
      for (let b = 0; b < nb; b++) {
        ar += sumC[b] * er[o + b] - sumS[b] * ei[o + b];
        ai += sumC[b] * ei[o + b] + sumS[b] * er[o + b];
      }
      amp2[k] = ar * ar + ai * ai;
    }
    let best = 0;
    for (let k = 1; k < np; k++) if (amp2[k] > amp2[best]) best = k;
    let shift = 0;
    if (best > 0 && best < np - 1) {
      const a = Math.sqrt(amp2[best - 1]);
      const b = Math.sqrt(amp2[best]);
      const c = Math.sqrt(amp2[best + 1]);
      const curvature = a - 2 * b + c;
      if (curvature < 0) shift = (0.5 * (a - c)) / curvature;
    }
    const p = p0 + (best + shift) * P_STEP;
    let ar = 0;
    let ai = 0;
    for (let b = 0; b < nb; b++) {
      const a = p * (lo + (b + 0.5) * width);
      ar += sumC[b] * Math.cos(a) - sumS[b] * Math.sin(a);
      ai += sumC[b] * Math.sin(a) + sumS[b] * Math.cos(a);
    }
    return { p, ar, ai };
  };
  const armsOf = (p: number, ar: number, ai: number): { pitchRad: number; phaseRad: number } => {
    const pitchRad = Math.atan2(m, p);
    const pitch = pitchRad > Math.PI / 2 ? pitchRad - Math.PI : pitchRad;
    const phase = (Math.atan2(ai, ar) - p * meanLn) / m;
    return { pitchRad: pitch, phaseRad: phase - (TWO_PI / m) * Math.floor(phase / (TWO_PI / m)) };
  };

  for (let i = 0; i < n; i++) {
    sumC[bin[i]] += cm[i];
    sumS[bin[i]] += sm[i];
  }
  const full = fitBins();
  const estimate = armsOf(full.p, full.ar, full.ai);
  const amplitude = Math.hypot(full.ar, full.ai) / n;

  const resamples = options.resamples;
  const pitches = new Float64Array(resamples);
  const phases = new Float64Array(resamples);
  const rng = makeRng(options.seed);
  for (let r = 0; r < resamples; r++) {
    sumC.fill(0);
    sumS.fill(0);
    for (let k = 0; k < n; k++) {
      const i = rng.int(n);
      sumC[bin[i]] += cm[i];
      sumS[bin[i]] += sm[i];
    }
    const f = fitBins();
    const a = armsOf(f.p, f.ar, f.ai);
    pitches[r] = a.pitchRad;
    phases[r] = estimate.phaseRad + wrapHalfPeriod(a.phaseRad - estimate.phaseRad, TWO_PI / m);
  }
  pitches.sort();
  phases.sort();
  const ci = (sorted: Float64Array): Ci95 => [
    quantileSorted(sorted, 0.025) / DEG,
    quantileSorted(sorted, 0.975) / DEG,
  ];
  return {
    m,
    pitchDeg: estimate.pitchRad / DEG,
    phaseDeg: estimate.phaseRad / DEG,
    RRefKpc: Math.exp(meanLn),
    pitchCi95: ci(pitches),
    phaseCi95: ci(phases),
    amplitude,
    n,
    resamples,
  };
}
