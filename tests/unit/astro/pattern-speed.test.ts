import { describe, expect, it } from 'vitest';
import {
  KMS_KPC_PER_MYR,
  angularSpeedKmsKpc,
  corotationRadiusKpc,
  delayMyr,
  orbitalPeriodMyr,
} from '@/lib/astro/pattern-speed';
import { makeRotationCurve } from '@/lib/astro/rotation-curves';

describe('pattern speed and delays', () => {
  const flat = makeRotationCurve('flat');

  it('converts km/s/kpc to time units', () => {
    // IAU constants (1 pc = 3.0857e13 km, 1 Myr = 3.156e13 s): 1 km/s/kpc ≈ 1.0227 Gyr⁻¹ (1/977.79 Myr⁻¹)
    expect(KMS_KPC_PER_MYR * 1000).toBeCloseTo(1.0227, 4);
    expect(1 / KMS_KPC_PER_MYR).toBeCloseTo(977.79, 2);
  });

  it('gives t = Δβ / (Ω − Ω_p) in Myr', () => {
    // same constants; one radian at 1 km/s/kpc relative speed is 977.79 Myr
    const omega = angularSpeedKmsKpc(8.5, flat);
    expect(omega).toBeCloseTo(220 / 8.5, 12);
    expect(delayMyr(180 / Math.PI, 8.5, flat, omega - 1)).toBeCloseTo(977.79, 1);
    // 2° ahead at R = 5 kpc, Ω = 44 km/s/kpc, Ω_p = 25 → 2π/180 rad / (19 × 1.0227e-3 Myr⁻¹) ≈ 1.80 Myr
    expect(delayMyr(2, 5, flat, 25)).toBeCloseTo((2 * Math.PI) / 180 / (19 * KMS_KPC_PER_MYR), 9);
    expect(delayMyr(2, 5, flat, 25)).toBeCloseTo(1.796, 2);
    // outside corotation the pattern overtakes the gas: stars behind (Δβ < 0) give positive delays
    expect(delayMyr(-2, 12, flat, 25)).toBeGreaterThan(0);
  });

  it('finds corotation and orbital periods', () => {
    // flat curve: R_c = Θ0 / Ω_p exactly; Sun's orbit ≈ 230–250 Myr (common practice)
    expect(corotationRadiusKpc(flat, 25)).toBeCloseTo(8.8, 9);
    expect(corotationRadiusKpc(flat, 1e-6)).toBeNull();
    const period = orbitalPeriodMyr(8.5, flat);
    expect(period).toBeGreaterThan(230);
    expect(period).toBeLessThan(250);
    const reid = makeRotationCurve('reid-2014');
    const rc = corotationRadiusKpc(reid, 25) as number;
    expect(angularSpeedKmsKpc(rc, reid)).toBeCloseTo(25, 9);
  });
});
