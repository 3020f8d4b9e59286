/**
 * The demo galaxy is of realistic size for the ordering analysis, and its truth says so: gas and
 * young stars 100–300 pc apart across the arms inside corotation, a delay of several Myr, the
 * sign reversed beyond corotation, a rotation curve that no analysis preset shares, streaming
 * motions of ≈ 10 km/s that the velocities carry, and arm tangents in both inner quadrants.
 * The truth's ordering fields are checked against a recomputation from the catalogs.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { armPoints, offsetFromArms } from '@/lib/astro/arms';
import { fromGalactocentric } from '@/lib/astro/galactocentric';
import { vLsrAtKms } from '@/lib/astro/kinematic-distance';
import { KMS_KPC_PER_MYR } from '@/lib/astro/pattern-speed';
import { angularSpeedKmsKpc, makeRotationCurve } from '@/lib/astro/rotation-curves';
import {
  DEFAULT_MODEL,
  galaxyCurve,
  galaxyThetaKms,
  generateGalaxy,
  type DemoGalaxy,
  type Tracer,
} from '@/seed/generator';

const GAS: Tracer[] = ['HI', 'CO'];
const YOUNG: Tracer[] = ['HII', 'OB'];
const SEEDS = [1, 7, 42];
const DEG = Math.PI / 180;

const galaxies = new Map<number, DemoGalaxy>();
beforeAll(() => {
  for (const seed of SEEDS)
    galaxies.set(seed, generateGalaxy({ seed, complexes: 800, interlopers: 300 }));
});
const galaxy = (seed: number) => galaxies.get(seed) as DemoGalaxy;

/** Plain sorted median, independent of lib/stats. */
function sortedMedian(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : 0.5 * (s[m - 1] + s[m]);
}

/** Offsets of the complex members of `classes`, recomputed with offsetFromArms at their true x, y. */
function recomputed(
  g: DemoGalaxy,
  classes: Tracer[],
  keep: (RKpc: number) => boolean,
): { perp: number[]; az: number[]; phase: number[]; R: number[] } {
  const out = {
    perp: [] as number[],
    az: [] as number[],
    phase: [] as number[],
    R: [] as number[],
  };
  for (const t of classes) {
    const cat = g.catalogs[t];
    for (let i = 0; i < cat.count; i++) {
      const R = Math.hypot(cat.xKpc[i], cat.yKpc[i]);
      if (cat.complexId[i] < 0 || !keep(R)) continue;
      const off = offsetFromArms(cat.xKpc[i], cat.yKpc[i], g.truth.arms, g.truth.R0Kpc);
      out.perp.push(off.perpOffsetKpc);
      out.az.push(off.azimuthOffsetDeg);
      out.phase.push(cat.phaseMyr[i]);
      out.R.push(R);
    }
  }
  return out;
}

describe('ordering of realistic size', () => {
  it('separates young stars from gas by 100–300 pc inside corotation, for several seeds', () => {
    for (const seed of SEEDS) {
      const o = galaxy(seed).truth.ordering;
      // Milky-Way gas–young-tracer offsets of order 100–300 pc (Vallée 2014, AJ 148, 5;
      // Hou & Han 2015, MNRAS 454, 626).
      expect(o.youngMinusGasPerpKpcInside!, `seed ${seed}`).toBeGreaterThan(0.1);
      expect(o.youngMinusGasPerpKpcInside!, `seed ${seed}`).toBeLessThan(0.3);
      // Over most of the disc inside corotation, not only on average: every 1-kpc bin 5–9 kpc.
      for (const bin of o.youngMinusGasAzimuthDeg.filter((b) => b.RMinKpc >= 5 && b.RMaxKpc <= 9)) {
        expect(bin.dPerpKpc!, `seed ${seed}, R ${bin.RMinKpc}`).toBeGreaterThan(0.1);
        expect(bin.dPerpKpc!, `seed ${seed}, R ${bin.RMinKpc}`).toBeLessThan(0.3);
      }
      // Beyond corotation the pattern overtakes the gas: the order reverses (Roberts 1969).
      expect(o.youngMinusGasPerpKpcOutside!, `seed ${seed}`).toBeLessThan(0);
    }
  });

  it('puts the young stars several Myr after the gas', () => {
    // Several Myr: Egusa et al. (2009), ApJ 697, 1870 find 4–13 Myr.
    expect(DEFAULT_MODEL.phase.starFormationDelayMyr).toBeGreaterThanOrEqual(5);
    expect(DEFAULT_MODEL.phase.starFormationDelayMyr).toBeLessThanOrEqual(10);
    for (const seed of SEEDS) {
      const t = galaxy(seed).truth.ordering.effectiveTimescaleMyr!;
      expect(t, `seed ${seed}`).toBeGreaterThan(5);
      expect(t, `seed ${seed}`).toBeLessThan(10);
    }
  });

  it('records medians that a recomputation from the catalogs reproduces', () => {
    const g = galaxy(7);
    const o = g.truth.ordering;
    const rc = g.truth.corotationKpc as number;
    const inside = (R: number) => R < rc;
    const all = () => true;
    for (const t of [...GAS, ...YOUNG]) {
      expect(o.perClassPerpKpc[t].all).toBeCloseTo(sortedMedian(recomputed(g, [t], all).perp), 9);
      expect(o.perClassPerpKpc[t].insideCorotation).toBeCloseTo(
        sortedMedian(recomputed(g, [t], inside).perp),
        9,
      );
    }
    const ymg = (keep: (R: number) => boolean) =>
      sortedMedian(recomputed(g, YOUNG, keep).perp) - sortedMedian(recomputed(g, GAS, keep).perp);
    expect(o.youngMinusGasPerpKpc).toBeCloseTo(ymg(all), 9);
    expect(o.youngMinusGasPerpKpcInside).toBeCloseTo(ymg(inside), 9);
    expect(o.youngMinusGasPerpKpcOutside).toBeCloseTo(
      ymg((R) => R >= rc),
      9,
    );
    expect(o.effectiveTimescaleMyr).toBeCloseTo(
      sortedMedian(recomputed(g, YOUNG, all).phase) - sortedMedian(recomputed(g, GAS, all).phase),
      9,
    );
    const bin = o.youngMinusGasAzimuthDeg.find((b) => b.RMinKpc === 7)!;
    const inBin = (R: number) => R >= 7 && R < 8;
    const [young, gas] = [recomputed(g, YOUNG, inBin), recomputed(g, GAS, inBin)];
    expect(bin.nYoung).toBe(young.az.length);
    expect(bin.nGas).toBe(gas.az.length);
    expect(bin.dPhiDeg).toBeCloseTo(sortedMedian(young.az) - sortedMedian(gas.az), 9);
    expect(bin.medianRKpc).toBeCloseTo(sortedMedian([...young.R, ...gas.R]), 9);
    expect(o.patternSpeedKmsKpc).toBe(g.truth.patternSpeedKmsKpc);
    expect(o.corotationKpc).toBe(rc);
  });

  it('has per-bin Δφ(R) that a straight-line fit turns back into the pattern speed and timescale', () => {
    // Δφ = 1.0227e-3 (Ω(R) − Ω_p) t (Egusa et al. 2004, PASJ 56, L45): least squares of Δφ
    // (rad) on Ω(median R) over the bins, written out here.
    const g = galaxy(7);
    const curve = galaxyCurve(g.truth);
    const pts = g.truth.ordering.youngMinusGasAzimuthDeg
      .filter((b) => b.nGas >= 20 && b.nYoung >= 20)
      .map((b) => ({ x: angularSpeedKmsKpc(b.medianRKpc!, curve), y: b.dPhiDeg! * DEG }));
    expect(pts.length).toBeGreaterThanOrEqual(8);
    const mx = pts.reduce((s, p) => s + p.x, 0) / pts.length;
    const my = pts.reduce((s, p) => s + p.y, 0) / pts.length;
    const slope =
      pts.reduce((s, p) => s + (p.x - mx) * (p.y - my), 0) /
      pts.reduce((s, p) => s + (p.x - mx) ** 2, 0);
    const intercept = my - slope * mx;
    const tMyr = slope / KMS_KPC_PER_MYR;
    const omegaP = -intercept / slope;
    // The bins see the median phase difference, so t ≈ effectiveTimescaleMyr (to 15 %, the
    // scatter of medians of a few dozen members) and Ω_p ≈ the injected one (to 1.5 km/s/kpc).
    expect(Math.abs(tMyr / g.truth.ordering.effectiveTimescaleMyr! - 1)).toBeLessThan(0.15);
    expect(Math.abs(omegaP - g.truth.patternSpeedKmsKpc)).toBeLessThan(1.5);
  });
});

describe('rotation curve', () => {
  const g = () => galaxy(7);

  it('is the arctan form with Θ(R0) = Θ0, tabulated finely enough', () => {
    const curve = galaxyCurve(g().truth);
    const p = g().truth.model.curve;
    expect(curve.R0Kpc).toBe(8.2); // demo choice, near Reid et al. (2019) R0 = 8.15 kpc
    expect(curve.theta0Kms).toBeCloseTo(236, 9); // demo choice, Reid et al. (2019) Θ0 = 236 km/s
    // Written out independently: V_a (2/π) arctan(R/r_t) + g (R − R0), V_a fixed by Θ(R0).
    const va = 236 / ((2 / Math.PI) * Math.atan(8.2 / 0.8));
    for (const R of [3.3, 5.55, 9.91, 14.2]) {
      const exact = va * (2 / Math.PI) * Math.atan(R / 0.8) - 1.7 * (R - 8.2);
      expect(galaxyThetaKms(p, R)).toBeCloseTo(exact, 9);
      expect(Math.abs(curve.thetaKms(R) - exact)).toBeLessThan(0.05); // linear interpolation
    }
  });

  it('differs from every analysis preset by realistic amounts', () => {
    const curve = galaxyCurve(g().truth);
    for (const name of ['flat', 'brand-blitz-1993', 'reid-2014', 'reid-2019'] as const) {
      const preset = makeRotationCurve(name);
      let maxRel = 0;
      for (let R = 4; R <= 14; R += 0.5)
        maxRel = Math.max(maxRel, Math.abs(curve.thetaKms(R) / preset.thetaKms(R) - 1));
      expect(maxRel, name).toBeGreaterThan(0.01);
      expect(maxRel, name).toBeLessThan(0.1); // a realistic mismatch, not a different galaxy
    }
    // Reid et al. (2014): R0 = 8.34 kpc, Θ0 = 241 km/s.
    const reid = makeRotationCurve('reid-2014');
    expect(Math.abs(curve.R0Kpc / reid.R0Kpc - 1)).toBeGreaterThan(0.01);
    expect(Math.abs(curve.theta0Kms / reid.theta0Kms - 1)).toBeGreaterThan(0.01);
  });

  it('varies gently over the disc', () => {
    const curve = galaxyCurve(g().truth);
    for (let R = 4; R < 15; R += 0.25) {
      // |dΘ/dR| of a few km/s/kpc, as in the Milky Way beyond 4 kpc (from memory).
      expect(Math.abs(curve.thetaKms(R + 0.25) - curve.thetaKms(R)) / 0.25).toBeLessThan(8);
    }
  });
});

describe('streaming motions in the velocities', () => {
  /**
   * Least-squares amplitude A of v_LSR − v_circ = A·p, where p is the line-of-sight projection of
   * a unit inflow + lag along the ridge normal (cos ψ inward, sin ψ behind), computed here from
   * l, b and the position alone, with v_circ from the galaxy's curve (not the truth columns).
   */
  function streamingAmplitudeKms(g: DemoGalaxy, pick: (i: number, t: Tracer) => boolean): number {
    const curve = galaxyCurve(g.truth);
    let sxy = 0;
    let sxx = 0;
    for (const t of ['CO', 'HI'] as Tracer[]) {
      const cat = g.catalogs[t];
      for (let i = 0; i < cat.count; i++) {
        if (!pick(i, t)) continue;
        const l = cat.lDeg[i] * DEG;
        const b = cat.bDeg[i] * DEG;
        const u = [-Math.cos(b) * Math.cos(l), -Math.cos(b) * Math.sin(l)];
        const R = cat.RKpc[i];
        const inward = [-cat.xKpc[i] / R, -cat.yKpc[i] / R];
        const beta = cat.betaDeg[i] * DEG;
        const behind = [Math.sin(beta), Math.cos(beta)]; // −dβ direction of lib/astro/galactocentric
        const psi = g.truth.arms[cat.armIndex[i]].pitchDeg * DEG;
        const p =
          (Math.cos(psi) * inward[0] + Math.sin(psi) * behind[0]) * u[0] +
          (Math.cos(psi) * inward[1] + Math.sin(psi) * behind[1]) * u[1];
        const resid = cat.vLsrKms[i] - vLsrAtKms(cat.lDeg[i], cat.bDeg[i], cat.distKpc[i], curve);
        sxy += p * resid;
        sxx += p * p;
      }
    }
    return sxy / sxx;
  }

  it('carries ≈ 10 km/s of inflow and lag on the ridges inside corotation, none far from the arms', () => {
    const g = galaxy(7);
    const rc = g.truth.corotationKpc as number;
    const onRidge = streamingAmplitudeKms(g, (i, t) => {
      const cat = g.catalogs[t];
      return cat.complexId[i] >= 0 && cat.RKpc[i] < rc - 1 && Math.abs(cat.perpOffsetKpc[i]) < 0.1;
    });
    // Peak density-wave streaming of order 10 km/s (Roberts 1969; from memory); the Gaussian
    // profile is ≥ 0.97 of its peak within 0.1 kpc of the ridge.
    expect(onRidge).toBeGreaterThan(8.5);
    expect(onRidge).toBeLessThan(11);
    const farOff = streamingAmplitudeKms(g, (i, t) => {
      const cat = g.catalogs[t];
      return cat.complexId[i] < 0 && Math.abs(cat.perpOffsetKpc[i]) > 1.5;
    });
    expect(Math.abs(farOff)).toBeLessThan(2); // exp(−½ (1.5/0.4)²) ≈ 0.001 of the peak
  });
});

describe('arm tangents for the tangent-point method', () => {
  it('has ridge tangents with |b| < 1° sources in the first and the fourth quadrant', () => {
    const g = galaxy(7);
    const tangents: number[] = [];
    for (const arm of g.truth.arms) {
      const pts = armPoints(arm, 0.05);
      const l = Array.from(
        pts.xKpc,
        (x, i) => fromGalactocentric(x, pts.yKpc[i], 0, g.truth.R0Kpc).lDeg,
      );
      // Largest / smallest l reached along the ridge (exact geometry, sampled every 0.05°).
      for (let i = 1; i < l.length - 1; i++) {
        const [a, b, c] = [l[i - 1], l[i], l[i + 1]];
        if (Math.abs(b - a) > 180 || Math.abs(c - b) > 180) continue;
        if ((b > a && b > c) || (b < a && b < c)) tangents.push(b);
      }
    }
    const near = (lt: number) => {
      let n = 0;
      for (const t of ['CO', 'HII'] as Tracer[]) {
        const cat = g.catalogs[t];
        for (let i = 0; i < cat.count; i++)
          if (Math.abs(cat.lDeg[i] - lt) < 2 && Math.abs(cat.bDeg[i]) < 1) n++;
      }
      return n;
    };
    const q1 = tangents.filter((lt) => lt > 20 && lt < 70);
    const q4 = tangents.filter((lt) => lt > 280 && lt < 340);
    expect(q1.length).toBeGreaterThanOrEqual(1);
    expect(q4.length).toBeGreaterThanOrEqual(1);
    for (const lt of [...q1, ...q4]) expect(near(lt), `tangent at l = ${lt}`).toBeGreaterThan(15);
  });
});
