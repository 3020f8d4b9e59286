/**
 * The demo-scenario generator: a synthetic Milky-Way-like galaxy with a known two-armed density
 * wave, observed from the Sun as four survey catalogs in varied layouts, with its truth.
 */
export { generateGalaxy, type DemoGalaxy } from './galaxy';
export { writeDemoFiles, truthFileName, type WrittenDemo, type WrittenFile } from './write';
export { GeneratorOptionError, type GalaxyOptions } from './options';
export { DEFAULT_MODEL, DEFAULT_ARMS, TRACERS, type ModelParams, type Tracer } from './params';
export { galaxyCurve, galaxyThetaKms, type GalaxyCurveParams } from './curve';
export { DIST_METHOD, type TracerCatalog } from './catalog';
export type { ComplexTable } from './complexes';
export type { GalaxyTruth } from './truth';
export type { OrderingTruth, RadialOrderingBin, ClassPerpOffsets } from './ordering-truth';
