/** The parse-report fields of a catalog as `GET /api/catalogs/{id}` returns them. */
export interface ParseReportJson {
  status: 'queued' | 'ingesting' | 'ready' | 'failed';
  /** `skip-bad-rows` or `reject-file`. */
  policy: string;
  rowCount: number;
  rejectedCount: number;
  /** Data rows read when the file was read to its end; null when reading stopped early. */
  dataRowCount: number | null;
  error: string | null;
  rejected: { line: number; reason: string }[];
}

const count = (n: number) => n.toLocaleString('en-US');
const rows = (n: number) => `${count(n)} data row${n === 1 ? '' : 's'}`;

/** A stored reason as one sentence: a closing period added once, never doubled. */
export function asSentence(text: string): string {
  const t = text.trim().replace(/\.+$/, '');
  return t.length === 0 ? '' : `${t}.`;
}

/**
 * The parse report's summary line for a finished catalog, agreeing with its status, counts and
 * list in every state: ready with or without rejects; failed after every row was rejected or
 * under the reject-file policy (the file was read to its end, `dataRowCount` set); failed for
 * a file-level reason (read stopped early: no row report). `tone` picks the colour.
 */
export function describeParseReport(r: ParseReportJson): {
  tone: 'ok' | 'warn' | 'error';
  text: string;
} {
  const listed =
    r.rejected.length < r.rejectedCount
      ? ` The first ${count(r.rejected.length)} are listed.`
      : r.rejectedCount > 0
        ? ' They are listed below.'
        : '';
  if (r.status === 'ready') {
    const read = r.dataRowCount ?? r.rowCount + r.rejectedCount;
    if (r.rejectedCount === 0) {
      return { tone: 'ok', text: `All ${rows(read)} were read and stored; none was rejected.` };
    }
    return {
      tone: 'warn',
      text: `${count(r.rowCount)} of ${rows(read)} were stored; ${count(r.rejectedCount)} ${r.rejectedCount === 1 ? 'was' : 'were'} rejected and left out of the catalog.${listed}`,
    };
  }
  if (r.dataRowCount === null) {
    return {
      tone: 'error',
      text: `The file could not be read to its end, so no row was stored and no row was checked: ${asSentence(r.error ?? 'no reason was recorded')}`,
    };
  }
  if (r.policy === 'reject-file' && r.rejectedCount > 0) {
    return {
      tone: 'error',
      text: `${count(r.rejectedCount)} of ${rows(r.dataRowCount)} ${r.rejectedCount === 1 ? 'is' : 'are'} bad, so the whole file was rejected (policy: reject the file on any bad row); no row was stored.${listed}`,
    };
  }
  return {
    tone: 'error',
    text: `All ${rows(r.dataRowCount)} were rejected; no row was stored.${listed}`,
  };
}
