'use client';

import { useMemo } from 'react';
import { DphiMarks } from '@/components/plots/dphi-marks';
import { fmt } from '@/components/link-runs/format';
import { angularSpeedKmsKpc, type RotationCurve } from '@/lib/astro/rotation-curves';
import { ZoomFigure, type Domain, type HoverTarget } from './zoom-figure';
import type { OrderingResult } from './types';

const DEG = 180 / Math.PI;

type Line = NonNullable<OrderingResult['patternFit']>['line'];

/**
 * The fitted model Δφ(R) = 1.0227·10⁻³ (Ω(R) − Ω_p) t in degrees at `RKpc`, from the fit's own
 * line Δφ = a + b Ω (b = 1.0227·10⁻³ t, a = −b Ω_p; Egusa et al. 2004), with Ω(R) of the
 * analysis's rotation curve. The line holds even where Ω_p alone is not constrained.
 */
function modelDphiDeg(line: Line, curve: RotationCurve, RKpc: number) {
  if (!line) return NaN;
  const [o1, o2] = line.omegaKmsKpc;
  const [p1, p2] = line.dphiRad;
  const slope = (p2 - p1) / (o2 - o1);
  return (p1 + slope * (angularSpeedKmsKpc(RKpc, curve) - o1)) * DEG;
}

/**
 * Δφ(R): the azimuthal offset of young stars minus gas in each ring of Galactocentric radius
 * (degrees, positive ahead in the sense of rotation) with its 95 % interval; rings the fit used
 * are filled, the others hollow. With a fitted line, the model curve through the rings and the
 * corotation radius where it crosses zero.
 */
export function PhasePlot({
  result,
  curve,
  fileStem,
}: {
  result: OrderingResult;
  curve: RotationCurve;
  fileStem: string;
}) {
  const bins = useMemo(
    () => result.radialBins.filter((b) => b.dphiDeg !== null),
    [result.radialBins],
  );
  const fit = result.patternFit;
  const model = useMemo(() => {
    if (!fit?.line || result.radialBins.length === 0) return [];
    const lo = result.radialBins[0].RminKpc;
    const hi = result.radialBins[result.radialBins.length - 1].RmaxKpc;
    const n = 80;
    return Array.from({ length: n + 1 }, (_, i) => {
      const R = lo + ((hi - lo) * i) / n;
      return [R, modelDphiDeg(fit.line, curve, R)] as const;
    }).filter(([, y]) => Number.isFinite(y));
  }, [fit, curve, result.radialBins]);
  const domain = useMemo<Domain>(() => {
    let x0 = Infinity;
    let x1 = -Infinity;
    let y0 = -1;
    let y1 = 1;
    for (const b of result.radialBins) {
      x0 = Math.min(x0, b.RminKpc);
      x1 = Math.max(x1, b.RmaxKpc);
    }
    for (const b of bins) {
      const [lo, hi] = b.ci95 ?? [b.dphiDeg!, b.dphiDeg!];
      y0 = Math.min(y0, lo);
      y1 = Math.max(y1, hi);
    }
    for (const [, y] of model) {
      y0 = Math.min(y0, y);
      y1 = Math.max(y1, y);
    }
    if (!(x1 > x0)) {
      x0 = 0;
      x1 = 16;
    }
    const pad = 0.08 * (y1 - y0);
    return { x0, x1, y0: y0 - pad, y1: y1 + pad };
  }, [result.radialBins, bins, model]);
  const targets = useMemo<HoverTarget[]>(
    () =>
      bins.map((b) => ({
        x: b.RKpc,
        y: b.dphiDeg!,
        text: `R ${fmt(b.RminKpc, 1)}–${fmt(b.RmaxKpc, 1)} kpc: Δφ ${fmt(b.dphiDeg, 2)}° [${b.ci95 ? `${fmt(b.ci95[0], 2)} to ${fmt(b.ci95[1], 2)}` : 'no interval'}], Ω ${fmt(b.omegaKmsKpc, 1)} km/s/kpc, ${b.fitted ? 'in the fit' : 'not in the fit'}`,
      })),
    [bins],
  );
  const corotation = fit?.corotationKpc ?? null;

  return (
    <ZoomFigure
      title="Azimuthal offset of young stars from gas against radius"
      fileStem={`${fileStem}-dphi-r`}
      width={620}
      height={360}
      domain={domain}
      xLabel="Galactocentric radius R (kpc)"
      yLabel="Δφ young − gas (°, ahead +)"
      targets={targets}
      testId="ordering-dphi-r"
      caption={
        <>
          Each ring’s Δφ of young stars (HII, OB) minus gas (HI, CO), positive ahead in the sense of
          rotation, with its 95 % interval; filled: rings the pattern fit used, hollow: rings it
          left out.{' '}
          {model.length > 0
            ? `Line: the fitted Δφ = 1.0227·10⁻³ (Ω(R) − Ω_p) t on ${curve.label}${corotation !== null ? `; dashed: corotation at R = ${fmt(corotation, 2)} kpc` : ''}.`
            : 'No line: the pattern fit did not constrain one.'}
        </>
      }
    >
      {({ px, py }) => (
        <DphiMarks
          px={px}
          py={py}
          xSpan={[domain.x0, domain.x1]}
          corotationKpc={corotation}
          model={model}
          rings={bins.map((b) => ({
            key: b.RminKpc,
            RKpc: b.RKpc,
            dphiDeg: b.dphiDeg!,
            ci95: b.ci95,
            fitted: b.fitted,
          }))}
        />
      )}
    </ZoomFigure>
  );
}
