/**
 * Bounded load test on loopback: a project with a 200 000-row catalog and a link run of about
 * 120 000 complexes is seeded through the services, then 20 clients (personal API token, keep-alive
 * HTTP) ask the running app for pages for 30 s: rows pages of every sort and direction down to the
 * last page (1 000 × 200), some with a position filter, and complexes pages of every sort with and
 * without filters. Prints one JSON line: per API the number of requests, p50/p95/p99 in ms, and
 * the errors, beside the targets (rows p95 ≤ 300 ms, complexes p95 ≤ 150 ms).
 * Run: `npm run bench:load` (scripts/bench.mjs starts its own database and web server, slot 3).
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { closeDb } from '@/db/client';
import { makeRng, type Rng } from '@/lib/stats/rng';
import { quantile } from '@/lib/stats/summary';
import { createCatalog } from '@/lib/services/catalogs';
import { ingestCatalog } from '@/lib/services/catalog-ingest';
import { executeLinkRun } from '@/lib/services/link-run-exec';
import { linkRunSchema, startLinkRun } from '@/lib/services/link-runs';
import { createProject } from '@/lib/services/projects';
import { createToken } from '@/lib/services/tokens';
import { createUser } from '@/lib/services/users';

const arg = (name: string, dflt: number) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? Number(process.argv[i + 1]) : dflt;
};

const BASE_URL = process.env.LANEWISE_BASE_URL;
const TARGET_P95_MS = { rows: 300, complexes: 150 };

type Source = { l: number; b: number; v: number };

/** Sources spread over the plane (|b| < 5°), invented. */
function randomSky(n: number, rng: Rng): Source[] {
  return Array.from({ length: n }, () => ({
    l: rng.next() * 360,
    b: rng.next() * 10 - 5,
    v: rng.next() * 250 - 100,
  }));
}

/** The first `share` of `a` seen again within a few arcsec and 1 km/s, the rest random. */
function withCounterparts(a: Source[], share: number, rng: Rng): Source[] {
  const k = Math.round(share * a.length);
  return randomSky(a.length, rng).map((o, i) =>
    i < k
      ? {
          l: (a[i].l + ((i % 7) - 3) * 2.5e-4 + 360) % 360,
          b: a[i].b + ((i % 5) - 2) * 2.5e-4,
          v: a[i].v + ((i % 3) - 1) * 0.5,
        }
      : o,
  );
}

/** Names as surveys give them (Galactic-coordinate designations), so sorting by name is real work. */
function writeCatalog(file: string, sources: Source[], prefix: string) {
  const lines = ['GLON,GLAT,VLSR,NAME'];
  for (const x of sources) {
    const name = `${prefix}${x.l.toFixed(3).padStart(7, '0')}${x.b < 0 ? '-' : '+'}${Math.abs(x.b).toFixed(3).padStart(6, '0')}`;
    lines.push(`${x.l.toFixed(5)},${x.b.toFixed(5)},${x.v.toFixed(2)},${name}`);
  }
  fs.writeFileSync(file, lines.join('\n') + '\n');
}

async function ingest(projectId: string, userId: string, file: string, name: string) {
  const form = new FormData();
  form.set('file', await fs.openAsBlob(file), path.basename(file));
  form.set('name', name);
  form.set('kind', name === 'CO' ? 'co' : 'hii');
  const c = await createCatalog(
    new Request('http://bench.local/', { method: 'POST', body: form }),
    projectId,
    userId,
  );
  await ingestCatalog(c.id, async () => undefined);
  return c.id;
}

const pick = <T>(rng: Rng, xs: readonly T[]) => xs[rng.int(xs.length)];

/** A rows request: any sort and direction, a page anywhere (a third of them the deepest tenth). */
function rowsUrl(rng: Rng, catalogId: string, rowCount: number) {
  const pageSize = 200;
  const pages = Math.ceil(rowCount / pageSize);
  const sort = pick(rng, ['row', 'name', 'l', 'b', 'v', 'radiusArcsec'] as const);
  const dir = pick(rng, ['asc', 'desc'] as const);
  const deep = rng.next() < 1 / 3;
  const page = deep ? pages - rng.int(Math.ceil(pages / 10)) : 1 + rng.int(pages);
  // One in five narrows to a longitude range and pages within it.
  const filter = rng.next() < 0.2 ? `&lMin=${10 + rng.int(300)}&lMax=${40 + rng.int(20)}` : '';
  const p = filter ? 1 + rng.int(5) : page;
  return `/api/catalogs/${catalogId}/rows?sort=${sort}&dir=${dir}&page=${p}&pageSize=${pageSize}${filter}`;
}

/** A complexes request: any sort, a page among the first hundred, a filter in half of them. */
function complexesUrl(rng: Rng, runId: string) {
  const sort = pick(rng, [
    'id',
    'size',
    'l',
    'b',
    'v',
    'maxSepArcsec',
    'maxDvKms',
    'reliability',
    'review',
  ] as const);
  const dir = pick(rng, ['asc', 'desc'] as const);
  const filter = pick(rng, ['', '', '', '&minSize=3', '&classes=co,hii', '&review=unreviewed']);
  return `/api/link-runs/${runId}/complexes?sort=${sort}&dir=${dir}&page=${1 + rng.int(100)}&pageSize=50${filter}`;
}

type Tally = { ms: number[]; errors: number; statuses: Record<string, number> };

function report(t: Tally) {
  const q = (p: number) => +quantile(t.ms, p).toFixed(1);
  return {
    requests: t.ms.length,
    p50Ms: q(0.5),
    p95Ms: q(0.95),
    p99Ms: q(0.99),
    errors: t.errors,
    errorStatuses: t.statuses,
  };
}

async function main() {
  if (!BASE_URL)
    throw new Error('LANEWISE_BASE_URL is not set: run this through npm run bench:load');
  const n = arg('rows', 200_000);
  const clients = arg('clients', 20);
  const seconds = arg('seconds', 30);
  const seedStart = performance.now();
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lanewise-load-'));
  const rng = makeRng(16);
  const co = randomSky(n, rng);
  writeCatalog(path.join(dir, 'co.csv'), co, 'G');
  writeCatalog(path.join(dir, 'hii.csv'), withCounterparts(co, 0.6, rng), 'H');
  const user = await createUser({
    email: `load-${Date.now()}@lab.example`,
    name: 'Load test',
    password: 'load-test-password-1',
  });
  const project = await createProject(user.id, { name: 'Load test' });
  const a = await ingest(project.id, user.id, path.join(dir, 'co.csv'), 'CO');
  const b = await ingest(project.id, user.id, path.join(dir, 'hii.csv'), 'HII');
  const run = await startLinkRun(
    project.id,
    user.id,
    linkRunSchema.parse({
      catalogIds: [a, b],
      radius: { mode: 'fixed', arcsec: 10 },
      velocity: { mode: 'fixed', kms: 5 },
    }),
  );
  await executeLinkRun(run.id, async () => undefined, new AbortController().signal);
  const { token } = await createToken(user.id, 'load test');
  const seedSeconds = (performance.now() - seedStart) / 1000;

  const tallies: Record<'rows' | 'complexes', Tally> = {
    rows: { ms: [], errors: 0, statuses: {} },
    complexes: { ms: [], errors: 0, statuses: {} },
  };
  const headers = { authorization: `Bearer ${token}` };
  // Warm the server's code paths once so the measurement is of paging, not of first compiles.
  await fetch(`${BASE_URL}/api/catalogs/${a}/rows`, { headers }).then((r) => r.arrayBuffer());
  await fetch(`${BASE_URL}/api/link-runs/${run.id}/complexes`, { headers }).then((r) =>
    r.arrayBuffer(),
  );
  const end = performance.now() + seconds * 1000;
  const client = async (i: number) => {
    const own = makeRng(1000 + i);
    while (performance.now() < end) {
      const api = own.next() < 0.5 ? 'rows' : 'complexes';
      const url = api === 'rows' ? rowsUrl(own, a, n) : complexesUrl(own, run.id);
      const t0 = performance.now();
      let status = 'network';
      try {
        const res = await fetch(BASE_URL + url, { headers });
        await res.arrayBuffer();
        status = String(res.status);
      } catch {
        /* counted below as a network error */
      }
      const tally = tallies[api];
      tally.ms.push(performance.now() - t0);
      if (status !== '200') {
        tally.errors++;
        tally.statuses[status] = (tally.statuses[status] ?? 0) + 1;
      }
    }
  };
  await Promise.all(Array.from({ length: clients }, (_, i) => client(i)));

  const rows = report(tallies.rows);
  const complexes = report(tallies.complexes);
  console.log(
    JSON.stringify({
      catalogRows: n,
      clients,
      seconds,
      seedSeconds: +seedSeconds.toFixed(1),
      rows,
      complexes,
      targets: { rowsP95Ms: TARGET_P95_MS.rows, complexesP95Ms: TARGET_P95_MS.complexes },
      meets: {
        rows: rows.p95Ms <= TARGET_P95_MS.rows && rows.errors === 0,
        complexes: complexes.p95Ms <= TARGET_P95_MS.complexes && complexes.errors === 0,
      },
    }),
  );
  fs.rmSync(dir, { recursive: true, force: true });
  await closeDb();
}

main().catch(async (e) => {
  console.error(e);
  await closeDb();
  process.exit(1);
});
