/**
 * Forms that refuse say why, beside the field: the link-run form states each limit and answers
 * a value beyond it with an inline error (the Start button stays usable), and the only owner who
 * tries to demote themself reads the API's reason beside the role select.
 */
import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, BrowserContext } from 'playwright-core';
import { BASE_URL, PASSWORD, newUser, type Client } from '../helpers/client';
import { launchBrowser } from '../helpers/browser';
import { upload, waitForCatalog } from '../helpers/catalogs';

const FIXTURES = path.resolve(__dirname, '../fixtures/link-runs');
const SLOW = { timeout: 20_000 };

describe('forms state their limits and errors inline', () => {
  let browser: Browser;
  let ctx: BrowserContext;
  let client: Client;
  let email: string;
  let projectId: string;

  beforeAll(async () => {
    browser = await launchBrowser();
    const user = await newUser('e2e-forms', 'Form Tester');
    client = user.client;
    email = user.email;
    const p = await client.json<{ project: { id: string } }>('POST', '/api/projects', {
      name: 'Form limits',
    });
    projectId = p.body.project.id;
    for (const [file, kind] of [
      ['co-clouds-30.csv', 'co'],
      ['hii-regions-30.csv', 'hii'],
    ] as const) {
      const content = fs.readFileSync(path.join(FIXTURES, file), 'utf8');
      const up = await upload(client, projectId, { content, name: kind, kind });
      expect(up.status).toBe(202);
      expect((await waitForCatalog(client, up.body.catalog.id)).status).toBe('ready');
    }
    ctx = await browser.newContext({ baseURL: BASE_URL, viewport: { width: 1440, height: 1000 } });
    const page = await ctx.newPage();
    await page.goto('/signin');
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password').fill(PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL((u) => !u.pathname.startsWith('/signin'));
    await page.close();
  }, 180_000);

  afterAll(async () => {
    await ctx?.close();
    await browser?.close();
  });

  it('the link-run form states the repeat limit, says why 11 is refused, and accepts a 0″ radius', async () => {
    const page = await ctx.newPage();
    await page.goto(`/projects/${projectId}/link-runs/new`);
    const repeats = page.getByLabel('Chance-link repeats');
    await repeats.waitFor(SLOW);
    // The limit of the API's schema (0–10), stated beside the field.
    await page.getByText('Whole number, 0 to 10.', { exact: false }).waitFor(SLOW);
    await repeats.fill('11');
    await page
      .getByRole('alert')
      .filter({ hasText: /Outside the limit: Whole number, 0 to 10/ })
      .first()
      .waitFor(SLOW);
    const start = page.getByRole('button', { name: 'Start link run' });
    expect(await start.isEnabled()).toBe(true);
    await start.click();
    expect(await repeats.getAttribute('aria-invalid')).toBe('true');
    expect(page.url()).toContain('/link-runs/new'); // refused, with the reason shown

    // A 0″ radius is one the API accepts: no error beside the radius (the old form refused it).
    await repeats.fill('0');
    const radius = page.getByLabel('Radius', { exact: true });
    await radius.fill('0');
    await expect.poll(() => repeats.getAttribute('aria-invalid'), SLOW).toBeNull();
    expect(await radius.getAttribute('aria-invalid')).toBeNull();
    expect(await page.locator('#run-radiusValue-error').count()).toBe(0);
    await page.close();
  });

  it('the only owner demoting themself reads why beside the select', async () => {
    const page = await ctx.newPage();
    await page.goto(`/projects/${projectId}/team`);
    const select = page.getByLabel(`Role of ${email}`);
    await select.waitFor(SLOW);
    await select.selectOption('editor');
    // The API's 409 message (lib/services/members.ts), shown inline.
    await page
      .getByRole('alert')
      .filter({ hasText: 'A project needs at least one owner: make someone else owner first.' })
      .waitFor(SLOW);
    expect(await select.inputValue()).toBe('owner');
    expect(await select.getAttribute('aria-invalid')).toBe('true');
    await page.close();
  });
});
