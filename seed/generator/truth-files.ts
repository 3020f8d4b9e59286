/**
 * Per-source truth as CSV: one file per catalog, row k describing row k of the catalog file
 * (same name), and one file of complexes. Angles and lengths keep 9 decimals (1e-9 deg,
 * 1e-9 kpc), velocities and times 6, so recomputing a source's position from its written
 * coordinates and true distance matches to far below the catalog's own rounding.
 */
import type { ComplexTable } from './complexes';
import type { TracerCatalog } from './catalog';
import { sourceName } from './layouts';
import type { ModelParams } from './params';
import { TRACERS } from './params';

/** Fixed-point text with `digits` decimals ('' for NaN); toFixed is the fastest exact-enough format. */
function fix(x: number, digits: number): string {
  return Number.isFinite(x) ? x.toFixed(digits) : '';
}
const ANGLE = 9;
const LENGTH = 9;
const SPEED = 6;
const TIME = 6;

/** Columns of a per-catalog truth CSV, with units. */
export const SOURCE_TRUTH_COLUMNS = [
  'name',
  'complex_id',
  'l_deg',
  'b_deg',
  'dist_kpc',
  'x_kpc',
  'y_kpc',
  'z_kpc',
  'R_kpc',
  'beta_deg',
  'arm_index',
  'arm_name',
  'perp_offset_kpc',
  'azimuth_offset_deg',
  'phase_myr',
  'v_circ_kms',
  'v_stream_kms',
  'v_random_kms',
  'v_lsr_true_kms',
  'v_err_kms',
  'size_pc',
] as const;

/** Header and line maker of the truth CSV of `cat`. */
export function sourceTruthRows(
  cat: TracerCatalog,
  model: ModelParams,
): { header: string; line: (i: number) => string } {
  return {
    header: SOURCE_TRUTH_COLUMNS.join(','),
    line: (i) =>
      [
        sourceName(cat.tracer, i, cat.count),
        cat.complexId[i],
        fix(cat.lDeg[i], ANGLE),
        fix(cat.bDeg[i], ANGLE),
        fix(cat.distKpc[i], LENGTH),
        fix(cat.xKpc[i], LENGTH),
        fix(cat.yKpc[i], LENGTH),
        fix(cat.zKpc[i], LENGTH),
        fix(cat.RKpc[i], LENGTH),
        fix(cat.betaDeg[i], ANGLE),
        cat.armIndex[i],
        model.arms[cat.armIndex[i]].name,
        fix(cat.perpOffsetKpc[i], LENGTH),
        fix(cat.azimuthOffsetDeg[i], ANGLE),
        fix(cat.phaseMyr[i], TIME),
        fix(cat.vCircKms[i], SPEED),
        fix(cat.vStreamKms[i], SPEED),
        fix(cat.vRandomKms[i], SPEED),
        fix(cat.vCircKms[i] + cat.vStreamKms[i] + cat.vRandomKms[i], SPEED),
        fix(cat.vErrKms[i], SPEED),
        fix(cat.sizePc[i], SPEED),
      ].join(','),
  };
}

/** Columns of the complexes truth CSV, with units. */
export const COMPLEX_TRUTH_COLUMNS = [
  'complex_id',
  'arm_index',
  'arm_name',
  'R_kpc',
  'beta_ridge_deg',
  'beta_deg',
  'x_kpc',
  'y_kpc',
  'z_kpc',
  'age_myr',
  'phase_myr',
  'azimuth_offset_deg',
  'v_random_kms',
  ...TRACERS.map((t) => `n_${t.toLowerCase()}`),
] as const;

/** Header and line maker of the complexes truth CSV. */
export function complexTruthRows(
  cx: ComplexTable,
  model: ModelParams,
): { header: string; line: (c: number) => string } {
  return {
    header: COMPLEX_TRUTH_COLUMNS.join(','),
    line: (c) =>
      [
        c,
        cx.armIndex[c],
        model.arms[cx.armIndex[c]].name,
        fix(cx.RKpc[c], LENGTH),
        fix(cx.betaRidgeDeg[c], ANGLE),
        fix(cx.betaDeg[c], ANGLE),
        fix(cx.xKpc[c], LENGTH),
        fix(cx.yKpc[c], LENGTH),
        fix(cx.zKpc[c], LENGTH),
        fix(cx.ageMyr[c], TIME),
        fix(cx.phaseMyr[c], TIME),
        fix(cx.azimuthOffsetDeg[c], ANGLE),
        fix(cx.vRandomKms[c], SPEED),
        ...TRACERS.map((t) => cx.members[t][c]),
      ].join(','),
  };
}
