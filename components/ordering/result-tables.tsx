import { fmt, fmtCount } from '@/components/link-runs/format';
import { TracerBadge, TracerGlyph } from '@/components/ui/tracer-badge';
import { TRACER_KINDS } from '@/lib/tracers';
import type { Ci, OrderingResult } from './types';
import { pc } from './words';

const th = 'px-3 py-2';
const thNum = 'px-3 py-2 text-right';
const td = 'px-3 py-1.5';
const tdNum = 'num px-3 py-1.5';

const ci = (c: Ci | null, d: number) => (c ? `${fmt(c[0], d)} to ${fmt(c[1], d)}` : '—');

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
        <thead className="border-b border-rule text-left text-xs uppercase tracking-wide text-ink-soft">
          <tr>{head}</tr>
        </thead>
        <tbody className="divide-y divide-rule/70">{children}</tbody>
      </table>
    </div>
  );
}

/** One row per tracer class: sources, median and mean offsets from the ridge with 95 % intervals. */
export function ClassTable({ result }: { result: OrderingResult }) {
  return (
    <Table
      label="Offsets by class"
      head={
        <>
          <th className={th}>Class</th>
          <th className={thNum}>Sources</th>
          <th className={thNum}>Median offset (kpc, downstream +)</th>
          <th className={thNum}>95 % interval (kpc)</th>
          <th className={thNum}>Mean offset (kpc, downstream +)</th>
          <th className={thNum}>95 % interval (kpc)</th>
          <th className={thNum}>Median Δβ (°, downstream +)</th>
        </>
      }
    >
      {result.classes.map((c) => (
        <tr key={c.kind}>
          <td className={td}>
            <TracerBadge kind={c.kind} />
          </td>
          <td className={tdNum}>{fmtCount(c.n)}</td>
          <td className={tdNum}>{fmt(c.medianOffsetKpc, 3)}</td>
          <td className={tdNum}>{ci(c.ci95, 3)}</td>
          <td className={tdNum}>{fmt(c.meanOffsetKpc, 3)}</td>
          <td className={tdNum}>{ci(c.meanCi95, 3)}</td>
          <td className={tdNum}>{fmt(c.medianAzimuthOffsetDeg, 2)}</td>
        </tr>
      ))}
    </Table>
  );
}

/** One row per arm: complexes, each class's median offset with its interval, gas-to-stars median. */
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
                <TracerGlyph kind={k} /> median (kpc, downstream +) [95 %]
              </span>
            </th>
          ))}
          <th className={thNum}>Gas → stars median (pc, downstream +)</th>
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
                    {fmt(c.medianOffsetKpc, 3)}{' '}
                    <span className="text-xs text-ink-soft">[{ci(c.ci95, 3)}]</span>
                    <span className="block text-xs text-ink-soft">n = {fmtCount(c.n)}</span>
                  </>
                ) : (
                  '—'
                )}
              </td>
            );
          })}
          <td className={tdNum}>{pc(a.gasToStarsMedianKpc, 1)}</td>
        </tr>
      ))}
    </Table>
  );
}

/** One row per ring of Galactocentric radius, marked inside or outside corotation. */
export function RadialTable({ result }: { result: OrderingResult }) {
  return (
    <Table
      label="Offsets by radius"
      head={
        <>
          <th className={thNum}>R (kpc)</th>
          <th className={thNum}>Complexes</th>
          <th className={thNum}>Gas → stars median (pc, ahead in rotation +)</th>
          <th className={thNum}>95 % interval (pc)</th>
          <th className={th}>Corotation</th>
        </>
      }
    >
      {result.radialBins.map((b) => (
        <tr key={b.RminKpc} className={b.insideCorotation ? '' : 'bg-paper-deep/50'}>
          <td className={tdNum}>
            {fmt(b.RminKpc, 1)}–{fmt(b.RmaxKpc, 1)}
          </td>
          <td className={tdNum}>{fmtCount(b.n)}</td>
          <td className={tdNum}>{pc(b.medianAcrossKpc, 1)}</td>
          <td className={tdNum}>{b.ci95 ? `${pc(b.ci95[0], 1)} to ${pc(b.ci95[1], 1)}` : '—'}</td>
          <td className={td} data-testid="radial-corotation">
            {b.insideCorotation ? 'inside' : 'outside'}
          </td>
        </tr>
      ))}
    </Table>
  );
}
