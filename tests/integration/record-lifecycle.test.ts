import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import mysql from 'mysql2/promise';
import Papa from 'papaparse';
import { SaxesParser } from 'saxes';
import type { Client } from '../helpers/client';
import { upload, waitForCatalog } from '../helpers/catalogs';
import { makeTeam, type Team } from '../helpers/team';

const N = 40;

/** N clouds along the plane and, 10″ from each, a young source 1 km/s faster: N links. */
function pairedCsv(offsetArcsec: number, dvKms: number) {
  const lines = ['GLON,GLAT,VLSR,NAME'];
  for (let i = 0; i < N; i++) {
    const l = 20 + i * 0.5 + offsetArcsec / 3600;
    lines.push(`${l.toFixed(6)},0.100000,${(40 + i + dvKms).toFixed(2)},S${i + 1}`);
  }
  return lines.join('\n') + '\n';
}

async function readyCatalog(client: Client, projectId: string, csv: string, name: string) {
  const up = await upload(client, projectId, { content: csv, name, kind: 'co' });
  expect(up.status).toBe(202);
  const c = await waitForCatalog(client, up.body.catalog.id);
  expect(c.status).toBe('ready');
  return c.id;
}

async function waitFinal<T extends { status: string }>(client: Client, url: string, key: string) {
  const deadline = Date.now() + 120_000;
  for (;;) {
    const r = await client.json<Record<string, T>>('GET', url);
    if (['done', 'failed', 'cancelled'].includes(r.body[key].status)) return r.body[key];
    if (Date.now() > deadline) throw new Error(`${url} still ${r.body[key].status}`);
    await new Promise((res) => setTimeout(res, 250));
  }
}

/** Rows of a VOTable's TABLEDATA, checked well-formed by a real XML parser, and its FIELD count. */
function parseVotable(xml: string) {
  const parser = new SaxesParser();
  let fields = 0;
  const rows: number[] = [];
  parser.on('opentag', (t) => {
    if (t.name === 'FIELD') fields++;
    if (t.name === 'TR') rows.push(0);
    if (t.name === 'TD') rows[rows.length - 1]++;
  });
  parser.write(xml).close();
  return { fields, rows };
}

type Summary = { links: number; complexes: number; sources: number };
type Dependents = {
  runs: { id: string; name: string }[];
  analyses: { id: string; name: string }[];
};

describe('protected catalogs and the lifecycle of runs and analyses', () => {
  let t: Team;
  let db: mysql.Connection;
  let catA: string;
  let catB: string;
  let runId: string;
  let summary: Summary;
  let analysisKept: string;
  let analysisDeleted: string;

  const startAnalysis = async () => {
    const r = await t.editor.json<{ analysis: { id: string } }>(
      'POST',
      `/api/projects/${t.projectId}/analyses`,
      { runId, curve: { name: 'reid-2014' }, arms: { preset: 'reid-2014' }, resamples: 2000 },
    );
    expect(r.status).toBe(202);
    await waitFinal(t.editor, `/api/analyses/${r.body.analysis.id}`, 'analysis');
    return r.body.analysis.id;
  };

  beforeAll(async () => {
    t = await makeTeam('lifecycle');
    db = await mysql.createConnection(process.env.DATABASE_URL!);
    catA = await readyCatalog(t.editor, t.projectId, pairedCsv(0, 0), 'Clouds');
    catB = await readyCatalog(t.editor, t.projectId, pairedCsv(10, 1), 'Young');
    const start = await t.editor.json<{ run: { id: string } }>(
      'POST',
      `/api/projects/${t.projectId}/link-runs`,
      {
        catalogIds: [catA, catB],
        radius: { mode: 'fixed', arcsec: 30 },
        velocity: { mode: 'fixed', kms: 3 },
        linkMode: 'all',
        chanceTrials: 1,
        name: 'Paired sample',
      },
    );
    expect(start.status).toBe(202);
    runId = start.body.run.id;
    const run = await waitFinal<{ status: string; summary: Summary }>(
      t.editor,
      `/api/link-runs/${runId}`,
      'run',
    );
    expect(run.status).toBe('done');
    summary = run.summary;
    // Built so: each cloud has exactly one partner (10″ and 1 km/s away; the next is 0.5° away).
    expect(summary.links).toBe(N);
    analysisKept = await startAnalysis();
    analysisDeleted = await startAnalysis();
  }, 300_000);

  afterAll(async () => {
    await db?.end();
  });

  const auditCount = async (action: string, subject: string) => {
    const [rows] = await db.query<mysql.RowDataPacket[]>(
      'SELECT COUNT(*) AS n FROM audit_log WHERE action = ? AND subject = ?',
      [action, subject],
    );
    return Number(rows[0].n);
  };

  it('answers 401 to anonymous callers before any lookup, 404 to outsiders, 403 to viewers', async () => {
    for (const [method, url] of [
      ['PATCH', `/api/catalogs/${catA}`],
      ['DELETE', `/api/catalogs/${catA}`],
      ['PATCH', `/api/link-runs/${runId}`],
      ['DELETE', `/api/link-runs/${runId}`],
      ['PATCH', `/api/analyses/${analysisKept}`],
      ['DELETE', `/api/analyses/${analysisKept}`],
      ['PATCH', '/api/catalogs/no-such-id'],
      ['DELETE', '/api/link-runs/no-such-id'],
      ['PATCH', '/api/analyses/no-such-id'],
    ] as const) {
      const body = method === 'PATCH' ? { archived: true } : undefined;
      expect((await t.anonymous.json(method, url, body)).status, `${method} ${url}`).toBe(401);
      if (!url.includes('no-such-id')) {
        expect((await t.outsider.json(method, url, body)).status, `${method} ${url}`).toBe(404);
        expect((await t.viewer.json(method, url, body)).status, `${method} ${url}`).toBe(403);
      }
    }
    // Nothing changed: the viewer's attempts were refused before the service.
    expect(await auditCount('catalog.archive', catA)).toBe(0);
  });

  it('refuses to delete a catalog that a run and its analyses use, listing them', async () => {
    const r = await t.editor.json<{ error: { code: string; details: Dependents } }>(
      'DELETE',
      `/api/catalogs/${catA}`,
    );
    expect(r.status).toBe(409);
    expect(r.body.error.code).toBe('catalog_in_use');
    expect(r.body.error.details.runs).toEqual([{ id: runId, name: 'Paired sample' }]);
    expect(r.body.error.details.analyses.map((a) => a.id).sort()).toEqual(
      [analysisKept, analysisDeleted].sort(),
    );
    for (const a of r.body.error.details.analyses) expect(a.name).toContain('Paired sample');
    const still = await t.viewer.json<{ catalog: { rowCount: number } }>(
      'GET',
      `/api/catalogs/${catA}`,
    );
    expect(still.status).toBe(200);
    expect(still.body.catalog.rowCount).toBe(N);
  });

  it('deletes an unused catalog as before', async () => {
    const spare = await readyCatalog(t.editor, t.projectId, pairedCsv(0, 0), 'Spare');
    expect((await t.editor.delete(`/api/catalogs/${spare}`)).status).toBe(204);
    expect((await t.viewer.get(`/api/catalogs/${spare}`)).status).toBe(404);
    expect(await auditCount('catalog.delete', spare)).toBe(1);
  });

  it('archives a used catalog: hidden from lists and new runs, the run complete and exportable', async () => {
    const bad = await t.editor.json('PATCH', `/api/catalogs/${catA}`, { archived: 'yes' });
    expect(bad.status).toBe(400);
    const r = await t.editor.json<{ catalog: { archivedAt: string | null } }>(
      'PATCH',
      `/api/catalogs/${catA}`,
      { archived: true },
    );
    expect(r.status).toBe(200);
    expect(r.body.catalog.archivedAt).not.toBeNull();
    expect(await auditCount('catalog.archive', catA)).toBe(1);

    const ids = async (query: string) =>
      (
        await t.viewer.json<{ catalogs: { id: string }[] }>(
          'GET',
          `/api/projects/${t.projectId}/catalogs${query}`,
        )
      ).body.catalogs.map((c) => c.id);
    expect(await ids('')).toEqual([catB]);
    expect((await ids('?archived=include')).sort()).toEqual([catA, catB].sort());
    expect(await ids('?archived=only')).toEqual([catA]);

    const again = await t.editor.json<{ error: { code: string } }>(
      'POST',
      `/api/projects/${t.projectId}/link-runs`,
      {
        catalogIds: [catA, catB],
        radius: { mode: 'fixed', arcsec: 30 },
        velocity: { mode: 'fixed', kms: 3 },
      },
    );
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('catalog_archived');

    const run = await t.viewer.json<{ run: { catalogs: { id: string; name: string }[] } }>(
      'GET',
      `/api/link-runs/${runId}`,
    );
    expect(run.body.run.catalogs.map((c) => c.name)).toEqual(['Clouds', 'Young']);

    // Every export of the run, parsed, has as many rows as the run's summary states.
    const expected = { links: summary.links, complexes: summary.complexes, sources: 2 * N };
    expect(summary.sources).toBe(2 * N); // both catalogs were linked whole
    for (const shape of ['links', 'complexes', 'sources'] as const) {
      const csvRes = await t.viewer.get(`/api/link-runs/${runId}/export.csv?shape=${shape}`);
      expect(csvRes.status).toBe(200);
      const csv = Papa.parse<Record<string, string>>(await csvRes.text(), {
        header: true,
        skipEmptyLines: true,
      });
      expect(csv.errors, shape).toEqual([]);
      expect(csv.data.length, shape).toBe(expected[shape]);
      if (shape === 'sources') {
        const fromA = csv.data.filter((s) => s.catalog_id === catA);
        expect(fromA.length).toBe(N);
        expect(fromA.every((s) => s.complex_id !== '')).toBe(true);
      }
      const votRes = await t.viewer.get(`/api/link-runs/${runId}/export.vot?shape=${shape}`);
      expect(votRes.status).toBe(200);
      const vot = parseVotable(await votRes.text());
      expect(vot.rows.length, shape).toBe(expected[shape]);
      expect(new Set(vot.rows)).toEqual(new Set([vot.fields]));
    }

    const restored = await t.editor.json<{ catalog: { archivedAt: string | null } }>(
      'PATCH',
      `/api/catalogs/${catA}`,
      { archived: false },
    );
    expect(restored.body.catalog.archivedAt).toBeNull();
    expect(await auditCount('catalog.restore', catA)).toBe(1);
  });

  it('renames, notes and archives a run; the list hides it unless asked', async () => {
    expect((await t.editor.json('PATCH', `/api/link-runs/${runId}`, {})).status).toBe(400);
    expect((await t.editor.json('PATCH', `/api/link-runs/${runId}`, { name: ' ' })).status).toBe(
      400,
    );
    const r = await t.editor.json<{ run: { name: string; note: string; archivedAt: string } }>(
      'PATCH',
      `/api/link-runs/${runId}`,
      { name: 'Paired sample, 30″', note: 'Kept for the paper.', archived: true },
    );
    expect(r.status).toBe(200);
    expect(r.body.run).toMatchObject({ name: 'Paired sample, 30″', note: 'Kept for the paper.' });
    expect(r.body.run.archivedAt).not.toBeNull();
    expect(await auditCount('link-run.update', runId)).toBe(1);
    const list = async (q: string) =>
      (
        await t.viewer.json<{ runs: { id: string; note: string | null }[] }>(
          'GET',
          `/api/projects/${t.projectId}/link-runs${q}`,
        )
      ).body.runs;
    expect(await list('')).toEqual([]);
    expect((await list('?archived=include')).map((x) => x.note)).toEqual(['Kept for the paper.']);
    expect(
      (await t.editor.json('GET', `/api/projects/${t.projectId}/link-runs?archived=maybe`)).status,
    ).toBe(400);
    await t.editor.json('PATCH', `/api/link-runs/${runId}`, { archived: false });
    expect((await list('')).map((x) => x.id)).toEqual([runId]);
  });

  it('renames, notes, archives and deletes an analysis', async () => {
    const r = await t.owner.json<{ analysis: { name: string; note: string } }>(
      'PATCH',
      `/api/analyses/${analysisKept}`,
      { name: 'Reid 2014 arms', note: 'Baseline.' },
    );
    expect(r.status).toBe(200);
    expect(r.body.analysis).toMatchObject({ name: 'Reid 2014 arms', note: 'Baseline.' });
    await t.editor.json('PATCH', `/api/analyses/${analysisDeleted}`, { archived: true });
    const list = async (q: string) =>
      (
        await t.viewer.json<{ analyses: { id: string; name: string }[] }>(
          'GET',
          `/api/projects/${t.projectId}/analyses${q}`,
        )
      ).body.analyses;
    expect((await list('')).map((a) => a.name)).toEqual(['Reid 2014 arms']);
    expect(await list('?archived=include')).toHaveLength(2);
    expect(await auditCount('analysis.update', analysisKept)).toBe(1);
    expect(await auditCount('analysis.update', analysisDeleted)).toBe(1);

    expect((await t.editor.delete(`/api/analyses/${analysisDeleted}`)).status).toBe(204);
    expect((await t.viewer.get(`/api/analyses/${analysisDeleted}`)).status).toBe(404);
    expect(await auditCount('analysis.delete', analysisDeleted)).toBe(1);
  });

  it('deletes a run only with its analyses, and leaves nothing of it', async () => {
    const [firstComplex] = (
      await t.viewer.json<{ complexes: { id: string }[] }>(
        'GET',
        `/api/link-runs/${runId}/complexes`,
      )
    ).body.complexes;
    const reviewed = await t.editor.json(
      'PATCH',
      `/api/link-runs/${runId}/complexes/${firstComplex.id}`,
      { review: 'accepted', note: 'clear pair' },
    );
    expect(reviewed.status).toBe(200);
    const distance = await t.editor.json(
      'PUT',
      `/api/link-runs/${runId}/complexes/${firstComplex.id}/distance`,
      { distKpc: 4.2, note: 'maser parallax' },
    );
    expect(distance.status).toBe(200);
    const [[job]] = await db.query<mysql.RowDataPacket[]>(
      'SELECT job_id AS jobId FROM link_runs WHERE id = ?',
      [runId],
    );

    const count = async (table: string, col: string, id: unknown) => {
      const [rows] = await db.query<mysql.RowDataPacket[]>(
        `SELECT COUNT(*) AS n FROM ${table} WHERE ${col} = ?`,
        [id],
      );
      return Number(rows[0].n);
    };
    // What the delete must remove is there to begin with.
    expect(await count('links', 'run_id', runId)).toBe(N);
    expect(await count('complexes', 'run_id', runId)).toBe(summary.complexes);
    expect(await count('complex_members', 'run_id', runId)).toBe(2 * N);
    expect(await count('distance_overrides', 'run_id', runId)).toBe(1);
    expect(await count('analyses', 'run_id', runId)).toBe(1);
    expect(await count('jobs', 'id', job.jobId)).toBe(1);

    const refused = await t.editor.json<{ error: { code: string; details: Dependents } }>(
      'DELETE',
      `/api/link-runs/${runId}`,
    );
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('run_in_use');
    expect(refused.body.error.details.analyses).toEqual([
      { id: analysisKept, name: 'Reid 2014 arms' },
    ]);
    expect((await t.viewer.get(`/api/link-runs/${runId}`)).status).toBe(200);

    expect((await t.editor.delete(`/api/link-runs/${runId}?withAnalyses=1`)).status).toBe(204);
    expect((await t.viewer.get(`/api/link-runs/${runId}`)).status).toBe(404);
    expect((await t.viewer.get(`/api/analyses/${analysisKept}`)).status).toBe(404);
    for (const [table, col, id] of [
      ['link_runs', 'id', runId],
      ['links', 'run_id', runId],
      ['complexes', 'run_id', runId],
      ['complex_members', 'run_id', runId],
      ['distance_overrides', 'run_id', runId],
      ['analysis_complexes', 'run_id', runId],
      ['analyses', 'run_id', runId],
      ['jobs', 'id', job.jobId],
    ] as const) {
      expect(await count(table, col, id), table).toBe(0);
    }
    expect(await auditCount('link-run.delete', runId)).toBe(1);

    // With the run gone nothing reads the catalog any more, and it deletes.
    expect((await t.editor.delete(`/api/catalogs/${catA}`)).status).toBe(204);
  });
});
