import { describe, expect, it } from 'vitest';
import { ARM_MODEL_PRESETS, offsetFromArms, type ArmSpec } from '@/lib/astro/arms';
import { polarToXy } from '@/lib/astro/galactocentric';
import { makeRng } from '@/lib/stats/rng';
import { prepareRidges, ridgeOffset, type RidgeOffset } from '@/lib/ordering/ridge-offset';

const TWO_ARMS: ArmSpec[] = [
  { name: 'A', RrefKpc: 7, betaRefDeg: 10, pitchDeg: 12.5, betaMinDeg: -187, betaMaxDeg: 154 },
  { name: 'B', RrefKpc: 7, betaRefDeg: 190, pitchDeg: 12.5, betaMinDeg: -7, betaMaxDeg: 334 },
];

function compare(arms: ArmSpec[], seed: number, count: number) {
  const rng = makeRng(seed);
  const prepared = prepareRidges(arms);
  const out: RidgeOffset = {
    armIndex: 0,
    perpOffsetKpc: 0,
    azimuthOffsetDeg: 0,
    withinRange: false,
  };
  let checked = 0;
  for (let k = 0; k < count; k++) {
    const { xKpc, yKpc } = polarToXy(3 + 12 * rng.next(), 360 * rng.next() - 180);
    // The second algorithm: dense scan of the ridge and golden-section refinement.
    const ref = offsetFromArms(xKpc, yKpc, arms, 8.34);
    if (Math.abs(ref.perpOffsetKpc) > 1.5) continue;
    ridgeOffset(prepared, xKpc, yKpc, out);
    expect(out.armIndex).toBe(ref.armIndex);
    expect(Math.abs(out.perpOffsetKpc - ref.perpOffsetKpc)).toBeLessThan(1e-6);
    if (Number.isNaN(ref.azimuthOffsetDeg)) expect(out.azimuthOffsetDeg).toBeNaN();
    else expect(out.azimuthOffsetDeg).toBeCloseTo(ref.azimuthOffsetDeg, 9);
    expect(out.withinRange).toBe(ref.withinRange);
    checked++;
  }
  return checked;
}

describe('ridgeOffset', () => {
  it('agrees with the scanning offsetFromArms on the demo-like two-armed spiral', () => {
    expect(compare(TWO_ARMS, 11, 3000)).toBeGreaterThan(1000);
  });

  it('agrees with offsetFromArms on every published preset (kinked arms included)', () => {
    for (const [key, preset] of Object.entries(ARM_MODEL_PRESETS)) {
      const n = compare(preset.arms, key.length * 97, 2000);
      expect(n, key).toBeGreaterThan(300);
    }
  });

  it('gives NaN at the Galactic centre and refuses an empty arm list', () => {
    const out: RidgeOffset = {
      armIndex: 0,
      perpOffsetKpc: 0,
      azimuthOffsetDeg: 0,
      withinRange: true,
    };
    ridgeOffset(prepareRidges(TWO_ARMS), 0, 0, out);
    expect(out.armIndex).toBe(-1);
    expect(Number.isNaN(out.perpOffsetKpc)).toBe(true);
    expect(() => prepareRidges([])).toThrow(RangeError);
  });
});
