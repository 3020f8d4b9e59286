import { execFile } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import mysql from 'mysql2/promise';
import Papa from 'papaparse';
import type { Client } from '../helpers/client';
import { upload, waitForCatalog } from '../helpers/catalogs';
import { makeTeam, type Team } from '../helpers/team';

/** Deterministic pseudo-random numbers (a linear congruential generator; common practice). */
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => (s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32;
}

/** Quotes a cell for the uploaded CSV (RFC 4180). */
const q = (cell: string) => (/[",\r\n]/.test(cell) ? `"${cell.replace(/"/g, '""')}"` : cell);

/**
 * What our CSV writer makes of an uploaded cell: the OWASP formula guard puts `'` before text
 * that starts like a formula and is not a plain number (lib/export/csv.ts); nothing else changes.
 */
const csvOf = (cell: string) =>
  /^[=+\-@\t\r]/.test(cell) && !/^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/.test(cell)
    ? `'${cell}`
    : cell;

const N_A = 60;
/** Catalog A: 40 columns, positions in RA/Dec (so l, b are computed and carry float noise). */
const A_HEADER = [
  'RA_DEG',
  'DEC_DEG',
  'VLSR',
  'FWHM',
  'name',
  ...Array.from({ length: 35 }, (_, i) => `X${String(i + 1).padStart(2, '0')}`),
];
A_HEADER[10] = 'σ_v (km/s)';
A_HEADER[11] = 'Note, free text';
function aRows(): string[][] {
  const r = lcg(7);
  return Array.from({ length: N_A }, (_, i) => {
    const row = A_HEADER.map((_, k) => {
      switch (k % 7) {
        case 0:
          return (r() * 100 - 50).toFixed(1 + (k % 9));
        case 1:
          return `${(r() * 10).toExponential(3)}`;
        case 2:
          return ['Núcleo Ω', 'a,b', 'say "hi"', '=SUM(A1)', '-12.5', '@home', ''][(i + k) % 7];
        case 3:
          return String(Math.floor(r() * 1e6));
        case 4:
          return `text ${i}-${k}`;
        case 5:
          return ['+cmd', 'x;y', '0.10', '1e-5', 'NaN', '—'][(i * k) % 6];
        default:
          return (r() * 1e-3).toPrecision(4);
      }
    });
    // Mapped columns: RA, Dec in the first quadrant of the plane, v_LSR, FWHM, name.
    row[0] = (280 + r() * 10).toFixed(5);
    row[1] = (-5 + r() * 5).toFixed(5);
    row[2] = (r() * 100 - 20).toFixed(2);
    row[3] = (1 + r() * 5).toFixed(2);
    row[4] = `CO-${i + 1}`;
    return row;
  });
}

const toCsv = (header: string[], rows: string[][]) =>
  [header, ...rows].map((r) => r.map(q).join(',')).join('\n') + '\n';

const B_HEADER = ['GLON', 'GLAT', 'VLSR', 'NAME', 'FLUX_MJY', 'Comment'];

/**
 * Runs the independent reader (Debian's astropy) on a VOTable and its CSV. Asynchronously: a
 * blocked event loop would let the HTTP client reuse a keep-alive socket the server has closed.
 */
async function astropyRead(vot: string, csv?: string) {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lanewise-export-'));
  fs.writeFileSync(path.join(dir, 'x.vot'), vot);
  const args = ['tests/helpers/votable-check.py', path.join(dir, 'x.vot')];
  if (csv !== undefined) {
    fs.writeFileSync(path.join(dir, 'x.csv'), csv);
    args.push(path.join(dir, 'x.csv'));
  }
  try {
    const { stdout } = await promisify(execFile)('/usr/bin/python3', args, {
      maxBuffer: 256 * 1024 * 1024,
    });
    return JSON.parse(stdout) as {
      fields: {
        name: string;
        datatype: string;
        arraysize: string | null;
        precision: string | null;
        unit: string | null;
        ucd: string | null;
        description: string | null;
      }[];
      rows: unknown[][];
      csv?: { header: string[]; rows: string[][] };
    };
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

async function text(client: Client, url: string) {
  const res = await client.get(url);
  expect([url, res.status]).toEqual([url, 200]);
  return res.text();
}

describe('joined exports a paper can publish', () => {
  let t: Team;
  let conn: mysql.Connection;
  let catA: string;
  let catB: string;
  let runId: string;
  const A = aRows();
  let B: string[][];

  beforeAll(async () => {
    conn = await mysql.createConnection(process.env.DATABASE_URL!);
    t = await makeTeam('joined');
    const upA = await upload(t.editor, t.projectId, {
      content: toCsv(A_HEADER, A),
      name: 'CO clouds, survey',
      kind: 'co',
      mapping: {
        position: {
          system: 'equatorial',
          lon: { column: 'RA_DEG', unit: 'deg' },
          lat: { column: 'DEC_DEG', unit: 'deg' },
        },
        velocity: { column: 'VLSR', unit: 'km/s', frame: 'lsr', convention: 'radio' },
        lineWidth: { column: 'FWHM', unit: 'km/s', kind: 'fwhm' },
        name: { column: 'name' },
      },
    });
    expect(upA.status).toBe(202);
    const a = await waitForCatalog(t.editor, upA.body.catalog.id);
    expect([a.status, a.rowCount]).toEqual(['ready', N_A]);
    catA = a.id;

    // B sits 1″ from each A source at the same velocity: every A source gets one link.
    const normal = Papa.parse<Record<string, string>>(
      await text(t.editor, `/api/catalogs/${catA}/export.csv`),
      { header: true, skipEmptyLines: true },
    ).data;
    B = normal.map((s, i) => [
      String(Number(s.l_deg) + 1 / 3600),
      s.b_deg,
      s.v_lsr_kms,
      `HII-${i + 1}`,
      (i * 1.1).toFixed(2),
      i % 2 ? 'ring, "bright"' : 'Ω',
    ]);
    const upB = await upload(t.editor, t.projectId, {
      content: toCsv(B_HEADER, B),
      name: 'HII regions (Ω)',
      kind: 'hii',
    });
    expect(upB.status).toBe(202);
    const b = await waitForCatalog(t.editor, upB.body.catalog.id);
    expect([b.status, b.rowCount]).toEqual(['ready', N_A]);
    catB = b.id;

    const start = await t.editor.json<{ run: { id: string } }>(
      'POST',
      `/api/projects/${t.projectId}/link-runs`,
      {
        catalogIds: [catA, catB],
        radius: { mode: 'fixed', arcsec: 10 },
        velocity: { mode: 'fixed', kms: 1 },
        linkMode: 'all',
        chanceTrials: 0,
      },
    );
    expect(start.status).toBe(202);
    runId = start.body.run.id;
    const deadline = Date.now() + 120_000;
    for (;;) {
      const r = await t.editor.json<{ run: { status: string } }>('GET', `/api/link-runs/${runId}`);
      if (r.body.run.status === 'done') break;
      expect(['queued', 'running']).toContain(r.body.run.status);
      if (Date.now() > deadline) throw new Error('link run did not finish');
      await new Promise((res) => setTimeout(res, 250));
    }
  });

  afterAll(async () => {
    await conn?.end();
  });

  it('joins every original column of both sides, equal to the uploaded cells in CSV and VOTable', async () => {
    const base = `/api/link-runs/${runId}`;
    const csv = await text(t.viewer, `${base}/export.csv?shape=links&columns=original`);
    const vot = await text(t.viewer, `${base}/export.vot?shape=links&columns=original`);
    const read = await astropyRead(vot, csv);
    const header = read.csv!.header;
    // The uploaded `name` meets our own `a_name` (source name): it becomes `a_name_2`.
    const aCol = (c: string) => (c === 'name' ? 'a_name_2' : `a_${c}`);
    for (const c of A_HEADER) expect(header).toContain(aCol(c));
    for (const c of B_HEADER) expect(header).toContain(`b_${c}`);
    // 19 canonical columns, then the uploaded ones of both sides.
    expect(header.length).toBe(19 + A_HEADER.length + B_HEADER.length);
    expect(read.fields.map((f) => f.name)).toEqual(header);
    expect(read.csv!.rows.length).toBe(N_A);
    expect(read.rows.length).toBe(N_A);

    const at = (name: string) => header.indexOf(name);
    for (let i = 0; i < N_A; i++) {
      const cells = read.csv!.rows[i];
      const votCells = read.rows[i];
      const up = A[Number(cells[at('row_a')]) - 1];
      const upB = B[Number(cells[at('row_b')]) - 1];
      expect(cells[at('catalog_a_name')]).toBe('CO clouds, survey');
      expect(cells[at('catalog_b_name')]).toBe('HII regions (Ω)');
      expect(cells[at('catalog_a')]).toBe(catA);
      A_HEADER.forEach((c, k) => {
        expect([c, cells[at(aCol(c))]]).toEqual([c, csvOf(up[k])]);
        expect([c, votCells[at(aCol(c))] ?? '']).toEqual([c, up[k]]);
      });
      B_HEADER.forEach((c, k) => {
        expect([c, cells[at(`b_${c}`)]]).toEqual([c, csvOf(upB[k])]);
        expect([c, votCells[at(`b_${c}`)] ?? '']).toEqual([c, upB[k]]);
      });
    }
  });

  it('gives every quantity a unit and a UCD1+ word, and writes no value wider than its precision', async () => {
    const base = `/api/link-runs/${runId}`;
    for (const shape of ['links', 'complexes', 'sources']) {
      const csv = await text(t.viewer, `${base}/export.csv?shape=${shape}`);
      // The reader fails on any astropy warning, an unknown UCD word or unit, or a wide value.
      const read = await astropyRead(
        await text(t.viewer, `${base}/export.vot?shape=${shape}`),
        csv,
      );
      expect(read.fields.map((f) => f.name)).toEqual(read.csv!.header);
      for (const f of read.fields) {
        expect([f.name, !!f.ucd, !!f.description]).toEqual([f.name, true, true]);
        if (f.datatype === 'double') expect([f.name, f.precision]).not.toEqual([f.name, null]);
        if (f.datatype === 'char' || f.datatype === 'unicodeChar') expect(f.arraysize).toBeTruthy();
      }
      const by = new Map(read.fields.map((f) => [f.name, f]));
      // Units and UCDs: VOUnits and the IVOA UCD1+ list (astropy's copy of it)
      const units: Record<string, string> = {
        links:
          'separation_arcsec=arcsec|pos.angDistance,delta_v_kms=km / s|spect.dopplerVeloc.radio;arith.diff,a_l=deg|pos.galactic.lon,b_b=deg|pos.galactic.lat,a_v=km / s|spect.dopplerVeloc.radio,row_a=|meta.record',
        complexes:
          'l_deg=deg|pos.galactic.lon;stat.mean,max_separation_arcsec=arcsec|pos.angDistance;stat.max,v_lsr_kms=km / s|spect.dopplerVeloc.radio;stat.mean',
        sources:
          'line_width_sigma_kms=km / s|phys.veloc.dispersion,dist_kpc=kpc|pos.distance,v_err_kms=km / s|stat.error;spect.dopplerVeloc.radio,catalog_name=|meta.title;meta.dataset',
      };
      for (const pair of units[shape].split(',')) {
        const [name, want] = pair.split('=');
        const f = by.get(name)!;
        expect([name, `${f.unit ?? ''}|${f.ucd}`]).toEqual([name, want]);
      }
    }
  });

  it('writes computed positions without float noise, to 8 decimals', async () => {
    const table = `catrows_${catA.replace(/-/g, '')}`;
    const [stored] = await conn.query<mysql.RowDataPacket[]>(
      `SELECT \`row\`, CAST(l AS CHAR) AS l FROM \`${table}\` ORDER BY \`row\``,
    );
    // RA/Dec → l, b leaves digits past the 8th decimal in the stored doubles (exact geometry
    // has no reason to land on 8 decimals), which the export must not show.
    expect(stored.some((r) => /\.\d{9,}/.test(String(r.l)))).toBe(true);
    const sources = Papa.parse<Record<string, string>>(
      await text(t.viewer, `/api/link-runs/${runId}/export.csv?shape=sources`),
      { header: true, skipEmptyLines: true },
    ).data.filter((s) => s.catalog_id === catA);
    expect(sources.length).toBe(N_A);
    for (const s of sources) {
      const l = String(stored[Number(s.row) - 1].l);
      expect(s.l_deg).toMatch(/^\d+(\.\d{1,8})?$/);
      expect(Math.abs(Number(s.l_deg) - Number(l))).toBeLessThanOrEqual(5e-9);
      expect(s.line_width_sigma_kms).toMatch(/^\d+(\.\d{1,3})?$/);
      expect(s.catalog_name).toBe('CO clouds, survey');
    }
  });

  it('joins sources of two catalogs with different columns under a prefix per catalog, empty where absent', async () => {
    const csv = await text(
      t.viewer,
      `/api/link-runs/${runId}/export.csv?shape=sources&columns=original`,
    );
    const read = await astropyRead(
      await text(t.viewer, `/api/link-runs/${runId}/export.vot?shape=sources&columns=original`),
      csv,
    );
    const header = read.csv!.header;
    const pa = 'CO_clouds_survey_';
    const pb = 'HII_regions_Ω_';
    for (const c of A_HEADER) expect(header).toContain(`${pa}${c}`);
    for (const c of B_HEADER) expect(header).toContain(`${pb}${c}`);
    const at = (n: string) => header.indexOf(n);
    expect(read.csv!.rows.length).toBe(2 * N_A);
    read.csv!.rows.forEach((cells, i) => {
      const fromA = cells[at('catalog_id')] === catA;
      const up = (fromA ? A : B)[Number(cells[at('row')]) - 1];
      A_HEADER.forEach((c, k) => {
        expect(cells[at(`${pa}${c}`)]).toBe(fromA ? csvOf(up[k]) : '');
        expect(read.rows[i][at(`${pa}${c}`)] ?? '').toBe(fromA ? up[k] : '');
      });
      B_HEADER.forEach((c, k) => {
        expect(cells[at(`${pb}${c}`)]).toBe(fromA ? '' : csvOf(up[k]));
        expect(read.rows[i][at(`${pb}${c}`)] ?? '').toBe(fromA ? '' : up[k]);
      });
    });
  });

  it('states the decimals of every quantity in methods.json and names catalogs in the catalog export', async () => {
    const methods = await t.viewer.json<{
      exportPrecision: { decimals: { quantity: string; unit: string; decimals: number }[] };
      catalogs: { id: string; name: string }[];
    }>('GET', `/api/link-runs/${runId}/methods.json`);
    expect(methods.body.exportPrecision.decimals).toContainEqual({
      quantity: 'Galactic longitude and latitude',
      unit: 'deg',
      decimals: 8,
    });
    expect(methods.body.catalogs.map((c) => c.name).sort()).toEqual([
      'CO clouds, survey',
      'HII regions (Ω)',
    ]);
    const rows = Papa.parse<Record<string, string>>(
      await text(t.viewer, `/api/catalogs/${catB}/export.csv`),
      { header: true, skipEmptyLines: true },
    ).data;
    expect(rows.length).toBe(N_A);
    expect(rows.every((r) => r.catalog_name === 'HII regions (Ω)')).toBe(true);
    expect(rows.every((r) => /^\d+(\.\d{1,8})?$/.test(r.l_deg))).toBe(true);
  });
});
