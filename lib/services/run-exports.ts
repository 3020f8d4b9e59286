import { inArray } from 'drizzle-orm';
import type { RowDataPacket } from 'mysql2';
import { db, pool } from '@/db/client';
import { catalogs } from '@/db/schema';
import { csvLine } from '@/lib/export/csv';
import { votableStream, type VotableField } from '@/lib/export/votable';
import { rowsTableName } from './catalog-tables';
import { requireDoneRun } from './link-runs';
import pkg from '@/package.json';

export type ExportShape = 'links' | 'complexes' | 'sources';

type Table = { fields: VotableField[]; rows: AsyncGenerator<unknown[]> };

const CHUNK = 10_000;

/** Reads a run's table in primary-key order, a chunk at a time: flat memory for any size. */
async function* chunks(query: string, runId: string): AsyncGenerator<RowDataPacket[]> {
  let after = -1;
  for (;;) {
    const [rows] = await pool().query<RowDataPacket[]>(query, [runId, after, CHUNK]);
    if (!rows.length) return;
    yield rows;
    after = Number(rows[rows.length - 1].id);
  }
}

const SOURCE_COLUMNS = ['name', 'l', 'b', 'v'] as const;

function linksTable(runId: string): Table {
  const fields: VotableField[] = [
    { name: 'catalog_a', datatype: 'char', arraysize: '*', ucd: 'meta.id' },
    { name: 'row_a', datatype: 'int', description: '1-based data row of catalog A as uploaded' },
    { name: 'catalog_b', datatype: 'char', arraysize: '*', ucd: 'meta.id' },
    { name: 'row_b', datatype: 'int', description: '1-based data row of catalog B as uploaded' },
    { name: 'separation_arcsec', datatype: 'double', unit: 'arcsec', ucd: 'pos.angDistance' },
    { name: 'delta_v_kms', datatype: 'double', unit: 'km/s', description: 'v_LSR(B) − v_LSR(A)' },
    { name: 'complex_id', datatype: 'int', ucd: 'meta.id' },
    { name: 'reliability', datatype: 'double', description: '1 − chance/real links at this separation' },
    { name: 'match_radius_arcsec', datatype: 'double', unit: 'arcsec' },
    ...SOURCE_COLUMNS.map((c) => ({ name: `a_${c}`, datatype: c === 'name' ? 'char' : 'double', arraysize: c === 'name' ? '*' : undefined }) as VotableField),
    ...SOURCE_COLUMNS.map((c) => ({ name: `b_${c}`, datatype: c === 'name' ? 'char' : 'double', arraysize: c === 'name' ? '*' : undefined }) as VotableField),
  ];
  async function* rows() {
    const [pairs] = await pool().query<RowDataPacket[]>('SELECT DISTINCT catalog_a, catalog_b FROM links WHERE run_id = ?', [runId]);
    for (const pair of pairs) {
      // One query per chunk joins both catalogs' rows on their primary keys.
      const query = `SELECT l.id, l.catalog_a, l.row_a, l.catalog_b, l.row_b, l.sep_arcsec, l.dv_kms, l.complex_id, l.reliability, l.radius_arcsec,
          a.name, a.l, a.b, a.v, b.name, b.l, b.b, b.v
        FROM links l JOIN \`${rowsTableName(pair.catalog_a)}\` a ON a.\`row\` = l.row_a JOIN \`${rowsTableName(pair.catalog_b)}\` b ON b.\`row\` = l.row_b
        WHERE l.run_id = ? AND l.catalog_a = ? AND l.catalog_b = ? AND l.id > ? ORDER BY l.id LIMIT ?`;
      let after = -1;
      for (;;) {
        const [chunk] = await pool().query<RowDataPacket[]>({ sql: query, values: [runId, pair.catalog_a, pair.catalog_b, after, CHUNK], rowsAsArray: true });
        if (!chunk.length) break;
        for (const r of chunk as unknown as unknown[][]) yield r.slice(1);
        after = Number((chunk[chunk.length - 1] as unknown as unknown[])[0]);
      }
    }
  }
  return { fields, rows: rows() };
}

function complexesTable(runId: string): Table {
  const fields: VotableField[] = [
    { name: 'complex_id', datatype: 'int', ucd: 'meta.id' },
    { name: 'name', datatype: 'char', arraysize: '*', description: 'name of its first member' },
    { name: 'size', datatype: 'int' },
    { name: 'links', datatype: 'int' },
    { name: 'n_hi', datatype: 'int' },
    { name: 'n_co', datatype: 'int' },
    { name: 'n_hii', datatype: 'int' },
    { name: 'n_ob', datatype: 'int' },
    { name: 'n_other', datatype: 'int' },
    { name: 'l_deg', datatype: 'double', unit: 'deg', ucd: 'pos.galactic.lon', description: 'centroid' },
    { name: 'b_deg', datatype: 'double', unit: 'deg', ucd: 'pos.galactic.lat', description: 'centroid' },
    { name: 'v_lsr_kms', datatype: 'double', unit: 'km/s', ucd: 'spect.dopplerVeloc', description: 'mean of members with a velocity' },
    { name: 'max_separation_arcsec', datatype: 'double', unit: 'arcsec' },
    { name: 'max_abs_delta_v_kms', datatype: 'double', unit: 'km/s' },
    { name: 'reliability', datatype: 'double', description: 'lowest reliability of its links' },
    { name: 'over_cap', datatype: 'boolean' },
    { name: 'review', datatype: 'char', arraysize: '*' },
    { name: 'review_note', datatype: 'char', arraysize: '*' },
    { name: 'reviewed_at', datatype: 'char', arraysize: '*' },
  ];
  async function* rows() {
    for await (const chunk of chunks(
      'SELECT id, name, size, link_count, n_hi, n_co, n_hii, n_ob, n_other, l, b, v, max_sep_arcsec, max_dv_kms, reliability, over_cap, review, review_note, reviewed_at FROM complexes WHERE run_id = ? AND id > ? ORDER BY id LIMIT ?',
      runId,
    )) {
      for (const r of chunk) {
        yield [
          r.id, r.name, r.size, r.link_count, r.n_hi, r.n_co, r.n_hii, r.n_ob, r.n_other, r.l, r.b, r.v, r.max_sep_arcsec,
          r.max_dv_kms, r.reliability, !!r.over_cap, r.review, r.review_note, r.reviewed_at ? new Date(r.reviewed_at).toISOString() : null,
        ];
      }
    }
  }
  return { fields, rows: rows() };
}

/** Every source of the run's catalogs with its complex (empty when it has no link). */
function sourcesTable(runId: string, catalogIds: string[]): Table {
  const fields: VotableField[] = [
    { name: 'catalog_id', datatype: 'char', arraysize: '*', ucd: 'meta.id' },
    { name: 'row', datatype: 'int' },
    { name: 'name', datatype: 'char', arraysize: '*' },
    { name: 'l_deg', datatype: 'double', unit: 'deg', ucd: 'pos.galactic.lon' },
    { name: 'b_deg', datatype: 'double', unit: 'deg', ucd: 'pos.galactic.lat' },
    { name: 'v_lsr_kms', datatype: 'double', unit: 'km/s', ucd: 'spect.dopplerVeloc' },
    { name: 'complex_id', datatype: 'int', ucd: 'meta.id' },
  ];
  async function* rows() {
    for (const cat of catalogIds) {
      let after = 0;
      for (;;) {
        const [chunk] = await pool().query<RowDataPacket[]>(
          `SELECT s.\`row\`, s.name, s.l, s.b, s.v, m.complex_id FROM \`${rowsTableName(cat)}\` s
           LEFT JOIN complex_members m ON m.run_id = ? AND m.catalog_id = ? AND m.\`row\` = s.\`row\`
           WHERE s.\`row\` > ? ORDER BY s.\`row\` LIMIT ?`,
          [runId, cat, after, CHUNK],
        );
        if (!chunk.length) break;
        for (const r of chunk) yield [cat, r.row, r.name, r.l, r.b, r.v, r.complex_id];
        after = Number(chunk[chunk.length - 1].row);
      }
    }
  }
  return { fields, rows: rows() };
}

async function table(runId: string, shape: ExportShape): Promise<Table> {
  const run = await requireDoneRun(runId);
  if (shape === 'links') return linksTable(runId);
  if (shape === 'complexes') return complexesTable(runId);
  return sourcesTable(runId, run.catalogIds);
}

/** A run's links, complexes or sources as CSV text pieces (header first). */
export async function* runCsv(runId: string, shape: ExportShape): AsyncGenerator<string> {
  const t = await table(runId, shape);
  yield csvLine(t.fields.map((f) => f.name));
  let buf = '';
  for await (const row of t.rows) {
    buf += csvLine(row);
    if (buf.length > 1 << 16) {
      yield buf;
      buf = '';
    }
  }
  if (buf) yield buf;
}

/** The same tables as VOTable 1.4 TABLEDATA. */
export async function runVotable(runId: string, shape: ExportShape): Promise<AsyncGenerator<string>> {
  const t = await table(runId, shape);
  return votableStream({ resourceName: `lanewise-link-run-${runId}`, tableName: shape, description: `Lanewise link run ${runId}: ${shape}`, fields: t.fields, rows: t.rows });
}

/** Everything needed to reproduce and cite a run: parameters, versions and references. */
export async function runMethods(runId: string) {
  const run = await requireDoneRun(runId);
  const cats = await db.select({ id: catalogs.id, name: catalogs.name, kind: catalogs.kind, fileName: catalogs.fileName, rowCount: catalogs.rowCount, mapping: catalogs.mapping }).from(catalogs).where(inArray(catalogs.id, run.catalogIds));
  const deps = pkg.dependencies as Record<string, string>;
  return {
    run: { id: run.id, name: run.name, createdAt: run.createdAt.toISOString(), finishedAt: run.finishedAt?.toISOString() ?? null },
    parameters: run.params,
    catalogs: cats,
    summary: run.summary,
    software: { lanewise: pkg.version, node: process.version, kdbush: deps.kdbush, mariadbDriver: deps.mysql2 },
    conventions: {
      positions: 'Galactic l, b (IAU 1958 system, J2000 realisation; Hipparcos Catalogue Vol. 1 §1.5.3), degrees',
      velocities: 'v_LSR (kinematic LSR: 20 km/s toward α = 18h, δ = +30° B1900), radio convention, km/s',
      separation: 'great-circle separation, Vincenty formula (Vincenty 1975)',
      rows: '1-based data rows of each file as uploaded (header lines not counted)',
    },
    methods: [
      'Candidate pairs from a k-d tree over (l, b) (kdbush), widened by 1/cos b and split at l = 0°/360°; caps near the poles; every pair decided by its exact separation.',
      'Radius fixed, or k·(r_A + r_B) with a floor, position errors added in quadrature; velocity window fixed or k·√(σ_A² + σ_B²).',
      'Complexes: connected components of the links, by union–find (Tarjan & van Leeuwen 1984).',
      'Chance links: the match repeated with catalog A rotated in longitude by each offset; expected chance links = mean over offsets; reliability per link = 1 − N_chance/N_real in its separation bin (common practice).',
    ],
    references: [
      'ESA 1997, The Hipparcos and Tycho Catalogues, ESA SP-1200, Vol. 1, §1.5.3',
      'Vincenty, T. 1975, Survey Review 23, 88',
      'Tarjan, R. E. & van Leeuwen, J. 1984, J. ACM 31, 245',
    ],
  };
}
