/**
 * The work estimate against the run it forecasts: the same catalogs and parameters are estimated
 * (`POST …/link-runs/estimate`) and then run, and each pair's forecast must lie within a factor of
 * two of the links the run really found — on the demo galaxy's catalogs (clustered: gas and young
 * stars of the same complexes) and on random catalogs with a clustered half.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { DEMO_CATALOGS } from '@/seed/demo-catalogs';
import { generateGalaxy, writeDemoFiles } from '@/seed/generator';
import type { Client } from '../helpers/client';
import { upload, waitForCatalog } from '../helpers/catalogs';
import { makeTeam, type Team } from '../helpers/team';

type Pair = { catalogA: string; catalogB: string; links: number };
type EstimatePair = { catalogA: string; catalogB: string; expectedLinks: number };

/** Deterministic pseudo-random numbers (a linear congruential generator; common practice). */
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => (s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32;
}

/**
 * n sources over 20° × 2° of the plane; the first `partners` of them copied into the second
 * catalog within 20″ and 2 km/s (invented associations), the rest of each catalog independent.
 */
function randomPair(seed: number, n: number, partners: number) {
  const r = lcg(seed);
  const one = () => ({ l: 20 + r() * 20, b: -1 + r() * 2, v: -50 + r() * 150 });
  const a = Array.from({ length: n }, one);
  const b = Array.from({ length: n }, (_, i) =>
    i < partners
      ? {
          l: a[i].l + ((r() - 0.5) * 20) / 3600,
          b: a[i].b + ((r() - 0.5) * 20) / 3600,
          v: a[i].v + (r() - 0.5) * 4,
        }
      : one(),
  );
  return [a, b];
}

const toCsv = (rows: { l: number; b: number; v: number }[]) =>
  'GLON,GLAT,VLSR,NAME\n' +
  rows.map((s, i) => `${s.l.toFixed(6)},${s.b.toFixed(6)},${s.v.toFixed(3)},S${i + 1}`).join('\n') +
  '\n';

async function ready(client: Client, projectId: string, opts: Parameters<typeof upload>[2]) {
  const up = await upload(client, projectId, opts);
  expect(up.status).toBe(202);
  const c = await waitForCatalog(client, up.body.catalog.id, 180_000);
  expect(c.status).toBe('ready');
  return c.id;
}

async function runLinks(client: Client, projectId: string, body: object): Promise<Pair[]> {
  const started = await client.json<{ run: { id: string } }>(
    'POST',
    `/api/projects/${projectId}/link-runs`,
    body,
  );
  expect(started.status).toBe(202);
  const deadline = Date.now() + 180_000;
  for (;;) {
    const r = await client.json<{ run: { status: string; summary: { pairs: Pair[] } | null } }>(
      'GET',
      `/api/link-runs/${started.body.run.id}`,
    );
    if (r.body.run.status === 'done') return r.body.run.summary!.pairs;
    expect(['queued', 'running']).toContain(r.body.run.status);
    if (Date.now() > deadline) throw new Error('run did not finish');
    await new Promise((res) => setTimeout(res, 300));
  }
}

async function compare(client: Client, projectId: string, body: object) {
  const est = await client.json<{ estimate: { pairs: EstimatePair[] } }>(
    'POST',
    `/api/projects/${projectId}/link-runs/estimate`,
    body,
  );
  expect(est.status).toBe(200);
  const real = await runLinks(client, projectId, body);
  return real.map((p) => {
    const e = est.body.estimate.pairs.find(
      (x) => x.catalogA === p.catalogA && x.catalogB === p.catalogB,
    )!;
    return { links: p.links, expected: e.expectedLinks };
  });
}

describe('the link-run estimate', () => {
  let t: Team;
  const demo: string[] = [];
  let randA: string;
  let randB: string;

  beforeAll(async () => {
    t = await makeTeam('estimate');
    // The demo galaxy as seed/seed.ts makes it (same seed and counts), written to a scratch folder.
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lanewise-estimate-'));
    await writeDemoFiles(generateGalaxy({ seed: 7, complexes: 800, interlopers: 300 }), dir);
    // CO clouds and HII regions of the demo galaxy, mapped as the demo project maps them.
    for (const c of [DEMO_CATALOGS[0], DEMO_CATALOGS[2]])
      demo.push(
        await ready(t.editor, t.projectId, {
          content: fs.readFileSync(path.join(dir, c.file)),
          fileName: c.file,
          name: c.name,
          kind: c.kind,
          mapping: c.mapping,
        }),
      );
    const [a, b] = randomPair(11, 3000, 400);
    randA = await ready(t.editor, t.projectId, { content: toCsv(a), name: 'Random A' });
    randB = await ready(t.editor, t.projectId, {
      content: toCsv(b),
      name: 'Random B',
      kind: 'hii',
    });
  }, 400_000);

  it('is within a factor of two of the links of three real runs', async () => {
    const cases = [
      // The demo run's parameters (seed/seed.ts): fixed 4′ and 6 km/s, every link.
      ...(await compare(t.editor, t.projectId, {
        catalogIds: demo,
        radius: { mode: 'fixed', arcsec: 240 },
        velocity: { mode: 'fixed', kms: 6 },
        linkMode: 'all',
      })),
      // Scaled by sizes and line widths, nearest partner only.
      ...(await compare(t.editor, t.projectId, {
        catalogIds: demo,
        radius: { mode: 'scaled', factor: 1, minArcsec: 30 },
        velocity: { mode: 'scaled', factor: 2 },
        linkMode: 'nearest',
      })),
      // Random catalogs: 400 invented associations within 20″ plus chance pairs at 60″.
      ...(await compare(t.editor, t.projectId, {
        catalogIds: [randA, randB],
        radius: { mode: 'fixed', arcsec: 60 },
        velocity: { mode: 'fixed', kms: 10 },
        linkMode: 'all',
      })),
    ];
    expect(cases).toHaveLength(3);
    for (const c of cases) {
      // A forecast of "0" for a run that finds links is the failure this guards against.
      expect(c.links).toBeGreaterThan(20);
      expect(c.expected / c.links).toBeGreaterThanOrEqual(0.5); // the brief's factor of two
      expect(c.expected / c.links).toBeLessThanOrEqual(2);
    }
  }, 600_000);

  it('warns when a run is scaled by line widths that a chosen catalog lacks', async () => {
    const est = await t.viewer.json<{
      estimate: { warnings: { catalogId: string; quantity: string; missingRows: number }[] };
    }>('POST', `/api/projects/${t.projectId}/link-runs/estimate`, {
      catalogIds: [randA, randB],
      radius: { mode: 'fixed', arcsec: 60 },
      velocity: { mode: 'scaled', factor: 2 },
    });
    expect(est.status).toBe(200);
    // Both random catalogs were uploaded without a line-width column: 3000 rows each lack one.
    expect(est.body.estimate.warnings).toEqual([
      expect.objectContaining({ catalogId: randA, quantity: 'lineWidth', missingRows: 3000 }),
      expect.objectContaining({ catalogId: randB, quantity: 'lineWidth', missingRows: 3000 }),
    ]);
  });
});
