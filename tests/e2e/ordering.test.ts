import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { DEFAULT_ARMS, DEFAULT_MODEL, generateGalaxy, writeDemoFiles } from '@/seed/generator';
import { BASE_URL, PASSWORD, newUser, type Client } from '../helpers/client';
import { launchBrowser } from '../helpers/browser';
import { upload, waitForCatalog } from '../helpers/catalogs';

/** The parts of the API's `OrderingResult` (lib/ordering/types.ts) the page is checked against. */
type Result = {
  headline: string[];
  youngMinusGas: { medianOffsetKpc: number | null; ci95: [number, number] | null };
  classes: { kind: string }[];
  complexes: { id: string; used: boolean; distCi95: [number, number] | null }[];
  sources: { kind: string }[];
  tangents: { offsets: unknown[] }[];
  radialBins: { dphiDeg: number | null }[];
  patternFit: { line: unknown } | null;
  interpretation: { source: 'fitted' | 'assumed' | null; corotationKpc: number | null };
  intraComplex: { linkRadiusPc: [number, number] | null };
  distances: { draws: number };
};

/** Radians per arcsecond: π / (180 · 3600) (exact). */
const RAD_PER_ARCSEC = Math.PI / 648_000;
/** The link run's radius (arcsec), fixed for the whole run. */
const LINK_RADIUS_ARCSEC = 300;

/** The CO file of the demo layout: semicolon-separated, Galactic, LSR radio velocities. */
const CO_MAPPING = {
  position: {
    system: 'galactic',
    lon: { column: 'l_deg', unit: 'deg' },
    lat: { column: 'b_deg', unit: 'deg' },
  },
  velocity: { column: 'v_lsr_kms', unit: 'km/s', frame: 'lsr', convention: 'radio' },
  lineWidth: { column: 'sigma_v', unit: 'km/s', kind: 'sigma' },
  size: { column: 'radius_arcsec', unit: 'arcsec', kind: 'radius' },
  name: { column: 'cloud_id' },
};

/** The HII file: sexagesimal J2000 and heliocentric optical-convention velocities. */
const HII_MAPPING = {
  position: {
    system: 'equatorial',
    lon: { column: 'RA_J2000', unit: 'sexagesimal' },
    lat: { column: 'DEC_J2000', unit: 'sexagesimal' },
  },
  velocity: { column: 'V_HEL_OPT', unit: 'km/s', frame: 'heliocentric', convention: 'optical' },
  velocityError: { column: 'E_V_HEL', unit: 'km/s' },
  lineWidth: { column: 'RRL_FWHM', unit: 'km/s', kind: 'fwhm' },
  size: { column: 'DIAM_ARCMIN', unit: 'arcmin', kind: 'diameter' },
  name: { column: 'REGION' },
};

/** The OB VOTable: decimal J2000, LSR velocities and independent distances for some rows. */
const OB_MAPPING = {
  position: {
    system: 'equatorial',
    lon: { column: 'ra', unit: 'deg' },
    lat: { column: 'dec', unit: 'deg' },
  },
  velocity: { column: 'vlsr', unit: 'km/s', frame: 'lsr', convention: 'radio' },
  velocityError: { column: 'vlsr_err', unit: 'km/s' },
  distance: { column: 'dist', unit: 'kpc' },
  distanceError: { column: 'dist_err', unit: 'kpc' },
  size: { column: 'diam', unit: 'arcmin', kind: 'diameter' },
  name: { column: 'assoc' },
};

async function waitForRun(client: Client, runId: string, timeoutMs = 120_000) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const r = await client.json<{
      run: { status: string; summary: { complexes: number } | null; error: string | null };
    }>('GET', `/api/link-runs/${runId}`);
    expect(r.status).toBe(200);
    if (['done', 'failed', 'cancelled'].includes(r.body.run.status)) return r.body.run;
    if (Date.now() > deadline) throw new Error(`link run ${runId} still ${r.body.run.status}`);
    await new Promise((res) => setTimeout(res, 250));
  }
}

describe('ordering analysis in the browser', () => {
  let browser: Browser;
  let dir: string;
  beforeAll(async () => {
    browser = await launchBrowser();
    dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lanewise-ordering-'));
  });
  afterAll(async () => {
    await browser?.close();
    if (dir) fs.rmSync(dir, { recursive: true, force: true });
  });

  it(
    'runs an analysis of a synthetic galaxy with its own arms, an assumed pattern speed, and shows the measured ordering, tangents, Δφ(R) and the intra-complex offsets apart',
    { timeout: 600_000 },
    async () => {
      const galaxy = generateGalaxy({ seed: 7, complexes: 600, interlopers: 0 });
      const written = await writeDemoFiles(galaxy, dir);

      const { client, email } = await newUser('e2e-ordering', 'Ordering Analyst');
      const p = await client.json<{ project: { id: string } }>('POST', '/api/projects', {
        name: 'Harbor Ridge density wave',
      });
      expect(p.status).toBe(201);
      const projectId = p.body.project.id;
      const catalogIds: string[] = [];
      for (const [tracer, kind, mapping] of [
        ['CO', 'co', CO_MAPPING],
        ['HII', 'hii', HII_MAPPING],
        ['OB', 'ob', OB_MAPPING],
      ] as const) {
        const file = written.catalogs[tracer];
        const up = await upload(client, projectId, {
          content: fs.readFileSync(path.join(dir, file.file)),
          fileName: file.file,
          name: `Harbor Ridge ${tracer}`,
          kind,
          mapping,
        });
        expect(up.status).toBe(202);
        const ready = await waitForCatalog(client, up.body.catalog.id);
        expect({ status: ready.status, rows: ready.rowCount }).toEqual({
          status: 'ready',
          rows: file.rows,
        });
        catalogIds.push(ready.id);
      }
      const started = await client.json<{ run: { id: string } }>(
        'POST',
        `/api/projects/${projectId}/link-runs`,
        {
          catalogIds,
          radius: { mode: 'fixed', arcsec: LINK_RADIUS_ARCSEC },
          velocity: { mode: 'fixed', kms: 5 },
          linkMode: 'all',
          chanceTrials: 0,
          name: 'CO, HII and OB, 300″ and 5 km/s',
        },
      );
      expect(started.status).toBe(202);
      const runId = started.body.run.id;
      const run = await waitForRun(client, runId);
      expect(run.status).toBe('done');
      expect(run.summary!.complexes).toBeGreaterThan(0);

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

      await page.goto(`/projects/${projectId}/arms`);
      await page.getByText('No ordering analysis yet', { exact: false }).waitFor();
      // The generator rotates on a curve of its own (seed/generator/curve.ts); the analysis uses
      // the page's default, Reid et al. (2014), whose published 1σ of R0 and Θ0 prefill the form.
      expect(await page.getByLabel('Rotation curve').inputValue()).toBe('reid-2014');
      expect(await page.getByLabel('R0 uncertainty, 1σ (kpc)').inputValue()).toBe('0.16'); // Reid et al. (2014): R0 = 8.34 ± 0.16 kpc
      expect(await page.getByLabel('Θ0 uncertainty, 1σ (km/s)').inputValue()).toBe('8'); // Reid et al. (2014): Θ0 = 240 ± 8 km/s
      expect(await page.getByLabel('Near/far rule').inputValue()).toBe('probabilistic');
      // No pattern speed is assumed until one is typed; then it is an assumption.
      const assumedField = page.getByLabel('Assumed pattern speed (optional)');
      expect(await assumedField.inputValue()).toBe('');
      await assumedField.fill(String(DEFAULT_MODEL.patternSpeedKmsKpc));

      // The generator's two arms as custom arms, typed into the table; the preview follows.
      await page.getByRole('radio', { name: 'Custom arms' }).check();
      const preview = page.getByTestId('arm-preview').locator('svg');
      await page.getByText('No arms yet', { exact: false }).waitFor();
      expect(await preview.locator('polyline').count()).toBe(0);
      for (const [i, arm] of DEFAULT_ARMS.entries()) {
        await page.getByRole('button', { name: 'Add arm' }).click();
        const n = i + 1;
        await page.getByLabel(`Arm ${n} Name`).fill(arm.name);
        await page.getByLabel(`Arm ${n} R_ref (kpc)`).fill(String(arm.RrefKpc));
        await page.getByLabel(`Arm ${n} β_ref (°)`).fill(String(arm.betaRefDeg));
        await page.getByLabel(`Arm ${n} Pitch ψ (°)`).fill(String(arm.pitchDeg));
        await page.getByLabel(`Arm ${n} β from (°)`).fill(String(arm.betaMinDeg));
        await page.getByLabel(`Arm ${n} β to (°)`).fill(String(arm.betaMaxDeg));
        await expect.poll(() => preview.locator('polyline').count()).toBe(n);
      }
      // A bad cell is named in the message and keeps the run button disabled until fixed.
      await page.getByLabel('Arm 2 Pitch ψ (°)').fill('abc');
      await page.getByText('Arm 2 (“Tidelace Arm”), pitch (°): “abc” is not a number.').waitFor();
      expect(await preview.locator('polyline').count()).toBe(1);
      const startButton = page.getByRole('button', { name: 'Start ordering analysis' });
      expect(await startButton.isDisabled()).toBe(true);
      await page.getByLabel('Arm 2 Pitch ψ (°)').fill(String(DEFAULT_ARMS[1].pitchDeg));
      await expect.poll(() => preview.locator('polyline').count()).toBe(2);

      expect(await page.getByLabel('Link run').inputValue()).toBe(runId);
      expect(await page.getByLabel('Resamples').inputValue()).toBe('2000');
      await page.getByLabel('Seed').fill('7');
      const posted = page.waitForResponse(
        (r) =>
          r.url().endsWith(`/api/projects/${projectId}/analyses`) &&
          r.request().method() === 'POST',
      );
      await startButton.click();
      const response = await posted;
      expect(response.status()).toBe(202);
      expect(response.request().postDataJSON()).toMatchObject({
        runId,
        curve: { name: 'reid-2014', R0Err: 0.16, theta0Err: 8 },
        patternSpeed: DEFAULT_MODEL.patternSpeedKmsKpc,
        nearFar: 'probabilistic',
        resamples: 2000,
        seed: 7,
        arms: {
          custom: DEFAULT_ARMS.map((a) => ({
            name: a.name,
            Rref: a.RrefKpc,
            betaRefDeg: a.betaRefDeg,
            pitchDeg: a.pitchDeg,
            betaMinDeg: a.betaMinDeg,
            betaMaxDeg: a.betaMaxDeg,
          })),
        },
      });
      const analysisId = ((await response.json()) as { analysis: { id: string } }).analysis.id;
      await page.waitForURL(new RegExp(`analysis=${analysisId}`));

      const status = page.getByTestId('analysis-status');
      await status.filter({ hasText: /^(done|failed)$/ }).waitFor({ timeout: 420_000 });
      expect(await status.textContent()).toBe('done');
      // The list of analyses polls on its own and follows within a second.
      await expect.poll(() => page.getByRole('progressbar').count()).toBe(0);

      const got = await client.json<{ analysis: { result: Result } }>(
        'GET',
        `/api/analyses/${analysisId}`,
      );
      expect(got.status).toBe(200);
      const result = got.body.analysis.result;
      const y = result.youngMinusGas;
      expect(y.medianOffsetKpc).not.toBeNull();
      expect(y.ci95).not.toBeNull();

      // The headline: the result's own sentences, the first the young-minus-gas offset with its
      // interval, each number as the API has it (headline.ts rounds to whole pc).
      const headline = page.getByTestId('ordering-headline');
      const sentences = await headline.locator('p').allTextContents();
      expect(sentences).toEqual(result.headline);
      const said = sentences[0].match(
        /^Young stars \(HII, OB\) (?:lie (\d+) pc (ahead of|behind) the gas \(HI, CO\) across the arms, in the sense of rotation|and gas \(HI, CO\) are not separated across the arms beyond the errors: young minus gas (-?\d+) pc,) ?:? ?95 % interval (-?\d+) to (-?\d+) pc \((\d+) complexes, each distance drawn (\d+) times\)\.$/,
      );
      expect(said, sentences[0]).not.toBeNull();
      const [, aheadPc, sense, zeroPc, loPc, hiPc, , draws] = said!;
      const medianPc =
        aheadPc !== undefined ? Number(aheadPc) * (sense === 'behind' ? -1 : 1) : Number(zeroPc);
      // `+ 0` turns a rounded −0 into the 0 the sentence prints.
      const wholePc = (kpc: number) => Math.round(kpc * 1000) + 0;
      expect(medianPc).toBe(wholePc(y.medianOffsetKpc!));
      expect(Number(loPc)).toBe(wholePc(y.ci95![0]));
      expect(Number(hiPc)).toBe(wholePc(y.ci95![1]));
      expect(Number(draws)).toBe(result.distances.draws);

      // The assumed pattern speed is labelled as an assumption; the interpretation says which
      // pattern speed (fitted takes precedence over assumed) it used.
      expect(await page.getByTestId('assumed-pattern-speed').textContent()).toBe(
        `assumed: ${DEFAULT_MODEL.patternSpeedKmsKpc.toFixed(1)} km/s/kpc`,
      );
      expect(await page.getByTestId('interpretation-source').textContent()).toBe(
        `pattern speed: ${result.interpretation.source ?? 'none'}`,
      );
      expect(result.interpretation.source).not.toBeNull();

      // The tables of the result: classes plus the young-minus-gas row, and the tangent offsets.
      expect(
        await page.getByRole('table', { name: 'Offsets by class' }).locator('tbody tr').count(),
      ).toBe(result.classes.length + 1);
      const tangentTable = page.getByRole('table', { name: 'Tangent-point offsets' });
      expect(await tangentTable.isVisible()).toBe(true);
      const offsets = result.tangents.reduce((n, t) => n + t.offsets.length, 0);
      expect(await tangentTable.locator('tbody tr').count()).toBe(Math.max(1, offsets));
      expect(offsets).toBeGreaterThan(0);

      // Δφ(R): one point per ring with a value, and the fitted line when the fit gave one.
      const dphi = page.getByRole('img', {
        name: 'Azimuthal offset of young stars from gas against radius',
      });
      expect(await dphi.isVisible()).toBe(true);
      const rings = result.radialBins.filter((b) => b.dphiDeg !== null).length;
      expect(rings).toBeGreaterThan(0);
      expect(await dphi.getByTestId('dphi-ring').count()).toBe(rings);
      expect(await dphi.getByTestId('dphi-model-line').count()).toBe(
        result.patternFit?.line ? 1 : 0,
      );

      // The intra-complex section stands apart and prints the link radius in pc, which must lie
      // within 300″ at the nearest and farthest distance intervals of the complexes (small-angle
      // geometry, exact to far below a printed digit).
      const intra = page.getByTestId('intra-complex');
      expect(await intra.isVisible()).toBe(true);
      const radius = (await intra.getByTestId('intra-link-radius').textContent())!;
      const r = radius.match(/^([\d.]+) to ([\d.]+) pc$/);
      expect(r, radius).not.toBeNull();
      const lr = result.intraComplex.linkRadiusPc!;
      // Printed with one decimal: within half of its last digit.
      expect(Math.abs(Number(r![1]) - lr[0])).toBeLessThanOrEqual(0.05 + 1e-9);
      expect(Math.abs(Number(r![2]) - lr[1])).toBeLessThanOrEqual(0.05 + 1e-9);
      const ci95s = result.complexes.flatMap((c) => (c.distCi95 ? [c.distCi95] : []));
      const nearestKpc = Math.min(...ci95s.map((c) => c[0]));
      const farthestKpc = Math.max(...ci95s.map((c) => c[1]));
      expect(lr[0]).toBeGreaterThanOrEqual(LINK_RADIUS_ARCSEC * RAD_PER_ARCSEC * nearestKpc * 1000);
      expect(lr[1]).toBeLessThanOrEqual(LINK_RADIUS_ARCSEC * RAD_PER_ARCSEC * farthestKpc * 1000);
      expect(lr[0]).toBeLessThanOrEqual(lr[1]);

      const map = page.getByTestId('ordering-face-on');
      expect(await page.getByRole('img', { name: 'Face-on map of the complexes' }).count()).toBe(1);
      expect(await map.locator('svg polyline').count()).toBe(DEFAULT_ARMS.length);
      expect(await map.getByTestId('corotation-circle').count()).toBe(
        result.interpretation.corotationKpc === null ? 0 : 1,
      );
      // One marker per HII source, plus the legend's (HII orange, lib/tracers.ts).
      const hiiSources = result.sources.filter((s) => s.kind === 'hii').length;
      expect(hiiSources).toBeGreaterThan(0);
      expect(await map.locator('svg path[fill="#d55e00"]').count()).toBe(hiiSources + 1);
      expect(
        await page.getByRole('img', { name: 'Longitude–velocity diagram with arm loci' }).count(),
      ).toBe(1);
      expect(
        await page.getByRole('img', { name: 'Offsets from the arm ridge by class' }).count(),
      ).toBe(1);

      // Hovering the middle of the map's plot area reads out the Galactic centre.
      await map.locator('svg').scrollIntoViewIfNeeded();
      const box = (await map.locator('svg').boundingBox())!;
      await page.mouse.move(
        box.x + (box.width * (58 + 548 / 2)) / 620,
        box.y + (box.height * (14 + 562 / 2)) / 620,
      );
      await expect
        .poll(() => page.getByTestId('ordering-face-on-readout').textContent())
        .toBe('Galactic centre');
      const reset = page.getByRole('button', {
        name: 'Reset the view of Face-on map of the complexes',
      });
      expect(await reset.isDisabled()).toBe(true);
      await page.getByRole('button', { name: 'Zoom in on Face-on map of the complexes' }).click();
      expect(await reset.isDisabled()).toBe(false);
      await reset.click();

      const pngDownload = page.waitForEvent('download');
      await page
        .getByRole('button', { name: 'Download PNG of Face-on map of the complexes' })
        .click();
      const png = fs.readFileSync((await (await pngDownload).path())!);
      expect([...png.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]); // PNG signature, ISO/IEC 15948
      const svgDownload = page.waitForEvent('download');
      await page
        .getByRole('button', { name: 'Download SVG of Face-on map of the complexes' })
        .click();
      const svgText = fs.readFileSync((await (await svgDownload).path())!, 'utf8');
      expect(svgText).toContain('<title>Face-on map of the complexes</title>');
      expect(svgText).toContain('x (kpc)');

      const csvDownload = page.waitForEvent('download');
      await page.getByRole('link', { name: 'Complexes table as CSV' }).click();
      const csv = fs
        .readFileSync((await (await csvDownload).path())!, 'utf8')
        .trim()
        .split(/\r?\n/);
      expect(csv[0].startsWith('complex_id,')).toBe(true);
      expect(csv).toHaveLength(1 + result.complexes.length);

      // The analysis is kept: reopen it from the list.
      await page.goto(`/projects/${projectId}/arms`);
      const list = page.getByRole('table', { name: 'Ordering analyses' });
      await list.locator('tbody tr').first().waitFor();
      expect(await list.locator('tbody tr').count()).toBe(1);
      await list.getByRole('link', { name: /^Open the analysis of CO, HII and OB/ }).click();
      await page.waitForURL(new RegExp(`analysis=${analysisId}`));
      await page.getByTestId('ordering-headline').waitFor();
      expect(await page.getByTestId('ordering-headline').locator('p').allTextContents()).toEqual(
        sentences,
      );
      await ctx.close();
    },
  );
});
