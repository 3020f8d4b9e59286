import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { BASE_URL, PASSWORD, linkIn, uniqueEmail, waitForMail } from '../helpers/client';
import { launchBrowser } from '../helpers/browser';

describe('a new team in the browser', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('signs up, creates a project, invites a colleague who signs up from the e-mail and sees the project', async () => {
    const pi = await browser.newContext({ baseURL: BASE_URL });
    const page = await pi.newPage();
    const piEmail = uniqueEmail('e2e-pi');
    await page.goto('/signup');
    await page.getByLabel('Name').fill('Principal Investigator');
    await page.getByLabel('E-mail').fill(piEmail);
    await page.getByLabel('Password').fill(PASSWORD);
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.waitForURL('**/projects');

    await page.getByLabel('New project').fill('Perseus-arm CO survey');
    await page.getByRole('button', { name: 'Create project' }).click();
    await page.waitForURL(/\/projects\/[0-9a-f-]{36}$/);
    await expect
      .poll(() => page.getByRole('heading', { name: 'Perseus-arm CO survey' }).count())
      .toBe(1);

    await page.getByRole('link', { name: 'Team' }).click();
    const colleague = uniqueEmail('e2e-colleague');
    await page.locator('input[name="inviteEmail"]').fill(colleague);
    await page.locator('select[name="inviteRole"]').selectOption('editor');
    await page.getByRole('button', { name: 'Send invitation' }).click();
    await page.getByText(`Invitation sent to ${colleague}.`).waitFor();

    const mail = await waitForMail(colleague, /invited to "Perseus-arm CO survey"/);
    const link = linkIn(mail.text);

    const other = await browser.newContext({ baseURL: BASE_URL });
    const p2 = await other.newPage();
    await p2.goto(new URL(link).pathname);
    await p2.getByRole('link', { name: 'Create an account' }).click();
    await p2.getByLabel('Name').fill('Colleague');
    await p2.getByLabel('Password').fill(PASSWORD);
    await p2.getByRole('button', { name: 'Create account' }).click();
    await p2.getByRole('button', { name: 'Accept and open the project' }).click();
    await p2.waitForURL(/\/projects\/[0-9a-f-]{36}$/);
    await p2.getByRole('heading', { name: 'Perseus-arm CO survey' }).waitFor();
    await p2.getByRole('link', { name: 'Team' }).click();
    await p2.getByText('Principal Investigator').waitFor();
    await pi.close();
    await other.close();
  });
});
