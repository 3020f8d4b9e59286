import { describe, expect, it } from 'vitest';
import { asSentence, describeParseReport, type ParseReportJson } from '@/lib/ingest/report';

const base: ParseReportJson = {
  status: 'ready',
  policy: 'skip-bad-rows',
  rowCount: 10,
  rejectedCount: 0,
  dataRowCount: 10,
  error: null,
  rejected: [],
};
const bad = (n: number) =>
  Array.from({ length: n }, (_, i) => ({
    line: i + 2,
    reason: 'field `b` value `x`: not a number',
  }));

describe('parse report summary', () => {
  it('says "none was rejected" only when nothing was', () => {
    expect(describeParseReport(base)).toEqual({
      tone: 'ok',
      text: 'All 10 data rows were read and stored; none was rejected.',
    });
    const failedAll = describeParseReport({
      ...base,
      status: 'failed',
      rowCount: 0,
      rejectedCount: 4,
      dataRowCount: 4,
      error: 'no row of the file passed validation: all 4 data rows were rejected',
      rejected: bad(4),
    });
    expect(failedAll).toEqual({
      tone: 'error',
      text: 'All 4 data rows were rejected; no row was stored. They are listed below.',
    });
  });

  it('ready with rejects, and a list shorter than the count says so', () => {
    const r = describeParseReport({
      ...base,
      rowCount: 8,
      rejectedCount: 1200,
      dataRowCount: 1208,
      rejected: bad(1000),
    });
    expect(r.tone).toBe('warn');
    expect(r.text).toBe(
      '8 of 1,208 data rows were stored; 1,200 were rejected and left out of the catalog. The first 1,000 are listed.',
    );
  });

  it('reject-file policy and a file-level failure', () => {
    expect(
      describeParseReport({
        ...base,
        status: 'failed',
        policy: 'reject-file',
        rowCount: 0,
        rejectedCount: 2,
        dataRowCount: 52,
        rejected: bad(2),
      }).text,
    ).toBe(
      '2 of 52 data rows are bad, so the whole file was rejected (policy: reject the file on any bad row); no row was stored. They are listed below.',
    );
    expect(
      describeParseReport({
        ...base,
        status: 'failed',
        rowCount: 0,
        dataRowCount: null,
        error: 'line 9 (byte 2001): binary data (a NUL byte) in the file.',
      }).text,
    ).toBe(
      'The file could not be read to its end, so no row was stored and no row was checked: line 9 (byte 2001): binary data (a NUL byte) in the file.',
    );
  });

  it('never doubles a closing period', () => {
    expect(asSentence('see the parse report.')).toBe('see the parse report.');
    expect(asSentence('see the parse report..')).toBe('see the parse report.');
    expect(asSentence('no reason')).toBe('no reason.');
  });
});
