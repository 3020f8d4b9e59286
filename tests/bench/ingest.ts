/**
 * Ingest benchmark: a generated CSV of N rows × 10 columns goes through the upload service (the
 * same code the route handler calls, with a real multipart request body streamed from disk) and
 * the ingest job into MariaDB; then a table page of 50 rows is fetched sorted on every column.
 * Prints one JSON line. Run: `npm run bench:ingest -- --rows 1000000`.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { closeDb } from '@/db/client';
import { createProject } from '@/lib/services/projects';
import { createUser } from '@/lib/services/users';
import { createCatalog } from '@/lib/services/catalogs';
import { ingestCatalog } from '@/lib/services/catalog-ingest';
import { catalogRowsPage, rowsQuerySchema } from '@/lib/services/catalog-rows';
import { openAsBlob } from 'node:fs';

const arg = (name: string, dflt: number) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? Number(process.argv[i + 1]) : dflt;
};

function writeCsv(file: string, rows: number) {
  const out = fs.openSync(file, 'w');
  fs.writeSync(
    out,
    'GLON,GLAT,VLSR,E_VLSR,FWHM_KMS,SIZE_ARCSEC,POS_ERR_ARCSEC,DIST_KPC,E_DIST_KPC,NAME\n',
  );
  let buf = '';
  let seed = 12345;
  const rnd = () => (seed = (seed * 1103515245 + 12345) & 0x7fffffff) / 0x7fffffff;
  for (let i = 0; i < rows; i++) {
    buf += `${(rnd() * 360).toFixed(5)},${(rnd() * 10 - 5).toFixed(5)},${(rnd() * 250 - 100).toFixed(2)},${(rnd() * 2).toFixed(2)},${(rnd() * 10).toFixed(2)},${(rnd() * 120).toFixed(1)},${(rnd() * 5).toFixed(2)},${(rnd() * 15).toFixed(2)},${rnd().toFixed(2)},BENCH-${i}\n`;
    if (buf.length > 1 << 20) {
      fs.writeSync(out, buf);
      buf = '';
    }
  }
  fs.writeSync(out, buf);
  fs.closeSync(out);
}

let peakRss = 0;
const sampler = setInterval(() => (peakRss = Math.max(peakRss, process.memoryUsage().rss)), 50);

async function main() {
  const rows = arg('rows', 1_000_000);
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lanewise-bench-'));
  const file = path.join(dir, 'bench.csv');
  writeCsv(file, rows);
  const user = await createUser({
    email: `bench-${Date.now()}@lab.example`,
    name: 'Bench',
    password: 'bench-password-1',
  });
  const project = await createProject(user.id, { name: 'Ingest benchmark' });
  const mapping = {
    position: {
      system: 'galactic',
      lon: { column: 'GLON', unit: 'deg' },
      lat: { column: 'GLAT', unit: 'deg' },
    },
    velocity: { column: 'VLSR', unit: 'km/s', frame: 'lsr', convention: 'radio' },
    velocityError: { column: 'E_VLSR', unit: 'km/s' },
    lineWidth: { column: 'FWHM_KMS', unit: 'km/s', kind: 'fwhm' },
    size: { column: 'SIZE_ARCSEC', unit: 'arcsec', kind: 'radius' },
    positionError: { column: 'POS_ERR_ARCSEC', unit: 'arcsec' },
    distance: { column: 'DIST_KPC', unit: 'kpc' },
    distanceError: { column: 'E_DIST_KPC', unit: 'kpc' },
    name: { column: 'NAME' },
  };
  const form = new FormData();
  form.set('file', await openAsBlob(file), 'bench.csv');
  form.set('name', 'bench');
  form.set('kind', 'co');
  form.set('mapping', JSON.stringify(mapping));
  const t0 = performance.now();
  const req = new Request('http://127.0.0.1/upload', { method: 'POST', body: form });
  const catalog = await createCatalog(req, project.id, user.id);
  const tUploaded = performance.now();
  await ingestCatalog(catalog.id, async () => undefined);
  const tReady = performance.now();

  const sortable = ['row', 'name', 'l', 'b', 'v', 'radiusArcsec', 'lineWidthKms', 'distKpc'];
  const times: number[] = [];
  for (const sort of sortable) {
    for (const dir of ['asc', 'desc']) {
      for (const page of [1, 2, 100]) {
        const q = rowsQuerySchema.parse({ sort, dir, page: String(page), pageSize: '50' });
        const s = performance.now();
        await catalogRowsPage(catalog.id, q);
        times.push(performance.now() - s);
      }
    }
  }
  times.sort((a, b) => a - b);
  const p95 = times[Math.floor(0.95 * (times.length - 1))];
  clearInterval(sampler);
  console.log(
    JSON.stringify({
      rows,
      columns: 10,
      fileMb: +(fs.statSync(file).size / 1e6).toFixed(1),
      uploadSeconds: +((tUploaded - t0) / 1000).toFixed(2),
      uploadToReadySeconds: +((tReady - t0) / 1000).toFixed(2),
      rowsPerSecond: Math.round(rows / ((tReady - t0) / 1000)),
      pageP95Ms: +p95.toFixed(1),
      pageMaxMs: +times[times.length - 1].toFixed(1),
      pageQueries: times.length,
      peakRssMb: Math.round(peakRss / 1e6),
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
