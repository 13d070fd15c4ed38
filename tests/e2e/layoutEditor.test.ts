import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SCREENS, signInPage, startE2e, type E2e } from '../support/e2e';

const PLANNER = 'planner@fernhill.test';
const REVIEWER = 'reviewer@fernhill.test';
const DEMO_PROJECT = 'Line 3 end-of-line cell';
const DEMO_LAYOUT = 'Fernhill line 3 — cell layout';

let e: E2e;
beforeAll(async () => {
  e = await startE2e();
});
afterAll(async () => e?.close());

/**
 * The demo layout's ids, through the page's own session. When the seed has no demo layout, one is
 * made here from the demo floor plan and catalogue: four arms of the invented Fernhill cell.
 */
async function demoLayout(page: Page): Promise<{ projectId: number; layoutId: number }> {
  return page.evaluate(
    async ({ projectName, layoutName }) => {
      const get = async (url: string) => {
        const r = await fetch(url);
        if (!r.ok) throw new Error(`${url}: ${r.status}`);
        return r.json();
      };
      const { projects } = await get('/api/projects');
      const project = projects.find((p: { name: string }) => p.name === projectName);
      const { layouts } = await get(`/api/projects/${project.id}/layouts`);
      const existing = layouts.find((l: { name: string }) => l.name === layoutName);
      if (existing) return { projectId: project.id, layoutId: existing.id };
      const { floorPlans } = await get(`/api/projects/${project.id}/floor-plans`);
      const { armModels } = await get('/api/arm-models');
      const model = (name: string) => armModels.find((m: { name: string }) => m.name.startsWith(name))?.id ?? armModels[0].id;
      const arm = (id: string, m: string, x: number, y: number, yaw: number) => ({ id, armModelId: model(m), label: '', x, y, yaw, mountHeight: 0 });
      const content = {
        arms: [
          arm('R1', 'Demo SCARA', 5000, 9000, 0),
          arm('R2', 'Demo SCARA', 9000, 9000, 180),
          arm('R3', 'Demo Articulated', 13000, 6000, 90),
          arm('R4', 'Demo Palletizer', 19000, 6000, 90),
        ],
        workPoints: [],
        boundaries: [],
        // Inside the stroke of the demo SCARA (mounted on the floor here), so every arm has a band.
        workHeights: [500],
      };
      const r = await fetch(`/api/projects/${project.id}/layouts`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ name: layoutName, floorPlanId: floorPlans[0]?.id ?? null, content }),
      });
      if (!r.ok) throw new Error(`create layout: ${r.status} ${await r.text()}`);
      return { projectId: project.id, layoutId: (await r.json()).layout.id };
    },
    { projectName: DEMO_PROJECT, layoutName: DEMO_LAYOUT },
  );
}

async function storedArm(page: Page, layoutId: number, armId: string): Promise<{ x: number; y: number }> {
  return page.evaluate(
    async ({ id, arm }) => {
      const { layout } = await (await fetch(`/api/layouts/${id}`)).json();
      const a = layout.content.arms.find((x: { id: string }) => x.id === arm);
      return { x: a.x, y: a.y };
    },
    { id: layoutId, arm: armId },
  );
}

/** Screen centre of an arm's base marker. */
async function baseCentre(page: Page, armId: string): Promise<[number, number]> {
  const box = await page.locator(`g.arm-mark[data-arm="${armId}"] circle.arm-base`).boundingBox();
  if (!box) throw new Error(`no marker for ${armId}`);
  return [box.x + box.width / 2, box.y + box.height / 2];
}

const pairKey = (a: string, b: string) => [a, b].sort().join('+');

async function openEditor(page: Page, projectId: number, layoutId: number) {
  await page.goto(`${e.server.url}/projects/${projectId}/layouts/${layoutId}`);
  await page.locator('[data-layout-editor]').waitFor();
  // The first analysis from the worker has drawn the findings list.
  await page.locator('[data-analysis-state="idle"]').waitFor();
  await page.locator('g.arm-mark').first().waitFor({ state: 'attached' });
}

describe('layout editor in Chromium', () => {
  it('drags an arm until it shares space with another; the shared zone follows live, undo and reload hold', async () => {
    const page = await e.browser.newPage({ viewport: { width: 1440, height: 1100 } });
    await signInPage(page, e.server.url, PLANNER);
    const { projectId, layoutId } = await demoLayout(page);

    // The project page lists the layout with its counts.
    await page.goto(`${e.server.url}/projects/${projectId}`);
    const row = page.getByRole('table', { name: 'Cell layouts' }).getByRole('row', { name: new RegExp(DEMO_LAYOUT) });
    await row.waitFor();
    await row.getByRole('link', { name: DEMO_LAYOUT }).click();
    await page.waitForURL(new RegExp(`/layouts/${layoutId}$`));
    await openEditor(page, projectId, layoutId);

    // Two arms that do not share space yet: the moving one and its neighbour (nearest such pair).
    const arms = await page.locator('g.arm-mark').evaluateAll((gs) => gs.map((g) => g.getAttribute('data-arm')!));
    expect(arms.length).toBeGreaterThanOrEqual(2);
    const shared = new Set(await page.locator('path.shared-zone').evaluateAll((ps) => ps.map((p) => p.getAttribute('data-shared'))));
    const centres = new Map<string, [number, number]>();
    for (const id of arms) centres.set(id, await baseCentre(page, id));
    let best: { a: string; b: string; d: number } | null = null;
    for (const a of arms) {
      for (const b of arms) {
        if (a >= b || shared.has(pairKey(a, b))) continue;
        const [ax, ay] = centres.get(a)!;
        const [bx, by] = centres.get(b)!;
        const d = Math.hypot(ax - bx, ay - by);
        if (!best || d < best.d) best = { a, b, d };
      }
    }
    expect(best, 'a pair of arms without a shared zone').not.toBeNull();
    const { a: mover, b: other } = best!;
    const key = pairKey(mover, other);
    const before = await storedArm(page, layoutId, mover);

    // Drag without letting go: the worker's analysis of the drag pose draws the shared zone live.
    const [sx, sy] = centres.get(mover)!;
    const [tx, ty] = centres.get(other)!;
    const reachAtStart = (await page.locator(`g.arm-reach[data-arm="${mover}"]`).boundingBox())!;
    await page.mouse.move(sx, sy);
    await page.mouse.down();
    const boundary = page.locator(`path.shared-zone[data-shared="${key}"]`);
    let appeared = false;
    for (let f = 0.1; f <= 0.9 + 1e-9 && !appeared; f += 0.1) {
      await page.mouse.move(sx + (tx - sx) * f, sy + (ty - sy) * f, { steps: 4 });
      appeared = await boundary
        .waitFor({ state: 'attached', timeout: 1500 })
        .then(() => true)
        .catch(() => false);
    }
    expect(appeared, 'shared zone drawn during the drag').toBe(true);
    // Meanwhile the dragged arm's reach rides on a layer of its own, as far from where it started as
    // the arm's mark (the plan's own copy is hidden until the drag ends).
    const reachBox = async (sel: string) => (await page.locator(sel).first().boundingBox())!;
    expect(await page.locator(`.plan-drag-layer[data-arm="${mover}"] g`).count()).toBe(1);
    const dragged = await reachBox(`.plan-drag-layer[data-arm="${mover}"] g`);
    const [mx, my] = await baseCentre(page, mover);
    expect(Math.abs(dragged.x + dragged.width / 2 - (reachAtStart.x + reachAtStart.width / 2) - (mx - sx))).toBeLessThan(3);
    expect(Math.abs(dragged.y + dragged.height / 2 - (reachAtStart.y + reachAtStart.height / 2) - (my - sy))).toBeLessThan(3);
    expect(await page.locator(`g.arm-reach[data-arm="${mover}"]`).evaluate((g) => getComputedStyle(g).display)).toBe('none');
    await page.mouse.up();
    await expect.poll(() => page.locator('.plan-drag-layer').count()).toBe(0);
    expect(await page.locator(`g.arm-reach[data-arm="${mover}"]`).evaluate((g) => getComputedStyle(g).display)).not.toBe('none');

    // The finding is listed and the boundary is drawn with the hatch pattern.
    const finding = page.locator(`[data-finding="shared-zone:${key}"]`);
    await finding.waitFor();
    expect(await finding.textContent()).toMatch(/share [\d.]+ m² of restricted space/);
    const fill = await boundary.evaluate((p) => getComputedStyle(p).fill);
    expect(fill).toContain('rf-shared-hatch');
    expect(await page.locator('pattern#rf-shared-hatch').count()).toBe(1);
    await expect.poll(async () => (await storedArm(page, layoutId, mover)).x, { timeout: 10000 }).not.toBe(before.x);
    const moved = await storedArm(page, layoutId, mover);
    // The caution is shown at the foot of the findings.
    expect(await page.locator('[data-caution]').textContent()).toMatch(/ISO 12100.*ISO 10218-2.*competent person/s);
    await page.screenshot({ path: path.join(SCREENS, 'layout-editor-after-drag.png') });

    // Clicking the finding selects it, emphasises the arms involved and zooms onto the shared zone.
    const boundaryBox0 = (await boundary.boundingBox())!;
    await finding.click();
    expect(await finding.getAttribute('aria-pressed')).toBe('true');
    await expect.poll(async () => (await boundary.boundingBox())!.width, { timeout: 5000 }).toBeGreaterThan(boundaryBox0.width * 1.5);
    await page.waitForTimeout(400);
    await page.screenshot({ path: path.join(SCREENS, 'layout-editor-shared-zone.png') });

    // Undo (Ctrl+Z) puts the arm back; the shared zone goes; the server gets the old position again.
    await page.locator('body').click({ position: { x: 5, y: 5 } });
    await page.keyboard.press('Control+z');
    await expect.poll(async () => boundary.count(), { timeout: 10000 }).toBe(0);
    await expect.poll(async () => storedArm(page, layoutId, mover), { timeout: 10000 }).toEqual(before);
    // Redo (Shift+Ctrl+Z) moves it again, and the save reaches the server.
    await page.keyboard.press('Shift+Control+z');
    await expect.poll(async () => storedArm(page, layoutId, mover), { timeout: 10000 }).toEqual(moved);
    await page.locator('[data-save-state="saved"]').waitFor();

    // Reload: the saved position, and the shared zone drawn again.
    await page.reload();
    await openEditor(page, projectId, layoutId);
    await page.locator(`path.shared-zone[data-shared="${key}"]`).waitFor({ state: 'attached' });
    await page.locator(`g.arm-mark[data-arm="${mover}"] circle.arm-base`).click();
    expect(Number(await page.getByLabel('x (east) (mm)').inputValue())).toBeCloseTo(moved.x, 0);
    expect(Number(await page.getByLabel('y (north) (mm)').inputValue())).toBeCloseTo(moved.y, 0);

    // Arrow keys nudge the selected arm 10 mm (Shift: 100 mm); ] turns it 5°.
    const yaw0 = Number(await page.getByLabel('Yaw (°)').inputValue());
    await page.locator('body').click({ position: { x: 5, y: 5 } });
    await page.locator(`g.arm-mark[data-arm="${mover}"] circle.arm-base`).click();
    await page.keyboard.press('ArrowRight');
    await page.keyboard.press('Shift+ArrowUp');
    await page.keyboard.press(']');
    await expect.poll(async () => Number(await page.getByLabel('x (east) (mm)').inputValue())).toBeCloseTo(moved.x + 10, 0);
    expect(Number(await page.getByLabel('y (north) (mm)').inputValue())).toBeCloseTo(moved.y + 100, 0);
    const yaw1 = Number(await page.getByLabel('Yaw (°)').inputValue());
    expect(((yaw1 - yaw0 + 540) % 360) - 180).toBeCloseTo(5, 6);
    await page.close();
  });

  it('shows the reviewer the same findings, read only', async () => {
    const planner = await e.browser.newPage();
    await signInPage(planner, e.server.url, PLANNER);
    const { projectId, layoutId } = await demoLayout(planner);
    await planner.close();

    const page = await e.browser.newPage({ viewport: { width: 1440, height: 1000 } });
    await signInPage(page, e.server.url, REVIEWER);
    await openEditor(page, projectId, layoutId);
    expect(await page.locator('[data-layout-editor]').getAttribute('data-read-only')).toBe('true');
    expect(await page.getByRole('button', { name: 'Add arm' }).count()).toBe(0);
    // Exact: findings are buttons too, and the demo's fence findings mention the fence.
    expect(await page.getByRole('button', { name: 'Fence', exact: true }).count()).toBe(0);
    const first = await page.locator('g.arm-mark').first().getAttribute('data-arm');
    const before = await storedArm(page, layoutId, first!);
    const [x, y] = await baseCentre(page, first!);
    await page.mouse.move(x, y);
    await page.mouse.down();
    await page.mouse.move(x + 120, y + 60, { steps: 5 });
    await page.mouse.up();
    // Selected but not moved: the marker stays where it was and nothing is saved.
    expect(await baseCentre(page, first!)).toEqual([x, y]);
    expect(await page.getByLabel('x (east) (mm)').getAttribute('readonly')).not.toBeNull();
    expect(await storedArm(page, layoutId, first!)).toEqual(before);
    expect(await page.locator('ul[aria-label="Findings"] li').count()).toBeGreaterThan(0);
    await page.screenshot({ path: path.join(SCREENS, 'layout-editor-reviewer.png') });
    await page.close();
  });
  it('draws a fence, an opening on it and an operator area by clicks; a save from elsewhere brings the conflict dialog', async () => {
    const page = await e.browser.newPage({ viewport: { width: 1440, height: 1100 } });
    await signInPage(page, e.server.url, PLANNER);
    const { projectId } = await demoLayout(page);
    const layoutId = await page.evaluate(async (pid) => {
      const { floorPlans } = await (await fetch(`/api/projects/${pid}/floor-plans`)).json();
      const { armModels } = await (await fetch('/api/arm-models')).json();
      const content = { arms: [{ id: 'R1', armModelId: armModels[0].id, label: '', x: 2500, y: 2500, yaw: 0, mountHeight: 0 }], workPoints: [], boundaries: [], workHeights: [900] };
      const r = await fetch(`/api/projects/${pid}/layouts`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ name: 'Boundaries drawn by clicks', floorPlanId: floorPlans[0]?.id ?? null, content }) });
      return (await r.json()).layout.id as number;
    }, projectId);
    await openEditor(page, projectId, layoutId);
    const svg = (await page.locator('svg[aria-label^="Layout "]').boundingBox())!;
    const at = (fx: number, fy: number): [number, number] => [svg.x + svg.width * fx, svg.y + svg.height * fy];

    // Fence: three corners, Enter finishes; it starts at 2000 mm and takes the typed height.
    await page.getByRole('button', { name: 'Fence', exact: true }).click();
    for (const [fx, fy] of [[0.3, 0.3], [0.7, 0.3], [0.7, 0.7]]) await page.mouse.click(...at(fx, fy));
    await page.keyboard.press('Enter');
    const height = page.getByLabel('Fence height (mm)');
    expect(await height.inputValue()).toBe('2000');
    await height.fill('1200');
    await height.press('Tab');
    // Below the 1400 mm of ISO 10218-2 for perimeter guards: the analysis says so.
    await page.locator('[data-finding="fence-too-low:F1"]').waitFor();

    // Opening: two clicks near the fence's first run, snapped onto it.
    await page.getByRole('button', { name: 'Opening', exact: true }).click();
    await page.mouse.click(...at(0.4, 0.305));
    await page.mouse.click(...at(0.5, 0.295));
    await page.locator('path.boundary-line[data-boundary="O1"]').waitFor({ state: 'attached' });

    // Operator area: four corners, the last one double-clicked.
    await page.getByRole('button', { name: 'Operator area', exact: true }).click();
    for (const [fx, fy] of [[0.35, 0.45], [0.6, 0.45], [0.6, 0.6]]) await page.mouse.click(...at(fx, fy));
    await page.mouse.dblclick(...at(0.35, 0.6));
    await page.locator('path.boundary-area[data-kind="operator"][data-boundary="OP1"]').waitFor({ state: 'attached' });
    expect(await page.locator('text.boundary-label[data-boundary="OP1"]').textContent()).toMatch(/OPERATOR AREA/);

    const stored = async () =>
      page.evaluate(async (id) => (await (await fetch(`/api/layouts/${id}`)).json()).layout as { version: number; content: { boundaries: Array<{ id: string; kind: string; points: number[][]; height?: number; fenceId?: string }>; arms: Array<{ x: number }> } }, layoutId);
    await expect.poll(async () => (await stored()).content.boundaries.map((z) => z.id).sort(), { timeout: 10000 }).toEqual(['F1', 'O1', 'OP1']);
    const boundaries = (await stored()).content.boundaries;
    const fence = boundaries.find((z) => z.id === 'F1')!;
    const opening = boundaries.find((z) => z.id === 'O1')!;
    expect(fence.height).toBe(1200);
    expect(fence.points).toHaveLength(3);
    expect(opening.fenceId).toBe('F1');
    // Both ends lie on the fence's first run (horizontal on screen, so one plan y), between its corners.
    expect(opening.points[0][1]).toBeCloseTo(fence.points[0][1], 0);
    expect(opening.points[1][1]).toBeCloseTo(fence.points[0][1], 0);
    expect(boundaries.find((z) => z.id === 'OP1')!.points).toHaveLength(4);
    await page.locator('[data-save-state="saved"]').waitFor();

    // Someone else saves the layout; the next edit here meets a newer version.
    const theirs = await page.evaluate(async (id) => {
      const { layout } = await (await fetch(`/api/layouts/${id}`)).json();
      const r = await fetch(`/api/layouts/${id}`, { method: 'PUT', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ version: layout.version, name: 'Boundaries drawn by clicks (edited elsewhere)' }) });
      return r.status;
    }, layoutId);
    expect(theirs).toBe(200);
    await page.keyboard.press('Escape');
    await page.locator('g.arm-mark[data-arm="R1"] circle.arm-base').click();
    await page.keyboard.press('ArrowRight');
    const dialog = page.getByRole('dialog', { name: 'This cell layout was changed elsewhere' });
    await dialog.waitFor();
    expect(await page.locator('[data-layout-editor]').getAttribute('data-read-only')).toBe('true');
    await dialog.getByRole('button', { name: 'Keep mine as a copy' }).click();
    await page.waitForURL((u) => !u.pathname.endsWith(`/layouts/${layoutId}`) && /\/layouts\/\d+$/.test(u.pathname));
    const copyId = Number(page.url().split('/').pop());
    const copy = await page.evaluate(async (id) => (await (await fetch(`/api/layouts/${id}`)).json()).layout, copyId);
    expect(copy.name).toMatch(/\(my copy\)$/);
    expect(copy.content.arms[0].x).toBe(2510);
    expect(copy.content.boundaries).toHaveLength(3);
    // Theirs is untouched by my edit.
    expect((await stored()).content.arms[0].x).toBe(2500);
    await page.locator('[data-layout-editor]').waitFor();
    await page.screenshot({ path: path.join(SCREENS, 'layout-editor-boundaries.png') });
    await page.close();
  });

  it('adds a work point by clicking the plan, imports the demo CSV of work points and shows the coverage matrix', async () => {
    const page = await e.browser.newPage({ viewport: { width: 1440, height: 1300 } });
    await signInPage(page, e.server.url, PLANNER);
    const { projectId } = await demoLayout(page);
    const layoutId = await page.evaluate(async (pid) => {
      const { floorPlans } = await (await fetch(`/api/projects/${pid}/floor-plans`)).json();
      const { armModels } = await (await fetch('/api/arm-models')).json();
      const id = (n: string) => armModels.find((m: { name: string }) => m.name === n).id;
      // Arms named R1–R4 as in samples/work-points/fernhill-line3.csv (its assignedArm column)
      const content = {
        arms: [
          { id: 'R1', armModelId: id('Demo SCARA 600'), label: '', x: 11200, y: 7300, yaw: -90, mountHeight: 400 },
          { id: 'R2', armModelId: id('Demo SCARA 600'), label: '', x: 14600, y: 7300, yaw: -90, mountHeight: 400 },
          { id: 'R3', armModelId: id('Demo Articulated 1400'), label: '', x: 18100, y: 3300, yaw: 0, mountHeight: 0 },
          { id: 'R4', armModelId: id('Demo Palletizer 3100'), label: '', x: 20200, y: 8300, yaw: 90, mountHeight: 0 },
        ],
        workPoints: [],
        boundaries: [],
        workHeights: [900],
      };
      const r = await fetch(`/api/projects/${pid}/layouts`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ name: 'Points by CSV', floorPlanId: floorPlans[0]?.id ?? null, content }) });
      return (await r.json()).layout.id as number;
    }, projectId);
    await openEditor(page, projectId, layoutId);

    // The point tool: one click on the plan adds P1 at the first work height.
    await page.getByRole('button', { name: 'Work point', exact: true }).click();
    const svg = (await page.locator('svg[aria-label^="Layout "]').boundingBox())!;
    await page.mouse.click(svg.x + svg.width * 0.5, svg.y + svg.height * 0.5);
    await page.keyboard.press('Escape');
    await page.getByRole('tab', { name: 'Work points' }).click();
    const table = page.getByRole('table', { name: 'Work points' });
    await table.getByText('P1', { exact: true }).first().waitFor();

    // CSV import (replace all) from the demo sample: 34 points.
    await page.getByRole('button', { name: 'Import CSV…' }).click();
    await page.locator('input[type="file"]').setInputFiles(path.resolve('samples/work-points/fernhill-line3.csv'));
    await page.getByRole('table', { name: 'Preview of the rows to import' }).waitFor();
    await page.locator('input[name="import-mode"][value="replace"]').check();
    await page.getByRole('button', { name: /^Import 34 points/ }).click();
    // (the table draws only the rows in view) — the import is saved with the layout by autosave
    await expect
      .poll(async () => page.evaluate(async (id) => (await (await fetch(`/api/layouts/${id}`)).json()).layout.content.workPoints.length, layoutId), { timeout: 15_000 })
      .toBe(34);

    // The coverage matrix: 34 rows × 4 arms from the worker's analysis.
    await page.getByRole('tab', { name: 'Coverage' }).click();
    const matrix = page.getByRole('img', { name: /^Coverage of 34 work points by 4 arms/ });
    await matrix.waitFor({ state: 'attached' });
    await page.screenshot({ path: path.join(SCREENS, 'layout-editor-coverage.png'), fullPage: true });
    await expect.poll(async () => (await matrix.boundingBox())?.height ?? 0).toBeGreaterThan(50);
    expect((await matrix.boundingBox())!.width).toBeGreaterThan(100);
    await page.close();
  });
});
