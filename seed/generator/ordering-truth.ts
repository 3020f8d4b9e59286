/**
 * The realized ordering of a generated galaxy across its arms, measured at the TRUE positions of
 * complex members (the offsets `offsetFromArms` gave each source): per class the median
 * perpendicular offset from the ridge, the young-star minus gas separation overall and on each
 * side of corotation, the azimuthal young-minus-gas offset Δφ per radial bin, and the effective
 * timescale that a fit of Δφ(R) = (Ω(R) − Ω_p)·t (Egusa et al. 2004, PASJ 56, L45) should
 * recover. Gas = HI + CO members, young = HII + OB members; offsets positive ahead in the sense
 * of rotation.
 */
import { median } from '@/lib/stats/summary';
import type { TracerCatalog } from './catalog';
import type { GalaxyModel } from './model';
import type { Tracer } from './params';

/** Median perpendicular offsets (kpc) of one class's complex members: all, and each side of corotation. */
export type ClassPerpOffsets = {
  all: number | null;
  insideCorotation: number | null;
  outsideCorotation: number | null;
};

/** Young-minus-gas offsets of the members with R in [RMinKpc, RMaxKpc). */
export type RadialOrderingBin = {
  RMinKpc: number;
  RMaxKpc: number;
  /** Median R (kpc) of the gas and young members in the bin. */
  medianRKpc: number | null;
  nGas: number;
  nYoung: number;
  /** Median azimuth offset (deg) of young members minus that of gas members. */
  dPhiDeg: number | null;
  /** The same for perpendicular offsets (kpc). */
  dPerpKpc: number | null;
};

/** The ordering truth; every median is null where its sample is empty. */
export type OrderingTruth = {
  perClassPerpKpc: Record<Tracer, ClassPerpOffsets>;
  /** median(young perp) − median(gas perp), kpc, over all members. */
  youngMinusGasPerpKpc: number | null;
  /** The same inside corotation (R < corotationKpc; all members when there is no corotation). */
  youngMinusGasPerpKpcInside: number | null;
  /** The same outside corotation (R ≥ corotationKpc). */
  youngMinusGasPerpKpcOutside: number | null;
  /** Δφ young minus gas per 1-kpc bin of R from 4 to 14 kpc. */
  youngMinusGasAzimuthDeg: RadialOrderingBin[];
  /** Median phase (Myr) of young members minus that of gas members. */
  effectiveTimescaleMyr: number | null;
  patternSpeedKmsKpc: number;
  corotationKpc: number | null;
};

const GAS: readonly Tracer[] = ['HI', 'CO'];
const YOUNG: readonly Tracer[] = ['HII', 'OB'];
/** Radial bins for the Δφ(R) truth: 1 kpc wide from 4 to 14 kpc. */
const BIN_MIN_KPC = 4;
const BIN_MAX_KPC = 14;
const BIN_WIDTH_KPC = 1;

function medianOrNull(values: number[]): number | null {
  return values.length === 0 ? null : median(values);
}

function difference(a: number | null, b: number | null): number | null {
  return a === null || b === null ? null : a - b;
}

/** Values of `column` over the complex members of `classes` whose R passes `keep`. */
function memberValues(
  catalogs: Record<Tracer, TracerCatalog>,
  classes: readonly Tracer[],
  column: 'perpOffsetKpc' | 'azimuthOffsetDeg' | 'phaseMyr' | 'RKpc',
  keep: (RKpc: number) => boolean,
): number[] {
  const out: number[] = [];
  for (const t of classes) {
    const cat = catalogs[t];
    for (let i = 0; i < cat.count; i++) {
      if (cat.complexId[i] >= 0 && keep(cat.RKpc[i])) out.push(cat[column][i]);
    }
  }
  return out;
}

/** Builds the ordering truth from the generated catalogs (their truth columns). */
export function orderingTruth(
  model: GalaxyModel,
  catalogs: Record<Tracer, TracerCatalog>,
): OrderingTruth {
  const rc = model.corotationKpc;
  const all = () => true;
  const inside = (R: number) => rc === null || R < rc;
  const outside = (R: number) => rc !== null && R >= rc;
  const perp = (classes: readonly Tracer[], keep: (R: number) => boolean) =>
    medianOrNull(memberValues(catalogs, classes, 'perpOffsetKpc', keep));
  const youngMinusGas = (keep: (R: number) => boolean) =>
    difference(perp(YOUNG, keep), perp(GAS, keep));

  const perClassPerpKpc = {} as Record<Tracer, ClassPerpOffsets>;
  for (const t of [...GAS, ...YOUNG]) {
    perClassPerpKpc[t] = {
      all: perp([t], all),
      insideCorotation: perp([t], inside),
      outsideCorotation: perp([t], outside),
    };
  }

  const bins: RadialOrderingBin[] = [];
  for (let lo = BIN_MIN_KPC; lo < BIN_MAX_KPC; lo += BIN_WIDTH_KPC) {
    const hi = lo + BIN_WIDTH_KPC;
    const inBin = (R: number) => R >= lo && R < hi;
    const azGas = memberValues(catalogs, GAS, 'azimuthOffsetDeg', inBin);
    const azYoung = memberValues(catalogs, YOUNG, 'azimuthOffsetDeg', inBin);
    bins.push({
      RMinKpc: lo,
      RMaxKpc: hi,
      medianRKpc: medianOrNull(memberValues(catalogs, [...GAS, ...YOUNG], 'RKpc', inBin)),
      nGas: azGas.length,
      nYoung: azYoung.length,
      dPhiDeg: difference(medianOrNull(azYoung), medianOrNull(azGas)),
      dPerpKpc: youngMinusGas(inBin),
    });
  }

  return {
    perClassPerpKpc,
    youngMinusGasPerpKpc: youngMinusGas(all),
    youngMinusGasPerpKpcInside: youngMinusGas(inside),
    youngMinusGasPerpKpcOutside: youngMinusGas(outside),
    youngMinusGasAzimuthDeg: bins,
    effectiveTimescaleMyr: difference(
      medianOrNull(memberValues(catalogs, YOUNG, 'phaseMyr', all)),
      medianOrNull(memberValues(catalogs, GAS, 'phaseMyr', all)),
    ),
    patternSpeedKmsKpc: model.params.patternSpeedKmsKpc,
    corotationKpc: rc,
  };
}
