// What a planner reads on screen and in exports, in Chromium: the editor's key explains every mark,
// an empty findings list names the checks it ran, and the work-point CSV opens with what it is,
// its state, its date and the cautions. The product's own words; no outside source applies.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CAUTIONS } from '@shared/safety';
import { SCREENS, signInPage, startE2e, type E2e } from '../support/e2e';

const PLANNER = 'planner@fernhill.test';
const DEMO_PROJECT = 'Line 3 end-of-line cell';

let e: E2e;
beforeAll(async () => {
  e = await startE2e();
});
afterAll(async () => e?.close());

/** Makes a cell layout in the demo project through the page's session; returns its ids. */
async function makeLayout(page: Page, name: string, farArms: boolean, farPoints = 0): Promise<{ projectId: number; layoutId: number }> {
  return page.evaluate(
    async ({ projectName, layoutName, withArms, far }) => {
      const { projects } = await (await fetch('/api/projects')).json();
      const project = projects.find((p: { name: string }) => p.name === projectName);
      const { armModels } = await (await fetch('/api/arm-models')).json();
      const arm = (id: string, x: number) => ({ id, armModelId: armModels[0].id, label: '', x, y: 0, yaw: 0, mountHeight: 0 });
      const content = {
        arms: withArms ? [arm('R1', 0), arm('R2', 40_000)] : [],
        workPoints: [
          ...(withArms ? [{ id: 'P1', x: 300, y: 0, z: 0, approach: 'any', tag: '' }] : []),
          // Points no arm reaches, each its own finding.
          ...Array.from({ length: far }, (_, i) => ({ id: `Q${i + 1}`, x: 100_000 + i * 100, y: 50_000, z: 0, approach: 'any', tag: '' })),
        ],
        boundaries: [],
        workHeights: [],
      };
      const r = await fetch(`/api/projects/${project.id}/layouts`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ name: layoutName, floorPlanId: null, content }),
      });
      if (!r.ok) throw new Error(`create layout: ${r.status} ${await r.text()}`);
      return { projectId: project.id, layoutId: (await r.json()).layout.id };
    },
    { projectName: DEMO_PROJECT, layoutName: name, withArms: farArms, far: farPoints },
  );
}

async function openEditor(page: Page, projectId: number, layoutId: number) {
  await page.goto(`${e.server.url}/projects/${projectId}/layouts/${layoutId}`);
  await page.locator('[data-layout-editor]').waitFor();
  await page.locator('[data-analysis-state="idle"]').waitFor();
}

describe('readable outputs in Chromium', () => {
  it('the key explains every mark; an empty findings list says what was checked or what to add; the CSV carries its notes', async () => {
    const page = await e.browser.newPage({ viewport: { width: 1440, height: 1000 }, acceptDownloads: true });
    await signInPage(page, e.server.url, PLANNER);

    const far = await makeLayout(page, 'Two arms far apart', true);
    await openEditor(page, far.projectId, far.layoutId);
    // The key opens from the keyboard.
    await page.locator('[data-plan-key] summary').focus();
    await page.keyboard.press('Enter');
    const key = page.getByRole('list', { name: 'Key to the plan' });
    await key.waitFor();
    const rows = await key.getByRole('listitem').allInnerTexts();
    for (const want of ['Shared zone (two arms overlap)', 'Restricted space', 'Keep-out', 'Work point no arm reaches', 'Plan north (+y) is up']) {
      expect(rows.some((r) => r.includes(want)), want).toBe(true);
    }
    expect(await page.locator('[data-key-swatch]').count()).toBeGreaterThanOrEqual(11);
    const empty = page.locator('[data-no-findings]');
    await empty.waitFor();
    const sentence = await empty.innerText();
    expect(sentence).toMatch(/^No findings from the checks run on this cell layout: every work point reached by an arm/);
    expect(sentence).toContain('shared zones of every pair of arms');
    await page.screenshot({ path: path.join(SCREENS, 'editor-key-no-findings.png') });

    // The work-point CSV: notes first, then the columns with their units.
    await page.getByRole('tab', { name: 'Work points' }).click();
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Export CSV' }).click()]);
    const text = readFileSync((await download.path())!, 'utf8').replace(/^\uFEFF/, '');
    const lines = text.split('\r\n');
    expect(lines[0]).toMatch(/^"# Ringfence work points · cell layout Two arms far apart · Working copy \(not a revision\) · exported \d{4}-\d\d-\d\d \d\d:\d\d UTC"$/);
    for (const c of CAUTIONS) expect(text).toContain(`"# ${c}"`);
    expect(lines.find((l) => l.startsWith('id,'))).toBe('id,x (mm),y (mm),z (mm above floor),approach (top/any),tag,assignedArm,margin R1 (mm),margin R2 (mm)');

    const blank = await makeLayout(page, 'Nothing yet', false);
    await openEditor(page, blank.projectId, blank.layoutId);
    expect(await page.locator('[data-no-findings]').innerText()).toBe('Nothing to check yet: place an arm or add work points, and the checks run as you edit.');
    // A long list shows a page at a time.
    const many = await makeLayout(page, 'Many unreached points', true, 250);
    // Zooms below take effect at once (no animation), so the canvas is read after them.
    await page.emulateMedia({ reducedMotion: 'reduce' });
    await openEditor(page, many.projectId, many.layoutId);
    await page.locator('[data-more-findings]').waitFor();
    expect(await page.locator('[data-kind="unreached-point"]').count()).toBe(200);
    expect(await page.locator('[data-more-findings]').innerText()).toBe('Show 50 more (50 not shown)');
    await page.locator('[data-more-findings]').click();
    await page.locator('[data-more-findings]').waitFor({ state: 'detached' });
    expect(await page.locator('[data-kind="unreached-point"]').count()).toBe(250);
    // …and the plan paints each of them as a red cross on its canvas layer, P1 (reached) in ink.
    const crosses = page.locator('[data-canvas-layer="layout-points"] canvas');
    expect(await crosses.getAttribute('data-unreached')).toBe('250');
    expect(await crosses.getAttribute('data-reached')).toBe('1');
    // The far points lie outside the fitted view: zoom out (to the limit) until they show, then read
    // the pixels at the crosses' centres.
    await page.locator('svg[aria-label^="Layout "]').focus();
    for (let i = 0; i < 8; i++) await page.keyboard.press('-');
    const seen = await crosses.evaluate((canvas: HTMLCanvasElement) => {
      const [tx, ty, k] = /translate\(([^,]+),([^)]+)\) scale\(([^)]+)\)/
        .exec(document.querySelector('g.plan-viewport')!.getAttribute('transform')!)!
        .slice(1)
        .map(Number);
      const ratio = canvas.width / canvas.clientWidth;
      const ctx = canvas.getContext('2d')!;
      const probe = document.createElement('span');
      document.body.append(probe);
      const rgb = (css: string) => {
        probe.style.color = css;
        return getComputedStyle(probe).color.match(/\d+/g)!.slice(0, 3).map(Number);
      };
      const want = { red: rgb('var(--color-finding-critical)'), ink: rgb('var(--color-ink)') };
      probe.remove();
      // The most opaque pixel around a plan point's screen position: [r, g, b, a], or null off the canvas.
      const at = (x: number, y: number) => {
        const sx = Math.round((tx + k * x) * ratio);
        const sy = Math.round((ty - k * y) * ratio);
        if (sx < 1 || sy < 1 || sx >= canvas.width - 1 || sy >= canvas.height - 1) return null;
        const d = ctx.getImageData(sx - 1, sy - 1, 3, 3).data;
        let best = 0;
        for (let i = 4; i < d.length; i += 4) if (d[i + 3] > d[best + 3]) best = i;
        return [...d.slice(best, best + 4)];
      };
      const is = (px: number[] | null, colour: number[]) => px !== null && px[3] >= 200 && colour.every((c, i) => Math.abs(px[i] - c) <= 40);
      const far = Array.from({ length: 250 }, (_, i) => at(100_000 + i * 100, 50_000));
      return {
        redCentres: far.filter((px) => is(px, want.red)).length,
        p1Ink: is(at(300, 0), want.ink),
        // Halfway between the arms and the far points nothing is painted.
        emptyAlpha: at(60_000, 25_000)?.[3] ?? -1,
      };
    });
    expect(seen).toEqual({ redCentres: 250, p1Ink: true, emptyAlpha: 0 });
    await page.close();
  }, 120_000);
});
