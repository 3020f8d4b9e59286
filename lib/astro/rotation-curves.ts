/**
 * Galactic rotation curves Θ(R): circular speed (km/s) against Galactocentric radius R (kpc),
 * each with the Sun–centre distance R0 it was fitted with and, where the fit had one, the
 * kinematic frame it was fitted in. Every curve here has an angular speed Θ(R)/R that falls
 * with R, which is what makes kinematic distances single-valued on each side of the tangent
 * point. Sources and check values: docs/methods.md, "Rotation curves".
 */

import type { SolarMotion } from './velocity';

/** Names of the available rotation-curve models. */
export type RotationCurveName =
  'flat' | 'brand-blitz-1993' | 'clemens-1985' | 'reid-2014' | 'reid-2019' | 'table';

/**
 * The frame a curve was fitted in (Reid et al. 2009, 2014): the Sun's motion relative to the
 * curve's LSR, and the mean peculiar motion of the fitted sources at their own position,
 * `sourceUKms` toward the Galactic centre and `sourceVKms` in the sense of rotation (km/s).
 */
export type CurveFrame = { solarMotion: SolarMotion; sourceUKms: number; sourceVKms: number };

/**
 * A rotation curve with its constants. `theta0Kms` is the Θ0 of the LSR formula
 * v_LSR = R0 sin l cos b (Θ(R)/R − Θ0/R0): Θ(R0) for the universal curves and tables, the
 * formula's own Θ0 for 'flat', 'brand-blitz-1993' and 'clemens-1985', as those curves are used
 * in practice. `frame` is null for curves meant for standard-LSR velocities as they are.
 */
export interface RotationCurve {
  name: RotationCurveName;
  label: string;
  source: string;
  R0Kpc: number;
  theta0Kms: number;
  frame: CurveFrame | null;
  /** Published 1σ uncertainty of R0 (kpc); null where the preset's R0 is an adopted standard, not a measurement. */
  R0ErrKpc: number | null;
  /** Published 1σ uncertainty of Θ0 (km/s); null where the preset's Θ0 is an adopted standard, not a measurement. */
  theta0ErrKms: number | null;
  params: Record<string, number>;
  /** Circular speed (km/s) at Galactocentric radius RKpc (kpc, > 0). */
  thetaKms(RKpc: number): number;
  /** The (R kpc, Θ km/s) rows of a 'table' curve. */
  table?: ReadonlyArray<readonly [number, number]>;
}

/** Overrides accepted by {@link makeRotationCurve}. */
export type RotationCurveOverrides = {
  R0Kpc?: number;
  theta0Kms?: number;
  params?: Record<string, number>;
  table?: Array<[number, number]>;
};

type ModelSpec = {
  label: string;
  source: string;
  R0Kpc: number;
  R0ErrKpc: number | null;
  theta0ErrKms: number | null;
  frame: CurveFrame | null;
  /** True where the LSR formula takes the model constant Θ0 rather than Θ(R0). */
  theta0IsConstant: boolean;
  params: Record<string, number>;
  paramNotes: Record<string, string>;
  /** Θ(R) for the given constants. */
  theta: (R0Kpc: number, p: Record<string, number>) => (RKpc: number) => number;
};

function urcReid2014(R0Kpc: number, p: Record<string, number>): (RKpc: number) => number {
  const lambda = (p.a3 / 1.5) ** 5;
  const beta = 0.72 + 0.44 * Math.log10(lambda);
  const a3sq = p.a3 * p.a3;
  const discCoeff = beta * 1.97;
  const haloCoeff = (1 - beta) * (1 + a3sq);
  const xScale = 1 / (p.a2 * R0Kpc);
  return (RKpc) => {
    const x = RKpc * xScale;
    const x2 = x * x;
    const disc = (discCoeff * x ** 1.22) / (x2 + 0.78 * 0.78) ** 1.43;
    return p.a1 * Math.sqrt(disc + (haloCoeff * x2) / (x2 + a3sq));
  };
}

function urcReid2019(R0Kpc: number, p: Record<string, number>): (RKpc: number) => number {
  const lambda = (p.a3 / 1.5) ** 5;
  const logLambda = Math.log10(lambda);
  const expTerm = Math.exp(-0.4 * lambda);
  const lambda04 = lambda ** 0.4;
  const amplitude =
    (p.scale * 200 * lambda ** 0.41) /
    Math.sqrt(0.8 + 0.49 * logLambda + (0.75 * expTerm) / (0.47 + 2.25 * lambda04));
  const discCoeff = (0.72 + 0.44 * logLambda) * 1.97;
  const haloCoeff = 1.6 * expTerm;
  const haloCore = 2.25 * lambda04;
  const rhoScale = 1 / (p.a2 * R0Kpc);
  return (RKpc) => {
    const rho = RKpc * rhoScale;
    const rho2 = rho * rho;
    const disc = (discCoeff * rho ** 1.22) / (rho2 + 0.61) ** 1.43;
    return amplitude * Math.sqrt(disc + (haloCoeff * rho2) / (rho2 + haloCore));
  };
}

// Clemens (1985), Table 3, for R0 = 8.5 kpc, Θ0 = 220 km/s: Θ(R) = Σ c_i R^i in four ranges of R/R0.
const CLEMENS_INNER = [0, 3069.81, -15809.8, 43980.1, -68287.3, 54904, -17731];
const CLEMENS_MIDDLE = [325.0912, -248.1467, 231.87099, -110.73531, 25.073006, -2.110625];
const CLEMENS_OUTER = [
  -2342.6564, 2507.60391, -1024.06876, 224.562732, -28.4080026, 2.0697271, -0.08050808, 0.00129348,
];
const CLEMENS_FAR_KMS = 234.88;

function polynomial(coeffs: readonly number[], x: number): number {
  let sum = 0;
  for (let i = coeffs.length - 1; i >= 0; i--) sum = sum * x + coeffs[i];
  return sum;
}

/** Clemens (1985) Θ (km/s) at R (kpc) for his R0 = 8.5 kpc, Θ0 = 220 km/s. */
function clemensTheta(RKpc: number): number {
  const x = RKpc / 8.5;
  if (x < 0.09) return polynomial(CLEMENS_INNER, RKpc);
  if (x < 0.45) return polynomial(CLEMENS_MIDDLE, RKpc);
  if (x < 1.6) return polynomial(CLEMENS_OUTER, RKpc);
  return CLEMENS_FAR_KMS;
}

// The IAU 1985 standard values are adopted by resolution, without an uncertainty (Kerr & Lynden-Bell 1986).
const IAU_1985 = { R0Kpc: 8.5, R0ErrKpc: null, theta0ErrKms: null } as const;

const MODELS: Record<Exclude<RotationCurveName, 'table'>, ModelSpec> = {
  flat: {
    label: 'Flat rotation curve',
    source:
      'Θ = Θ0 everywhere; R0 = 8.5 kpc, Θ0 = 220 km/s are the IAU 1985 standard values (Kerr & Lynden-Bell 1986, MNRAS 221, 1023, abstract), adopted without an uncertainty',
    ...IAU_1985,
    frame: null,
    theta0IsConstant: true,
    params: { theta0Kms: 220 },
    paramNotes: { theta0Kms: 'Θ0, the constant circular speed (km/s)' },
    theta: (_R0, p) => () => p.theta0Kms,
  },
  'brand-blitz-1993': {
    label: 'Brand & Blitz (1993)',
    source:
      'Brand & Blitz (1993), A&A 275, 67, their fitted outer rotation curve: Θ/Θ0 = a1 (R/R0)^a2 + a3, a1 = 1.0074, a2 = 0.0382, a3 = 0.00698, for the IAU 1985 values R0 = 8.5 kpc, Θ0 = 220 km/s. Convention: Θ0 = 220 km/s in the v_LSR formula, as the curve is used in practice (the fit itself gives Θ(R0) = 223.16 km/s). Standard-LSR velocities are used as they are. Coefficients as commonly tabulated; not checked against the original paper here',
    ...IAU_1985,
    frame: null,
    theta0IsConstant: true,
    params: { a1: 1.0074, a2: 0.0382, a3: 0.00698, theta0Kms: 220 },
    paramNotes: {
      a1: 'a1 (dimensionless)',
      a2: 'a2, power-law index',
      a3: 'a3 (dimensionless)',
      theta0Kms: 'Θ0 of the formula and of the v_LSR formula (km/s)',
    },
    theta: (R0, p) => (R) => p.theta0Kms * (p.a1 * (R / R0) ** p.a2 + p.a3),
  },
  'clemens-1985': {
    label: 'Clemens (1985)',
    source:
      'Clemens (1985), ApJ 295, 422, Table 3: polynomial fits of Θ(R) in four ranges of R/R0 (0–0.09, 0.09–0.45, 0.45–1.6, beyond: 234.88 km/s) for the IAU 1985 values R0 = 8.5 kpc, Θ0 = 220 km/s. Convention: Θ0 = 220 km/s in the v_LSR formula (the polynomial gives Θ(R0) = 218.96 km/s); another R0 or Θ0 scales R by R0/8.5 and Θ by Θ0/220. The coefficients are the widely reproduced ones and were not checked against the original table here; they join to within 0.05 km/s at the range boundaries. Standard-LSR velocities are used as they are',
    ...IAU_1985,
    frame: null,
    theta0IsConstant: true,
    params: { theta0Kms: 220 },
    paramNotes: { theta0Kms: 'Θ0 of the v_LSR formula (km/s); Θ scales with it' },
    theta: (R0, p) => (R) => (p.theta0Kms / 220) * clemensTheta((R * 8.5) / R0),
  },
  'reid-2014': {
    label: 'Universal rotation curve, Reid et al. (2014)',
    source:
      'Persic, Salucci & Stel (1996) universal rotation curve, eqs. 8–11, with model A5 of Reid et al. (2014), ApJ 783, 130, Table 4: a1 = 241 km/s, a2 = 0.90, a3 = 1.46, R0 = 8.34 ± 0.16 kpc, Θ0 = 240 ± 8 km/s, solar motion (U⊙, V⊙, W⊙) = (10.7, 15.6, 8.9) km/s and mean source peculiar motion (U_s, V_s) = (2.9, −1.6) km/s. Standard-LSR velocities are moved into this frame (solar motion and V_s; U_s is not applied, as its projection depends on the distance) before the distance is solved. R0, Θ0 and their uncertainties are as in the abstract; the solar and source motions agree with a published copy of model A5 except V_s, given there as −1.5 km/s: V_s and the table number were not checked against the original here',
    R0Kpc: 8.34,
    R0ErrKpc: 0.16,
    theta0ErrKms: 8,
    frame: {
      solarMotion: { uKms: 10.7, vKms: 15.6, wKms: 8.9 },
      sourceUKms: 2.9,
      sourceVKms: -1.6,
    },
    theta0IsConstant: false,
    params: { a1: 241, a2: 0.9, a3: 1.46 },
    paramNotes: {
      a1: 'a1, amplitude (km/s)',
      a2: 'a2 = R_opt/R0',
      a3: 'a3 = 1.5 (L/L*)^0.2',
    },
    theta: urcReid2014,
  },
  'reid-2019': {
    label: 'Universal rotation curve, Reid et al. (2019)',
    source:
      'Persic, Salucci & Stel (1996) form with the amplitude set by λ, as used by Reid et al. (2019), ApJ 885, 131, with the A5 model refit for kinematic distances (Wenger et al.): a2 = 0.977, a3 = 1.623, R0 = 8.166 kpc; Reid et al. (2019) give R0 = 8.15 ± 0.15 kpc, Θ0 = 236 ± 7 km/s (abstract). Solar motion (U⊙, V⊙, W⊙) = (10.6, 10.7, 7.6) km/s and mean source peculiar motion (U_s, V_s) = (6.0, −4.3) km/s of model A5 (Table 3); standard-LSR velocities are moved into this frame (solar motion and V_s; U_s is not applied) before the distance is solved. The solar and source motions were not checked against the original table here, and the refit at R0 = 8.166 kpc has its own, slightly different, motions',
    R0Kpc: 8.166,
    R0ErrKpc: 0.15,
    theta0ErrKms: 7,
    frame: {
      solarMotion: { uKms: 10.6, vKms: 10.7, wKms: 7.6 },
      sourceUKms: 6.0,
      sourceVKms: -4.3,
    },
    theta0IsConstant: false,
    params: { a2: 0.977, a3: 1.623, scale: 1 },
    paramNotes: {
      a2: 'a2 = R_opt/R0',
      a3: 'a3 = 1.5 (L/L*)^0.2',
      scale: 'overall factor on Θ (1 = published curve)',
    },
    theta: urcReid2019,
  },
};

const TABLE_SPEC = {
  label: 'Tabulated rotation curve',
  source:
    'user table: linear interpolation in R; Θ held at the first value inside the first row and at the last value beyond the last row',
  R0Kpc: 8.5,
};

/** One entry per curve name, for forms: label, source, default R0 and Θ(R0), and the model constants with notes. */
export type RotationCurvePreset = {
  name: RotationCurveName;
  label: string;
  source: string;
  R0Kpc: number;
  theta0Kms: number | null;
  R0ErrKpc: number | null;
  theta0ErrKms: number | null;
  params: Record<string, number>;
  paramNotes: Record<string, string>;
};

function tableTheta(rows: ReadonlyArray<readonly [number, number]>, RKpc: number): number {
  const n = rows.length;
  if (RKpc <= rows[0][0]) return rows[0][1];
  if (RKpc >= rows[n - 1][0]) return rows[n - 1][1];
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (rows[mid][0] <= RKpc) lo = mid;
    else hi = mid;
  }
  const [r0, t0] = rows[lo];
  const [r1, t1] = rows[hi];
  return t0 + ((t1 - t0) * (RKpc - r0)) / (r1 - r0);
}

function validateTable(
  table: Array<[number, number]> | undefined,
): ReadonlyArray<readonly [number, number]> {
  if (!table || table.length < 2) {
    throw new RangeError('a table rotation curve needs at least two (R kpc, Θ km/s) rows');
  }
  const rows = table.map(([R, t]) => [R, t] as const);
  rows.forEach(([R, t], i) => {
    if (!Number.isFinite(R) || R <= 0)
      throw new RangeError(`rotation table row ${i + 1}: R = ${R} kpc must be positive`);
    if (!Number.isFinite(t) || t <= 0)
      throw new RangeError(`rotation table row ${i + 1}: Θ = ${t} km/s must be positive`);
    if (i > 0 && R <= rows[i - 1][0]) {
      throw new RangeError(
        `rotation table row ${i + 1}: R = ${R} kpc must exceed the previous row's ${rows[i - 1][0]} kpc`,
      );
    }
    if (i > 0 && t / R >= rows[i - 1][1] / rows[i - 1][0]) {
      throw new RangeError(
        `rotation table row ${i + 1}: Θ/R = ${(t / R).toFixed(3)} km/s/kpc does not fall below the previous row's ${(rows[i - 1][1] / rows[i - 1][0]).toFixed(3)}; kinematic distances need Θ/R to decrease with R`,
      );
    }
  });
  return Object.freeze(rows);
}

function positive(name: string, value: number | undefined, fallback: number): number {
  const v = value ?? fallback;
  if (!Number.isFinite(v) || v <= 0)
    throw new RangeError(`${name} = ${v} must be a positive number`);
  return v;
}

/**
 * Builds a rotation curve by name with optional overrides. R0Kpc replaces the model's R0.
 * `params` replaces named model constants (unknown names are rejected). `theta0Kms` is the Θ0
 * of the LSR formula: for 'flat', 'brand-blitz-1993' and 'clemens-1985' it replaces the model's
 * own Θ0 constant (Θ scales with it); for 'reid-2014', 'reid-2019' and 'table' the curve is
 * rescaled so that Θ(R0) equals it. `table` gives the rows of a 'table'
 * curve (R strictly increasing, Θ/R strictly decreasing). The returned object is frozen.
 */
export function makeRotationCurve(
  name: RotationCurveName,
  overrides: RotationCurveOverrides = {},
): RotationCurve {
  if (name === 'table') {
    const rows = validateTable(overrides.table);
    const R0Kpc = positive('R0Kpc', overrides.R0Kpc, TABLE_SPEC.R0Kpc);
    const raw0 = tableTheta(rows, R0Kpc);
    const scale =
      overrides.theta0Kms === undefined
        ? 1
        : positive('theta0Kms', overrides.theta0Kms, raw0) / raw0;
    return Object.freeze({
      name,
      label: TABLE_SPEC.label,
      source: TABLE_SPEC.source,
      R0Kpc,
      theta0Kms: raw0 * scale,
      R0ErrKpc: null,
      theta0ErrKms: null,
      frame: null,
      params: Object.freeze({ scale }),
      table: rows,
      thetaKms: (RKpc: number) => scale * tableTheta(rows, RKpc),
    });
  }
  const spec = MODELS[name];
  if (!spec) throw new RangeError(`unknown rotation curve ${JSON.stringify(name)}`);
  const params: Record<string, number> = { ...spec.params };
  for (const [key, value] of Object.entries(overrides.params ?? {})) {
    if (!(key in spec.params)) {
      throw new RangeError(
        `rotation curve ${name} has no constant ${JSON.stringify(key)} (known: ${Object.keys(spec.params).join(', ')})`,
      );
    }
    if (!Number.isFinite(value))
      throw new RangeError(`rotation curve ${name}: ${key} = ${value} is not a finite number`);
    params[key] = value;
  }
  const R0Kpc = positive('R0Kpc', overrides.R0Kpc, spec.R0Kpc);
  if (overrides.theta0Kms !== undefined) {
    const target = positive('theta0Kms', overrides.theta0Kms, 0);
    if (spec.theta0IsConstant) params.theta0Kms = target;
    else {
      const key = name === 'reid-2014' ? 'a1' : 'scale';
      params[key] *= target / spec.theta(R0Kpc, params)(R0Kpc);
    }
  }
  Object.freeze(params);
  const theta = spec.theta(R0Kpc, params);
  const thetaAtR0 = theta(R0Kpc);
  if (!Number.isFinite(thetaAtR0) || thetaAtR0 <= 0) {
    throw new RangeError(`rotation curve ${name}: these constants give Θ(R0) = ${thetaAtR0} km/s`);
  }
  const theta0Kms = spec.theta0IsConstant ? params.theta0Kms : thetaAtR0;
  return Object.freeze({
    name,
    label: spec.label,
    source: spec.source,
    R0Kpc,
    theta0Kms,
    R0ErrKpc: spec.R0ErrKpc,
    theta0ErrKms: spec.theta0ErrKms,
    frame: spec.frame,
    params,
    thetaKms: (RKpc: number) => (RKpc > 0 ? theta(RKpc) : 0),
  });
}

/**
 * The same curve (model, constants, table) with R0 and the Θ0 of the LSR formula replaced, for
 * Monte Carlo over the Galactic constants. The model keeps its own dependence on R0 (R/R0 in
 * Brand & Blitz, R/(a2 R0) in the universal curve); Θ0 follows the rule of
 * {@link makeRotationCurve}'s `theta0Kms` override. The published uncertainties are kept.
 */
export function curveWithConstants(
  curve: RotationCurve,
  R0Kpc: number,
  theta0Kms: number,
): RotationCurve {
  if (!(R0Kpc > 0) || !Number.isFinite(R0Kpc))
    throw new RangeError(`curveWithConstants: R0Kpc = ${R0Kpc} must be a positive number`);
  if (!(theta0Kms > 0) || !Number.isFinite(theta0Kms))
    throw new RangeError(`curveWithConstants: theta0Kms = ${theta0Kms} must be a positive number`);
  if (curve.name === 'table') {
    return makeRotationCurve('table', {
      R0Kpc,
      theta0Kms,
      table: (curve.table ?? []).map(([R, t]) => [R, t]),
    });
  }
  return makeRotationCurve(curve.name, { R0Kpc, theta0Kms, params: { ...curve.params } });
}

/** Names, labels, sources and default constants of every curve, for settings forms. */
export const ROTATION_CURVE_PRESETS: ReadonlyArray<RotationCurvePreset> = Object.freeze([
  ...(Object.keys(MODELS) as Array<Exclude<RotationCurveName, 'table'>>).map((name) => {
    const spec = MODELS[name];
    return {
      name,
      label: spec.label,
      source: spec.source,
      R0Kpc: spec.R0Kpc,
      theta0Kms: makeRotationCurve(name).theta0Kms,
      R0ErrKpc: spec.R0ErrKpc,
      theta0ErrKms: spec.theta0ErrKms,
      params: { ...spec.params },
      paramNotes: { ...spec.paramNotes },
    };
  }),
  {
    name: 'table' as const,
    label: TABLE_SPEC.label,
    source: TABLE_SPEC.source,
    R0Kpc: TABLE_SPEC.R0Kpc,
    theta0Kms: null,
    R0ErrKpc: null,
    theta0ErrKms: null,
    params: {},
    paramNotes: {},
  },
]);

/** Angular speed Ω = Θ(R)/R (km/s/kpc) of a curve at radius RKpc (kpc). */
export function angularSpeedKmsKpc(RKpc: number, curve: RotationCurve): number {
  return curve.thetaKms(RKpc) / RKpc;
}
