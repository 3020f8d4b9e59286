/**
 * From a Milky-Way analysis request to the analysis settings: the curve with its constants'
 * uncertainties, the arm model (a preset, rescaled to the curve's R0 on request, or the user's
 * arms) and every option. Pure (no I/O), so it is tested on its own; the service adds what only
 * the database knows (the link run's radius).
 */
import { rescaleArms } from '@/lib/astro/arm-rescale';
import { ARM_MODEL_PRESETS, type ArmSpec } from '@/lib/astro/arms';
import { toolCurve } from '@/lib/calculators';
import { HttpError } from '@/lib/http/errors';
import type { OrderingSettings } from '@/lib/ordering';
import type { AnalysisParams } from '@/lib/schemas/analyses';

/** The arm model of a request: a published preset by key (with the R0 it was fitted with), or the user's own arms. */
export function armsOf(params: AnalysisParams): {
  arms: ArmSpec[];
  label: string;
  source: string;
  R0Kpc: number | null;
} {
  if ('preset' in params.arms) {
    const p = ARM_MODEL_PRESETS[params.arms.preset];
    if (!p)
      throw new HttpError(
        400,
        'unknown_preset',
        `arms.preset: no arm model "${params.arms.preset}"; use one of ${Object.keys(ARM_MODEL_PRESETS).join(', ')}.`,
      );
    return { arms: p.arms, label: p.label, source: p.source, R0Kpc: p.R0Kpc };
  }
  const arms = params.arms.custom.map((a) => ({
    name: a.name,
    RrefKpc: a.Rref,
    betaRefDeg: a.betaRefDeg,
    pitchDeg: a.pitchDeg,
    betaMinDeg: a.betaMinDeg,
    betaMaxDeg: a.betaMaxDeg,
  }));
  return { arms, label: 'custom arms', source: 'defined in this project', R0Kpc: null };
}

/** The analysis settings of a request; `linkRadiusArcsec` comes from the link run. */
export function orderingSettings(
  params: AnalysisParams,
  linkRadiusArcsec: [number, number] | null = null,
): OrderingSettings {
  const curve = toolCurve(params.curve.name, params.curve.R0, params.curve.theta0);
  const model = armsOf(params);
  const rescale =
    'preset' in params.arms && params.arms.rescaleToCurveR0 === true && model.R0Kpc !== null;
  return {
    curve,
    arms: rescale ? rescaleArms(model.arms, model.R0Kpc!, curve.R0Kpc) : model.arms,
    armWidthKpc: params.armWidthKpc,
    patternSpeedKmsKpc: params.patternSpeed ?? null,
    sigmaStreamKms: params.sigmaStreamKms,
    R0ErrKpc: params.curve.R0Err ?? curve.R0ErrKpc ?? 0,
    theta0ErrKms: params.curve.theta0Err ?? curve.theta0ErrKms ?? 0,
    scaleHeightKpc: params.scaleHeightKpc,
    nearFar: params.nearFar,
    velocityFrom: params.velocityFrom,
    resamples: params.resamples,
    seed: params.seed,
    mcDraws: params.mcDraws,
    armsR0Kpc: rescale ? curve.R0Kpc : model.R0Kpc,
    tangentNearTerminalKms: params.tangentNearTerminalKms ?? null,
    linkRadiusArcsec,
  };
}
