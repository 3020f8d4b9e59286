/**
 * The flow sign the ordering statistics are signed with (`lib/ordering/flow-sign`): s =
 * sign(Ω(R) − Ω_p), +1 inside corotation (material overtakes the pattern, downstream = ahead in
 * rotation), −1 outside (Roberts 1969), and 0 for a complex whose distance interval reaches across
 * corotation (flagged `straddles-corotation`) or that has no position.
 */
import { angularSpeedKmsKpc } from '@/lib/astro/pattern-speed';
import type { RotationCurve } from '@/lib/astro/rotation-curves';
import type { ResultComplex } from './types';

export function complexFlowSign(
  c: ResultComplex,
  curve: RotationCurve,
  patternSpeedKmsKpc: number,
): -1 | 0 | 1 {
  if (c.RKpc === null || c.flags.includes('straddles-corotation')) return 0;
  return angularSpeedKmsKpc(c.RKpc, curve) > patternSpeedKmsKpc ? 1 : -1;
}
