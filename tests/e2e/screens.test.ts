import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { generateGalaxy, writeDemoFiles } from '@/seed/generator';
import { BASE_URL, PASSWORD, newUser } from '../helpers/client';
import { launchBrowser } from '../helpers/browser';
import { upload, waitForCatalog } from '../helpers/catalogs';

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

/** Page backgrounds of the two themes (app/globals.css, --color-paper). */
const PAPER = { light: 'rgb(247, 244, 236)', dark: 'rgb(20, 25, 27)' };

const VIEWPORTS = [
  { width: 390, height: 844 },
  { width: 1440, height: 900 },
] as const;

/** Width and height of a PNG from its IHDR chunk (ISO/IEC 15948 §11.2.2). */
function pngSize(png: Buffer) {
  expect([...png.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]); // PNG signature, ISO/IEC 15948
  return { width: png.readUInt32BE(16), height: png.readUInt32BE(20) };
}

/** Texts of every inline figure that reach outside its viewBox (0.5 user units of slack). */
function clippedTexts(page: Page) {
  return page.evaluate(() => {
    const out: string[] = [];
    for (const svg of Array.from(document.querySelectorAll<SVGSVGElement>('svg[data-figure]'))) {
      const vb = svg.viewBox.baseVal;
      const box = svg.getBoundingClientRect();
      const k = vb.width / box.width;
      for (const t of Array.from(svg.querySelectorAll('text'))) {
        if (!t.textContent?.trim()) continue;
        const r = t.getBoundingClientRect();
        const x0 = (r.left - box.left) * k;
        const x1 = (r.right - box.left) * k;
        const y0 = (r.top - box.top) * k;
        const y1 = (r.bottom - box.top) * k;
        if (x0 < -0.5 || y0 < -0.5 || x1 > vb.width + 0.5 || y1 > vb.height + 0.5)
          out.push(`${svg.getAttribute('aria-label')}: “${t.textContent}”`);
      }
    }
    return out;
  });
}

const horizontalOverflow = (page: Page) =>
  page.evaluate(() => document.scrollingElement!.scrollWidth - window.innerWidth);

/** The innermost elements that reach past the window's right edge: where to look on a failure. */
const widestElements = (page: Page) =>
  page.evaluate(() => {
    const out: string[] = [];
    const inScroller = (el: Element) => {
      for (let p = el.parentElement; p && p !== document.body; p = p.parentElement)
        if (['auto', 'scroll', 'hidden'].includes(getComputedStyle(p).overflowX)) return true;
      return false;
    };
    for (const el of Array.from(document.body.querySelectorAll<HTMLElement>('*'))) {
      if (el.getBoundingClientRect().right <= window.innerWidth + 0.5 || inScroller(el)) continue;
      const inner = Array.from(el.children).some(
        (c) => c.getBoundingClientRect().right > window.innerWidth + 0.5,
      );
      if (!inner) out.push(`${el.tagName.toLowerCase()}.${el.className}`.slice(0, 120));
    }
    return out.slice(0, 5).join(' | ');
  });

describe('screens at phone and desktop widths, light and dark', () => {
  let browser: Browser;
  let dir: string;
  beforeAll(async () => {
    browser = await launchBrowser();
    dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lanewise-screens-'));
  });
  afterAll(async () => {
    await browser?.close();
    if (dir) fs.rmSync(dir, { recursive: true, force: true });
  });

  it(
    'has no sideways page scroll, a working menu, the theme, and every figure saved as SVG and 4× PNG with no text cut off',
    { timeout: 600_000 },
    async () => {
      const galaxy = generateGalaxy({ seed: 11, complexes: 150, interlopers: 0 });
      const written = await writeDemoFiles(galaxy, dir);
      const { client, email } = await newUser('e2e-screens', 'Screen Checker');
      const p = await client.json<{ project: { id: string } }>('POST', '/api/projects', {
        name: 'Saltmarsh Reach survey',
      });
      expect(p.status).toBe(201);
      const projectId = p.body.project.id;
      const catalogIds: string[] = [];
      for (const [tracer, kind, mapping] of [
        ['CO', 'co', CO_MAPPING],
        ['HII', 'hii', HII_MAPPING],
      ] as const) {
        const file = written.catalogs[tracer];
        const up = await upload(client, projectId, {
          content: fs.readFileSync(path.join(dir, file.file)),
          fileName: file.file,
          name: `Saltmarsh ${tracer}`,
          kind,
          mapping,
        });
        expect(up.status).toBe(202);
        expect((await waitForCatalog(client, up.body.catalog.id)).status).toBe('ready');
        catalogIds.push(up.body.catalog.id);
      }
      const started = await client.json<{ run: { id: string } }>(
        'POST',
        `/api/projects/${projectId}/link-runs`,
        {
          catalogIds,
          radius: { mode: 'fixed', arcsec: 300 },
          velocity: { mode: 'fixed', kms: 5 },
          linkMode: 'all',
          chanceTrials: 0,
          name: 'CO and HII, 300″',
        },
      );
      expect(started.status).toBe(202);
      const runId = started.body.run.id;
      await expect
        .poll(
          async () =>
            (await client.json<{ run: { status: string } }>('GET', `/api/link-runs/${runId}`)).body
              .run.status,
          { timeout: 120_000, interval: 300 },
        )
        .toBe('done');
      const complexes = await client.json<{ complexes: { id: number }[] }>(
        'GET',
        `/api/link-runs/${runId}/complexes?sort=id&dir=asc&pageSize=1`,
      );
      const complexId = complexes.body.complexes[0].id;
      const analysis = await client.json<{ analysis: { id: string } }>(
        'POST',
        `/api/projects/${projectId}/analyses`,
        {
          runId,
          curve: { name: 'reid-2014' },
          arms: { preset: 'reid-2014' },
          resamples: 2000,
          mcDraws: 50,
        },
      );
      expect(analysis.status).toBe(202);
      const analysisId = analysis.body.analysis.id;
      await expect
        .poll(
          async () =>
            (
              await client.json<{ analysis: { status: string } }>(
                'GET',
                `/api/analyses/${analysisId}`,
              )
            ).body.analysis.status,
          { timeout: 300_000, interval: 1000 },
        )
        .toBe('done');

      const base = `/projects/${projectId}`;
      const pages = [
        { url: '/projects', title: 'Projects · Lanewise' },
        {
          url: `${base}/catalogs/${catalogIds[0]}`,
          title: 'Catalog · Saltmarsh CO · Saltmarsh Reach survey · Lanewise',
        },
        {
          url: `${base}/complexes?run=${runId}`,
          title: 'Complexes · CO and HII, 300″ · Saltmarsh Reach survey · Lanewise',
        },
        {
          url: `${base}/link-runs/${runId}/complexes/${complexId}`,
          title: `Complex ${complexId} · CO and HII, 300″ · Saltmarsh Reach survey · Lanewise`,
        },
        {
          url: `${base}/arms?analysis=${analysisId}`,
          title: 'Arms & ordering · Saltmarsh Reach survey · Lanewise',
        },
        { url: '/tools', title: 'Calculators · Lanewise' },
      ];

      for (const viewport of VIEWPORTS)
        for (const scheme of ['light', 'dark'] as const) {
          const ctx = await browser.newContext({
            baseURL: BASE_URL,
            viewport,
            colorScheme: scheme,
            acceptDownloads: true,
          });
          const page = await ctx.newPage();
          await page.goto('/signin');
          await page.getByLabel('E-mail').fill(email);
          await page.getByLabel('Password').fill(PASSWORD);
          await page.getByRole('button', { name: 'Sign in' }).click();
          await page.waitForURL((u) => !u.pathname.startsWith('/signin'));
          for (const { url, title } of pages) {
            await page.goto(url);
            await page.waitForLoadState('networkidle');
            const where = `${url} at ${viewport.width} px, ${scheme}`;
            expect(await page.title(), where).toBe(title);
            if ((await horizontalOverflow(page)) > 0)
              expect.fail(`${where}: wider than the window: ${await widestElements(page)}`);
            // The system's scheme is followed: the page background is the theme's paper.
            expect(
              await page.evaluate(() => getComputedStyle(document.body).backgroundColor),
              where,
            ).toBe(PAPER[scheme]);
            expect(await clippedTexts(page), where).toEqual([]);
          }

          if (viewport.width === 390 && scheme === 'light') {
            // The project sections fold into a menu; opening it shows them, following one folds it.
            await page.goto(base);
            const sections = page.getByRole('navigation', { name: 'Project' });
            const catalogsLink = sections.getByRole('link', { name: 'Catalogs' });
            expect(await catalogsLink.isVisible()).toBe(false);
            const menu = sections.getByRole('button', { name: /Menu/ });
            await menu.click();
            expect(await menu.getAttribute('aria-expanded')).toBe('true');
            await catalogsLink.click();
            await page.waitForURL(new RegExp(`${base}/catalogs$`));
            await expect.poll(() => catalogsLink.isVisible()).toBe(false);
            expect(await horizontalOverflow(page)).toBeLessThanOrEqual(0);
          }

          if (viewport.width === 1440 && scheme === 'light') {
            // The toggle overrides the system and is kept: the server renders the next page dark.
            await page.goto('/projects');
            await page.getByTestId('theme-toggle').selectOption('dark');
            expect(await page.evaluate(() => getComputedStyle(document.body).backgroundColor)).toBe(
              PAPER.dark,
            );
            const html = await (await page.request.get('/projects')).text();
            expect(html).toMatch(/<html[^>]*class="[^"]*\bdark\b/);
            await page.reload();
            expect(await page.evaluate(() => getComputedStyle(document.body).backgroundColor)).toBe(
              PAPER.dark,
            );
            await page.getByTestId('theme-toggle').selectOption('system');
            expect(await page.evaluate(() => getComputedStyle(document.body).backgroundColor)).toBe(
              PAPER.light,
            );

            // Every figure on the figure pages saves as SVG (font inside, colours written out)
            // and as a PNG of 4 × its size.
            for (const url of [pages[1].url, pages[3].url, pages[4].url]) {
              await page.goto(url);
              await page.waitForLoadState('networkidle');
              const buttons = page.getByRole('button', { name: /^Download PNG at 4× of / });
              const count = await buttons.count();
              expect(count, url).toBeGreaterThan(0);
              for (let i = 0; i < count; i++) {
                const button = buttons.nth(i);
                const label = (await button.getAttribute('aria-label'))!;
                const title = label.replace('Download PNG at 4× of ', '');
                const figure = button.locator('xpath=ancestor::figure[1]');
                const drawn = figure.locator('svg[data-figure], canvas').first();
                const size = await drawn.evaluate((el) =>
                  el instanceof SVGSVGElement
                    ? { width: el.viewBox.baseVal.width, height: el.viewBox.baseVal.height }
                    : {
                        width: (el as HTMLCanvasElement).width / devicePixelRatio,
                        height: (el as HTMLCanvasElement).height / devicePixelRatio,
                      },
                );
                const [png] = await Promise.all([page.waitForEvent('download'), button.click()]);
                expect(pngSize(fs.readFileSync((await png.path())!)), title).toEqual({
                  width: Math.round(4 * size.width),
                  height: Math.round(4 * size.height),
                });
                const [svg] = await Promise.all([
                  page.waitForEvent('download'),
                  page
                    .getByRole('button', { name: `Download SVG of ${title}`, exact: true })
                    .click(),
                ]);
                const text = fs.readFileSync((await svg.path())!, 'utf8');
                expect(text, title).toMatch(/<svg[^>]*xmlns="http:\/\/www\.w3\.org\/2000\/svg"/);
                expect(text, title).not.toContain('var(');
                if (await drawn.evaluate((el) => el instanceof SVGSVGElement))
                  expect(text, title).toMatch(
                    /@font-face\{font-family:'Lanewise Plot Sans';src:url\(data:/,
                  );
              }
            }
          }
          await ctx.close();
        }
    },
  );
});
