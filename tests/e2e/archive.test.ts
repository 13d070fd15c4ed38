// Archiving in Chromium, mostly by keyboard: the planner archives the demo project with a confirm step,
// finds it under Show → Archived, and an admin restores it.
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SCREENS, signInPage, startE2e, type E2e } from '../support/e2e';

let e: E2e;
beforeAll(async () => {
  e = await startE2e();
});
afterAll(async () => e?.close());

describe('archive in Chromium', () => {
  it('archives a project with a confirm step, lists it under Archived, and an admin restores it', async () => {
    const page = await e.browser.newPage();
    await signInPage(page, e.server.url, 'planner@fernhill.test');
    await page.goto(`${e.server.url}/projects`);
    await page.getByRole('link', { name: 'Line 3 end-of-line cell' }).click();
    await page.getByRole('button', { name: 'Archive project' }).focus();
    await page.keyboard.press('Enter');
    const dialog = page.getByRole('dialog', { name: 'Archive this project?' });
    await dialog.waitFor();
    await dialog.getByRole('button', { name: 'Archive project' }).focus();
    await page.keyboard.press('Enter');
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'Archived' }).count()).toBe(1);
    await page.screenshot({ path: path.join(SCREENS, 'project-archived.png'), fullPage: true });

    await page.goto(`${e.server.url}/projects`);
    await expect.poll(() => page.getByRole('link', { name: 'Line 3 end-of-line cell' }).count()).toBe(0);
    await page.getByLabel('Show').selectOption('archived');
    await page.getByRole('link', { name: 'Line 3 end-of-line cell' }).waitFor();
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL(/\/sign-in/);

    await signInPage(page, e.server.url, 'admin@fernhill.test');
    await page.goto(`${e.server.url}/projects`);
    await page.getByLabel('Show').selectOption('archived');
    await page.getByRole('link', { name: 'Line 3 end-of-line cell' }).click();
    await page.getByRole('button', { name: 'Restore project' }).click();
    await page.getByRole('dialog', { name: 'Restore this project?' }).getByRole('button', { name: 'Restore project' }).click();
    await page.getByRole('button', { name: 'Archive project' }).waitFor();
    await page.goto(`${e.server.url}/projects`);
    await page.getByRole('link', { name: 'Line 3 end-of-line cell' }).waitFor();
    await page.close();
  });
});
