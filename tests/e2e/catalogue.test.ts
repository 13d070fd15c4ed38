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

  it('the planner duplicates a built-in model, lengthens the upper arm and sees the plotted max reach grow', async () => {
    const page = await e.browser.newPage({ viewport: { width: 1400, height: 1000 } });
    await signInPage(page, e.server.url, 'planner@fernhill.test');
    await page.goto(`${e.server.url}/catalogue`);
    await page.getByRole('link', { name: 'Demo Six-Axis 2000' }).click();
    await page.getByTestId('max-reach').waitFor();
    // Built-in: read-only, with a way to a copy of one's own.
    expect(await page.getByLabel('Model name').isDisabled()).toBe(true);
    await page.getByRole('button', { name: 'Duplicate' }).click();
    await page.waitForURL((u) => /\/catalogue\/\d+$/.test(u.pathname) && !u.pathname.endsWith('/1'));
    await expect.poll(() => page.getByLabel('Model name').inputValue()).toBe('Demo Six-Axis 2000 (copy)');
    const before = await plottedMaxReach(page);
    expect(before).toBeGreaterThan(1000);

    // The upper arm of this chain is the a of row J2 (900 mm): make it 300 mm longer.
    const upperArm = page.getByLabel('J2 a', { exact: true });
    await upperArm.fill('1200');
    await expect.poll(() => plottedMaxReach(page), { timeout: 10_000 }).toBeGreaterThan(before + 200);
    const after = await plottedMaxReach(page);
    // A longer upper arm adds at most its own extra length to the reach (triangle inequality).
    expect(after).toBeLessThanOrEqual(before + 300 + 70);

    // An invalid entry names the field and keeps the last valid profile on screen.
    await upperArm.fill('long');
    await page.getByText('a must be a finite number').first().waitFor();
    await page.getByText('Showing the last valid profile').waitFor();
    await upperArm.fill('1200');

    // Pose panel: the tool point follows J2; beyond a limit the pose is reported as unreachable.
    const tool = page.getByTestId('tool-point');
    const toolBefore = await tool.textContent();
    await page.getByLabel('J2', { exact: true }).fill('30');
    await expect.poll(() => tool.textContent()).not.toBe(toolBefore);
    await page.screenshot({ path: path.join(SCREENS, 'catalogue-model-edit.png'), fullPage: true });
    await page.getByLabel('J2', { exact: true }).fill('170');
    await page.getByText('This pose cannot be reached.').waitFor();
    expect(await page.locator('g.pose-greyed').count()).toBe(1);
    await page.screenshot({ path: path.join(SCREENS, 'catalogue-pose-unreachable.png'), fullPage: true });

    await page.getByRole('button', { name: 'Save model' }).click();
    await page.getByText('Saved.').waitFor();
    await page.goto(`${e.server.url}/catalogue`);
    await page.getByRole('link', { name: 'Demo Six-Axis 2000 (copy)' }).waitFor();
    await page.screenshot({ path: path.join(SCREENS, 'catalogue-list.png'), fullPage: true });
    await page.close();
  });
});
