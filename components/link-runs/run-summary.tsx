import Link from 'next/link';
import { HistogramSvg } from '@/components/plots/histogram-svg';
import { Panel } from '@/components/ui/panel';
import { fmt, fmtCount, fmtSeconds } from './format';
import type { Run, RunSummary } from './types';

/** Integer sizes inside a bin with half-integer edges: `3`, or `6–10`. */
function sizeRange(lo: number, hi: number): string {
  const a = Math.ceil(lo);
  const b = Math.floor(hi);
  return a >= b ? String(a) : `${a}–${b}`;
}

function Figure({ label, value, testId }: { label: string; value: string; testId?: string }) {
  return (
    <div>
      <dt className="text-xs tracking-wide text-ink-soft">{label}</dt>
      <dd className="num mt-0.5 text-left text-xl" data-testid={testId}>
        {value}
      </dd>
    </div>
  );
}

/**
 * What a finished run found: totals, links per catalog pair with the chance-link estimate, the
 * sources left out or linked by position only, over-cap complexes, and the histograms.
 */
export function RunSummaryView({
  run,
  summary,
  projectId,
}: {
  run: Run;
  summary: RunSummary;
  projectId: string;
}) {
  const name = new Map(run.catalogs.map((c) => [c.id, c.name]));
  const catalogName = (id: string) => name.get(id) ?? id;
  const chance = run.params.chanceTrials > 0;
  const stem = run.name.replace(/[^\w.-]+/g, '_');
  return (
    <div className="space-y-6">
      <Panel title="Result">
        <dl className="grid grid-cols-2 gap-4 sm:grid-cols-4">
          <Figure label="Links" value={fmtCount(summary.links)} testId="summary-links" />
          <Figure
            label="Complexes"
            value={fmtCount(summary.complexes)}
            testId="summary-complexes"
          />
          <Figure label="Sources searched" value={fmtCount(summary.sources)} />
          <Figure label="Time" value={fmtSeconds(summary.durationSeconds)} />
        </dl>
        {summary.capped.length > 0 && (
          <div
            role="status"
            className="mt-4 rounded-md border border-tracer-other/50 bg-tracer-other/10 px-3 py-2 text-sm"
          >
            <p className="font-medium">
              {summary.capped.length === 1
                ? 'One complex has'
                : `${fmtCount(summary.capped.length)} complexes have`}{' '}
              more than {fmtCount(summary.complexCap)} members.
            </p>
            <p className="mt-1 text-ink-soft">
              Such chains usually mean the tolerances are too wide for a crowded sight line. Look at
              them, or start a run with a smaller radius or velocity window:{' '}
              {summary.capped.slice(0, 12).map((c, i) => (
                <span key={c.complexId}>
                  {i > 0 && ', '}
                  <Link
                    className="text-accent underline"
                    href={`/projects/${projectId}/link-runs/${run.id}/complexes/${c.complexId}`}
                  >
                    #{c.complexId}
                  </Link>{' '}
                  ({fmtCount(c.size)})
                </span>
              ))}
              {summary.capped.length > 12 && ` and ${fmtCount(summary.capped.length - 12)} more`}.
            </p>
          </div>
        )}
      </Panel>

      <Panel title="Links per catalog pair">
        <div className="overflow-x-auto">
          <table className="w-full text-sm" aria-label="Links per catalog pair">
            <thead className="border-b border-rule text-xs text-ink-soft">
              <tr>
                <th className="px-2 py-1.5 text-left font-medium">catalog A</th>
                <th className="px-2 py-1.5 text-left font-medium">catalog B</th>
                <th className="px-2 py-1.5 text-right font-medium">links</th>
                <th
                  className="px-2 py-1.5 text-right font-medium"
                  title="mean link count over the shifted repeats ± its standard error"
                >
                  expected chance links
                </th>
                <th
                  className="px-2 py-1.5 text-right font-medium"
                  title="1 − expected chance links / links"
                >
                  reliability
                </th>
                <th
                  className="px-2 py-1.5 text-right font-medium"
                  title="sources without velocity left out (A / B)"
                >
                  left out A / B
                </th>
                <th
                  className="px-2 py-1.5 text-right font-medium"
                  title="sources without velocity linked by position only (A / B)"
                >
                  position only A / B
                </th>
              </tr>
            </thead>
            <tbody className="divide-y divide-rule/60">
              {summary.pairs.map((p) => (
                <tr key={`${p.catalogA}-${p.catalogB}`}>
                  <td className="px-2 py-1">{catalogName(p.catalogA)}</td>
                  <td className="px-2 py-1">{catalogName(p.catalogB)}</td>
                  <td className="num px-2 py-1">{fmtCount(p.links)}</td>
                  <td className="num px-2 py-1">
                    {p.expectedChance === null
                      ? '—'
                      : `${fmt(p.expectedChance, 1)} ± ${fmt(p.chanceStdErr, 1)}`}
                  </td>
                  <td className="num px-2 py-1">{fmt(p.reliability, 3)}</td>
                  <td className="num px-2 py-1">
                    {fmtCount(p.excludedA)} / {fmtCount(p.excludedB)}
                  </td>
                  <td className="num px-2 py-1">
                    {fmtCount(p.positionOnlyA)} / {fmtCount(p.positionOnlyB)}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        {!chance && (
          <p className="mt-2 text-xs text-ink-soft">
            This run made no chance-link repeats, so there is no false-link estimate. Re-run with at
            least one repeat to see how many links chance alignments alone would give.
          </p>
        )}
      </Panel>

      <Panel title="Distributions">
        <div className="flex flex-wrap gap-6">
          <HistogramSvg
            title="Separation of linked sources"
            edges={summary.histograms.separationArcsec.edges}
            counts={summary.histograms.separationArcsec.counts}
            xLabel="angular separation (″)"
            yLabel="links"
            fileStem={`${stem}-separation`}
          />
          <HistogramSvg
            title="Velocity difference of linked sources"
            edges={summary.histograms.deltaVKms.edges}
            counts={summary.histograms.deltaVKms.counts}
            xLabel="Δv (km/s)"
            yLabel="links"
            fileStem={`${stem}-delta-v`}
          />
          <HistogramSvg
            title="Complex sizes"
            edges={summary.complexSizes.edges}
            counts={summary.complexSizes.counts}
            xLabel="members per complex"
            yLabel="complexes"
            fileStem={`${stem}-complex-sizes`}
            labelBin={sizeRange}
          />
        </div>
      </Panel>
    </div>
  );
}
