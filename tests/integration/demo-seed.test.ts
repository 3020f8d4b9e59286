/**
 * The demo project through the whole product: `seed/seed.ts` (what `npm start` runs) uploads the
 * demo galaxy's four invented catalogs through the real ingest job, links them and runs the
 * ordering analysis on the Reid et al. (2014) curve — not the curve the galaxy was made with —
 * without a pattern speed. The seeded analysis must recover the galaxy's ordering: its
 * young-minus-gas interval contains the injected value of the truth file the seed wrote
 * (seed/generator truth at the true positions). Seeding again changes nothing.
 */
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import type { OrderingResult } from '@/lib/ordering';
import { DEMO_PASSWORD, DEMO_PROJECT_NAME } from '@/seed/demo-accounts';
import { Client } from '../helpers/client';

function seed() {
  const r = spawnSync(path.resolve('node_modules/.bin/tsx'), ['seed/seed.ts'], {
    env: process.env,
    encoding: 'utf8',
    timeout: 900_000,
  });
  if (r.status !== 0) throw new Error(`seed failed (${r.status}): ${r.stderr}`);
}

type Listed = { id: string; status: string; kind?: string };

describe('the seeded demo project', () => {
  const viewer = new Client();
  let projectId: string;
  let analyses: Listed[];

  beforeAll(async () => {
    seed();
    expect(await viewer.signIn('viewer@harborridge.example', DEMO_PASSWORD)).toBeLessThan(400);
    const projects = await viewer.json<{ projects: { id: string; name: string }[] }>(
      'GET',
      '/api/projects',
    );
    projectId = projects.body.projects.find((p) => p.name === DEMO_PROJECT_NAME)!.id;
    analyses = (
      await viewer.json<{ analyses: Listed[] }>('GET', `/api/projects/${projectId}/analyses`)
    ).body.analyses;
  }, 1_000_000);

  it("recovers the demo galaxy's ordering with an interval that contains the truth", async () => {
    const done = analyses.find(
      (a) => a.status === 'done' && (a.kind ?? 'milky-way') === 'milky-way',
    )!;
    const a = await viewer.json<{ analysis: { result: OrderingResult } }>(
      'GET',
      `/api/analyses/${done.id}`,
    );
    const r = a.body.analysis.result;
    const truthFile = path.join(process.env.LANEWISE_DATA_DIR!, 'demo-source', 'truth.json');
    const truth = JSON.parse(fs.readFileSync(truthFile, 'utf8')) as {
      ordering: { youngMinusGasPerpKpc: number };
    };
    const [lo, hi] = r.youngMinusGas.ci95!;
    expect(lo).toBeLessThanOrEqual(truth.ordering.youngMinusGasPerpKpc);
    expect(hi).toBeGreaterThanOrEqual(truth.ordering.youngMinusGasPerpKpc);
    expect(lo).toBeGreaterThan(0);
    expect(r.headline[0]).toMatch(/ahead of the gas/);
    expect(r.distances.R0ErrKpc).toBe(0.16); // Reid et al. (2014): R0 = 8.34 ± 0.16 kpc
  });

  it('seeding again changes nothing', { timeout: 1_000_000 }, async () => {
    seed();
    const again = (
      await viewer.json<{ analyses: Listed[] }>('GET', `/api/projects/${projectId}/analyses`)
    ).body.analyses;
    expect(again.map((a) => a.id)).toEqual(analyses.map((a) => a.id));
  });
});
