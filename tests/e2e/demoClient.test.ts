// The demo as its client first sees it, in Chromium: signed in, the client opens the demo project,
// finds the released revision B the seed stored (revision A, returned for changes, stays hidden),
// reads its plan sheet in the page and downloads the same bytes the release stored.
import { createHash } from 'node:crypto';
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Revision } from '../../backend/src/models';
import { SCREENS, signInPage, startE2e, type E2e } from '../support/e2e';

const CLIENT = 'client@fernhill.test';
const DEMO_PROJECT = 'Line 3 end-of-line cell';

let e: E2e;
beforeAll(async () => {
  e = await startE2e();
});
afterAll(async () => e?.close());

describe('the demo client in Chromium', () => {
  it('sees the released revision B of the demo on first sign-in, reads and downloads its plan sheet', async () => {
    const stored = (await Revision.findOne({ where: { letter: 'B', state: 'released' } }))!;
    expect(stored.planSheetChecksum).toMatch(/^[0-9a-f]{64}$/);

    const page = await e.browser.newPage({ viewport: { width: 1280, height: 1000 }, acceptDownloads: true });
    await signInPage(page, e.server.url, CLIENT);
    await page.getByRole('link', { name: DEMO_PROJECT }).first().click();
    const table = page.getByRole('table', { name: 'Revisions' });
    await table.waitFor();
    // Only what was released reaches the client: B, not the returned A.
    await expect.poll(() => table.locator('[data-revision]').evaluateAll((rows) => rows.map((r) => r.getAttribute('data-revision')))).toEqual(['B']);
    await table.locator('[data-revision="B"] [data-revision-state="released"]').waitFor();
    await page.screenshot({ path: path.join(SCREENS, 'demo-client-project.png'), fullPage: true });

    await table.getByRole('link', { name: 'Revision B' }).click();
    // The stored sheet is drawn in the page, sheet by sheet.
    await page.locator('[data-sheet-state="done"]').waitFor({ timeout: 30_000 });
    await expect.poll(() => page.locator('[data-sheet-state]').textContent()).toMatch(/Sheet 1 of \d+/);
    await page.screenshot({ path: path.join(SCREENS, 'demo-client-sheet.png'), fullPage: true });

    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Download the plan sheet (PDF)' }).click()]);
    expect(download.suggestedFilename()).toMatch(/revision-B\.pdf$/);
    const bytes = await readFile((await download.path())!);
    expect(bytes.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(createHash('sha256').update(bytes).digest('hex')).toBe(stored.planSheetChecksum);
    await page.close();
  });
});
