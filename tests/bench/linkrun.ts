/**
 * Link-run benchmark: two Galactic-plane catalogs of N sources (|b| < 5°; 60 % of A seen again
 * in B, the rest random) are ingested through the services, then (1) a run at 60″ and 5 km/s with five chance repeats is executed and
 * stored by the worker's code, (2) complexes pages are fetched with every sort (p95), and (3) a
 * run with about a million links is exported as CSV (rows/s, peak RSS). Prints one JSON line.
 * Run: `npm run bench:linkrun -- --rows 200000`.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { RowDataPacket } from 'mysql2';
import { closeDb, pool } from '@/db/client';
import { createCatalog } from '@/lib/services/catalogs';
import { ingestCatalog } from '@/lib/services/catalog-ingest';
import { complexesPage, complexesQuerySchema } from '@/lib/services/complexes';
import { executeLinkRun } from '@/lib/services/link-run-exec';
import { linkRunSchema, startLinkRun } from '@/lib/services/link-runs';
import { createProject } from '@/lib/services/projects';
import { runCsv } from '@/lib/services/run-exports';
import { createUser } from '@/lib/services/users';

const arg = (name: string, dflt: number) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? Number(process.argv[i + 1]) : dflt;
};

let peakRss = 0;
const sampler = setInterval(() => (peakRss = Math.max(peakRss, process.memoryUsage().rss)), 50);

type Source = { l: number; b: number; v: number };

function randomSky(n: number, seed: number): Source[] {
  let s = seed;
  const rnd = () => (s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32;
  return Array.from({ length: n }, () => ({
    l: rnd() * 360,
    b: rnd() * 10 - 5,
    v: rnd() * 250 - 100,
  }));
}

/** Catalog B: the first `share` of A's sources seen again within ~3″ and 1 km/s, the rest random. */
function withCounterparts(a: Source[], share: number, seed: number): Source[] {
  const other = randomSky(a.length, seed);
  const k = Math.round(share * a.length);
  return other.map((o, i) =>
    i < k
      ? {
          l: (a[i].l + ((i % 7) - 3) * 2.5e-4 + 360) % 360,
          b: a[i].b + ((i % 5) - 2) * 2.5e-4,
          v: a[i].v + ((i % 3) - 1) * 0.5,
        }
      : o,
  );
}

function writeCatalog(file: string, sources: Source[]) {
  const lines = ['GLON,GLAT,VLSR,NAME'];
  sources.forEach((x, i) =>
    lines.push(`${x.l.toFixed(5)},${x.b.toFixed(5)},${x.v.toFixed(2)},S${i}`),
  );
  fs.writeFileSync(file, lines.join('\n') + '\n');
}

async function ingest(projectId: string, userId: string, file: string, name: string) {
  const form = new FormData();
  form.set('file', await fs.openAsBlob(file), path.basename(file));
  form.set('name', name);
  form.set('kind', 'co');
  const c = await createCatalog(
    new Request('http://bench.local/', { method: 'POST', body: form }),
    projectId,
    userId,
  );
  await ingestCatalog(c.id, async () => undefined);
  return c.id;
}

async function timedRun(projectId: string, userId: string, body: unknown) {
  const run = await startLinkRun(projectId, userId, linkRunSchema.parse(body));
  const t0 = performance.now();
  await executeLinkRun(run.id, async () => undefined, new AbortController().signal);
  return { id: run.id, seconds: (performance.now() - t0) / 1000 };
}

async function main() {
  const n = arg('rows', 200_000);
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lanewise-linkrun-'));
  const skyA = randomSky(n, 1);
  writeCatalog(path.join(dir, 'a.csv'), skyA);
  writeCatalog(path.join(dir, 'b.csv'), withCounterparts(skyA, 0.6, 2));
  const user = await createUser({
    email: `bench-${Date.now()}@lab.example`,
    name: 'Bench',
    password: 'bench-password-1',
  });
  const project = await createProject(user.id, { name: 'Link-run benchmark' });
  const a = await ingest(project.id, user.id, path.join(dir, 'a.csv'), 'A');
  const b = await ingest(project.id, user.id, path.join(dir, 'b.csv'), 'B');

  const main = await timedRun(project.id, user.id, {
    catalogIds: [a, b],
    radius: { mode: 'fixed', arcsec: 60 },
    velocity: { mode: 'fixed', kms: 5 },
    linkMode: 'all',
    chanceTrials: 5,
  });

  // 60 % of A's sources have a counterpart in B within ~3″: a 10″ radius makes one complex of
  // each (~120 000 at 200 000 sources) plus a few chance pairs. The wide radius, chosen from the
  // source density, gives ~5 links per source: ~1 000 000 links to export.
  const density = n / (360 * 10 * 3600 * 3600); // per arcsec²
  const mid = await timedRun(project.id, user.id, {
    catalogIds: [a, b],
    radius: { mode: 'fixed', arcsec: 10 },
    velocity: { mode: 'ignore' },
    linkMode: 'all',
    chanceTrials: 0,
  });
  const wide = await timedRun(project.id, user.id, {
    catalogIds: [a, b],
    radius: { mode: 'fixed', arcsec: Math.sqrt(1_000_000 / (n * density * Math.PI)) },
    velocity: { mode: 'ignore' },
    linkMode: 'all',
    chanceTrials: 0,
    complexCap: 100_000,
  });

  const times: number[] = [];
  for (const sort of [
    'id',
    'size',
    'l',
    'b',
    'v',
    'maxSepArcsec',
    'maxDvKms',
    'reliability',
    'review',
  ]) {
    for (const dir of ['asc', 'desc']) {
      for (const page of [1, 2, 50]) {
        const s = performance.now();
        await complexesPage(
          mid.id,
          complexesQuerySchema.parse({ sort, dir, page: String(page), pageSize: '50' }),
        );
        times.push(performance.now() - s);
      }
    }
  }
  times.sort((x, y) => x - y);
  const first = await complexesPage(mid.id, complexesQuerySchema.parse({}));

  const rssBefore = process.memoryUsage().rss;
  peakRss = rssBefore;
  const t0 = performance.now();
  let rows = -1;
  // Memory at 10 %, 50 % and 100 % of the rows: flat means the growth stops, whatever the size.
  const growthAt: Record<string, number> = {};
  const [[{ n: expected }]] = await pool().query<RowDataPacket[]>(
    'SELECT COUNT(*) AS n FROM links WHERE run_id = ?',
    [wide.id],
  );
  for await (const piece of runCsv(wide.id, 'links')) {
    const bytes = typeof piece === 'string' ? Buffer.from(piece) : piece;
    for (let i = bytes.indexOf(10); i >= 0; i = bytes.indexOf(10, i + 1)) rows++;
    for (const share of [0.1, 0.5])
      if (!growthAt[share] && rows >= share * expected)
        growthAt[share] = Math.round((peakRss - rssBefore) / 1e6);
  }
  const exportSeconds = (performance.now() - t0) / 1000;
  clearInterval(sampler);
  console.log(
    JSON.stringify({
      sources: n,
      run60arcsec: { seconds: +main.seconds.toFixed(2), chanceRepeats: 5 },
      complexesRun: { seconds: +mid.seconds.toFixed(2), complexes: first.total },
      wideRun: { seconds: +wide.seconds.toFixed(2) },
      complexesPageP95Ms: +times[Math.floor(0.95 * (times.length - 1))].toFixed(1),
      exportLinks: rows,
      exportRowsPerSecond: Math.round(rows / exportSeconds),
      exportRssGrowthMb: {
        at10pct: growthAt[0.1],
        at50pct: growthAt[0.5],
        atEnd: Math.round((peakRss - rssBefore) / 1e6),
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
