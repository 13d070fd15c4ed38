// Review and release in Chromium: reviewer sends back with a comment on a finding, planner resubmits,
// reviewer signs off, planner releases, the client downloads the sheet and acknowledges it. The demo
// layout already holds revisions A (returned for changes) and B (released), so this round is C and D.
import { createHash } from 'node:crypto';
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MailMessage, Revision } from '../../backend/src/models';
import { SCREENS, signInPage, startE2e, type E2e } from '../support/e2e';

const PLANNER = 'planner@fernhill.test';
const REVIEWER = 'reviewer@fernhill.test';
const CLIENT = 'client@fernhill.test';
const DEMO_PROJECT = 'Line 3 end-of-line cell';
// The letters this test's two submissions get after the demo's A and B.
const FIRST = 'C';
const SECOND = 'D';

let e: E2e;
beforeAll(async () => {
  e = await startE2e();
});
afterAll(async () => e?.close());

const shot = (page: Page, name: string) => page.screenshot({ path: path.join(SCREENS, `review-${name}.png`), fullPage: true });

/** The demo project's first layout, through the page's own session. */
async function demoLayout(page: Page): Promise<{ projectId: number; layoutId: number }> {
  return page.evaluate(async (projectName) => {
    const { projects } = await (await fetch('/api/projects')).json();
    const project = projects.find((p: { name: string }) => p.name === projectName);
    const { layouts } = await (await fetch(`/api/projects/${project.id}/layouts`)).json();
    if (!layouts.length) throw new Error('the demo project has no layout');
    return { projectId: project.id, layoutId: layouts[0].id };
  }, DEMO_PROJECT);
}

async function submitFromEditor(page: Page, projectId: number, layoutId: number): Promise<number> {
  await page.goto(`${e.server.url}/projects/${projectId}/layouts/${layoutId}`);
  await page.locator('[data-layout-editor]').waitFor();
  await page.getByRole('button', { name: 'Submit revision' }).click();
  await page.getByRole('button', { name: 'Freeze and submit' }).click();
  await page.waitForURL(/\/revisions\/\d+$/);
  return Number(/\/revisions\/(\d+)$/.exec(page.url())![1]);
}

describe('review and release in Chromium', () => {
  it('return for changes on a finding → resubmit → sign off → release → client downloads and acknowledges', async () => {
    const planner = await e.browser.newPage({ viewport: { width: 1440, height: 1000 } });
    const reviewer = await e.browser.newPage({ viewport: { width: 1440, height: 1000 } });
    const client = await e.browser.newPage({ viewport: { width: 1280, height: 1000 }, acceptDownloads: true });
    // browser.newPage() opens each page in its own context: three separate sessions.
    await signInPage(planner, e.server.url, PLANNER);
    await signInPage(reviewer, e.server.url, REVIEWER);
    const { projectId, layoutId } = await demoLayout(planner);

    // Planner submits revision C from the editor.
    const revC = await submitFromEditor(planner, projectId, layoutId);
    await planner.getByRole('heading', { name: new RegExp(`revision ${FIRST}$`) }).waitFor();
    await planner.getByText('Waiting for a reviewer’s sign-off.').waitFor();

    // Reviewer comments on the first finding and sends it back.
    await reviewer.goto(`${e.server.url}/projects/${projectId}/revisions/${revC}`);
    const finding = reviewer.locator('[data-finding]').first();
    await finding.waitFor();
    const findingId = (await finding.getAttribute('data-finding'))!;
    const findingMessage = (await finding.locator('[data-finding-message]').textContent())!;
    await finding.getByRole('textbox').fill('Check this against the cell drawing and move the arm if you can.');
    await finding.getByRole('button', { name: 'Comment' }).click();
    await finding.getByText('Check this against the cell drawing and move the arm if you can.').waitFor();
    // A click on the plan pins a comment to that spot.
    const plan = reviewer.getByRole('img', { name: /Revision plan of/ }).or(reviewer.locator('svg[aria-label^="Revision plan of"]')).first();
    const box = (await plan.boundingBox())!;
    await reviewer.mouse.click(box.x + box.width * 0.5, box.y + box.height * 0.5);
    await reviewer.getByLabel(/^At x/).fill('Keep a 600 mm walkway along here.');
    await reviewer.getByRole('button', { name: 'Pin comment' }).click();
    await reviewer.getByRole('heading', { name: 'Comments on the plan' }).waitFor();
    await reviewer.getByRole('button', { name: 'Return for changes' }).click();
    await reviewer.getByRole('alert').filter({ hasText: 'Say what needs to change' }).waitFor();
    await reviewer.getByLabel('Decision note (required to return it for changes)').fill('See the comment on the shared space.');
    await reviewer.getByRole('button', { name: 'Return for changes' }).click();
    await reviewer.locator('[data-revision-state="returned"]').first().waitFor();
    await shot(reviewer, '1-changes-requested');

    // Planner moves the first arm by 300 mm east (through the API) and resubmits: revision D.
    await planner.evaluate(async (id) => {
      const { layout } = await (await fetch(`/api/layouts/${id}`)).json();
      const content = { ...layout.content, arms: layout.content.arms.map((a: { x: number }, i: number) => (i === 0 ? { ...a, x: a.x + 300 } : a)) };
      const r = await fetch(`/api/layouts/${id}`, { method: 'PUT', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ version: layout.version, content }) });
      if (!r.ok) throw new Error(`save: ${r.status}`);
    }, layoutId);
    const revD = await submitFromEditor(planner, projectId, layoutId);
    expect(revD).not.toBe(revC);
    await planner.getByRole('heading', { name: new RegExp(`revision ${SECOND}$`) }).waitFor();
    // The change is listed under its element's heading, as a list a screen reader reads in order.
    const armsSection = planner.locator('[data-diff]').getByRole('region', { name: 'Arms (1)' });
    await armsSection.getByRole('listitem').filter({ hasText: /moved 300 mm/ }).first().waitFor();

    // Reviewer sees C's comment as history on the same finding, and signs off D.
    await reviewer.goto(`${e.server.url}/projects/${projectId}/revisions/${revD}`);
    const same = reviewer.locator(`[data-finding="${findingId}"]`);
    // The finding either persists (C's comment shown as its history) or is listed as gone in the diff.
    await reviewer.locator('[data-finding]').first().waitFor();
    if (await same.count()) await same.getByRole('list', { name: 'Earlier comments on this finding' }).getByText('Check this against the cell drawing and move the arm if you can.').waitFor();
    else await reviewer.locator('[data-diff]').getByText(`Gone: ${findingMessage}`).waitFor();
    await reviewer.getByRole('button', { name: `Sign off revision ${SECOND}` }).click();
    await reviewer.locator('[data-revision-state="signed_off"]').first().waitFor();
    await shot(reviewer, '2-signed-off');

    // Planner releases.
    await planner.reload();
    await planner.getByRole('button', { name: 'Release to the client' }).click();
    await planner.locator('[data-mail-status="sent"]').waitFor();
    await shot(planner, '3-released');
    const stored = await Revision.findByPk(revD);
    expect(stored!.state).toBe('released');
    const mail = await MailMessage.findOne({ where: { subject: `${DEMO_PROJECT}: plan sheet, revision ${SECOND} released` } });
    expect(mail!.to).toContain(CLIENT);
    expect(mail!.attachments[0].checksum).toBe(stored!.planSheetChecksum);

    // The client finds the released revision on the project page (beside the demo's released B), downloads it and acknowledges receipt.
    await signInPage(client, e.server.url, CLIENT);
    await client.goto(`${e.server.url}/projects/${projectId}`);
    const table = client.getByRole('table', { name: 'Revisions' });
    await table.waitFor();
    await expect.poll(() => table.locator('[data-revision]').evaluateAll((rows) => rows.map((r) => r.getAttribute('data-revision')))).toEqual(['B', SECOND]);
    await table.getByRole('link', { name: `Revision ${SECOND}` }).click();
    await client.getByRole('button', { name: 'Acknowledge receipt' }).waitFor();
    const [download] = await Promise.all([client.waitForEvent('download'), client.getByRole('link', { name: 'Download the plan sheet (PDF)' }).click()]);
    const bytes = await readFile((await download.path())!);
    expect(createHash('sha256').update(bytes).digest('hex')).toBe(stored!.planSheetChecksum);
    // The sheet is drawn in the page, sheet by sheet.
    await client.locator('[data-sheet-state="done"]').waitFor();
    await expect.poll(() => client.locator('[data-sheet-state]').textContent()).toMatch(/Sheet 1 of \d+/);
    await client.getByRole('button', { name: 'Next sheet' }).click();
    await expect.poll(() => client.locator('[data-sheet-state]').textContent()).toMatch(/Sheet 2 of/);
    await client.getByRole('button', { name: 'Acknowledge receipt' }).click();
    await client.locator('[data-acknowledged]').waitFor();
    await shot(client, '4-client-acknowledged');
    // The unreleased revision C is not there for the client.
    await client.goto(`${e.server.url}/projects/${projectId}/revisions/${revC}`);
    await client.getByRole('heading', { name: 'Revision not found' }).waitFor();

    // Staff see who acknowledged.
    await planner.reload();
    await planner.getByText(/Received by: .*on/).waitFor();
    await shot(planner, '5-acknowledged-staff');
  });
});
