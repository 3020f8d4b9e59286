import { describe, expect, it } from 'vitest';
import { KMS_KPC_PER_MYR } from '@/lib/astro/pattern-speed';
import {
  fitPatternSpeed,
  percentileInterval,
  type PhaseOffsetBin,
} from '@/lib/ordering/pattern-fit';
import { makeRng, deriveSeed, type Rng } from '@/lib/stats/rng';

// 1 km/s in kpc/Myr (equal to 1 km/s/kpc in Myr⁻¹) from the IAU values 1 pc = 3.0857e13 km and
// 1 Myr = 3.156e13 s, kept apart from the module's constant so the simulations check its units.
const KMS_IN_KPC_PER_MYR = 3.156e13 / 3.0857e16;

type Curve = { thetaKms(RKpc: number): number };
const FLAT_V_KMS = 200;
const flat: Curve = { thetaKms: () => FLAT_V_KMS };
// Rising then flat: Θ = V0 R / √(R² + Rc²), so Ω = V0 / √(R² + Rc²) and Ω = Ω_p at √((V0/Ω_p)² − Rc²).
const RISE_V0_KMS = 230;
const RISE_CORE_KPC = 2.5;
const risingFlat: Curve = {
  thetaKms: (R) => (RISE_V0_KMS * R) / Math.sqrt(R * R + RISE_CORE_KPC * RISE_CORE_KPC),
};

type Galaxy = {
  patternKmsKpc: number;
  delayMyr: number;
  RminKpc: number;
  RmaxKpc: number;
  bins: number;
  perBin: number;
  scatterKpc: number;
  resamples: number;
};

const PITCH_DEG = 15;
const STEP_MYR = 0.1;

/**
 * One star-forming complex: born where its circular orbit meets a two-armed log-spiral ridge that
 * turns rigidly at Ω_p, its orbit integrated in Cartesian coordinates (leapfrog under the
 * acceleration V²/R towards the centre) for the delay, and both positions read in the frame
 * turning with the pattern, with Gaussian position errors. Returns the azimuth (rad) from the
 * birth point to the young stars, positive in the sense of rotation.
 */
function complexOffsetRad(RKpc: number, curve: Curve, g: Galaxy, rng: Rng): number {
  const arm = rng.int(2) * Math.PI;
  const ridgeRad = -Math.log(RKpc / 5) / Math.tan((PITCH_DEG * Math.PI) / 180) + arm;
  const bornMyr = 500 * rng.next();
  const patternAngle = (tMyr: number) => g.patternKmsKpc * KMS_IN_KPC_PER_MYR * tMyr;
  const birthAngle = ridgeRad + patternAngle(bornMyr);
  let x = RKpc * Math.cos(birthAngle);
  let y = RKpc * Math.sin(birthAngle);
  const speed = curve.thetaKms(RKpc) * KMS_IN_KPC_PER_MYR;
  let vx = -speed * Math.sin(birthAngle);
  let vy = speed * Math.cos(birthAngle);
  const accel = (px: number, py: number): [number, number] => {
    const r = Math.hypot(px, py);
    const v = curve.thetaKms(r) * KMS_IN_KPC_PER_MYR;
    const k = -(v * v) / (r * r);
    return [k * px, k * py];
  };
  const steps = Math.round(g.delayMyr / STEP_MYR);
  const dt = steps > 0 ? g.delayMyr / steps : 0;
  let [ax, ay] = accel(x, y);
  for (let s = 0; s < steps; s++) {
    vx += 0.5 * dt * ax;
    vy += 0.5 * dt * ay;
    x += dt * vx;
    y += dt * vy;
    [ax, ay] = accel(x, y);
    vx += 0.5 * dt * ax;
    vy += 0.5 * dt * ay;
  }
  const toPattern = (px: number, py: number, tMyr: number): [number, number] => {
    const a = -patternAngle(tMyr);
    return [
      px * Math.cos(a) - py * Math.sin(a) + g.scatterKpc * rng.normal(),
      px * Math.sin(a) + py * Math.cos(a) + g.scatterKpc * rng.normal(),
    ];
  };
  const [bx, by] = toPattern(RKpc * Math.cos(birthAngle), RKpc * Math.sin(birthAngle), bornMyr);
  const [sx, sy] = toPattern(x, y, bornMyr + g.delayMyr);
  return Math.atan2(bx * sy - by * sx, bx * sx + by * sy);
}

/** Radial bins of simulated complexes: mean offset and mean Ω per bin, and replicate r of all
 * bins from resample r (complexes drawn with replacement within each bin). */
function simulateBins(curve: Curve, g: Galaxy, seed: number): PhaseOffsetBin[] {
  const rng = makeRng(seed);
  const width = (g.RmaxKpc - g.RminKpc) / g.bins;
  const members = Array.from({ length: g.bins }, (_, b) => {
    const R = Float64Array.from({ length: g.perBin }, () => g.RminKpc + (b + rng.next()) * width);
    const dphi = R.map((r) => complexOffsetRad(r, curve, g, rng));
    return { R, dphi };
  });
  const replicates = members.map(() => new Float64Array(g.resamples));
  const boot = makeRng(deriveSeed(seed, 1));
  for (let r = 0; r < g.resamples; r++)
    members.forEach(({ dphi }, b) => {
      let sum = 0;
      for (let k = 0; k < dphi.length; k++) sum += dphi[boot.int(dphi.length)];
      replicates[b][r] = sum / dphi.length;
    });
  return members.map(({ R, dphi }, b) => ({
    RKpc: R.reduce((s, r) => s + r, 0) / R.length,
    omegaKmsKpc: R.reduce((s, r) => s + curve.thetaKms(r) / r, 0) / R.length,
    dphiRad: dphi.reduce((s, d) => s + d, 0) / dphi.length,
    n: dphi.length,
    replicatesRad: replicates[b],
  }));
}

const inside = (x: number, [lo, hi]: [number, number]) => x >= lo && x <= hi;

const armGalaxy: Galaxy = {
  patternKmsKpc: 20,
  delayMyr: 8,
  RminKpc: 3,
  RmaxKpc: 9,
  bins: 8,
  perBin: 25,
  scatterKpc: 0.05,
  resamples: 2000,
};

describe('fitPatternSpeed on simulated complexes (orbits integrated, not the fitted formula)', () => {
  for (const [name, curve] of [
    ['flat', flat],
    ['rising-then-flat', risingFlat],
  ] as const) {
    it(`recovers Ω_p and t inside their 95 % intervals, ${name} curve`, () => {
      const fit = fitPatternSpeed(simulateBins(curve, armGalaxy, 11), curve);
      expect(fit.constrained).toBe(true);
      expect(fit.reason).toBeNull();
      expect(fit.binsUsed).toBe(armGalaxy.bins);
      // simulation truth: Ω_p = 20 km/s/kpc, t = 8 Myr
      expect(inside(20, fit.patternSpeedCi95!)).toBe(true);
      expect(inside(8, fit.timescaleCi95!)).toBe(true);
      expect(fit.patternSpeedKmsKpc!).toBeCloseTo(20, 0);
      expect(fit.timescaleMyr!).toBeGreaterThan(7);
      expect(fit.timescaleMyr!).toBeLessThan(9);
      expect(fit.chi2PerDof!).toBeLessThan(4);
    });

    it(`intervals cover the truth in ≥ 90 % of 50 simulated galaxies, ${name} curve`, () => {
      const g = { ...armGalaxy, bins: 6, perBin: 15, resamples: 1000 };
      let speedCovered = 0;
      let timeCovered = 0;
      const seeds = 50;
      for (let s = 0; s < seeds; s++) {
        const fit = fitPatternSpeed(simulateBins(curve, g, deriveSeed(2024, s)), curve);
        // simulation truth: Ω_p = 20 km/s/kpc, t = 8 Myr
        if (fit.patternSpeedCi95 && inside(20, fit.patternSpeedCi95)) speedCovered++;
        if (fit.timescaleCi95 && inside(8, fit.timescaleCi95)) timeCovered++;
      }
      // 95 % intervals: ≥ 45 of 50 (a 95 % interval with ~10 % slack for 50 draws, common practice)
      expect(speedCovered).toBeGreaterThanOrEqual(45);
      expect(timeCovered).toBeGreaterThanOrEqual(45);
    });
  }

  it('a galaxy with no drift (t = 0): t consistent with 0, Ω_p not constrained', () => {
    const still = { ...armGalaxy, delayMyr: 0 };
    const fit = fitPatternSpeed(simulateBins(flat, still, 5), flat);
    expect(fit.constrained).toBe(false);
    expect(fit.patternSpeedKmsKpc).toBeNull();
    expect(fit.patternSpeedCi95).toBeNull();
    expect(fit.corotationKpc).toBeNull();
    expect(inside(0, fit.timescaleCi95!)).toBe(true); // simulation truth: t = 0
    expect(fit.reason).toMatch(/do not change with Ω\(R\) beyond their errors/);
    expect(fit.reason).toMatch(/consistent with 0/);
  });

  it('without drift, Ω_p is reported as not constrained in ≥ 90 % of 40 galaxies', () => {
    const still = { ...armGalaxy, delayMyr: 0, resamples: 1000 };
    let unconstrained = 0;
    for (let s = 0; s < 40; s++)
      if (!fitPatternSpeed(simulateBins(flat, still, deriveSeed(77, s)), flat).constrained)
        unconstrained++;
    // a 95 % slope interval contains the true slope 0 in ~95 % of galaxies (common practice)
    expect(unconstrained).toBeGreaterThanOrEqual(36);
  });
});

describe('corotation', () => {
  const g: Galaxy = { ...armGalaxy, patternKmsKpc: 25, RminKpc: 4, RmaxKpc: 14, bins: 10 };

  it('flat curve: offsets reverse sign across R_CR = V/Ω_p, recovered within its interval', () => {
    const bins = simulateBins(flat, g, 3);
    const fit = fitPatternSpeed(bins, flat);
    const truth = FLAT_V_KMS / 25; // exact geometry: Ω = V/R = Ω_p at 8 kpc
    expect(inside(truth, fit.corotationCi95!)).toBe(true);
    // exact geometry: the bisection root of V/R = Ω̂_p for the fitted Ω̂_p
    expect(fit.corotationKpc!).toBeCloseTo(FLAT_V_KMS / fit.patternSpeedKmsKpc!, 9);
    for (const bin of bins) {
      const [lo, hi] = percentileInterval(bin.replicatesRad);
      // the drift picture: ahead inside corotation, behind outside (Roberts 1969)
      if (bin.RKpc < truth - 1) expect(lo).toBeGreaterThan(0);
      if (bin.RKpc > truth + 1) expect(hi).toBeLessThan(0);
    }
    expect(bins.filter((b) => b.RKpc < truth - 1).length).toBeGreaterThanOrEqual(2);
    expect(bins.filter((b) => b.RKpc > truth + 1).length).toBeGreaterThanOrEqual(2);
  });

  it('rising-then-flat curve: R_CR recovered within its interval, root exact for the fitted Ω_p', () => {
    const fit = fitPatternSpeed(simulateBins(risingFlat, g, 4), risingFlat);
    const root = (speed: number) => Math.sqrt((RISE_V0_KMS / speed) ** 2 - RISE_CORE_KPC ** 2);
    expect(inside(root(25), fit.corotationCi95!)).toBe(true); // exact geometry
    expect(fit.corotationKpc!).toBeCloseTo(root(fit.patternSpeedKmsKpc!), 9); // exact geometry
    // the interval follows the Ω_p interval through Ω(R): faster pattern, smaller radius
    expect(fit.corotationCi95![0]).toBeCloseTo(root(fit.patternSpeedCi95![1]), 9);
    expect(fit.corotationCi95![1]).toBeCloseTo(root(fit.patternSpeedCi95![0]), 9);
  });

  it('a corotation beyond the radii searched is null with a note, and no curve gives none', () => {
    const inner = fitPatternSpeed(simulateBins(flat, { ...armGalaxy, RmaxKpc: 7 }, 8), flat);
    expect(inner.constrained).toBe(true);
    expect(inner.corotationKpc).toBeNull(); // V/Ω_p = 10 kpc lies beyond the 3–7 kpc bins (exact geometry)
    expect(inner.notes.join(' ')).toMatch(/corotation lies outside/);
    const wider = fitPatternSpeed(simulateBins(flat, { ...armGalaxy, RmaxKpc: 7 }, 8), flat, {
      corotationRangeKpc: [1, 30],
    });
    expect(wider.corotationKpc!).toBeCloseTo(FLAT_V_KMS / wider.patternSpeedKmsKpc!, 9); // exact geometry
    expect(fitPatternSpeed(simulateBins(flat, armGalaxy, 8), null).corotationKpc).toBeNull();
  });
});

describe('units and published values', () => {
  it('1 km/s/kpc = 1.0227e-3 Myr⁻¹', () => {
    // IAU constants: 1 pc = 3.0857e13 km, 1 Myr = 3.156e13 s (4–5 digits, so agreement to 2e-4)
    expect(Math.abs(KMS_KPC_PER_MYR / KMS_IN_KPC_PER_MYR - 1)).toBeLessThan(2e-4);
    expect(KMS_KPC_PER_MYR).toBeCloseTo(1.0227e-3, 7); // Egusa et al. (2004) conversion
  });

  it('recovers NGC 4254: t = 4.8 Myr, Ω_p = 26 km/s/kpc', () => {
    const tMyr = 4.8; // Egusa et al. (2004), PASJ 56, L45
    const patternKmsKpc = 26; // Egusa et al. (2004), PASJ 56, L45
    const vKms = 150; // flat curve assumed for the check (from memory, order of NGC 4254's)
    const rng = makeRng(42);
    const sigmaRad = 0.005;
    const bins = [1.5, 2, 2.5, 3, 3.5, 4, 5, 6, 7].map((R) => {
      const omegaKmsKpc = vKms / R;
      const dphiRad = KMS_IN_KPC_PER_MYR * (omegaKmsKpc - patternKmsKpc) * tMyr;
      const replicatesRad = Float64Array.from(
        { length: 2000 },
        () => dphiRad + sigmaRad * rng.normal(),
      );
      return { RKpc: R, omegaKmsKpc, dphiRad, n: 20, replicatesRad };
    });
    const fit = fitPatternSpeed(bins, { thetaKms: () => vKms });
    expect(fit.timescaleMyr!).toBeCloseTo(4.8, 3); // Egusa et al. (2004)
    expect(fit.patternSpeedKmsKpc!).toBeCloseTo(26, 3); // Egusa et al. (2004)
    expect(fit.corotationKpc!).toBeCloseTo(150 / 26, 3); // exact geometry: V/Ω_p
    expect(inside(4.8, fit.timescaleCi95!)).toBe(true);
    expect(inside(26, fit.patternSpeedCi95!)).toBe(true);
    expect(fit.chi2PerDof!).toBeCloseTo(0, 12); // exact line (offsets made without noise)
  });
});

describe('the weighted line', () => {
  it('matches the normal equations solved directly, fit and replicate intervals', () => {
    const bins = simulateBins(flat, armGalaxy, 21);
    const fit = fitPatternSpeed(bins, flat);
    const weights = bins.map((b) => {
      const m = b.replicatesRad.reduce((a, v) => a + v, 0) / b.replicatesRad.length;
      const variance =
        b.replicatesRad.reduce((a, v) => a + (v - m) ** 2, 0) / (b.replicatesRad.length - 1);
      return 1 / variance;
    });
    // Cramer's rule on [[s, sx], [sx, sxx]] (a second algorithm)
    const solve = (y: (b: PhaseOffsetBin) => number) => {
      let s = 0;
      let sx = 0;
      let sxx = 0;
      let sy = 0;
      let sxy = 0;
      bins.forEach((b, i) => {
        const w = weights[i];
        s += w;
        sx += w * b.omegaKmsKpc;
        sxx += w * b.omegaKmsKpc ** 2;
        sy += w * y(b);
        sxy += w * b.omegaKmsKpc * y(b);
      });
      const det = s * sxx - sx * sx;
      return { slope: (s * sxy - sx * sy) / det, intercept: (sxx * sy - sx * sxy) / det };
    };
    const { slope, intercept } = solve((b) => b.dphiRad);
    // brute force: one fit per replicate index r, taken from every bin at the same r
    const slopes = Float64Array.from({ length: armGalaxy.resamples }, (_, r) => {
      return solve((b) => b.replicatesRad[r]).slope;
    });
    const [slopeLo, slopeHi] = percentileInterval(slopes);
    expect(fit.slopeCi95![0]).toBeCloseTo(slopeLo, 10);
    expect(fit.slopeCi95![1]).toBeCloseTo(slopeHi, 10);
    expect(fit.slopeRadPerKmsKpc!).toBeCloseTo(slope, 10);
    expect(fit.interceptRad!).toBeCloseTo(intercept, 10);
    expect(fit.patternSpeedKmsKpc!).toBeCloseTo(-intercept / slope, 8);
    expect(fit.timescaleMyr!).toBeCloseTo(slope / KMS_KPC_PER_MYR, 8);
  });

  it('percentileInterval gives the type-7 percentiles', () => {
    const values = Float64Array.from({ length: 101 }, (_, i) => 100 - i);
    const [lo95, hi95] = percentileInterval(values);
    expect(lo95).toBeCloseTo(2.5, 12); // exact: (n − 1) p = 2.5
    expect(hi95).toBeCloseTo(97.5, 12); // exact: (n − 1) p = 97.5
    const [lo50, hi50] = percentileInterval(values, 0.5);
    expect(lo50).toBeCloseTo(25, 12); // exact
    expect(hi50).toBeCloseTo(75, 12); // exact
    expect(values[0]).toBe(100);
  });
});

describe('when the data do not constrain the fit', () => {
  const line = (omegas: number[], slope: number, spread: number, n = 10): PhaseOffsetBin[] => {
    const rng = makeRng(9);
    return omegas.map((omegaKmsKpc, i) => {
      const dphiRad = slope * (omegaKmsKpc - 20);
      return {
        RKpc: 2 + i,
        omegaKmsKpc,
        dphiRad,
        n,
        replicatesRad: Float64Array.from({ length: 500 }, () => dphiRad + spread * rng.normal()),
      };
    });
  };

  it('fewer usable bins than minBins: no t, no Ω_p', () => {
    const fit = fitPatternSpeed(line([60, 40], 0.01, 0.01), flat);
    expect(fit.timescaleMyr).toBeNull();
    expect(fit.patternSpeedKmsKpc).toBeNull();
    expect(fit.reason).toMatch(/only 2 bin\(s\).*at least 3/);
    expect(fitPatternSpeed(line([60, 40], 0.01, 0.001), flat, { minBins: 2 }).constrained).toBe(
      true,
    );
  });

  it('bins with one tracer or empty bins are left out with a note', () => {
    const bins = line([60, 50, 40, 30], 0.01, 0.001);
    bins[1] = { ...bins[1], n: 1, replicatesRad: new Float64Array(500).fill(bins[1].dphiRad) };
    bins[2] = { ...bins[2], n: 0, dphiRad: NaN, replicatesRad: new Float64Array(0) };
    const fit = fitPatternSpeed(bins, flat);
    expect(fit.binsUsed).toBe(2);
    expect([...fit.usedBins]).toEqual([1, 0, 0, 1]);
    expect(fit.notes.join(' ')).toMatch(/single tracer/);
    expect(fit.constrained).toBe(false);
  });

  it('Ω spanning under 1 % of itself: no lever arm', () => {
    const fit = fitPatternSpeed(line([30, 30.05, 30.1, 30.15], 0.01, 0.0001), flat);
    expect(fit.timescaleMyr).toBeNull();
    expect(fit.reason).toMatch(/lever arm/);
  });

  it('offsets falling with Ω (t < 0 beyond errors): t as measured, no Ω_p', () => {
    const fit = fitPatternSpeed(line([60, 50, 40, 30, 20], -0.01, 0.002), flat);
    expect(fit.timescaleMyr!).toBeCloseTo(-0.01 / KMS_KPC_PER_MYR, 0); // as constructed
    expect(fit.timescaleCi95![1]).toBeLessThan(0);
    expect(fit.patternSpeedKmsKpc).toBeNull();
    expect(fit.constrained).toBe(false);
    expect(fit.reason).toMatch(/no pattern speed is derived/);
  });
});

describe('bad input', () => {
  const good = (): PhaseOffsetBin[] => simulateBins(flat, { ...armGalaxy, resamples: 50 }, 1);

  it('throws RangeError naming the field', () => {
    const cases: Array<[string, (b: PhaseOffsetBin[]) => void]> = [
      ['omegaKmsKpc', (b) => (b[2].omegaKmsKpc = NaN)],
      ['RKpc', (b) => (b[0].RKpc = -1)],
      ['dphiRad', (b) => (b[1].dphiRad = 4)],
      ['.n', (b) => (b[3].n = 2.5)],
      ['replicatesRad has 49', (b) => (b[4].replicatesRad = b[4].replicatesRad.subarray(1))],
      ['replicatesRad[3]', (b) => (b[5].replicatesRad[3] = Infinity)],
    ];
    for (const [field, spoil] of cases) {
      const bins = good();
      spoil(bins);
      expect(() => fitPatternSpeed(bins, flat)).toThrow(RangeError);
      expect(() => fitPatternSpeed(bins, flat)).toThrow(field);
    }
    expect(() => fitPatternSpeed(good(), flat, { level: 1 })).toThrow(/level = 1/);
    expect(() => fitPatternSpeed(good(), flat, { minBins: 1 })).toThrow(/minBins = 1/);
    expect(() => fitPatternSpeed(good(), flat, { corotationRangeKpc: [9, 3] })).toThrow(
      /corotationRangeKpc/,
    );
    expect(() => percentileInterval([])).toThrow(RangeError);
    expect(() => percentileInterval([1, NaN])).toThrow(/replicate 1/);
  });
});
