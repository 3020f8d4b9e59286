'use client';

import Link from 'next/link';
import { Panel } from '@/components/ui/panel';
import { CHOICE_WORDS, pc } from '@/components/ordering/words';
import { fmt, fmtRange, fmtWhen } from './format';
import type { ComplexAnalysis } from './types';

function Row({ label, children }: { label: React.ReactNode; children: React.ReactNode }) {
  return (
    <div className="flex items-baseline justify-between gap-3 py-1">
      <dt className="text-ink-soft">{label}</dt>
      <dd className="num text-right">{children}</dd>
    </div>
  );
}

/**
 * Where the run's latest done ordering analysis placed this complex: its distance (median of
 * the Monte Carlo draws, 68 % and 95 % intervals), the probability of the near root, how the
 * distance was chosen, its arm and its offset from that arm's ridge, measured positive ahead in
 * the sense of rotation.
 */
export function AnalysisPlacementPanel({
  projectId,
  analysis: a,
}: {
  projectId: string;
  analysis: ComplexAnalysis | null;
}) {
  const arms = `/projects/${projectId}/arms`;
  if (!a)
    return (
      <Panel title="Ordering analysis">
        <p className="text-sm text-ink-soft">
          No ordering analysis of this run has finished yet. Run one on{' '}
          <Link href={arms} className="text-accent underline">
            Arms &amp; ordering
          </Link>{' '}
          to give this complex a kinematic distance and an arm.
        </p>
      </Panel>
    );
  return (
    <Panel
      title={`From analysis ${fmtWhen(a.finishedAt)}`}
      actions={
        <Link
          href={`${arms}?analysis=${a.id}#result`}
          className="text-sm text-accent hover:underline"
        >
          Open the analysis
        </Link>
      }
    >
      <dl className="divide-y divide-rule/60 text-sm" data-testid="complex-analysis">
        <Row label="distance (kpc)">
          <span data-testid="analysis-dist">{fmt(a.distKpc, 2)}</span>
        </Row>
        <Row label="68 % interval (kpc)">{fmtRange(a.distLoKpc, a.distHiKpc, 2)}</Row>
        <Row label="95 % interval (kpc)">{fmtRange(a.distCi95?.[0], a.distCi95?.[1], 2)}</Row>
        <Row label="P(near)">{fmt(a.pNear, 2)}</Row>
        <Row label="chosen by">
          <span className="font-sans">{CHOICE_WORDS[a.choice]}</span>
        </Row>
        <Row label="arm">
          <span className="font-sans" data-testid="analysis-arm">
            {a.arm ?? 'none within the arm width'}
          </span>
        </Row>
        <Row label="offset from the ridge (pc)">{pc(a.perpOffsetKpc)}</Row>
      </dl>
      <p className="mt-3 text-xs text-ink-soft">
        Distance: median of the analysis’s distance draws. Offset: positive ahead of the ridge in
        the sense of Galactic rotation.
        {a.used ? '' : ' This complex was left out of the ordering statistics.'}
      </p>
    </Panel>
  );
}
