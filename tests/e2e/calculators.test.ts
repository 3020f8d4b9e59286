import fs from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { BASE_URL, PASSWORD, uniqueEmail } from '../helpers/client';
import { launchBrowser } from '../helpers/browser';

describe('the calculators page in the browser', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('converts pasted positions, computes kinematic distances and draws the plot', async () => {
    const context = await browser.newContext({ baseURL: BASE_URL, acceptDownloads: true });
    const page = await context.newPage();
    await page.goto('/signup');
    await page.getByLabel('Name').fill('Calculator User');
    await page.getByLabel('E-mail').fill(uniqueEmail('e2e-tools'));
    await page.getByLabel('Password').fill(PASSWORD);
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.waitForURL('**/projects');

    await page.getByRole('link', { name: 'Calculators' }).click();
    await page.waitForURL('**/tools');
    await page.getByRole('heading', { name: 'Calculators' }).waitFor();

    // Coordinate conversion: the Galactic centre in degrees and in sexagesimal text.
    await page.getByRole('combobox', { name: 'Input frame' }).selectOption('equatorial');
    await page
      .getByRole('textbox', { name: /^Positions/ })
      .fill('# Galactic centre\n266.40499 -28.93617\n17:45:37.1976 -28:56:10.212\n');
    await page.getByRole('button', { name: 'Convert' }).click();
    const converted = page.getByRole('table', { name: 'Converted positions' });
    await converted.waitFor();
    const convertedRows = converted.locator('tbody tr');
    await expect.poll(() => convertedRows.count()).toBe(2);
    // l ≈ 0°, b ≈ 0° to 6 decimals (Hipparcos Catalogue Vol. 1 §1.5.3)
    for (const i of [0, 1]) {
      const cells = await convertedRows.nth(i).locator('td').allTextContents();
      expect(Number(cells[3]) < 1e-5 || Number(cells[3]) > 360 - 1e-5).toBe(true);
      expect(Math.abs(Number(cells[4]))).toBeLessThan(1e-5);
    }
    const [csvDownload] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'Download CSV' }).click(),
    ]);
    const csv = fs
      .readFileSync(await csvDownload.path(), 'utf8')
      .trim()
      .split('\n');
    expect(csv[0]).toBe('line,ra_input,dec_input,l_deg,b_deg');
    expect(csv).toHaveLength(3);

    // Kinematic distances on the flat curve (R0 = 8.5 kpc, Θ0 = 220 km/s).
    await page.getByRole('combobox', { name: 'Rotation curve' }).selectOption('flat');
    await page.getByRole('textbox', { name: 'R0 (kpc)' }).fill('8.5');
    await page.getByRole('textbox', { name: /^Θ0/ }).fill('220');
    await page.getByRole('textbox', { name: /^Sources/ }).fill('30 0 50\n120 0 -50\n120 0 30\n');
    await page.getByRole('button', { name: 'Compute distances' }).click();
    const table = page.getByRole('table', { name: 'Kinematic distances' });
    await table.waitFor();
    const rows = table.locator('tbody tr');
    await expect.poll(() => rows.count()).toBe(3);
    // Flat closed form R = R0 Θ0 sin l / (Θ0 sin l + v) (exact geometry): R = 5.844, near 3.350, far 11.372, tangent R0 cos l = 7.361
    const first = await rows.nth(0).locator('td').allTextContents();
    expect([first[4], first[5], first[7], first[11]]).toEqual([
      '5.844',
      '3.350',
      '11.372',
      '7.361',
    ]);
    // 68 % intervals around each root (near grows with v, far shrinks; exact geometry)
    const [nearLo, nearHi] = first[6].split('–').map(Number);
    expect(nearLo).toBeLessThan(3.35);
    expect(nearHi).toBeGreaterThan(3.35);
    const [farLo, farHi] = first[8].split('–').map(Number);
    expect(farLo).toBeLessThan(11.372);
    expect(farHi).toBeGreaterThan(11.372);
    expect(first[9]).toBe('—');
    const second = await rows.nth(1).locator('td').allTextContents();
    expect(second[5]).toBe('—');
    expect(second[7]).toBe('—');
    expect(second[9]).toBe('4.617'); // flat closed form at l = 120°, v = −50 km/s (exact geometry)
    expect(second[12]).toMatch(/outer Galaxy/);
    const third = await rows.nth(2).locator('td').allTextContents();
    expect(third[12]).toMatch(/no distance/);
    await page.getByText(/No point on this sight line has this velocity/).waitFor();

    // The plot of the first row: curve, velocity line, near / far / tangent marked.
    const plot = page.getByRole('img', { name: /^Velocity against distance/ });
    await plot.waitFor();
    expect(await plot.getAttribute('aria-label')).toMatch(/l = 30\.000°/);
    expect(await plot.locator('path[data-series="curve"]').getAttribute('d')).toMatch(/^M[\d.]+,/);
    await expect
      .poll(() => plot.locator('[data-root="near"]').textContent())
      .toMatch(/near 3\.35 kpc/);
    expect(await plot.locator('[data-root="far"]').textContent()).toMatch(/far 11\.37 kpc/);
    expect(await plot.locator('[data-root="tangent"]').textContent()).toMatch(
      /tangent 7\.36 kpc, v_t = 110\.0 km\/s/, // exact geometry: l = 30°, v_t = Θ0 (1 − sin l) = 110 km/s, d_t = 7.36 kpc
    );
    expect(await plot.textContent()).toMatch(/Distance along the line of sight d \(kpc\)/);
    expect(await plot.textContent()).toMatch(/v_LSR \(km\/s\)/);

    // Selecting the outer-Galaxy row redraws the plot for its sight line: one (single) root, no tangent.
    await rows.nth(1).click();
    await expect.poll(() => plot.getAttribute('aria-label')).toMatch(/l = 120\.000°/);
    expect(await plot.locator('[data-root="near"]').count()).toBe(0);
    expect(await plot.locator('[data-root="tangent"]').count()).toBe(0);
    expect(await plot.locator('[data-root="far"]').count()).toBe(0);
    expect(await plot.locator('[data-root="single"]').textContent()).toMatch(/single 4\.62 kpc/);

    const [svgDownload] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'Download SVG' }).click(),
    ]);
    expect(svgDownload.suggestedFilename()).toMatch(/\.svg$/);
    const svg = fs.readFileSync(await svgDownload.path(), 'utf8');
    expect(svg).toMatch(/^<\?xml/);
    expect(svg).toMatch(/<svg[^>]*xmlns="http:\/\/www\.w3\.org\/2000\/svg"/);
    expect(svg).toMatch(/single 4\.62 kpc/);
    await context.close();
  });

  it('names the pasted line of a bad row', async () => {
    const context = await browser.newContext({ baseURL: BASE_URL });
    const page = await context.newPage();
    await page.goto('/signup');
    await page.getByLabel('Name').fill('Calculator User');
    await page.getByLabel('E-mail').fill(uniqueEmail('e2e-tools-bad'));
    await page.getByLabel('Password').fill(PASSWORD);
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.waitForURL('**/projects');
    await page.goto('/tools');
    await page.getByRole('combobox', { name: 'Input frame' }).selectOption('galactic');
    await page.getByRole('textbox', { name: /^Positions/ }).fill('# l b\n10 10\n\n20 95\n');
    await page.getByRole('button', { name: 'Convert' }).click();
    // Line 4 of the paste is points[1] of the request; the message names the line.
    await page.getByText(/^Line 4: latitude b 95 is outside −90…90°/).waitFor();
    await context.close();
  });
});
