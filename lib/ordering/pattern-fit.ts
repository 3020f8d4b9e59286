/**
 * Pattern speed Ω_p and star-formation timescale t from the azimuthal offsets between gas and
 * young stars in radial bins (Egusa et al. 2004, PASJ 56, L45; Egusa et al. 2009, ApJ 697, 1870;
 * Tamburro et al. 2008, AJ 136, 2872). Where gas forms stars as it crosses a density wave rotating
 * at Ω_p, the young stars appear t later at Δφ(R) = K (Ω(R) − Ω_p) t from it (K = 1 km/s/kpc in
 * Myr⁻¹), so the straight line Δφ = a Ω + b gives t = a / K and Ω_p = −b / a. Offsets are in rad,
 * positive AHEAD of the gas in the sense of rotation; Ω in km/s/kpc; t in Myr; R in kpc. Many
 * galaxies show no clean offset (Foyle et al. 2011, ApJ 735, 101), so the fit says when the data
 * do not constrain it instead of returning a number.
 */
import { KMS_KPC_PER_MYR } from '@/lib/astro/pattern-speed';
import { quantileSorted } from '@/lib/stats/summary';

/**
 * One radial bin: its radius, the angular speed Ω(R) the analysis used there, the measured offset
 * Δφ (rad, positive ahead, within [−π, π]) from n tracers, and its bootstrap replicates.
 * Replicate r of every bin must come from the same resample r, so that the fit on replicate
 * index r is one draw of the whole fit and the intervals are joint across bins. A bin with n = 0
 * is skipped whatever its other fields hold.
 */
export type PhaseOffsetBin = {
  RKpc: number;
  omegaKmsKpc: number;
  dphiRad: number;
  n: number;
  replicatesRad: Float64Array;
};

/** Options: fewest usable bins for a fit (default 3, at least 2), interval level (default 0.95),
 * and the radii (kpc) where corotation may be placed (default: the used bins' span). */
export type PatternFitOptions = {
  minBins?: number;
  level?: number;
  corotationRangeKpc?: [number, number];
};

/**
 * Result of {@link fitPatternSpeed}. `*Ci95` are percentile intervals at `level` (0.95 unless
 * asked otherwise) from the fits to the replicates. A null value is not constrained by the data;
 * `reason` then says why in plain words, and `notes` carries other caveats.
 */
export type PatternFit = {
  level: number;
  /** Number of bins that entered the fit, and a 0/1 flag per input bin. */
  binsUsed: number;
  usedBins: Uint8Array;
  /** True when a pattern speed was fitted. */
  constrained: boolean;
  reason: string | null;
  notes: string[];
  /** Slope a (rad per km/s/kpc) of Δφ against Ω, and Δφ at Ω = 0 (rad). */
  slopeRadPerKmsKpc: number | null;
  slopeCi95: [number, number] | null;
  interceptRad: number | null;
  /** Fraction of replicates whose slope has the other sign than the fitted one. */
  slopeSignFlipFraction: number | null;
  /** Σ w (Δφ − fit)² / (bins − 2), weights 1/variance of each bin's replicates. */
  chi2PerDof: number | null;
  timescaleMyr: number | null;
  timescaleCi95: [number, number] | null;
  patternSpeedKmsKpc: number | null;
  patternSpeedCi95: [number, number] | null;
  corotationKpc: number | null;
  corotationCi95: [number, number] | null;
  /** End points of the fitted line over the used bins' Ω, for plotting. */
  line: { omegaKmsKpc: [number, number]; dphiRad: [number, number] } | null;
};

/** Smallest spread of Ω across the used bins, as a fraction of their median |Ω|, for a slope:
 * below 1 % the lever arm is smaller than the uncertainty of any rotation curve. */
export const MIN_OMEGA_SPREAD_FRACTION = 0.01;

/**
 * Percentile interval [(1 − level)/2, (1 + level)/2] (type-7 quantiles) of bootstrap replicates;
 * the input is not modified. Throws RangeError for an empty or non-finite sample or a bad level.
 */
export function percentileInterval(replicates: ArrayLike<number>, level = 0.95): [number, number] {
  if (!(level > 0 && level < 1))
    throw new RangeError(`percentileInterval: level = ${level} must lie in (0, 1)`);
  if (replicates.length === 0) throw new RangeError('percentileInterval: no replicates');
  const sorted = Float64Array.from(replicates);
  for (let i = 0; i < sorted.length; i++)
    if (!Number.isFinite(sorted[i]))
      throw new RangeError(`percentileInterval: replicate ${i} = ${sorted[i]} is not finite`);
  sorted.sort();
  const alpha = (1 - level) / 2;
  return [quantileSorted(sorted, alpha), quantileSorted(sorted, 1 - alpha)];
}

/**
 * Weighted least-squares fit of Δφ (rad) on Ω (km/s/kpc) over the bins with n ≥ 2 and replicate
 * spread > 0 (weights 1/variance of the replicates), then the same fit on every replicate index
 * for percentile intervals of the slope, t = slope / K and Ω_p = −intercept / slope.
 *
 * Nothing is fitted (t and Ω_p null) with fewer than `minBins` usable bins or when Ω spans less
 * than {@link MIN_OMEGA_SPREAD_FRACTION} of its median. Ω_p is not constrained (null) when the
 * slope interval contains 0 — more than (1 − level)/2 of the replicates give the other sign, so
 * the offsets do not change with Ω beyond their errors; t is then reported, consistent with 0. A
 * slope that is negative beyond its errors contradicts stars forming after the gas passes the arm:
 * t is reported as measured and no Ω_p is derived. Corotation R_CR, where Ω(R) = Ω_p, is found by
 * bisection on `curve` within `corotationRangeKpc`; its interval maps the Ω_p interval through
 * Ω(R), which falls with R for disc rotation curves. Throws RangeError naming a bad field.
 */
export function fitPatternSpeed(
  bins: PhaseOffsetBin[],
  curve: { thetaKms(RKpc: number): number } | null,
  options: PatternFitOptions = {},
): PatternFit {
  const minBins = options.minBins ?? 3;
  const level = options.level ?? 0.95;
  if (!Number.isInteger(minBins) || minBins < 2)
    throw new RangeError(`fitPatternSpeed: minBins = ${minBins} must be an integer ≥ 2`);
  if (!(level > 0 && level < 1))
    throw new RangeError(`fitPatternSpeed: level = ${level} must lie in (0, 1)`);
  const replicates = validateBins(bins);
  const notes: string[] = [];
  const usedBins = new Uint8Array(bins.length);
  const weight = new Float64Array(bins.length);
  let binsUsed = 0;
  let singleTracer = 0;
  bins.forEach((bin, i) => {
    if (bin.n === 0) return;
    const variance = replicateVariance(bin.replicatesRad);
    if (bin.n < 2 || !(variance > 0)) {
      singleTracer++;
      return;
    }
    usedBins[i] = 1;
    weight[i] = 1 / variance;
    binsUsed++;
  });
  if (singleTracer > 0)
    notes.push(
      `${singleTracer} bin(s) with a single tracer or no spread among their replicates have no error and were left out`,
    );
  const fit = emptyFit(level, binsUsed, usedBins, notes);
  if (binsUsed < minBins) {
    fit.reason = `only ${binsUsed} bin(s) have offsets with errors (at least ${minBins} needed): neither a timescale nor a pattern speed can be fitted`;
    return fit;
  }

  const used = [...usedBins.keys()].filter((i) => usedBins[i] === 1);
  let sw = 0;
  let swx = 0;
  let omegaMin = Infinity;
  let omegaMax = -Infinity;
  for (const i of used) {
    const omega = bins[i].omegaKmsKpc;
    sw += weight[i];
    swx += weight[i] * omega;
    omegaMin = Math.min(omegaMin, omega);
    omegaMax = Math.max(omegaMax, omega);
  }
  const omegaMedian = medianAbs(used.map((i) => bins[i].omegaKmsKpc));
  if (!(omegaMax - omegaMin >= MIN_OMEGA_SPREAD_FRACTION * omegaMedian) || omegaMax === omegaMin) {
    fit.reason = `Ω(R) spans only ${(omegaMax - omegaMin).toPrecision(3)} km/s/kpc across the bins (${((100 * (omegaMax - omegaMin)) / omegaMedian).toPrecision(2)} % of its median): too short a lever arm to fit a slope, so neither a timescale nor a pattern speed`;
    return fit;
  }
  // Centring Ω on its weighted mean keeps slope and level uncorrelated and Ω_p = Ω̄ − level/slope well conditioned.
  const omegaBar = swx / sw;
  const centred = new Float64Array(bins.length);
  let sxx = 0;
  for (const i of used) {
    centred[i] = bins[i].omegaKmsKpc - omegaBar;
    sxx += weight[i] * centred[i] * centred[i];
  }
  const lineAt = (value: (i: number) => number) => {
    let sy = 0;
    let sxy = 0;
    for (const i of used) {
      const y = value(i);
      sy += weight[i] * y;
      sxy += weight[i] * centred[i] * y;
    }
    return { slope: sxy / sxx, levelAtMean: sy / sw };
  };

  const best = lineAt((i) => bins[i].dphiRad);
  const slopes = new Float64Array(replicates);
  const speeds = new Float64Array(replicates);
  let flips = 0;
  for (let r = 0; r < replicates; r++) {
    const line = lineAt((i) => bins[i].replicatesRad[r]);
    slopes[r] = line.slope;
    speeds[r] = omegaBar - line.levelAtMean / line.slope;
    if (Math.sign(line.slope) !== Math.sign(best.slope)) flips++;
  }
  let chi2 = 0;
  for (const i of used) {
    const residual = bins[i].dphiRad - best.levelAtMean - best.slope * centred[i];
    chi2 += weight[i] * residual * residual;
  }
  const slopeCi = percentileInterval(slopes, level);
  const timescaleCi = slopeCi.map((a) => a / KMS_KPC_PER_MYR) as [number, number];
  const atOmega = (omega: number) => best.levelAtMean + best.slope * (omega - omegaBar);
  Object.assign(fit, {
    slopeRadPerKmsKpc: best.slope,
    slopeCi95: slopeCi,
    interceptRad: atOmega(0),
    slopeSignFlipFraction: flips / replicates,
    chi2PerDof: binsUsed > 2 ? chi2 / (binsUsed - 2) : null,
    timescaleMyr: best.slope / KMS_KPC_PER_MYR,
    timescaleCi95: timescaleCi,
    line: { omegaKmsKpc: [omegaMin, omegaMax], dphiRad: [atOmega(omegaMin), atOmega(omegaMax)] },
  });
  const tText = `t = ${fmt(fit.timescaleMyr!)} Myr (${intervalText(timescaleCi)} Myr)`;
  if (slopeCi[0] <= 0 && slopeCi[1] >= 0) {
    fit.reason = `the offsets do not change with Ω(R) beyond their errors (${(100 * fit.slopeSignFlipFraction!).toPrecision(2)} % of the resamples give the other slope sign): no pattern speed can be fitted; ${tText} is consistent with 0`;
    return fit;
  }
  if (best.slope < 0) {
    fit.reason = `the offsets fall as Ω(R) rises, ${tText}: young stars ahead of the gas where it rotates slowest and behind where it rotates fastest is not the order of stars forming after the gas crosses the arm, so no pattern speed is derived`;
    return fit;
  }

  fit.constrained = true;
  fit.patternSpeedKmsKpc = omegaBar - best.levelAtMean / best.slope;
  fit.patternSpeedCi95 = percentileInterval(speeds, level);
  if (curve) placeCorotation(fit, curve, options.corotationRangeKpc ?? radiusSpan(bins, used));
  return fit;
}

function placeCorotation(
  fit: PatternFit,
  curve: { thetaKms(RKpc: number): number },
  rangeKpc: [number, number],
): void {
  const [lo, hi] = rangeKpc;
  if (!(lo > 0 && hi > lo && Number.isFinite(hi)))
    throw new RangeError(
      `fitPatternSpeed: corotationRangeKpc = [${lo}, ${hi}] must be two increasing positive radii`,
    );
  const where = `${fmt(lo)}–${fmt(hi)} kpc`;
  fit.corotationKpc = corotationWithin(curve, fit.patternSpeedKmsKpc!, lo, hi);
  if (fit.corotationKpc === null) {
    fit.notes.push(
      `Ω(R) does not reach Ω_p = ${fmt(fit.patternSpeedKmsKpc!)} km/s/kpc within ${where}: corotation lies outside the radii searched`,
    );
    return;
  }
  const [speedLo, speedHi] = fit.patternSpeedCi95!;
  // Ω(R) falls with R: the fastest pattern speed of the interval gives the smallest radius.
  const inner = corotationWithin(curve, speedHi, lo, hi);
  const outer = corotationWithin(curve, speedLo, lo, hi);
  if (inner === null || outer === null) {
    fit.notes.push(
      `the corotation interval reaches beyond ${where} (the radii searched), so it is not given`,
    );
    return;
  }
  fit.corotationCi95 = [inner, outer];
}

/** R (kpc) in [lo, hi] where Θ(R)/R = speed, by bisection in ln R; null without a sign change. */
function corotationWithin(
  curve: { thetaKms(RKpc: number): number },
  speedKmsKpc: number,
  loKpc: number,
  hiKpc: number,
): number | null {
  const excess = (lnR: number) => curve.thetaKms(Math.exp(lnR)) / Math.exp(lnR) - speedKmsKpc;
  let a = Math.log(loKpc);
  let b = Math.log(hiKpc);
  const fa = excess(a);
  const fb = excess(b);
  if (!(fa >= 0 && fb <= 0)) return null;
  for (let k = 0; k < 200 && b - a > 1e-13; k++) {
    const mid = 0.5 * (a + b);
    if (excess(mid) > 0) a = mid;
    else b = mid;
  }
  return Math.exp(0.5 * (a + b));
}

/** Checks every bin; returns the common replicate count of the bins with n ≥ 1. */
function validateBins(bins: PhaseOffsetBin[]): number {
  if (!Array.isArray(bins)) throw new RangeError('fitPatternSpeed: bins must be an array');
  let replicates = -1;
  bins.forEach((bin, i) => {
    const at = `fitPatternSpeed: bins[${i}]`;
    if (!Number.isInteger(bin.n) || bin.n < 0)
      throw new RangeError(`${at}.n = ${bin.n} must be a non-negative integer`);
    if (bin.n === 0) return;
    if (!(bin.RKpc > 0 && Number.isFinite(bin.RKpc)))
      throw new RangeError(`${at}.RKpc = ${bin.RKpc} must be a positive radius`);
    if (!Number.isFinite(bin.omegaKmsKpc))
      throw new RangeError(`${at}.omegaKmsKpc = ${bin.omegaKmsKpc} must be finite`);
    if (!(Math.abs(bin.dphiRad) <= Math.PI))
      throw new RangeError(`${at}.dphiRad = ${bin.dphiRad} must lie in [−π, π]`);
    const reps = bin.replicatesRad;
    if (!(reps instanceof Float64Array) || reps.length < 2)
      throw new RangeError(`${at}.replicatesRad must be a Float64Array of at least 2 replicates`);
    if (replicates === -1) replicates = reps.length;
    else if (reps.length !== replicates)
      throw new RangeError(
        `${at}.replicatesRad has ${reps.length} replicates where earlier bins have ${replicates}; replicate r of every bin must come from resample r`,
      );
    for (let r = 0; r < reps.length; r++)
      if (!(Math.abs(reps[r]) <= Math.PI))
        throw new RangeError(`${at}.replicatesRad[${r}] = ${reps[r]} must lie in [−π, π]`);
  });
  return replicates;
}

function emptyFit(level: number, binsUsed: number, usedBins: Uint8Array, notes: string[]) {
  const fit: PatternFit = {
    level,
    binsUsed,
    usedBins,
    constrained: false,
    reason: null,
    notes,
    slopeRadPerKmsKpc: null,
    slopeCi95: null,
    interceptRad: null,
    slopeSignFlipFraction: null,
    chi2PerDof: null,
    timescaleMyr: null,
    timescaleCi95: null,
    patternSpeedKmsKpc: null,
    patternSpeedCi95: null,
    corotationKpc: null,
    corotationCi95: null,
    line: null,
  };
  return fit;
}

function replicateVariance(reps: Float64Array): number {
  let sum = 0;
  for (let r = 0; r < reps.length; r++) sum += reps[r];
  const m = sum / reps.length;
  let ss = 0;
  for (let r = 0; r < reps.length; r++) ss += (reps[r] - m) ** 2;
  return ss / (reps.length - 1);
}

function medianAbs(values: number[]): number {
  const sorted = Float64Array.from(values, Math.abs).sort();
  return quantileSorted(sorted, 0.5);
}

function radiusSpan(bins: PhaseOffsetBin[], used: number[]): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const i of used) {
    lo = Math.min(lo, bins[i].RKpc);
    hi = Math.max(hi, bins[i].RKpc);
  }
  return [lo, hi];
}

function fmt(x: number): string {
  return x.toPrecision(3);
}

function intervalText([lo, hi]: [number, number]): string {
  return `interval ${fmt(lo)} to ${fmt(hi)}`;
}
