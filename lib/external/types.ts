/**
 * Shapes of the external-galaxy ordering analysis (a spiral seen from outside) and their plain
 * validation. Angles in degrees unless a name says Rad, distances in the disc in kpc, the
 * galaxy's distance in Mpc, speeds in km/s, angular speeds in km/s/kpc, times in Myr.
 */
import type { TracerKind } from '@/lib/ordering/types';

/** Sense of rotation as seen on the sky with north up and east left. */
export type SkyRotationSense = 'counterclockwise' | 'clockwise';

/** The galaxy's rotation curve: flat, or a table of (R kpc, V km/s) rows read by linear interpolation. */
export type ExternalRotationCurveSpec =
  | { kind: 'flat'; vKms: number }
  | { kind: 'table'; points: ReadonlyArray<readonly [number, number]> };

/** Where the galaxy is and how its disc lies on the sky. */
export type ExternalGalaxy = {
  centerRaDeg: number;
  centerDecDeg: number;
  distanceMpc: number;
  inclinationDeg: number;
  /** Position angle of the receding major axis, east of north. */
  positionAngleDeg: number;
  /** Given, or 'trailing-arms' to infer it from the winding of the fitted arms. */
  rotation: SkyRotationSense | 'trailing-arms';
  rotationCurve: ExternalRotationCurveSpec;
};

/** One source of a catalog. */
export type ExternalSource = { raDeg: number; decDeg: number; kind: TracerKind };

/** Sources as columns. */
export type ExternalSourceColumns = {
  raDeg: Float64Array;
  decDeg: Float64Array;
  kind: ArrayLike<TracerKind>;
};

/** Rings in the disc: [minKpc + k·widthKpc, minKpc + (k + 1)·widthKpc) up to maxKpc. */
export type RingSpec = { minKpc: number; maxKpc: number; widthKpc: number };

/**
 * m log-spiral arms in the disc: ln(R/RRefKpc) = −(φ − phaseDeg − k·360°/m)·tan(pitchDeg), with φ
 * increasing in the sense of rotation, so a positive pitch angle is a trailing arm.
 */
export type LogSpiralArms = { m: number; pitchDeg: number; phaseDeg: number; RRefKpc: number };

/** A 95 % interval [lo, hi]. */
export type Ci95 = [number, number];

/** Options of {@link import('./analysis').runExternalAnalysis}. */
export type ExternalAnalysisOptions = {
  /** m, the number of arms. */
  arms: number;
  rings: RingSpec;
  /** Bootstrap resamples (≥ 2000 for a reported interval, common practice). */
  resamples: number;
  seed: number;
  gasKinds?: TracerKind[];
  youngKinds?: TracerKind[];
  /** Label permutations of the null test (default 999). */
  permutations?: number;
  /** Gaussian kernel (σ, deg) smoothing the azimuthal profiles (default 5). */
  kernelDeg?: number;
  /** Azimuthal bins of the profiles, a power of two (default 256). */
  azimuthBins?: number;
  /** Fewest sources of each class for a ring to be measured (default 10). */
  minPerClass?: number;
  /** Arms entered by hand for the ridge cross-check; else they are fitted to `armsFrom`. */
  armModel?: LogSpiralArms | null;
  /** Class whose positions the arms are fitted to (default 'gas'). */
  armsFrom?: 'gas' | 'young';
};

/** Gas and young-star classes unless the options say otherwise. */
export const DEFAULT_GAS_KINDS: TracerKind[] = ['hi', 'co'];
export const DEFAULT_YOUNG_KINDS: TracerKind[] = ['hii', 'ob'];

const KINDS: ReadonlySet<string> = new Set(['hi', 'co', 'hii', 'ob', 'other']);

function finite(value: unknown, field: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value))
    throw new RangeError(`${field} = ${String(value)} must be a finite number`);
  return value;
}

function within(value: unknown, field: string, lo: number, hi: number, hiOpen = false): number {
  const v = finite(value, field);
  if (v < lo || v > hi || (hiOpen && v === hi))
    throw new RangeError(`${field} = ${v} must lie in [${lo}, ${hi}${hiOpen ? ')' : ']'}`);
  return v;
}

function positive(value: unknown, field: string): number {
  const v = finite(value, field);
  if (!(v > 0)) throw new RangeError(`${field} = ${v} must be positive`);
  return v;
}

function positiveInteger(value: unknown, field: string): number {
  const v = finite(value, field);
  if (!Number.isInteger(v) || v < 1)
    throw new RangeError(`${field} = ${v} must be a positive integer`);
  return v;
}

/** Checks a rotation curve spec; throws RangeError naming the field (prefix `field`). */
export function validateRotationCurveSpec(spec: ExternalRotationCurveSpec, field: string): void {
  if (spec?.kind === 'flat') {
    positive(spec.vKms, `${field}.vKms`);
    return;
  }
  if (spec?.kind !== 'table')
    throw new RangeError(
      `${field}.kind = ${String((spec as { kind?: unknown })?.kind)} must be 'flat' or 'table'`,
    );
  if (!Array.isArray(spec.points) || spec.points.length < 2)
    throw new RangeError(`${field}.points must hold at least two (R, V) rows`);
  let previous = 0;
  spec.points.forEach((row, k) => {
    const R = positive(row?.[0], `${field}.points[${k}][0] (R, kpc)`);
    positive(row?.[1], `${field}.points[${k}][1] (V, km/s)`);
    if (!(R > previous))
      throw new RangeError(`${field}.points[${k}][0] = ${R} must exceed the previous radius`);
    previous = R;
  });
}

/** Checks a galaxy; throws RangeError naming the field, e.g. `galaxy.inclinationDeg`. */
export function validateGalaxy(galaxy: ExternalGalaxy): void {
  within(galaxy.centerRaDeg, 'galaxy.centerRaDeg', 0, 360, true);
  within(galaxy.centerDecDeg, 'galaxy.centerDecDeg', -90, 90);
  positive(galaxy.distanceMpc, 'galaxy.distanceMpc');
  within(galaxy.inclinationDeg, 'galaxy.inclinationDeg', 0, 90, true);
  within(galaxy.positionAngleDeg, 'galaxy.positionAngleDeg', 0, 360, true);
  if (!['counterclockwise', 'clockwise', 'trailing-arms'].includes(galaxy.rotation))
    throw new RangeError(
      `galaxy.rotation = ${String(galaxy.rotation)} must be 'counterclockwise', 'clockwise' or 'trailing-arms'`,
    );
  validateRotationCurveSpec(galaxy.rotationCurve, 'galaxy.rotationCurve');
}

/** Checks log-spiral arms; throws RangeError naming the field (prefix `field`). */
export function validateArms(arms: LogSpiralArms, field: string): void {
  positiveInteger(arms.m, `${field}.m`);
  const pitch = within(arms.pitchDeg, `${field}.pitchDeg`, -90, 90);
  if (pitch === 0) throw new RangeError(`${field}.pitchDeg = 0 is a ring, not a spiral`);
  finite(arms.phaseDeg, `${field}.phaseDeg`);
  positive(arms.RRefKpc, `${field}.RRefKpc`);
}

/** Checks ring edges; throws RangeError naming the field. */
export function validateRings(rings: RingSpec): void {
  const lo = within(rings.minKpc, 'rings.minKpc', 0, Infinity);
  const hi = finite(rings.maxKpc, 'rings.maxKpc');
  if (!(hi > lo)) throw new RangeError(`rings.maxKpc = ${hi} must exceed rings.minKpc = ${lo}`);
  const width = positive(rings.widthKpc, 'rings.widthKpc');
  if ((hi - lo) / width > 1000)
    throw new RangeError(`rings.widthKpc = ${width} makes more than 1000 rings`);
}

/** Checks analysis options; throws RangeError naming the field, e.g. `options.resamples`. */
export function validateOptions(options: ExternalAnalysisOptions): void {
  positiveInteger(options.arms, 'options.arms');
  validateRings(options.rings);
  positiveInteger(options.resamples, 'options.resamples');
  finite(options.seed, 'options.seed');
  if (options.permutations !== undefined)
    positiveInteger(options.permutations, 'options.permutations');
  if (options.kernelDeg !== undefined) positive(options.kernelDeg, 'options.kernelDeg');
  if (options.azimuthBins !== undefined) {
    const n = positiveInteger(options.azimuthBins, 'options.azimuthBins');
    if (n < 16 || (n & (n - 1)) !== 0)
      throw new RangeError(`options.azimuthBins = ${n} must be a power of two ≥ 16`);
  }
  if (options.minPerClass !== undefined)
    positiveInteger(options.minPerClass, 'options.minPerClass');
  for (const field of ['gasKinds', 'youngKinds'] as const) {
    const kinds = options[field];
    if (kinds === undefined) continue;
    if (!Array.isArray(kinds) || kinds.length === 0)
      throw new RangeError(`options.${field} must be a non-empty list of kinds`);
    for (const k of kinds)
      if (!KINDS.has(k)) throw new RangeError(`options.${field} holds unknown kind ${String(k)}`);
  }
  const gas = new Set(options.gasKinds ?? DEFAULT_GAS_KINDS);
  for (const k of options.youngKinds ?? DEFAULT_YOUNG_KINDS)
    if (gas.has(k))
      throw new RangeError(`kind ${k} is in both options.gasKinds and options.youngKinds`);
  if (options.armModel) validateArms(options.armModel, 'options.armModel');
  if (options.armsFrom !== undefined && options.armsFrom !== 'gas' && options.armsFrom !== 'young')
    throw new RangeError(`options.armsFrom = ${String(options.armsFrom)} must be 'gas' or 'young'`);
}

/** Sources as columns, checked; throws RangeError naming the source (1-based) and field. */
export function sourceColumns(
  sources: ExternalSource[] | ExternalSourceColumns,
): ExternalSourceColumns {
  const cols = Array.isArray(sources)
    ? {
        raDeg: Float64Array.from(sources, (s) => s.raDeg),
        decDeg: Float64Array.from(sources, (s) => s.decDeg),
        kind: sources.map((s) => s.kind),
      }
    : sources;
  const n = cols.raDeg.length;
  if (cols.decDeg.length !== n || cols.kind.length !== n)
    throw new RangeError(
      `sources: raDeg (${n}), decDeg (${cols.decDeg.length}) and kind (${cols.kind.length}) differ in length`,
    );
  for (let i = 0; i < n; i++) {
    within(cols.raDeg[i], `sources[${i + 1}].raDeg`, 0, 360, true);
    within(cols.decDeg[i], `sources[${i + 1}].decDeg`, -90, 90);
    if (!KINDS.has(cols.kind[i]))
      throw new RangeError(`sources[${i + 1}].kind = ${String(cols.kind[i])} is not a tracer kind`);
  }
  return cols;
}
