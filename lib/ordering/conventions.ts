/**
 * The frame and sign conventions of an ordering result, in words, for the result's
 * `conventions` field and the methods text.
 */

/** States the frame, the signs and the intervals of one run. */
export function conventionsText(p: {
  R0Kpc: number;
  resamples: number;
  seed: number;
  draws: number;
}): string {
  return [
    `Frame: Galactocentric, as in Reid et al. (2014): Sun at (R0, 0, 0) with R0 = ${p.R0Kpc} kpc, z toward the north Galactic pole, l = 90° along −y; azimuth β = atan2(−y, x), 0 toward the Sun and increasing with Galactic longitude, which is also the sense of Galactic rotation.`,
    'Signs: every offset is measured, positive ahead of the arm ridge in the sense of Galactic rotation (perpendicular offsets in kpc, azimuthal offsets at the same R in degrees); young minus gas is positive when the young stars (HII, OB) lie farther ahead than the gas (HI, CO). Upstream and downstream are an interpretation, stated separately with the pattern speed it rests on (fitted, or assumed when the user gave one).',
    `Distances: each complex's kinematic distance is a distribution of ${p.draws} Monte Carlo draws (velocity error with streaming, the curve's R0 and Θ0 uncertainties shared by all complexes of a draw, near/far by the chosen rule); no arm prior is used.`,
    `Intervals: 95 % percentile intervals of a nested bootstrap — complexes resampled with replacement, each with one of its distance draws — ${p.resamples} resamples, seed ${p.seed}.`,
    'Tangent offsets: Δl = l_t(to) − l_t(from), ΔR = R0 |cos l_t| Δl, Δn = ΔR cos ψ, signed positive when `to` lies ahead of `from` in rotation. l–v offsets: Δv from the arm locus converted with ∂v/∂n of the model. Pattern fit: Δφ(R) = 1.0227·10⁻³ (Ω(R) − Ω_p) t.',
  ].join(' ');
}
