import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { BASE_URL, PASSWORD, newUser } from '../helpers/client';
import { launchBrowser } from '../helpers/browser';
import { upload, waitForCatalog } from '../helpers/catalogs';

const FIXTURES = path.resolve(__dirname, '../fixtures/link-runs');
const CO = fs.readFileSync(path.join(FIXTURES, 'co-clouds-30.csv'), 'utf8');
const HII = fs.readFileSync(path.join(FIXTURES, 'hii-regions-30.csv'), 'utf8');

/**
 * The links a run must find, by brute force over the fixtures: every CO–HII pair closer than
 * `radiusArcsec` (flat-sky, fine at these separations) whose velocities differ by at most `dvKms`.
 */
function expectedLinks(radiusArcsec: number, dvKms: number): number {
  const rows = (csv: string) =>
    csv
      .trim()
      .split('\n')
      .slice(2)
      .map((line) => line.split(',').map(Number));
  const a = rows(CO);
  const b = rows(HII);
  let n = 0;
  for (const [la, ba, va] of a) {
    for (const [lb, bb, vb] of b) {
      const dx = (la - lb) * Math.cos((ba * Math.PI) / 180) * 3600;
      const dy = (ba - bb) * 3600;
      if (Math.hypot(dx, dy) <= radiusArcsec && Math.abs(va - vb) <= dvKms) n++;
    }
  }
  return n;
}

describe('link runs in the browser', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('starts a run from the form, follows it to done, reviews a complex and downloads the links', async () => {
    // Each HII region sits 4.5″ and 1 km/s from one CO cloud; clouds are 1.1° apart (fixture design).
    const linksExpected = expectedLinks(60, 5);
    expect(linksExpected).toBe(30);
    // A ±0.5 km/s window is narrower than the 1 km/s offset of every pair (fixture design).
    const narrowExpected = expectedLinks(60, 0.5);
    expect(narrowExpected).toBe(0);

    const { client, email } = await newUser('e2e-linkruns', 'Link Reviewer');
    const p = await client.json<{ project: { id: string } }>('POST', '/api/projects', {
      name: 'Harbor Ridge inner disc',
    });
    expect(p.status).toBe(201);
    const projectId = p.body.project.id;
    const ids: string[] = [];
    for (const [content, name, kind] of [
      [CO, 'Harbor Ridge CO clouds', 'co'],
      [HII, 'Harbor Ridge HII regions', 'hii'],
    ] as const) {
      const up = await upload(client, projectId, { content, name, kind, fileName: `${kind}.csv` });
      expect(up.status).toBe(202);
      const ready = await waitForCatalog(client, up.body.catalog.id);
      expect({ status: ready.status, rows: ready.rowCount }).toEqual({ status: 'ready', rows: 30 });
      ids.push(ready.id);
    }

    const ctx = await browser.newContext({
      baseURL: BASE_URL,
      viewport: { width: 1440, height: 1000 },
    });
    const page = await ctx.newPage();
    await page.goto('/signin');
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password').fill(PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL((u) => !u.pathname.startsWith('/signin'));

    await page.goto(`/projects/${projectId}/link-runs`);
    await page.getByText('No link runs yet').waitFor();
    await page.getByRole('link', { name: 'New link run' }).click();
    await page.waitForURL('**/link-runs/new');

    await page.getByRole('checkbox', { name: /Harbor Ridge CO clouds/ }).check();
    await page.getByRole('checkbox', { name: /Harbor Ridge HII regions/ }).check();
    await page.getByLabel('Radius', { exact: true }).fill('60');
    expect(await page.getByLabel('Radius unit').inputValue()).toBe('arcsec');
    await page.getByLabel('Window (km/s)').fill('5');
    // The estimate is asked for once the parameters are complete: 30 + 30 sources.
    const estimate = page.getByTestId('run-estimate');
    await estimate.waitFor();
    expect(await estimate.textContent()).toContain('60 sources');

    const posted = page.waitForResponse(
      (r) =>
        r.url().endsWith(`/api/projects/${projectId}/link-runs`) && r.request().method() === 'POST',
    );
    await page.getByRole('button', { name: 'Start link run' }).click();
    const started = await posted;
    expect(started.status()).toBe(202);
    const body = (await started.request().postDataJSON()) as Record<string, unknown>;
    expect(body).toMatchObject({
      catalogIds: ids,
      radius: { mode: 'fixed', arcsec: 60 },
      velocity: { mode: 'fixed', kms: 5 },
      linkMode: 'all',
    });
    await page.waitForURL(/\/link-runs\/[0-9a-f-]{36}$/);
    const runId = new URL(page.url()).pathname.split('/').pop()!;

    const status = page.getByTestId('run-status').first();
    await status.filter({ hasText: /^(done|failed|cancelled)$/ }).waitFor({ timeout: 90_000 });
    expect({
      status: await status.textContent(),
      // Next.js's route announcer is an empty alert of its own; only alerts with text count.
      alerts: (await page.getByRole('alert').allTextContents()).filter((t) => t.trim()),
    }).toEqual({
      status: 'done',
      alerts: [],
    });
    expect(await page.getByRole('progressbar').count()).toBe(0);
    expect(await page.getByTestId('summary-links').textContent()).toBe(String(linksExpected));
    // Each complex is one CO cloud and its HII region (fixture design).
    expect(await page.getByTestId('summary-complexes').textContent()).toBe('30');
    const pairs = page.getByRole('table', { name: 'Links per catalog pair' });
    expect(await pairs.locator('tbody tr td:nth-child(3)').allTextContents()).toEqual(['30']);
    expect(await page.getByRole('img', { name: 'Separation of linked sources' }).count()).toBe(1);

    const table = page.getByRole('table', { name: 'Complexes' });
    await table.locator('tbody tr').first().waitFor();
    expect(await table.locator('tbody tr').count()).toBe(30);
    expect(await page.getByTestId('complexes-range').textContent()).toBe('1–30 of 30');
    // Columns: selection, #, name, size.
    const sizes = await table.locator('tbody tr td:nth-child(4)').allTextContents();
    expect(new Set(sizes)).toEqual(new Set(['2']));

    // Distance and arm come from the run's latest ordering analysis: none yet, then one.
    const headers = await table.locator('thead th').allTextContents();
    const distCol = headers.findIndex((h) => h.startsWith('distance (kpc)')) + 1;
    const armCol = headers.findIndex((h) => h.startsWith('arm')) + 1;
    expect(distCol).toBeGreaterThan(0);
    expect(armCol).toBeGreaterThan(0);
    await page.getByText(/^Distances and arms appear once an ordering analysis/).waitFor();
    expect(
      new Set(await table.locator(`tbody tr td:nth-child(${distCol})`).allTextContents()),
    ).toEqual(new Set(['—']));
    const analysis = await client.json<{ analysis: { id: string } }>(
      'POST',
      `/api/projects/${projectId}/analyses`,
      {
        runId,
        curve: { name: 'reid-2014' },
        arms: { preset: 'reid-2014' },
        resamples: 2000,
        mcDraws: 100,
      },
    );
    expect(analysis.status).toBe(202);
    await expect
      .poll(
        async () =>
          (
            await client.json<{ analysis: { status: string } }>(
              'GET',
              `/api/analyses/${analysis.body.analysis.id}`,
            )
          ).body.analysis.status,
        { timeout: 120_000, interval: 500 },
      )
      .toBe('done');
    type Placed = {
      distKpc: number | null;
      distLoKpc: number | null;
      distHiKpc: number | null;
      arm: string | null;
    };
    const placed = await client.json<{ complexes: { id: string; analysis: Placed }[] }>(
      'GET',
      `/api/link-runs/${runId}/complexes?sort=id&dir=asc&pageSize=50`,
    );
    // The API's own values, as the table prints them (two decimals, the 68 % interval after).
    const distText = (a: Placed) =>
      a.distKpc === null
        ? '—'
        : `${a.distKpc.toFixed(2)} ${a.distLoKpc!.toFixed(2)}–${a.distHiKpc!.toFixed(2)}`;
    expect(placed.body.complexes.some((c) => c.analysis.distKpc !== null)).toBe(true);
    await page.reload();
    await page.getByTestId('complexes-analysis').waitFor();
    expect(await table.locator(`tbody tr td:nth-child(${distCol})`).allTextContents()).toEqual(
      placed.body.complexes.map((c) => distText(c.analysis)),
    );
    expect(await table.locator(`tbody tr td:nth-child(${armCol})`).allTextContents()).toEqual(
      placed.body.complexes.map((c) => c.analysis.arm ?? '—'),
    );

    // Open the first complex and review it.
    const firstLink = table.getByRole('link', { name: /^Complex \d+$/ }).first();
    const complexId = (await firstLink.textContent())!.trim();
    await firstLink.click();
    await page.waitForURL(new RegExp(`/link-runs/${runId}/complexes/${complexId}$`));
    await page.getByRole('heading', { name: new RegExp(`^Complex ${complexId}`) }).waitFor();
    await page.getByRole('heading', { name: /^From analysis / }).waitFor();
    const shown = placed.body.complexes.find((c) => c.id === complexId)!.analysis;
    expect(await page.getByTestId('analysis-dist').textContent()).toBe(
      shown.distKpc === null ? '—' : shown.distKpc.toFixed(2),
    );
    const members = page.getByRole('table', { name: 'Members' });
    await members.locator('tbody tr').first().waitFor();
    expect(await members.locator('tbody tr').count()).toBe(2);
    const memberNames = await members.locator('tbody tr td:nth-child(5)').allTextContents();
    expect(memberNames.map((n) => n.slice(0, 4)).sort()).toEqual(['HRC-', 'HRH-']);
    expect(memberNames[0].slice(4)).toBe(memberNames[1].slice(4));
    expect(
      await page.getByRole('table', { name: 'Links of the complex' }).locator('tbody tr').count(),
    ).toBe(1);
    expect(await page.getByRole('img', { name: 'Members on the sky' }).count()).toBe(1);

    expect(await page.getByTestId('review-state').textContent()).toBe('not reviewed');
    await page.getByRole('radio', { name: /^accepted/ }).check();
    const note = 'CO cloud and HII region coincide within 5″ and 1 km/s.';
    await page.getByLabel('Note').fill(note);
    const patched = page.waitForResponse(
      (r) => r.url().endsWith(`/complexes/${complexId}`) && r.request().method() === 'PATCH',
    );
    await page.getByRole('button', { name: 'Save review' }).click();
    expect((await patched).status()).toBe(200);
    await page
      .getByTestId('review-state')
      .filter({ hasText: /^accepted$/ })
      .waitFor();
    const history = page.getByRole('list', { name: 'Review history' });
    await history.locator('li').first().waitFor();
    expect(await history.locator('li').count()).toBe(1);
    const entry = await history.locator('li').first().textContent();
    expect(entry).toContain('accepted');
    expect(entry).toContain('Link Reviewer');
    expect(entry).toContain(note);
    const saved = await client.json<{ complex: { review: string; reviewNote: string } }>(
      'GET',
      `/api/link-runs/${runId}/complexes/${complexId}`,
    );
    expect(saved.body.complex).toMatchObject({ review: 'accepted', reviewNote: note });

    // An independent distance replaces the kinematic one for this complex, and can be taken back.
    await page.getByLabel('Distance (kpc)').fill('3.2');
    await page.getByLabel('Why', { exact: true }).fill('maser parallax of the HII region');
    const put = page.waitForResponse(
      (r) => r.url().endsWith(`/complexes/${complexId}/distance`) && r.request().method() === 'PUT',
    );
    await page.getByRole('button', { name: 'Save distance' }).click();
    expect((await put).status()).toBe(200);
    await page.getByText(/^Set to 3\.2 kpc by Link Reviewer/).waitFor();
    const withDistance = await client.json<{
      complex: { distanceOverride: { distKpc: number; note: string } | null };
    }>('GET', `/api/link-runs/${runId}/complexes/${complexId}`);
    expect(withDistance.body.complex.distanceOverride).toMatchObject({
      distKpc: 3.2,
      note: 'maser parallax of the HII region',
    });
    await page.getByRole('button', { name: 'Use the kinematic distance' }).click();
    await page.getByText(/^Ordering analyses give this complex a kinematic distance/).waitFor();
    const cleared = await client.json<{ complex: { distanceOverride: unknown } }>(
      'GET',
      `/api/link-runs/${runId}/complexes/${complexId}`,
    );
    expect(cleared.body.complex.distanceOverride).toBeNull();

    // The links CSV from the run page.
    await page.getByRole('link', { name: 'Back to the run' }).click();
    await page.waitForURL(new RegExp(`/link-runs/${runId}$`));
    const downloading = page.waitForEvent('download');
    await page.getByRole('link', { name: 'Links as CSV' }).click();
    const download = await downloading;
    const file = await download.path();
    const lines = fs.readFileSync(file, 'utf8').trim().split(/\r?\n/);
    expect(
      lines[0].startsWith(
        'catalog_a,row_a,catalog_b,row_b,separation_arcsec,delta_v_kms,complex_id',
      ),
    ).toBe(true);
    expect(lines).toHaveLength(1 + linksExpected);

    // Re-run with edits starts from this run's parameters; a narrower window loses every link.
    await page.getByRole('link', { name: 'Re-run with edits' }).click();
    await page.waitForURL(new RegExp(`/link-runs/new\\?from=${runId}$`));
    await page.getByTestId('run-estimate').waitFor();
    expect(await page.getByLabel('Radius', { exact: true }).inputValue()).toBe('60');
    expect(await page.getByLabel('Window (km/s)').inputValue()).toBe('5');
    expect(await page.getByRole('checkbox', { name: /Harbor Ridge HII regions/ }).isChecked()).toBe(
      true,
    );
    await page.getByLabel('Window (km/s)').fill('0.5');
    await page.getByLabel('Chance-link repeats').fill('2');
    await page.getByLabel('Run name (optional)').fill('Narrow window');
    await page.getByRole('button', { name: 'Start link run' }).click();
    await page.waitForURL(
      (u) => /\/link-runs\/[0-9a-f-]{36}$/.test(u.pathname) && !u.pathname.endsWith(runId),
    );
    await page.getByRole('heading', { name: 'Narrow window' }).waitFor();
    await status.filter({ hasText: /^(done|failed|cancelled)$/ }).waitFor({ timeout: 90_000 });
    expect(await status.textContent()).toBe('done');
    expect(await page.getByTestId('summary-links').textContent()).toBe(String(narrowExpected));
    await page.getByLabel('Other run').selectOption(runId);
    await expect.poll(() => page.getByTestId('compare-common').textContent()).toBe('0');
    expect(await page.getByTestId('compare-gained').textContent()).toBe(String(linksExpected));
    expect(await page.getByTestId('compare-lost').textContent()).toBe('0');

    // The project's Complexes section opens on the newest finished run (the narrow one, without
    // complexes); choosing the first run shows its complexes with the review.
    await page.getByRole('link', { name: 'Complexes', exact: true }).click();
    await page.waitForURL(`**/projects/${projectId}/complexes`);
    await page.getByText('This run found no complexes.').waitFor();
    await page.getByLabel('Link run').selectOption(runId);
    await page.waitForURL(`**/projects/${projectId}/complexes?run=${runId}`);
    await expect.poll(() => page.getByTestId('complexes-range').textContent()).toBe('1–30 of 30');
    await page.getByLabel('Review state').selectOption('accepted');
    await page.getByRole('button', { name: 'Apply filters' }).click();
    await expect.poll(() => page.getByTestId('complexes-range').textContent()).toBe('1–1 of 1');
    await ctx.close();
  });
});
