'use client';

import { Button } from '@/components/ui/button';
import { NEW_ARM_ROW, type ArmRowDraft } from './settings-model';

const COLUMNS: { key: keyof ArmRowDraft; label: string; numeric: boolean }[] = [
  { key: 'name', label: 'Name', numeric: false },
  { key: 'Rref', label: 'R_ref (kpc)', numeric: true },
  { key: 'betaRefDeg', label: 'β_ref (°)', numeric: true },
  { key: 'pitchDeg', label: 'Pitch ψ (°)', numeric: true },
  { key: 'betaMinDeg', label: 'β from (°)', numeric: true },
  { key: 'betaMaxDeg', label: 'β to (°)', numeric: true },
];

const cell =
  'w-full rounded border border-rule bg-white px-2 py-1 text-sm focus:border-accent focus:outline-none focus:ring-2 focus:ring-accent/20';

/**
 * The custom arms as a small table form: one log spiral per row, ln(R/R_ref) = −(β − β_ref) tan ψ
 * over the β range (Reid et al. 2014 form). Cells with an error are outlined and carry the message.
 */
export function ArmsEditor({
  rows,
  onChange,
  errors,
  disabled,
}: {
  rows: ArmRowDraft[];
  onChange: (rows: ArmRowDraft[]) => void;
  errors: Record<string, string>;
  disabled: boolean;
}) {
  const set = (i: number, key: keyof ArmRowDraft, value: string) =>
    onChange(rows.map((r, j) => (j === i ? { ...r, [key]: value } : r)));
  return (
    <div className="space-y-2">
      <div className="relative overflow-x-auto rounded-md border border-rule bg-white/70">
        <table className="w-full text-sm" aria-label="Custom arms">
          <thead className="border-b border-rule text-left text-xs text-ink-soft">
            <tr>
              {COLUMNS.map((c) => (
                <th key={c.key} className={`px-2 py-1.5 ${c.numeric ? 'text-right' : ''}`}>
                  {c.label}
                </th>
              ))}
              <th className="px-2 py-1.5">
                <span className="sr-only">Remove</span>
              </th>
            </tr>
          </thead>
          <tbody className="divide-y divide-rule/70">
            {rows.map((r, i) => (
              <tr key={i}>
                {COLUMNS.map((c) => {
                  const err = errors[`arm${i}.${c.key}`];
                  return (
                    <td key={c.key} className="px-1.5 py-1">
                      <input
                        className={`${cell} ${c.numeric ? 'num min-w-16' : 'min-w-28'} ${err ? 'border-danger' : ''}`}
                        aria-label={`Arm ${i + 1} ${c.label}`}
                        aria-invalid={err ? true : undefined}
                        title={err}
                        inputMode={c.numeric ? 'decimal' : undefined}
                        value={r[c.key]}
                        disabled={disabled}
                        onChange={(e) => set(i, c.key, e.target.value)}
                      />
                    </td>
                  );
                })}
                <td className="px-1.5 py-1">
                  <Button
                    type="button"
                    variant="quiet"
                    className="px-2 py-0.5 text-xs"
                    disabled={disabled}
                    aria-label={`Remove arm ${i + 1}`}
                    onClick={() => onChange(rows.filter((_, j) => j !== i))}
                  >
                    Remove
                  </Button>
                </td>
              </tr>
            ))}
            {rows.length === 0 && (
              <tr>
                <td colSpan={COLUMNS.length + 1} className="px-3 py-3 text-center text-ink-soft">
                  No arms yet: add one, or copy a preset’s arms to start from.
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
      <Button
        type="button"
        variant="quiet"
        className="px-2.5 py-1 text-xs"
        disabled={disabled}
        onClick={() => onChange([...rows, { ...NEW_ARM_ROW, name: `Arm ${rows.length + 1}` }])}
      >
        Add arm
      </Button>
    </div>
  );
}
