'use client';

import { fmt, fmtCount } from '@/components/link-runs/format';
import { ci, fmtP } from '@/components/ordering/words';
import type { ExternalResultJson } from './types';

function Fact({
  label,
  testId,
  children,
}: {
  label: string;
  testId?: string;
  children: React.ReactNode;
}) {
  return (
    <div>
      <dt className="text-xs tracking-wide text-ink-soft">{label}</dt>
      <dd className="num mt-0.5" data-testid={testId}>
        {children}
      </dd>
    </div>
  );
}

/** A fitted value with its 95 % interval, or "not constrained". */
function valueCi(value: number | null, c: [number, number] | null, decimals: number, unit: string) {
  if (value === null) return 'not constrained';
  return `${fmt(value, decimals)} ${unit} [95 %: ${ci(c, decimals)}]`;
}

/**
 * The fit of Δφ(R) = 1.0227·10⁻³ (Ω(R) − Ω_p) t: the fitted pattern speed, timescale and
 * corotation radius with their 95 % intervals, or "not constrained" with the fit's reason; the
 * label-permutation null test; the arm fit and the sense of rotation.
 */
export function FitFacts({ result }: { result: ExternalResultJson }) {
  const fit = result.fit;
  const arms = result.armsFit;
  const nt = result.nullTest;
  return (
    <div className="space-y-3" data-testid="external-fit">
      {fit ? (
        <dl className="grid gap-3 sm:grid-cols-3">
          <Fact label="Fitted pattern speed Ω_p" testId="fit-pattern-speed">
            {valueCi(fit.patternSpeedKmsKpc, fit.patternSpeedCi95, 1, 'km/s/kpc')}
          </Fact>
          <Fact label="Fitted timescale t" testId="fit-timescale">
            {valueCi(fit.timescaleMyr, fit.timescaleCi95, 1, 'Myr')}
          </Fact>
          <Fact label="Corotation R_CR = V/Ω_p" testId="fit-corotation">
            {valueCi(fit.corotationKpc, fit.corotationCi95, 2, 'kpc')}
          </Fact>
        </dl>
      ) : (
        <p className="text-sm" data-testid="fit-not-constrained">
          The fit is not constrained: {result.fitReason ?? 'no reason was recorded'}.
        </p>
      )}
      {fit && (
        <p className="text-xs text-ink-soft">
          Straight line of Δφ against Ω(R) over {fit.binsUsed} rings, weighted by each ring’s
          bootstrap variance; intervals from the same fit on every resample.
          {fit.reason && <> Ω_p: {fit.reason}.</>}
          {fit.notes.map((n) => (
            <span key={n}> {n}</span>
          ))}
        </p>
      )}
      <dl className="grid gap-3 sm:grid-cols-3">
        <Fact label="Null test (azimuths shuffled within rings)" testId="null-test-p">
          {nt ? `p = ${fmtP(nt.pValue)}` : 'no ring could be measured'}
        </Fact>
        <Fact label="Arms fitted to the positions">
          {arms
            ? `m = ${arms.m}, pitch ${fmt(arms.pitchDeg, 1)}° [${ci(arms.pitchCi95, 1)}], phase ${fmt(arms.phaseDeg, 1)}° [${ci(arms.phaseCi95, 1)}]`
            : result.armModel
              ? `entered: m = ${result.armModel.m}, pitch ${fmt(result.armModel.pitchDeg, 1)}°`
              : 'too few sources'}
        </Fact>
        <Fact label="Sense of rotation on the sky">
          {result.rotation}
          {result.rotationInference &&
            ` (inferred from trailing arms${result.rotationInference.clear ? '' : '; the winding is not clear beyond its errors'})`}
        </Fact>
      </dl>
      {nt && (
        <p className="text-xs text-ink-soft">
          Statistic: {nt.statistic} over {nt.rings} rings, observed {fmt(nt.observedDeg, 2)}°;{' '}
          {fmtCount(nt.permutations)} permutations of the class labels within rings. A small p says
          the gas and young stars are offset at all; it says nothing about the sign.
        </p>
      )}
    </div>
  );
}

const th = 'px-3 py-2';
const thNum = 'px-3 py-2 text-right';
const td = 'px-3 py-1.5';
const tdNum = 'num px-3 py-1.5 text-right';

/** Every ring: its sources, Ω(R), the cross-correlation offset and the ridge cross-check. */
export function RingTable({ result }: { result: ExternalResultJson }) {
  return (
    <div className="overflow-x-auto rounded-lg border border-rule bg-white/70">
      <table className="w-full text-sm" aria-label="Offsets ring by ring">
        <thead className="border-b border-rule text-left text-xs tracking-wide text-ink-soft">
          <tr>
            <th className={th}>Ring R (kpc)</th>
            <th className={thNum}>Gas</th>
            <th className={thNum}>Young</th>
            <th className={thNum}>Ω (km/s/kpc)</th>
            <th className={thNum}>Δφ young − gas (°, ahead +)</th>
            <th className={thNum}>95 % (°)</th>
            <th className={thNum}>From the ridges (°) [95 %]</th>
            <th className={th}>Note</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-rule/70">
          {result.rings.map((r) => (
            <tr key={r.minKpc}>
              <td className={`${td} num`}>
                {fmt(r.minKpc, 1)}–{fmt(r.maxKpc, 1)}
              </td>
              <td className={tdNum}>{fmtCount(r.nGas)}</td>
              <td className={tdNum}>{fmtCount(r.nYoung)}</td>
              <td className={tdNum}>{fmt(r.omegaKmsKpc, 1)}</td>
              <td className={tdNum}>{fmt(r.dphiDeg, 2)}</td>
              <td className={tdNum}>{ci(r.ci95, 2)}</td>
              <td className={tdNum}>
                {r.ridge ? `${fmt(r.ridge.youngMinusGasDeg, 2)} [${ci(r.ridge.ci95, 2)}]` : '—'}
              </td>
              <td className={`${td} text-xs text-ink-soft`}>
                {r.reason ?? (r.atLagLimit ? 'at the lag limit ±180°/m' : '')}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
