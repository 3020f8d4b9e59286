/**
 * The frame and sign conventions of an ordering result, in words, for the result's
 * `conventions` field and the methods summary.
 */

/** States the frame, the signs and the test of one run (corotation radius in kpc or null). */
export function conventionsText(p: {
  corotationKpc: number | null;
  patternSpeedKmsKpc: number;
  resamples: number;
  seed: number;
  R0Kpc: number;
}): string {
  const cr =
    p.corotationKpc === null
      ? 'none within 0.01–1000 kpc'
      : `R_CR = ${p.corotationKpc.toFixed(2)} kpc`;
  return [
    `Frame: Galactocentric, as in Reid et al. (2014): Sun at (R0, 0, 0) with R0 = ${p.R0Kpc} kpc, z toward the north Galactic pole, l = 90° along −y; azimuth β = atan2(−y, x), 0 toward the Sun and increasing with Galactic longitude, which is also the sense of Galactic rotation.`,
    "Arm offsets: perpOffsetKpc is the signed distance to the nearest point of the arm ridge; azimuthOffsetDeg is β − β_ridge at the same R. Both are positive ahead of the ridge in the sense of rotation. Members are measured against their complex's arm.",
    "Gas→stars: per complex, the displacement from the centroid of its gas members (HI, CO) to the centroid of its young-star members (HII, OB). Members are placed at their complex's distance, so only its component across the line of sight, w, is observed; it is deprojected onto the orbit direction ê_β (the density-wave flow relative to the pattern): S = w / (ê_β·ŵ), ŵ the in-plane direction across the line of sight; complexes whose orbit runs within 30° of the line of sight are left out. Across = S ê_β·n̂ with n̂ the ridge normal pointing ahead (positive when the young stars lie farther ahead of the ridge than the gas); along = S ê_β·t̂ with t̂ the ridge tangent toward increasing β; Δβ = S / R.",
    `Flow sign s = sign(Ω(R) − Ω_p) with Ω_p = ${p.patternSpeedKmsKpc} km/s/kpc (corotation ${cr}): +1 inside corotation, −1 outside.`,
    'classes, perArm, gasToStars, delayMyr and ks are signed downstream (value × s): positive means downstream of the ridge or of the gas — ahead inside corotation, behind outside — where density-wave theory puts young stars relative to gas. Complexes whose distance interval reaches across corotation are left out of these.',
    'complexes, sources and radialBins are not multiplied by s (positive = ahead in rotation), so radialBins show the reversal at corotation.',
    `gasToStars.pValue: one-sided sign-flip test (Fisher 1935) of "median downstream across offset > 0", ${p.resamples} random sign patterns, seed ${p.seed}. Intervals: 95 % percentile bootstrap (Efron 1979) over complexes, ${p.resamples} resamples; for class offsets whole complexes are resampled.`,
    'Delay: t = Δβ / (Ω(R) − Ω_p) from the deprojected azimuth offset Δβ, in Myr, positive when the young stars lie downstream; left out within 10 % of Ω_p of corotation.',
  ].join(' ');
}
