/**
 * Options of {@link generateGalaxy}: the seed, how many complexes and interlopers (directly, by a
 * scale factor, or from a target total row count), and optional model overrides. Validation
 * throws {@link GeneratorOptionError} naming the option and the offending value.
 */
import { DEFAULT_MODEL, TRACERS, type ModelParams } from './params';

/** What the caller may set; everything but the seed has a default. */
export type GalaxyOptions = {
  /** Seed of the deterministic generator (an integer). */
  seed: number;
  /** Star-forming complexes (default 300), multiplied by `scale`. */
  complexes?: number;
  /** Sources in no complex, shared among the classes (default 200), multiplied by `scale`. */
  interlopers?: number;
  /** Factor applied to `complexes` and `interlopers` (default 1). */
  scale?: number;
  /**
   * Target total number of rows over the four catalogs. Complexes are added until their members
   * fill about 85 % of it, interlopers fill the rest exactly. Excludes `complexes`,
   * `interlopers` and `scale`.
   */
  rows?: number;
  /** Model overrides, merged shallowly over {@link DEFAULT_MODEL}. */
  model?: Partial<ModelParams>;
};

/** Options after defaults and validation. */
export type ResolvedOptions = {
  seed: number;
  /** Either fixed counts, or a row target. */
  counts:
    { mode: 'fixed'; complexes: number; interlopers: number } | { mode: 'rows'; rows: number };
  model: ModelParams;
};

/** Thrown for an invalid option; the message names the option and the value. */
export class GeneratorOptionError extends Error {
  constructor(
    readonly option: string,
    readonly value: unknown,
    reason: string,
  ) {
    super(`Invalid option ${option} = ${JSON.stringify(value)}: ${reason}`);
    this.name = 'GeneratorOptionError';
  }
}

export const DEFAULT_COMPLEXES = 300;
export const DEFAULT_INTERLOPERS = 200;
/** Upper bound on rows, to fail clearly rather than run out of memory. */
export const MAX_ROWS = 50_000_000;

function nonNegativeInteger(option: string, value: number): number {
  if (!Number.isInteger(value) || value < 0 || value > MAX_ROWS) {
    throw new GeneratorOptionError(option, value, `must be an integer from 0 to ${MAX_ROWS}`);
  }
  return value;
}

/** Applies defaults and checks every option; throws {@link GeneratorOptionError} on the first bad one. */
export function resolveOptions(options: GalaxyOptions): ResolvedOptions {
  if (!Number.isSafeInteger(options.seed)) {
    throw new GeneratorOptionError('seed', options.seed, 'must be an integer');
  }
  const model: ModelParams = { ...DEFAULT_MODEL, ...options.model };
  checkModel(model);
  if (options.rows !== undefined) {
    for (const other of ['complexes', 'interlopers', 'scale'] as const) {
      if (options[other] !== undefined) {
        throw new GeneratorOptionError('rows', options.rows, `cannot be combined with ${other}`);
      }
    }
    const rows = nonNegativeInteger('rows', options.rows);
    if (rows < 1) throw new GeneratorOptionError('rows', rows, 'must be at least 1');
    return { seed: options.seed, counts: { mode: 'rows', rows }, model };
  }
  const scale = options.scale ?? 1;
  if (!Number.isFinite(scale) || scale <= 0) {
    throw new GeneratorOptionError('scale', scale, 'must be a positive number');
  }
  const complexes = nonNegativeInteger('complexes', options.complexes ?? DEFAULT_COMPLEXES);
  const interlopers = nonNegativeInteger('interlopers', options.interlopers ?? DEFAULT_INTERLOPERS);
  return {
    seed: options.seed,
    counts: {
      mode: 'fixed',
      complexes: nonNegativeInteger('complexes × scale', Math.round(complexes * scale)),
      interlopers: nonNegativeInteger('interlopers × scale', Math.round(interlopers * scale)),
    },
    model,
  };
}

function checkModel(model: ModelParams): void {
  if (!(model.patternSpeedKmsKpc > 0)) {
    throw new GeneratorOptionError(
      'model.patternSpeedKmsKpc',
      model.patternSpeedKmsKpc,
      'must be positive',
    );
  }
  if (model.arms.length === 0) {
    throw new GeneratorOptionError('model.arms', model.arms.length, 'needs at least one arm');
  }
  for (const key of ['R0Kpc', 'theta0Kms', 'turnoverKpc', 'stepKpc', 'maxKpc'] as const) {
    if (!(model.curve[key] > 0)) {
      throw new GeneratorOptionError(`model.curve.${key}`, model.curve[key], 'must be positive');
    }
  }
  const { phase } = model;
  if (!(phase.maxAgeMyr > 0)) {
    throw new GeneratorOptionError('model.phase.maxAgeMyr', phase.maxAgeMyr, 'must be positive');
  }
  if (!(phase.starFormationDelayMyr >= 0)) {
    throw new GeneratorOptionError(
      'model.phase.starFormationDelayMyr',
      phase.starFormationDelayMyr,
      'must be zero or positive',
    );
  }
  if (!(phase.gasAtDelay > 0 && phase.gasAtDelay <= 1)) {
    throw new GeneratorOptionError(
      'model.phase.gasAtDelay',
      phase.gasAtDelay,
      'must lie in (0, 1] (a share of the initial gas)',
    );
  }
  if (!(phase.gasDispersalMyr > 0)) {
    throw new GeneratorOptionError(
      'model.phase.gasDispersalMyr',
      phase.gasDispersalMyr,
      'must be positive (Infinity keeps the gas)',
    );
  }
  const shareSum = TRACERS.reduce((sum, t) => sum + model.tracers[t].interloperShare, 0);
  if (Math.abs(shareSum - 1) > 1e-9) {
    throw new GeneratorOptionError(
      'model.tracers.*.interloperShare',
      shareSum,
      'shares must sum to 1',
    );
  }
  if (!(model.interloperMaxRKpc > model.interloperMinRKpc && model.interloperMinRKpc >= 0)) {
    throw new GeneratorOptionError(
      'model.interloperMinRKpc..interloperMaxRKpc',
      [model.interloperMinRKpc, model.interloperMaxRKpc],
      'must be an increasing, non-negative range',
    );
  }
}
