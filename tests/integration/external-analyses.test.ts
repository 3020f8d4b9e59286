import { beforeAll, describe, expect, it } from 'vitest';
import { generateExternalGalaxy } from '@/seed/external-generator';
import type { Client } from '../helpers/client';
import { upload, waitForCatalog } from '../helpers/catalogs';
import { makeTeam, type Team } from '../helpers/team';

type Ring = { RKpc: number; maxKpc: number; dphiDeg: number | null; ci95: [number, number] | null };
type Fit = {
  patternSpeedKmsKpc: number | null;
  patternSpeedCi95: [number, number] | null;
  timescaleMyr: number | null;
  timescaleCi95: [number, number] | null;
  corotationKpc: number | null;
};
type ExternalAnalysis = {
  id: string;
  kind: string;
  status: string;
  error: string | null;
  runId: string | null;
  catalogIds: string[] | null;
  result: {
    rings: Ring[];
    fit: Fit | null;
    nullTest: { pValue: number } | null;
    sources: { RKpc: number[]; phiDeg: number[]; kind: string[] };
    complexes: { id: string; raDeg: number; decDeg: number; RKpc: number; phiDeg: number }[] | null;
    methods: string;
  };
};

async function waitFor<T>(client: Client, url: string, key: string, timeoutMs = 180_000) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const r = await client.json<Record<string, { status: string }>>('GET', url);
    const x = r.body[key];
    if (['done', 'failed', 'cancelled'].includes(x.status)) return x as unknown as T;
    if (Date.now() > deadline) throw new Error(`${key} still ${x.status}`);
    await new Promise((res) => setTimeout(res, 300));
  }
}

const MAPPING = {
  position: {
    system: 'equatorial',
    lon: { column: 'RA', unit: 'deg' },
    lat: { column: 'DEC', unit: 'deg' },
  },
};

/**
 * Injection–recovery through the API for a spiral seen from outside: the generator's clouds and
 * HII regions (orbits crossing a ridge rotating at Ω_p = 24 km/s/kpc, HII regions 6 Myr after
 * their clouds) are uploaded as RA/Dec catalogs, the project's target is set to the galaxy, and
 * the analysis must recover the generator's Ω_p and t within its intervals.
 */
describe('external-galaxy analysis through the API', () => {
  let t: Team;
  let catalogIds: string[];
  const g = generateExternalGalaxy({ seed: 11, gasCount: 14_000, youngCount: 14_000 });
  const body = (extra: Record<string, unknown> = {}) => ({
    kind: 'external-galaxy',
    catalogIds,
    arms: 2,
    rings: { minKpc: 3, maxKpc: 11, widthKpc: 1 },
    resamples: 2000,
    seed: 5,
    ...extra,
  });
  const csv = (kind: string) =>
    [
      'RA,DEC',
      ...g.kind.flatMap((k, i) =>
        k === kind ? [`${g.raDeg[i].toFixed(8)},${g.decDeg[i].toFixed(8)}`] : [],
      ),
    ].join('\n');

  beforeAll(async () => {
    t = await makeTeam('external');
    catalogIds = [];
    for (const kind of ['co', 'hii']) {
      const up = await upload(t.editor, t.projectId, {
        content: csv(kind),
        fileName: `${kind}.csv`,
        name: `Synthetic ${kind}`,
        kind,
        mapping: MAPPING,
      });
      expect(up.status).toBe(202);
      const done = await waitForCatalog(t.editor, up.body.catalog.id);
      expect(done.status).toBe('ready');
      expect(done.rowCount).toBe(14_000);
      catalogIds.push(done.id);
    }
  });

  it('without a galaxy in the body or the target, says that galaxy is missing', async () => {
    const r = await t.editor.json<{ error: { message: string } }>(
      'POST',
      `/api/projects/${t.projectId}/analyses`,
      body(),
    );
    expect(r.status).toBe(400);
    expect(r.body.error.message).toMatch(/^galaxy:/);
  });

  it('checks the target on PATCH and names the bad field', async () => {
    const bad = await t.owner.json<{ error: { message: string } }>(
      'PATCH',
      `/api/projects/${t.projectId}`,
      {
        settings: {
          target: { kind: 'external-galaxy', galaxy: { ...g.galaxy, inclinationDeg: 89 } },
        },
      },
    );
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/^settings\.target\.galaxy\.inclinationDeg/);
    const ok = await t.owner.json<{ project: { settings: { target: { kind: string } } } }>(
      'PATCH',
      `/api/projects/${t.projectId}`,
      {
        settings: {
          target: { kind: 'external-galaxy', name: 'Synthetic spiral', galaxy: g.galaxy },
        },
      },
    );
    expect(ok.status).toBe(200);
    expect(ok.body.project.settings.target.kind).toBe('external-galaxy');
  });

  it('recovers the generator’s pattern speed and timescale from the target’s galaxy', async () => {
    const start = await t.editor.json<{ analysis: { id: string; kind: string } }>(
      'POST',
      `/api/projects/${t.projectId}/analyses`,
      body(),
    );
    expect(start.status).toBe(202);
    expect(start.body.analysis.kind).toBe('external-galaxy');
    const a = await waitFor<ExternalAnalysis>(
      t.viewer,
      `/api/analyses/${start.body.analysis.id}`,
      'analysis',
    );
    expect(a.error).toBeNull();
    expect(a.status).toBe('done');
    expect(a.kind).toBe('external-galaxy');
    expect(a.runId).toBeNull();
    expect(a.catalogIds).toEqual(catalogIds);
    const fit = a.result.fit!;
    const [pLo, pHi] = fit.patternSpeedCi95!;
    expect(pLo).toBeLessThanOrEqual(24); // generator truth: Ω_p
    expect(pHi).toBeGreaterThanOrEqual(24);
    const [tLo, tHi] = fit.timescaleCi95!;
    expect(tLo).toBeLessThanOrEqual(6); // generator truth: delayMyr
    expect(tHi).toBeGreaterThanOrEqual(6);
    const corotation = g.truth.corotationKpc!; // generator truth, about 8.1 kpc
    expect(Math.abs(fit.corotationKpc! - corotation)).toBeLessThan(1);
    const inside = a.result.rings.filter((r) => r.maxKpc <= corotation - 1);
    expect(inside.length).toBeGreaterThanOrEqual(3);
    // young stars ahead of their gas inside corotation (generator truth: Ω > Ω_p there)
    for (const r of inside) expect(r.dphiDeg!).toBeGreaterThan(0);
    expect(inside[0].ci95![0]).toBeGreaterThan(0);
    expect(a.result.nullTest!.pValue).toBeLessThan(0.05);
    // deprojected places against the generator's own disc positions (CSV rows in generator
    // order, clouds first; perspective neglected: (R/D) tan i ≈ 1e-3)
    expect(a.result.sources.RKpc).toHaveLength(28_000);
    for (let i = 0; i < g.kind.length; i += 97) {
      expect(a.result.sources.kind[i]).toBe(g.kind[i]);
      expect(Math.abs(a.result.sources.RKpc[i] / g.truth.RKpc[i] - 1)).toBeLessThan(2e-3);
      const d = (a.result.sources.phiDeg[i] * Math.PI) / 180 - g.truth.phiRad[i];
      expect(Math.abs(Math.atan2(Math.sin(d), Math.cos(d)))).toBeLessThan(2e-3);
    }
    expect(a.result.methods).toMatch(/Egusa et al\. 2004/);
    expect(a.result.methods).toMatch(/Calabretta & Greisen 2002/);
    expect(a.result.methods).toMatch(/2000 bootstrap resamples/);
    const methods = await t.viewer.get(`/api/analyses/${a.id}/methods.txt`);
    expect(methods.status).toBe(200);
    expect(await methods.text()).toBe(a.result.methods);

    const list = await t.viewer.json<{
      analyses: { id: string; kind: string; summary: { patternSpeedKmsKpc: number } | null }[];
    }>('GET', `/api/projects/${t.projectId}/analyses`);
    expect(list.body.analyses[0]).toMatchObject({ id: a.id, kind: 'external-galaxy' });
    expect(list.body.analyses[0].summary!.patternSpeedKmsKpc).toBe(fit.patternSpeedKmsKpc);
  });

  it('lets viewers read but not start; outsiders see nothing; anonymous callers must sign in', async () => {
    const url = `/api/projects/${t.projectId}/analyses`;
    expect((await t.viewer.get(url)).status).toBe(200);
    expect((await t.viewer.post(url, body())).status).toBe(403);
    expect((await t.outsider.post(url, body())).status).toBe(404);
    expect((await t.outsider.get(url)).status).toBe(404);
    expect((await t.anonymous.get(url)).status).toBe(401);
  });

  it('links the catalogs on position only and places each complex in the disc', async () => {
    const start = await t.editor.json<{ run: { id: string } }>(
      'POST',
      `/api/projects/${t.projectId}/link-runs`,
      {
        catalogIds,
        radius: { mode: 'fixed', arcsec: 0.3 },
        velocity: { mode: 'ignore' },
        linkMode: 'all',
        chanceTrials: 0,
      },
    );
    expect(start.status).toBe(202);
    const run = await waitFor<{
      status: string;
      summary: { complexes: number; radiusPc: { distanceMpc: number; minPc: number } };
    }>(t.viewer, `/api/link-runs/${start.body.run.id}`, 'run');
    expect(run.status).toBe('done');
    expect(run.summary.complexes).toBeGreaterThan(10);
    // 0.3″ at 12 Mpc: 12e6 pc × 0.3 / 206 264.806 (small-angle, exact geometry)
    expect(run.summary.radiusPc.minPc).toBeCloseTo(17.45, 2);

    const a0 = await t.editor.json<{ analysis: { id: string } }>(
      'POST',
      `/api/projects/${t.projectId}/analyses`,
      body({ catalogIds: undefined, runId: start.body.run.id, resamples: 2000 }),
    );
    expect(a0.status).toBe(202);
    const a = await waitFor<ExternalAnalysis>(
      t.viewer,
      `/api/analyses/${a0.body.analysis.id}`,
      'analysis',
    );
    expect(a.error).toBeNull();
    expect(a.runId).toBe(start.body.run.id);
    const complexes = a.result.complexes!;
    expect(complexes.length).toBe(run.summary.complexes);
    // Each complex lies within 0.3″ of its members: its place matches the generator's disc
    // position of the nearest generated source (generator truth, put on the sky in 3-D).
    const cosDec = Math.cos((g.galaxy.centerDecDeg * Math.PI) / 180);
    for (const c of complexes.slice(0, 50)) {
      let best = -1;
      let bestD = Infinity;
      for (let i = 0; i < g.kind.length; i++) {
        const d = ((g.raDeg[i] - c.raDeg) * cosDec) ** 2 + (g.decDeg[i] - c.decDeg) ** 2;
        if (d < bestD) [best, bestD] = [i, d];
      }
      expect(Math.abs(c.RKpc - g.truth.RKpc[best])).toBeLessThan(0.05);
      const dphi = (c.phiDeg * Math.PI) / 180 - g.truth.phiRad[best];
      expect(Math.abs(Math.atan2(Math.sin(dphi), Math.cos(dphi)))).toBeLessThan(0.02);
    }
  });
});
