/**
 * The second demo project: an invented nearby spiral seen at a moderate inclination, the
 * "Thistledown Spiral". Its clouds and HII regions come from the external-galaxy generator (orbits
 * crossing a ridge that rotates at a known pattern speed, HII regions a known time after the
 * crossing), are written as CSV files with RA/Dec columns, ingested through the real ingest job,
 * and analysed through the real analysis job with the project's target as the galaxy. Every step
 * is skipped when already done, so seeding twice changes nothing.
 */
import fs from 'node:fs';
import path from 'node:path';
import { and, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { analyses, catalogs, projects } from '@/db/schema';
import { env } from '@/lib/env';
import { runWorker } from '@/lib/jobs/worker';
import {
  externalAnalysisSchema,
  externalGalaxySchema,
  type ProjectTarget,
} from '@/lib/schemas/analyses';
import { createCatalog } from '@/lib/services/catalogs';
import { startExternalAnalysis } from '@/lib/services/external-analyses';
import { updateProject } from '@/lib/services/projects';
import { ensureDemoProject } from '@/lib/services/seed-accounts';
import { getUserByEmail } from '@/lib/services/users';
import { DEMO_ACCOUNTS } from './demo-accounts';
import { drainJobs } from './drain-jobs';
import {
  DEFAULT_EXTERNAL_PARAMS,
  generateExternalGalaxy,
  type ExternalGeneratorParams,
} from './external-generator';

export const EXTERNAL_DEMO_PROJECT_NAME = 'Harbor Ridge Radio Group — the Thistledown Spiral';

const GALAXY_NAME = 'Thistledown Spiral (invented)';

/**
 * The invented galaxy: two arms of pitch 18°, a pattern speed of 21 km/s/kpc and HII regions
 * 8 Myr after their clouds, at 9.5 Mpc and 52° inclination, turning clockwise on the sky.
 */
export const EXTERNAL_DEMO_PARAMS: Partial<ExternalGeneratorParams> = {
  seed: 23,
  gasCount: 8000,
  youngCount: 8000,
  delayMyr: 8,
  pattern: {
    ...DEFAULT_EXTERNAL_PARAMS.pattern,
    pitchDeg: 18,
    phaseDeg: 75,
    patternSpeedKmsKpc: 21,
  },
  sky: {
    centerRaDeg: 152.618,
    centerDecDeg: -18.42,
    distanceMpc: 9.5,
    inclinationDeg: 52,
    positionAngleDeg: 121,
    rotation: 'clockwise',
  },
};

const FILES = [
  { file: 'thistledown-co-clouds.csv', name: 'Thistledown CO clouds', kind: 'co' as const },
  { file: 'thistledown-hii-regions.csv', name: 'Thistledown HII regions', kind: 'hii' as const },
];

const MAPPING = {
  position: {
    system: 'equatorial',
    lon: { column: 'ra_deg', unit: 'deg' },
    lat: { column: 'dec_deg', unit: 'deg' },
  },
  name: { column: 'source_id' },
};

/** Writes one CSV per class (RA/Dec J2000 in degrees to 10⁻⁷°, about 0.02 pc at 9.5 Mpc). */
function writeFiles(dir: string) {
  const g = generateExternalGalaxy(EXTERNAL_DEMO_PARAMS);
  fs.mkdirSync(dir, { recursive: true });
  for (const f of FILES) {
    const prefix = f.kind === 'co' ? 'TC' : 'TH';
    const lines = ['# Invented demo catalog of the Thistledown Spiral', 'source_id,ra_deg,dec_deg'];
    for (let i = 0; i < g.kind.length; i++)
      if (g.kind[i] === f.kind)
        lines.push(
          `${prefix}${String(lines.length - 1).padStart(5, '0')},${g.raDeg[i].toFixed(7)},${g.decDeg[i].toFixed(7)}`,
        );
    fs.writeFileSync(path.join(dir, f.file), lines.join('\n') + '\n');
  }
  return g.galaxy;
}

async function userIds(): Promise<Record<string, string>> {
  const ids: Record<string, string> = {};
  for (const a of DEMO_ACCOUNTS) {
    const u = await getUserByEmail(a.email);
    if (!u) throw new Error(`demo account ${a.email} missing`);
    ids[a.email] = u.id;
  }
  return ids;
}

/** Seeds the external-galaxy demo project; returns its id. */
export async function seedExternalDemo(): Promise<string> {
  const ids = await userIds();
  const projectId = await ensureDemoProject(
    EXTERNAL_DEMO_PROJECT_NAME,
    'Invented demo data: a nearby spiral seen at a moderate inclination, whose pattern speed and cloud-to-HII-region time are known exactly.',
    ids,
  );
  const ownerId = ids['owner@harborridge.example'];
  const editorId = ids['editor@harborridge.example'];
  const dir = path.resolve(env().LANEWISE_DATA_DIR, 'demo-external-source');
  // The galaxy as the generator places it: no file needs to be read to know it.
  const galaxy = fs.existsSync(path.join(dir, FILES[1].file))
    ? generateExternalGalaxy({ ...EXTERNAL_DEMO_PARAMS, gasCount: 1, youngCount: 1 }).galaxy
    : writeFiles(dir);
  const target: ProjectTarget = {
    kind: 'external-galaxy',
    name: GALAXY_NAME,
    galaxy: externalGalaxySchema.parse(galaxy),
  };
  const [current] = await db
    .select({ settings: projects.settings })
    .from(projects)
    .where(eq(projects.id, projectId));
  if (JSON.stringify(current?.settings?.target) !== JSON.stringify(target))
    await updateProject(projectId, ownerId, { settings: { target } }, 'owner');

  const catalogIds: string[] = [];
  for (const f of FILES) {
    const [existing] = await db
      .select({ id: catalogs.id, status: catalogs.status })
      .from(catalogs)
      .where(and(eq(catalogs.projectId, projectId), eq(catalogs.name, f.name)));
    if (existing?.status === 'ready') {
      catalogIds.push(existing.id);
      continue;
    }
    const form = new FormData();
    form.set('file', await fs.openAsBlob(path.join(dir, f.file)), f.file);
    form.set('name', f.name);
    form.set('kind', f.kind);
    form.set('mapping', JSON.stringify(MAPPING));
    const created = await createCatalog(
      new Request('http://seed.local/upload', { method: 'POST', body: form }),
      projectId,
      editorId,
    );
    catalogIds.push(created.id);
  }
  await drainJobs();

  const [done] = await db
    .select({ id: analyses.id })
    .from(analyses)
    .where(and(eq(analyses.projectId, projectId), eq(analyses.status, 'done')));
  if (!done) {
    await startExternalAnalysis(
      projectId,
      editorId,
      externalAnalysisSchema.parse({
        kind: 'external-galaxy',
        catalogIds,
        arms: 2,
        rings: { minKpc: 3, maxKpc: 11, widthKpc: 1 },
        resamples: 2000,
        seed: 1,
      }),
    );
    await runWorker({ once: true });
  }
  return projectId;
}
