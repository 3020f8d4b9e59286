import { describe, expect, it } from 'vitest';
import { orderingSettings } from '@/lib/analysis-settings';
import { ARM_MODEL_PRESETS } from '@/lib/astro/arms';
import { analysisSchema } from '@/lib/schemas/analyses';

const request = (extra: Record<string, unknown> = {}) =>
  analysisSchema.parse({
    runId: 'r',
    curve: { name: 'reid-2019' },
    arms: { preset: 'reid-2014' },
    ...extra,
  });

describe('orderingSettings', () => {
  it("takes the preset's published R0 and Θ0 errors unless the request gives its own", () => {
    const s = orderingSettings(request());
    expect(s.R0ErrKpc).toBe(0.15); // Reid et al. (2019): R0 = 8.15 ± 0.15 kpc
    expect(s.theta0ErrKms).toBe(7); // Reid et al. (2019): Θ0 = 236 ± 7 km/s
    const own = orderingSettings(
      request({ curve: { name: 'reid-2019', R0Err: 0.3, theta0Err: 0 } }),
    );
    expect([own.R0ErrKpc, own.theta0ErrKms]).toEqual([0.3, 0]);
    expect(orderingSettings(request({ curve: { name: 'flat' } })).R0ErrKpc).toBe(0); // adopted IAU value: none
  });

  it('states no pattern speed unless one is given, and defaults to the probabilistic near/far rule', () => {
    expect(orderingSettings(request()).patternSpeedKmsKpc).toBeNull();
    expect(orderingSettings(request({ patternSpeed: 25 })).patternSpeedKmsKpc).toBe(25);
    expect(orderingSettings(request()).nearFar).toBe('probabilistic');
    expect(orderingSettings(request({ tangentNearTerminalKms: 10 })).tangentNearTerminalKms).toBe(
      10,
    );
  });

  it("rescales a preset's arms to the curve's R0 only when asked, and then warns of no mismatch", () => {
    const preset = ARM_MODEL_PRESETS['reid-2014'];
    const kept = orderingSettings(request());
    expect(kept.arms).toEqual(preset.arms);
    expect(kept.armsR0Kpc).toBe(preset.R0Kpc); // 8.34 kpc, Reid et al. (2014)
    const scaled = orderingSettings(
      request({ arms: { preset: 'reid-2014', rescaleToCurveR0: true } }),
    );
    const factor = scaled.curve.R0Kpc / preset.R0Kpc; // radii scale with R0 (exact geometry)
    scaled.arms.forEach((a, i) =>
      expect(a.RrefKpc).toBeCloseTo(preset.arms[i].RrefKpc * factor, 12),
    );
    expect(scaled.armsR0Kpc).toBe(scaled.curve.R0Kpc);
  });

  it('refuses an unknown preset, naming it', () => {
    expect(() => orderingSettings(request({ arms: { preset: 'no-such-arms' } }))).toThrow(
      /"arms",\s*"preset"[\s\S]*No such arm model; use one of reid-2014/,
    );
  });
});
