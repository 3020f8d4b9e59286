import fs from 'node:fs';
import path from 'node:path';
import { and, eq } from 'drizzle-orm';
import { closeDb, db } from '@/db/client';
import { analyses, catalogs, linkRuns } from '@/db/schema';
import { env } from '@/lib/env';
import { analysisSchema, startAnalysis } from '@/lib/services/analyses';
import { createCatalog } from '@/lib/services/catalogs';
import { complexesPage, complexesQuerySchema, reviewComplex } from '@/lib/services/complexes';
import { linkRunSchema, startLinkRun } from '@/lib/services/link-runs';
import { updateProject } from '@/lib/services/projects';
import { getUserByEmail } from '@/lib/services/users';
import { ensureDemoAccounts } from '@/lib/services/seed-accounts';
import { DEMO_CATALOGS } from './demo-catalogs';
import { drainJobs } from './drain-jobs';
import { seedExternalDemo } from './external-demo';
import { DEFAULT_MODEL, generateGalaxy, writeDemoFiles } from './generator';

/**
 * Runs every queued job to its end in this process, through the worker's own code, then waits
 * for any job that a worker of the running app claimed first (as under `npm test`).
 */
async function seedCatalogs(projectId: string, editorId: string) {
  const dir = path.resolve(env().LANEWISE_DATA_DIR, 'demo-source');
  if (!fs.existsSync(path.join(dir, 'truth.json'))) {
    const galaxy = generateGalaxy({ seed: 7, complexes: 800, interlopers: 300 });
    fs.mkdirSync(dir, { recursive: true });
    await writeDemoFiles(galaxy, dir);
  }
  for (const c of DEMO_CATALOGS) {
    const [existing] = await db
      .select({ id: catalogs.id, status: catalogs.status })
      .from(catalogs)
      .where(and(eq(catalogs.projectId, projectId), eq(catalogs.name, c.name)));
    if (existing?.status === 'ready') continue;
    const form = new FormData();
    form.set('file', await fs.openAsBlob(path.join(dir, c.file)), c.file);
    form.set('name', c.name);
    form.set('kind', c.kind);
    form.set('mapping', JSON.stringify(c.mapping));
    await createCatalog(
      new Request('http://seed.local/upload', { method: 'POST', body: form }),
      projectId,
      editorId,
    );
  }
  await drainJobs();
}

async function seedRun(projectId: string, editorId: string) {
  const [done] = await db
    .select({ id: linkRuns.id })
    .from(linkRuns)
    .where(and(eq(linkRuns.projectId, projectId), eq(linkRuns.status, 'done')));
  if (done) return done.id;
  const cats = await db
    .select({ id: catalogs.id, name: catalogs.name })
    .from(catalogs)
    .where(and(eq(catalogs.projectId, projectId), eq(catalogs.status, 'ready')));
  const ordered = DEMO_CATALOGS.map((d) => cats.find((c) => c.name === d.name)!.id);
  const run = await startLinkRun(
    projectId,
    editorId,
    linkRunSchema.parse({
      name: 'Gas and young stars, 4′ and 6 km/s',
      catalogIds: ordered,
      radius: { mode: 'fixed', arcsec: 240 },
      velocity: { mode: 'fixed', kms: 6 },
      linkMode: 'all',
      chanceTrials: 5,
    }),
  );
  await drainJobs();
  // A few reviews, as the team would leave them.
  const page = await complexesPage(
    run.id,
    complexesQuerySchema.parse({ sort: 'size', dir: 'desc', pageSize: '6' }),
  );
  const verdicts = [
    ['accepted', 'CO, HII and OB members agree in velocity; a clear star-forming complex.'],
    ['accepted', 'Compact; the HII region sits on the CO peak.'],
    ['accepted', ''],
    ['doubtful', 'Velocity spread near the window edge; check the HI line profile.'],
    ['rejected', 'Chance alignment along a crowded sight line.'],
  ] as const;
  for (let i = 0; i < Math.min(verdicts.length, page.complexes.length); i++) {
    await reviewComplex(run.id, Number(page.complexes[i].id), editorId, {
      review: verdicts[i][0],
      note: verdicts[i][1],
    });
  }
  return run.id;
}

/**
 * The demo's ordering settings, as the owner would save them: the demo galaxy's arms, but the
 * Reid et al. (2014) curve with its published R0 and Θ0 uncertainties instead of the curve the
 * galaxy was made with (R0 8.2 kpc, Θ0 236 km/s, an arctangent rise), and no pattern speed: the
 * analysis fits it. So the demo shows what is recoverable with a realistic mismatch.
 */
const demoOrdering = () => ({
  curve: { name: 'reid-2014' as const },
  arms: {
    custom: DEFAULT_MODEL.arms.map((a) => ({
      name: a.name,
      Rref: a.RrefKpc,
      betaRefDeg: a.betaRefDeg,
      pitchDeg: a.pitchDeg,
      betaMinDeg: a.betaMinDeg,
      betaMaxDeg: a.betaMaxDeg,
    })),
  },
  nearFar: 'probabilistic' as const,
  armWidthKpc: 1,
  sigmaStreamKms: 7,
  scaleHeightKpc: 0.06,
  velocityFrom: 'gas' as const,
});

async function seedAnalysis(projectId: string, editorId: string, ownerId: string, runId: string) {
  await updateProject(projectId, ownerId, { settings: { ordering: demoOrdering() } }, 'owner');
  const [existing] = await db
    .select({ id: analyses.id })
    .from(analyses)
    .where(and(eq(analyses.projectId, projectId), eq(analyses.status, 'done')));
  if (existing) return;
  await startAnalysis(
    projectId,
    editorId,
    analysisSchema.parse({ runId, ...demoOrdering(), resamples: 2000, seed: 1 }),
  );
  await drainJobs();
}

/**
 * Fills the local database with the demo team and the "Harbor Ridge Radio Group" project:
 * four invented catalogs ingested through the real ingest job, a finished link run with a few
 * reviewed complexes, and an ordering analysis. Each step is skipped when already done.
 */
async function main() {
  const projectId = await ensureDemoAccounts();
  const editor = await getUserByEmail('editor@harborridge.example');
  const owner = await getUserByEmail('owner@harborridge.example');
  if (!editor || !owner) throw new Error('demo accounts missing');
  if (process.env.LANEWISE_SEED_ACCOUNTS_ONLY !== '1') {
    await seedCatalogs(projectId, editor.id);
    const runId = await seedRun(projectId, editor.id);
    await seedAnalysis(projectId, editor.id, owner.id, runId);
    console.log(`[seed] external-galaxy demo project ${await seedExternalDemo()} ready`);
  }
  console.log(`[seed] demo project ${projectId} ready`);
  await closeDb();
  process.exit(0);
}

main().catch(async (e) => {
  console.error('[seed] failed:', e instanceof Error ? e.stack : e);
  await closeDb();
  process.exit(1);
});
