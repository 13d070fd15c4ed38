import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SCREENS, signInPage, startE2e, type E2e } from '../support/e2e';

let e: E2e;
beforeAll(async () => {
  e = await startE2e();
});
afterAll(async () => e?.close());

/** The max reach the profile plot shows, mm (from its text read-out under the drawing). */
async function plottedMaxReach(page: Page): Promise<number> {
  const text = (await page.getByTestId('max-reach').textContent()) ?? '';
  return Number(text.replace(/[^\d.]/g, ''));
}

describe('arm catalogue in Chromium', () => {
  it('lists the built-in models; a reviewer reads a model but cannot edit or duplicate it', async () => {
    const page = await e.browser.newPage({ viewport: { width: 1400, height: 1000 } });
    await signInPage(page, e.server.url, 'reviewer@fernhill.test');
    await page.getByRole('link', { name: 'Arm catalogue' }).click();
    await page.getByRole('table', { name: 'Arm models' }).waitFor();
    expect(await page.getByRole('button', { name: 'New model' }).count()).toBe(0);
    await page.getByRole('link', { name: 'Demo Six-Axis 2000' }).click();
    await page.getByTestId('max-reach').waitFor();
    expect(await page.getByLabel('Model name').isDisabled()).toBe(true);
    expect(await page.getByRole('button', { name: 'Duplicate' }).count()).toBe(0);
    await page.close();
  });

  it('the planner duplicates Demo Articulated 1400, lengthens the upper arm and sees the plotted max reach grow', async () => {
    const page = await e.browser.newPage({ viewport: { width: 1400, height: 1000 } });
    await signInPage(page, e.server.url, 'planner@fernhill.test');
    await page.goto(`${e.server.url}/catalogue`);
    await page.getByRole('link', { name: 'Demo Articulated 1400' }).click();
    await page.getByTestId('max-reach').waitFor();
    // Built-in: read-only, with a way to a copy of one's own.
    expect(await page.getByLabel('Upper arm (mm)').isDisabled()).toBe(true);
    await page.screenshot({ path: path.join(SCREENS, 'catalogue-built-in.png'), fullPage: true });
    await page.getByRole('button', { name: 'Duplicate' }).click();
    await expect.poll(() => page.getByLabel('Model name').inputValue(), { timeout: 10_000 }).toBe('Demo Articulated 1400 (copy)');
    const before = await plottedMaxReach(page);
    expect(before).toBeGreaterThan(1000);

    const upperArm = page.getByLabel('Upper arm (mm)');
    const upper = Number(await upperArm.inputValue());
    await upperArm.fill(String(upper + 300));
    await expect.poll(() => plottedMaxReach(page), { timeout: 10_000 }).toBeGreaterThan(before + 150);
    const after = await plottedMaxReach(page);
    // A longer upper arm adds at most its own extra length to the reach (triangle inequality), plus the boundary tolerance.
    expect(after).toBeLessThanOrEqual(before + 300 + 5);

    // An invalid entry names the field by its label (and unit) and keeps the last valid profile on screen.
    await upperArm.fill('long');
    await page.getByText('Upper arm must be a number').first().waitFor();
    await page.getByText('Showing the last valid profile').waitFor();
    await upperArm.fill(String(upper + 300));
    await page.getByText('Showing the last valid profile').waitFor({ state: 'detached' });
    expect(await plottedMaxReach(page)).toBe(after);
    const stopTime = page.getByLabel('Stop time, category 0 (s)');
    const stopBefore = await stopTime.inputValue();
    await stopTime.fill('0');
    await page.getByText('Stop time (category 0) must be greater than 0 s').waitFor();
    const j1Max = page.getByLabel('J1 max', { exact: true });
    const j1MaxBefore = await j1Max.inputValue();
    await j1Max.fill('-999');
    await page.getByText('J1 max must be at least −720°').waitFor();
    // No message on the form shows a property name or a field path.
    const alerts = await page.getByRole('alert').allTextContents();
    expect(alerts.length).toBeGreaterThanOrEqual(2);
    for (const text of alerts) expect(text).not.toMatch(/\b[a-z]+[A-Z]\w*\b|\b[A-Za-z_]\w*\.(?:[A-Za-z_]\w*|\d+\b)/);
    await stopTime.fill(stopBefore);
    await j1Max.fill(j1MaxBefore);
    await page.getByText('Stop time (category 0) must be greater than 0 s').waitFor({ state: 'detached' });

    // Pose panel: the tool point follows J2; beyond a limit the pose is reported and drawn greyed.
    const tool = page.getByTestId('tool-point');
    const toolBefore = await tool.textContent();
    await page.getByLabel('J2', { exact: true }).fill('20');
    await expect.poll(() => tool.textContent()).not.toBe(toolBefore);
    await page.screenshot({ path: path.join(SCREENS, 'catalogue-model-edit.png'), fullPage: true });
    await page.getByLabel('J2', { exact: true }).fill('720');
    await page.getByText('This pose cannot be reached.').waitFor();
    expect(await page.locator('g.pose-greyed').count()).toBe(1);
    await page.screenshot({ path: path.join(SCREENS, 'catalogue-pose-unreachable.png'), fullPage: true });

    // the whole-arm envelope is the second outline, with its legend; a wider upper arm grows it
    await page.locator('.legend-envelope').waitFor();
    const envelopeBefore = await page.locator('path.envelope').getAttribute('d');
    expect(envelopeBefore?.length ?? 0).toBeGreaterThan(10);
    await page.getByLabel('Upper arm radius (mm)').fill('400');
    await expect.poll(() => page.locator('path.envelope').getAttribute('d'), { timeout: 10_000 }).not.toBe(envelopeBefore);
    await page.getByRole('button', { name: 'Save model' }).click();
    await page.getByText('Saved.').waitFor();
    await page.goto(`${e.server.url}/catalogue`);
    await page.getByRole('link', { name: 'Demo Articulated 1400 (copy)' }).waitFor();
    await page.screenshot({ path: path.join(SCREENS, 'catalogue-list.png'), fullPage: true });
    await page.close();
  });

  it('a new linkage model shows its four-bar and Grashof class; a DH chain edits its table', async () => {
    const page = await e.browser.newPage({ viewport: { width: 1400, height: 1000 } });
    await signInPage(page, e.server.url, 'planner@fernhill.test');
    await page.goto(`${e.server.url}/catalogue`);
    await page.getByRole('button', { name: 'New model' }).click();
    await page.getByLabel('Kinematic family').selectOption('linkage');
    await page.getByTestId('max-reach').waitFor();
    // Default drive: crank 300, coupler 1160, rocker 320, ground 1150 mm: s + l = 1460 ≤ p + q = 1470 with the
    // crank shortest → crank-rocker (Grashof condition, docs/sources.md "Four-bar linkage") [derived].
    await expect.poll(() => page.getByTestId('grashof-class').textContent()).toMatch(/^crank-rocker/);
    // A coupler of 1100 mm makes s + l = 1450 > 1420: no link turns fully.
    await page.getByLabel('Coupler (mm)').fill('1100');
    await expect.poll(() => page.getByTestId('grashof-class').textContent()).toMatch(/^triple rocker/);
    await page.screenshot({ path: path.join(SCREENS, 'catalogue-new-linkage.png'), fullPage: true });

    await page.getByLabel('Kinematic family').selectOption('chain');
    await page.getByTestId('max-reach').waitFor();
    const before = await plottedMaxReach(page);
    await page.getByLabel('J3 a', { exact: true }).fill('800');
    await expect.poll(() => plottedMaxReach(page), { timeout: 10_000 }).toBeGreaterThan(before + 200);
    await page.getByLabel('Model name').fill('Fernhill trial chain');
    await page.getByRole('button', { name: 'Create model' }).click();
    await page.waitForURL(/\/catalogue\/\d+$/);
    await expect.poll(() => page.getByRole('heading', { level: 1 }).textContent()).toBe('Fernhill trial chain');
    await page.close();
  });
});
