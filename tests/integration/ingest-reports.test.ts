import fs from 'node:fs';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { newUser, type Client } from '../helpers/client';
import { planeCsv, upload, waitForCatalog, type CatalogJson } from '../helpers/catalogs';

type Report = CatalogJson & {
  policy: string;
  dataRowCount: number | null;
  decimalComma: boolean;
  assumptions: string[];
  rejected: { line: number; reason: string }[];
};

const decimalCommaFile = fs.readFileSync(
  path.join(__dirname, '../fixtures/ingest/hii-decimal-comma.csv'),
  'utf8',
);

/** Sends a multipart form with the file and extra text fields; returns status and JSON. */
async function post(client: Client, url: string, content: string, fields: Record<string, string>) {
  const form = new FormData();
  form.set('file', new Blob([content]), 'catalog.csv');
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  const res = await client.request('POST', url, form);
  return { status: res.status, body: await res.json() };
}

async function report(client: Client, id: string): Promise<Report> {
  await waitForCatalog(client, id);
  const r = await client.json<{ catalog: Report }>('GET', `/api/catalogs/${id}`);
  return r.body.catalog;
}

describe('parse reports and hostile files', () => {
  let owner: Client;
  let projectId: string;
  beforeAll(async () => {
    owner = (await newUser('ingest-reports')).client;
    const p = await owner.json<{ project: { id: string } }>('POST', '/api/projects', {
      name: 'Ingest reports',
    });
    projectId = p.body.project.id;
  });

  it('a catalog whose every row failed lists and counts each rejected row, with a clean message', async () => {
    // Decimal commas read without the option: every numeric cell is "not a number".
    const up = await post(owner, `/api/projects/${projectId}/catalogs`, decimalCommaFile, {
      name: 'All bad',
      kind: 'hii',
      mapping: JSON.stringify({
        position: {
          system: 'galactic',
          lon: { column: 'GLON', unit: 'deg' },
          lat: { column: 'GLAT', unit: 'deg' },
        },
      }),
    });
    expect(up.status).toBe(202);
    const c = await report(owner, up.body.catalog.id);
    expect(c.status).toBe('failed');
    expect(c.rowCount).toBe(0);
    expect(c.dataRowCount).toBe(4); // the fixture's four data rows
    expect(c.rejectedCount).toBe(4);
    expect(c.rejected.map((r) => r.line)).toEqual([3, 4, 5, 6]); // after comment and header
    expect(c.error).toMatch(/all 4 data rows were rejected; the first is line 3: field `GLON`/);
    expect(c.error).not.toMatch(/\.$/);
  });

  it('reject-file policy: reads to the end and reports every bad row with agreeing counts', async () => {
    const csv = planeCsv(50, ['12.5,95.2,10,BAD-LAT', '13.0,abc,10,BAD-NUM']);
    const up = await upload(owner, projectId, { content: csv, policy: 'reject-file' });
    expect(up.status).toBe(202);
    const c = await report(owner, up.body.catalog.id);
    expect(c.status).toBe('failed');
    expect(c.rowCount).toBe(0);
    expect(c.dataRowCount).toBe(52);
    expect(c.rejectedCount).toBe(2);
    expect(c.rejected.map((r) => r.line)).toEqual([53, 54]); // 2 lines before the 50 good rows
    expect(c.error).toMatch(/2 of 52 data rows are bad; the first is line 53/);
  });

  it('detects decimal commas in the preview and reads them when asked, end to end', async () => {
    const pre = await post(
      owner,
      `/api/projects/${projectId}/catalogs/preview`,
      decimalCommaFile,
      {},
    );
    expect(pre.status).toBe(200);
    expect(pre.body.preview.delimiter).toBe(';');
    expect(pre.body.decimalComma).toEqual({ columns: ['GLON', 'GLAT', 'VLSR'], applied: true });
    const mapping = pre.body.suggestion.mapping;
    expect(mapping.position.lon.column).toBe('GLON');

    const up = await post(owner, `/api/projects/${projectId}/catalogs`, decimalCommaFile, {
      name: 'Decimal commas',
      kind: 'hii',
      decimalComma: 'true',
      mapping: JSON.stringify(mapping),
    });
    expect(up.status).toBe(202);
    const c = await report(owner, up.body.catalog.id);
    expect(c.status).toBe('ready');
    expect(c.rowCount).toBe(4);
    expect(c.rejectedCount).toBe(0);
    expect(c.decimalComma).toBe(true);
    expect(c.assumptions.some((a) => /decimal comma/.test(a))).toBe(true);
    const rows = await owner.json<{ rows: { name: string; l: number; b: number; v: number }[] }>(
      'GET',
      `/api/catalogs/${c.id}/rows?pageSize=10&sort=row`,
    );
    // The fixture's cells with the comma read as a decimal point.
    expect(rows.body.rows.map((r) => [r.name, r.l, r.b, r.v])).toEqual([
      ['DC-1', 30.1, -0.25, 95.5],
      ['DC-2', 45.75, 0.5, 58.25],
      ['DC-3', 310.2, -1.125, -42.5],
      ['DC-4', 12.05, 0.04, 18.0],
    ]);
  });

  it('a NUL byte past the first KB rejects the file, naming line and byte, and stores nothing', async () => {
    const lines = planeCsv(120).split('\n');
    lines[100] = lines[100].replace('SRC', 'X\0Y'); // data row 99 sits on file line 101
    const csv = lines.join('\n');
    const byte = Buffer.from(csv).indexOf(0) + 1;
    expect(byte).toBeGreaterThan(1024);
    const up = await upload(owner, projectId, { content: csv, name: 'NUL inside' });
    expect(up.status).toBe(400);
    expect(up.body.error.code).toBe('binary-file');
    expect(up.body.error.message).toContain(`line 101 (byte ${byte})`);
    const list = await owner.json<{ catalogs: { name: string }[] }>(
      'GET',
      `/api/projects/${projectId}/catalogs`,
    );
    expect(list.body.catalogs.map((x) => x.name)).not.toContain('NUL inside');

    // Past the part read at upload, the ingest fails with the same reason and no row report.
    const big = planeCsv(6000).split('\n');
    big[5000] = big[5000].replace('SRC', 'X\0Y');
    const late = await upload(owner, projectId, {
      content: [...big.slice(0, 20), '1.0,95.0,1,BAD-LAT', ...big.slice(20)].join('\n'),
      name: 'NUL late',
    });
    expect(late.status).toBe(202);
    const c = await report(owner, late.body.catalog.id);
    expect(c.status).toBe('failed');
    expect(c.error).toMatch(/^line 5002 \(byte \d+\): binary data/);
    expect(c.rejectedCount).toBe(0);
    expect(c.rejected).toEqual([]);
    expect(c.dataRowCount).toBeNull();
  });

  it('stores a raw row over 64 KB whole: the catalog export carries it intact', async () => {
    const longName = 'N'.repeat(70_000);
    const csv = planeCsv(3, [`12.0,0.5,10,${longName}`]);
    const up = await upload(owner, projectId, { content: csv, name: 'Long row' });
    expect(up.status).toBe(202);
    const c = await report(owner, up.body.catalog.id);
    expect(c.status).toBe('ready');
    expect(c.rowCount).toBe(4);
    const res = await owner.request('GET', `/api/catalogs/${c.id}/export.csv`);
    expect(res.status).toBe(200);
    const text = await res.text();
    expect(text).toContain(longName);
  });

  it('a multi-megabyte single line is reported as a long line, not as an unclosed quote', async () => {
    // 4 MB stays under the test upload limit (UPLOAD_LIMIT_MB=5 in scripts/setup.mjs).
    const line = Array.from({ length: 500_000 }, (_, i) => (i % 360) + 0.5).join(',');
    expect(line.length).toBeGreaterThan(2 * 1024 * 1024);
    const up = await upload(owner, projectId, { content: line, name: 'One line' });
    expect(up.status).toBe(400);
    expect(up.body.error.code).toBe('line-too-long');
    expect(up.body.error.message).toBe(
      'line 1 is longer than 1 MB; is this a delimited text file with line breaks?',
    );
  });
});
