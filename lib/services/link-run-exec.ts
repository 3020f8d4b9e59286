import { eq, sql } from 'drizzle-orm';
import type { RowDataPacket } from 'mysql2';
import { db, pool } from '@/db/client';
import { linkRuns, projects, users } from '@/db/schema';
import { env } from '@/lib/env';
import { sendMail } from '@/lib/mail/send';
import { runFinishedMail } from '@/lib/mail/templates';
import {
  buildComplexes,
  estimateChanceLinks,
  matchCatalogs,
  pairRadiusArcsec,
  type LinkSet,
  type MatchParams,
  type SourceArrays,
} from '@/lib/match';
import { loadTsv, tsvCell } from './bulk-load';
import { rowsTableName } from './catalog-tables';
import { runCatalogs, type LinkRunParams, type RunCatalog } from './link-runs';

type LoadedCatalog = RunCatalog & {
  src: SourceArrays;
  rowNumber: Uint32Array;
  names: (string | null)[];
};

/** Reads a ready catalog's canonical columns into flat typed arrays, in row order. */
async function loadCatalog(c: RunCatalog): Promise<LoadedCatalog> {
  const [rows] = await pool().query<RowDataPacket[]>({
    sql: `SELECT \`row\`, l, b, v, radius_arcsec, pos_err_arcsec, line_width_kms, name FROM \`${rowsTableName(c.id)}\` ORDER BY \`row\``,
    rowsAsArray: true,
  });
  const n = rows.length;
  const src = {
    lDeg: new Float64Array(n),
    bDeg: new Float64Array(n),
    vKms: new Float64Array(n),
    radiusArcsec: new Float64Array(n),
    posErrArcsec: new Float64Array(n),
    lineWidthKms: new Float64Array(n),
  };
  const rowNumber = new Uint32Array(n);
  const names: (string | null)[] = new Array(n);
  const num = (x: unknown, missing: number) => (x === null ? missing : Number(x));
  for (let i = 0; i < n; i++) {
    const r = rows[i] as unknown[];
    rowNumber[i] = Number(r[0]);
    src.lDeg[i] = Number(r[1]);
    src.bDeg[i] = Number(r[2]);
    src.vKms[i] = num(r[3], NaN);
    src.radiusArcsec[i] = num(r[4], 0);
    src.posErrArcsec[i] = num(r[5], 0);
    src.lineWidthKms[i] = num(r[6], 0);
    names[i] = (r[7] as string | null) ?? null;
  }
  return { ...c, src, rowNumber, names };
}

function histogram(values: ArrayLike<number> & Iterable<number>, edges: number[]) {
  const counts = new Array(edges.length - 1).fill(0);
  for (const x of values) {
    if (!Number.isFinite(x)) continue;
    let k = edges.findIndex((e, i) => i > 0 && x <= e) - 1;
    if (k < 0) k = x < edges[0] ? 0 : counts.length - 1;
    counts[Math.max(0, Math.min(counts.length - 1, k))]++;
  }
  return { edges, counts };
}

const linspace = (a: number, b: number, n: number) =>
  Array.from({ length: n + 1 }, (_, i) => +(a + ((b - a) * i) / n).toPrecision(6));

type PairResult = {
  catA: number;
  catB: number;
  links: LinkSet;
  reliability: Float32Array | null;
  expected: number | null;
  stdErr: number | null;
  overall: number | null;
};

/** Unit-vector mean of positions: a centroid that is right across l = 0°/360°. */
function centroid(ls: number[], bs: number[]) {
  let x = 0;
  let y = 0;
  let z = 0;
  const d = Math.PI / 180;
  for (let i = 0; i < ls.length; i++) {
    x += Math.cos(bs[i] * d) * Math.cos(ls[i] * d);
    y += Math.cos(bs[i] * d) * Math.sin(ls[i] * d);
    z += Math.sin(bs[i] * d);
  }
  const l = (Math.atan2(y, x) / d + 360) % 360;
  const b = Math.atan2(z, Math.hypot(x, y)) / d;
  return { l, b };
}

/**
 * Runs one link run: match every pair of its catalogs (with the shifted-catalog chance
 * estimate when asked), group links into complexes, and store links, complexes and members.
 * The run is marked `done` last, after everything is stored; on failure the caller removes what
 * was written ({@link clearRunResults}), so no half-written run is ever shown.
 */
export async function executeLinkRun(
  runId: string,
  progress: (fraction: number) => Promise<void>,
  signal: AbortSignal,
) {
  const started = Date.now();
  const [run] = await db.select().from(linkRuns).where(eq(linkRuns.id, runId));
  if (!run) throw new Error(`link run ${runId} no longer exists`);
  await clearRunResults(runId);
  await db
    .update(linkRuns)
    .set({ status: 'running', startedAt: sql`NOW(3)`, error: null })
    .where(eq(linkRuns.id, runId));
  const params = run.params as unknown as LinkRunParams;
  const chosen = await runCatalogs(run.projectId, run.catalogIds);
  const cats: LoadedCatalog[] = [];
  for (const c of chosen) cats.push(await loadCatalog(c));
  await progress(0.05);

  const matchParams: MatchParams = {
    radius: params.radius,
    velocity: params.velocity,
    linkMode: params.linkMode,
    missingVelocity: params.missingVelocity,
  };
  // Spread the chosen number of repeats over both signs: ±1°, ±2°, … (common practice).
  const shiftsDeg = Array.from(
    { length: params.chanceTrials },
    (_, k) => (k % 2 === 0 ? 1 : -1) * (Math.floor(k / 2) + 1),
  );
  const pairList: [number, number][] = [];
  for (let i = 0; i < cats.length; i++)
    for (let j = i + 1; j < cats.length; j++) pairList.push([i, j]);
  const results: PairResult[] = [];
  let lastReported = 0;
  for (let p = 0; p < pairList.length; p++) {
    const [i, j] = pairList[p];
    const base = 0.05 + (0.75 * p) / pairList.length;
    const span = 0.75 / pairList.length;
    const onProgress = (f: number) => {
      const now = Date.now();
      if (now - lastReported > 500) {
        lastReported = now;
        progress(base + span * f).catch(() => undefined);
      }
    };
    if (shiftsDeg.length) {
      const est = await estimateChanceLinks(cats[i].src, cats[j].src, matchParams, {
        shiftsDeg,
        onProgress,
        signal,
      });
      results.push({
        catA: i,
        catB: j,
        links: est.links,
        reliability: est.reliability,
        expected: est.expected,
        stdErr: Number.isFinite(est.stdErr) ? est.stdErr : null,
        overall: Number.isFinite(est.overallReliability) ? est.overallReliability : null,
      });
    } else {
      const links = await matchCatalogs(cats[i].src, cats[j].src, matchParams, {
        onProgress,
        signal,
      });
      results.push({
        catA: i,
        catB: j,
        links,
        reliability: null,
        expected: null,
        stdErr: null,
        overall: null,
      });
    }
    await progress(base + span);
  }

  const complexes = buildComplexes(
    cats.map((c) => c.src.lDeg.length),
    results.map((r) => ({ catA: r.catA, catB: r.catB, links: r.links })),
    { maxSize: params.complexCap },
  );
  await progress(0.82);

  // Per-complex link statistics.
  const nC = complexes.count;
  const maxSep = new Float64Array(nC);
  const maxDv = new Float64Array(nC).fill(NaN);
  const minRel = new Float64Array(nC).fill(NaN);
  const linkLines: string[] = [];
  const allSep: number[] = [];
  const allDv: number[] = [];
  let linkId = 0;
  for (const r of results) {
    const a = cats[r.catA];
    const b = cats[r.catB];
    for (let k = 0; k < r.links.count; k++) {
      const ia = r.links.indexA[k];
      const ib = r.links.indexB[k];
      const c = complexes.complexOf[r.catA][ia];
      const sep = r.links.sepArcsec[k];
      const dv = r.links.dvKms[k];
      const rel = r.reliability ? r.reliability[k] : NaN;
      maxSep[c] = Math.max(maxSep[c], sep);
      if (Number.isFinite(dv))
        maxDv[c] = Number.isFinite(maxDv[c]) ? Math.max(maxDv[c], Math.abs(dv)) : Math.abs(dv);
      if (Number.isFinite(rel))
        minRel[c] = Number.isFinite(minRel[c]) ? Math.min(minRel[c], rel) : rel;
      allSep.push(sep);
      allDv.push(dv);
      const radius = pairRadiusArcsec(
        params.radius,
        a.src.radiusArcsec![ia],
        b.src.radiusArcsec![ib],
        a.src.posErrArcsec![ia],
        b.src.posErrArcsec![ib],
      );
      linkLines.push(
        [
          runId,
          linkId++,
          a.id,
          a.rowNumber[ia],
          b.id,
          b.rowNumber[ib],
          sep,
          tsvCell(dv),
          radius,
          tsvCell(rel),
          c,
        ].join('\t'),
      );
    }
  }
  await loadTsv(
    'links',
    'run_id, id, catalog_a, row_a, catalog_b, row_b, sep_arcsec, dv_kms, radius_arcsec, reliability, complex_id',
    linkLines,
  );
  await progress(0.9);

  const complexLines: string[] = [];
  const memberLines: string[] = [];
  const kindKeys = ['hi', 'co', 'hii', 'ob', 'other'] as const;
  for (let c = 0; c < nC; c++) {
    const counts: Record<string, number> = { hi: 0, co: 0, hii: 0, ob: 0, other: 0 };
    const ls: number[] = [];
    const bs: number[] = [];
    let vSum = 0;
    let vN = 0;
    let name: string | null = null;
    for (let m = complexes.memberOffset[c]; m < complexes.memberOffset[c + 1]; m++) {
      const cat = cats[complexes.memberCatalog[m]];
      const i = complexes.memberIndex[m];
      counts[cat.kind]++;
      ls.push(cat.src.lDeg[i]);
      bs.push(cat.src.bDeg[i]);
      const v = cat.src.vKms![i];
      if (Number.isFinite(v)) {
        vSum += v;
        vN++;
      }
      name ??= cat.names[i];
      memberLines.push(
        [runId, c, cat.id, cat.rowNumber[i], tsvCell(cat.names[i]?.slice(0, 128) ?? null)].join(
          '\t',
        ),
      );
    }
    const ctr = centroid(ls, bs);
    complexLines.push(
      [
        runId,
        c,
        complexes.size[c],
        complexes.linkCount[c],
        ...kindKeys.map((k) => counts[k]),
        ctr.l,
        ctr.b,
        tsvCell(vN ? vSum / vN : null),
        maxSep[c],
        tsvCell(maxDv[c]),
        tsvCell(minRel[c]),
        complexes.overCap[c],
        tsvCell(name?.slice(0, 128) ?? null),
      ].join('\t'),
    );
  }
  await loadTsv(
    'complexes',
    'run_id, id, size, link_count, n_hi, n_co, n_hii, n_ob, n_other, l, b, v, max_sep_arcsec, max_dv_kms, reliability, over_cap, name',
    complexLines,
  );
  await loadTsv('complex_members', 'run_id, complex_id, catalog_id, `row`, name', memberLines);
  await progress(0.98);

  // Loops, not Math.max(...xs): a spread of a million links overflows the call stack.
  const maxOf = (xs: ArrayLike<number>, floor: number) => {
    let m = floor;
    for (let i = 0; i < xs.length; i++)
      if (Number.isFinite(xs[i]) && Math.abs(xs[i]) > m) m = Math.abs(xs[i]);
    return m;
  };
  const maxRadius = params.radius.mode === 'fixed' ? params.radius.arcsec : maxOf(allSep, 1);
  const dvSpan = params.velocity.mode === 'fixed' ? params.velocity.kms : maxOf(allDv, 1);
  const sizes = complexes.size;
  const summary = {
    links: linkId,
    complexes: nC,
    sources: cats.reduce((s, c) => s + c.src.lDeg.length, 0),
    durationSeconds: +((Date.now() - started) / 1000).toFixed(2),
    complexCap: params.complexCap,
    capped: complexes.capped.map((x) => ({ complexId: String(x.complex), size: x.size })),
    chanceShiftsDeg: shiftsDeg,
    pairs: results.map((r) => ({
      catalogA: cats[r.catA].id,
      catalogB: cats[r.catB].id,
      links: r.links.count,
      expectedChance: r.expected,
      chanceStdErr: r.stdErr,
      reliability: r.overall,
      excludedA: r.links.excludedA,
      excludedB: r.links.excludedB,
      positionOnlyA: r.links.positionOnlyA,
      positionOnlyB: r.links.positionOnlyB,
    })),
    histograms: {
      separationArcsec: histogram(allSep, linspace(0, maxRadius || 1, 20)),
      deltaVKms: histogram(allDv.filter(Number.isFinite), linspace(-dvSpan, dvSpan, 20)),
    },
    complexSizes: histogram(sizes, [1.5, 2.5, 3.5, 4.5, 5.5, 10.5, 20.5, maxOf(sizes, 21.5)]),
  };
  // Marked done last: until this statement the run shows as running, its results unseen.
  await db
    .update(linkRuns)
    .set({ status: 'done', progress: 1, summary, finishedAt: sql`NOW(3)` })
    .where(eq(linkRuns.id, runId));
  await notifyIfLong(runId, started, 'finished', `${linkId} links in ${nC} complexes.`);
}

/** Deletes everything a run wrote (an interrupted or failed attempt). */
export async function clearRunResults(runId: string) {
  await db.execute(sql`DELETE FROM links WHERE run_id = ${runId}`);
  await db.execute(sql`DELETE FROM complexes WHERE run_id = ${runId}`);
  await db.execute(sql`DELETE FROM complex_members WHERE run_id = ${runId}`);
}

export async function failLinkRun(runId: string, reason: string, cancelled: boolean) {
  await clearRunResults(runId);
  const [run] = await db
    .select({ startedAt: linkRuns.startedAt })
    .from(linkRuns)
    .where(eq(linkRuns.id, runId));
  await db
    .update(linkRuns)
    .set({
      status: cancelled ? 'cancelled' : 'failed',
      error: reason.slice(0, 2000),
      finishedAt: sql`NOW(3)`,
    })
    .where(eq(linkRuns.id, runId));
  if (run?.startedAt)
    await notifyIfLong(
      runId,
      run.startedAt.getTime(),
      cancelled ? 'was cancelled' : 'failed',
      reason,
    );
}

/** E-mails whoever started a run that took over a minute (RUN_NOTICE_AFTER_SECONDS), unless they opted out. */
async function notifyIfLong(runId: string, startedMs: number, status: string, summary: string) {
  if (Date.now() - startedMs < env().RUN_NOTICE_AFTER_SECONDS * 1000) return;
  const [x] = await db
    .select({
      email: users.email,
      notify: users.notifyRunEmails,
      projectName: projects.name,
      projectId: projects.id,
    })
    .from(linkRuns)
    .innerJoin(users, eq(users.id, linkRuns.createdBy))
    .innerJoin(projects, eq(projects.id, linkRuns.projectId))
    .where(eq(linkRuns.id, runId));
  if (!x || !x.notify) return;
  const link = `${env().NEXTAUTH_URL}/projects/${x.projectId}/link-runs/${runId}`;
  await sendMail({
    to: x.email,
    ...runFinishedMail({ link, projectName: x.projectName, status, summary }),
  }).catch((e) => console.error('[mail] run notice not sent:', e instanceof Error ? e.message : e));
}
