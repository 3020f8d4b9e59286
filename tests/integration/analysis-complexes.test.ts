import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import mysql from 'mysql2/promise';
import type { Client } from '../helpers/client';
import { upload, waitForCatalog } from '../helpers/catalogs';
import { makeTeam, type Team } from '../helpers/team';

type Src = { l: number; b: number; v: number };

/** Deterministic pseudo-random numbers (a linear congruential generator; common practice). */
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => (s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32;
}

/**
 * Invented clouds: inside the solar circle (first quadrant, velocities below a rough terminal
 * velocity 220 (1 − sin l) km/s, so most have a near and a far root), a few beyond it (terminal
 * velocity, tangent point) and some in the outer Galaxy (negative velocities, one root).
 */
function clouds(n: number): Src[] {
  const r = lcg(11);
  const out: Src[] = [];
  for (let i = 0; i < n; i++) {
    const b = (r() - 0.5) * 0.8;
    if (i % 5 === 4) {
      out.push({ l: 110 + r() * 60, b, v: -5 - r() * 50 });
    } else {
      const l = 18 + r() * 55;
      const vt = 220 * (1 - Math.sin((l * Math.PI) / 180));
      out.push({ l, b, v: i % 9 === 0 ? vt + 25 : 5 + r() * 0.85 * vt });
    }
  }
  return out;
}

const toCsv = (rows: Src[]) =>
  'GLON,GLAT,VLSR,NAME\n' +
  rows.map((s, i) => `${s.l.toFixed(6)},${s.b.toFixed(6)},${s.v.toFixed(3)},S${i + 1}`).join('\n') +
  '\n';

async function waitFor(client: Client, url: string, key: 'run' | 'analysis', timeoutMs = 180_000) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const r = await client.json<Record<string, { status: string } & Record<string, unknown>>>(
      'GET',
      url,
    );
    const x = r.body[key];
    if (['done', 'failed', 'cancelled'].includes(x.status)) return x;
    if (Date.now() > deadline) throw new Error(`${key} still ${x.status}`);
    await new Promise((res) => setTimeout(res, 300));
  }
}

type Placed = {
  distKpc: number | null;
  distLoKpc: number | null;
  distHiKpc: number | null;
  distCi95: [number, number] | null;
  pNear: number | null;
  choice: string;
  arm: string | null;
  perpOffsetKpc: number | null;
  used: boolean;
};
type ResultRow = Placed & { id: string };
type ApiComplex = { id: string; size: number; analysis: (Placed & { id: string }) | null };
type Page = { complexes: ApiComplex[]; total: number };

const pick = (r: Placed): Placed => ({
  distKpc: r.distKpc,
  distLoKpc: r.distLoKpc,
  distHiKpc: r.distHiKpc,
  distCi95: r.distCi95,
  pNear: r.pNear,
  choice: r.choice,
  arm: r.arm,
  perpOffsetKpc: r.perpOffsetKpc,
  used: r.used,
});

/**
 * A result row as the API must return it. MariaDB sends a DOUBLE as text that can be one unit
 * in the last place off, so numbers match to 12 decimals (distances of a few kpc).
 */
const placedLike = (r: Placed) => {
  const near = (x: number | null) => (x === null ? null : expect.closeTo(x, 12));
  return {
    ...pick(r),
    distKpc: near(r.distKpc),
    distLoKpc: near(r.distLoKpc),
    distHiKpc: near(r.distHiKpc),
    distCi95: r.distCi95 && r.distCi95.map(near),
    pNear: near(r.pNear),
    perpOffsetKpc: near(r.perpOffsetKpc),
  };
};

describe("each complex's distance and arm from the run's latest analysis", () => {
  let t: Team;
  let runId: string;
  const CO = clouds(60);
  // HII regions: the same clouds nudged by up to ~15″ and 1 km/s.
  const HII = (() => {
    const r = lcg(12);
    return CO.map((s) => ({
      l: s.l + (r() - 0.5) * 0.008,
      b: s.b + (r() - 0.5) * 0.008,
      v: s.v + (r() - 0.5) * 2,
    }));
  })();
  const body = (extra: Record<string, unknown>) => ({
    runId,
    curve: { name: 'reid-2014' },
    arms: { preset: 'reid-2014' },
    resamples: 2000,
    mcDraws: 100,
    ...extra,
  });

  async function analyse(extra: Record<string, unknown>) {
    const start = await t.editor.json<{ analysis: { id: string } }>(
      'POST',
      `/api/projects/${t.projectId}/analyses`,
      body(extra),
    );
    expect(start.status).toBe(202);
    const a = (await waitFor(
      t.viewer,
      `/api/analyses/${start.body.analysis.id}`,
      'analysis',
    )) as unknown as { id: string; status: string; result: { complexes: ResultRow[] } };
    expect(a.status).toBe('done');
    return a;
  }

  /** Every complex of the run, read through the API a page at a time. */
  async function allPages(client: Client, query: string, pageSize = 7) {
    const out: ApiComplex[] = [];
    for (let page = 1; ; page++) {
      const r = await client.json<Page>(
        'GET',
        `/api/link-runs/${runId}/complexes?${query}&page=${page}&pageSize=${pageSize}`,
      );
      expect(r.status).toBe(200);
      out.push(...r.body.complexes);
      if (out.length >= r.body.total || r.body.complexes.length === 0) return out;
    }
  }

  beforeAll(async () => {
    t = await makeTeam('placed');
    const ids: string[] = [];
    for (const [rows, kind] of [
      [CO, 'co'],
      [HII, 'hii'],
    ] as const) {
      const up = await upload(t.editor, t.projectId, { content: toCsv(rows), name: kind, kind });
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
        velocity: { mode: 'fixed', kms: 3 },
        linkMode: 'all',
        chanceTrials: 0,
      },
    );
    runId = start.body.run.id;
    expect((await waitFor(t.editor, `/api/link-runs/${runId}`, 'run')).status).toBe('done');
  });

  afterAll(async () => {
    // Deleting the project removes its runs, their analyses and, with them, the stored rows.
    if (!t) return;
    const conn = await mysql.createConnection(process.env.DATABASE_URL!);
    try {
      expect((await t.owner.delete(`/api/projects/${t.projectId}`)).status).toBeLessThan(300);
      // The project is gone at once; a job removes its rows (lib/jobs/project-delete.ts).
      const left = async () => {
        const [rows] = await conn.query<mysql.RowDataPacket[]>(
          'SELECT COUNT(*) AS n FROM analysis_complexes WHERE run_id = ?',
          [runId],
        );
        return Number(rows[0].n);
      };
      const deadline = Date.now() + 60_000;
      while ((await left()) > 0 && Date.now() < deadline)
        await new Promise((resolve) => setTimeout(resolve, 500));
      expect(await left()).toBe(0);
    } finally {
      await conn.end();
    }
  });

  it('shows no analysis before one has finished', async () => {
    const all = await allPages(t.viewer, 'sort=id&dir=asc', 100);
    expect(all.length).toBeGreaterThan(40);
    expect(all.every((c) => c.analysis === null)).toBe(true);
  });

  it("returns each complex's row of the latest done analysis, sorts on it, and follows a newer analysis", async () => {
    const first = await analyse({ seed: 5 });
    const rows = first.result.complexes;
    const byId = new Map(rows.map((r) => [r.id, r]));

    const listed = await allPages(t.viewer, 'sort=id&dir=asc', 500);
    expect(listed.length).toBe(rows.length);
    for (const c of listed) {
      expect(c.analysis?.id).toBe(first.id);
      // the analysis's own stored result (JSON), a path the table does not share
      expect(pick(c.analysis!)).toEqual(placedLike(byId.get(c.id)!));
    }
    // The data exercise the columns: missing distances or arms, and both near and far roots.
    expect(rows.some((r) => r.arm !== null)).toBe(true);
    expect(rows.some((r) => r.arm === null)).toBe(true);
    expect(rows.some((r) => r.pNear === null)).toBe(true);
    expect(rows.some((r) => r.pNear !== null && r.pNear > 0 && r.pNear < 1)).toBe(true);

    // Sorting by distance, a page at a time, matches a plain sort of the result's rows. The
    // oracle is MariaDB's order written out: NULL first ascending, last descending; ties by id.
    for (const dir of ['asc', 'desc'] as const) {
      const s = dir === 'asc' ? 1 : -1;
      const expected = [...rows]
        .sort((a, b) => {
          const x = a.distKpc ?? -Infinity;
          const y = b.distKpc ?? -Infinity;
          return x !== y ? s * (x - y) : s * (Number(a.id) - Number(b.id));
        })
        .map((r) => r.id);
      const got = await allPages(t.viewer, `sort=dist&dir=${dir}`);
      expect(got.map((c) => c.id)).toEqual(expected);
    }

    const one = rows.find((r) => r.distKpc !== null)!;
    const detail = await t.viewer.json<{ complex: ApiComplex }>(
      'GET',
      `/api/link-runs/${runId}/complexes/${one.id}`,
    );
    expect(detail.status).toBe(200);
    expect(detail.body.complex.analysis?.id).toBe(first.id);
    expect(pick(detail.body.complex.analysis!)).toEqual(placedLike(one));

    // A later analysis with the near root forced places some complexes elsewhere; the API follows it.
    const second = await analyse({ seed: 6, nearFar: 'near' });
    const moved = second.result.complexes.filter(
      (r) => r.distKpc !== byId.get(r.id)!.distKpc,
    ).length;
    expect(moved).toBeGreaterThan(0);
    const again = await allPages(t.viewer, 'sort=id&dir=asc', 500);
    const secondById = new Map(second.result.complexes.map((r) => [r.id, r]));
    for (const c of again) {
      expect(c.analysis?.id).toBe(second.id);
      expect(pick(c.analysis!)).toEqual(placedLike(secondById.get(c.id)!));
    }
  });

  it('lets viewers read the placed complexes; outsiders get 404 and anonymous callers 401', async () => {
    const list = `/api/link-runs/${runId}/complexes?sort=dist&dir=desc`;
    const one = `/api/link-runs/${runId}/complexes/0`;
    expect((await t.viewer.get(list)).status).toBe(200);
    expect((await t.viewer.get(one)).status).toBe(200);
    expect((await t.outsider.get(list)).status).toBe(404);
    expect((await t.outsider.get(one)).status).toBe(404);
    expect((await t.anonymous.get(list)).status).toBe(401);
    expect((await t.anonymous.get(one)).status).toBe(401);
  });
});
