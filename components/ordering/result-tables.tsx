import { fmt, fmtCount } from '@/components/link-runs/format';
import { TracerBadge, TracerGlyph } from '@/components/ui/tracer-badge';
import { TRACER_KINDS } from '@/lib/tracers';
import type { Ci, ClassSummary, OrderingResult } from './types';
import { ci, pc, pcCi, sharedDecimals } from './words';

const th = 'px-3 py-2';
const thNum = 'px-3 py-2 text-right';
const td = 'px-3 py-1.5';
const tdNum = 'num px-3 py-1.5';

type YoungMinusGas = OrderingResult['youngMinusGas'];

/** Decimals in pc for a median and its interval given in kpc, shared by the three numbers. */
const pcDecimals = (median: number | null, c: Ci | null) =>
  sharedDecimals([median, ...(c ?? [])].map((x) => (x === null ? null : x * 1000)));

/** A count that may be a sum of draw weights: whole numbers as such, else one decimal. */
const count = (n: number) => (Number.isInteger(n) ? fmtCount(n) : fmt(n, 1));

function Table({
  label,
  head,
  children,
}: {
  label: string;
  head: React.ReactNode;
  children: React.ReactNode;
}) {
  return (
    <div className="overflow-x-auto rounded-lg border border-rule bg-white/70">
      <table className="w-full text-sm" aria-label={label}>
        <thead className="border-b border-rule text-left text-xs tracking-wide text-ink-soft">
          <tr>{head}</tr>
        </thead>
        <tbody className="divide-y divide-rule/70">{children}</tbody>
      </table>
    </div>
  );
}

/** A median offset in pc with its 95 % interval beneath, or a dash. */
function PcWithCi({ kpc, c }: { kpc: number | null; c: Ci | null }) {
  const d = pcDecimals(kpc, c);
  return (
    <>
      {pc(kpc, d)}
      <span className="block text-xs text-ink-soft">[{pcCi(c, d)}]</span>
    </>
  );
}

function ClassRow({ c }: { c: ClassSummary }) {
  const d = pcDecimals(c.medianOffsetKpc, c.ci95);
  const a = sharedDecimals([c.medianAzimuthOffsetDeg, ...(c.azimuthCi95 ?? [])], 2);
  return (
    <tr>
      <td className={td}>
        <TracerBadge kind={c.kind} />
      </td>
      <td className={tdNum}>{fmtCount(c.n)}</td>
      <td className={tdNum}>{fmtCount(c.nComplexes)}</td>
      <td className={tdNum}>{pc(c.medianOffsetKpc, d)}</td>
      <td className={tdNum}>{pcCi(c.ci95, d)}</td>
      <td className={tdNum}>{fmt(c.medianAzimuthOffsetDeg, a)}</td>
      <td className={tdNum}>{ci(c.azimuthCi95, a)}</td>
    </tr>
  );
}

function YoungMinusGasRow({ y }: { y: YoungMinusGas }) {
  const d = pcDecimals(y.medianOffsetKpc, y.ci95);
  const a = sharedDecimals([y.azimuthDeg, ...(y.azimuthCi95 ?? [])], 2);
  return (
    <tr className="bg-accent-soft/30 font-medium" data-testid="young-minus-gas-row">
      <td className={td}>Young (HII, OB) − gas (HI, CO)</td>
      <td className={tdNum}>
        {fmtCount(y.nYoung)} / {fmtCount(y.nGas)}
      </td>
      <td className={tdNum}>—</td>
      <td className={tdNum}>{pc(y.medianOffsetKpc, d)}</td>
      <td className={tdNum}>{pcCi(y.ci95, d)}</td>
      <td className={tdNum}>{fmt(y.azimuthDeg, a)}</td>
      <td className={tdNum}>{ci(y.azimuthCi95, a)}</td>
    </tr>
  );
}

/**
 * One row per tracer class: sources, complexes, median offset from the ridge across the arm and
 * in azimuth, each with the 95 % interval that carries the distance errors; then young stars
 * minus gas (sources young / gas).
 */
export function ClassTable({ result }: { result: OrderingResult }) {
  return (
    <Table
      label="Offsets by class"
      head={
        <>
          <th className={th}>Class</th>
          <th className={thNum}>Sources</th>
          <th className={thNum}>Complexes</th>
          <th className={thNum}>Median offset (pc, ahead +)</th>
          <th className={thNum}>95 % interval (pc)</th>
          <th className={thNum}>Median Δβ (°, ahead +)</th>
          <th className={thNum}>95 % interval (°)</th>
        </>
      }
    >
      {result.classes.map((c) => (
        <ClassRow key={c.kind} c={c} />
      ))}
      <YoungMinusGasRow y={result.youngMinusGas} />
    </Table>
  );
}

/** One row per arm: complexes, each class's median offset with its interval, young minus gas. */
export function ArmTable({ result }: { result: OrderingResult }) {
  const kinds = TRACER_KINDS.filter((k) =>
    result.perArm.some((a) => a.classes.some((c) => c.kind === k)),
  );
  return (
    <Table
      label="Offsets by arm"
      head={
        <>
          <th className={th}>Arm</th>
          <th className={thNum}>Complexes</th>
          {kinds.map((k) => (
            <th key={k} className={thNum}>
              <span className="inline-flex items-center gap-1">
                <TracerGlyph kind={k} /> median (pc, ahead +) [95 %]
              </span>
            </th>
          ))}
          <th className={thNum}>Young − gas (pc, ahead +) [95 %]</th>
        </>
      }
    >
      {result.perArm.map((a) => (
        <tr key={a.arm}>
          <td className={td}>{a.arm}</td>
          <td className={tdNum}>{fmtCount(a.n)}</td>
          {kinds.map((k) => {
            const c = a.classes.find((x) => x.kind === k);
            return (
              <td key={k} className={tdNum}>
                {c ? (
                  <>
                    <PcWithCi kpc={c.medianOffsetKpc} c={c.ci95} />
                    <span className="block text-xs text-ink-soft">n = {fmtCount(c.n)}</span>
                  </>
                ) : (
                  '—'
                )}
              </td>
            );
          })}
          <td className={tdNum}>
            <PcWithCi kpc={a.youngMinusGas.medianOffsetKpc} c={a.youngMinusGas.ci95} />
          </td>
        </tr>
      ))}
    </Table>
  );
}

/** One row per ring of Galactocentric radius: Δφ of young stars minus gas, used by the fit or not. */
export function RadialTable({ result }: { result: OrderingResult }) {
  return (
    <Table
      label="Azimuthal offsets by radius"
      head={
        <>
          <th className={thNum}>R (kpc)</th>
          <th className={thNum}>Ω(R) (km/s/kpc)</th>
          <th className={thNum}>Gas sources</th>
          <th className={thNum}>Young sources</th>
          <th className={thNum}>Δφ young − gas (°, ahead +)</th>
          <th className={thNum}>95 % interval (°)</th>
          <th className={th}>In the fit</th>
        </>
      }
    >
      {result.radialBins.map((b) => {
        const d = sharedDecimals([b.dphiDeg, ...(b.ci95 ?? [])], 2);
        return (
          <tr key={b.RminKpc} className={b.fitted ? '' : 'text-ink-soft'}>
            <td className={tdNum}>
              {fmt(b.RminKpc, 1)}–{fmt(b.RmaxKpc, 1)}
            </td>
            <td className={tdNum}>{fmt(b.omegaKmsKpc, 1)}</td>
            <td className={tdNum}>{count(b.nGas)}</td>
            <td className={tdNum}>{count(b.nYoung)}</td>
            <td className={tdNum}>{fmt(b.dphiDeg, d)}</td>
            <td className={tdNum}>{ci(b.ci95, d)}</td>
            <td className={td}>{b.fitted ? 'yes' : 'no'}</td>
          </tr>
        );
      })}
    </Table>
  );
}

/** Each class's tangent longitude at each arm tangent of the model, with its 95 % interval. */
export function TangentLongitudeTable({ result }: { result: OrderingResult }) {
  const kinds = TRACER_KINDS.filter((k) =>
    result.tangents.some((t) => t.classes.some((c) => c.kind === k)),
  );
  return (
    <Table
      label="Tangent longitudes"
      head={
        <>
          <th className={th}>Arm</th>
          <th className={thNum}>Model tangent l (°)</th>
          <th className={thNum}>R_t (kpc)</th>
          <th className={thNum}>d_t (kpc)</th>
          {kinds.map((k) => (
            <th key={k} className={thNum}>
              <span className="inline-flex items-center gap-1">
                <TracerGlyph kind={k} /> l_t (°) [95 %]
              </span>
            </th>
          ))}
        </>
      }
    >
      {result.tangents.map((t) => (
        <tr key={`${t.arm}${t.modelTangentLDeg}`}>
          <td className={td}>{t.arm}</td>
          <td className={tdNum}>{fmt(t.modelTangentLDeg, 2)}</td>
          <td className={tdNum}>{fmt(t.RtKpc, 2)}</td>
          <td className={tdNum}>{fmt(t.distKpc, 2)}</td>
          {kinds.map((k) => {
            const c = t.classes.find((x) => x.kind === k);
            return (
              <td key={k} className={tdNum}>
                {c ? (
                  <>
                    {fmt(c.tangentLDeg, 2)}
                    <span className="block text-xs text-ink-soft">
                      [{ci(c.ci95, 2)}], n = {fmtCount(c.n)}
                    </span>
                  </>
                ) : (
                  '—'
                )}
              </td>
            );
          })}
        </tr>
      ))}
    </Table>
  );
}

/**
 * The separations of class pairs at each tangent: Δl, the across-arm Δn (positive when the second
 * class lies ahead of the first in the sense of rotation), and Δt where a pattern speed exists,
 * labelled fitted or assumed.
 */
export function TangentOffsetTable({ result }: { result: OrderingResult }) {
  const rows = result.tangents.flatMap((t) =>
    t.offsets.map((o) => ({ t, o, key: `${t.arm}${t.modelTangentLDeg}${o.from}${o.to}` })),
  );
  return (
    <Table
      label="Tangent-point offsets"
      head={
        <>
          <th className={th}>Arm</th>
          <th className={thNum}>Model tangent l (°)</th>
          <th className={th}>From → to</th>
          <th className={thNum}>Δl (°) [95 %]</th>
          <th className={thNum}>ΔR (pc)</th>
          <th className={thNum}>Δn (pc, ahead +) [95 %]</th>
          <th className={thNum}>Δt (Myr) [95 %]</th>
        </>
      }
    >
      {rows.length === 0 && (
        <tr>
          <td className={td} colSpan={7}>
            No pair of classes has a tangent longitude at any tangent of the model.
          </td>
        </tr>
      )}
      {rows.map(({ t, o, key }) => {
        const dl = sharedDecimals([o.dlDeg, ...(o.dlCi95 ?? [])], 2);
        const dt = sharedDecimals([o.dtMyr, ...(o.dtCi95 ?? [])], 2);
        return (
          <tr key={key}>
            <td className={td}>{t.arm}</td>
            <td className={tdNum}>{fmt(t.modelTangentLDeg, 2)}</td>
            <td className={td}>
              <span className="inline-flex items-center gap-1">
                <TracerBadge kind={o.from} /> → <TracerBadge kind={o.to} />
              </span>
            </td>
            <td className={tdNum}>
              {fmt(o.dlDeg, dl)}
              <span className="block text-xs text-ink-soft">[{ci(o.dlCi95, dl)}]</span>
            </td>
            <td className={tdNum}>{pc(o.dRKpc, pcDecimals(o.dRKpc, null))}</td>
            <td className={tdNum}>
              <PcWithCi kpc={o.dnKpc} c={o.dnCi95} />
            </td>
            <td className={tdNum}>
              {o.dtMyr === null ? (
                <span className="text-xs text-ink-soft">no pattern speed</span>
              ) : (
                <>
                  {fmt(o.dtMyr, dt)}
                  <span className="block text-xs text-ink-soft">
                    [{ci(o.dtCi95, dt)}], {t.patternSpeedLabel ?? 'stated'} Ω_p ={' '}
                    {fmt(t.patternSpeedKmsKpc, 1)} km/s/kpc
                  </span>
                </>
              )}
            </td>
          </tr>
        );
      })}
    </Table>
  );
}

/** Per arm and class, from the longitude–velocity diagram: median Δv and across-arm Δn. */
export function LvOffsetTable({ result }: { result: OrderingResult }) {
  return (
    <Table
      label="Longitude–velocity offsets"
      head={
        <>
          <th className={th}>Arm</th>
          <th className={th}>Class</th>
          <th className={thNum}>Sources</th>
          <th className={thNum}>Complexes</th>
          <th className={thNum}>Median Δv (km/s)</th>
          <th className={thNum}>Median Δn (pc, ahead +)</th>
          <th className={thNum}>95 % interval (pc)</th>
        </>
      }
    >
      {result.lvOffsets.length === 0 && (
        <tr>
          <td className={td} colSpan={7}>
            No source could be placed against an arm locus.
          </td>
        </tr>
      )}
      {result.lvOffsets.map((r) => {
        const d = pcDecimals(r.dnKpc, r.ci95);
        return (
          <tr key={`${r.arm}${r.kind}`}>
            <td className={td}>{r.arm}</td>
            <td className={td}>
              <TracerBadge kind={r.kind} />
            </td>
            <td className={tdNum}>{fmtCount(r.n)}</td>
            <td className={tdNum}>{fmtCount(r.nClusters)}</td>
            <td className={tdNum}>{fmt(r.medianDvKms, 1)}</td>
            <td className={tdNum}>{pc(r.dnKpc, d)}</td>
            <td className={tdNum}>{pcCi(r.ci95, d)}</td>
          </tr>
        );
      })}
    </Table>
  );
}
