import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { DEMO_CATALOGS } from '@/seed/demo-catalogs';
import { DEFAULT_MODEL, generateGalaxy, writeDemoFiles } from '@/seed/generator';
import type { Client } from '../helpers/client';
import { upload, waitForCatalog } from '../helpers/catalogs';
import { makeTeam, type Team } from '../helpers/team';

async function waitFor(client: Client, url: string, key: 'run' | 'analysis', timeoutMs = 180_000) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const r = await client.json<
      Record<string, { status: string; error: string | null } & Record<string, unknown>>
    >('GET', url);
    const x = r.body[key];
    if (['done', 'failed', 'cancelled'].includes(x.status)) return x;
    if (Date.now() > deadline) throw new Error(`${key} still ${x.status}`);
    await new Promise((res) => setTimeout(res, 300));
  }
}

/**
 * Injection–recovery through the whole product: the synthetic galaxy's files are uploaded and
 * mapped as a researcher would, linked by a link run, and analysed with the galaxy's own arms,
 * rotation curve and pattern speed. The generator puts young stars ≈ 1.4 pc downstream of the
 * gas inside each complex (6.5 pc along the orbit × sin 12.5°; seed/generator params).
 */
describe('ordering analysis through the API', () => {
  let t: Team;
  let runId: string;
  const body = () => ({
    runId,
    curve: { name: DEFAULT_MODEL.rotationCurve },
    arms: {
      custom: DEFAULT_MODEL.arms.map((a) => ({
        name: a.name,
        Rref: a.RrefKpc,
        betaRefDeg: a.betaRefDeg,
        pitchDeg: a.pitchDeg,
        betaMinDeg: a.betaMinDeg,
        betaMaxDeg: a.betaMaxDeg,
      })),
    },
    patternSpeed: DEFAULT_MODEL.patternSpeedKmsKpc,
    resamples: 2000,
    seed: 3,
  });

  beforeAll(async () => {
    t = await makeTeam('ordering');
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lanewise-galaxy-'));
    await writeDemoFiles(generateGalaxy({ seed: 7, complexes: 600, interlopers: 0 }), dir);
    const ids: string[] = [];
    for (const c of DEMO_CATALOGS.filter((d) => d.kind !== 'hi')) {
      const up = await upload(t.editor, t.projectId, {
        content: fs.readFileSync(path.join(dir, c.file)),
        fileName: c.file,
        name: c.name,
        kind: c.kind,
        mapping: c.mapping,
      });
      expect(up.status).toBe(202);
      const done = await waitForCatalog(t.editor, up.body.catalog.id);
      expect(done.status).toBe('ready');
      ids.push(done.id);
    }
    const start = await t.editor.json<{ run: { id: string } }>(
      'POST',
      `/api/projects/${t.projectId}/link-runs`,
      {
        catalogIds: ids,
        radius: { mode: 'fixed', arcsec: 240 },
        velocity: { mode: 'fixed', kms: 6 },
        linkMode: 'all',
        chanceTrials: 0,
      },
    );
    runId = start.body.run.id;
    expect((await waitFor(t.editor, `/api/link-runs/${runId}`, 'run')).status).toBe('done');
  });

  it('recovers the injected gas-to-young-star ordering with an interval that excludes zero', async () => {
    const start = await t.editor.json<{ analysis: { id: string } }>(
      'POST',
      `/api/projects/${t.projectId}/analyses`,
      body(),
    );
    expect(start.status).toBe(202);
    const a = (await waitFor(
      t.viewer,
      `/api/analyses/${start.body.analysis.id}`,
      'analysis',
    )) as unknown as {
      status: string;
      gasToStars: { n: number; medianAcrossKpc: number; ci95: [number, number]; pValue: number };
      delayMyr: { median: number | null };
      result: {
        exclusions: { complexes: number; used: number; reasons: Record<string, number> };
        warnings: string[];
      };
    };
    expect(a.status).toBe('done');
    const g = a.gasToStars;
    expect(g.n).toBeGreaterThan(30);
    expect(g.ci95[0]).toBeGreaterThan(0);
    expect(g.ci95[0]).toBeLessThanOrEqual(0.0014 * 1.5); // injected ≈ 1.4 pc (generator truth)
    expect(g.ci95[1]).toBeGreaterThanOrEqual(0.0014 / 1.5);
    expect(g.pValue).toBeLessThan(0.01);
    expect(a.result.exclusions.used).toBeLessThanOrEqual(a.result.exclusions.complexes);
    expect(a.result.exclusions.reasons['unreliable-longitude']).toBeGreaterThan(0);
    expect(a.result.warnings.length).toBeGreaterThan(0);

    const csv = await (
      await t.viewer.get(`/api/analyses/${start.body.analysis.id}/export.csv?table=complexes`)
    ).text();
    expect(csv.split(/\r?\n/)[0]).toMatch(/^complex_id,l_deg,b_deg/);
    const methods = await (
      await t.viewer.get(`/api/analyses/${start.body.analysis.id}/methods.txt`)
    ).text();
    expect(methods).toMatch(/Reid/);
    expect(methods).toMatch(/2000 resamples/);
    const list = await t.viewer.json<{
      analyses: { id: string; summary: { pValue: number } | null }[];
    }>('GET', `/api/projects/${t.projectId}/analyses`);
    expect(list.body.analyses[0].id).toBe(start.body.analysis.id);
  });

  it('lets viewers read but not start analyses or override distances', async () => {
    expect((await t.viewer.post(`/api/projects/${t.projectId}/analyses`, body())).status).toBe(403);
    expect((await t.outsider.post(`/api/projects/${t.projectId}/analyses`, body())).status).toBe(
      404,
    );
    expect((await t.anonymous.get(`/api/projects/${t.projectId}/analyses`)).status).toBe(401);
    expect(
      (
        await t.viewer.request('PUT', `/api/link-runs/${runId}/complexes/0/distance`, {
          distKpc: 3,
          note: 'maser parallax',
        })
      ).status,
    ).toBe(403);
    const ok = await t.editor.request('PUT', `/api/link-runs/${runId}/complexes/0/distance`, {
      distKpc: 3,
      note: 'maser parallax',
    });
    expect(ok.status).toBe(200);
    const detail = await t.viewer.json<{
      complex: { distanceOverride: { distKpc: number; note: string } | null };
    }>('GET', `/api/link-runs/${runId}/complexes/0`);
    expect(detail.body.complex.distanceOverride).toMatchObject({
      distKpc: 3,
      note: 'maser parallax',
    });
    const few = await t.editor.json<{ error: { message: string } }>(
      'POST',
      `/api/projects/${t.projectId}/analyses`,
      { ...body(), resamples: 100 },
    );
    expect(few.status).toBe(400);
    expect(few.body.error.message).toMatch(/resamples/);
    const presets = await t.viewer.json<{ presets: { key: string; source: string }[] }>(
      'GET',
      `/api/projects/${t.projectId}/arm-presets`,
    );
    expect(presets.body.presets.map((p) => p.key)).toContain('reid-2014');
  });
});
