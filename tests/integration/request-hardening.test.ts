import { beforeAll, describe, expect, it } from 'vitest';
import mysql from 'mysql2/promise';
import { BASE_URL, Client } from '../helpers/client';
import { planeCsv, upload, waitForCatalog } from '../helpers/catalogs';
import { makeTeam, type Team } from '../helpers/team';

type ErrorBody = { error: { code: string; message: string } };

async function readyCatalog(client: Client, projectId: string, kind: string) {
  const up = await upload(client, projectId, { content: planeCsv(30), name: `${kind} cat`, kind });
  expect(up.status).toBe(202);
  const c = await waitForCatalog(client, up.body.catalog.id);
  expect(c.status).toBe('ready');
  return c.id;
}

async function doneRun(client: Client, projectId: string, catalogIds: string[]) {
  const start = await client.json<{ run: { id: string } }>(
    'POST',
    `/api/projects/${projectId}/link-runs`,
    { catalogIds, radius: { mode: 'fixed', arcsec: 60 }, velocity: { mode: 'ignore' } },
  );
  expect(start.status).toBe(202);
  const id = start.body.run.id;
  const deadline = Date.now() + 60_000;
  for (;;) {
    const r = await client.json<{ run: { status: string } }>('GET', `/api/link-runs/${id}`);
    if (r.body.run.status === 'done') return id;
    if (r.body.run.status === 'failed' || Date.now() > deadline)
      throw new Error(`run ${id}: ${r.body.run.status}`);
    await new Promise((res) => setTimeout(res, 250));
  }
}

describe('request hardening (#16 items 8, 9, 10, 11c)', () => {
  let t: Team;
  let catalogId: string;
  let runDone: string;
  let runCancelled: string;
  let ownProject: string;
  let ownRun: string;

  beforeAll(async () => {
    t = await makeTeam('harden');
    catalogId = await readyCatalog(t.editor, t.projectId, 'co');
    const hii = await readyCatalog(t.editor, t.projectId, 'hii');
    runDone = await doneRun(t.editor, t.projectId, [catalogId, hii]);
    runCancelled = await doneRun(t.editor, t.projectId, [catalogId, hii]);
    // A run in another state than done, set directly so the test does not race the worker.
    const conn = await mysql.createConnection(process.env.DATABASE_URL!);
    await conn.execute("UPDATE link_runs SET status = 'cancelled' WHERE id = ?", [runCancelled]);
    await conn.end();
    // The outsider's own project, with a done run of its own.
    const p = await t.outsider.json<{ project: { id: string } }>('POST', '/api/projects', {
      name: 'Outsider project',
    });
    ownProject = p.body.project.id;
    const oc = await readyCatalog(t.outsider, ownProject, 'co');
    const oh = await readyCatalog(t.outsider, ownProject, 'hii');
    ownRun = await doneRun(t.outsider, ownProject, [oc, oh]);
  });

  it('8: pages carry a nonce CSP that their scripts use; pages and API responses carry the other headers', async () => {
    const page = await t.owner.get('/projects');
    expect(page.status).toBe(200);
    const csp = page.headers.get('content-security-policy') ?? '';
    const nonce = /'nonce-([^']+)'/.exec(csp)?.[1];
    expect(nonce).toBeTruthy();
    expect(csp).toContain("frame-ancestors 'none'");
    expect(csp).not.toMatch(/script-src[^;]*'unsafe-inline'/);
    const html = await page.text();
    const scripts = [...html.matchAll(/<script\b[^>]*>/g)].map((m) => m[0]);
    expect(scripts.length).toBeGreaterThan(0);
    // Every script the server sends runs only because it carries this response's nonce.
    for (const s of scripts) expect(s).toContain(`nonce="${nonce}"`);
    const again = await t.owner.get('/projects');
    expect(again.headers.get('content-security-policy')).not.toContain(`'nonce-${nonce}'`);
    await again.text();

    const api = await t.owner.get('/api/projects');
    await api.text();
    expect(api.headers.get('content-security-policy')).toContain("default-src 'none'");
    for (const res of [page, api]) {
      expect(res.headers.get('x-frame-options')).toBe('DENY');
      expect(res.headers.get('x-content-type-options')).toBe('nosniff');
      expect(res.headers.get('referrer-policy')).toBe('strict-origin-when-cross-origin');
      expect(res.headers.get('permissions-policy')).toContain('camera=()');
    }
  });

  it('9: cookie-authenticated writes need our Origin or Sec-Fetch-Site: same-origin; tokens need neither', async () => {
    const names = () =>
      t.owner
        .json<{ projects: { name: string }[] }>('GET', '/api/projects')
        .then((r) => r.body.projects.map((p) => p.name));
    const create = (name: string, headers: Record<string, string>, origin: string | null) => {
      t.owner.origin = origin;
      return t.owner.request('POST', '/api/projects', { name }, headers);
    };
    try {
      const none = await create('no-origin', {}, null);
      expect(none.status).toBe(403);
      expect(((await none.json()) as ErrorBody).error.message).toMatch(/neither an Origin/);
      const nul = await create('null-origin', { origin: 'null' }, null);
      expect(nul.status).toBe(403);
      // A foreign page that also claims the forwarded host must not pass.
      const forged = await create(
        'forged-host',
        { origin: 'http://evil.example', 'x-forwarded-host': 'evil.example' },
        null,
      );
      expect(forged.status).toBe(403);
      const crossSite = await create('cross-site', { 'sec-fetch-site': 'cross-site' }, BASE_URL);
      expect(crossSite.status).toBe(403);
      const sameSite = await create('fetch-meta', { 'sec-fetch-site': 'same-origin' }, null);
      expect(sameSite.status).toBe(201);
    } finally {
      t.owner.origin = BASE_URL;
    }
    expect(await names()).not.toEqual(
      expect.arrayContaining([expect.stringMatching(/origin|forged|cross-site/)]),
    );

    const tok = await t.owner.json<{ token: string }>('POST', '/api/tokens', { name: 'script' });
    expect(tok.status).toBe(201);
    const script = new Client();
    script.origin = null;
    script.bearer = tok.body.token;
    expect((await script.json('POST', '/api/projects', { name: 'by token' })).status).toBe(201);
  });

  it('10: bad input is a 4xx naming what and where, and nothing is stored', async () => {
    const listed = async () =>
      (await t.editor.json<{ analyses: unknown[] }>('GET', `/api/projects/${t.projectId}/analyses`))
        .body.analyses.length;
    const before = await listed();
    for (const preset of ['__proto__', 'constructor']) {
      const r = await t.editor.json<ErrorBody>('POST', `/api/projects/${t.projectId}/analyses`, {
        runId: runDone,
        curve: { name: 'flat' },
        arms: { preset },
      });
      expect(r.status, preset).toBe(400);
      expect(r.body.error.message).toMatch(/^arms\.preset: /);
    }
    expect(await listed()).toBe(before);

    let deep: Record<string, unknown> = {};
    for (let i = 0; i < 999; i++) deep = { a: deep };
    const deepRes = await t.owner.json<ErrorBody>('PATCH', `/api/projects/${t.projectId}`, {
      settings: deep,
    });
    expect(deepRes.status).toBe(400);
    expect(deepRes.body.error.message).toMatch(/deeper than 32 .*at settings\.a/);

    const huge = await t.owner.json<ErrorBody>('PATCH', `/api/projects/${t.projectId}`, {
      settings: { notes: 'x'.repeat(20 * 1024 * 1024) },
    });
    expect(huge.status).toBe(413);
    const big = await t.owner.json<ErrorBody>('PATCH', `/api/projects/${t.projectId}`, {
      settings: { notes: 'x'.repeat(100 * 1024) },
    });
    expect(big.status).toBe(400);
    expect(big.body.error.message).toMatch(/^settings: /);
    const project = await t.owner.json<{ project: { settings: Record<string, unknown> } }>(
      'GET',
      `/api/projects/${t.projectId}`,
    );
    expect(project.body.project.settings).not.toHaveProperty('notes');

    const hex = await t.viewer.json<ErrorBody>('GET', `/api/catalogs/${catalogId}/rows?lMin=0x10`);
    expect(hex.status).toBe(400);
    expect(hex.body.error.message).toMatch(/^lMin: /);
    const page = await t.viewer.json<ErrorBody>(
      'GET',
      `/api/link-runs/${runDone}/complexes?pageSize=0x10`,
    );
    expect(page.status).toBe(400);

    const nul = await t.owner.json<ErrorBody>('POST', '/api/projects', { name: 'X\u0000Y' });
    expect(nul.status).toBe(400);
    expect(nul.body.error.message).toMatch(/^name: .*control character/);
    const desc = await t.owner.json<ErrorBody>('PATCH', `/api/projects/${t.projectId}`, {
      description: 'ok\u0000not',
    });
    expect(desc.status).toBe(400);
    expect(desc.body.error.message).toMatch(/^description: /);
    const all = await t.owner.json<{ projects: { name: string; description: string | null }[] }>(
      'GET',
      '/api/projects',
    );
    for (const p of all.body.projects)
      expect(`${p.name}${p.description ?? ''}`).not.toContain('\0');
  });

  it("11c: another project's run answers the same whatever its state", async () => {
    const start = (runId: string) =>
      t.outsider.json<ErrorBody>('POST', `/api/projects/${ownProject}/analyses`, {
        runId,
        curve: { name: 'flat' },
        arms: { preset: 'reid-2014' },
      });
    const answers = await Promise.all([runDone, runCancelled, 'no-such-run'].map(start));
    const shapes = answers.map((a) => `${a.status} ${a.body.error?.code}`);
    expect(shapes).toEqual(['400 unknown_run', '400 unknown_run', '400 unknown_run']);

    const compare = (other: string) =>
      t.outsider.json<ErrorBody>('GET', `/api/link-runs/${ownRun}/compare?with=${other}`);
    const cmp = await Promise.all([runDone, runCancelled, 'no-such-run'].map(compare));
    expect(cmp.map((a) => `${a.status} ${a.body.error?.code}`)).toEqual([
      '404 not_found',
      '404 not_found',
      '404 not_found',
    ]);

    // A bad body or query to a foreign run or project is still "not found", not "bad input".
    for (const runId of [runDone, runCancelled]) {
      expect((await t.outsider.post(`/api/link-runs/${runId}/cancel`)).status).toBe(404);
      expect((await t.outsider.get(`/api/link-runs/${runId}/complexes?page=x`)).status).toBe(404);
      expect((await t.outsider.patch(`/api/link-runs/${runId}/complexes/x`, {})).status).toBe(404);
      expect((await t.outsider.get(`/api/link-runs/${runId}/export.csv?shape=x`)).status).toBe(404);
    }
    expect((await t.outsider.patch(`/api/projects/${t.projectId}`, { bogus: 1 })).status).toBe(404);
  });
});
