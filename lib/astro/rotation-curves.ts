/**
 * Galactic rotation curves Θ(R): circular speed (km/s) against Galactocentric radius R (kpc),
 * each with the Sun–centre distance R0 it was fitted with. Every curve here has an angular speed
 * Θ(R)/R that falls with R, which is what makes kinematic distances single-valued on each side
 * of the tangent point.
 */

/** Names of the available rotation-curve models. */
export type RotationCurveName = 'flat' | 'brand-blitz-1993' | 'reid-2014' | 'reid-2019' | 'table';

/**
 * A rotation curve with its constants. `theta0Kms` is always Θ(R0), the value the LSR formula
 * v_LSR = R0 sin l cos b (Θ(R)/R − Θ0/R0) needs; `params` holds the model's own constants.
 */
export interface RotationCurve {
  name: RotationCurveName;
  label: string;
  source: string;
  R0Kpc: number;
  theta0Kms: number;
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

const MODELS: Record<Exclude<RotationCurveName, 'table'>, ModelSpec> = {
  flat: {
    label: 'Flat rotation curve',
    source:
      'Θ = Θ0 everywhere; R0 = 8.5 kpc, Θ0 = 220 km/s are the IAU 1985 recommended values (Kerr & Lynden-Bell 1986), common practice',
    R0Kpc: 8.5,
    // IAU 1985 standard values, adopted by resolution without an uncertainty (Kerr & Lynden-Bell 1986)
    R0ErrKpc: null,
    theta0ErrKms: null,
    params: { theta0Kms: 220 },
    paramNotes: { theta0Kms: 'Θ0, the constant circular speed (km/s)' },
    theta: (_R0, p) => () => p.theta0Kms,
  },
  'brand-blitz-1993': {
    label: 'Brand & Blitz (1993)',
    source:
      'Brand & Blitz (1993), A&A 275, 67: Θ/Θ0 = a1 (R/R0)^a2 + a3 with R0 = 8.5 kpc, Θ0 = 220 km/s',
    R0Kpc: 8.5,
    // the IAU 1985 standard values the fit was made with: adopted, so no 1σ (Kerr & Lynden-Bell 1986)
    R0ErrKpc: null,
    theta0ErrKms: null,
    params: { a1: 1.0074, a2: 0.0382, a3: 0.00698, theta0Kms: 220 },
    paramNotes: {
      a1: 'a1 (dimensionless)',
      a2: 'a2, power-law index',
      a3: 'a3 (dimensionless)',
      theta0Kms: 'Θ0 of the formula (km/s); Θ(R0) = Θ0 (a1 + a3)',
    },
    theta: (R0, p) => (R) => p.theta0Kms * (p.a1 * (R / R0) ** p.a2 + p.a3),
  },
  'reid-2014': {
    label: 'Universal rotation curve, Reid et al. (2014)',
    source:
      'Persic, Salucci & Stel (1996) universal rotation curve, eqs. 8–11, with the constants of Reid et al. (2014), ApJ 783, 130: a1 = 241 km/s, a2 = 0.90, a3 = 1.46, R0 = 8.34 kpc',
    R0Kpc: 8.34,
    // Reid et al. (2014): R0 = 8.34 ± 0.16 kpc, Θ0 = 240 ± 8 km/s
    R0ErrKpc: 0.16,
    theta0ErrKms: 8,
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
      'Persic, Salucci & Stel (1996) form with the amplitude set by λ, as used by Reid et al. (2019), ApJ 885, 131 (A5 model refit for kinematic distances by Wenger et al.): a2 = 0.977, a3 = 1.623, R0 = 8.166 kpc',
    R0Kpc: 8.166,
    // Reid et al. (2019): R0 = 8.15 ± 0.15 kpc, Θ0 = 236 ± 7 km/s
    R0ErrKpc: 0.15,
    theta0ErrKms: 7,
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
 * `params` replaces named model constants (unknown names are rejected). `theta0Kms` means:
 * for 'flat' and 'brand-blitz-1993', the model's own Θ0 constant (for Brand & Blitz, Θ(R0) =
 * Θ0 (a1 + a3) = 223.16 km/s with the published constants); for 'reid-2014', 'reid-2019' and
 * 'table', the curve is rescaled so that Θ(R0) equals it. `table` gives the rows of a 'table'
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
    if (name === 'flat' || name === 'brand-blitz-1993') params.theta0Kms = target;
    else {
      const key = name === 'reid-2014' ? 'a1' : 'scale';
      params[key] *= target / spec.theta(R0Kpc, params)(R0Kpc);
    }
  }
  Object.freeze(params);
  const theta = spec.theta(R0Kpc, params);
  const theta0Kms = theta(R0Kpc);
  if (!Number.isFinite(theta0Kms) || theta0Kms <= 0) {
    throw new RangeError(`rotation curve ${name}: these constants give Θ(R0) = ${theta0Kms} km/s`);
  }
  return Object.freeze({
    name,
    label: spec.label,
    source: spec.source,
    R0Kpc,
    theta0Kms,
    R0ErrKpc: spec.R0ErrKpc,
    theta0ErrKms: spec.theta0ErrKms,
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
