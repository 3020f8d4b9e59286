import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  MakeTime,
  RotateVector,
  Rotation_EQD_EQJ,
  SphereFromVector,
  Vector,
} from 'astronomy-engine';
import { equatorialToGalactic } from '@/lib/astro/coordinates';
import {
  DYNAMICAL_LSR,
  KINEMATIC_LSR,
  REST_FREQUENCY_HZ,
  SPEED_OF_LIGHT_KMS,
  convertVelocityConvention,
  frequencyToVelocityKms,
  helioToLsrKms,
  lsrToHelioKms,
  velocityToFrequencyHz,
  type VelocityConvention,
} from '@/lib/astro/velocity';

const D = Math.PI / 180;

describe('LSR correction', () => {
  it('uses the kinematic and dynamical solar motions of docs/methods.md, "Velocities"', () => {
    // common practice (standard solar motion); Schönrich, Binney & Dehnen 2010
    expect(KINEMATIC_LSR).toEqual({ uKms: 10.27, vKms: 15.32, wKms: 7.74 });
    expect(DYNAMICAL_LSR).toEqual({ uKms: 11.1, vKms: 12.24, wKms: 7.25 });
  });

  it('equals v + U cos l cos b + V sin l cos b + W sin b and inverts exactly', () => {
    // formula of docs/methods.md, "Velocities" (common practice)
    fc.assert(
      fc.property(
        fc.double({ min: -500, max: 500, noNaN: true }),
        fc.double({ min: 0, max: 360, noNaN: true }),
        fc.double({ min: -90, max: 90, noNaN: true }),
        (v, l, b) => {
          const expected =
            v +
            10.27 * Math.cos(l * D) * Math.cos(b * D) +
            15.32 * Math.sin(l * D) * Math.cos(b * D) +
            7.74 * Math.sin(b * D);
          expect(helioToLsrKms(v, l, b)).toBeCloseTo(expected, 10);
          expect(lsrToHelioKms(helioToLsrKms(v, l, b), l, b)).toBeCloseTo(v, 10);
          const dyn =
            v +
            11.1 * Math.cos(l * D) * Math.cos(b * D) +
            12.24 * Math.sin(l * D) * Math.cos(b * D) +
            7.25 * Math.sin(b * D);
          expect(helioToLsrKms(v, l, b, DYNAMICAL_LSR)).toBeCloseTo(dyn, 10);
        },
      ),
    );
  });

  it('adds +20.0 km/s toward the solar apex α = 18h, δ = +30° (B1900)', () => {
    // common practice: standard solar motion 20.0 km/s toward 18h, +30° (B1900); precessed to
    // J2000 with astronomy-engine (Rotation_EQD_EQJ at B1900.0 = JD 2415020.3135)
    const b1900 = MakeTime(2415020.3135 - 2451545.0);
    const c = Math.cos(30 * D);
    const v = new Vector(c * Math.cos(270 * D), c * Math.sin(270 * D), Math.sin(30 * D), b1900);
    const j2000 = SphereFromVector(RotateVector(Rotation_EQD_EQJ(b1900), v));
    const g = equatorialToGalactic(j2000.lon, j2000.lat);
    expect(helioToLsrKms(0, g.lDeg, g.bDeg)).toBeCloseTo(20.0, 1);
    expect(helioToLsrKms(0, (g.lDeg + 180) % 360, -g.bDeg)).toBeCloseTo(-20.0, 1);
  });
});

describe('velocity conventions', () => {
  const conventions: VelocityConvention[] = ['radio', 'optical', 'relativistic'];

  it('round-trips between every pair of conventions', () => {
    // exact algebra through ν/ν₀
    fc.assert(
      fc.property(
        fc.double({ min: -50000, max: 50000, noNaN: true }),
        fc.constantFrom(...conventions),
        fc.constantFrom(...conventions),
        (v, from, to) => {
          const w = convertVelocityConvention(v, from, to);
          expect(convertVelocityConvention(w, to, from)).toBeCloseTo(v, 6);
        },
      ),
    );
  });

  it('matches closed forms between conventions', () => {
    // v_opt = v_rad / (1 − v_rad/c); relativistic β = (1 − r²)/(1 + r²) (standard definitions)
    const c = SPEED_OF_LIGHT_KMS;
    const vr = 3000;
    expect(convertVelocityConvention(vr, 'radio', 'optical')).toBeCloseTo(vr / (1 - vr / c), 9);
    const r = 1 - vr / c;
    expect(convertVelocityConvention(vr, 'radio', 'relativistic')).toBeCloseTo(
      (c * (1 - r * r)) / (1 + r * r),
      9,
    );
    expect(convertVelocityConvention(50, 'radio', 'optical')).toBeCloseTo(50.00834, 4);
  });

  it('places the HI line correctly', () => {
    // HI rest frequency 1420.405751768 MHz (standard line lists; from memory); radio convention
    expect(REST_FREQUENCY_HZ.HI).toBe(1420405751.768);
    expect(REST_FREQUENCY_HZ.CO_1_0).toBe(115271201800);
    const f = velocityToFrequencyHz(100, REST_FREQUENCY_HZ.HI, 'radio');
    // ν = ν₀ (1 − v/c): 100 km/s shifts the line down by 1420405751.768 × 100 / 299792.458 Hz
    expect(REST_FREQUENCY_HZ.HI - f).toBeCloseTo(
      (REST_FREQUENCY_HZ.HI * 100) / SPEED_OF_LIGHT_KMS,
      3,
    );
    expect(REST_FREQUENCY_HZ.HI - f).toBeCloseTo(473796.36, 1);
    // the 21 cm line (common practice): λ = c/ν ≈ 0.2111 m
    expect((SPEED_OF_LIGHT_KMS * 1000) / REST_FREQUENCY_HZ.HI).toBeCloseTo(0.2111, 4);
    for (const conv of conventions) {
      expect(
        frequencyToVelocityKms(
          velocityToFrequencyHz(-45.5, REST_FREQUENCY_HZ.CO_1_0, conv),
          REST_FREQUENCY_HZ.CO_1_0,
          conv,
        ),
      ).toBeCloseTo(-45.5, 8);
      expect(frequencyToVelocityKms(REST_FREQUENCY_HZ.HI, REST_FREQUENCY_HZ.HI, conv)).toBe(0);
    }
  });

  it('rejects velocities with no frequency', () => {
    // domain of each convention
    expect(() => convertVelocityConvention(SPEED_OF_LIGHT_KMS, 'radio', 'optical')).toThrow(
      RangeError,
    );
    expect(() => convertVelocityConvention(-SPEED_OF_LIGHT_KMS, 'optical', 'radio')).toThrow(
      'optical',
    );
    expect(() => velocityToFrequencyHz(SPEED_OF_LIGHT_KMS * 1.5, 1, 'relativistic')).toThrow(
      RangeError,
    );
    expect(() => frequencyToVelocityKms(-1, 1, 'radio')).toThrow(RangeError);
  });
});
