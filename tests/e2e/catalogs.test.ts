import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { BASE_URL, PASSWORD, uniqueEmail } from '../helpers/client';
import { launchBrowser } from '../helpers/browser';
import { planeCsv } from '../helpers/catalogs';

const FIXTURE = path.resolve(__dirname, '../fixtures/e2e/co-clouds-300.csv');

/** The good rows of the fixture, read here independently of the app (the oracle for counts). */
function fixtureRows() {
  const lines = fs.readFileSync(FIXTURE, 'utf8').trim().split('\n').slice(2);
  return lines
    .map((line) => {
      const [l, b, v, name] = line.split(',');
      return { l: Number(l), b: Number(b), v: Number(v), name };
    })
    .filter((r) => Number.isFinite(r.l) && Math.abs(r.b) <= 90);
}

/** Pixels of a plot canvas drawn in the CO colour (#009e73 blended over the paper background). */
async function tracerPixels(page: Page, testId: string): Promise<number> {
  return page.evaluate((id) => {
    const canvas = document.querySelector<HTMLCanvasElement>(`canvas[data-testid="${id}"]`);
    if (!canvas) return -1;
    const data = canvas.getContext('2d')!.getImageData(0, 0, canvas.width, canvas.height).data;
    let n = 0;
    for (let i = 0; i < data.length; i += 4) if (data[i] < 150 && data[i + 1] > data[i] + 40) n++;
    return n;
  }, testId);
}

const firstCells = (page: Page, column: number) =>
  page
    .getByRole('table', { name: 'Catalog rows' })
    .locator(`tbody tr td:nth-child(${column})`)
    .allTextContents();

describe('catalogs in the browser', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('uploads a CSV through the mapping screen, follows it being read, and shows its report, rows and plots', async () => {
    const good = fixtureRows();
    expect(good).toHaveLength(298);
    const ctx = await browser.newContext({
      baseURL: BASE_URL,
      viewport: { width: 1440, height: 1000 },
    });
    const page = await ctx.newPage();

    await page.goto('/signup');
    await page.getByLabel('Name').fill('Catalog Curator');
    await page.getByLabel('E-mail').fill(uniqueEmail('e2e-catalogs'));
    await page.getByLabel('Password').fill(PASSWORD);
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.waitForURL('**/projects');
    await page.getByLabel('New project').fill('Inner-disc CO clouds');
    await page.getByRole('button', { name: 'Create project' }).click();
    await page.waitForURL(/\/projects\/[0-9a-f-]{36}$/);
    const projectId = new URL(page.url()).pathname.split('/').pop()!;

    await page.getByRole('link', { name: 'Catalogs', exact: true }).click();
    await page.getByText('No catalogs yet').waitFor();
    await page.getByRole('link', { name: 'Upload catalog', exact: true }).click();
    await page.waitForURL('**/catalogs/new');

    // Choosing the file sends its start for the preview and fills in the suggested mapping.
    await page.getByLabel('Catalog file').setInputFiles(FIXTURE);
    const preview = page.getByRole('table', { name: 'Preview of the file' });
    await preview.waitFor();
    expect(await preview.locator('tbody tr').count()).toBe(20);
    expect(await preview.locator('tbody tr').first().locator('td').first().textContent()).toBe('3');
    expect(await page.getByLabel('Longitude column (l)').inputValue()).toBe('GLON');
    expect(await page.getByLabel('Latitude column (b)').inputValue()).toBe('GLAT');
    expect(await page.getByLabel('Velocity column').inputValue()).toBe('VLSR');
    expect(await page.getByLabel('Name column').inputValue()).toBe('NAME');
    await page.getByLabel('Velocity frame').selectOption('lsr');
    await page.getByLabel('Catalog name').fill('Harbor Ridge CO clouds');
    await page.getByLabel('Tracer class').selectOption('co');

    // A larger catalog sent just before keeps the single test worker busy, so this one is
    // visibly waiting when its page opens (jobs run in the order they were queued).
    const pacer = await ctx.request.post(`/api/projects/${projectId}/catalogs`, {
      headers: { origin: BASE_URL },
      multipart: {
        file: { name: 'pacer.csv', mimeType: 'text/csv', buffer: Buffer.from(planeCsv(150_000)) },
        name: 'Pacer',
        kind: 'hi',
      },
    });
    expect(pacer.status()).toBe(202);

    const posted = page.waitForResponse(
      (r) =>
        r.url().endsWith(`/api/projects/${projectId}/catalogs`) && r.request().method() === 'POST',
    );
    await page.getByRole('button', { name: 'Upload and read catalog' }).click();
    expect((await posted).status()).toBe(202);
    await page.waitForURL(/\/catalogs\/[0-9a-f-]{36}$/);
    await page.getByRole('heading', { name: 'Harbor Ridge CO clouds' }).waitFor();
    await page.getByRole('progressbar').waitFor();
    const status = page.getByTestId('catalog-status');
    await status.filter({ hasText: /^(ready|failed)$/ }).waitFor({ timeout: 90_000 });
    const failure = await page.locator('main [role="alert"]').allTextContents();
    expect({ status: await status.textContent(), failure }).toEqual({
      status: 'ready',
      failure: [],
    });
    expect(await page.getByRole('progressbar').count()).toBe(0);
    expect(await page.getByTestId('row-count').textContent()).toBe('298');

    // Parse report: the two bad lines with what was wrong in each.
    const rejected = page.getByRole('table', { name: 'Rejected rows' });
    expect(await rejected.locator('tbody tr td:first-child').allTextContents()).toEqual([
      '58',
      '212',
    ]);
    const reasons = await rejected.locator('tbody tr td:nth-child(2)').allTextContents();
    expect(reasons[0]).toContain('3l.207');
    expect(reasons[1]).toContain('97.500');
    expect(await page.getByTestId('rejected-summary').textContent()).toContain(
      '298 of 300 data rows were stored; 2 were rejected',
    );

    // Server-paged table: 50 rows a page, in file order first.
    const table = page.getByRole('table', { name: 'Catalog rows' });
    await table.locator('tbody tr').first().waitFor();
    expect(await table.locator('tbody tr').count()).toBe(50);
    expect(await page.getByTestId('rows-range').textContent()).toBe('1–50 of 298');
    expect((await firstCells(page, 4))[0]).toBe(good[0].l.toFixed(4));
    await page.getByRole('button', { name: 'Next', exact: true }).click();
    await expect.poll(() => page.getByTestId('rows-range').textContent()).toBe('51–100 of 298');
    await expect.poll(async () => (await firstCells(page, 1))[0]).toBe('51');

    // Sorting by l: ascending on the first click, descending on the second; back to page 1.
    const lHeader = table.getByRole('button', { name: 'l (°)' });
    await lHeader.click();
    await lHeader.click();
    await expect
      .poll(() => table.locator('th[aria-sort="descending"]').textContent())
      .toContain('l (°)');
    const lMax = Math.max(...good.map((r) => r.l));
    await expect.poll(async () => (await firstCells(page, 4))[0]).toBe(lMax.toFixed(4));
    expect(await page.getByTestId('rows-range').textContent()).toBe('1–50 of 298');
    const lDesc = (await firstCells(page, 4)).map(Number);
    expect(lDesc).toEqual([...lDesc].sort((a, b) => b - a));

    await page.getByRole('combobox', { name: 'Rows per page' }).selectOption('100');
    await expect.poll(() => page.getByTestId('page-of').textContent()).toBe('page 1 of 3');

    // Range filters and the name search, counted against the fixture itself.
    await page.getByLabel('l from').fill('20');
    await page.getByLabel('l to').fill('30');
    await page.getByLabel('b from').fill('-0.5');
    await page.getByLabel('b to').fill('0.5');
    await page.getByRole('button', { name: 'Apply filters' }).click();
    const inBox = good.filter((r) => r.l >= 20 && r.l <= 30 && r.b >= -0.5 && r.b <= 0.5).length;
    expect(inBox).toBeGreaterThan(0);
    await expect
      .poll(() => page.getByTestId('rows-range').textContent())
      .toBe(`1–${inBox} of ${inBox}`);
    await page.getByRole('button', { name: 'Clear' }).click();
    await page.getByLabel('Search names').fill('HRG-CO-021');
    await page.getByRole('button', { name: 'Apply filters' }).click();
    const named = good.filter((r) => r.name.includes('HRG-CO-021')).length;
    await expect
      .poll(() => page.getByTestId('rows-range').textContent())
      .toBe(`1–${named} of ${named}`);

    // Both plots are drawn from the binary points in the CO colour, with a cursor readout.
    const sky = page.getByTestId('sky-plot');
    await sky.waitFor();
    await expect.poll(() => tracerPixels(page, 'sky-plot')).toBeGreaterThan(100);
    await expect.poll(() => tracerPixels(page, 'lv-plot')).toBeGreaterThan(100);
    await sky.scrollIntoViewIfNeeded();
    const box = (await sky.boundingBox())!;
    await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    await expect
      .poll(() => page.getByTestId('sky-plot-readout').textContent())
      .toMatch(/^l = [\d.]+ ° {3}b = −?[\d.]+ °$/);
    const before = await tracerPixels(page, 'sky-plot');
    await page.mouse.down();
    await page.mouse.move(box.x + box.width * 0.55, box.y + box.height * 0.6, { steps: 5 });
    await page.mouse.up();
    await expect.poll(() => tracerPixels(page, 'sky-plot')).not.toBe(before);
    const reset = page.getByRole('button', { name: 'Reset zoom' }).first();
    expect(await reset.isEnabled()).toBe(true);
    await reset.click();
    await expect.poll(() => tracerPixels(page, 'sky-plot')).toBe(before);

    // Downloads: the PNG is the canvas; the SVG holds one marker per point (298 < the 20 000 cap).
    const [png] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'Download PNG' }).first().click(),
    ]);
    expect(png.suggestedFilename()).toBe('Harbor Ridge CO clouds-sky.png');
    expect(
      fs
        .readFileSync(await png.path())
        .subarray(1, 4)
        .toString(),
    ).toBe('PNG');
    const [svg] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'Download SVG' }).nth(1).click(),
    ]);
    expect(svg.suggestedFilename()).toBe('Harbor Ridge CO clouds-lv.svg');
    const svgText = fs.readFileSync(await svg.path(), 'utf8');
    expect(svgText.match(/<use /g)).toHaveLength(298);
    expect(svgText).toContain('LSR velocity v (km/s)');

    expect(await page.getByRole('link', { name: 'Download CSV' }).getAttribute('href')).toMatch(
      /\/api\/catalogs\/[0-9a-f-]{36}\/export\.csv$/,
    );

    // The list shows both catalogs as ready, then deleting this one leads back to it.
    await page.getByRole('button', { name: 'Delete', exact: true }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Keep it' }).click();
    expect(await page.getByRole('dialog').count()).toBe(0);
    await page.getByRole('button', { name: 'Delete', exact: true }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Delete catalog' }).click();
    await page.waitForURL(`**/projects/${projectId}/catalogs`);
    const list = page.getByRole('table', { name: 'Catalogs' });
    await list.getByRole('link', { name: 'Pacer' }).waitFor();
    expect(await list.getByRole('link', { name: 'Harbor Ridge CO clouds' }).count()).toBe(0);
    await ctx.close();
  });
});
