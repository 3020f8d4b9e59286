/**
 * Throughput of the ingest hot path: reader (papaparse) + batch normaliser over a generated
 * 1 000 000-row, 10-column CSV in a temp directory. Prints JSON. Target: ≥ 200 000 rows/s.
 * Run: npx tsx tests/bench/ingest-parse.ts [rows]
 */
import { createReadStream, createWriteStream } from 'node:fs';
import { mkdtemp, rm, stat } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { once } from 'node:events';
import { mappingSchema } from '@/lib/ingest/mapping';
import { makeBatchNormaliser } from '@/lib/ingest/normalise';
import { openTable } from '@/lib/ingest/table';

async function writeCsv(file: string, rows: number): Promise<void> {
  const out = createWriteStream(file);
  out.write('name,glon,glat,vlsr,e_vlsr,dv,r_arcsec,flux,snr,flag\n');
  let seed = 12345;
  const rand = (): number => {
    seed = (seed * 1103515245 + 12345) % 2147483648;
    return seed / 2147483648;
  };
  let chunk = '';
  for (let i = 0; i < rows; i++) {
    chunk += `C${i},${(rand() * 360).toFixed(4)},${(rand() * 4 - 2).toFixed(4)},${(rand() * 300 - 150).toFixed(2)},${(rand() * 2).toFixed(2)},${(rand() * 10).toFixed(2)},${(rand() * 120).toFixed(1)},${(rand() * 100).toFixed(3)},${(rand() * 50).toFixed(1)},${i % 3}\n`;
    if (chunk.length > 1 << 16) {
      if (!out.write(chunk)) await once(out, 'drain');
      chunk = '';
    }
  }
  out.end(chunk);
  await once(out, 'finish');
}

async function main(): Promise<void> {
  const rows = Number(process.argv[2] ?? 1_000_000);
  const dir = await mkdtemp(path.join(tmpdir(), 'lanewise-bench-'));
  const file = path.join(dir, 'catalog.csv');
  try {
    await writeCsv(file, rows);
    const mapping = mappingSchema.parse({
      position: {
        system: 'galactic',
        lon: { column: 'glon', unit: 'deg' },
        lat: { column: 'glat', unit: 'deg' },
      },
      velocity: { column: 'vlsr', unit: 'km/s', frame: 'heliocentric', convention: 'radio' },
      velocityError: { column: 'e_vlsr', unit: 'km/s' },
      lineWidth: { column: 'dv', unit: 'km/s', kind: 'fwhm' },
      size: { column: 'r_arcsec', unit: 'arcsec', kind: 'radius' },
      name: { column: 'name' },
    });
    const start = process.hrtime.bigint();
    const table = await openTable(createReadStream(file));
    const normalise = makeBatchNormaliser(table.header, mapping);
    let accepted = 0;
    let rejected = 0;
    let peakHeapMb = 0;
    for await (const batch of table.batches) {
      const out = normalise(batch);
      accepted += out.columns.count;
      rejected += out.rejected.length;
      peakHeapMb = Math.max(peakHeapMb, process.memoryUsage().heapUsed / 2 ** 20);
    }
    const seconds = Number(process.hrtime.bigint() - start) / 1e9;
    console.log(
      JSON.stringify({
        bench: 'ingest-parse',
        rows,
        columns: 10,
        fileMb: +((await stat(file)).size / 2 ** 20).toFixed(1),
        accepted,
        rejected,
        seconds: +seconds.toFixed(3),
        rowsPerSecond: Math.round(rows / seconds),
        targetRowsPerSecond: 200_000,
        peakHeapMb: +peakHeapMb.toFixed(1),
      }),
    );
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}

void main();
