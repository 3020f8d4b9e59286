import { beforeAll, describe, expect, it } from 'vitest';
import mysql from 'mysql2/promise';
import Papa from 'papaparse';
import { countMail, waitForMail, type Client } from '../helpers/client';
import { upload, waitForCatalog } from '../helpers/catalogs';
import { makeTeam, type Team } from '../helpers/team';

type Src = { l: number; b: number; v: number };

/** Deterministic pseudo-random numbers (a linear congruential generator; common practice). */
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => (s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32;
}

/** Sources piled at the l = 0°/360° seam and within 0.1° of both poles, plus some in the plane. */
function awkwardSky(seed: number, n: number): Src[] {
  const r = lcg(seed);
  const out: Src[] = [];
  for (let i = 0; i < n; i++) {
    const kind = i % 4;
    const v = -20 + r() * 40;
    if (kind === 0) out.push({ l: (360 + (r() - 0.5) * 0.2) % 360, b: (r() - 0.5) * 0.2, v });
    else if (kind === 1) out.push({ l: r() * 360, b: 89.9 + r() * 0.1, v });
    else if (kind === 2) out.push({ l: r() * 360, b: -89.9 - r() * 0.1, v });
    else out.push({ l: 30 + r() * 0.2, b: r() * 0.2, v });
  }
  return out;
}

const toCsv = (rows: Src[]) =>
  'GLON,GLAT,VLSR,NAME\n' +
  rows.map((s, i) => `${s.l.toFixed(6)},${s.b.toFixed(6)},${s.v.toFixed(3)},S${i + 1}`).join('\n') +
  '\n';

/** Great-circle separation by the haversine formula, written independently of lib/match. */
function sepArcsec(a: Src, b: Src) {
  const d = Math.PI / 180;
  const h =
    Math.sin(((b.b - a.b) * d) / 2) ** 2 +
    Math.cos(a.b * d) * Math.cos(b.b * d) * Math.sin(((b.l - a.l) * d) / 2) ** 2;
  return ((2 * Math.asin(Math.min(1, Math.sqrt(h)))) / d) * 3600;
}

async function waitForRun(client: Client, runId: string, timeoutMs = 120_000) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const r = await client.json<{
      run: {
        status: string;
        summary: Record<string, unknown> | null;
        error: string | null;
        progress: number;
      };
    }>('GET', `/api/link-runs/${runId}`);
    if (['done', 'failed', 'cancelled'].includes(r.body.run.status)) return r.body.run;
    if (Date.now() > deadline) throw new Error(`run still ${r.body.run.status}`);
    await new Promise((res) => setTimeout(res, 250));
  }
}

async function readyCatalog(
  client: Client,
  projectId: string,
  rows: Src[],
  name: string,
  kind: string,
) {
  const up = await upload(client, projectId, { content: toCsv(rows), name, kind });
  expect(up.status).toBe(202);
  const c = await waitForCatalog(client, up.body.catalog.id);
  expect(c.status).toBe('ready');
  return c.id;
}

describe('link runs through the API', () => {
  let t: Team;
  let catA: string;
  let catB: string;
  const A = awkwardSky(1, 160);
  // B: A's sources nudged by up to ~40″ and 3 km/s, plus unrelated ones.
  const B = (() => {
    const r = lcg(2);
    const near = A.map((s) => ({
      l: (s.l + (r() - 0.5) * 0.02 + 360) % 360,
      b: Math.max(-90, Math.min(90, s.b + (r() - 0.5) * 0.02)),
      v: s.v + (r() - 0.5) * 6,
    }));
    return [...near, ...awkwardSky(3, 80)];
  })();

  beforeAll(async () => {
    t = await makeTeam('runs');
    catA = await readyCatalog(t.editor, t.projectId, A, 'Awkward CO', 'co');
    catB = await readyCatalog(t.editor, t.projectId, B, 'Awkward HII', 'hii');
  });

  it('finds exactly the links of a brute-force oracle (seam and poles included), and groups complexes', async () => {
    const body = {
      catalogIds: [catA, catB],
      radius: { mode: 'fixed', arcsec: 60 },
      velocity: { mode: 'fixed', kms: 2.5 },
      linkMode: 'all',
      chanceTrials: 0,
    };
    const start = await t.editor.json<{ run: { id: string; status: string } }>(
      'POST',
      `/api/projects/${t.projectId}/link-runs`,
      body,
    );
    expect(start.status).toBe(202);
    const run = await waitForRun(t.editor, start.body.run.id);
    expect(run.status).toBe('done');

    const expected = new Set<string>();
    A.forEach((a, i) =>
      B.forEach((b, j) => {
        if (sepArcsec(a, b) <= 60 && Math.abs(b.v - a.v) <= 2.5) expected.add(`${i + 1}-${j + 1}`);
      }),
    );
    expect(expected.size).toBeGreaterThan(20);

    const csv = await (
      await t.viewer.get(`/api/link-runs/${start.body.run.id}/export.csv?shape=links`)
    ).text();
    const [header, ...lines] = csv.trim().split(/\r?\n/);
    const cols = header.split(',');
    for (const c of [
      'catalog_a',
      'row_a',
      'catalog_b',
      'row_b',
      'separation_arcsec',
      'delta_v_kms',
      'complex_id',
    ])
      expect(cols).toContain(c);
    const got = new Set(
      lines
        .map((l) => l.split(','))
        .map((f) => `${f[cols.indexOf('row_a')]}-${f[cols.indexOf('row_b')]}`),
    );
    expect(got).toEqual(expected);
    expect(lines.every((l) => l.split(',')[cols.indexOf('catalog_a')] === catA)).toBe(true);

    // Complexes are the connected components of the links (here each link's two ends).
    const complexes = await t.viewer.json<{
      total: number;
      complexes: { size: number; classes: string[] }[];
    }>('GET', `/api/link-runs/${start.body.run.id}/complexes?pageSize=500`);
    const parent = new Map<string, string>();
    const find = (x: string): string =>
      parent.get(x) === x || !parent.has(x)
        ? (parent.set(x, parent.get(x) ?? x), x)
        : find(parent.get(x)!);
    for (const k of expected) {
      const [i, j] = k.split('-');
      parent.set(find(`a${i}`), find(`b${j}`));
    }
    const roots = new Set([...parent.keys()].map(find));
    expect(complexes.body.total).toBe(roots.size);
    expect(
      complexes.body.complexes.every((c) => c.classes.includes('co') && c.classes.includes('hii')),
    ).toBe(true);
  });

  it('lets viewers read and export but not start runs or review; editors review with an audit trail', async () => {
    const body = {
      catalogIds: [catA, catB],
      radius: { mode: 'fixed', arcsec: 30 },
      velocity: { mode: 'ignore' },
      linkMode: 'mutual',
      chanceTrials: 2,
    };
    expect((await t.viewer.post(`/api/projects/${t.projectId}/link-runs`, body)).status).toBe(403);
    expect((await t.outsider.post(`/api/projects/${t.projectId}/link-runs`, body)).status).toBe(
      404,
    );
    expect((await t.anonymous.post(`/api/projects/${t.projectId}/link-runs`, body)).status).toBe(
      401,
    );
    const start = await t.editor.json<{ run: { id: string } }>(
      'POST',
      `/api/projects/${t.projectId}/link-runs`,
      body,
    );
    const run = await waitForRun(t.editor, start.body.run.id);
    expect(run.status).toBe('done');
    const pairs = (run.summary as { pairs: { expectedChance: number | null }[] }).pairs;
    expect(pairs[0].expectedChance).not.toBeNull();

    const list = await t.viewer.json<{ complexes: { id: string }[] }>(
      'GET',
      `/api/link-runs/${start.body.run.id}/complexes?sort=size&dir=desc`,
    );
    const id = list.body.complexes[0].id;
    const detail = await t.viewer.json<{
      complex: { members: { original: Record<string, string> }[]; links: unknown[] };
    }>('GET', `/api/link-runs/${start.body.run.id}/complexes/${id}`);
    expect(detail.status).toBe(200);
    expect(detail.body.complex.members.length).toBeGreaterThanOrEqual(2);
    expect(detail.body.complex.members[0].original.GLON).toBeDefined();

    expect(
      (
        await t.viewer.patch(`/api/link-runs/${start.body.run.id}/complexes/${id}`, {
          review: 'accepted',
          note: 'x',
        })
      ).status,
    ).toBe(403);
    // A note that a spreadsheet would run as a formula, with a quote, a comma and a line break.
    const note = '=velocity offset large, "see" spectra\nsecond look';
    const reviewed = await t.editor.json<{
      complex: { review: string; reviewedAt: string; reviewedBy: { id: string } };
    }>('PATCH', `/api/link-runs/${start.body.run.id}/complexes/${id}`, {
      review: 'doubtful',
      note,
    });
    expect(reviewed.status).toBe(200);
    expect(reviewed.body.complex.review).toBe('doubtful');
    expect(reviewed.body.complex.reviewedBy.id).toBe(t.ids.editor);
    const after = await t.viewer.json<{
      complex: { history: { review: string; note: string; by: { id: string } }[] };
    }>('GET', `/api/link-runs/${start.body.run.id}/complexes/${id}`);
    expect(after.body.complex.history[0]).toMatchObject({
      review: 'doubtful',
      note,
      by: { id: t.ids.editor },
    });
    const doubtful = await t.viewer.json<{ total: number }>(
      'GET',
      `/api/link-runs/${start.body.run.id}/complexes?review=doubtful`,
    );
    expect(doubtful.body.total).toBe(1);

    // Exports: every complex and every source once; the note comes back escaped, never as a formula.
    const complexesCsv = Papa.parse<Record<string, string>>(
      await (
        await t.viewer.get(`/api/link-runs/${start.body.run.id}/export.csv?shape=complexes`)
      ).text(),
      { header: true, skipEmptyLines: true },
    ).data;
    const all = await t.viewer.json<{ total: number }>(
      'GET',
      `/api/link-runs/${start.body.run.id}/complexes`,
    );
    expect(complexesCsv.length).toBe(all.body.total);
    expect(complexesCsv.find((c) => c.complex_id === id)).toMatchObject({
      review: 'doubtful',
      review_note: `'${note}`,
      reviewed_at: reviewed.body.complex.reviewedAt,
      over_cap: 'false',
    });
    const sourcesCsv = Papa.parse<Record<string, string>>(
      await (
        await t.viewer.get(`/api/link-runs/${start.body.run.id}/export.csv?shape=sources`)
      ).text(),
      { header: true, skipEmptyLines: true },
    ).data;
    expect(sourcesCsv.length).toBe(A.length + B.length);
    expect(sourcesCsv.filter((s) => s.complex_id === id).length).toBe(
      detail.body.complex.members.length,
    );
    expect(new Set(sourcesCsv.map((s) => s.catalog_id))).toEqual(new Set([catA, catB]));
    const vot = await (
      await t.viewer.get(`/api/link-runs/${start.body.run.id}/export.vot?shape=complexes`)
    ).text();
    expect(vot.match(/<TR>/g)?.length).toBe(all.body.total);
    expect(vot).toContain('<TD>=velocity offset large, &quot;see&quot; spectra\nsecond look</TD>');
    const methods = await t.viewer.json<{ parameters: { linkMode: string }; references: string[] }>(
      'GET',
      `/api/link-runs/${start.body.run.id}/methods.json`,
    );
    expect(methods.body.parameters.linkMode).toBe('mutual');
    expect(methods.body.references.length).toBeGreaterThan(0);
  });

  it('e-mails whoever started a run when it ends, unless they opted out', async () => {
    const body = {
      catalogIds: [catA, catB],
      radius: { mode: 'fixed', arcsec: 20 },
      velocity: { mode: 'ignore' },
      linkMode: 'all',
      chanceTrials: 0,
    };
    const start = await t.editor.json<{ run: { id: string } }>(
      'POST',
      `/api/projects/${t.projectId}/link-runs`,
      body,
    );
    await waitForRun(t.editor, start.body.run.id);
    const me = await t.editor.json<{ user: { email: string } }>('GET', '/api/account');
    const mail = await waitForMail(
      me.body.user.email,
      /Link run finished/,
      10_000,
      start.body.run.id,
    );
    expect(mail.text).toContain(`/link-runs/${start.body.run.id}`);

    expect((await t.editor.patch('/api/account', { notifyRunEmails: false })).status).toBe(200);
    const before = countMail(me.body.user.email);
    const second = await t.editor.json<{ run: { id: string } }>(
      'POST',
      `/api/projects/${t.projectId}/link-runs`,
      body,
    );
    await waitForRun(t.editor, second.body.run.id);
    await new Promise((res) => setTimeout(res, 1500));
    expect(countMail(me.body.user.email)).toBe(before);
    await t.editor.patch('/api/account', { notifyRunEmails: true });
  });

  it('refuses catalogs that are not ready or not in the project, naming which', async () => {
    const r = await t.editor.json<{ error: { message: string } }>(
      'POST',
      `/api/projects/${t.projectId}/link-runs`,
      {
        catalogIds: [catA, '00000000-0000-0000-0000-000000000000'],
        radius: { mode: 'fixed', arcsec: 30 },
        velocity: { mode: 'ignore' },
        linkMode: 'all',
        chanceTrials: 0,
      },
    );
    expect(r.status).toBe(400);
    expect(r.body.error.message).toMatch(/catalogIds\[1\]/);
  });
});

describe('long runs: cancelled, or their worker killed', () => {
  let t: Team;
  let a: string;
  let b: string;
  const long = () => ({
    catalogIds: [a, b],
    radius: { mode: 'fixed', arcsec: 400 },
    velocity: { mode: 'ignore' },
    linkMode: 'all',
    chanceTrials: 10,
    complexCap: 100_000,
  });

  /** Waits until a worker has the run's job and is part-way through; returns that job's row. */
  async function partWay(conn: mysql.Connection, runId: string) {
    for (let i = 0; i < 400; i++) {
      const [[job]] = (await conn.query(
        "SELECT j.id, j.locked_by, j.progress FROM jobs j JOIN link_runs r ON r.job_id = j.id WHERE r.id = ? AND j.status = 'running'",
        [runId],
      )) as unknown as [[{ id: number; locked_by: string; progress: number }?]];
      if (job && job.progress > 0.1) return job;
      await new Promise((res) => setTimeout(res, 50));
    }
    const seen = await t.viewer.json<{ run: { status: string; summary: unknown } }>(
      'GET',
      `/api/link-runs/${runId}`,
    );
    throw new Error(
      `never caught the run part-way: ${JSON.stringify(seen.body.run).slice(0, 400)}`,
    );
  }

  async function startLongRun(): Promise<string> {
    const start = await t.editor.json<{ run: { id: string } }>(
      'POST',
      `/api/projects/${t.projectId}/link-runs`,
      long(),
    );
    expect(start.status).toBe(202);
    return start.body.run.id;
  }

  beforeAll(async () => {
    t = await makeTeam('long');
    const r = lcg(9);
    const rows = (n: number) =>
      Array.from({ length: n }, () => ({ l: r() * 40, b: (r() - 0.5) * 4, v: (r() - 0.5) * 100 }));
    a = await readyCatalog(t.editor, t.projectId, rows(40_000), 'Long A', 'co');
    b = await readyCatalog(t.editor, t.projectId, rows(40_000), 'Long B', 'ob');
  }, 300_000);

  it('stops a running run on request: cancelled, with nothing of it stored; viewers may not cancel', async () => {
    const runId = await startLongRun();
    const conn = await mysql.createConnection(process.env.DATABASE_URL!);
    try {
      await partWay(conn, runId);
      expect((await t.viewer.post(`/api/link-runs/${runId}/cancel`, {})).status).toBe(403);
      expect((await t.outsider.post(`/api/link-runs/${runId}/cancel`, {})).status).toBe(404);
      const cancel = await t.editor.json<{ run: { id: string } }>(
        'POST',
        `/api/link-runs/${runId}/cancel`,
        {},
      );
      expect(cancel.status).toBe(202);

      const run = await waitForRun(t.viewer, runId);
      expect(run.status).toBe('cancelled');
      expect(run.error).toMatch(/cancel/i);
      expect(run.summary).toBeNull();
      for (const table of ['links', 'complexes', 'complex_members']) {
        const [[n]] = (await conn.query(`SELECT COUNT(*) AS n FROM ${table} WHERE run_id = ?`, [
          runId,
        ])) as unknown as [[{ n: number }]];
        expect([table, Number(n.n)]).toEqual([table, 0]);
      }
      // The worker marks the run first and its job a moment later.
      let jobStatus = '';
      for (let i = 0; i < 100 && jobStatus !== 'cancelled'; i++) {
        if (i) await new Promise((res) => setTimeout(res, 100));
        const [[job]] = (await conn.query(
          'SELECT j.status FROM jobs j JOIN link_runs r ON r.job_id = j.id WHERE r.id = ?',
          [runId],
        )) as unknown as [[{ status: string }]];
        jobStatus = job.status;
      }
      expect(jobStatus).toBe('cancelled');
      expect((await t.viewer.get(`/api/link-runs/${runId}/complexes`)).status).toBe(409);
      expect((await t.viewer.get(`/api/link-runs/${runId}/export.csv?shape=links`)).status).toBe(
        409,
      );
      // A finished run cannot be cancelled again.
      expect((await t.editor.post(`/api/link-runs/${runId}/cancel`, {})).status).toBe(409);
    } finally {
      await conn.end();
    }
  }, 300_000);

  it('leaves no half-written run when its worker is killed; the run is picked up again and finishes whole', async () => {
    const runId = await startLongRun();
    const conn = await mysql.createConnection(process.env.DATABASE_URL!);
    try {
      // Once a worker is part-way through the job, kill that worker outright.
      const pid = Number((await partWay(conn, runId)).locked_by.split(':').pop());
      process.kill(pid, 'SIGKILL');
      const mid = await t.viewer.json<{ run: { status: string; summary: unknown } }>(
        'GET',
        `/api/link-runs/${runId}`,
      );
      expect(mid.body.run.status).toBe('running');
      expect(mid.body.run.summary).toBeNull();
      expect((await t.viewer.get(`/api/link-runs/${runId}/complexes`)).status).toBe(409);

      const run = await waitForRun(t.viewer, runId, 300_000);
      expect(run.status).toBe('done');
      const summary = run.summary as { links: number; complexes: number };
      const [[stored]] = (await conn.query(
        'SELECT COUNT(*) AS n, COUNT(DISTINCT id) AS d FROM links WHERE run_id = ?',
        [runId],
      )) as unknown as [[{ n: number; d: number }]];
      expect(Number(stored.n)).toBe(summary.links);
      expect(Number(stored.d)).toBe(summary.links);
      const [[cx]] = (await conn.query('SELECT COUNT(*) AS n FROM complexes WHERE run_id = ?', [
        runId,
      ])) as unknown as [[{ n: number }]];
      expect(Number(cx.n)).toBe(summary.complexes);
      const [[job]] = (await conn.query(
        'SELECT j.attempts FROM jobs j JOIN link_runs r ON r.job_id = j.id WHERE r.id = ?',
        [runId],
      )) as unknown as [[{ attempts: number }]];
      expect(job.attempts).toBe(2);
    } finally {
      await conn.end();
    }
  }, 300_000);
});
