/**
 * The ordering analysis: do gas tracers lie upstream of young stars across spiral arms?
 * Pure computation (no I/O); see `./analysis` for the entry point and `./types` for the contract.
 */
export { runOrderingAnalysis } from './analysis';
export type {
  Ci,
  ClassSummary,
  ComplexRow,
  DistanceChoice,
  OrderingComplex,
  OrderingMember,
  OrderingResult,
  OrderingSettings,
  TracerKind,
} from './types';
export {
  EXCLUSION_REASONS,
  UNRELIABLE_LONGITUDE_EXCLUSION_DEG,
  type ExclusionReason,
} from './exclusions';
export { MIN_RESAMPLES } from './settings';
