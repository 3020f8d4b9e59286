import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import mysql from 'mysql2/promise';
import { is, sql } from 'drizzle-orm';
import { MySqlTable, getTableConfig } from 'drizzle-orm/mysql-core';
import { closeDb, db } from '@/db/client';
import * as schema from '@/db/schema';
import { HttpError } from '@/lib/http/errors';
import { errorResponse } from '@/lib/http/handler';
import { rowsPageSql, rowsQuerySchema } from '@/lib/services/catalog-rows';
import { rowsTableName } from '@/lib/services/catalog-tables';
import { commonLinksSql, compareRuns } from '@/lib/services/link-runs';
import { newUser, uniqueEmail, type Client } from '../helpers/client';
import { planeCsv, upload, waitForCatalog } from '../helpers/catalogs';

/** Deterministic pseudo-random numbers (a linear congruential generator; common practice). */
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => (s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32;
}

/**
 * Two invented catalogs in one patch of the plane: each HII source sits 5–55″ from a CO source,
 * so a 30″ run and a 60″ run share some links and differ in others.
 */
function pairedCatalogs(n: number) {
  const r = lcg(7);
  const co = ['GLON,GLAT,VLSR,NAME'];
  const hii = ['GLON,GLAT,VLSR,NAME'];
  for (let i = 0; i < n; i++) {
    const l = 20 + r() * 2;
    const b = (r() - 0.5) * 1;
    const v = 40 + r() * 20;
    const sepDeg = (5 + r() * 50) / 3600;
    const pa = r() * 2 * Math.PI;
    co.push(`${l.toFixed(6)},${b.toFixed(6)},${v.toFixed(2)},CO-${i}`);
    hii.push(
      `${(l + (sepDeg * Math.sin(pa)) / Math.cos((b * Math.PI) / 180)).toFixed(6)},${(b + sepDeg * Math.cos(pa)).toFixed(6)},${v.toFixed(2)},H-${i}`,
    );
  }
  return { co: co.join('\n') + '\n', hii: hii.join('\n') + '\n' };
}

/** Names with ties, case and accent variants (equal under the table's collation) and blanks. */
function namedCsv(n: number) {
  const r = lcg(11);
  const variants = ['Núcleo', 'nucleo', 'NUCLEO', 'Arm', 'arm', 'Z9', ''];
  const lines = ['GLON,GLAT,VLSR,NAME'];
  for (let i = 0; i < n; i++) {
    const name = i % 5 === 0 ? variants[i % variants.length] : `G${Math.floor(r() * 60)}`;
    lines.push(
      `${(r() * 360).toFixed(4)},${(r() * 4 - 2).toFixed(3)},${(r() * 200 - 100).toFixed(1)},${name}`,
    );
  }
  return lines.join('\n') + '\n';
}

async function readyCatalog(client: Client, projectId: string, content: string, kind: string) {
  const up = await upload(client, projectId, { content, name: `${kind} sources`, kind });
  expect(up.status).toBe(202);
  const c = await waitForCatalog(client, up.body.catalog.id);
  expect(c.status).toBe('ready');
  return c.id;
}

async function doneRun(client: Client, projectId: string, catalogIds: string[], arcsec: number) {
  const start = await client.json<{ run: { id: string } }>(
    'POST',
    `/api/projects/${projectId}/link-runs`,
    { catalogIds, radius: { mode: 'fixed', arcsec }, velocity: { mode: 'fixed', kms: 5 } },
  );
  expect(start.status).toBe(202);
  const deadline = Date.now() + 60_000;
  for (;;) {
    const r = await client.json<{ run: { status: string } }>(
      'GET',
      `/api/link-runs/${start.body.run.id}`,
    );
    if (r.body.run.status === 'done') return start.body.run.id;
    if (r.body.run.status !== 'queued' && r.body.run.status !== 'running')
      throw new Error(`run ${r.body.run.status}`);
    if (Date.now() > deadline) throw new Error('run did not finish');
    await new Promise((res) => setTimeout(res, 250));
  }
}

describe('queries that grow with the data, project deletion, not-ready exports', () => {
  let owner: Client;
  let projectId: string;
  let co: string;
  let hii: string;
  let named: string;
  let run30: string;
  let run60: string;
  let conn: mysql.Connection;

  beforeAll(async () => {
    conn = await mysql.createConnection(process.env.DATABASE_URL!);
    owner = (await newUser('limits-owner')).client;
    const created = await owner.json<{ project: { id: string } }>('POST', '/api/projects', {
      name: 'Limits',
    });
    projectId = created.body.project.id;
    const cats = pairedCatalogs(1500);
    co = await readyCatalog(owner, projectId, cats.co, 'co');
    hii = await readyCatalog(owner, projectId, cats.hii, 'hii');
    named = await readyCatalog(owner, projectId, namedCsv(1100), 'other');
    run30 = await doneRun(owner, projectId, [co, hii], 30);
    run60 = await doneRun(owner, projectId, [co, hii], 60);
  });

  afterAll(async () => {
    await conn?.end();
    await closeDb();
  });

  const linkKeys = async (runId: string) => {
    const [rows] = await conn.query<mysql.RowDataPacket[]>(
      'SELECT catalog_a, row_a, catalog_b, row_b FROM links WHERE run_id = ?',
      [runId],
    );
    return new Set(rows.map((x) => `${x.catalog_a}:${x.row_a}:${x.catalog_b}:${x.row_b}`));
  };

  it('compares two runs through the link-key index, with the counts of a set intersection', async () => {
    const [plan] = (await db.execute(sql`EXPLAIN ${commonLinksSql(run30, run60)}`)) as unknown as [
      { table: string; key: string | null; ref: string | null }[],
    ];
    // Each link of one run is found in the other by (run, catalog_a, row_a, catalog_b, row_b).
    expect(plan.map((p) => p.table)).toEqual(['x', 'y']);
    expect([plan[1].key, plan[1].ref?.split(',').length]).toEqual(['links_key', 5]);

    // Oracle: the two runs' link keys read whole and intersected in JavaScript.
    const [a, b] = [await linkKeys(run30), await linkKeys(run60)];
    const common = [...a].filter((k) => b.has(k)).length;
    expect(a.size).toBeGreaterThan(300);
    expect(b.size - common).toBeGreaterThan(100); // the wider run gains links
    const r = await owner.json<{
      comparison: {
        common: number;
        gained: number;
        lost: number;
        gainedSample: { catalogA: string; rowA: number; catalogB: string; rowB: number }[];
        lostSample: unknown[];
      };
    }>('GET', `/api/link-runs/${run30}/compare?with=${run60}`);
    expect(r.status).toBe(200);
    expect(r.body.comparison.common).toBe(common);
    expect(r.body.comparison.gained).toBe(b.size - common);
    expect(r.body.comparison.lost).toBe(a.size - common);
    expect(r.body.comparison.gainedSample).toHaveLength(20);
    for (const g of r.body.comparison.gainedSample) {
      const key = `${g.catalogA}:${g.rowA}:${g.catalogB}:${g.rowB}`;
      expect([b.has(key), a.has(key)]).toEqual([true, false]);
    }
    expect(r.body.comparison.lostSample).toHaveLength(Math.min(20, a.size - common));
  });

  it('stops a comparison at the statement time limit and answers 503 saying so', async () => {
    const before = process.env.LANEWISE_QUERY_SECONDS;
    process.env.LANEWISE_QUERY_SECONDS = '0.000001';
    let caught: unknown;
    try {
      await compareRuns(run30, run60);
    } catch (e) {
      caught = e;
    } finally {
      if (before === undefined) delete process.env.LANEWISE_QUERY_SECONDS;
      else process.env.LANEWISE_QUERY_SECONDS = before;
    }
    expect(caught).toBeInstanceOf(HttpError);
    const res = errorResponse(caught);
    expect(res.status).toBe(503);
    const body = (await res.json()) as { error: { code: string; message: string } };
    expect(body.error.code).toBe('query_timeout');
    expect(body.error.message).toMatch(/^This comparison took longer than 0\.000001 s/);
    // The pooled connection went back with the server's limit, not the tiny one.
    const [[limit]] = (await db.execute(
      sql`SELECT @@SESSION.max_statement_time AS s`,
    )) as unknown as [[{ s: number }]];
    expect(Number(limit.s)).toBe(0);
    expect((await compareRuns(run30, run60)).comparison.common).toBeGreaterThan(0);
  });

  it('answers 409 before streaming the export of a catalog that is not ready', async () => {
    const up = await upload(owner, projectId, {
      content: planeCsv(20, ['1,2,x,BAD']),
      policy: 'reject-file',
      name: 'Refused',
    });
    const c = await waitForCatalog(owner, up.body.catalog.id);
    expect(c.status).toBe('failed');
    const r = await owner.json<{ error: { code: string; message: string } }>(
      'GET',
      `/api/catalogs/${c.id}/export.csv`,
    );
    expect(r.status).toBe(409);
    expect(r.body.error.message).toMatch(/The catalog is failed/);
    // A ready catalog still streams its rows: header plus one line per row.
    const csv = await (await owner.get(`/api/catalogs/${named}/export.csv`)).text();
    expect(csv.trim().split(/\r?\n/)).toHaveLength(1 + 1100);
  });

  it('gives deep pages the rows of a whole-table OFFSET query, read through the index', async () => {
    const table = rowsTableName(named);
    // Oracle: MariaDB's own sort of the whole table (filesort, the old paging), same collation.
    const oracle = async (order: string, where = '1 = 1', limit = 37, offset = 0) => {
      const [rows] = await conn.query<mysql.RowDataPacket[]>(
        `SELECT \`row\` FROM \`${table}\` IGNORE INDEX (by_name, by_v) WHERE ${where} ORDER BY ${order} LIMIT ${limit} OFFSET ${offset}`,
      );
      return rows.map((x) => Number(x.row));
    };
    const cases = [
      { sort: 'name', dir: 'asc', order: 'name ASC, `row` ASC' },
      { sort: 'name', dir: 'desc', order: 'name DESC, `row` DESC' },
      { sort: 'v', dir: 'desc', order: 'v DESC, `row` DESC', vMin: '-20', where: 'v >= -20' },
    ];
    for (const c of cases) {
      const seen = new Set<number>();
      const qs = `sort=${c.sort}&dir=${c.dir}&pageSize=37${c.vMin ? `&vMin=${c.vMin}` : ''}`;
      for (let page = 1; ; page++) {
        const r = await owner.json<{ rows: { row: number }[]; total: number }>(
          'GET',
          `/api/catalogs/${named}/rows?${qs}&page=${page}`,
        );
        expect(r.status).toBe(200);
        const got = r.body.rows.map((x) => x.row);
        expect([page, got]).toEqual([page, await oracle(c.order, c.where, 37, (page - 1) * 37)]);
        got.forEach((x) => seen.add(x));
        if (got.length < 37) {
          expect(seen.size).toBe(r.body.total);
          break;
        }
      }
    }
    // The deep page's row numbers come from the name index alone, then one lookup per row.
    const q = rowsQuerySchema.parse({ sort: 'name', page: '25', pageSize: '37' });
    const [plan] = (await db.execute(sql`EXPLAIN ${rowsPageSql(named, q)}`)) as unknown as [
      { select_type: string; table: string; type: string; key: string | null; Extra: string }[],
    ];
    const inner = plan.find((p) => p.select_type === 'DERIVED')!;
    expect([inner.key, inner.Extra]).toEqual(['by_name', 'Using index']);
    const outer = plan.find((p) => p.table === 't')!;
    expect([outer.type, outer.key]).toEqual(['eq_ref', 'PRIMARY']);
  });

  it('deletes everything of a project: rows, tables, per-run tables, jobs and files', async () => {
    const analysis = await owner.json<{ analysis: { id: string } }>(
      'POST',
      `/api/projects/${projectId}/analyses`,
      { runId: run60, curve: { name: 'reid-2014' }, arms: { preset: 'reid-2014' } },
    );
    expect(analysis.status).toBe(202);
    const invite = await owner.json('POST', `/api/projects/${projectId}/members`, {
      email: uniqueEmail('limits-guest'),
      role: 'viewer',
    });
    expect(invite.status).toBe(201);
    expect(
      (await owner.patch(`/api/link-runs/${run30}/complexes/0`, { review: 'doubtful', note: 'x' }))
        .status,
    ).toBe(200);

    const [catRows] = await conn.query<mysql.RowDataPacket[]>(
      'SELECT id FROM catalogs WHERE project_id = ?',
      [projectId],
    );
    const [runRows] = await conn.query<mysql.RowDataPacket[]>(
      'SELECT id FROM link_runs WHERE project_id = ?',
      [projectId],
    );
    const [analysisRows] = await conn.query<mysql.RowDataPacket[]>(
      'SELECT id FROM analyses WHERE project_id = ?',
      [projectId],
    );
    const catalogIds = catRows.map((r) => String(r.id));
    const ids = [
      projectId,
      ...catalogIds,
      ...runRows.map((r) => String(r.id)),
      ...analysisRows.map((r) => String(r.id)),
    ];
    // CO, HII and the named catalog (and the refused one when the export test ran first).
    expect(catalogIds).toEqual(expect.arrayContaining([co, hii, named]));
    expect(ids).toHaveLength(1 + catalogIds.length + 2 + 1);
    const dataDir = process.env.LANEWISE_DATA_DIR!;
    expect(fs.existsSync(path.join(dataDir, 'uploads', co))).toBe(true);

    expect((await owner.delete(`/api/projects/${projectId}`)).status).toBe(204);
    // Gone for its users at once, while the job removes the rest.
    expect((await owner.get(`/api/projects/${projectId}`)).status).toBe(404);
    expect((await owner.get(`/api/catalogs/${co}/rows`)).status).toBe(404);
    const list = await owner.json<{ projects: { id: string }[] }>('GET', '/api/projects');
    expect(list.body.projects.map((p) => p.id)).not.toContain(projectId);

    const deadline = Date.now() + 60_000;
    for (;;) {
      const [[job]] = await conn.query<mysql.RowDataPacket[]>(
        "SELECT status, error FROM jobs WHERE kind = 'project-delete' AND JSON_VALUE(payload, '$.projectId') = ?",
        [projectId],
      );
      expect(job).toBeDefined();
      if (job.status === 'done') break;
      expect([job.status, job.error]).toEqual([expect.stringMatching(/queued|running/), null]);
      if (Date.now() > deadline) throw new Error('the project-delete job did not finish');
      await new Promise((res) => setTimeout(res, 250));
    }

    // Every id-like column of every table in db/schema.ts, for every id of the project.
    const leftovers: string[] = [];
    for (const t of Object.values(schema)) {
      if (!is(t, MySqlTable)) continue;
      const cfg = getTableConfig(t);
      for (const col of cfg.columns) {
        if (!/^varchar/.test(col.getSQLType())) continue;
        if (!/(^|_)id$|^catalog_[ab]$/.test(col.name)) continue;
        const [[r]] = await conn.query<mysql.RowDataPacket[]>(
          `SELECT COUNT(*) AS n FROM \`${cfg.name}\` WHERE \`${col.name}\` IN (?)`,
          [ids],
        );
        if (Number(r.n)) leftovers.push(`${cfg.name}.${col.name}: ${r.n}`);
      }
    }
    expect(leftovers).toEqual([]);
    // Text that names the project's things: audit subjects, job payloads (but the deletion's record).
    for (const id of ids) {
      const [[r]] = await conn.query<mysql.RowDataPacket[]>(
        `SELECT (SELECT COUNT(*) FROM audit_log WHERE subject LIKE ?) +
                (SELECT COUNT(*) FROM jobs WHERE kind <> 'project-delete' AND payload LIKE ?) AS n`,
        [`%${id}%`, `%${id}%`],
      );
      expect([id, Number(r.n)]).toEqual([id, 0]);
    }
    const [tables] = await conn.query<mysql.RowDataPacket[]>(
      "SELECT table_name AS name FROM information_schema.tables WHERE table_schema = DATABASE() AND table_name LIKE 'catrows\\_%'",
    );
    const hex = catalogIds.map((id) => id.replace(/-/g, ''));
    expect(tables.map((x) => String(x.name)).filter((n) => hex.some((h) => n.includes(h)))).toEqual(
      [],
    );
    const files = fs.readdirSync(dataDir, { recursive: true }).map(String);
    expect(files.filter((f) => ids.some((id) => f.includes(id)))).toEqual([]);
  });
});
