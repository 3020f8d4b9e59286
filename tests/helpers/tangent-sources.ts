/**
 * Invented sources along one spiral arm for checking the tangent-point method: complexes spread
 * evenly in β along the ridge, each with its own offset across the arm, holding members of
 * several tracer classes. A class sits on the ridge shifted along its normal (positive ahead in
 * the sense of rotation), or at its gas's positions advanced in azimuth by the drift
 * (Ω(R) − Ω_p) t at each member's own radius — a different picture from the constant normal
 * shift the analysis assumes.
 */
import { shiftedRidgePoint } from '@/lib/astro/arm-tangents';
import type { ArmSpec } from '@/lib/astro/arms';
import {
  ROTATION_SENSE,
  azimuthDeg,
  fromGalactocentric,
  polarToXy,
} from '@/lib/astro/galactocentric';
import { vLsrAtKms } from '@/lib/astro/kinematic-distance';
import { KMS_KPC_PER_MYR } from '@/lib/astro/pattern-speed';
import { angularSpeedKmsKpc, type RotationCurve } from '@/lib/astro/rotation-curves';
import { KIND_INDEX } from '@/lib/ordering/members';
import type { TangentInput } from '@/lib/ordering/tangents';
import type { TracerKind } from '@/lib/ordering/types';
import { makeRng } from '@/lib/stats/rng';

const DEG = Math.PI / 180;

/** One class: members per complex, its normal shift (kpc), and optionally an age (Myr) drifted at patternSpeedKmsKpc. */
export type SourceClass = {
  kind: TracerKind;
  perComplex: number;
  normalOffsetKpc: number;
  driftMyr?: number;
};

export type RidgeSourceOptions = {
  arm: ArmSpec;
  curve: RotationCurve;
  betaFromDeg: number;
  betaToDeg: number;
  complexes: number;
  classes: SourceClass[];
  /** Spread of the complexes across the arm, of members about their complex, and of members along the arm (kpc). */
  acrossSigmaKpc: number;
  memberSigmaKpc: number;
  alongSigmaKpc: number;
  zSigmaKpc: number;
  vSigmaKms: number;
  patternSpeedKmsKpc?: number;
  seed: number;
};

/** Source columns for {@link tangentOffsets}; the complex index is the cluster. */
export function ridgeSources(opt: RidgeSourceOptions): TangentInput {
  const rng = makeRng(opt.seed);
  const R0 = opt.curve.R0Kpc;
  const l: number[] = [];
  const b: number[] = [];
  const v: number[] = [];
  const kind: number[] = [];
  const cluster: number[] = [];
  for (let c = 0; c < opt.complexes; c++) {
    const betaC = opt.betaFromDeg + rng.next() * (opt.betaToDeg - opt.betaFromDeg);
    const across = opt.acrossSigmaKpc * rng.normal();
    for (const cls of opt.classes) {
      for (let m = 0; m < cls.perComplex; m++) {
        const p0 = shiftedRidgePoint(opt.arm, betaC, 0);
        const betaM =
          betaC + (opt.alongSigmaKpc * rng.normal()) / Math.hypot(p0.xKpc, p0.yKpc) / DEG;
        const normal = cls.normalOffsetKpc + across + opt.memberSigmaKpc * rng.normal();
        let { xKpc, yKpc } = shiftedRidgePoint(opt.arm, betaM, normal);
        if (cls.driftMyr !== undefined) {
          const R = Math.hypot(xKpc, yKpc);
          const omegaRel = angularSpeedKmsKpc(R, opt.curve) - (opt.patternSpeedKmsKpc ?? 0);
          const dBetaDeg = (ROTATION_SENSE * omegaRel * cls.driftMyr * KMS_KPC_PER_MYR) / DEG;
          ({ xKpc, yKpc } = polarToXy(R, azimuthDeg(xKpc, yKpc) + dBetaDeg));
        }
        const h = fromGalactocentric(xKpc, yKpc, opt.zSigmaKpc * rng.normal(), R0);
        l.push(h.lDeg);
        b.push(h.bDeg);
        v.push(vLsrAtKms(h.lDeg, h.bDeg, h.distKpc, opt.curve) + opt.vSigmaKms * rng.normal());
        kind.push(KIND_INDEX[cls.kind]);
        cluster.push(c);
      }
    }
  }
  return {
    lDeg: Float64Array.from(l),
    bDeg: Float64Array.from(b),
    vLsrKms: Float64Array.from(v),
    kind: Uint8Array.from(kind),
    cluster: Int32Array.from(cluster),
  };
}

/** Source columns of several sets joined, cluster ids kept apart (set k's clusters offset by k × 1e6). */
export function joinSources(parts: TangentInput[]): TangentInput {
  const cat = <T extends Float64Array | Uint8Array | Int32Array>(
    pick: (p: TangentInput) => T,
    make: (n: number) => T,
    offset = 0,
  ): T => {
    const out = make(parts.reduce((s, p) => s + pick(p).length, 0));
    let at = 0;
    parts.forEach((p, k) => {
      const col = pick(p);
      for (let i = 0; i < col.length; i++) out[at + i] = col[i] + k * offset;
      at += col.length;
    });
    return out;
  };
  return {
    lDeg: cat(
      (p) => p.lDeg,
      (n) => new Float64Array(n),
    ),
    bDeg: cat(
      (p) => p.bDeg,
      (n) => new Float64Array(n),
    ),
    vLsrKms: cat(
      (p) => p.vLsrKms,
      (n) => new Float64Array(n),
    ),
    kind: cat(
      (p) => p.kind,
      (n) => new Uint8Array(n),
    ),
    cluster: cat(
      (p) => p.cluster,
      (n) => new Int32Array(n),
      1e6,
    ),
  };
}
