/**
 * Ordering analyses of a galaxy seen from outside (the `external-galaxy` kind): starting one from
 * the API body and the project's target, loading its sources from catalogs or from the members of
 * a link run's complexes, running `runExternalAnalysis` in the worker, and storing the result as
 * JSON with a methods text. The method: docs/methods.md, "External galaxies".
 */
import { eq, inArray } from 'drizzle-orm';
import type { RowDataPacket } from 'mysql2';
import { db, pool } from '@/db/client';
import { analyses, catalogs, jobs, projects } from '@/db/schema';
import { galacticToEquatorialBulk } from '@/lib/astro/coordinates';
import { newId } from '@/lib/auth/secrets';
import { runExternalAnalysis, DEFAULT_PERMUTATIONS } from '@/lib/external/analysis';
import type { ExternalAnalysisResult } from '@/lib/external/analysis';
import { deprojectToDisc } from '@/lib/external/deproject';
import { GAS, YOUNG } from '@/lib/external/ring-offsets';
import {
  DEFAULT_GAS_KINDS,
  DEFAULT_YOUNG_KINDS,
  validateGalaxy,
  validateOptions,
  type ExternalAnalysisOptions,
  type ExternalGalaxy,
} from '@/lib/external/types';
import { HttpError } from '@/lib/http/errors';
import type { TracerKind } from '@/lib/ordering/types';
import {
  externalAnalysisSchema,
  externalGalaxySchema,
  projectTargetSchema,
  type ExternalAnalysisParams,
} from '@/lib/schemas/analyses';
import pkg from '@/package.json';
import { markAnalysisDone } from './analyses';
import { rowsTableName } from './catalog-tables';
import { requireDoneRun, runCatalogs } from './link-runs';

/** The job kind whose handler runs {@link executeExternalAnalysis}. */
export const EXTERNAL_ANALYSIS_JOB = 'external-analysis';

/** Kernel σ (deg) of the azimuthal profiles; the core's default, stated in the methods text. */
const KERNEL_DEG = 5;

/** The galaxy a project's settings hold as its target, or null when it is not an external galaxy. */
export function targetGalaxy(
  settings: Record<string, unknown> | null | undefined,
): { name: string | null; galaxy: ExternalGalaxy } | null {
  const parsed = projectTargetSchema.safeParse(settings?.target);
  if (!parsed.success || parsed.data.kind !== 'external-galaxy') return null;
  return { name: parsed.data.name ?? null, galaxy: parsed.data.galaxy };
}

async function projectTarget(projectId: string) {
  const [p] = await db
    .select({ settings: projects.settings })
    .from(projects)
    .where(eq(projects.id, projectId));
  return targetGalaxy(p?.settings);
}

function analysisOptions(params: ExternalAnalysisParams): ExternalAnalysisOptions {
  return {
    arms: params.arms,
    rings: params.rings,
    resamples: params.resamples,
    seed: params.seed,
    gasKinds: params.gasKinds,
    youngKinds: params.youngKinds,
    permutations: DEFAULT_PERMUTATIONS,
    kernelDeg: KERNEL_DEG,
  };
}

/** A RangeError of the pure core as a 400 that names the field. */
function asBadRequest<T>(check: () => T): T {
  try {
    return check();
  } catch (e) {
    if (e instanceof RangeError) throw new HttpError(400, 'invalid_input', e.message);
    throw e;
  }
}

/**
 * Checks and records an external-galaxy analysis and its job. The galaxy is the body's, else the
 * project's target; it is stored with the parameters, so a later change of the target does not
 * change what this analysis was run with.
 */
export async function startExternalAnalysis(
  projectId: string,
  userId: string,
  params: ExternalAnalysisParams,
) {
  const target = params.galaxy ? null : await projectTarget(projectId);
  const galaxy = params.galaxy ?? target?.galaxy;
  if (!galaxy)
    throw new HttpError(
      400,
      'missing_galaxy',
      "galaxy: this project's target is not an external galaxy; give the galaxy (centre, distance, inclination, position angle, rotation, rotation curve) in the request or set the project's target in Settings.",
    );
  asBadRequest(() => {
    validateGalaxy(galaxy);
    validateOptions(analysisOptions(params));
  });
  const catalogIds = params.runId
    ? await runCatalogIds(projectId, params.runId)
    : (await runCatalogs(projectId, params.catalogIds ?? [])).map((c) => c.id);
  await requireBothClasses(catalogIds, params);
  const id = newId();
  const stored = { ...params, galaxy, galaxyName: target?.name ?? null };
  await db.transaction(async (tx) => {
    const [job] = await tx.insert(jobs).values({
      kind: EXTERNAL_ANALYSIS_JOB,
      projectId,
      payload: { analysisId: id },
      createdBy: userId,
    });
    await tx.insert(analyses).values({
      id,
      projectId,
      kind: 'external-galaxy',
      runId: params.runId ?? null,
      catalogIds: params.runId ? null : catalogIds,
      params: stored,
      jobId: Number(job.insertId),
      createdBy: userId,
    });
  });
  return { id, kind: 'external-galaxy' as const, status: 'queued' as const };
}

async function runCatalogIds(projectId: string, runId: string): Promise<string[]> {
  const run = await requireDoneRun(runId);
  if (run.projectId !== projectId)
    throw new HttpError(400, 'unknown_run', 'runId: no such link run in this project.');
  return run.catalogIds;
}

async function requireBothClasses(catalogIds: string[], params: ExternalAnalysisParams) {
  const rows = await db
    .select({ kind: catalogs.kind })
    .from(catalogs)
    .where(inArray(catalogs.id, catalogIds));
  const kinds = new Set(rows.map((r) => r.kind));
  const need = [
    ['gas', params.gasKinds ?? DEFAULT_GAS_KINDS],
    ['young-star', params.youngKinds ?? DEFAULT_YOUNG_KINDS],
  ] as const;
  for (const [label, wanted] of need)
    if (!wanted.some((k) => kinds.has(k)))
      throw new HttpError(
        400,
        'missing_class',
        `${params.runId ? 'runId' : 'catalogIds'}: no ${label} catalog (kinds ${wanted.join(', ')}) among the chosen catalogs.`,
      );
}

type LoadedSources = {
  raDeg: Float64Array;
  decDeg: Float64Array;
  kind: TracerKind[];
  catalogs: { id: string; name: string; kind: TracerKind; n: number }[];
  complexes: { id: number; size: number; raDeg: number; decDeg: number }[] | null;
};

/** Catalog rows store Galactic l, b; the analysis works in RA/Dec (J2000). */
function toEquatorial(l: number[], b: number[]) {
  return galacticToEquatorialBulk(Float64Array.from(l), Float64Array.from(b));
}

/**
 * Every row of the catalogs, or, for a run, every member of its complexes at its own position
 * (a complex's members keep their own classes; the complexes' mean positions are deprojected
 * apart, for the list of complexes).
 */
async function loadSources(catalogIds: string[], runId: string | null): Promise<LoadedSources> {
  const meta = await db
    .select({ id: catalogs.id, name: catalogs.name, kind: catalogs.kind })
    .from(catalogs)
    .where(inArray(catalogs.id, catalogIds));
  const l: number[] = [];
  const b: number[] = [];
  const kind: TracerKind[] = [];
  const used: LoadedSources['catalogs'] = [];
  for (const catalogId of catalogIds) {
    const c = meta.find((x) => x.id === catalogId);
    if (!c) throw new Error(`catalog ${catalogId} of the analysis no longer exists`);
    const [rows] = await pool().query<RowDataPacket[]>({
      sql: runId
        ? `SELECT s.l, s.b FROM complex_members m JOIN \`${rowsTableName(catalogId)}\` s ON s.\`row\` = m.\`row\`
           WHERE m.run_id = ? AND m.catalog_id = ? ORDER BY s.\`row\``
        : `SELECT l, b FROM \`${rowsTableName(catalogId)}\` ORDER BY \`row\``,
      values: runId ? [runId, catalogId] : [],
      rowsAsArray: true,
    });
    for (const r of rows as unknown as unknown[][]) {
      l.push(Number(r[0]));
      b.push(Number(r[1]));
      kind.push(c.kind);
    }
    used.push({ id: c.id, name: c.name, kind: c.kind, n: rows.length });
  }
  const { raDeg, decDeg } = toEquatorial(l, b);
  let complexes: LoadedSources['complexes'] = null;
  if (runId) {
    const [rows] = await pool().query<RowDataPacket[]>(
      'SELECT id, size, l, b FROM complexes WHERE run_id = ? ORDER BY id',
      [runId],
    );
    const at = toEquatorial(
      rows.map((r) => Number(r.l)),
      rows.map((r) => Number(r.b)),
    );
    complexes = rows.map((r, k) => ({
      id: Number(r.id),
      size: Number(r.size),
      raDeg: at.raDeg[k],
      decDeg: at.decDeg[k],
    }));
  }
  return { raDeg, decDeg, kind, catalogs: used, complexes };
}

const round = (x: number, digits: number) => {
  const f = 10 ** digits;
  return Math.round(x * f) / f;
};

/** What the stored result and the methods text say besides the core's result. */
type ResultContext = {
  params: ExternalAnalysisParams;
  galaxy: ExternalGalaxy;
  galaxyName: string | null;
  analysisId: string;
  sources: LoadedSources;
  runName: string | null;
};

/**
 * The stored result: the core's result with its typed arrays as plain lists (deprojected
 * sources rounded to 0.1 pc and 0.001°), plus the galaxy, the sources' origin, each complex's
 * place in the disc for a run, and the methods text.
 */
export function externalResultJson(result: ExternalAnalysisResult, context: ResultContext) {
  const { sources } = context;
  const complexes =
    sources.complexes &&
    (() => {
      const disc = deprojectToDisc(
        Float64Array.from(sources.complexes, (c) => c.raDeg),
        Float64Array.from(sources.complexes, (c) => c.decDeg),
        { ...context.galaxy, rotation: result.rotation },
      );
      return sources.complexes.map((c, k) => ({
        id: String(c.id),
        size: c.size,
        raDeg: c.raDeg,
        decDeg: c.decDeg,
        RKpc: disc.RKpc[k],
        phiDeg: (disc.phiRad[k] * 180) / Math.PI,
      }));
    })();
  const counts = { gas: 0, young: 0, other: 0 };
  for (const code of result.sources.classCode)
    counts[code === GAS ? 'gas' : code === YOUNG ? 'young' : 'other']++;
  return {
    kind: 'external-galaxy' as const,
    galaxy: { name: context.galaxyName, ...context.galaxy },
    rotation: result.rotation,
    rotationInference: result.rotationInference,
    rings: result.rings,
    fit: result.fit && { ...result.fit, usedBins: Array.from(result.fit.usedBins) },
    fitReason: result.fitReason,
    nullTest: result.nullTest,
    armsFit: result.armsFit,
    armModel: result.armModel,
    input: {
      from: context.params.runId ? ('link-run-members' as const) : ('catalogs' as const),
      runId: context.params.runId ?? null,
      runName: context.runName,
      catalogs: sources.catalogs,
      counts,
      gasKinds: context.params.gasKinds ?? DEFAULT_GAS_KINDS,
      youngKinds: context.params.youngKinds ?? DEFAULT_YOUNG_KINDS,
      permutations: DEFAULT_PERMUTATIONS,
      kernelDeg: KERNEL_DEG,
    },
    sources: {
      RKpc: Array.from(result.sources.RKpc, (x) => round(x, 4)),
      phiDeg: Array.from(result.sources.phiDeg, (x) => round(x, 3)),
      kind: sources.kind,
    },
    complexes,
    methods: externalMethodsText(result, context),
  };
}

export type ExternalAnalysisJson = ReturnType<typeof externalResultJson>;

const fmt = (x: number | null | undefined, digits: number) =>
  x === null || x === undefined || !Number.isFinite(x) ? 'n/a' : x.toFixed(digits);
const range = (c: [number, number] | null | undefined, digits: number) =>
  c ? `${fmt(c[0], digits)} to ${fmt(c[1], digits)}` : 'n/a';

/** A methods paragraph for the paper, with every parameter and reference, then the results. */
export function externalMethodsText(
  result: ExternalAnalysisResult,
  context: ResultContext,
): string {
  const { params, galaxy, sources } = context;
  const { rings } = params;
  const curve =
    galaxy.rotationCurve.kind === 'flat'
      ? `a flat rotation curve V = ${galaxy.rotationCurve.vKms} km/s`
      : `a rotation curve of ${galaxy.rotationCurve.points.length} (R, V) rows, interpolated linearly`;
  const from = params.runId
    ? `the members of the complexes of link run ${context.runName ?? params.runId}, each at its own position`
    : `every row of the catalogs ${sources.catalogs.map((c) => `“${c.name}” (${c.kind.toUpperCase()}, ${c.n})`).join(', ')}`;
  const sense =
    galaxy.rotation === 'trailing-arms'
      ? `${result.rotation} on the sky, inferred from the winding of trailing arms fitted to the gas`
      : `${result.rotation} on the sky`;
  const fit = result.fit;
  const paragraph = [
    `We measured the ordering of gas (${(params.gasKinds ?? DEFAULT_GAS_KINDS).join(', ').toUpperCase()}) and young stars (${(params.youngKinds ?? DEFAULT_YOUNG_KINDS).join(', ').toUpperCase()}) in ${context.galaxyName ?? 'the galaxy'} with Lanewise ${pkg.version} (analysis ${context.analysisId}), from ${from}.`,
    `Sources were placed in the disc from gnomonic (TAN) standard coordinates about the centre RA = ${galaxy.centerRaDeg}°, Dec = ${galaxy.centerDecDeg}° (Calabretta & Greisen 2002), for a distance of ${galaxy.distanceMpc} Mpc, an inclination of ${galaxy.inclinationDeg}° and a receding major axis at position angle ${galaxy.positionAngleDeg}° east of north, the disc rotating ${sense}.`,
    `In rings ${rings.widthKpc} kpc wide from ${rings.minKpc} to ${rings.maxKpc} kpc, the azimuthal profiles of the two classes, smoothed by a wrapped Gaussian of σ = ${KERNEL_DEG}°, were cross-correlated and the lag of the peak within ±${fmt(180 / params.arms, 1)}° (m = ${params.arms} arms) taken as the offset Δφ, young stars minus gas, positive ahead in the sense of rotation (Egusa et al. 2004; Tamburro et al. 2008); 95 % percentile intervals come from ${params.resamples} bootstrap resamples of each ring's sources (seed ${params.seed}; Efron & Tibshirani 1993).`,
    `Δφ(R) = 1.0227·10⁻³ (Ω(R) − Ω_p) t was fitted for the pattern speed Ω_p and the timescale t, with Ω(R) from ${curve} (Egusa et al. 2004, 2009), and a permutation test exchanging class labels within rings (${DEFAULT_PERMUTATIONS} permutations) asked whether any offset exists, which many galaxies lack (Foyle et al. 2011).`,
    'As a cross-check, each class’s m-fold mean offset from log-spiral arms fitted by the 2-D Fourier method (Kalnajs 1975; Puerari & Dottori 1992) is reported per ring.',
  ].join(' ');
  const measured = result.rings.filter((r) => r.dphiDeg !== null);
  const lines = [
    paragraph,
    '',
    'Results',
    `- Rings measured: ${measured.length} of ${result.rings.length}.`,
    ...result.rings.map((r) =>
      r.dphiDeg === null
        ? `- R = ${fmt(r.RKpc, 2)} kpc: not measured (${r.reason ?? 'too few sources'}).`
        : `- R = ${fmt(r.RKpc, 2)} kpc: Δφ = ${fmt(r.dphiDeg, 2)}° (95 % interval ${range(r.ci95, 2)}), ${r.nGas} gas and ${r.nYoung} young sources.`,
    ),
    fit
      ? `- Fit (${fit.binsUsed} rings): Ω_p = ${fmt(fit.patternSpeedKmsKpc, 1)} km/s/kpc (${range(fit.patternSpeedCi95, 1)}), t = ${fmt(fit.timescaleMyr, 1)} Myr (${range(fit.timescaleCi95, 1)}), corotation ${fmt(fit.corotationKpc, 2)} kpc.${fit.reason ? ` ${fit.reason}.` : ''}`
      : `- Fit: not constrained (${result.fitReason ?? 'too few rings'}).`,
    result.nullTest
      ? `- Null test: p = ${fmt(result.nullTest.pValue, 3)} (${result.nullTest.permutations} permutations over ${result.nullTest.rings} rings).`
      : '- Null test: not run (too few measured rings).',
    result.armsFit
      ? `- Arms fitted: pitch ${fmt(result.armsFit.pitchDeg, 1)}° (${range(result.armsFit.pitchCi95, 1)}).`
      : '- Arms: entered by hand or too few sources to fit.',
    '',
    'References',
    '- Calabretta, M. R. & Greisen, E. W. 2002, A&A 395, 1077',
    '- Egusa, F., Sofue, Y. & Nakanishi, H. 2004, PASJ 56, L45; Egusa, F. et al. 2009, ApJ 697, 1870',
    '- Tamburro, D. et al. 2008, AJ 136, 2872',
    '- Foyle, K. et al. 2011, ApJ 735, 101',
    '- Kalnajs, A. J. 1975, in La Dynamique des Galaxies Spirales, 103; Puerari, I. & Dottori, H. A. 1992, A&AS 93, 469',
    '- Efron, B. & Tibshirani, R. J. 1993, An Introduction to the Bootstrap',
    '',
  ];
  return lines.join('\n');
}

/** Runs an external-galaxy analysis job; the analysis turns `done` last, in one write. */
export async function executeExternalAnalysis(
  analysisId: string,
  progress: (f: number) => Promise<void>,
) {
  const [a] = await db.select().from(analyses).where(eq(analyses.id, analysisId));
  if (!a) throw new Error(`analysis ${analysisId} no longer exists`);
  await db
    .update(analyses)
    .set({ status: 'running', error: null })
    .where(eq(analyses.id, analysisId));
  const stored = a.params as Record<string, unknown>;
  const params = externalAnalysisSchema.parse(stored);
  const galaxy = externalGalaxySchema.parse(stored.galaxy);
  const galaxyName = typeof stored.galaxyName === 'string' ? stored.galaxyName : null;
  let runName: string | null = null;
  let catalogIds = a.catalogIds ?? [];
  if (a.runId) {
    const run = await requireDoneRun(a.runId);
    runName = run.name;
    catalogIds = run.catalogIds;
  }
  const sources = await loadSources(catalogIds, a.runId);
  await progress(0.1);
  const result = runExternalAnalysis(
    { raDeg: sources.raDeg, decDeg: sources.decDeg, kind: sources.kind },
    galaxy,
    analysisOptions(params),
  );
  await progress(0.95);
  const json = externalResultJson(result, {
    params,
    galaxy,
    galaxyName,
    analysisId,
    sources,
    runName,
  });
  await markAnalysisDone(db, analysisId, json);
}
