// The demo seed on an empty database: the cell layout's review replayed through the product's own
// services (revision A returned for changes with the reviewer's comment, revision B signed off and
// released with its stored plan sheet), the working copy still editable, and a second run adding nothing.
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { RevisionDiff } from '@shared/schemas/revision';
import { DEMO_HISTORY_FILE, readDemoHistory } from '../../backend/src/db/demoHistory';
import { readDemoLayout } from '../../backend/src/db/demoLayout';
import { DEMO_ACCOUNTS, DEMO_PASSWORD, DEMO_PROJECT, seedDemoIfEmpty } from '../../backend/src/db/seed';
import { featureSeedSteps } from '../../backend/src/features';
import { ArmModel, AuditEvent, FloorPlan, Layout, MailDelivery, Project, Revision, ReviewComment, User } from '../../backend/src/models';
import { rerenderReleased } from '../../backend/src/services/release';
import { createTestApp, getBytes, signedIn, type TestApp } from '../support/testApp';

// pdfjs-dist reads the stored sheet back (an independent PDF reader; legacy build for Node).
const pdfjs = await import('pdfjs-dist/legacy/build/pdf.mjs');

const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex');
const SEEDED_AT = new Date('2026-03-20T12:00:00Z');
const LAYOUT_NAME = 'Fernhill line 3 — cell layout';

let t: TestApp;
let seeded: boolean;
let layout: Layout;
let revA: Revision;
let revB: Revision;
let planner: User;
let reviewer: User;

async function pdfText(pdf: Buffer): Promise<string> {
  const doc = await pdfjs.getDocument({ data: new Uint8Array(pdf), useSystemFonts: false }).promise;
  const texts: string[] = [];
  for (let i = 1; i <= doc.numPages; i++) {
    const tc = await (await doc.getPage(i)).getTextContent();
    texts.push(tc.items.map((it) => ('str' in it ? it.str : '')).join(' '));
  }
  return texts.join(' ').replace(/\s+/g, ' ');
}

beforeAll(async () => {
  t = await createTestApp();
  seeded = await seedDemoIfEmpty(t.sequelize, { bcryptCost: 4, steps: featureSeedSteps(), now: SEEDED_AT });
  layout = (await Layout.findOne({ where: { name: LAYOUT_NAME } }))!;
  [revA, revB] = await Revision.findAll({ where: { layoutId: layout.id }, order: [['id', 'ASC']] });
  const byRole = async (role: string) => (await User.findOne({ where: { email: DEMO_ACCOUNTS.find((a) => a.role === role)!.email } }))!;
  [planner, reviewer] = [await byRole('planner'), await byRole('reviewer')];
}, 120_000);
afterAll(async () => t?.close());

describe('demo seed', () => {
  it('seeds the accounts of the README and one demo project the client is a member of', async () => {
    expect(seeded).toBe(true);
    const users = await User.findAll({ order: [['id', 'ASC']] });
    expect(users.map((u) => [u.email, u.role])).toEqual(DEMO_ACCOUNTS.map((a) => [a.email, a.role]));
    const projects = await Project.findAll();
    expect(projects.map((p) => p.name)).toEqual([DEMO_PROJECT.name]);
    expect(await Revision.count()).toBe(2);
  });

  it('revision A froze the first draft and was returned for changes by the demo reviewer with the comment of the history', async () => {
    expect(revA.letter).toBe('A');
    expect(revA.state).toBe('returned');
    expect(revA.submittedBy).toBe(planner.id);
    expect(revA.decidedBy).toBe(reviewer.id);
    const story = JSON.parse(readFileSync(DEMO_HISTORY_FILE, 'utf8'));
    expect(revA.decisionComment).toBe(story.revisionA.returned.comment);
    expect(revA.decisionComment).toMatch(/operator area/);
    // The draft's palletizer stood where the history says, and the analysis frozen with it finds
    // what the comment speaks of: reach into the operator area at the pallet exchange.
    expect(revA.snapshot.layout.content.arms.find((a) => a.id === 'R4')!.y).toBe(9400);
    const findingsA = revA.snapshot.analysis.findings.map((f) => f.id);
    expect(findingsA).toContain('reach-into-operator-area:R4+OP1');
    expect(findingsA).toContain('unreached-point:P11');
    expect(revA.planSheet).toBeNull();
  });

  it('revision B froze the edited working copy, was signed off by the reviewer and released by the planner', async () => {
    expect(revB.letter).toBe('B');
    expect(revB.state).toBe('released');
    expect(revB.submittedBy).toBe(planner.id);
    expect(revB.decidedBy).toBe(reviewer.id);
    expect(revB.releasedBy).toBe(planner.id);
    const findingsB = revB.snapshot.analysis.findings.map((f) => f.id);
    expect(findingsB).not.toContain('reach-into-operator-area:R4+OP1');
    // The sign-off note names what stays open; those findings are indeed still there.
    expect(revB.decisionComment).toMatch(/separation distance/);
    expect(findingsB).toEqual(expect.arrayContaining(['opening-too-close:O1+R4', 'fence-reach-over:F1+R3']));
    expect(findingsB.filter((id) => id.startsWith('unreached-point:'))).toEqual([]);
    // B froze exactly the sample's working copy, which is also the layout's content now.
    const ids = new Map((await ArmModel.findAll({ attributes: ['id', 'name'] })).map((m) => [m.name, m.id]));
    const sample = readDemoLayout((n) => ids.get(n));
    expect(revB.snapshot.layout.content).toEqual(sample.content);
    expect(layout.content).toEqual(sample.content);
  });

  it('dates the history back from the day of seeding, A a few days before B, each audit entry at its step', async () => {
    // 2026-03-20 minus the days of samples/demo-history.json, at its UTC times (worked out by hand).
    expect(revA.submittedAt.toISOString()).toBe('2026-03-12T16:05:00.000Z');
    expect(revA.decidedAt!.toISOString()).toBe('2026-03-13T10:40:00.000Z');
    expect(revB.submittedAt.toISOString()).toBe('2026-03-15T11:30:00.000Z');
    expect(revB.decidedAt!.toISOString()).toBe('2026-03-16T15:00:00.000Z');
    expect(revB.releasedAt!.toISOString()).toBe('2026-03-17T09:20:00.000Z');
    expect(revB.sheetCreatedAt!.toISOString()).toBe(revB.releasedAt!.toISOString());
    const project = (await Project.findOne())!;
    const plan = (await FloorPlan.findOne({ where: { projectId: project.id } }))!;
    expect(project.createdAt.toISOString()).toBe('2026-03-08T09:10:00.000Z');
    expect(plan.createdAt.toISOString()).toBe('2026-03-08T09:35:00.000Z');
    expect(layout.createdAt.toISOString()).toBe('2026-03-09T14:20:00.000Z');
    expect(layout.updatedAt.toISOString()).toBe('2026-03-15T09:15:00.000Z');

    const events = await AuditEvent.findAll({ where: { entity: ['revision', 'layout'] }, order: [['id', 'ASC']] });
    expect(events.map((e) => [e.action, e.entityId, e.actorId, e.at.toISOString()])).toEqual([
      ['revision.submit', String(revA.id), planner.id, '2026-03-12T16:05:00.000Z'],
      ['revision.return', String(revA.id), reviewer.id, '2026-03-13T10:40:00.000Z'],
      ['layout.update', String(layout.id), planner.id, '2026-03-15T09:15:00.000Z'],
      ['revision.submit', String(revB.id), planner.id, '2026-03-15T11:30:00.000Z'],
      ['revision.sign_off', String(revB.id), reviewer.id, '2026-03-16T15:00:00.000Z'],
      ['revision.release', String(revB.id), planner.id, '2026-03-17T09:20:00.000Z'],
    ]);
    expect(events.at(-1)!.details).toMatchObject({ letter: 'B', planSheetChecksum: revB.planSheetChecksum });
    // Past events: nothing was mailed, and no comment was invented beyond the decision notes.
    expect(await MailDelivery.count()).toBe(0);
    expect(await ReviewComment.count()).toBe(0);
  });

  it('stores B’s released sheet: a real PDF with the layout, the same bytes the release code renders again', async () => {
    const pdf = revB.planSheet!;
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(sha256(pdf)).toBe(revB.planSheetChecksum);
    const text = await pdfText(pdf);
    expect(text).toContain(LAYOUT_NAME);
    expect(text).toContain(DEMO_PROJECT.clientName);
    expect(text).toContain('Tomasz Adeyemi');
    expect(text).not.toContain('DRAFT');
    // Rendering the released revision again with its stored date gives the stored bytes.
    expect(sha256(await rerenderReleased(revB))).toBe(revB.planSheetChecksum);
  }, 60_000);

  it('the demo client sees the released revision B only and downloads its stored sheet', async () => {
    const client = await signedIn(t.app, 'client@fernhill.test', DEMO_PASSWORD);
    const project = (await Project.findOne())!;
    const list = await client.get(`/api/projects/${project.id}/revisions`);
    expect(list.status).toBe(200);
    expect(list.body.revisions.map((r: { letter: string; state: string }) => [r.letter, r.state])).toEqual([['B', 'released']]);
    const res = await getBytes(client, `/api/revisions/${revB.id}/plan-sheet.pdf?download=1`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    expect(res.headers['content-disposition']).toContain('attachment');
    expect(sha256(res.body as Buffer)).toBe(revB.planSheetChecksum);
    expect((await client.get(`/api/revisions/${revA.id}`)).status).toBe(404);
  }, 60_000);

  it('the reviewer sees B’s changes since A: the palletizer moved 700 mm and its reach into the operator area gone', async () => {
    const asReviewer = await signedIn(t.app, 'reviewer@fernhill.test', DEMO_PASSWORD);
    const res = await asReviewer.get(`/api/revisions/${revB.id}`);
    expect(res.status).toBe(200);
    const diff = RevisionDiff.parse(res.body.revision.diff);
    expect(diff.previous).toEqual({ id: revA.id, letter: 'A' });
    const arms = diff.groups.filter((g) => g.element === 'arm');
    expect(arms.map((g) => g.id)).toEqual(['R4']);
    expect(arms[0].changes.map((c) => c.text).join('; ')).toMatch(/moved 700 mm/);
    expect(diff.findings.removed.map((f) => f.id)).toContain('reach-into-operator-area:R4+OP1');
    // What B adds are warnings only (gaps now measured where A's reach crossed the fence).
    expect(diff.findings.added.filter((f) => f.severity === 'critical')).toEqual([]);
  });

  it('leaves the working copy editable: the planner’s PUT is saved as the next version', async () => {
    const asPlanner = await signedIn(t.app, 'planner@fernhill.test', DEMO_PASSWORD);
    const got = await asPlanner.get(`/api/layouts/${layout.id}`);
    expect(got.body.layout.version).toBe(2);
    const content = got.body.layout.content;
    content.boundaries = content.boundaries.map((z: { id: string; height?: number }) => (z.id === 'F1' ? { ...z, height: 2200 } : z));
    const put = await asPlanner.put(`/api/layouts/${layout.id}`).send({ version: 2, content });
    expect(put.status).toBe(200);
    expect(put.body.layout.version).toBe(3);
    expect(put.body.layout.content.boundaries.find((z: { id: string }) => z.id === 'F1').height).toBe(2200);
    // A new revision can be submitted from it (none is open).
    const sub = await asPlanner.post(`/api/layouts/${layout.id}/revisions`);
    expect(sub.status).toBe(201);
    expect(sub.body.revision.letter).toBe('C');
  }, 60_000);

  it('running the seed again adds nothing', async () => {
    const counts = async () => Promise.all([User.count(), Project.count(), Layout.count(), FloorPlan.count(), Revision.count(), AuditEvent.count()]);
    const before = await counts();
    expect(await seedDemoIfEmpty(t.sequelize, { bcryptCost: 4, steps: featureSeedSteps() })).toBe(false);
    expect(await counts()).toEqual(before);
  });
});

describe('demo history file', () => {
  it('refuses times out of order, naming the field', () => {
    const dir = mkdtempSync(path.join(os.tmpdir(), 'demo-history-'));
    try {
      const story = JSON.parse(readFileSync(DEMO_HISTORY_FILE, 'utf8'));
      story.revisionB.released = { daysBefore: 9, time: '09:20' };
      const file = path.join(dir, 'demo-history.json');
      writeFileSync(file, JSON.stringify(story));
      expect(() => readDemoHistory(SEEDED_AT, file)).toThrow(/revisionB\.released \(9 days before, 09:20\) comes before revisionB\.signedOff/);
      story.revisionB.released = { daysBefore: 3, time: '9:20' };
      writeFileSync(file, JSON.stringify(story));
      expect(() => readDemoHistory(SEEDED_AT, file)).toThrow(/revisionB\.released\.time: Write the time of day as HH:MM/);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
