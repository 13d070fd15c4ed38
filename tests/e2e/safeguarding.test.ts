// The opening inspector's safeguard fields in Chromium: on the seeded demo layout, the access
// opening's safeguard is removed and set again through the form, and the findings list follows.
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SCREENS, signInPage, startE2e, type E2e } from '../support/e2e';

let e: E2e;
beforeAll(async () => {
  e = await startE2e();
});
afterAll(async () => e?.close());

describe('safeguard of an access opening', () => {
  it('is set in the inspector, and the separation-distance finding follows', async () => {
    const page = await e.browser.newPage({ viewport: { width: 1440, height: 1100 } });
    await signInPage(page, e.server.url, 'planner@fernhill.test');
    const { projectId, layoutId } = await page.evaluate(async () => {
      const { projects } = await (await fetch('/api/projects')).json();
      for (const p of projects as Array<{ id: number }>) {
        const { layouts } = await (await fetch(`/api/projects/${p.id}/layouts`)).json();
        const l = (layouts as Array<{ id: number; name: string }>).find((x) => x.name === 'Fernhill line 3 — cell layout');
        if (l) return { projectId: p.id, layoutId: l.id };
      }
      throw new Error('no demo layout');
    });
    await page.goto(`${e.server.url}/projects/${projectId}/layouts/${layoutId}`);
    await page.locator('[data-layout-editor]').waitFor();
    await page.locator('[data-analysis-state="idle"]').waitFor();

    // The demo door is interlocked: the palletizer stands closer than S.
    const tooClose = page.locator('[data-finding="opening-too-close:O1+R4"]');
    await tooClose.waitFor();

    await page.locator('path.boundary-line[data-boundary="O1"]').dispatchEvent('click');
    const device = page.getByLabel('Safeguard', { exact: true });
    await device.waitFor();
    expect(await device.inputValue()).toBe('interlock');

    // No safeguard: the finding goes.
    await device.selectOption('');
    await expect.poll(async () => tooClose.count(), { timeout: 10000 }).toBe(0);

    // A light curtain, 14 mm resolution, 0.02 s response, category 0 stop. With the palletizer's
    // invented 1.1 s category 0 time, T = 1.12 s; ISO 13855: 2000 × 1.12 > 500 mm, so
    // S = 1600 mm/s × 1.12 s + 8 × (14 − 14) mm = 1792 mm.
    await device.selectOption('light-curtain');
    const response = page.getByLabel('Response time (s)');
    await response.fill('fast');
    await response.press('Enter');
    await page.getByText('Response time (s): enter a number').waitFor();
    await response.fill('0.02');
    await page.getByLabel('Stop category').selectOption('0');
    const resolution = page.getByLabel('Resolution (mm)');
    await resolution.fill('14');
    await resolution.press('Enter');
    await tooClose.waitFor();
    expect(await tooClose.textContent()).toMatch(/light curtain is \d+ mm from the restricted space of Palletizer; ISO 13855 asks for at least 1792 mm/);
    await page.screenshot({ path: path.join(SCREENS, 'safeguard-inspector.png') });

    // Saved with the layout.
    await expect
      .poll(
        async () =>
          page.evaluate(async (id) => {
            const { layout } = await (await fetch(`/api/layouts/${id}`)).json();
            return layout.content.boundaries.find((z: { id: string }) => z.id === 'O1').safeguard ?? null;
          }, layoutId),
        { timeout: 10000 },
      )
      .toEqual({ device: 'light-curtain', responseTimeS: 0.02, stopCategory: 0, resolutionMm: 14, approach: 'normal' });
    await page.close();
  });
});
