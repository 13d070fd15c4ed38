// The section in Chromium: the Section tool draws a line across an arm and the fence of the demo
// cell, the side view shows the arm's cut and the fence numbers, and a drag of the arm moves the cut
// live (from the worker, before the drag is committed) and changes the distance to the fence.
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

interface Demo {
  projectId: number;
  layoutId: number;
  arms: Array<{ id: string; x: number; y: number }>;
  fences: Array<{ id: string; points: Array<[number, number]> }>;
}

async function demo(page: Page): Promise<Demo> {
  return page.evaluate(
    async ({ projectName, layoutName }) => {
      const get = async (url: string) => (await fetch(url)).json();
      const { projects } = await get('/api/projects');
      const project = projects.find((p: { name: string }) => p.name === projectName);
      const { layouts } = await get(`/api/projects/${project.id}/layouts`);
      const summary = layouts.find((l: { name: string }) => l.name === layoutName);
      const { layout } = await get(`/api/layouts/${summary.id}`);
      return {
        projectId: project.id,
        layoutId: layout.id,
        arms: layout.content.arms.map((a: { id: string; x: number; y: number }) => ({ id: a.id, x: a.x, y: a.y })),
        fences: layout.content.boundaries.filter((z: { kind: string }) => z.kind === 'fence'),
      };
    },
    { projectName: DEMO_PROJECT, layoutName: DEMO_LAYOUT },
  );
}

async function baseCentre(page: Page, armId: string): Promise<[number, number]> {
  const box = await page.locator(`g.arm-mark[data-arm="${armId}"] circle.arm-base`).boundingBox();
  if (!box) throw new Error(`no marker for ${armId}`);
  return [box.x + box.width / 2, box.y + box.height / 2];
}

/** The c value (mm) shown for a fence in the section's dimension list. */
async function shownC(page: Page, fenceId: string): Promise<number> {
  const text = await page.locator(`[data-section-dimensions] li[data-fence="${fenceId}"]`).first().innerText();
  const m = /c = (\d+) mm/.exec(text);
  if (!m) throw new Error(`no c in "${text}"`);
  return Number(m[1]);
}

describe('section view in Chromium', () => {
  it('draws a section across an arm and the fence, shows the cut and fence numbers, and follows a drag', async () => {
    const page = await e.browser.newPage({ viewport: { width: 1440, height: 1500 } });
    await signInPage(page, e.server.url, PLANNER);
    const d = await demo(page);
    await page.goto(`${e.server.url}/projects/${d.projectId}/layouts/${d.layoutId}`);
    await page.locator('[data-layout-editor]').waitFor();
    await page.locator('[data-analysis-state="idle"]').waitFor();
    await page.locator('g.arm-mark').first().waitFor({ state: 'attached' });

    // Before a line is drawn the panel says what to do.
    await expect(page.locator('[data-section-empty]').innerText()).resolves.toMatch(/Draw a section line on the plan with the Section tool/);

    // Plan → screen from two arm markers (north up on screen).
    const [p, q] = [d.arms[0], d.arms.find((a) => Math.hypot(a.x - d.arms[0].x, a.y - d.arms[0].y) > 500)!];
    const [ps, qs] = [await baseCentre(page, p.id), await baseCentre(page, q.id)];
    const k = Math.hypot(qs[0] - ps[0], qs[1] - ps[1]) / Math.hypot(q.x - p.x, q.y - p.y);
    const toScreen = (x: number, y: number): [number, number] => [ps[0] + (x - p.x) * k, ps[1] - (y - p.y) * k];

    // A line through the arm farthest east, at its y, on to beyond the fence's east side.
    const arm = d.arms.reduce((a, b) => (b.x > a.x ? b : a));
    const fence = d.fences[0];
    const fenceEast = Math.max(...fence.points.map((pt) => pt[0]));
    expect(fenceEast).toBeGreaterThan(arm.x);
    const a = toScreen(arm.x - 1500, arm.y);
    const b = toScreen(fenceEast + 800, arm.y);

    await page.getByRole('group', { name: 'Tools' }).getByRole('button', { name: 'Section' }).click();
    await page.mouse.click(a[0], a[1]);
    await page.mouse.move((a[0] + b[0]) / 2, a[1], { steps: 3 });
    await page.mouse.click(b[0], b[1]);

    // The line stays on the plan with its end letters; the side view shows the arm's cut and the fence.
    await page.locator('g.section-line text[data-section-end="A′"]').waitFor({ state: 'attached' });
    const cut = page.locator(`[data-section-view] path[data-section-cut="${arm.id}"]`);
    await cut.waitFor({ state: 'attached' });
    await page.locator(`[data-section-view] rect[data-section-fence="${fence.id}"]`).waitFor({ state: 'attached' });
    const c0 = await shownC(page, fence.id);
    expect(c0).toBeGreaterThan(0);
    await expect(page.locator('[data-section-view] [data-caution]').innerText()).resolves.toMatch(/competent person under the local codes/);
    await expect(page.locator('[data-section-view] svg').textContent()).resolves.toMatch(/c \d+/);
    await page.screenshot({ path: '/tmp/section-drawn.png', fullPage: true });
    await page.locator('[data-section-view]').screenshot({ path: '/tmp/section-panel-drawn.png' });
    await page.screenshot({ path: path.join(SCREENS, 'section-drawn.png'), fullPage: true });

    // Drag the arm east by half the gap: the cut moves during the drag, and c shrinks by the distance moved.
    const d0 = await cut.getAttribute('d');
    const [sx, sy] = await baseCentre(page, arm.id);
    const dx = (c0 / 2) * k;
    await page.mouse.move(sx, sy);
    await page.mouse.down();
    await page.mouse.move(sx + dx / 2, sy, { steps: 4 });
    await page.mouse.move(sx + dx, sy, { steps: 4 });
    await page.waitForFunction(
      ({ id, before }) => document.querySelector(`[data-section-view] path[data-section-cut="${id}"]`)?.getAttribute('d') !== before,
      { id: arm.id, before: d0 },
      { timeout: 10_000 },
    );
    await page.screenshot({ path: '/tmp/section-dragging.png', fullPage: true });
    await page.mouse.up();
    await page.locator('[data-analysis-state="idle"]').waitFor();
    await page.locator('[data-save-state="saved"]').waitFor({ timeout: 15_000 });
    await page.waitForFunction(
      ({ fenceId, before }) => {
        const li = document.querySelector(`[data-section-dimensions] li[data-fence="${fenceId}"]`);
        const m = li && /c = (\d+) mm/.exec(li.textContent ?? '');
        return !!m && Number(m[1]) !== before;
      },
      { fenceId: fence.id, before: c0 },
      { timeout: 10_000 },
    );
    const c1 = await shownC(page, fence.id);
    const moved = await page.evaluate(
      async ({ id, armId }) => {
        const { layout } = await (await fetch(`/api/layouts/${id}`)).json();
        return layout.content.arms.find((x: { id: string }) => x.id === armId).x as number;
      },
      { id: d.layoutId, armId: arm.id },
    );
    // The line runs east along the arm's y and the fence crossing is east of the arm: c shrinks by the move (mm, shown rounded).
    expect(moved - arm.x).toBeGreaterThan(0);
    expect(Math.abs(c0 - c1 - (moved - arm.x))).toBeLessThanOrEqual(2);
    await page.screenshot({ path: '/tmp/section-moved.png', fullPage: true });
    await page.locator('[data-section-view]').screenshot({ path: '/tmp/section-panel-moved.png' });

    // Esc during a new line drops it; the drawn one stays. Clear removes it.
    await page.keyboard.press('s');
    await page.mouse.click(a[0], a[1] + 40);
    await page.keyboard.press('Escape');
    await expect(page.locator('g.section-line').count()).resolves.toBe(1);
    await page.getByRole('button', { name: 'Clear section' }).click();
    await page.locator('[data-section-empty]').waitFor();

    // A second line, picked with the key, along the column row at y = 4 m of the demo hall: the
    // column crossed is drawn hatched to full height, the fence with its height.
    await page.keyboard.press('s');
    // The page may have scrolled for the button: measure the plan's place on screen again.
    const [ps2, qs2] = [await baseCentre(page, p.id), await baseCentre(page, q.id)];
    const again = (x: number, y: number): [number, number] => [ps2[0] + (x - p.x) * k, ps2[1] - (y - p.y) * k];
    expect(Math.hypot(qs2[0] - ps2[0], qs2[1] - ps2[1])).toBeCloseTo(Math.hypot(qs[0] - ps[0], qs[1] - ps[1]), 0);
    const c = again(15500, 4000);
    const f = again(fenceEast + 600, 4000);
    await page.mouse.click(c[0], c[1]);
    await page.mouse.click(f[0], f[1]);
    await page.locator('[data-section-view] rect[data-structure^="COLUMNS#"]').first().waitFor({ state: 'attached' });
    await page.locator(`[data-section-view] rect[data-section-fence="${fence.id}"]`).waitFor({ state: 'attached' });
    await expect(page.locator('[data-section-view] svg').textContent()).resolves.toMatch(/column · full height/);
    await page.locator('[data-section-view]').screenshot({ path: '/tmp/section-panel-column.png' });
    const box = (await page.locator('g.section-line').boundingBox())!;
    await page.screenshot({ path: '/tmp/section-plan-line.png', clip: { x: box.x - 60, y: box.y - 60, width: box.width + 120, height: box.height + 120 } });
    await page.close();
  });

  it('lets a reviewer draw a section on a read-only layout: the side view shows, nothing is edited', async () => {
    const page = await e.browser.newPage({ viewport: { width: 1440, height: 1500 } });
    await signInPage(page, e.server.url, 'reviewer@fernhill.test');
    const d = await demo(page);
    const versionBefore = await page.evaluate(async (id) => (await (await fetch(`/api/layouts/${id}`)).json()).layout.version as number, d.layoutId);
    await page.goto(`${e.server.url}/projects/${d.projectId}/layouts/${d.layoutId}`);
    await page.locator('[data-layout-editor]').waitFor();
    await page.locator('[data-analysis-state="idle"]').waitFor();
    await page.locator('g.arm-mark').first().waitFor({ state: 'attached' });
    await page.getByText(/Read only/).first().waitFor();
    const [p, q] = [d.arms[0], d.arms.find((a) => Math.hypot(a.x - d.arms[0].x, a.y - d.arms[0].y) > 500)!];
    const [ps, qs] = [await baseCentre(page, p.id), await baseCentre(page, q.id)];
    const k = Math.hypot(qs[0] - ps[0], qs[1] - ps[1]) / Math.hypot(q.x - p.x, q.y - p.y);
    const toScreen = (x: number, y: number): [number, number] => [ps[0] + (x - p.x) * k, ps[1] - (y - p.y) * k];
    const arm = d.arms.reduce((a, b) => (b.x > a.x ? b : a));
    const fenceEast = Math.max(...d.fences[0].points.map((pt) => pt[0]));
    const a = toScreen(arm.x - 1500, arm.y);
    const b = toScreen(fenceEast + 800, arm.y);
    await page.getByRole('group', { name: 'Tools' }).getByRole('button', { name: 'Section' }).click();
    await page.mouse.click(a[0], a[1]);
    await page.mouse.click(b[0], b[1]);
    await page.locator(`[data-section-view] path[data-section-cut="${arm.id}"]`).waitFor({ state: 'attached' });
    await page.locator(`[data-section-dimensions] li[data-fence="${d.fences[0].id}"]`).first().waitFor();
    await page.screenshot({ path: path.join(SCREENS, 'section-reviewer.png'), fullPage: true });
    const versionAfter = await page.evaluate(async (id) => (await (await fetch(`/api/layouts/${id}`)).json()).layout.version as number, d.layoutId);
    expect(versionAfter).toBe(versionBefore);
    await page.close();
  });
});
