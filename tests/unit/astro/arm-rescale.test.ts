import { describe, expect, it } from 'vitest';
import { r0Mismatch, rescaleArms } from '@/lib/astro/arm-rescale';
import { ARM_MODEL_PRESETS, armRadiusKpc } from '@/lib/astro/arms';

describe('arm model R0 against the curve R0', () => {
  it('measures the shift between the Reid 2014 arms and the Reid 2019 curve', () => {
    // Reid et al. (2014) R0 = 8.34 kpc; Reid 2019 curve refit R0 = 8.166 kpc: 174 pc (arithmetic)
    const m = r0Mismatch(8.34, 8.166);
    expect(m?.shiftKpc).toBeCloseTo(0.174, 12);
    expect(m?.warning).toContain('174 pc');
    expect(m?.warning).toContain('closer to');
    expect(r0Mismatch(8.166, 8.34)?.warning).toContain('farther from');
    expect(r0Mismatch(8.34, 8.3405)).toBeNull(); // agree to 1 pc
    expect(() => r0Mismatch(0, 8)).toThrow('armsR0Kpc = 0');
  });

  it('scales every ridge radius by the ratio of R0 and keeps the pitch', () => {
    const preset = ARM_MODEL_PRESETS['reid-2014'];
    const out = rescaleArms(preset.arms, 8.34, 8.166);
    const ratio = 8.166 / 8.34; // exact geometry: radius in units of R0 kept
    out.forEach((arm, i) => {
      const before = preset.arms[i];
      for (const beta of [before.betaMinDeg, 20, before.betaMaxDeg]) {
        expect(armRadiusKpc(arm, beta)).toBeCloseTo(armRadiusKpc(before, beta) * ratio, 12);
      }
      expect(arm.pitchDeg).toBe(before.pitchDeg);
      expect(arm.betaRefDeg).toBe(before.betaRefDeg);
    });
    expect(preset.arms[0].RrefKpc).toBe(5.0); // input untouched
    expect(() => rescaleArms(preset.arms, 8.34, -1)).toThrow('toR0Kpc = -1');
  });
});
