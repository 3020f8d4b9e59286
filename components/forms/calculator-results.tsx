'use client';

import { useState } from 'react';
import { ApiError } from '@/lib/api-client';
import { linesReport } from '@/lib/calculators';
import { Button } from '@/components/ui/button';

/** Rows shown on screen; the CSV always holds every row. */
export const SHOWN_ROWS = 500;

/** One CSV field: quoted when it holds a comma, quote or line break; empty for null. */
export function csvField(value: string | number | null): string {
  if (value === null) return '';
  const s = String(value);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** CSV text (header line, then one line per row). */
export function toCsv(header: string[], rows: Array<Array<string | number | null>>): string {
  return [header, ...rows].map((r) => r.map(csvField).join(',')).join('\n') + '\n';
}

/** Saves text as a file through a temporary object URL. */
export function downloadText(filename: string, text: string, type: string): void {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const a = document.createElement('a');
  a.href = url;
  a.download = filename;
  a.click();
  // Revoking at once can cancel the download in some browsers.
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

/** "Copy CSV" and "Download CSV" for a result table. */
export function CsvActions({ csv, filename }: { csv: string; filename: string }) {
  const [note, setNote] = useState<string | null>(null);
  return (
    <div className="flex items-center gap-2">
      {note && <span className="text-xs text-ink-soft">{note}</span>}
      <Button
        type="button"
        variant="quiet"
        onClick={async () => {
          try {
            await navigator.clipboard.writeText(csv);
            setNote('Copied.');
          } catch {
            setNote('The browser refused the clipboard; use Download CSV.');
          }
        }}
      >
        Copy CSV
      </Button>
      <Button type="button" variant="quiet" onClick={() => downloadText(filename, csv, 'text/csv')}>
        Download CSV
      </Button>
    </div>
  );
}

export type Column = { label: string; numeric?: boolean };

/**
 * A result table: numeric columns right-aligned in monospaced digits, units in the headers.
 * Shows the first {@link SHOWN_ROWS} rows; `selected` highlights one row and `onSelect` makes
 * rows clickable.
 */
export function ResultsTable({
  caption,
  columns,
  rows,
  selected,
  onSelect,
}: {
  caption: string;
  columns: Column[];
  rows: Array<Array<React.ReactNode>>;
  selected?: number;
  onSelect?: (index: number) => void;
}) {
  const shown = rows.slice(0, SHOWN_ROWS);
  return (
    <div className="overflow-x-auto rounded-md border border-rule bg-white">
      <table className="min-w-full text-sm">
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-paper-deep/60 text-xs text-ink-soft">
          <tr>
            {columns.map((c) => (
              <th
                key={c.label}
                scope="col"
                className={`px-3 py-2 font-medium whitespace-nowrap ${c.numeric ? 'text-right' : 'text-left'}`}
              >
                {c.label}
              </th>
            ))}
          </tr>
        </thead>
        <tbody className="divide-y divide-rule/70">
          {shown.map((row, i) => (
            <tr
              key={i}
              aria-selected={onSelect ? selected === i : undefined}
              onClick={onSelect ? () => onSelect(i) : undefined}
              className={`${onSelect ? 'cursor-pointer hover:bg-accent-soft/40' : ''} ${selected === i ? 'bg-accent-soft/70' : ''}`}
            >
              {row.map((cell, j) => (
                <td
                  key={j}
                  className={`px-3 py-1.5 whitespace-nowrap ${columns[j]?.numeric ? 'num' : ''}`}
                >
                  {cell}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
      {rows.length > SHOWN_ROWS && (
        <p className="border-t border-rule px-3 py-2 text-xs text-ink-soft">
          Showing the first {SHOWN_ROWS} of {rows.length} rows; the CSV holds all of them.
        </p>
      )}
    </div>
  );
}

/** A labelled multi-line input for pasted rows. */
export function PasteArea({
  label,
  hint,
  ...props
}: React.TextareaHTMLAttributes<HTMLTextAreaElement> & { label: string; hint?: string }) {
  return (
    <label className="block space-y-1 text-sm">
      <span className="font-medium text-ink">{label}</span>
      <textarea
        spellCheck={false}
        className="w-full rounded-md border border-rule bg-white px-3 py-2 font-mono text-sm shadow-inner shadow-black/[0.02] focus:border-accent focus:ring-2 focus:ring-accent/20 focus:outline-none"
        {...props}
      />
      {hint && <span className="block text-xs text-ink-soft">{hint}</span>}
    </label>
  );
}

/**
 * Turns an API error that names `points[i]` / `sources[i]` entries into lines naming the pasted
 * lines they came from, first first (`Line 4: …`), with the count of the ones not listed.
 */
export function lineMessage(message: string, details: unknown, lines: number[]): string {
  const entries = Array.isArray(details)
    ? (details as { index?: unknown; message?: unknown }[]).filter(
        (d) => typeof d?.index === 'number' && lines[d.index] !== undefined,
      )
    : [];
  if (entries.length === 0) return message;
  const problems = entries.map((d) => ({
    line: lines[d.index as number],
    reason: typeof d.message === 'string' ? d.message : message,
  }));
  // The API lists at most MAX_REPORTED_PROBLEMS entries and counts the rest in its message.
  const more = /\(and (\d+) more bad \w+\)$/.exec(message);
  const unlisted = more ? Number(more[1]) + 1 - entries.length : 0;
  const report = linesReport(problems);
  return unlisted > 0
    ? `${report}\nand ${unlisted} more bad line${unlisted === 1 ? '' : 's'}.`
    : report;
}

/**
 * The message for a failed calculation: an API error that names an entry is told by the pasted
 * line it came from (`readLines` re-reads the paste; if that fails the API's words stand).
 */
export function calculationError(e: Error, readLines: () => { line: number }[]): string {
  if (!(e instanceof ApiError)) return e.message;
  let lines: number[] = [];
  try {
    lines = readLines().map((r) => r.line);
  } catch {
    // The paste no longer reads: keep the API's message as it is.
  }
  return lineMessage(e.message, e.details, lines);
}
