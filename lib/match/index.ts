/**
 * The cross-matcher: links sources of several catalogs by Galactic position (degrees) and LSR
 * velocity (km/s), groups the links into complexes, and estimates chance links. Pure: typed arrays
 * in, typed arrays out.
 */
export { estimateChanceLinks, DEFAULT_SHIFTS_DEG } from './chance';
export type { ChanceEstimate, ChanceOptions } from './chance';
export { buildComplexes } from './complexes';
export type { ComplexSet, PairLinks } from './complexes';
export { MatchCancelledError, MatchInputError } from './errors';
export { IdBuffer } from './idBuffer';
export { matchCatalogs } from './matchCatalogs';
export type { MatchCatalogsOptions } from './matchCatalogs';
export { matchMany } from './matchMany';
export type { CatalogPairLinks, MatchManyOptions } from './matchMany';
export { separationArcsec } from './separation';
export { buildSkyIndex, capCandidates, wrapLongitudeDeg } from './skyIndex';
export type { SkyIndex } from './skyIndex';
export { pairRadiusArcsec, velocityWindowKms } from './tolerance';
export type {
  LinkMode,
  LinkSet,
  MatchParams,
  MissingVelocityPolicy,
  ProgressCallback,
  RadiusRule,
  RunOptions,
  SourceArrays,
  VelocityRule,
} from './types';
