import { readFileSync } from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SCREENS, signInPage, startE2e, type E2e } from '../support/e2e';

const SAMPLE = path.resolve('samples/floor-plans/fernhill-hall.dxf');
const PLANNER = 'planner@fernhill.test';
const DEMO_PROJECT = 'Line 3 end-of-line cell';

let e: E2e;
beforeAll(async () => {
  e = await startE2e();
});
afterAll(async () => e?.close());

async function openDemoProject(page: Page): Promise<void> {
  await page.goto(`${e.server.url}/projects`);
  await page.getByRole('link', { name: DEMO_PROJECT }).first().click();
  await page.getByRole('heading', { name: 'Floor plans' }).waitFor();
}

/** The preview's own numbers, read from the DOM the browser laid out. */
async function previewFacts(page: Page) {
  return page.locator('svg[aria-label^="Preview of"]').evaluate((svg) => {
    const paths = [...svg.querySelectorAll<SVGPathElement>('g.plan-static path.plan-lines')];
    const bar = svg.querySelector<SVGGElement>('g.plan-scale-bar')!;
    const barLine = bar.querySelector<SVGPathElement>('path')!;
    const outline = svg.querySelector<SVGGElement>('g.plan-layer[data-layer="OUTLINE"]')!;
    const svgBox = svg.getBoundingClientRect();
    const outlineBox = outline.getBoundingClientRect();
    return {
      layers: paths.map((p) => p.closest('g')!.getAttribute('data-layer')),
      features: paths.reduce((n, p) => n + Number(p.getAttribute('data-features')), 0),
      nonEmptyPaths: paths.filter((p) => (p.getAttribute('d') ?? '').length > 10).length,
      barLabel: bar.querySelector('text')!.textContent,
      barMetres: Number(bar.getAttribute('data-metres')),
      barPx: barLine.getBBox().width,
      outlinePx: { width: outlineBox.width, height: outlineBox.height },
      inside:
        outlineBox.left >= svgBox.left - 1 &&
        outlineBox.right <= svgBox.right + 1 &&
        outlineBox.top >= svgBox.top - 1 &&
        outlineBox.bottom <= svgBox.bottom + 1,
    };
  });
}

describe('floor plans in Chromium', () => {
  it('uploads the demo hall, previews it to scale, saves a layer role across a reload', async () => {
    const page = await e.browser.newPage({ viewport: { width: 1440, height: 1000 } });
    await signInPage(page, e.server.url, PLANNER);
    await openDemoProject(page);

    await page.locator('input[type="file"]').setInputFiles(SAMPLE);
    await page.waitForURL(/\/projects\/\d+\/floor-plans\/\d+$/);
    await page.getByRole('heading', { name: 'fernhill-hall.dxf' }).waitFor();
    await page.locator('g.plan-static path.plan-lines').first().waitFor({ state: 'attached' });

    // The importer's note about the skipped hatch is listed plainly.
    await expect.poll(() => page.getByRole('region', { name: /notes from reading/i }).textContent()).toMatch(/HATCH/);
    // Units came from the header ($INSUNITS 4 = millimetres, DXF reference HEADER section).
    expect(await page.getByLabel('Drawing unit').inputValue()).toBe('mm');
    expect(await page.locator('[data-units-source]').getAttribute('data-units-source')).toBe('header');

    const facts = await previewFacts(page);
    expect(facts.layers).toEqual(expect.arrayContaining(['OUTLINE', 'WALLS', 'COLUMNS', 'MACHINES']));
    expect(facts.features).toBeGreaterThan(10);
    expect(facts.nonEmptyPaths).toBe(facts.layers.length - (facts.layers.includes('TEXT') ? 1 : 0));
    expect(facts.barLabel).toMatch(/^\d+(\.\d+)? m$/);
    expect(facts.inside).toBe(true);
    // Scale check: the hall outline is 24 m × 16 m in the sample (samples/make-samples.ts); at the
    // scale bar's px per metre the outline's screen box must be 24 × and 16 × that, within the
    // stroke width (2 px). The browser's own layout (getBoundingClientRect) is the measure.
    const pxPerMetre = facts.barPx / facts.barMetres;
    expect(Math.abs(facts.outlinePx.width - 24 * pxPerMetre)).toBeLessThan(3);
    expect(Math.abs(facts.outlinePx.height - 16 * pxPerMetre)).toBeLessThan(3);

    // Zooming in by keyboard shortens the scale bar's step or lengthens its bar; the outline grows.
    await page.locator('svg[aria-label^="Preview of"]').focus();
    await page.keyboard.press('+');
    await page.keyboard.press('+');
    await expect.poll(async () => (await previewFacts(page)).outlinePx.width).toBeGreaterThan(facts.outlinePx.width * 2);
    const zoomed = await previewFacts(page);
    expect(zoomed.barPx / zoomed.barMetres).toBeGreaterThan(pxPerMetre * 2);
    await page.keyboard.press('0');
    await expect.poll(async () => Math.round((await previewFacts(page)).outlinePx.width)).toBe(Math.round(facts.outlinePx.width));

    // The cursor read-out is in plan mm with y north: the top edge of the outline is near y = 16 000.
    const box = (await page.locator('g.plan-layer[data-layer="OUTLINE"]').boundingBox())!;
    await page.mouse.move(box.x + box.width / 2, box.y + 1);
    const readout = (await page.getByLabel('Pointer position').textContent()) ?? '';
    const y = Number(/y ([\d\s\u00a0\u202f,.]+) mm/.exec(readout)?.[1].replace(/[^\d]/g, ''));
    expect(Math.abs(y - 16_000)).toBeLessThan(200);

    // Change one layer's role; it is saved (reload shows it still changed).
    const saved = page.waitForResponse((r) => r.request().method() === 'PATCH' && r.url().includes('/api/floor-plans/'));
    await page.getByLabel('Role of layer DOORS').selectOption('obstacle');
    expect((await saved).status()).toBe(200);
    await page.getByLabel('Height of layer DOORS in mm').waitFor();
    await page.reload();
    await page.getByLabel('Role of layer DOORS').waitFor();
    expect(await page.getByLabel('Role of layer DOORS').inputValue()).toBe('obstacle');

    await page.locator('g.plan-static path.plan-lines').first().waitFor({ state: 'attached' });
    await page.mouse.move(box.x + box.width * 0.3, box.y + box.height * 0.4);
    await page.screenshot({ path: path.join(SCREENS, 'floor-plan-planner.png'), fullPage: true });

    // Hiding a layer is view-only: its group is hidden and no change is sent.
    let patches = 0;
    page.on('request', (r) => {
      if (r.method() === 'PATCH') patches += 1;
    });
    await page.getByLabel('Show layer TEXT').uncheck();
    expect(await page.locator('g.plan-layer[data-layer="TEXT"]').getAttribute('display')).toBe('none');
    expect(patches).toBe(0);

    // Reading the drawing in centimetres makes it ten times larger: 240 m × 160 m, refitted.
    const rescaled = page.waitForResponse((r) => r.request().method() === 'PATCH' && r.url().includes('/api/floor-plans/'));
    await page.getByLabel('Drawing unit').selectOption('cm');
    expect((await rescaled).status()).toBe(200);
    await expect.poll(() => page.getByText(/240 m × 160 m/).count()).toBeGreaterThan(0);
    expect(await page.locator('[data-units-source]').getAttribute('data-units-source')).toBe('chosen');
    const cm = await previewFacts(page);
    expect(cm.inside).toBe(true);
    expect(Math.abs(cm.outlinePx.width - facts.outlinePx.width)).toBeLessThan(3);
    expect(cm.barPx / cm.barMetres).toBeCloseTo(pxPerMetre / 10, 6);
    expect(await page.getByLabel('Role of layer DOORS').inputValue()).toBe('obstacle');
    await page.close();
  });

  it('shows the server\u2019s own message when the upload is not a DXF drawing', async () => {
    const page = await e.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signInPage(page, e.server.url, PLANNER);
    await openDemoProject(page);
    await page.locator('input[type="file"]').setInputFiles({
      name: 'shopping-list.dxf',
      mimeType: 'application/dxf',
      buffer: Buffer.from('eggs\nflour\nbutter\nsugar\n'),
    });
    const alert = page.getByRole('alert').filter({ hasText: 'could not be imported' });
    await alert.waitFor();
    expect(await alert.textContent()).toMatch(/not a DXF drawing/i);
    expect(page.url()).not.toMatch(/floor-plans\/\d+/);
    await page.screenshot({ path: path.join(SCREENS, 'floor-plan-upload-error.png'), fullPage: true });
    await page.close();
  });

  it('shows the upload\u2019s progress as a percentage bar, then the server\u2019s answer', async () => {
    const page = await e.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signInPage(page, e.server.url, PLANNER);
    await openDemoProject(page);
    // Slow the upload (Chromium's network emulation) and send 2 MB so the steps can be watched;
    // the body is plain text, so the server answers that it is not a DXF drawing.
    const cdp = await page.context().newCDPSession(page);
    await cdp.send('Network.enable');
    await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 20, downloadThroughput: 10e6, uploadThroughput: 1e6 });
    // Record every state the upload shows, in the page itself (a MutationObserver), so no step
    // is missed between two looks from the test.
    await page.evaluate(() => {
      const w = window as unknown as { __seen: { values: number[]; reading: boolean } };
      w.__seen = { values: [], reading: false };
      new MutationObserver(() => {
        const bar = document.querySelector('[role="progressbar"][aria-label="Upload"]');
        if (bar) w.__seen.values.push(Number(bar.getAttribute('aria-valuenow')));
        if (document.body.textContent?.includes('Reading the drawing…')) w.__seen.reading = true;
      }).observe(document.body, { subtree: true, childList: true, attributes: true, characterData: true });
    });
    await page.locator('input[type="file"]').setInputFiles({
      name: 'big-notes.dxf',
      mimeType: 'application/dxf',
      buffer: Buffer.from('a line of notes that is not a drawing\n'.repeat(55_000)),
    });
    await page.getByRole('alert').filter({ hasText: 'could not be imported' }).waitFor({ timeout: 30_000 });
    await cdp.detach();
    const seen = await page.evaluate(() => (window as unknown as { __seen: { values: number[]; reading: boolean } }).__seen);
    expect(seen.values.some((v) => v > 0 && v < 100)).toBe(true);
    expect(Math.max(...seen.values)).toBe(100);
    expect(seen.reading).toBe(true);
    expect(await page.getByRole('alert').filter({ hasText: 'could not be imported' }).textContent()).toMatch(/not a DXF drawing/i);
    await page.close();
  });

  it('lets the reviewer read a plan but not change roles or upload', async () => {
    const page = await e.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signInPage(page, e.server.url, 'reviewer@fernhill.test');
    await openDemoProject(page);
    expect(await page.locator('input[type="file"]').count()).toBe(0);
    await page.getByRole('link', { name: 'fernhill-hall.dxf' }).first().click();
    await page.getByRole('table', { name: 'Layers' }).waitFor();
    expect(await page.getByLabel('Role of layer WALLS').count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Delete' }).count()).toBe(0);
    await page.getByRole('link', { name: 'Download original' }).waitFor();
    await page.close();
  });

  it('flags a drawing whose header names the wrong unit, and reads it in the fitting unit in one click', async () => {
    // the inch sample with its $INSUNITS set to 4 (millimetres): a 24 m hall then reads 0.94 m wide
    const text = readFileSync(path.resolve('samples/floor-plans/fernhill-hall-inches.dxf'), 'utf8').replace(/(\$INSUNITS\n\s*70\n)\s*1\n/, '$1     4\n');
    expect(text).not.toBe(readFileSync(path.resolve('samples/floor-plans/fernhill-hall-inches.dxf'), 'utf8'));
    const page = await e.browser.newPage({ viewport: { width: 1440, height: 1000 } });
    await signInPage(page, e.server.url, PLANNER);
    await openDemoProject(page);
    await page.locator('input[type="file"]').setInputFiles({ name: 'hall-wrong-unit.dxf', mimeType: 'application/dxf', buffer: Buffer.from(text) });
    await page.waitForURL(/\/projects\/\d+\/floor-plans\/\d+$/);
    const check = page.getByRole('region', { name: 'Drawing unit check' });
    await check.waitFor();
    expect(await check.textContent()).toMatch(/0\.94 m wide read in millimetres.*in inches it would be 24 m/);
    await page.locator('g.plan-static path.plan-lines').first().waitFor({ state: 'attached' });
    await page.screenshot({ path: path.join(SCREENS, 'floor-plan-wrong-unit.png'), fullPage: true });

    await page.getByRole('button', { name: 'Read in inches' }).click();
    await check.waitFor({ state: 'detached' });
    expect(await page.getByLabel('Drawing unit').inputValue()).toBe('in');
    await page.getByRole('heading', { name: 'hall-wrong-unit.dxf' }).waitFor();
    await page.getByText(/Floor plan · 24\.0 m × 16\.0 m/).waitFor();

    await page.getByRole('button', { name: 'Save these roles for this project' }).click();
    await page.getByText(/^Saved: the next drawing/).waitFor();
    await page.close();
  });
});
