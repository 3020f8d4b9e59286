/**
 * Turns a source's true Galactocentric position and random velocity into one catalog row: what
 * the Sun sees (l, b, v_LSR with measurement error, angular size, line width, an independent
 * distance for some OB associations) and the truth beside it (position, distance, arm offsets,
 * velocity parts).
 */
import { offsetFromArms } from '@/lib/astro/arms';
import { azimuthDeg, fromGalactocentric } from '@/lib/astro/galactocentric';
import { vLsrAtKms } from '@/lib/astro/kinematic-distance';
import { DIST_METHOD, type TracerCatalog } from './catalog';
import { lineOfSight, streamingVelocityKms, type GalaxyModel } from './model';
import { bernoulli, logNormal, type Rng } from './random';

const ARCMIN_PER_RAD = (180 / Math.PI) * 60;

/** Size–line-width relation of molecular clouds: σ_v = 0.72 S^0.5 km/s, S in pc (Solomon et al. 1987). */
function coDispersionKms(radiusPc: number): number {
  return 0.72 * Math.sqrt(radiusPc);
}

/** Median line FWHM (km/s) of the demo's HI clouds and of its HII regions' radio recombination lines: invented values of a plausible size, not measurements. */
const HI_FWHM_MEDIAN_KMS = 8;
const HII_RRL_FWHM_MEDIAN_KMS = 24;

/**
 * Fills row i of `cat` for a source at Galactocentric (x, y, z) kpc with a random line-of-sight
 * velocity vRandomKms (km/s) about circular rotation plus streaming; complexId −1 and
 * phaseMyr NaN mark an interloper. Draws size, line width, measurement error and (OB only) an
 * independent distance from `rng`.
 */
export function observeSource(
  model: GalaxyModel,
  rng: Rng,
  cat: TracerCatalog,
  i: number,
  pos: { xKpc: number; yKpc: number; zKpc: number },
  vRandomKms: number,
  complexId: number,
  phaseMyr: number,
): void {
  const { params, R0Kpc, curve } = model;
  const tp = params.tracers[cat.tracer];
  const { xKpc, yKpc, zKpc } = pos;
  const sky = fromGalactocentric(xKpc, yKpc, zKpc, R0Kpc);
  const RKpc = Math.hypot(xKpc, yKpc);
  const betaDeg = azimuthDeg(xKpc, yKpc);
  const arm = offsetFromArms(xKpc, yKpc, params.arms, R0Kpc);

  const vCirc = vLsrAtKms(sky.lDeg, sky.bDeg, sky.distKpc, curve);
  const stream = streamingVelocityKms(
    model,
    params.arms[arm.armIndex],
    RKpc,
    betaDeg,
    arm.perpOffsetKpc,
  );
  const u = lineOfSight(sky.lDeg, sky.bDeg, R0Kpc);
  const vStream = stream.vxKms * u.ux + stream.vyKms * u.uy;
  const vTrue = vCirc + vStream + vRandomKms;

  cat.lDeg[i] = sky.lDeg;
  cat.bDeg[i] = sky.bDeg;
  cat.vLsrKms[i] = vTrue + tp.velErrKms * rng.normal();
  cat.vErrKms[i] = tp.velErrKms;
  const sizePc = logNormal(rng, tp.sizeMedianPc, tp.sizeSigmaLn);
  cat.sizePc[i] = sizePc;
  cat.sizeArcmin[i] = (sizePc / 1000 / sky.distKpc) * ARCMIN_PER_RAD;
  cat.lineWidthKms[i] = lineWidthKms(cat.tracer, sizePc, rng);

  cat.xKpc[i] = xKpc;
  cat.yKpc[i] = yKpc;
  cat.zKpc[i] = zKpc;
  cat.RKpc[i] = RKpc;
  cat.betaDeg[i] = betaDeg;
  cat.distKpc[i] = sky.distKpc;
  cat.armIndex[i] = arm.armIndex;
  cat.perpOffsetKpc[i] = arm.perpOffsetKpc;
  cat.azimuthOffsetDeg[i] = arm.azimuthOffsetDeg;
  cat.complexId[i] = complexId;
  cat.phaseMyr[i] = phaseMyr;
  cat.vCircKms[i] = vCirc;
  cat.vStreamKms[i] = vStream;
  cat.vRandomKms[i] = vRandomKms;

  if (cat.tracer === 'OB') drawIndependentDistance(model, rng, cat, i);
}

function lineWidthKms(tracer: TracerCatalog['tracer'], sizePc: number, rng: Rng): number {
  switch (tracer) {
    case 'HI':
      return logNormal(rng, HI_FWHM_MEDIAN_KMS, 0.3);
    case 'CO':
      return coDispersionKms(sizePc / 2) * logNormal(rng, 1, 0.2);
    case 'HII':
      return logNormal(rng, HII_RRL_FWHM_MEDIAN_KMS, 0.2);
    case 'OB':
      return NaN;
  }
}

/**
 * Independent distance of an OB association: a parallax distance 1/ϖ with error σ_ϖ/ϖ² when
 * the true parallax is at least `parallaxMinSnr` σ, else a photometric one, d·10^(δμ/5) with
 * error d·σ_μ·ln10/5 (first-order propagation of a distance-modulus error; common practice).
 */
function drawIndependentDistance(
  model: GalaxyModel,
  rng: Rng,
  cat: TracerCatalog,
  i: number,
): void {
  const dp = model.params.distances;
  if (!bernoulli(rng, dp.fraction)) return;
  const d = cat.distKpc[i];
  const plxTrueMas = 1 / d;
  if (plxTrueMas >= dp.parallaxMinSnr * dp.parallaxErrMas) {
    const plxMas = plxTrueMas + dp.parallaxErrMas * rng.normal();
    if (plxMas > 0) {
      cat.indepDistKpc[i] = 1 / plxMas;
      cat.indepDistErrKpc[i] = dp.parallaxErrMas / (plxMas * plxMas);
      cat.distMethod[i] = DIST_METHOD.parallax;
      return;
    }
  }
  const dObs = d * 10 ** ((dp.photometricErrMag * rng.normal()) / 5);
  cat.indepDistKpc[i] = dObs;
  cat.indepDistErrKpc[i] = (dObs * dp.photometricErrMag * Math.LN10) / 5;
  cat.distMethod[i] = DIST_METHOD.photometric;
}
