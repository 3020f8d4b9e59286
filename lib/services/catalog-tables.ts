import { sql } from 'drizzle-orm';
import { db } from '@/db/client';

/**
 * Each catalog's rows live in a table of their own, `catrows_<id>`. Loading goes into
 * `catrows_<id>_load` without secondary indexes; the indexes are then built in one sorted pass
 * and the table renamed into place, which is several times faster for millions of rows than
 * keeping indexes up to date row by row, and makes deleting a catalog a DROP TABLE. A catalog
 * is readable only once `catrows_<id>` exists and the catalog is marked ready.
 *
 * Canonical columns: l, b in degrees; v in km/s (LSR, radio convention); radius, position
 * error in arcsec; velocity error and line width σ in km/s; distance and its error in kpc.
 */
export function rowsTableName(catalogId: string, loading = false): string {
  if (!/^[0-9a-f-]{36}$/.test(catalogId)) throw new Error(`not a catalog id: ${catalogId}`);
  return `catrows_${catalogId.replace(/-/g, '')}${loading ? '_load' : ''}`;
}

export const rowsTable = (catalogId: string, loading = false) =>
  sql.raw(`\`${rowsTableName(catalogId, loading)}\``);

/** Canonical column list in load order (matches the TSV the ingest writes). */
export const ROW_COLUMNS =
  '`row`, line, name, l, b, v, radius_arcsec, pos_err_arcsec, v_err_kms, line_width_kms, dist_kpc, dist_err_kpc, original';

/** Drops any leftover of an earlier attempt and creates an empty load table. */
export async function createLoadTable(catalogId: string) {
  await db.execute(sql`DROP TABLE IF EXISTS ${rowsTable(catalogId, true)}`);
  await db.execute(sql`CREATE TABLE ${rowsTable(catalogId, true)} (
    \`row\` INT UNSIGNED NOT NULL PRIMARY KEY,
    line INT UNSIGNED NOT NULL,
    name VARCHAR(128) NULL,
    l DOUBLE NOT NULL,
    b DOUBLE NOT NULL,
    v DOUBLE NULL,
    radius_arcsec DOUBLE NULL,
    pos_err_arcsec DOUBLE NULL,
    v_err_kms DOUBLE NULL,
    line_width_kms DOUBLE NULL,
    dist_kpc DOUBLE NULL,
    dist_err_kpc DOUBLE NULL,
    original MEDIUMTEXT NULL
  ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
}

/**
 * Builds the indexes that paging and sorting need, then renames the table into place. Each
 * secondary index also holds the primary key, so `(column, row)` is the order a page sorted on
 * that column reads, and a deep page is found in the index alone (catalog-rows.ts); `by_name`
 * names `row` to make that order explicit.
 */
export async function finaliseLoadTable(catalogId: string) {
  await db.execute(sql`ALTER TABLE ${rowsTable(catalogId, true)}
    ADD INDEX by_l (l), ADD INDEX by_b (b), ADD INDEX by_v (v), ADD INDEX by_name (name, \`row\`),
    ADD INDEX by_radius (radius_arcsec), ADD INDEX by_line_width (line_width_kms), ADD INDEX by_dist (dist_kpc)`);
  await db.execute(sql`DROP TABLE IF EXISTS ${rowsTable(catalogId)}`);
  await db.execute(sql`RENAME TABLE ${rowsTable(catalogId, true)} TO ${rowsTable(catalogId)}`);
}

export async function dropRowsTables(catalogId: string) {
  await db.execute(sql`DROP TABLE IF EXISTS ${rowsTable(catalogId, true)}`);
  await db.execute(sql`DROP TABLE IF EXISTS ${rowsTable(catalogId)}`);
}
