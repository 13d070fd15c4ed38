// The audit log in Chromium: the admin reads the demo's history in words — "Signed off revision B",
// item kinds such as "Cell layout", the edit's changes as lines — with no JSON, no stored action
// codes and no camelCase kinds on the page, and the action filter offers words; pages carry their
// own tab titles. The product's own words (docs/glossary.md); no outside source applies.
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SCREENS, signInPage, startE2e, type E2e } from '../support/e2e';

const DEMO_PROJECT = 'Line 3 end-of-line cell';

let e: E2e;
beforeAll(async () => {
  e = await startE2e();
});
afterAll(async () => e?.close());

describe('audit log and tab titles in Chromium', () => {
  it('shows the audit log in words, never raw JSON, codes or camelCase kinds', async () => {
    const page = await e.browser.newPage();
    await signInPage(page, e.server.url, 'admin@fernhill.test');
    await page.goto(`${e.server.url}/admin/audit`);
    const table = page.getByRole('table', { name: 'Audit events' });
    await table.getByRole('cell', { name: 'Signed off revision B', exact: true }).first().waitFor();
    await table.getByRole('cell', { name: 'Edited cell layout', exact: true }).first().waitFor();
    await table.getByRole('cell', { name: 'Signed in', exact: true }).first().waitFor();
    const text = (await table.textContent()) ?? '';
    expect(text).toMatch(/Cell layout/);
    expect(text).not.toMatch(/[{}]|"\w+":/);
    expect(text).not.toMatch(/\b(floorPlan|armModel|sign_off|revision\.\w+|auth\.\w+|layout\.update)\b/);
    await page.screenshot({ path: path.join(SCREENS, 'audit-log.png'), fullPage: true });

    // The filter offers words and still filters by the stored action.
    const action = page.getByLabel('Action');
    expect(await action.locator('option').allTextContents()).toEqual(expect.arrayContaining(['Any revision action', 'Signed off a revision', 'Returned a revision for changes']));
    expect(await page.getByLabel('Item kind').locator('option').allTextContents()).toEqual(expect.arrayContaining(['Floor plan', 'Arm model', 'Cell layout']));
    await action.selectOption({ label: 'Returned a revision for changes' });
    await page.getByRole('button', { name: 'Show' }).click();
    await expect.poll(async () => (await table.locator('tbody tr').allTextContents()).length).toBe(1);
    expect(await table.locator('tbody tr').first().textContent()).toMatch(/Returned revision A for changes/);
    await page.close();
  });

  it('gives pages their own tab titles', async () => {
    const page = await e.browser.newPage();
    await page.goto(`${e.server.url}/sign-in`);
    await expect.poll(() => page.title()).toBe('Sign in · Ringfence');
    await signInPage(page, e.server.url, 'admin@fernhill.test');
    await page.goto(`${e.server.url}/admin/audit`);
    await expect.poll(() => page.title()).toBe('Audit log · Ringfence');
    const { projectId, layoutId, layoutName } = await page.evaluate(async (projectName) => {
      const { projects } = await (await fetch('/api/projects')).json();
      const project = projects.find((p: { name: string }) => p.name === projectName);
      const { layouts } = await (await fetch(`/api/projects/${project.id}/layouts`)).json();
      return { projectId: project.id as number, layoutId: layouts[0].id as number, layoutName: layouts[0].name as string };
    }, DEMO_PROJECT);
    await page.goto(`${e.server.url}/projects/${projectId}/layouts/${layoutId}`);
    await expect.poll(() => page.title()).toBe(`${layoutName} · ${DEMO_PROJECT} · Ringfence`);
    await page.goto(`${e.server.url}/projects/${projectId}`);
    await expect.poll(() => page.title()).toBe(`${DEMO_PROJECT} · Ringfence`);
    await page.close();
  });
});
