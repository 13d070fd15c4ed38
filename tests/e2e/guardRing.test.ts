// The guard-ring proposal in Chromium: open the demo layout, propose, see the dashed preview and the
// BOM, accept (fences and doors in the layout), undo (the hand-drawn fence is back).
import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SCREENS, signInPage, startE2e, type E2e } from '../support/e2e';

const PLANNER = 'planner@fernhill.test';
const DEMO_PROJECT = 'Line 3 end-of-line cell';
const DEMO_LAYOUT = 'Fernhill line 3 — cell layout';

let e: E2e;
beforeAll(async () => {
  e = await startE2e();
});
afterAll(async () => e?.close());

async function demoIds(page: Page): Promise<{ projectId: number; layoutId: number }> {
  return page.evaluate(
    async ({ projectName, layoutName }) => {
      const { projects } = await (await fetch('/api/projects')).json();
      const project = projects.find((p: { name: string }) => p.name === projectName);
      const { layouts } = await (await fetch(`/api/projects/${project.id}/layouts`)).json();
      return { projectId: project.id, layoutId: layouts.find((l: { name: string }) => l.name === layoutName).id };
    },
    { projectName: DEMO_PROJECT, layoutName: DEMO_LAYOUT },
  );
}

describe('guard-ring proposal in Chromium', () => {
  it('proposes a ring for the demo, previews it with its BOM, accepts it as one undo step', async () => {
    const page = await e.browser.newPage({ viewport: { width: 1440, height: 1200 } });
    await signInPage(page, e.server.url, PLANNER);
    const { projectId, layoutId } = await demoIds(page);
    await page.goto(`${e.server.url}/projects/${projectId}/layouts/${layoutId}`);
    await page.locator('[data-layout-editor]').waitFor();
    await page.locator('[data-analysis-state="idle"]').waitFor();
    const handDrawn = await page.locator('path.boundary-line[data-kind="fence"]').evaluateAll((ps) => ps.map((p) => p.getAttribute('data-boundary')));
    expect(handDrawn.length).toBeGreaterThan(0);

    await page.getByRole('button', { name: 'Propose guard ring' }).click();
    const panel = page.locator('[data-guard-ring-panel]');
    await panel.waitFor();
    // The defaults are shown and editable; the clearance says where its 150 mm comes from.
    expect(await panel.locator('input[name="clearanceMm"]').inputValue()).toBe('150');
    expect(await panel.textContent()).toMatch(/common practice/);
    await panel.locator('input[name="panelWidthsMm"]').fill('500, 1000, 1500');
    await panel.getByRole('button', { name: 'Propose', exact: true }).click();
    await panel.locator('[data-guard-ring-result]').waitFor();

    // Preview: dashed fence lines and doors on the plan; the BOM table with panels of the chosen widths.
    const preview = page.locator('path[data-preview-fence]');
    expect(await preview.count()).toBeGreaterThan(0);
    expect(await preview.first().evaluate((p) => getComputedStyle(p).strokeDasharray)).not.toBe('none');
    expect(await page.locator('path[data-preview-door]').count()).toBeGreaterThan(0);
    const bom = panel.getByRole('table', { name: 'Proposed fence parts' });
    const rows = await bom.locator('tbody tr').allTextContents();
    expect(rows.some((r) => /^panel(1500|1000|500) × 2000 mm\d+$/.test(r))).toBe(true);
    expect(rows.some((r) => /^post, corner/.test(r))).toBe(true);
    expect(rows.some((r) => /^interlock/.test(r))).toBe(true);
    expect(rows.some((r) => /^floor anchor/.test(r))).toBe(true);
    expect(await panel.locator('[data-bom-totals]').textContent()).toMatch(/Fence length [\d.]+ m · enclosed floor [\d.]+ m²/);
    expect(await panel.textContent()).toMatch(/ISO 12100.*competent person/s);
    await page.screenshot({ path: path.join(SCREENS, 'guard-ring-preview.png') });

    // Accept: the proposal's fences and doors replace the hand-drawn ones; the preview goes.
    await panel.getByRole('button', { name: 'Accept' }).click();
    await page.locator('path.boundary-line[data-boundary="GR1"]').waitFor({ state: 'attached' });
    expect(await page.locator('path.boundary-line[data-kind="opening"]').count()).toBeGreaterThan(0);
    for (const id of handDrawn) expect(await page.locator(`path.boundary-line[data-boundary="${id}"]`).count()).toBe(0);
    expect(await page.locator('path[data-preview-fence]').count()).toBe(0);
    // The re-analysis has no fence or opening finding.
    await page.locator('[data-analysis-state="idle"]').waitFor();
    const kinds = await page.locator('[data-finding]').evaluateAll((els) => els.map((el) => el.getAttribute('data-finding') ?? ''));
    expect(kinds.filter((k) => /fence|opening/.test(k))).toEqual([]);

    // The Fence parts tab counts the accepted fences.
    await page.getByRole('tab', { name: 'Fence parts' }).click();
    await page.getByRole('table', { name: 'Fence parts of the cell layout' }).waitFor();
    await page.screenshot({ path: path.join(SCREENS, 'guard-ring-accepted.png') });

    // One undo step takes it all back.
    await page.getByRole('button', { name: 'Undo' }).click();
    for (const id of handDrawn) await page.locator(`path.boundary-line[data-boundary="${id}"]`).waitFor({ state: 'attached' });
    expect(await page.locator('path.boundary-line[data-boundary="GR1"]').count()).toBe(0);
    await page.close();
  });
});
