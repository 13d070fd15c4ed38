import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SCREENS, signInPage, startE2e, type E2e } from '../support/e2e';

let e: E2e;
beforeAll(async () => {
  e = await startE2e();
});
afterAll(async () => e?.close());

describe('foundation in Chromium', () => {
  it('sends a signed-out visitor to sign-in and shows a clear error on bad credentials', async () => {
    const page = await e.browser.newPage();
    await page.goto(`${e.server.url}/projects`);
    await page.waitForURL(/\/sign-in/);
    await page.getByLabel('E-mail').fill('planner@fernhill.test');
    await page.getByLabel('Password').fill('not-the-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect.poll(() => page.getByRole('alert').first().textContent()).toMatch(/not right/i);
    await page.close();
  });

  it('lets the planner create a project and see it listed; the client does not see it', async () => {
    const page = await e.browser.newPage();
    await signInPage(page, e.server.url, 'planner@fernhill.test');
    await page.goto(`${e.server.url}/projects`);
    await page.getByRole('button', { name: 'New project' }).first().click();
    await page.getByLabel('Project name').fill('Tray denester retrofit');
    await page.getByLabel('Client').fill('Fernhill Biscuit Works');
    await page.getByLabel('Site').fill('Hall 2, line 5');
    await page.getByRole('button', { name: /create/i }).last().click();
    await page.goto(`${e.server.url}/projects`);
    await page.getByRole('cell', { name: 'Tray denester retrofit' }).waitFor();
    await page.screenshot({ path: path.join(SCREENS, 'projects-planner.png'), fullPage: true });
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL(/\/sign-in/);

    await signInPage(page, e.server.url, 'client@fernhill.test');
    await page.goto(`${e.server.url}/projects`);
    await page.getByRole('cell', { name: 'Line 3 end-of-line cell' }).waitFor();
    expect(await page.getByText('Tray denester retrofit').count()).toBe(0);
    await page.screenshot({ path: path.join(SCREENS, 'projects-client.png'), fullPage: true });
    await page.close();
  });

  it('shows a real not-found page for unknown routes', async () => {
    const page = await e.browser.newPage();
    await signInPage(page, e.server.url, 'reviewer@fernhill.test');
    await page.goto(`${e.server.url}/no/such/page`);
    await expect.poll(() => page.locator('body').textContent()).toMatch(/not found|no page/i);
    await page.close();
  });
});
