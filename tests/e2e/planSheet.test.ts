// Plan sheet export in Chromium: the editor's export dialog renders on the server, previews page 1
// with pdfjs-dist in the browser, and downloads the PDF and the DXF.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SCREENS, signInPage, startE2e, type E2e } from '../support/e2e';

const PLANNER = 'planner@fernhill.test';
const DEMO_LAYOUT = 'Fernhill line 3 — cell layout';

let e: E2e;
beforeAll(async () => {
  e = await startE2e();
});
afterAll(async () => e?.close());

describe('plan sheet export in Chromium', () => {
  it('opens the export dialog on the demo layout, shows the preview and downloads a PDF and a DXF', async () => {
    const page = await e.browser.newPage({ viewport: { width: 1440, height: 1100 }, acceptDownloads: true });
    await signInPage(page, e.server.url, PLANNER);
    const { projectId, layoutId } = await page.evaluate(async (name) => {
      const { projects } = await (await fetch('/api/projects')).json();
      for (const p of projects) {
        const { layouts } = await (await fetch(`/api/projects/${p.id}/layouts`)).json();
        const l = layouts.find((x: { name: string }) => x.name === name);
        if (l) return { projectId: p.id as number, layoutId: l.id as number };
      }
      throw new Error('the demo layout was not seeded');
    }, DEMO_LAYOUT);
    await page.goto(`${e.server.url}/projects/${projectId}/layouts/${layoutId}`);
    await page.locator('[data-layout-editor]').waitFor();

    await page.getByRole('button', { name: 'Export plan sheet' }).click();
    const dialog = page.getByRole('dialog', { name: 'Export plan sheet' });
    await dialog.waitFor();
    await dialog.getByLabel('Paper size').selectOption('A3');
    await dialog.getByRole('button', { name: 'Render preview' }).click();
    const preview = dialog.getByLabel('Preview of sheet 1');
    await preview.and(page.locator('[data-preview-state="done"]')).waitFor({ timeout: 30_000 });
    // The preview canvas has ink on it (not a blank page): count non-white pixels in the browser.
    const inked = await preview.evaluate((c) => {
      const canvas = c as HTMLCanvasElement;
      const d = canvas.getContext('2d')!.getImageData(0, 0, canvas.width, canvas.height).data;
      let n = 0;
      for (let i = 0; i < d.length; i += 4) if (d[i] < 200 || d[i + 1] < 200 || d[i + 2] < 200) n++;
      return { n, total: d.length / 4, ratio: canvas.width / canvas.height };
    });
    expect(inked.n).toBeGreaterThan(inked.total * 0.01);
    // A3 landscape: 420 / 297.
    expect(inked.ratio).toBeCloseTo(420 / 297, 1);
    await expect(dialog.getByText(/Sheet 1 of \d+/).textContent()).resolves.toMatch(/Sheet 1 of [6-9]/);
    await page.screenshot({ path: path.join(SCREENS, 'plan-sheet-dialog.png') });

    const [download] = await Promise.all([page.waitForEvent('download'), dialog.getByRole('button', { name: 'Download', exact: true }).click()]);
    expect(download.suggestedFilename()).toMatch(/\.pdf$/);
    const file = await download.path();
    expect(readFileSync(file).subarray(0, 5).toString('latin1')).toBe('%PDF-');

    const [dxf] = await Promise.all([page.waitForEvent('download'), dialog.getByRole('button', { name: 'Download DXF' }).click()]);
    expect(dxf.suggestedFilename()).toMatch(/\.dxf$/);
    const text = readFileSync(await dxf.path(), 'utf8');
    expect(text).toContain('$INSUNITS');
    expect(text).toContain('RF_ARMS');
    await page.close();
  });
});
