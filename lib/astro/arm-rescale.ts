/**
 * Keeping an arm model and a rotation curve on one R0. Arm models are fitted in a Galactocentric
 * frame built with the fit's own R0; used with a curve of another R0, the Sun sits at a different
 * place relative to the ridges. Rescaling multiplies every radius of the arm model by
 * toR0/fromR0 (pitch angles and azimuths kept), so that each ridge keeps its radius in units of
 * R0 — a first-order correction, not a refit (docs/methods.md, "Spiral arms").
 */

import type { ArmSpec } from './arms';

function positiveR0(name: string, value: number): number {
  if (!(value > 0) || !Number.isFinite(value)) {
    throw new RangeError(`${name} = ${value} kpc must be a positive number`);
  }
  return value;
}

/** The arms with every radius scaled by toR0Kpc / fromR0Kpc (kpc); a new array, the input is untouched. */
export function rescaleArms(arms: ArmSpec[], fromR0Kpc: number, toR0Kpc: number): ArmSpec[] {
  const factor = positiveR0('toR0Kpc', toR0Kpc) / positiveR0('fromR0Kpc', fromR0Kpc);
  return arms.map((arm) => ({
    ...arm,
    RrefKpc: arm.RrefKpc * factor,
    ...(arm.widthKpc === undefined ? {} : { widthKpc: arm.widthKpc * factor }),
  }));
}

/** Difference between the arm model's R0 and the curve's: the shift (kpc, arms − curve) and a warning, or null when they agree to 1 pc. */
export function r0Mismatch(
  armsR0Kpc: number,
  curveR0Kpc: number,
): { shiftKpc: number; warning: string } | null {
  const shiftKpc = positiveR0('armsR0Kpc', armsR0Kpc) - positiveR0('curveR0Kpc', curveR0Kpc);
  if (Math.abs(shiftKpc) < 0.001) return null;
  const pc = Math.round(Math.abs(shiftKpc) * 1000);
  return {
    shiftKpc,
    warning: `The arm model was fitted with R0 = ${armsR0Kpc} kpc and the rotation curve uses R0 = ${curveR0Kpc} kpc: the Sun sits ${pc} pc ${shiftKpc > 0 ? 'closer to' : 'farther from'} the Galactic centre than the arms assume. Rescale the arms to the curve's R0, or use a curve with the arms' R0.`,
  };
}
