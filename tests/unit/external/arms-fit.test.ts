import { describe, expect, it } from 'vitest';
import { fitLogSpiralArms, ridgeAzimuthRad, ridgeOffsetRad } from '@/lib/external/arms-fit';
import { makeRng } from '@/lib/stats/rng';

const DEG = Math.PI / 180;

/** Points scattered about m exact log spirals, ln(R/R_ref) = −(φ − φ_ref − 2πk/m) tan ψ, plus a uniform background. */
function spiralPoints(
  m: number,
  pitchDeg: number,
  phaseDeg: number,
  RRefKpc: number,
  seed: number,
) {
  const rng = makeRng(seed);
  const R: number[] = [];
  const phi: number[] = [];
  for (let i = 0; i < 4000; i++) {
    const r = 2 + rng.next() * 10;
    if (i % 5 === 0) {
      R.push(r);
      phi.push(rng.next() * 2 * Math.PI);
      continue;
    }
    const arm = rng.int(m);
    const onRidge =
      phaseDeg * DEG + (2 * Math.PI * arm) / m - Math.log(r / RRefKpc) / Math.tan(pitchDeg * DEG);
    R.push(r);
    phi.push(onRidge + 0.08 * rng.normal());
  }
  return { RKpc: Float64Array.from(R), phiRad: Float64Array.from(phi) };
}

describe('log-spiral arms fitted by the 2-D Fourier method', () => {
  for (const [m, pitch, phase] of [
    [2, 18, 40],
    [2, -25, 100],
    [3, 12, 10],
    [4, 30, 80],
  ] as const) {
    it(`recovers m = ${m}, ψ = ${pitch}°, φ_ref = ${phase}° within its intervals`, () => {
      const pts = spiralPoints(m, pitch, phase, 6, m * 100 + pitch);
      const fit = fitLogSpiralArms(pts.RKpc, pts.phiRad, m, { resamples: 300, seed: 4 })!;
      // the injected spiral; the phase compared at the fit's R_ref on the same arm
      const truthPhase =
        ridgeAzimuthRad({ m, pitchDeg: pitch, phaseDeg: phase, RRefKpc: 6 }, fit.RRefKpc) / DEG;
      const period = 360 / m;
      const phaseOffset =
        ((((fit.phaseDeg - truthPhase) % period) + 1.5 * period) % period) - period / 2;
      expect(fit.pitchCi95[0]).toBeLessThanOrEqual(pitch);
      expect(fit.pitchCi95[1]).toBeGreaterThanOrEqual(pitch);
      expect(Math.abs(fit.pitchDeg - pitch)).toBeLessThan(1);
      expect(Math.abs(phaseOffset)).toBeLessThan(1);
      // A 95 % interval misses the truth once in twenty draws (3 of 60 in a trial run of this
      // set-up): the phase is checked against twice the interval's half-width.
      const halfWidth = (fit.phaseCi95[1] - fit.phaseCi95[0]) / 2;
      expect(Math.abs(phaseOffset)).toBeLessThan(2 * halfWidth);
    });
  }

  it('ridge offsets are positive ahead in rotation and wrap within one arm period', () => {
    const arms = { m: 2, pitchDeg: 20, phaseDeg: 30, RRefKpc: 5 };
    const ridge = ridgeAzimuthRad(arms, 7);
    // exact geometry of the stated convention
    expect(ridge).toBeCloseTo(30 * DEG - Math.log(7 / 5) / Math.tan(20 * DEG), 12);
    expect(ridgeOffsetRad(arms, 7, ridge + 0.1)).toBeCloseTo(0.1, 12);
    expect(ridgeOffsetRad(arms, 7, ridge + Math.PI - 0.1)).toBeCloseTo(-0.1, 12); // the other arm
  });

  it('returns null with fewer than three sources and refuses a bad radius', () => {
    expect(
      fitLogSpiralArms(Float64Array.of(1, 2), Float64Array.of(0, 1), 2, { resamples: 10, seed: 1 }),
    ).toBeNull();
    expect(() =>
      fitLogSpiralArms(Float64Array.of(1, -2, 3), Float64Array.of(0, 1, 2), 2, {
        resamples: 10,
        seed: 1,
      }),
    ).toThrow(/RKpc\[1\]/);
  });
});
