import { describe, expect, it } from 'vitest';
import { pairRadiusArcsec, velocityWindowKms } from '@/lib/match';

describe('pair tolerances', () => {
  it('fixed radius ignores sizes and errors', () => {
    expect(pairRadiusArcsec({ mode: 'fixed', arcsec: 60 }, 100, 100, 30, 40)).toBe(60); // documented rule
  });

  it('scaled radius: √(max(floor, k(rA + rB))² + eA² + eB²)', () => {
    const rule = { mode: 'scaled' as const, factor: 1, minArcsec: 5 };
    expect(pairRadiusArcsec(rule, 3, 4, 3, 4)).toBeCloseTo(Math.sqrt(74), 12); // 7² + 3² + 4² = 74, by hand
    const floored = { mode: 'scaled' as const, factor: 0.5, minArcsec: 5 };
    expect(pairRadiusArcsec(floored, 3, 4, 3, 4)).toBeCloseTo(Math.sqrt(50), 12); // floor 5 > 3.5: 5² + 25, by hand
    expect(pairRadiusArcsec(floored, 0, 0, 0, 0)).toBe(5); // point sources without errors get the floor
  });

  it('velocity windows: fixed, k·√(σA² + σB²), or none', () => {
    expect(velocityWindowKms({ mode: 'fixed', kms: 5 }, 3, 4)).toBe(5); // documented rule
    expect(velocityWindowKms({ mode: 'scaled', factor: 2 }, 3, 4)).toBeCloseTo(10, 12); // 2·√(9 + 16), by hand
    expect(velocityWindowKms({ mode: 'ignore' }, 3, 4)).toBe(Infinity); // documented rule
  });
});
