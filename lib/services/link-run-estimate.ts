import type { RowDataPacket } from 'mysql2';
import { pool } from '@/db/client';
import type { MatchParams, SourceArrays } from '@/lib/match';
import type { LinkRunParams, ScalingWarning } from '@/lib/schemas/link-run-request';
import { rowsTableName } from './catalog-tables';
import { expectedLinksForMode } from './expected-links';
import { runCatalogs, type RunCatalog } from './link-runs';

type Loaded = RunCatalog & { src: SourceArrays; missingLineWidth: number; missingSize: number };

/** The canonical columns the tolerances read, as the run reads them (a missing size or width is 0). */
async function loadForEstimate(c: RunCatalog): Promise<Loaded> {
  const [rows] = await pool().query<RowDataPacket[]>({
    sql: `SELECT l, b, v, radius_arcsec, pos_err_arcsec, line_width_kms FROM \`${rowsTableName(c.id)}\``,
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
  let missingLineWidth = 0;
  let missingSize = 0;
  for (let i = 0; i < n; i++) {
    const r = rows[i] as unknown[];
    src.lDeg[i] = Number(r[0]);
    src.bDeg[i] = Number(r[1]);
    src.vKms[i] = r[2] === null ? NaN : Number(r[2]);
    src.radiusArcsec[i] = r[3] === null ? 0 : Number(r[3]);
    src.posErrArcsec[i] = r[4] === null ? 0 : Number(r[4]);
    src.lineWidthKms[i] = r[5] === null ? 0 : Number(r[5]);
    if (r[3] === null) missingSize++;
    if (r[5] === null) missingLineWidth++;
  }
  return { ...c, src, missingLineWidth, missingSize };
}

function plural(n: number, word: string) {
  return `${n} ${word}${n === 1 ? '' : 's'}`;
}

/** One warning per chosen catalog and scaling quantity that some of its rows lack. */
export function scalingWarnings(
  params: Pick<LinkRunParams, 'radius' | 'velocity'>,
  cats: {
    id: string;
    name: string;
    rowCount: number;
    missingLineWidth: number;
    missingSize: number;
  }[],
): ScalingWarning[] {
  const out: ScalingWarning[] = [];
  for (const c of cats) {
    if (params.velocity.mode === 'scaled' && c.missingLineWidth > 0)
      out.push({
        catalogId: c.id,
        catalogName: c.name,
        quantity: 'lineWidth',
        missingRows: c.missingLineWidth,
        rowCount: c.rowCount,
        message: `The velocity window is scaled by line widths, but ${plural(c.missingLineWidth, 'row')} of ${c.rowCount} in "${c.name}" have none: their window is 0 km/s from their own side.`,
      });
    if (params.radius.mode === 'scaled' && c.missingSize > 0)
      out.push({
        catalogId: c.id,
        catalogName: c.name,
        quantity: 'size',
        missingRows: c.missingSize,
        rowCount: c.rowCount,
        message: `The radius is scaled by source sizes, but ${plural(c.missingSize, 'row')} of ${c.rowCount} in "${c.name}" have none: they count as points (the ${params.radius.minArcsec}″ floor applies).`,
      });
  }
  return out;
}

/**
 * A forecast of a run before it starts: for each catalog pair, the links expected from the
 * catalogs' measured densities (expected-links.ts), the work, and warnings about scaling
 * quantities the catalogs lack.
 */
export async function estimateLinkRun(projectId: string, params: LinkRunParams) {
  const chosen = await runCatalogs(projectId, params.catalogIds);
  const cats: Loaded[] = [];
  for (const c of chosen) cats.push(await loadForEstimate(c));
  const matchParams: MatchParams = {
    radius: params.radius,
    velocity: params.velocity,
    linkMode: params.linkMode,
    missingVelocity: params.missingVelocity,
  };
  const pairs = [];
  let candidates = 0;
  let links = 0;
  for (let i = 0; i < cats.length; i++) {
    for (let j = i + 1; j < cats.length; j++) {
      const e = expectedLinksForMode(cats[i].src, cats[j].src, matchParams);
      candidates += e.candidates;
      links += e.links;
      pairs.push({
        catalogA: cats[i].id,
        catalogB: cats[j].id,
        nA: cats[i].src.lDeg.length,
        nB: cats[j].src.lDeg.length,
        expectedCandidates: e.candidates,
        expectedLinks: e.links,
        sampledA: e.sampledA,
      });
    }
  }
  const sources = cats.reduce((s, c) => s + c.src.lDeg.length, 0);
  const repeats = 1 + params.chanceTrials;
  const workUnits = repeats * (sources + candidates);
  // About two million sources or candidates a second on this class of machine (bench:match).
  return {
    estimate: {
      sources,
      pairs,
      expectedLinks: links,
      chanceRepeats: params.chanceTrials,
      workUnits,
      roughSeconds: Math.max(1, Math.round(workUnits / 2e6 + sources / 2e5)),
      warnings: scalingWarnings(params, cats),
    },
  };
}
