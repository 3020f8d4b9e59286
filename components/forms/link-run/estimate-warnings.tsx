import type { Estimate } from '@/components/link-runs/types';
import type { ScalingWarning } from '@/lib/schemas/link-run-request';

/** The estimate as the API returns it: links forecast per pair, and scaling warnings. */
export type EstimateJson = Omit<Estimate, 'pairs'> & {
  pairs: (Estimate['pairs'][number] & { expectedLinks: number })[];
  expectedLinks: number;
  warnings: ScalingWarning[];
};

/** Each chosen catalog that lacks a quantity the tolerances scale by, with how many rows. */
export function EstimateWarnings({ warnings }: { warnings: ScalingWarning[] }) {
  if (warnings.length === 0) return null;
  return (
    <ul
      className="space-y-1 rounded-md border border-danger/30 bg-paper-deep px-3 py-2 text-xs"
      aria-label="Warnings about the chosen catalogs"
    >
      {warnings.map((w) => (
        <li key={`${w.catalogId}-${w.quantity}`}>{w.message}</li>
      ))}
    </ul>
  );
}
