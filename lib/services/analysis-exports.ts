import { csvLine } from '@/lib/export/csv';
import { HttpError } from '@/lib/http/errors';
import type { OrderingResult } from '@/lib/ordering';
import { analysisSchema, armsOf, getAnalysis } from './analyses';
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

const ci = (c: [number, number] | null) => (c ? [c[0], c[1]] : [null, null]);

/** One of the analysis tables as CSV text. */
export async function analysisCsv(
  analysisId: string,
  table: 'complexes' | 'classes' | 'sources',
): Promise<string> {
  const { result } = await doneResult(analysisId);
  if (table === 'classes') {
    const head = [
      'kind',
      'n',
      'median_offset_kpc',
      'median_ci95_lo',
      'median_ci95_hi',
      'mean_offset_kpc',
      'mean_ci95_lo',
      'mean_ci95_hi',
      'median_azimuth_offset_deg',
    ];
    return [
      csvLine(head),
      ...result.classes.map((c) =>
        csvLine([
          c.kind,
          c.n,
          c.medianOffsetKpc,
          ...ci(c.ci95),
          c.meanOffsetKpc,
          ...ci(c.meanCi95),
          c.medianAzimuthOffsetDeg,
        ]),
      ),
    ].join('');
  }
  if (table === 'sources') {
    return [
      csvLine(['complex_id', 'kind', 'x_kpc', 'y_kpc', 'perp_offset_kpc']),
      ...result.sources.map((s) => csvLine([s.complexId, s.kind, s.xKpc, s.yKpc, s.perpOffsetKpc])),
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
    'distance_choice',
    'distance_reason',
    'flags',
    'x_kpc',
    'y_kpc',
    'R_kpc',
    'beta_deg',
    'arm',
    'perp_offset_kpc',
    'azimuth_offset_deg',
    'gas_to_stars_across_kpc',
    'used',
    'excluded_because',
  ];
  return [
    csvLine(head),
    ...result.complexes.map((c) =>
      csvLine([
        c.id,
        c.lDeg,
        c.bDeg,
        c.vLsrKms,
        c.distKpc,
        c.distLoKpc,
        c.distHiKpc,
        c.choice,
        c.reason,
        c.flags.join(' '),
        c.xKpc,
        c.yKpc,
        c.RKpc,
        c.betaDeg,
        c.arm,
        c.perpOffsetKpc,
        c.azimuthOffsetDeg,
        c.gasToStarsAcrossKpc,
        c.used,
        c.excludedBecause,
      ]),
    ),
  ].join('');
}

const fmt = (x: number | null | undefined, digits = 3) =>
  x === null || x === undefined ? 'n/a' : x.toFixed(digits);

/** A methods text for the paper: every parameter with its reference, then the results. */
export async function analysisMethods(analysisId: string): Promise<string> {
  const { a, result } = await doneResult(analysisId);
  const p = analysisSchema.parse(a.params);
  const curve = toolCurve(p.curve.name, p.curve.R0, p.curve.theta0);
  const arms = armsOf(p);
  const g = result.gasToStars;
  const lines = [
    `Lanewise ${pkg.version} ordering analysis ${a.id} of link run ${a.runId} (${a.runName ?? ''}), finished ${a.finishedAt ?? ''}.`,
    '',
    'Parameters',
    `- Rotation curve: ${curve.label} (${curve.source}); R0 = ${curve.R0Kpc} kpc, Θ0 = Θ(R0) = ${curve.theta0Kms.toFixed(2)} km/s.`,
    `- Kinematic distances: circular rotation, v_LSR = R0 sin l cos b (Θ(R)/R − Θ0/R0) (SCIENCE §4); velocities from ${p.velocityFrom === 'gas' ? 'the gas members' : 'all members'} of each complex.`,
    `- Uncertainties: Monte Carlo, ${p.mcDraws} draws per complex, σ² = σ_meas² + σ_stream², σ_stream = ${p.sigmaStreamKms} km/s (common practice: 5–10 km/s streaming near arms).`,
    `- Near/far ambiguity: an independent distance of a linked tracer where one exists; else the near root when the far root lies more than 2.5 scale heights from the plane, scale height ${p.scaleHeightKpc} kpc (common practice).`,
    '- Excluded: |l| < 15° and |l − 180°| < 15° (kinematic distances unreliable), velocities beyond the terminal velocity, sources near the tangent point, complexes without velocity or distance, and complexes farther than the arm width from every arm.',
    `- Arm model: ${arms.label} (${arms.source}); log spirals ln(R/R_ref) = −(β − β_ref) tan ψ (Reid et al. 2014, ApJ 783, 130); arm width ${p.armWidthKpc} kpc.`,
    `- Pattern speed Ω_p = ${p.patternSpeed} km/s/kpc; corotation at ${fmt(result.corotationKpc, 2)} kpc. Delay t = Δβ / (Ω(R) − Ω_p), 1 km/s/kpc = 1.0227 Gyr⁻¹.`,
    `- Statistics: medians with percentile-bootstrap 95 % intervals (${p.resamples} resamples, seed ${p.seed}; Efron & Tibshirani 1993); sign-flip permutation test for young stars ahead of gas; two-sample Kolmogorov–Smirnov test.`,
    `- Frame: ${result.conventions}`,
    '',
    'Results',
    `- Complexes: ${result.exclusions.complexes}, used ${result.exclusions.used}; excluded: ${
      Object.entries(result.exclusions.reasons)
        .map(([k, v]) => `${k} ${v}`)
        .join(', ') || 'none'
    }.`,
    ...result.classes.map(
      (c) =>
        `- ${c.kind.toUpperCase()}: n = ${c.n}, median offset from the ridge ${fmt(c.medianOffsetKpc)} kpc (95 % CI ${c.ci95 ? `${fmt(c.ci95[0])} to ${fmt(c.ci95[1])}` : 'n/a'}).`,
    ),
    `- Gas → young stars across the arm: n = ${g.n}, median ${fmt(g.medianAcrossKpc)} kpc (95 % CI ${g.ci95 ? `${fmt(g.ci95[0])} to ${fmt(g.ci95[1])}` : 'n/a'}), permutation p = ${fmt(g.pValue, 4)}.`,
    `- Delay: median ${fmt(result.delayMyr.median, 2)} Myr (95 % CI ${result.delayMyr.ci95 ? `${fmt(result.delayMyr.ci95[0], 2)} to ${fmt(result.delayMyr.ci95[1], 2)}` : 'n/a'}), n = ${result.delayMyr.n}.`,
    ...result.warnings.map((w) => `- Warning: ${w}`),
    '',
    'References',
    '- ESA 1997, The Hipparcos and Tycho Catalogues, ESA SP-1200 (Galactic coordinates)',
    '- Reid, M. J. et al. 2014, ApJ 783, 130 (arms, rotation curve); Reid, M. J. et al. 2019, ApJ 885, 131',
    '- Brand, J. & Blitz, L. 1993, A&A 275, 67; Persic, M., Salucci, P. & Stel, F. 1996, MNRAS 281, 27',
    '- Schönrich, R., Binney, J. & Dehnen, W. 2010, MNRAS 403, 1829 (solar motion)',
    '- Efron, B. & Tibshirani, R. J. 1993, An Introduction to the Bootstrap',
    '',
  ];
  return lines.join('\n');
}
