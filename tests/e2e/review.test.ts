import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, BrowserContext } from 'playwright-core';
import { BASE_URL, PASSWORD, newUser, type Client } from '../helpers/client';
import { launchBrowser } from '../helpers/browser';
import { upload, waitForCatalog } from '../helpers/catalogs';

const FIXTURES = path.resolve(__dirname, '../fixtures/link-runs');
const CO = fs.readFileSync(path.join(FIXTURES, 'co-clouds-30.csv'), 'utf8');
const HII = fs.readFileSync(path.join(FIXTURES, 'hii-regions-30.csv'), 'utf8');

async function waitForRun(client: Client, runId: string) {
  const deadline = Date.now() + 120_000;
  for (;;) {
    const r = await client.json<{ run: { status: string } }>('GET', `/api/link-runs/${runId}`);
    if (['done', 'failed', 'cancelled'].includes(r.body.run.status)) return r.body.run;
    if (Date.now() > deadline) throw new Error(`run still ${r.body.run.status}`);
    await new Promise((res) => setTimeout(res, 250));
  }
}

/** The machine is shared: pages may take seconds to answer. */
const SLOW = { timeout: 20_000 };

describe('reviewing complexes in the browser', () => {
  let browser: Browser;
  let ctx: BrowserContext;
  let client: Client;
  let projectId: string;
  let runId: string;

  beforeAll(async () => {
    browser = await launchBrowser();
    const user = await newUser('e2e-review', 'Keyboard Reviewer');
    client = user.client;
    const p = await client.json<{ project: { id: string } }>('POST', '/api/projects', {
      name: 'Harbor Ridge review',
    });
    projectId = p.body.project.id;
    const ids: string[] = [];
    for (const [content, kind] of [
      [CO, 'co'],
      [HII, 'hii'],
    ] as const) {
      const up = await upload(client, projectId, { content, name: kind, kind });
      expect(up.status).toBe(202);
      ids.push((await waitForCatalog(client, up.body.catalog.id)).id);
    }
    const start = await client.json<{ run: { id: string } }>(
      'POST',
      `/api/projects/${projectId}/link-runs`,
      {
        catalogIds: ids,
        radius: { mode: 'fixed', arcsec: 60 },
        velocity: { mode: 'fixed', kms: 5 },
        linkMode: 'all',
        chanceTrials: 0,
      },
    );
    runId = start.body.run.id;
    expect((await waitForRun(client, runId)).status).toBe('done');

    ctx = await browser.newContext({ baseURL: BASE_URL, viewport: { width: 1440, height: 1000 } });
    const page = await ctx.newPage();
    await page.goto('/signin');
    await page.getByLabel('E-mail').fill(user.email);
    await page.getByLabel('Password').fill(PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL((u) => !u.pathname.startsWith('/signin'));
    await page.close();
  }, 180_000);

  afterAll(async () => {
    await ctx?.close();
    await browser?.close();
  });

  it('reviews ten complexes with the keyboard only', async () => {
    const page = await ctx.newPage();
    await page.goto(`/projects/${projectId}/complexes?run=${runId}&review=unreviewed`);
    await expect
      .poll(() => page.getByTestId('complexes-range').textContent(), SLOW)
      .toBe('1–30 of 30');
    await page.getByText('0 of 30 reviewed').first().waitFor();
    await page.keyboard.press('j');
    await page.getByTestId('cursor-row').waitFor();
    await page.keyboard.press('Enter');
    await page.waitForURL(/\/complexes\/\d+\?/);

    const keys = ['a', 'd', 'r'] as const;
    const words = { a: 'accepted', d: 'rejected', r: 'doubtful' } as const;
    const done: { id: string; review: string }[] = [];
    for (let i = 0; i < 10; i++) {
      const id = new URL(page.url()).pathname.split('/').pop()!;
      await page.getByRole('heading', { name: new RegExp(`^Complex ${id}`) }).waitFor();
      await page
        .getByTestId('review-state')
        .filter({ hasText: /^not reviewed$/ })
        .waitFor();
      if (i === 0) {
        // A letter typed into the note is text, not a verdict.
        await page.getByLabel('Note').pressSequentially('a');
        await page.waitForTimeout(300);
        expect(await page.getByTestId('review-state').textContent()).toBe('not reviewed');
        await page.getByLabel('Note').blur();
      }
      const key = keys[i % 3];
      await page.keyboard.press(key);
      await page
        .getByTestId('review-state')
        .filter({ hasText: new RegExp(`^${words[key]}$`) })
        .waitFor();
      done.push({ id, review: words[key] });
      await page.getByText('Not in this list').first().waitFor();
      await page.keyboard.press('n');
      await page.waitForURL((u) => !u.pathname.endsWith(`/complexes/${id}`));
    }
    expect(new Set(done.map((d) => d.id)).size).toBe(10);
    await page
      .getByText(/10 of 30 reviewed in this run/)
      .first()
      .waitFor();

    // The verdicts as the API stores them.
    for (const d of done) {
      const r = await client.json<{
        complex: { review: string | null; reviewNote: string | null };
      }>('GET', `/api/link-runs/${runId}/complexes/${d.id}`);
      expect({ id: d.id, review: r.body.complex.review }).toEqual(d);
    }
    expect(done[0].review).toBe('accepted');
    const first = await client.json<{ complex: { reviewNote: string | null } }>(
      'GET',
      `/api/link-runs/${runId}/complexes/${done[0].id}`,
    );
    expect(first.body.complex.reviewNote).toBe('a');
    const all = await client.json<{ total: number }>(
      'GET',
      `/api/link-runs/${runId}/complexes?review=unreviewed`,
    );
    expect(all.body.total).toBe(20);
    await page.close();
  });

  it('keeps filters and sort in the address, so a bookmark reopens the same view', async () => {
    const page = await ctx.newPage();
    await page.goto(`/projects/${projectId}/complexes?run=${runId}`);
    await expect
      .poll(() => page.getByTestId('complexes-range').textContent(), SLOW)
      .toBe('1–30 of 30');
    // Member names HRC-001 … HRC-009 (the fixture's first nine clouds), sorted by l descending.
    await page.getByLabel('Search member names').fill('HRC-00');
    await page.getByRole('button', { name: 'Apply filters' }).click();
    await page.waitForURL(/q=HRC-00/, SLOW);
    const sortBy = page.getByRole('button', { name: /^l \(°\)/ });
    await sortBy.click();
    await page.waitForURL(/sort=l&|sort=l$/, SLOW);
    await page.locator('th[aria-sort="ascending"]').waitFor(SLOW);
    await sortBy.click();
    await page.waitForURL(/dir=desc/, SLOW);
    await page.locator('th[aria-sort="descending"]').waitFor(SLOW);
    const bookmark = page.url();

    // The same filter and order as the API gives them: the oracle of the rows shown.
    const query = new URL(bookmark).searchParams;
    query.delete('run');
    const api = await client.json<{ total: number; complexes: { id: number | string }[] }>(
      'GET',
      `/api/link-runs/${runId}/complexes?${query}`,
    );
    expect(api.body.total).toBe(9);
    const shownIds = async (p: typeof page) => {
      await expect
        .poll(() => p.getByTestId('complexes-range').textContent(), SLOW)
        .toBe(`1–${api.body.total} of ${api.body.total}`);
      return (await p.getByRole('link', { name: /^Complex \d+$/ }).allTextContents()).map(Number);
    };
    const expected = api.body.complexes.map((c) => Number(c.id));
    expect(await shownIds(page)).toEqual(expected);

    const reopened = await ctx.newPage();
    await reopened.goto(bookmark);
    expect(await shownIds(reopened)).toEqual(expected);
    expect(await reopened.getByLabel('Search member names').inputValue()).toBe('HRC-00');
    await reopened
      .locator('th[aria-sort="descending"]')
      .getByText(/^l \(°\)/)
      .waitFor(SLOW);

    // Back steps through the earlier views: the ascending order, then the unsorted filter.
    await reopened.close();
    await page.goBack();
    await page
      .locator('th[aria-sort="ascending"]')
      .getByText(/^l \(°\)/)
      .waitFor(SLOW);
    await page.close();
  });

  it('shows a missing run or complex as not found once, and asks the server nothing more', async () => {
    const page = await ctx.newPage();
    const asked: string[] = [];
    page.on('request', (r) => {
      if (new URL(r.url()).pathname.startsWith('/api/link-runs/')) asked.push(r.url());
    });
    for (const url of [
      `/projects/${projectId}/link-runs/no-such-run`,
      `/projects/${projectId}/link-runs/${runId}/complexes/abc`,
      `/projects/${projectId}/link-runs/${runId}/complexes/99999`,
      `/projects/${projectId}/catalogs/no-such-catalog`,
      `/projects/${projectId}/arms?analysis=no-such-analysis`,
    ]) {
      const res = await page.goto(url);
      expect(res?.status()).toBe(404);
      await page.getByText('Not found', { exact: true }).waitFor();
      await page.waitForTimeout(2500);
      expect(await page.getByText('Not found', { exact: true }).count()).toBe(1);
      expect(await page.getByText(/Loading/).count()).toBe(0);
      expect(await page.getByText(/invalid|expected/i).count()).toBe(0);
    }
    expect(asked).toEqual([]);
    await page.close();
  });
});
