/**
 * The truth record of a generated galaxy: every injected parameter, the conventions of the
 * files, the counts, and the realized per-class offsets from the arm ridges (medians over
 * complex members, split at corotation). Per-source truth lives in the catalogs' truth columns
 * and is written as one CSV per catalog.
 */
import type { ArmSpec } from '@/lib/astro/arms';
import { KMS_KPC_PER_MYR } from '@/lib/astro/pattern-speed';
import { median as sampleMedian } from '@/lib/stats/summary';
import type { ComplexTable } from './complexes';
import type { TracerCatalog } from './catalog';
import type { GalaxyModel } from './model';
import type { ResolvedOptions } from './options';
import { orderingTruth, type OrderingTruth } from './ordering-truth';
import { TRACERS, type ModelParams, type Tracer } from './params';

/** Medians over the complex members of one class on one side of corotation. */
export type OffsetSummary = {
  n: number;
  medianAzimuthOffsetDeg: number | null;
  medianPerpOffsetKpc: number | null;
  medianPhaseMyr: number | null;
};

/** What the truth file holds besides the per-source CSVs (JSON-serializable). */
export type GalaxyTruth = {
  scenario: string;
  seed: number;
  counts: {
    complexes: number;
    interlopers: number;
    rows: number;
    perTracer: Record<Tracer, { rows: number; members: number; interlopers: number }>;
  };
  conventions: Record<string, string>;
  /**
   * The generator's own rotation curve: a 'table' curve of `@/lib/astro/rotation-curves` with
   * these rows (R kpc, Θ km/s) and R0, tabulated from the analytic form stated in `source`
   * with the constants of `model.curve` (`galaxyCurve(truth)` rebuilds it).
   */
  rotationCurve: {
    name: string;
    label: string;
    source: string;
    R0Kpc: number;
    theta0Kms: number;
    params: Record<string, number>;
    table: Array<[number, number]>;
  };
  R0Kpc: number;
  patternSpeedKmsKpc: number;
  corotationKpc: number | null;
  /** 1 km/s/kpc in Myr⁻¹, as used to turn phases into azimuthal offsets. */
  kmsKpcPerMyr: number;
  arms: ArmSpec[];
  model: ModelParams;
  realized: Record<Tracer, { insideCorotation: OffsetSummary; outsideCorotation: OffsetSummary }>;
  /** The realized ordering across the arms at true positions, for checking an analysis. */
  ordering: OrderingTruth;
};

const CONVENTIONS: Record<string, string> = {
  galactocentric:
    'Frame of lib/astro/galactocentric (Reid et al. 2014): Sun at (R0, 0, 0) kpc on +x, l = 90° along −y, z to the north Galactic pole; azimuth β = atan2(−y, x) deg, 0 toward the Sun, increasing with longitude and in the sense of rotation.',
  armOffsets:
    'Per source: offsetFromArms(x, y, arms, R0) of lib/astro/arms at its true position: nearest arm, signed perpendicular offset (kpc) and azimuthal offset at the same R (deg), positive = ahead in the sense of rotation.',
  phase:
    'Phase τ (Myr) of a complex relative to the moment its material crosses the ridge line; its centre lies at Δβ = (Ω(R) − Ω_p)·τ from the ridge at the same R, with 1 km/s/kpc = kmsKpcPerMyr Myr⁻¹ (≈ 1.0227 Gyr⁻¹); the inverse of delayMyr in lib/astro/pattern-speed.',
  velocity:
    'v_LSR (kinematic LSR, radio convention) = vLsrAtKms(l, b, d, curve) [circular rotation] + streaming projected on the line of sight + random line-of-sight motion (complex systemic + member) + measurement error. Truth columns give the first three parts; the model velocities are taken as radio-convention values (they differ from relativistic ones by about v²/2c, ≲ 0.1 km/s here).',
  heliocentric:
    'HII file: V_HEL_OPT = lsrToHelioKms(convertVelocityConvention(v_LSR, radio → optical), l, b) with the kinematic LSR solar motion (U, V, W) = (10.27, 15.32, 7.74) km/s of lib/astro/velocity.',
  sizes:
    'Angular diameter = physical diameter / true distance (small angle). HI SIZE_ARCMIN, HII DIAM_ARCMIN and OB diam are diameters in arcmin; CO radius_arcsec is half the diameter, in arcsec.',
  positions: 'No centroid error is injected: written positions are the true ones, rounded.',
  streaming:
    'In-plane streaming at a point d⊥ (kpc) from the nearest ridge (pitch ψ): δv = −s·V·exp(−½ (d⊥/w)²)·n̂ with V = model.streamingKms, w = model.streamingWidthKpc, n̂ = cos ψ ê_R + sin ψ ê_ahead and s = +1 inside corotation, −1 outside: inside corotation an inflow of V cos ψ and a lag behind rotation of V sin ψ on the ridge (after the shocked flow of Roberts 1969), fading across the arm; projected on the line of sight (truth column v_stream_kms).',
  ordering:
    'ordering.*: medians over complex members at their true positions (offsets from offsetFromArms as in armOffsets); gas = HI + CO members, young = HII + OB members; young minus gas = median(young) − median(gas), positive when the young stars lie ahead of the gas in the sense of rotation. effectiveTimescaleMyr = median phase of young members − median phase of gas members. Radial bins: members with R in [RMinKpc, RMaxKpc).',
};

function median(values: number[]): number | null {
  return values.length === 0 ? null : sampleMedian(values);
}

const CURVE_FORM =
  'Θ(R) = V_a (2/π) arctan(R / turnoverKpc) + outerSlopeKmsKpc (R − R0), V_a such that Θ(R0) = theta0Kms (arctan rise of Courteau 1997, AJ 114, 2402); constants in model.curve, tabulated every model.curve.stepKpc and interpolated linearly';

function summarize(
  cat: TracerCatalog,
  inside: boolean,
  corotationKpc: number | null,
): OffsetSummary {
  const az: number[] = [];
  const perp: number[] = [];
  const phase: number[] = [];
  for (let i = 0; i < cat.count; i++) {
    if (cat.complexId[i] < 0) continue;
    const isInside = corotationKpc === null || cat.RKpc[i] < corotationKpc;
    if (isInside !== inside) continue;
    az.push(cat.azimuthOffsetDeg[i]);
    perp.push(cat.perpOffsetKpc[i]);
    phase.push(cat.phaseMyr[i]);
  }
  return {
    n: az.length,
    medianAzimuthOffsetDeg: median(az),
    medianPerpOffsetKpc: median(perp),
    medianPhaseMyr: median(phase),
  };
}

/** Assembles the truth record from the resolved options, the model and the generated tables. */
export function buildTruth(
  resolved: ResolvedOptions,
  model: GalaxyModel,
  complexes: ComplexTable,
  catalogs: Record<Tracer, TracerCatalog>,
): GalaxyTruth {
  const perTracer = {} as GalaxyTruth['counts']['perTracer'];
  const realized = {} as GalaxyTruth['realized'];
  let rows = 0;
  let interlopers = 0;
  for (const t of TRACERS) {
    const cat = catalogs[t];
    let members = 0;
    for (let i = 0; i < cat.count; i++) if (cat.complexId[i] >= 0) members++;
    perTracer[t] = { rows: cat.count, members, interlopers: cat.count - members };
    rows += cat.count;
    interlopers += cat.count - members;
    realized[t] = {
      insideCorotation: summarize(cat, true, model.corotationKpc),
      outsideCorotation: summarize(cat, false, model.corotationKpc),
    };
  }
  const { curve } = model;
  return {
    scenario: 'Harbor Ridge Radio Group synthetic galaxy (invented demo data)',
    seed: resolved.seed,
    counts: { complexes: complexes.count, interlopers, rows, perTracer },
    conventions: CONVENTIONS,
    rotationCurve: {
      name: curve.name,
      label: 'Demo galaxy rotation curve (generator-own; none of the analysis presets)',
      source: CURVE_FORM,
      R0Kpc: curve.R0Kpc,
      theta0Kms: curve.theta0Kms,
      params: { ...curve.params },
      table: (curve.table ?? []).map(([R, theta]) => [R, theta]),
    },
    R0Kpc: model.R0Kpc,
    patternSpeedKmsKpc: model.params.patternSpeedKmsKpc,
    corotationKpc: model.corotationKpc,
    kmsKpcPerMyr: KMS_KPC_PER_MYR,
    arms: model.params.arms,
    model: model.params,
    realized,
    ordering: orderingTruth(model, catalogs),
  };
}
