import fs from 'node:fs';
import { Transform } from 'node:stream';
import { eq, sql } from 'drizzle-orm';
import { db, pool } from '@/db/client';
import { catalogs } from '@/db/schema';
import { IngestFileError } from '@/lib/ingest/errors';
import type { Mapping } from '@/lib/ingest/mapping';
import type { CanonicalColumns, Rejection } from '@/lib/ingest/canonical';
import { makeBatchNormaliser } from '@/lib/ingest/normalise';
import { openTable } from '@/lib/ingest/table';
import { loadTsv, tsvCell } from './bulk-load';
import { pointsPath } from './catalogs';
import {
  createLoadTable,
  dropRowsTables,
  finaliseLoadTable,
  ROW_COLUMNS,
  rowsTableName,
} from './catalog-tables';

/** The parse report keeps this many rejected rows; the count covers them all. */
const MAX_STORED_REJECTS = 100_000;

/** Rows parsed and checked per batch: small, so their cells die young and cost little to collect. */
const PARSE_BATCH_ROWS = 2_000;
/** Rows per LOAD DATA statement: large, so MariaDB spends its time storing, not starting. */
const LOAD_BATCH_ROWS = 20_000;

/** Appends the TSV lines (see bulk-load.ts) of a batch of accepted rows to `out`. */
function appendTsvLines(c: CanonicalColumns, out: string[]) {
  for (let i = 0; i < c.count; i++) {
    out.push(
      [
        c.row[i],
        c.line[i],
        tsvCell(c.name[i] ? c.name[i]!.slice(0, 128) : null),
        c.lDeg[i],
        c.bDeg[i],
        tsvCell(c.vLsrKms[i]),
        tsvCell(c.radiusArcsec[i]),
        tsvCell(c.posErrArcsec[i]),
        tsvCell(c.vErrKms[i]),
        tsvCell(c.sigmaVKms[i]),
        tsvCell(c.distKpc[i]),
        tsvCell(c.distErrKpc[i]),
        tsvCell(JSON.stringify(c.original[i])),
      ].join('\t'),
    );
  }
}

async function insertRejects(catalogId: string, rejected: Rejection[]) {
  if (!rejected.length) return;
  const values = rejected.map((r) => [catalogId, r.line, r.reason.slice(0, 500)]);
  await pool().query('INSERT IGNORE INTO catalog_rejects (catalog_id, line, reason) VALUES ?', [
    values,
  ]);
}

/** Counts the bytes that pass, so progress can follow the file. */
function byteCounter() {
  const t = new Transform({
    transform(chunk: Buffer, _enc, cb) {
      t.bytes += chunk.length;
      cb(null, chunk);
    },
  }) as Transform & { bytes: number };
  t.bytes = 0;
  return t;
}

/** Removes whatever an earlier, interrupted attempt stored for this catalog. */
async function clearStoredRows(catalogId: string) {
  await dropRowsTables(catalogId);
  await db.execute(sql`DELETE FROM catalog_rejects WHERE catalog_id = ${catalogId}`);
}

/**
 * Reads, normalises, validates and stores one uploaded catalog. Rows go in batches into a load
 * table that no reader uses (see catalog-tables.ts); the catalog turns `ready` last, in one
 * statement, so a crash or failure never shows a partial catalog (see {@link failIngest}).
 */
export async function ingestCatalog(
  catalogId: string,
  progress: (fraction: number) => Promise<void>,
) {
  const [c] = await db.select().from(catalogs).where(eq(catalogs.id, catalogId));
  if (!c) throw new Error(`catalog ${catalogId} no longer exists`);
  await db
    .update(catalogs)
    .set({
      status: 'ingesting',
      progress: 0,
      error: null,
      rowCount: 0,
      rejectedCount: 0,
      dataRowCount: null,
    })
    .where(eq(catalogs.id, catalogId));
  await clearStoredRows(catalogId);
  await createLoadTable(catalogId);

  const size = fs.statSync(c.filePath).size || 1;
  const counter = byteCounter();
  const table = await openTable(fs.createReadStream(c.filePath).pipe(counter), {
    batchSize: PARSE_BATCH_ROWS,
  });
  const normalise = makeBatchNormaliser(table.header, c.mapping as Mapping, {
    decimalComma: c.decimalComma,
  });
  const pointsTmp = `${pointsPath(catalogId)}.tmp`;
  const points = fs.createWriteStream(pointsTmp);
  let rowCount = 0;
  let rejectedCount = 0;
  let dataRows = 0;
  let firstReject: Rejection | null = null;
  // Under the reject-file policy the file is still read to its end after the first bad row, so
  // that the report counts and lists every bad row; nothing more is stored.
  const rejectingFile = () => c.policy === 'reject-file' && rejectedCount > 0;
  let lastReport = 0;
  // The database stores one LOAD batch while JavaScript parses the next: both cores stay busy.
  let storing: Promise<void> = Promise.resolve();
  let pending: string[] = [];
  const store = async () => {
    await storing;
    storing = loadTsv(`\`${rowsTableName(catalogId, true)}\``, ROW_COLUMNS, pending);
    pending = [];
  };
  try {
    for await (const batch of table.batches) {
      const { columns, rejected } = normalise(batch);
      dataRows += batch.values.length;
      if (rejectedCount < MAX_STORED_REJECTS)
        await insertRejects(catalogId, rejected.slice(0, MAX_STORED_REJECTS - rejectedCount));
      rejectedCount += rejected.length;
      firstReject ??= rejected[0] ?? null;
      if (rejectingFile()) continue;
      appendTsvLines(columns, pending);
      if (pending.length >= LOAD_BATCH_ROWS) await store();
      rowCount += columns.count;
      const f32 = new Float32Array(columns.count * 3);
      for (let i = 0; i < columns.count; i++) {
        f32[3 * i] = columns.lDeg[i];
        f32[3 * i + 1] = columns.bDeg[i];
        f32[3 * i + 2] = columns.vLsrKms[i];
      }
      if (!points.write(Buffer.from(f32.buffer)))
        await new Promise<void>((r) => points.once('drain', () => r()));
      const now = Date.now();
      if (now - lastReport > 250) {
        lastReport = now;
        const fraction = Math.min(0.99, counter.bytes / size);
        await db.update(catalogs).set({ progress: fraction }).where(eq(catalogs.id, catalogId));
        await progress(fraction);
      }
    }
    await store();
    await storing;
    await new Promise<void>((resolve, reject) =>
      points.end((err?: Error | null) => (err ? reject(err) : resolve())),
    );
    if (rejectingFile() || rowCount === 0) {
      // The whole file was read: the report (counts and list) is complete and stays.
      await db
        .update(catalogs)
        .set({ rowCount: 0, rejectedCount, dataRowCount: dataRows })
        .where(eq(catalogs.id, catalogId));
      throw rowsFailed(c.policy, dataRows, rejectedCount, firstReject);
    }
    await progress(0.99);
    await finaliseLoadTable(catalogId);
    fs.renameSync(pointsTmp, pointsPath(catalogId));
    await db
      .update(catalogs)
      .set({
        status: 'ready',
        progress: 1,
        rowCount,
        rejectedCount,
        dataRowCount: dataRows,
        readyAt: sql`NOW(3)`,
      })
      .where(eq(catalogs.id, catalogId));
  } catch (e) {
    await storing.catch(() => undefined);
    points.destroy();
    fs.rmSync(pointsTmp, { force: true });
    throw e;
  }
}

/**
 * Why a fully read file yields no catalog, with the counts the report shows: every row was bad,
 * or the reject-file policy met a bad row. Like every stored reason it has no closing period.
 */
function rowsFailed(
  policy: 'skip-bad-rows' | 'reject-file',
  dataRows: number,
  rejectedCount: number,
  first: Rejection | null,
): IngestFileError {
  const firstBad = first ? `; the first is line ${first.line}: ${first.reason}` : '';
  if (policy === 'reject-file' && rejectedCount > 0) {
    return new IngestFileError(
      'rejected-row',
      `the file was rejected as a whole (policy: reject the file on any bad row): ${rejectedCount} of ${dataRows} data rows are bad${firstBad}`,
      { line: first?.line, rejectedCount, dataRowCount: dataRows },
    );
  }
  return new IngestFileError(
    'no-data-rows',
    `no row of the file passed validation: all ${dataRows} data rows were rejected${firstBad}`,
    { line: first?.line, rejectedCount, dataRowCount: dataRows },
  );
}

/**
 * Marks a catalog failed with its reason and removes every stored row. The parse report stays
 * only when the whole file was read (`dataRowCount` set); a file that failed part-way (unreadable
 * bytes, a crash, a cancel) has no row report, so rejects found before the failure are removed
 * and its count is 0, matching the list.
 */
export async function failIngest(catalogId: string, reason: string) {
  await dropRowsTables(catalogId);
  const [c] = await db
    .select({ dataRowCount: catalogs.dataRowCount })
    .from(catalogs)
    .where(eq(catalogs.id, catalogId));
  if (c && c.dataRowCount === null) {
    await db.execute(sql`DELETE FROM catalog_rejects WHERE catalog_id = ${catalogId}`);
  }
  await db
    .update(catalogs)
    .set({
      status: 'failed',
      error: reason.replace(/\.+$/, '').slice(0, 2000),
      rowCount: 0,
      ...(c && c.dataRowCount === null ? { rejectedCount: 0 } : {}),
    })
    .where(eq(catalogs.id, catalogId));
  fs.rmSync(`${pointsPath(catalogId)}.tmp`, { force: true });
  fs.rmSync(pointsPath(catalogId), { force: true });
}
