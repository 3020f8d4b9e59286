import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import mysql from 'mysql2/promise';
import type { Client } from '../helpers/client';
import { upload, waitForCatalog } from '../helpers/catalogs';
import { makeTeam, type Team } from '../helpers/team';

type Src = { l: number; b: number; v: number };
type ApiComplex = {
  id: string;
  maxSepArcsec: number;
  maxDvKms: number | null;
  v: number | null;
  review: string | null;
  reviewNote: string | null;
};
type Page = { complexes: ApiComplex[]; total: number };
type Progress = {
  run: { reviewed: number; total: number };
  filter: { reviewed: number; total: number };
};
type Neighbours = {
  prev: string | null;
  next: string | null;
  nextUnreviewed: string | null;
  position: number | null;
  total: number;
};

/** Deterministic pseudo-random numbers (a linear congruential generator; common practice). */
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => (s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32;
}

const N = 40;
/** Invented clouds 1° apart along the plane, so no two pairs can join. */
const CO: Src[] = (() => {
  const r = lcg(5);
  return Array.from({ length: N }, (_, i) => ({
    l: 20 + i,
    b: (r() - 0.5) * 0.6,
    v: 10 + r() * 80,
  }));
})();
/** One HII region per cloud, up to ~40″ away in b and up to 3 km/s off: pairs differ in both. */
const HII: Src[] = (() => {
  const r = lcg(6);
  return CO.map((s) => ({ l: s.l, b: s.b + (r() * 40) / 3600, v: s.v + (r() - 0.5) * 6 }));
})();

const toCsv = (rows: Src[], tag: string) =>
  'GLON,GLAT,VLSR,NAME\n' +
  rows
    .map((s, i) => `${s.l.toFixed(6)},${s.b.toFixed(6)},${s.v.toFixed(3)},${tag}${i}`)
    .join('\n') +
  '\n';

async function waitForRun(client: Client, runId: string) {
  const deadline = Date.now() + 120_000;
  for (;;) {
    const r = await client.json<{ run: { status: string } }>('GET', `/api/link-runs/${runId}`);
    if (['done', 'failed', 'cancelled'].includes(r.body.run.status)) return r.body.run;
    if (Date.now() > deadline) throw new Error(`run still ${r.body.run.status}`);
    await new Promise((res) => setTimeout(res, 250));
  }
}

describe('reviewing many complexes: bulk verdicts, progress and moving through a list', () => {
  let t: Team;
  let runId: string;
  let conn: mysql.Connection;
  const all = async (query = '') =>
    (await t.viewer.json<Page>('GET', `/api/link-runs/${runId}/complexes?pageSize=500&${query}`))
      .body.complexes;
  const auditCount = async () =>
    Number(
      (
        await conn.query<mysql.RowDataPacket[]>(
          "SELECT COUNT(*) AS n FROM audit_log WHERE action = 'complex.review' AND subject LIKE ?",
          [`${runId}:%`],
        )
      )[0][0].n,
    );

  beforeAll(async () => {
    conn = await mysql.createConnection(process.env.DATABASE_URL!);
    t = await makeTeam('review-flow');
    const ids: string[] = [];
    for (const [rows, kind] of [
      [CO, 'co'],
      [HII, 'hii'],
    ] as const) {
      const up = await upload(t.editor, t.projectId, {
        content: toCsv(rows, kind),
        name: kind,
        kind,
      });
      expect(up.status).toBe(202);
      const c = await waitForCatalog(t.editor, up.body.catalog.id);
      expect(c.status).toBe('ready');
      ids.push(c.id);
    }
    const start = await t.editor.json<{ run: { id: string } }>(
      'POST',
      `/api/projects/${t.projectId}/link-runs`,
      {
        catalogIds: ids,
        radius: { mode: 'fixed', arcsec: 60 },
        velocity: { mode: 'fixed', kms: 5 },
        linkMode: 'all',
        chanceTrials: 0,
      },
    );
    expect(start.status).toBe(202);
    runId = start.body.run.id;
    expect((await waitForRun(t.editor, runId)).status).toBe('done');
    // Every cloud links to its own HII region only (construction above).
    expect((await all()).length).toBe(N);
  }, 180_000);

  afterAll(async () => {
    await conn?.end();
  });

  it('gives every complex of a filter one verdict and note in one request, with an audit row for each one changed', async () => {
    const before = await all();
    const seps = before.map((c) => c.maxSepArcsec).sort((a, b) => a - b);
    const cut = seps[Math.floor(N / 2)];
    // The oracle: the filter applied in JS to the whole list.
    const inFilter = new Set(before.filter((c) => c.maxSepArcsec <= cut).map((c) => c.id));
    expect(inFilter.size).toBeGreaterThan(5);
    expect(inFilter.size).toBeLessThan(N);

    // One of them already carries the verdict and note the bulk review will give: not changed.
    const already = [...inFilter][0];
    expect(
      (
        await t.editor.json('PATCH', `/api/link-runs/${runId}/complexes/${already}`, {
          review: 'rejected',
          note: 'chance pair',
        })
      ).status,
    ).toBe(200);
    const audit0 = await auditCount();

    const body = { filter: { maxSepArcsec: String(cut) }, review: 'rejected', note: 'chance pair' };
    expect((await t.anonymous.post(`/api/link-runs/${runId}/complexes/review`, body)).status).toBe(
      401,
    );
    expect((await t.outsider.post(`/api/link-runs/${runId}/complexes/review`, body)).status).toBe(
      404,
    );
    expect((await t.viewer.post(`/api/link-runs/${runId}/complexes/review`, body)).status).toBe(
      403,
    );
    expect(await auditCount()).toBe(audit0);

    const res = await t.editor.json<{ matched: number; changed: number }>(
      'POST',
      `/api/link-runs/${runId}/complexes/review`,
      body,
    );
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ matched: inFilter.size, changed: inFilter.size - 1 });

    const [rows] = await conn.query<mysql.RowDataPacket[]>(
      'SELECT id, review, review_note AS note, reviewed_by AS who FROM complexes WHERE run_id = ?',
      [runId],
    );
    for (const r of rows) {
      if (inFilter.has(String(r.id)))
        expect({ review: r.review, note: r.note, who: r.who }).toEqual({
          review: 'rejected',
          note: 'chance pair',
          who: t.ids.editor,
        });
      else expect(r.review).toBeNull();
    }
    const [audit] = await conn.query<mysql.RowDataPacket[]>(
      "SELECT subject, user_id AS who, detail FROM audit_log WHERE action = 'complex.review' AND subject LIKE ? ORDER BY id",
      [`${runId}:%`],
    );
    const bulkRows = audit.slice(audit0);
    expect(bulkRows.length).toBe(inFilter.size - 1);
    expect(new Set(bulkRows.map((a) => String(a.subject).split(':')[1]))).toEqual(
      new Set([...inFilter].filter((id) => id !== already)),
    );
    for (const a of bulkRows) {
      const detail = typeof a.detail === 'string' ? JSON.parse(a.detail) : a.detail;
      expect({ who: a.who, review: detail.review, note: detail.note }).toEqual({
        who: t.ids.editor,
        review: 'rejected',
        note: 'chance pair',
      });
    }

    // By ids: one verdict for two complexes, one of which is outside the run → nothing changes.
    const outside = await t.editor.json('POST', `/api/link-runs/${runId}/complexes/review`, {
      complexIds: [Number(already), 99_999],
      review: 'accepted',
    });
    expect(outside.status).toBe(404);
    expect(await auditCount()).toBe(audit0 + inFilter.size - 1);
    // Both a filter and ids, or neither, is a bad request.
    expect(
      (
        await t.editor.post(`/api/link-runs/${runId}/complexes/review`, {
          filter: {},
          complexIds: [1],
          review: 'accepted',
        })
      ).status,
    ).toBe(400);
  });

  it('counts reviewed complexes for the run and for a filter as a direct SQL count does', async () => {
    const cutDv = 1.5;
    const p = await t.viewer.json<Progress>(
      'GET',
      `/api/link-runs/${runId}/complexes/review?maxDvKms=${cutDv}`,
    );
    expect(p.status).toBe(200);
    const [[run]] = await conn.query<mysql.RowDataPacket[]>(
      'SELECT COUNT(*) AS total, SUM(review IS NOT NULL) AS reviewed FROM complexes WHERE run_id = ?',
      [runId],
    );
    const [[filtered]] = await conn.query<mysql.RowDataPacket[]>(
      'SELECT COUNT(*) AS total, SUM(review IS NOT NULL) AS reviewed FROM complexes WHERE run_id = ? AND max_dv_kms <= ?',
      [runId, cutDv],
    );
    expect(p.body.run).toEqual({ reviewed: Number(run.reviewed), total: Number(run.total) });
    expect(p.body.filter).toEqual({
      reviewed: Number(filtered.reviewed),
      total: Number(filtered.total),
    });
    expect(p.body.run.reviewed).toBeGreaterThan(0);
    expect(p.body.filter.total).toBeLessThan(N);
    expect(
      (await t.anonymous.request('GET', `/api/link-runs/${runId}/complexes/review`)).status,
    ).toBe(401);
  });

  it('finds the previous, next and next unreviewed complex of a sorted list as sorting the whole list does', async () => {
    const list = await all();
    // Oracle: the list sorted in JS by v descending, ties by id descending (the API's order).
    const sorted = [...list].sort((a, b) => b.v! - a.v! || Number(b.id) - Number(a.id));
    for (const i of [0, 7, 19, sorted.length - 1]) {
      const c = sorted[i];
      const r = await t.viewer.json<Neighbours>(
        'GET',
        `/api/link-runs/${runId}/complexes/${c.id}/neighbours?sort=v&dir=desc`,
      );
      expect(r.status).toBe(200);
      const later = [...sorted.slice(i + 1), ...sorted.slice(0, i)];
      expect(r.body).toEqual({
        prev: sorted[i - 1]?.id ?? null,
        next: sorted[i + 1]?.id ?? null,
        nextUnreviewed: later.find((x) => x.review === null)?.id ?? null,
        position: i + 1,
        total: N,
      });
    }
    // Within "not reviewed" by id: a reviewed complex is outside the list but still has neighbours.
    const reviewed = list.find((c) => c.review !== null)!;
    const open = list.filter((c) => c.review === null).map((c) => Number(c.id));
    const r = await t.viewer.json<Neighbours>(
      'GET',
      `/api/link-runs/${runId}/complexes/${reviewed.id}/neighbours?review=unreviewed`,
    );
    const id = Number(reviewed.id);
    expect(r.body).toEqual({
      prev:
        open
          .filter((x) => x < id)
          .at(-1)
          ?.toString() ?? null,
      next: open.find((x) => x > id)?.toString() ?? null,
      nextUnreviewed: (open.find((x) => x > id) ?? open[0]).toString(),
      position: null,
      total: open.length,
    });
    expect(
      (await t.viewer.request('GET', `/api/link-runs/${runId}/complexes/99999/neighbours`)).status,
    ).toBe(404);
  });

  it(`refuses a bulk review of more than 5000 complexes before changing any`, async () => {
    // 5000 invented complexes added to the run, so 5040 match the empty filter.
    const values = Array.from(
      { length: 5000 },
      (_, i) =>
        `(${conn.escape(runId)}, ${1000 + i}, 2, 1, 0, 1, 1, 0, 0, 30, 0, 10, 5, 1, 0.5, 0)`,
    );
    await conn.query(
      `INSERT INTO complexes (run_id, id, size, link_count, n_hi, n_co, n_hii, n_ob, n_other, l, b, v, max_sep_arcsec, max_dv_kms, reliability, over_cap) VALUES ${values.join(',')}`,
    );
    try {
      const audit0 = await auditCount();
      const res = await t.editor.json<{ error: { code: string; message: string } }>(
        'POST',
        `/api/link-runs/${runId}/complexes/review`,
        { filter: {}, review: 'accepted', note: '' },
      );
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('too_many_complexes');
      expect(res.body.error.message).toContain('5000');
      expect(await auditCount()).toBe(audit0);
      const [[n]] = await conn.query<mysql.RowDataPacket[]>(
        "SELECT COUNT(*) AS n FROM complexes WHERE run_id = ? AND review = 'accepted'",
        [runId],
      );
      expect(Number(n.n)).toBe(0);
      // Ids past the limit are refused by the request's schema.
      const ids = Array.from({ length: 5001 }, (_, i) => i);
      expect(
        (
          await t.editor.post(`/api/link-runs/${runId}/complexes/review`, {
            complexIds: ids,
            review: 'accepted',
          })
        ).status,
      ).toBe(400);
    } finally {
      await conn.query('DELETE FROM complexes WHERE run_id = ? AND id >= 1000', [runId]);
    }
  });
});
