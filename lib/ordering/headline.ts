/**
 * The reconciled headline of an ordering result, in plain words (docs/methods.md, "Reading the
 * result"): the class offsets with their propagated intervals, the tangent offsets, the
 * pattern-speed fit, where they agree and where not, and — labelled as an interpretation — what a
 * density wave with the fitted (or stated) pattern speed predicts. A sentence says "as a density
 * wave predicts" only when the interval excludes zero with the predicted sign.
 */
import { angularSpeedKmsKpc, type RotationCurve } from '@/lib/astro/rotation-curves';
import { corotationRadiusKpc } from '@/lib/astro/pattern-speed';
import type { ArmTangentResult } from './tangents';
import type { Ci, Interpretation, OrderingResult, PatternFitSummary, YoungMinusGas } from './types';

/** Share of used complexes on one side of corotation above which a sign is predicted for the whole field. */
export const ONE_SIDE_SHARE = 0.8;

const pc = (kpc: number) => `${Math.round(kpc * 1000)} pc`;
const pcCi = (ci: Ci) => `${Math.round(ci[0] * 1000)} to ${Math.round(ci[1] * 1000)} pc`;

/** +1 when the interval lies above 0, −1 below, 0 when it contains 0. */
export function excludesZero(ci: Ci | null): 1 | -1 | 0 {
  if (!ci) return 0;
  if (ci[0] > 0) return 1;
  if (ci[1] < 0) return -1;
  return 0;
}

/** Upstream/downstream reading from the fitted pattern speed, else the stated one, else none. */
export function interpretationOf(
  fit: PatternFitSummary | null,
  statedKmsKpc: number | null,
  medianRKpc: number[],
  curve: RotationCurve,
): Interpretation {
  const fitted = fit?.patternSpeedKmsKpc ?? null;
  const omegaP = fitted ?? statedKmsKpc;
  if (omegaP === null)
    return {
      patternSpeedKmsKpc: null,
      source: null,
      corotationKpc: null,
      insideShare: null,
      predictedSign: null,
    };
  const inside = medianRKpc.filter((R) => angularSpeedKmsKpc(R, curve) > omegaP).length;
  const share = medianRKpc.length > 0 ? inside / medianRKpc.length : null;
  return {
    patternSpeedKmsKpc: omegaP,
    source: fitted !== null ? 'fitted' : 'assumed',
    corotationKpc: corotationRadiusKpc(curve, omegaP),
    insideShare: share,
    predictedSign:
      share === null ? null : share >= ONE_SIDE_SHARE ? 1 : share <= 1 - ONE_SIDE_SHARE ? -1 : null,
  };
}

function classSentence(y: YoungMinusGas, complexes: number, draws: number): string | null {
  if (y.medianOffsetKpc === null) return null;
  const where = `${complexes} complexes, each distance drawn ${draws} times`;
  const sign = excludesZero(y.ci95);
  if (!y.ci95)
    return `Young stars minus gas across the arms: ${pc(y.medianOffsetKpc)} (no interval; ${where}).`;
  if (sign === 0)
    return `Young stars (HII, OB) and gas (HI, CO) are not separated across the arms beyond the errors: young minus gas ${pc(y.medianOffsetKpc)}, 95 % interval ${pcCi(y.ci95)} (${where}).`;
  return `Young stars (HII, OB) lie ${pc(Math.abs(y.medianOffsetKpc))} ${sign > 0 ? 'ahead of' : 'behind'} the gas (HI, CO) across the arms, in the sense of rotation: 95 % interval ${pcCi(y.ci95)} (${where}).`;
}

type TangentPair = { arm: string; lDeg: number; dnKpc: number; dnCi95: Ci | null };

/** Gas-to-young tangent offsets (the pair with the most sources per arm tangent). */
export function tangentPairs(tangents: ArmTangentResult[]): TangentPair[] {
  const out: TangentPair[] = [];
  for (const t of tangents) {
    const gasYoung = t.offsets.filter(
      (o) => (o.from === 'co' || o.from === 'hi') && (o.to === 'hii' || o.to === 'ob'),
    );
    const best = gasYoung.find((o) => o.from === 'co' && o.to === 'hii') ?? gasYoung[0];
    if (best && Number.isFinite(best.dnKpc))
      out.push({ arm: t.arm, lDeg: t.modelTangentLDeg, dnKpc: best.dnKpc, dnCi95: best.dnCi95 });
  }
  return out;
}

function tangentSentence(pairs: TangentPair[]): string | null {
  if (pairs.length === 0) return null;
  const parts = pairs.map((p) => {
    const ci = p.dnCi95 ? ` (${pcCi(p.dnCi95)})` : '';
    return `${p.arm} at l ≈ ${p.lDeg.toFixed(1)}°: ${pc(p.dnKpc)}${ci}`;
  });
  return `Tangent-point offsets of young stars from gas, positive ahead, independent of kinematic distances — ${parts.join('; ')}.`;
}

function fitSentence(fit: PatternFitSummary | null, reason: string | null): string {
  if (!fit || (!fit.constrained && fit.timescaleMyr === null))
    return `Pattern speed and timescale: not constrained by these data (${reason ?? fit?.reason ?? 'too few radial bins'}).`;
  const t =
    fit.timescaleMyr !== null && fit.timescaleCi95
      ? `t = ${fit.timescaleMyr.toFixed(1)} Myr (95 % interval ${fit.timescaleCi95[0].toFixed(1)} to ${fit.timescaleCi95[1].toFixed(1)})`
      : 't not constrained';
  if (fit.patternSpeedKmsKpc === null || !fit.patternSpeedCi95)
    return `Fit of Δφ(R) over ${fit.binsUsed} radial bins: ${t}; the pattern speed is not constrained (${fit.reason ?? 'see the fit'}).`;
  const cr =
    fit.corotationKpc !== null ? `, corotation at R = ${fit.corotationKpc.toFixed(1)} kpc` : '';
  return `Fit of Δφ(R) over ${fit.binsUsed} radial bins: Ω_p = ${fit.patternSpeedKmsKpc.toFixed(1)} km/s/kpc (95 % interval ${fit.patternSpeedCi95[0].toFixed(1)} to ${fit.patternSpeedCi95[1].toFixed(1)}), ${t}${cr}.`;
}

function overlaps(a: Ci, b: Ci): boolean {
  return a[0] <= b[1] && b[0] <= a[1];
}

function agreementSentence(y: YoungMinusGas, pairs: TangentPair[]): string | null {
  if (!y.ci95 || pairs.length === 0) return null;
  const ci = y.ci95;
  const name = (p: TangentPair) => `${p.arm} (l ≈ ${p.lDeg.toFixed(1)}°)`;
  const agree = pairs.filter((p) => p.dnCi95 && overlaps(p.dnCi95, ci)).map(name);
  const differ = pairs.filter((p) => p.dnCi95 && !overlaps(p.dnCi95, ci)).map(name);
  const parts: string[] = [];
  if (agree.length > 0) parts.push(`agree with the class offsets at ${agree.join(', ')}`);
  if (differ.length > 0)
    parts.push(
      `differ from them beyond the errors at ${differ.join(', ')} (kinematic-distance biases such as streaming act on the class offsets, not on tangents)`,
    );
  return parts.length > 0 ? `The tangent offsets ${parts.join(' and ')}.` : null;
}

function interpretationSentence(y: YoungMinusGas, it: Interpretation): string {
  if (it.patternSpeedKmsKpc === null)
    return 'Interpretation: no pattern speed was fitted or stated, so upstream and downstream are not assigned.';
  const label = it.source === 'fitted' ? 'the fitted' : 'an assumed (not fitted)';
  const cr =
    it.corotationKpc !== null ? ` (corotation at R = ${it.corotationKpc.toFixed(1)} kpc)` : '';
  const head = `Interpretation with ${label} pattern speed Ω_p = ${it.patternSpeedKmsKpc.toFixed(1)} km/s/kpc${cr}:`;
  if (it.predictedSign === null)
    return `${head} the used complexes lie on both sides of corotation, so no single sign is predicted for the whole field; see the radial bins.`;
  const side = it.predictedSign > 0 ? 'inside' : 'outside';
  const want = it.predictedSign > 0 ? 'ahead of' : 'behind';
  const seen = excludesZero(y.ci95);
  if (seen === it.predictedSign)
    return `${head} most complexes lie ${side} corotation, where young stars formed from gas that crossed the arm lie ${want} it; the measured offset excludes zero with that sign, as a density wave predicts.`;
  if (seen === 0)
    return `${head} most complexes lie ${side} corotation, where a density wave puts young stars ${want} the gas; the measured offset is consistent with zero, so the data neither confirm nor exclude it.`;
  return `${head} most complexes lie ${side} corotation, where a density wave puts young stars ${want} the gas; the measured offset has the opposite sign beyond its errors.`;
}

/** The headline sentences of a result (without the headline itself). */
export function headlineOf(
  r: Omit<OrderingResult, 'headline'>,
  used: number,
  draws: number,
): string[] {
  const pairs = tangentPairs(r.tangents);
  return [
    classSentence(r.youngMinusGas, used, draws),
    tangentSentence(pairs),
    agreementSentence(r.youngMinusGas, pairs),
    fitSentence(r.patternFit, r.patternFitReason),
    interpretationSentence(r.youngMinusGas, r.interpretation),
  ].filter((s): s is string => s !== null);
}
