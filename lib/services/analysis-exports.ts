import { csvLine } from '@/lib/export/csv';
import { formatDecimals } from '@/lib/export/decimals';
import { EXPORT_DECIMALS } from '@/lib/export/precision';
import { HttpError } from '@/lib/http/errors';
import type { OrderingResult } from '@/lib/ordering';
import { armsOf } from '@/lib/analysis-settings';
import { analysisSchema, getAnalysis } from './analyses';
import { toolCurve } from '@/lib/calculators';
import pkg from '@/package.json';

async function doneResult(analysisId: string) {
  const a = await getAnalysis(analysisId);
  if (a.status !== 'done' || !a.result)
    throw new HttpError(
      409,
      'not_done',
      `The analysis is ${a.status}; its tables exist once it is done.`,
    );
  return { a, result: a.result as unknown as OrderingResult };
}

// Numbers are written to the decimals of their quantity (docs/methods.md, "Exports").
const D = EXPORT_DECIMALS;
const r = (x: number | null | undefined, decimals: number) =>
  x === null || x === undefined ? null : formatDecimals(x, decimals);
const ci = (c: [number, number] | null, decimals: number) =>
  c ? [r(c[0], decimals), r(c[1], decimals)] : [null, null];

/** One of the analysis tables as CSV text. */
export async function analysisCsv(
  analysisId: string,
  table: 'complexes' | 'classes' | 'sources',
): Promise<string> {
  const { result } = await doneResult(analysisId);
  if (table === 'classes') {
    const head = [
      'scope',
      'kind',
      'n',
      'n_complexes',
      'median_offset_kpc',
      'ci95_lo_kpc',
      'ci95_hi_kpc',
      'median_azimuth_offset_deg',
      'azimuth_ci95_lo_deg',
      'azimuth_ci95_hi_deg',
    ];
    const rows = (scope: string, classes: OrderingResult['classes']) =>
      classes.map((c) =>
        csvLine([
          scope,
          c.kind,
          c.n,
          c.nComplexes,
          r(c.medianOffsetKpc, D.lengthKpc),
          ...ci(c.ci95, D.lengthKpc),
          r(c.medianAzimuthOffsetDeg, D.angleDeg),
          ...ci(c.azimuthCi95, D.angleDeg),
        ]),
      );
    return [
      csvLine(head),
      ...rows('all arms', result.classes),
      ...result.perArm.flatMap((a) => rows(a.arm, a.classes)),
    ].join('');
  }
  if (table === 'sources') {
    return [
      csvLine(['complex_id', 'kind', 'x_kpc', 'y_kpc', 'perp_offset_kpc']),
      ...result.sources.map((s) =>
        csvLine([
          s.complexId,
          s.kind,
          r(s.xKpc, D.lengthKpc),
          r(s.yKpc, D.lengthKpc),
          r(s.perpOffsetKpc, D.lengthKpc),
        ]),
      ),
    ].join('');
  }
  const head = [
    'complex_id',
    'l_deg',
    'b_deg',
    'v_lsr_kms',
    'dist_kpc',
    'dist_lo_kpc',
    'dist_hi_kpc',
    'dist_ci95_lo_kpc',
    'dist_ci95_hi_kpc',
    'p_near',
    'distance_choice',
    'distance_reason',
    'flags',
    'x_kpc',
    'y_kpc',
    'R_kpc',
    'beta_deg',
    'arm',
    'on_arm_share',
    'perp_offset_kpc',
    'perp_ci95_lo_kpc',
    'perp_ci95_hi_kpc',
    'azimuth_offset_deg',
    'intra_complex_across_kpc',
    'used',
    'excluded_because',
  ];
  return [
    csvLine(head),
    ...result.complexes.map((c) =>
      csvLine([
        c.id,
        r(c.lDeg, D.positionDeg),
        r(c.bDeg, D.positionDeg),
        r(c.vLsrKms, D.velocityKms),
        r(c.distKpc, D.lengthKpc),
        r(c.distLoKpc, D.lengthKpc),
        r(c.distHiKpc, D.lengthKpc),
        ...ci(c.distCi95, D.lengthKpc),
        r(c.pNear, D.fraction),
        c.choice,
        c.reason,
        c.flags.join(' '),
        r(c.xKpc, D.lengthKpc),
        r(c.yKpc, D.lengthKpc),
        r(c.RKpc, D.lengthKpc),
        r(c.betaDeg, D.angleDeg),
        c.arm,
        r(c.onArmShare, D.fraction),
        r(c.perpOffsetKpc, D.lengthKpc),
        ...ci(c.perpCi95, D.lengthKpc),
        r(c.azimuthOffsetDeg, D.angleDeg),
        r(c.intraAcrossKpc, D.lengthKpc),
        c.used,
        c.excludedBecause,
      ]),
    ),
  ].join('');
}

const fmt = (x: number | null | undefined, digits = 3) =>
  x === null || x === undefined ? 'n/a' : x.toFixed(digits);

const ciText = (c: [number, number] | null, digits = 3) =>
  c ? `${fmt(c[0], digits)} to ${fmt(c[1], digits)}` : 'n/a';

/** A methods text for the paper: one paragraph with every parameter and reference, then the results. */
export async function analysisMethods(analysisId: string): Promise<string> {
  const { a, result } = await doneResult(analysisId);
  // An external-galaxy analysis stores its methods text with its result when it finishes.
  if (a.kind === 'external-galaxy') return (a.result as { methods: string }).methods;
  const p = analysisSchema.parse(a.params);
  const curve = toolCurve(p.curve.name, p.curve.R0, p.curve.theta0);
  const arms = armsOf(p);
  const d = result.distances;
  const y = result.youngMinusGas;
  const fit = result.patternFit;
  const it = result.interpretation;
  const paragraph = [
    `We measured the ordering of gas (HI, CO) and young stars (HII regions, OB associations) across the spiral arms with Lanewise ${pkg.version} (analysis ${a.id} of link run ${a.runId}, ${a.runName ?? ''}).`,
    `Kinematic distances assume circular rotation on the ${curve.label} (${curve.source}) with R0 = ${curve.R0Kpc} kpc and Θ0 = ${curve.theta0Kms.toFixed(1)} km/s; each complex's distance is a distribution of ${d.draws} Monte Carlo draws over its velocity (measurement error in quadrature with σ_stream = ${d.sigmaStreamKms} km/s of streaming motions), over R0 and Θ0 (σ = ${d.R0ErrKpc} kpc and ${d.theta0ErrKms} km/s, shared by all complexes of a draw), and over the near/far choice (${p.nearFar} rule; scale height ${p.scaleHeightKpc} kpc; independent distances of linked tracers as likelihoods), with velocities from ${p.velocityFrom === 'gas' ? 'the gas members' : 'all members'} of each complex.`,
    `Arms are log spirals ln(R/R_ref) = −(β − β_ref) tan ψ (Reid et al. 2014) from ${arms.label} (${arms.source}); each draw is measured against its nearest ridge within ${p.armWidthKpc} kpc, and no arm prior enters the distances.`,
    `Offsets are signed positive ahead of the ridge in the sense of Galactic rotation; class medians and the young-minus-gas difference carry 95 % percentile intervals from a nested bootstrap over complexes and their distance draws (${p.resamples} resamples, seed ${p.seed}; Efron & Tibshirani 1993; Davison & Hinkley 1997).`,
    "Independently of kinematic distances, each class's tangent longitude at the model arm tangents was taken from a kernel-smoothed longitude profile of sources with |b| < 1°, with ΔR = R0 |cos l_t| Δl and Δn = ΔR cos ψ; offsets in the longitude–velocity plane were converted with ∂v/∂n of the model.",
    'The pattern speed and timescale were fitted to the young-minus-gas azimuthal offsets in 1 kpc rings as Δφ(R) = 1.0227·10⁻³ (Ω(R) − Ω_p) t (Egusa et al. 2004, 2009).',
  ].join(' ');
  const lines = [
    paragraph,
    '',
    'Results',
    `- Complexes: ${result.exclusions.complexes}, used ${result.exclusions.used}; left out: ${
      Object.entries(result.exclusions.reasons)
        .filter(([, v]) => v > 0)
        .map(([k, v]) => `${k} ${v}`)
        .join(', ') || 'none'
    }.`,
    ...result.classes.map(
      (c) =>
        `- ${c.kind.toUpperCase()}: n = ${c.n} in ${c.nComplexes} complexes, median offset from the ridge ${fmt(c.medianOffsetKpc)} kpc (95 % interval ${ciText(c.ci95)}).`,
    ),
    `- Young minus gas: ${fmt(y.medianOffsetKpc)} kpc (95 % interval ${ciText(y.ci95)}).`,
    ...result.tangents.flatMap((t) =>
      t.offsets.map(
        (o) =>
          `- Tangent ${t.arm} (model l = ${fmt(t.modelTangentLDeg, 2)}°): ${o.from} → ${o.to} Δl = ${fmt(o.dlDeg, 2)}°, Δn = ${fmt(o.dnKpc)} kpc (95 % interval ${ciText(o.dnCi95)}).`,
      ),
    ),
    fit
      ? `- Pattern fit (${fit.binsUsed} rings): Ω_p = ${fmt(fit.patternSpeedKmsKpc, 1)} km/s/kpc (${ciText(fit.patternSpeedCi95, 1)}), t = ${fmt(fit.timescaleMyr, 1)} Myr (${ciText(fit.timescaleCi95, 1)}), corotation ${fmt(fit.corotationKpc, 2)} kpc.${fit.reason ? ` ${fit.reason}.` : ''}`
      : `- Pattern fit: not constrained (${result.patternFitReason ?? 'too few rings'}).`,
    `- Interpretation: ${it.source === null ? 'no pattern speed fitted or stated' : `${it.source} Ω_p = ${fmt(it.patternSpeedKmsKpc, 1)} km/s/kpc`}.`,
    `- Within complexes (bounded by the link radius, ${ciText(result.intraComplex.linkRadiusPc, 1)} pc): young stars ${fmt(result.intraComplex.medianAcrossKpc, 4)} kpc across from their own gas (n = ${result.intraComplex.n}).`,
    ...result.warnings.map((w) => `- Warning: ${w}`),
    '',
    'References',
    '- Brand, J. & Blitz, L. 1993, A&A 275, 67; Persic, M., Salucci, P. & Stel, F. 1996, MNRAS 281, 27',
    '- Reid, M. J. et al. 2014, ApJ 783, 130 (arms, rotation curve, Galactocentric frame); Reid, M. J. et al. 2019, ApJ 885, 131',
    '- Egusa, F., Sofue, Y. & Nakanishi, H. 2004, PASJ 56, L45; Egusa, F. et al. 2009, ApJ 697, 1870',
    '- Efron, B. & Tibshirani, R. J. 1993, An Introduction to the Bootstrap; Davison, A. C. & Hinkley, D. V. 1997, Bootstrap Methods and their Application',
    '',
  ];
  return lines.join('\n');
}
