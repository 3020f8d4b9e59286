import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { DEMO_CATALOGS } from '@/seed/demo-catalogs';
import type { OrderingResult } from '@/lib/ordering';
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
 * mapped as a researcher would, linked by a link run, and analysed with the galaxy's arms on the
 * Reid et al. (2014) curve — not the generator's own curve — with no pattern speed given. The
 * generator's truth (seed/generator, at the true positions) states the young-minus-gas offset.
 */
describe('ordering analysis through the API', () => {
  let t: Team;
  let runId: string;
  const body = () => ({
    runId,
    curve: { name: 'reid-2014' },
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
    resamples: 2000,
    seed: 3,
  });

  const galaxy = generateGalaxy({ seed: 7, complexes: 1500, interlopers: 0 });

  beforeAll(async () => {
    t = await makeTeam('ordering');
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lanewise-galaxy-'));
    await writeDemoFiles(galaxy, dir);
    const ids: string[] = [];
    for (const c of DEMO_CATALOGS) {
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

  it('recovers the injected ordering: young minus gas, tangents, fit and the intra-complex bound', async () => {
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
    )) as unknown as { status: string; result: OrderingResult };
    expect(a.status).toBe('done');
    const r = a.result;
    const truth = galaxy.truth.ordering.youngMinusGasPerpKpc!; // generator truth at true positions
    const [lo, hi] = r.youngMinusGas.ci95!;
    expect(lo).toBeLessThanOrEqual(truth);
    expect(hi).toBeGreaterThanOrEqual(truth);
    expect(lo).toBeGreaterThan(0);
    expect(r.headline[0]).toMatch(/ahead of the gas/);
    expect(r.interpretation.source === 'assumed').toBe(false); // nothing was assumed
    expect(r.tangents.length).toBeGreaterThan(0);
    expect(r.patternFit !== null || r.patternFitReason !== null).toBe(true);
    // 240″ at the complexes' distances: a few pc, against offsets of ~100 pc across the arm
    expect(r.intraComplex.linkRadiusPc![1]).toBeLessThan(20);
    expect(r.exclusions.reasons['unreliable-longitude']).toBeGreaterThan(0);
    expect(r.warnings.length).toBeGreaterThan(0);

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
      analyses: { id: string; summary: { youngMinusGasKpc: number | null } | null }[];
    }>('GET', `/api/projects/${t.projectId}/analyses`);
    expect(list.body.analyses[0].id).toBe(start.body.analysis.id);
    expect(list.body.analyses[0].summary!.youngMinusGasKpc).toBe(r.youngMinusGas.medianOffsetKpc);
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
