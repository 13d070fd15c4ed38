// Find a place in Chromium on the seeded demo: search where the first picker may stand for the
// handover point, see the map and the candidates, place the arm at the best one (one undo step);
// then propose arms for it and discard the proposal.
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SCREENS, signInPage, startE2e, type E2e } from '../support/e2e';

let e: E2e;
beforeAll(async () => {
  e = await startE2e();
});
afterAll(async () => e?.close());

describe('placement search in the editor', () => {
  it('draws the map and candidates for the demo, places the arm at a candidate, and previews a proposal', async () => {
    const page = await e.browser.newPage({ viewport: { width: 1440, height: 1100 } });
    await signInPage(page, e.server.url, 'planner@fernhill.test');
    const ids = await page.evaluate(async () => {
      const { projects } = await (await fetch('/api/projects')).json();
      const project = projects.find((p: { name: string }) => p.name === 'Line 3 end-of-line cell');
      const { layouts } = await (await fetch(`/api/projects/${project.id}/layouts`)).json();
      return { projectId: project.id as number, layoutId: layouts.find((l: { name: string }) => l.name === 'Fernhill line 3 — cell layout').id as number };
    });
    const stored = () => page.evaluate(async (id) => (await (await fetch(`/api/layouts/${id}`)).json()).layout.content.arms.find((a: { id: string }) => a.id === 'R1'), ids.layoutId);
    const before = await stored();
    await page.goto(`${e.server.url}/projects/${ids.projectId}/layouts/${ids.layoutId}`);
    await page.locator('[data-analysis-state="idle"]').waitFor();

    await page.getByRole('button', { name: 'Find a place' }).click();
    const panel = page.locator('[data-placement-panel]');
    await panel.getByLabel('Arm').selectOption('arm:R1');
    await panel.getByLabel('Work points').selectOption('tag:handover');
    await panel.getByRole('button', { name: 'Search' }).click();

    await page.locator('g[data-placement-map] image').waitFor({ state: 'attached' });
    await panel.locator('[data-placement-legend]').waitFor();
    const first = panel.locator('[data-candidate-button="1"]');
    await first.waitFor();
    expect(await page.locator('g.placement-candidate').count()).toBeGreaterThan(0);

    // The map explains the spot under the pointer (its margin, or why it fails).
    const img = (await page.locator('g[data-placement-map] image').boundingBox())!;
    await page.mouse.move(img.x + img.width * 0.2, img.y + img.height * 0.8, { steps: 3 });
    await expect.poll(() => panel.locator('[data-placement-hover]').textContent()).not.toBe('');
    await page.screenshot({ path: path.join(SCREENS, 'placement-map.png') });

    const text = (await first.textContent())!;
    const [, x, y] = /x (-?\d+), y (-?\d+)/.exec(text)!;
    await first.click();
    await expect.poll(async () => { const a = await stored(); return [Math.round(a.x), Math.round(a.y)]; }, { timeout: 10_000 }).toEqual([Number(x), Number(y)]);

    // One undo step puts the arm back where it stood.
    await page.keyboard.press('Control+z');
    await expect.poll(async () => { const a = await stored(); return [a.x, a.y]; }, { timeout: 10_000 }).toEqual([before.x, before.y]);

    // Propose arms: one SCARA for the handover point, shown beside the current layout with both scores.
    await panel.getByRole('tab', { name: 'Propose arms' }).click();
    await panel.getByLabel('Demo SCARA 600').fill('1');
    await panel.getByLabel('Mount height (mm)').fill('400');
    await panel.getByRole('button', { name: 'Propose' }).click();
    const proposal = panel.locator('[data-proposal]');
    await proposal.waitFor({ timeout: 20_000 });
    expect(await proposal.getByRole('row', { name: /^Arms/ }).textContent()).toMatch(/^Arms41$/);
    expect(await page.locator('g.placement-proposed').count()).toBe(1);
    await proposal.getByRole('button', { name: 'Discard' }).click();
    await expect.poll(() => page.locator('g.placement-proposed').count()).toBe(0);
    expect((await stored()).x).toBe(before.x);
    await page.close();
  });
});
