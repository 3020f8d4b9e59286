/**
 * The two tolerances of a link, pair by pair.
 *
 * Radius (arcsec):
 * - fixed: R = arcsec (position errors are not added: a fixed radius is taken as final);
 * - scaled: R = √( max(minArcsec, factor·(r_A + r_B))² + e_A² + e_B² ), with r the angular radii
 *   and e the 1σ position errors of the two sources (missing columns count as 0). The floor keeps
 *   point-like sources matchable; the errors add in quadrature because they are independent.
 *
 * Velocity window (km/s) on |v_B − v_A|:
 * - fixed: W = kms;
 * - scaled: W = factor·√(σ_A² + σ_B²), σ the line widths (the spread of the difference of two
 *   independent lines);
 * - ignore: W = ∞.
 * A pair links when separation ≤ R and |Δv| ≤ W (both inclusive).
 */
import type { RadiusRule, VelocityRule } from './types';

/** Match radius in arcsec for one pair; `ra`, `rb` angular radii and `ea`, `eb` position errors in arcsec. */
export function pairRadiusArcsec(
  rule: RadiusRule,
  ra: number,
  rb: number,
  ea: number,
  eb: number,
): number {
  if (rule.mode === 'fixed') return rule.arcsec;
  const base = Math.max(rule.minArcsec, rule.factor * (ra + rb));
  return Math.sqrt(base * base + ea * ea + eb * eb);
}

/** Velocity window in km/s for one pair; `sigmaA`, `sigmaB` line widths (σ) in km/s. */
export function velocityWindowKms(rule: VelocityRule, sigmaA: number, sigmaB: number): number {
  if (rule.mode === 'fixed') return rule.kms;
  if (rule.mode === 'scaled') return rule.factor * Math.sqrt(sigmaA * sigmaA + sigmaB * sigmaB);
  return Infinity;
}
