'use client';

import { useMemo } from 'react';
import { DphiMarks } from '@/components/plots/dphi-marks';
import { fmt } from '@/components/link-runs/format';
import { ZoomFigure, type Domain, type HoverTarget } from '@/components/ordering/zoom-figure';
import type { ExternalRotationCurve } from '@/lib/external/rotation';
import { classWords, modelDphiDeg } from './figure-model';
import type { ExternalResultJson } from './types';

export const DPHI_PLOT_TITLE = 'Azimuthal offset Δφ of young stars from gas against disc radius';

/**
 * Δφ(R) of an external galaxy: each measured ring's young-minus-gas offset (degrees, positive
 * ahead in the sense of rotation) with its 95 % bootstrap interval, filled where the fit used the
 * ring; the fitted curve Δφ = 1.0227·10⁻³ (Ω(R) − Ω_p) t on the galaxy's rotation curve; and the
 * corotation radius where it crosses zero.
 */
export function DphiPlot({
  result,
  curve,
  fileStem,
}: {
  result: ExternalResultJson;
  curve: ExternalRotationCurve;
  fileStem: string;
}) {
  const fit = result.fit;
  const words = classWords(
    result.input.catalogs.map((c) => c.kind),
    result.input.gasKinds,
    result.input.youngKinds,
  );
  const rings = useMemo(() => {
    const used = fit?.usedBins ?? [];
    return result.rings.flatMap((r, k) =>
      r.dphiDeg === null ? [] : [{ ...r, dphiDeg: r.dphiDeg, fitted: used[k] === 1 }],
    );
  }, [result.rings, fit]);
  const lo = result.rings[0]?.minKpc ?? 0;
  const hi = result.rings[result.rings.length - 1]?.maxKpc ?? 1;
  const model = useMemo(() => {
    if (!fit) return [];
    const n = 100;
    return Array.from({ length: n + 1 }, (_, i) => {
      const R = Math.max(lo, 1e-3) + ((hi - Math.max(lo, 1e-3)) * i) / n;
      return [R, modelDphiDeg(fit, curve, R)] as const;
    }).filter((p): p is readonly [number, number] => p[1] !== null && Number.isFinite(p[1]));
  }, [fit, curve, lo, hi]);
  const domain = useMemo<Domain>(() => {
    let y0 = -1;
    let y1 = 1;
    for (const r of rings) {
      const [a, b] = r.ci95 ?? [r.dphiDeg, r.dphiDeg];
      y0 = Math.min(y0, a);
      y1 = Math.max(y1, b);
    }
    // The model may run far off at small radii, where Ω(R) is large; the rings set the scale.
    const floor = y0 - (y1 - y0);
    const ceiling = y1 + (y1 - y0);
    for (const [, y] of model) {
      y0 = Math.min(y0, Math.max(y, floor));
      y1 = Math.max(y1, Math.min(y, ceiling));
    }
    const pad = 0.08 * (y1 - y0);
    return { x0: lo, x1: hi > lo ? hi : lo + 1, y0: y0 - pad, y1: y1 + pad };
  }, [rings, model, lo, hi]);
  const targets = useMemo<HoverTarget[]>(
    () =>
      rings.map((r) => ({
        x: r.RKpc,
        y: r.dphiDeg,
        text: `R ${fmt(r.minKpc, 1)}–${fmt(r.maxKpc, 1)} kpc: Δφ ${fmt(r.dphiDeg, 2)}° [${r.ci95 ? `${fmt(r.ci95[0], 2)} to ${fmt(r.ci95[1], 2)}` : 'no interval'}], Ω ${fmt(r.omegaKmsKpc, 1)} km/s/kpc, ${r.nGas} gas and ${r.nYoung} young, ${r.fitted ? 'in the fit' : 'not in the fit'}`,
      })),
    [rings],
  );
  const corotation = fit?.corotationKpc ?? null;
  const constrained = fit?.patternSpeedKmsKpc != null && fit.timescaleMyr !== null;

  return (
    <ZoomFigure
      title={DPHI_PLOT_TITLE}
      fileStem={`${fileStem}-dphi-r`}
      width={620}
      height={360}
      domain={domain}
      xLabel="Disc radius R (kpc)"
      yLabel="Δφ young − gas (°, ahead +)"
      targets={targets}
      testId="external-dphi-r"
      caption={
        <>
          Each ring’s Δφ of {words.young} minus {words.gas}, positive ahead in the sense of
          rotation, with its 95 % bootstrap interval; filled: rings the fit used, hollow: rings it
          left out.{' '}
          {model.length === 0
            ? `No curve: ${result.fitReason ?? 'no fit'}.`
            : constrained
              ? `Line: the fitted Δφ = 1.0227·10⁻³ (Ω(R) − Ω_p) t with Ω_p = ${fmt(fit!.patternSpeedKmsKpc, 1)} km/s/kpc and t = ${fmt(fit!.timescaleMyr, 1)} Myr on the galaxy’s rotation curve${corotation !== null ? `; dashed: corotation at R = ${fmt(corotation, 2)} kpc` : ''}.`
              : `Line: the fitted straight line of Δφ against Ω(R) on the galaxy’s rotation curve; Ω_p is not constrained (${fit!.reason ?? 'see the fit'}).`}
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
          rings={rings.map((r) => ({
            key: r.minKpc,
            RKpc: r.RKpc,
            dphiDeg: r.dphiDeg,
            ci95: r.ci95,
            fitted: r.fitted,
          }))}
        />
      )}
    </ZoomFigure>
  );
}
