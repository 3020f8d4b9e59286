import fs from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { formatSexagesimal } from '@/lib/astro/coordinates';
import { ringEdgesKpc } from '@/lib/external/ring-offsets';
import { generateExternalGalaxy } from '@/seed/external-generator';
import { BASE_URL, PASSWORD, newUser, type Client } from '../helpers/client';
import { launchBrowser } from '../helpers/browser';
import { upload, waitForCatalog } from '../helpers/catalogs';

/** The parts of the API's external-galaxy result (lib/external/analysis.ts) the page is checked against. */
type Result = {
  rings: { dphiDeg: number | null }[];
  fit: {
    patternSpeedKmsKpc: number | null;
    patternSpeedCi95: [number, number] | null;
    timescaleMyr: number | null;
    timescaleCi95: [number, number] | null;
    corotationKpc: number | null;
  } | null;
  fitReason: string | null;
  nullTest: { pValue: number } | null;
  armModel: { m: number } | null;
  sources: { kind: string[] };
};

const RINGS = { minKpc: 3, maxKpc: 11, widthKpc: 1 };
const SEED = 5;

async function waitForAnalysis(client: Client, id: string, timeoutMs = 300_000) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const r = await client.json<{
      analysis: { status: string; error: string | null; result: Result | null };
    }>('GET', `/api/analyses/${id}`);
    expect(r.status).toBe(200);
    if (['done', 'failed', 'cancelled'].includes(r.body.analysis.status)) return r.body.analysis;
    if (Date.now() > deadline) throw new Error(`analysis ${id} still ${r.body.analysis.status}`);
    await new Promise((res) => setTimeout(res, 500));
  }
}

describe('external galaxy in the browser', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it(
    'sets a project’s target to an external galaxy, analyses two RA/Dec catalogs of a synthetic spiral, and shows the deprojected map and Δφ(R) with the fit',
    { timeout: 600_000 },
    async () => {
      // Invented spiral (seed/external-generator): Ω_p = 24 km/s/kpc, t = 6 Myr, m = 2, i = 45°.
      const galaxy = generateExternalGalaxy({ seed: 3, gasCount: 1500, youngCount: 1500 });
      const g = galaxy.galaxy;
      if (g.rotationCurve.kind !== 'table') throw new Error('the generator gives a table curve');
      const curvePoints = g.rotationCurve.points;

      const { client, email } = await newUser('e2e-external', 'Disc Analyst');
      const p = await client.json<{ project: { id: string } }>('POST', '/api/projects', {
        name: 'Lantern Spiral offsets',
      });
      expect(p.status).toBe(201);
      const projectId = p.body.project.id;

      const ctx = await browser.newContext({
        baseURL: BASE_URL,
        viewport: { width: 1600, height: 1100 },
        acceptDownloads: true,
      });
      const page = await ctx.newPage();
      await page.goto('/signin');
      await page.getByLabel('E-mail').fill(email);
      await page.getByLabel('Password').fill(PASSWORD);
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.waitForURL((u) => !u.pathname.startsWith('/signin'));

      // Settings → Target: the Milky Way until an external galaxy is saved.
      await page.goto(`/projects/${projectId}/settings`);
      expect(await page.getByTestId('project-target').textContent()).toContain('Milky Way');
      await page.getByRole('radio', { name: /^An external galaxy/ }).check();
      await page.getByLabel('Galaxy name').fill('Lantern Spiral');
      // The centre as sexagesimal hours and degrees, read by the house's RA/Dec parser.
      await page
        .getByLabel('Centre RA (J2000)')
        .fill(formatSexagesimal(g.centerRaDeg, { hours: true, secondsDecimals: 4 }));
      await page
        .getByLabel('Centre Dec (J2000)')
        .fill(formatSexagesimal(g.centerDecDeg, { secondsDecimals: 3 }));
      await page.getByLabel('Distance (Mpc)').fill(String(g.distanceMpc));
      await page
        .getByLabel('Position angle of the receding major axis')
        .fill(String(g.positionAngleDeg));
      await page.getByLabel('Sense of rotation on the sky').selectOption(g.rotation);
      await page
        .getByRole('combobox', { name: 'Rotation curve', exact: true })
        .selectOption('table');
      await page
        .getByLabel('Rotation curve table')
        .fill(curvePoints.map(([R, V]) => `${R} ${V}`).join('\n'));
      // A bad value is refused in the browser with its field named, and nothing is saved.
      await page.getByLabel('Inclination i (°)').fill('88');
      await page.getByRole('button', { name: 'Save target' }).click();
      await page
        .getByText('Inclination i (°): Inclinations above 85° cannot be deprojected.')
        .waitFor();
      const before = await client.json<{ project: { settings: Record<string, unknown> } }>(
        'GET',
        `/api/projects/${projectId}`,
      );
      expect(before.body.project.settings.target).toBeUndefined();
      await page.getByLabel('Inclination i (°)').fill(String(g.inclinationDeg));
      const patched = page.waitForResponse(
        (r) => r.url().endsWith(`/api/projects/${projectId}`) && r.request().method() === 'PATCH',
      );
      await page.getByRole('button', { name: 'Save target' }).click();
      expect((await patched).status()).toBe(200);
      await page.getByText('Saved.').waitFor();

      const saved = await client.json<{ project: { settings: { target: unknown } } }>(
        'GET',
        `/api/projects/${projectId}`,
      );
      const target = saved.body.project.settings.target as {
        kind: string;
        name: string;
        galaxy: typeof g;
      };
      expect(target.kind).toBe('external-galaxy');
      expect(target.name).toBe('Lantern Spiral');
      // Sexagesimal to 1e-4 s of time and 1e-3″: within 1e-6° of the generator's centre.
      expect(Math.abs(target.galaxy.centerRaDeg - g.centerRaDeg)).toBeLessThan(1e-6);
      expect(Math.abs(target.galaxy.centerDecDeg - g.centerDecDeg)).toBeLessThan(1e-6);
      expect(target.galaxy).toMatchObject({
        distanceMpc: g.distanceMpc,
        inclinationDeg: g.inclinationDeg,
        positionAngleDeg: g.positionAngleDeg,
        rotation: g.rotation,
        rotationCurve: { kind: 'table', points: curvePoints },
      });
      await expect
        .poll(() => page.getByTestId('project-target').textContent())
        .toContain('Lantern Spiral');
      expect(await page.getByTestId('project-target').textContent()).toContain('kpc in the disc');

      // Two catalogs in RA/Dec: clouds in decimal degrees, HII regions in sexagesimal.
      const gasRows = ['cloud,ra_deg,dec_deg'];
      const youngRows = ['REGION,RA_J2000,DEC_J2000'];
      for (let i = 0; i < galaxy.kind.length; i++) {
        const ra = galaxy.raDeg[i];
        const dec = galaxy.decDeg[i];
        if (galaxy.kind[i] === 'co') gasRows.push(`C${i},${ra.toFixed(8)},${dec.toFixed(8)}`);
        else
          youngRows.push(
            `H${i},${formatSexagesimal(ra, { hours: true, secondsDecimals: 4 })},${formatSexagesimal(dec, { secondsDecimals: 3 })}`,
          );
      }
      const catalogIds: string[] = [];
      for (const [rows, kind, name, mapping] of [
        [
          gasRows,
          'co',
          'Lantern CO clouds',
          {
            position: {
              system: 'equatorial',
              lon: { column: 'ra_deg', unit: 'deg' },
              lat: { column: 'dec_deg', unit: 'deg' },
            },
            name: { column: 'cloud' },
          },
        ],
        [
          youngRows,
          'hii',
          'Lantern HII regions',
          {
            position: {
              system: 'equatorial',
              lon: { column: 'RA_J2000', unit: 'sexagesimal' },
              lat: { column: 'DEC_J2000', unit: 'sexagesimal' },
            },
            name: { column: 'REGION' },
          },
        ],
      ] as const) {
        const up = await upload(client, projectId, {
          content: rows.join('\n') + '\n',
          fileName: `${kind}.csv`,
          name,
          kind,
          mapping,
        });
        expect(up.status).toBe(202);
        const ready = await waitForCatalog(client, up.body.catalog.id);
        expect({ status: ready.status, rows: ready.rowCount }).toEqual({
          status: 'ready',
          rows: rows.length - 1,
        });
        catalogIds.push(ready.id);
      }

      // Arms & ordering shows the external view: no kinematic distances, no l–v diagram.
      await page.goto(`/projects/${projectId}/arms`);
      await page.getByText('No external-galaxy analysis yet.', { exact: false }).waitFor();
      expect(await page.getByText('Near/far rule').count()).toBe(0);
      expect(await page.getByText('longitude–velocity', { exact: false }).count()).toBe(0);
      for (const name of ['Lantern CO clouds', 'Lantern HII regions'])
        expect(await page.getByRole('checkbox', { name }).isChecked()).toBe(true);
      await page.getByLabel('Arms m').fill('2');
      await page.getByLabel('Rings from R (kpc)').fill(String(RINGS.minKpc));
      await page.getByLabel('Rings to R (kpc)').fill(String(RINGS.maxKpc));
      await page.getByLabel('Ring width (kpc)').fill(String(RINGS.widthKpc));
      // Too few resamples are refused in the browser with the field named.
      await page.getByLabel('Resamples').fill('500');
      await page.getByText('Resamples: Use at least 2 000 resamples.').waitFor();
      const start = page.getByRole('button', { name: 'Start external-galaxy analysis' });
      expect(await start.isDisabled()).toBe(true);
      await page.getByLabel('Resamples').fill('2000');
      await page.getByLabel('Seed').fill(String(SEED));
      const posted = page.waitForResponse(
        (r) =>
          r.url().endsWith(`/api/projects/${projectId}/analyses`) &&
          r.request().method() === 'POST',
      );
      await start.click();
      const response = await posted;
      expect(response.status()).toBe(202);
      const body = response.request().postDataJSON() as { catalogIds: string[] };
      expect({ ...body, catalogIds: [...body.catalogIds].sort() }).toEqual({
        kind: 'external-galaxy',
        catalogIds: [...catalogIds].sort(),
        arms: 2,
        rings: RINGS,
        resamples: 2000,
        seed: SEED,
      });
      const analysisId = ((await response.json()) as { analysis: { id: string } }).analysis.id;
      await page.waitForURL(new RegExp(`analysis=${analysisId}`));
      const status = page.getByTestId('analysis-status');
      await status.filter({ hasText: /^(done|failed)$/ }).waitFor({ timeout: 300_000 });
      const analysis = await waitForAnalysis(client, analysisId);
      expect(analysis.error).toBeNull();
      expect(await status.textContent()).toBe('done');
      const result = analysis.result!;

      // The fit recovers the generator's pattern speed and timescale within its intervals
      // (seed/external-generator defaults: Ω_p = 24 km/s/kpc, t = 6 Myr), and the page prints
      // the API's numbers.
      const fit = result.fit!;
      expect(fit, result.fitReason ?? '').not.toBeNull();
      expect(fit.patternSpeedCi95![0]).toBeLessThanOrEqual(24);
      expect(fit.patternSpeedCi95![1]).toBeGreaterThanOrEqual(24);
      expect(fit.timescaleCi95![0]).toBeLessThanOrEqual(6);
      expect(fit.timescaleCi95![1]).toBeGreaterThanOrEqual(6);
      const one = (x: number) => x.toFixed(1).replace('-', '−');
      expect(await page.getByTestId('fit-pattern-speed').textContent()).toBe(
        `${one(fit.patternSpeedKmsKpc!)} km/s/kpc [95 %: ${one(fit.patternSpeedCi95![0])} to ${one(fit.patternSpeedCi95![1])}]`,
      );
      expect(await page.getByTestId('fit-timescale').textContent()).toBe(
        `${one(fit.timescaleMyr!)} Myr [95 %: ${one(fit.timescaleCi95![0])} to ${one(fit.timescaleCi95![1])}]`,
      );
      // An offset injected in every ring: the label permutations hardly ever reach it.
      expect(result.nullTest!.pValue).toBeLessThan(0.05);
      expect(await page.getByTestId('null-test-p').textContent()).toMatch(/^p = /);

      // The deprojected map: one marker per HII source plus the legend's (HII orange,
      // lib/tracers.ts), the ring edges and the m arm ridges.
      const map = page.getByTestId('external-disc-map');
      expect(
        await page.getByRole('img', { name: 'Deprojected face-on map of the disc' }).count(),
      ).toBe(1);
      const young = result.sources.kind.filter((k) => k === 'hii').length;
      expect(young).toBe(youngRows.length - 1);
      expect(await map.locator('svg path[fill="#d55e00"]').count()).toBe(young + 1);
      expect(await map.getByTestId('disc-ring').count()).toBe(ringEdgesKpc(RINGS).length);
      expect(await map.getByTestId('disc-arm').count()).toBe(result.armModel!.m);

      // Δφ(R): a point with its interval bar per measured ring, and the fitted curve.
      const dphi = page.getByTestId('external-dphi-r');
      const measured = result.rings.filter((r) => r.dphiDeg !== null).length;
      expect(measured).toBeGreaterThan(2);
      expect(await dphi.getByTestId('dphi-ring').count()).toBe(measured);
      expect(await dphi.getByTestId('dphi-model-line').count()).toBe(1);
      expect(await dphi.getByTestId('dphi-corotation').count()).toBe(
        fit.corotationKpc === null ? 0 : 1,
      );
      expect(
        await page.getByRole('table', { name: 'Offsets ring by ring' }).locator('tbody tr').count(),
      ).toBe(result.rings.length);

      // Both figures download: the map as SVG, Δφ(R) as PNG.
      const svgDownload = page.waitForEvent('download');
      await page
        .getByRole('button', { name: 'Download SVG of Deprojected face-on map of the disc' })
        .click();
      const svgText = fs.readFileSync((await (await svgDownload).path())!, 'utf8');
      expect(svgText).toContain('<title>Deprojected face-on map of the disc</title>');
      expect(svgText).toContain('x along the receding major axis (kpc)');
      const pngDownload = page.waitForEvent('download');
      await page
        .getByRole('button', {
          name: 'Download PNG of Azimuthal offset Δφ of young stars from gas against disc radius',
        })
        .click();
      const png = fs.readFileSync((await (await pngDownload).path())!);
      expect([...png.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]); // PNG signature, ISO/IEC 15948

      // Settings show the saved galaxy again.
      await page.goto(`/projects/${projectId}/settings`);
      expect(await page.getByLabel('Inclination i (°)').inputValue()).toBe(
        String(g.inclinationDeg),
      );
      expect(await page.getByRole('radio', { name: /^An external galaxy/ }).isChecked()).toBe(true);
      await ctx.close();
    },
  );
});
