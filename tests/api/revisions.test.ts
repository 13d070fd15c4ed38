// The review and release workflow through the API across roles, with mail over real SMTP to the local fake.
import { createHash } from 'node:crypto';
import type { Express } from 'express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { RevisionDiff, RevisionSnapshot } from '@shared/schemas/revision';
import { AuditEvent, Layout, MailDelivery, MailMessage, Revision, SnapshotFloorPlan } from '../../backend/src/models';
import { startFakeSmtp, type FakeSmtp } from '../../backend/src/services/mail/fakeSmtp';
import { createMailer, type Mailer } from '../../backend/src/services/mail/mailer';
import { rerenderReleased } from '../../backend/src/services/release';
import { fullSnapshot, revisionLetter } from '../../backend/src/services/revisions';
import { buildArmModel, buildProject, buildUser, TEST_PASSWORD } from '../support/factories';
import { createTestApp, getBytes, signedIn, type TestApp } from '../support/testApp';

const sha256 = (b: Buffer | string) => createHash('sha256').update(b).digest('hex');
// An independent canonical form (keys sorted at every level) to check the stored checksum against.
function sorted(v: unknown): unknown {
  if (Array.isArray(v)) return v.map(sorted);
  if (v && typeof v === 'object') return Object.fromEntries(Object.keys(v).sort().map((k) => [k, sorted((v as Record<string, unknown>)[k])]));
  return v;
}

let t: TestApp;
let smtp: FakeSmtp;
// The app's transport: the fake's, or (to test failures) one pointed at a port nobody listens on.
let inner: Mailer;
const switchable: Mailer = { send: (m) => inner.send(m), close: () => inner.close() };
const FROM = 'Ringfence <no-reply@ringfence.local>';

beforeAll(async () => {
  smtp = await startFakeSmtp();
  inner = createMailer(smtp.url, FROM);
  t = await createTestApp({}, { mailer: switchable });
});
afterAll(async () => {
  inner.close();
  await smtp.close();
  await t.close();
});

const content = (modelId: number, r1: [number, number]) => ({
  arms: [
    { id: 'R1', armModelId: modelId, label: 'Picker 1', x: r1[0], y: r1[1], yaw: 0, mountHeight: 0 },
    { id: 'R2', armModelId: modelId, label: 'Picker 2', x: 4800, y: 3000, yaw: 180, mountHeight: 0 },
  ],
  workPoints: [{ id: 'P1', x: 4400, y: 3000, z: 100, approach: 'any', tag: 'infeed' }],
  boundaries: [],
  workHeights: [100],
});

/** A planner and a reviewer, both signed in, an arm model and a project the planner is a member of. */
async function reviewSetup() {
  const planner = await buildUser({ role: 'planner' });
  const reviewer = await buildUser({ role: 'reviewer' });
  const model = await buildArmModel();
  const project = await buildProject({ members: [planner] });
  return { planner, model, project, P: await signedIn(t.app, planner.email, TEST_PASSWORD), R: await signedIn(t.app, reviewer.email, TEST_PASSWORD) };
}

describe('revision letters', () => {
  it('run A … Z, AA … AZ, BA …, ZZ, AAA (bijective base 26, as drawing revisions and spreadsheet columns — common practice)', () => {
    expect([0, 1, 25, 26, 27, 51, 52, 701, 702].map(revisionLetter)).toEqual(['A', 'B', 'Z', 'AA', 'AB', 'AZ', 'BA', 'ZZ', 'AAA']);
    expect(() => revisionLetter(-1)).toThrow(/index/);
  });
});

describe('review and release workflow', () => {
  it('submit → return for changes → resubmit (B) → sign off → release → client downloads and acknowledges', async () => {
    const planner = await buildUser({ role: 'planner' });
    const reviewer = await buildUser({ role: 'reviewer' });
    const admin = await buildUser({ role: 'admin' });
    const client = await buildUser({ role: 'client' });
    const otherClient = await buildUser({ role: 'client' });
    const model = await buildArmModel();
    const project = await buildProject({ members: [client, planner] });
    const other = await buildProject({ members: [otherClient] });
    const layout = await Layout.create({ projectId: project.id, floorPlanId: null, name: 'End-of-line cell', content: content(model.id, [4000, 3000]), createdBy: planner.id });
    const otherLayout = await Layout.create({ projectId: other.id, floorPlanId: null, name: 'Other cell', content: content(model.id, [4000, 3000]), createdBy: null });

    const P = await signedIn(t.app, planner.email, TEST_PASSWORD);
    const R = await signedIn(t.app, reviewer.email, TEST_PASSWORD);
    const A = await signedIn(t.app, admin.email, TEST_PASSWORD);
    const C = await signedIn(t.app, client.email, TEST_PASSWORD);
    const C2 = await signedIn(t.app, otherClient.email, TEST_PASSWORD);
    const anon = request.agent(t.app);

    // Submit: planners (and admins) only.
    expect((await anon.post(`/api/layouts/${layout.id}/revisions`)).status).toBe(401);
    expect((await R.post(`/api/layouts/${layout.id}/revisions`)).status).toBe(403);
    expect((await C.post(`/api/layouts/${layout.id}/revisions`)).status).toBe(403);
    const subA = await P.post(`/api/layouts/${layout.id}/revisions`);
    expect(subA.status).toBe(201);
    const revA = subA.body.revision;
    expect(revA).toMatchObject({ letter: 'A', state: 'submitted', layoutName: 'End-of-line cell' });
    const sharedZone = revA.snapshot.analysis.findings.find((f: { id: string }) => f.id === 'shared-zone:R1+R2');
    expect(sharedZone).toBeTruthy();
    // The checksum covers the canonical JSON of the whole snapshot (floor plan put back in).
    const rowA = await Revision.findByPk(revA.id);
    const fullA = await fullSnapshot(rowA!);
    expect(rowA!.checksum).toBe(sha256(JSON.stringify(sorted(fullA))));
    expect(rowA!.checksum).toBe(revA.checksum);
    // The whole snapshot has the shape the shared schema (and so the review page) expects.
    expect(RevisionSnapshot.safeParse(fullA).error?.issues ?? []).toEqual([]);
    // Only one open revision per layout.
    expect((await P.post(`/api/layouts/${layout.id}/revisions`)).status).toBe(409);

    // Reviewers were told, over SMTP.
    const toReviewers = await MailMessage.findOne({ where: { subject: `${project.name}: revision A of End-of-line cell submitted for review` } });
    expect(toReviewers!.to).toContain(reviewer.email);
    expect(toReviewers!.text).toContain(`/projects/${project.id}/revisions/${revA.id}`);

    // Immutable: every attempt to change it is a conflict, and the database refuses it too.
    for (const m of ['put', 'patch', 'delete'] as const) expect((await P[m](`/api/revisions/${revA.id}`).send({ letter: 'Z' })).status).toBe(409);
    await expect(Revision.update({ snapshot: { ...rowA!.snapshot, layout: { ...rowA!.snapshot.layout, name: 'tampered' } } }, { where: { id: revA.id } })).rejects.toThrow(/immutable/);
    expect((await Revision.findByPk(revA.id))!.checksum).toBe(revA.checksum);

    // Comments: on a finding (stable id) and on a spot.
    expect((await C.post(`/api/revisions/${revA.id}/comments`).send({ body: 'x' })).status).toBe(403);
    expect((await R.post(`/api/revisions/${revA.id}/comments`).send({ body: 'No such', findingId: 'shared-zone:R8+R9' })).status).toBe(400);
    const onFinding = await R.post(`/api/revisions/${revA.id}/comments`).send({ body: 'Pickers share too much of the infeed; separate them.', findingId: 'shared-zone:R1+R2' });
    expect(onFinding.status).toBe(201);
    const onSpot = await R.post(`/api/revisions/${revA.id}/comments`).send({ body: 'Leave a walkway here.', point: { x: 6000, y: 2500 } });
    expect(onSpot.body.comment.point).toEqual({ x: 6000, y: 2500 });
    expect((await P.patch(`/api/comments/${onSpot.body.comment.id}`).send({ resolved: true })).body.comment.resolved).toBe(true);

    // Decision: reviewers only (admins may not decide); a comment is required to send it back.
    for (const who of [P, A, C]) expect((await who.post(`/api/revisions/${revA.id}/decision`).send({ decision: 'sign_off' })).status).toBe(403);
    expect((await R.post(`/api/revisions/${revA.id}/decision`).send({ decision: 'return', comment: '  ' })).status).toBe(400);
    const back = await R.post(`/api/revisions/${revA.id}/decision`).send({ decision: 'return', comment: 'Move picker 1 away from picker 2.' });
    expect(back.status).toBe(200);
    expect(back.body.revision).toMatchObject({ state: 'returned', decisionComment: 'Move picker 1 away from picker 2.' });
    expect((await R.post(`/api/revisions/${revA.id}/decision`).send({ decision: 'sign_off' })).status).toBe(409);
    const toPlanner = await MailMessage.findOne({ where: { subject: `${project.name}: revision A of End-of-line cell returned for changes` } });
    expect(toPlanner!.to).toEqual([planner.email]);
    expect(toPlanner!.text).toContain('Move picker 1 away');
    // A changes-requested revision cannot be released.
    expect((await P.post(`/api/revisions/${revA.id}/release`)).status).toBe(409);

    // The planner moves R1 by (−3000, −4000) mm and resubmits: revision B.
    const live = await P.get(`/api/layouts/${layout.id}`);
    expect((await P.put(`/api/layouts/${layout.id}`).send({ version: live.body.layout.version, content: content(model.id, [1000, -1000]) })).status).toBe(200);
    const subB = await P.post(`/api/layouts/${layout.id}/revisions`);
    expect(subB.status).toBe(201);
    const revB = subB.body.revision;
    expect(revB.letter).toBe('B');
    // Diff against A: a 3-4-5 right triangle gives 5000 mm exactly (Pythagoras).
    expect(RevisionDiff.safeParse(revB.diff).error?.issues ?? []).toEqual([]);
    expect(revB.diff.previous).toEqual({ id: revA.id, letter: 'A' });
    expect(revB.diff.groups).toEqual([{ element: 'arm', id: 'R1', title: 'Arm R1 (Picker 1)', status: 'changed', changes: [{ field: 'x,y', text: 'moved 5000 mm (from 4000, 3000 to 1000, −1000 mm)' }] }]);
    expect(revB.diff.findings.removed.map((f: { id: string }) => f.id)).toContain('shared-zone:R1+R2');
    // A's comment on the finding is B's history.
    expect(revB.history.map((c: { body: string; revisionLetter: string }) => [c.revisionLetter, c.body])).toEqual([['A', 'Pickers share too much of the infeed; separate them.']]);
    // A is still as it was frozen.
    expect((await P.get(`/api/revisions/${revA.id}`)).body.revision.snapshot.layout.content.arms[0]).toMatchObject({ x: 4000, y: 3000 });

    const approved = await R.post(`/api/revisions/${revB.id}/decision`).send({ decision: 'sign_off', comment: '' });
    expect(approved.body.revision.state).toBe('signed_off');

    // Clients see nothing before release.
    expect((await C.get(`/api/projects/${project.id}/revisions`)).body.revisions).toEqual([]);
    expect((await C.get(`/api/revisions/${revB.id}`)).status).toBe(404);
    expect((await getBytes(C, `/api/revisions/${revB.id}/plan-sheet.pdf`)).status).toBe(404);
    expect((await C.get(`/api/layouts/${layout.id}/revisions`)).status).toBe(403);

    // Release: planners only, approved only.
    for (const who of [R, C]) expect((await who.post(`/api/revisions/${revB.id}/release`)).status).toBe(403);
    const rel = await P.post(`/api/revisions/${revB.id}/release`);
    expect(rel.status).toBe(200);
    expect(rel.body.revision.state).toBe('released');
    expect(rel.body.mail).toMatchObject({ status: 'sent', attempts: 1, to: [client.email] });
    expect((await P.post(`/api/revisions/${revB.id}/release`)).status).toBe(409);
    const rowB = await Revision.findByPk(revB.id);
    expect(rowB!.planSheet!.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(rowB!.planSheetChecksum).toBe(sha256(rowB!.planSheet!));
    // Re-rendering from the frozen snapshot with the stored release date gives the same bytes.
    expect(sha256(await rerenderReleased(rowB!))).toBe(rowB!.planSheetChecksum);

    // The client's mail travelled over SMTP with the sheet attached, byte-identical.
    const toClient = await MailMessage.findOne({ where: { subject: `${project.name}: plan sheet, revision B released` } });
    expect(toClient!.to).toEqual([client.email]);
    expect(toClient!.attachments).toHaveLength(1);
    expect(toClient!.attachments[0]).toMatchObject({ contentType: 'application/pdf', size: rowB!.planSheet!.length, checksum: rowB!.planSheetChecksum });

    // The client lists only the released revision, downloads the stored sheet, and never sees drafts or comments.
    const list = (await C.get(`/api/projects/${project.id}/revisions`)).body.revisions;
    expect(list.map((r: { letter: string }) => r.letter)).toEqual(['B']);
    const detail = (await C.get(`/api/revisions/${revB.id}`)).body.revision;
    expect(detail).not.toHaveProperty('comments');
    expect(detail).not.toHaveProperty('snapshot');
    expect(detail).not.toHaveProperty('decisionComment');
    const dl = await getBytes(C, `/api/revisions/${revB.id}/plan-sheet.pdf?download=1`);
    expect(dl.status).toBe(200);
    expect(dl.headers['content-type']).toBe('application/pdf');
    expect(dl.headers['content-disposition']).toMatch(/^attachment/);
    expect(sha256(dl.body as Buffer)).toBe(rowB!.planSheetChecksum);
    expect((await C.get(`/api/revisions/${revA.id}`)).status).toBe(404);
    expect((await getBytes(C, `/api/revisions/${revA.id}/plan-sheet.pdf`)).status).toBe(404);
    // Another project's client: nothing, whatever id is tried.
    expect((await C2.get(`/api/revisions/${revB.id}`)).status).toBe(404);
    expect((await getBytes(C2, `/api/revisions/${revB.id}/plan-sheet.pdf`)).status).toBe(404);
    expect((await C2.get(`/api/projects/${project.id}/revisions`)).status).toBe(404);
    const otherRev = await P.post(`/api/layouts/${otherLayout.id}/revisions`);
    expect((await C.get(`/api/revisions/${otherRev.body.revision.id}`)).status).toBe(404);

    // Staff get a fresh DRAFT of an unreleased revision (not the stored sheet).
    const draft = await getBytes(R, `/api/revisions/${revA.id}/plan-sheet.pdf`);
    expect(draft.status).toBe(200);
    expect((draft.body as Buffer).subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(draft.headers['content-disposition']).toMatch(/DRAFT/);

    // Released revisions' comments are read-only.
    expect((await R.post(`/api/revisions/${revB.id}/comments`).send({ body: 'Late note' })).status).toBe(409);

    // Acknowledge: clients only; staff see who and when.
    expect((await P.post(`/api/revisions/${revB.id}/acknowledge`)).status).toBe(403);
    expect((await C2.post(`/api/revisions/${revB.id}/acknowledge`)).status).toBe(404);
    const ack = await C.post(`/api/revisions/${revB.id}/acknowledge`);
    expect(ack.status).toBe(200);
    const seen = (await R.get(`/api/revisions/${revB.id}`)).body.revision.acknowledgements;
    expect(seen).toEqual([{ user: { id: client.id, name: client.name }, at: ack.body.acknowledgement.at }]);
    expect((await C.get(`/api/revisions/${revB.id}`)).body.revision.acknowledgedAt).toBe(ack.body.acknowledgement.at);

    // Every step wrote an audit event.
    const actions = (await AuditEvent.findAll({ where: { entity: ['revision', 'comment'] }, order: [['id', 'ASC']] })).map((e) => e.action);
    for (const a of ['revision.submit', 'comment.create', 'comment.resolve', 'revision.return', 'revision.sign_off', 'revision.release', 'revision.acknowledge']) expect(actions).toContain(a);
  });

  it('a reviewer cannot decide a revision they submitted', async () => {
    const reviewer = await buildUser({ role: 'reviewer' });
    const model = await buildArmModel();
    const project = await buildProject();
    const layout = await Layout.create({ projectId: project.id, floorPlanId: null, name: 'Own cell', content: content(model.id, [4000, 3000]), createdBy: null });
    const planner = await buildUser({ role: 'planner' });
    const P = await signedIn(t.app, planner.email, TEST_PASSWORD);
    const rev = (await P.post(`/api/layouts/${layout.id}/revisions`)).body.revision;
    // The submitter later became a reviewer (a role change), which must not let them sign off their own work.
    await Revision.sequelize!.query('UPDATE revisions SET "submittedBy" = :u WHERE id = :id', { replacements: { u: reviewer.id, id: rev.id } });
    const R = await signedIn(t.app, reviewer.email, TEST_PASSWORD);
    const res = await R.post(`/api/revisions/${rev.id}/decision`).send({ decision: 'sign_off' });
    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/you submitted/i);
  });

  it('a mail failure never loses the release: it is recorded and retry-mail sends it', async () => {
    const planner = await buildUser({ role: 'planner' });
    const reviewer = await buildUser({ role: 'reviewer' });
    const client = await buildUser({ role: 'client' });
    const model = await buildArmModel();
    const project = await buildProject({ members: [client] });
    const layout = await Layout.create({ projectId: project.id, floorPlanId: null, name: 'Retry cell', content: content(model.id, [4000, 3000]), createdBy: null });
    const P = await signedIn(t.app, planner.email, TEST_PASSWORD);
    const R = await signedIn(t.app, reviewer.email, TEST_PASSWORD);
    const rev = (await P.post(`/api/layouts/${layout.id}/revisions`)).body.revision;
    await R.post(`/api/revisions/${rev.id}/decision`).send({ decision: 'sign_off' });

    const good = inner;
    inner = createMailer('smtp://127.0.0.1:1', FROM); // nothing listens on port 1: a real connection failure
    try {
      const rel = await P.post(`/api/revisions/${rev.id}/release`);
      expect(rel.status).toBe(200);
      expect(rel.body.revision.state).toBe('released');
      expect(rel.body.mail.status).toBe('failed');
      expect(rel.body.mail.error).toBeTruthy();
    } finally {
      inner.close();
      inner = good;
    }
    const row = await Revision.findByPk(rev.id);
    expect(row!.state).toBe('released');
    expect(row!.planSheetChecksum).toBe(sha256(row!.planSheet!));
    const failed = await MailDelivery.findOne({ where: { revisionId: rev.id, kind: 'release' } });
    expect(failed).toMatchObject({ status: 'failed', attempts: 1 });
    expect((await R.post(`/api/revisions/${rev.id}/release/retry-mail`)).status).toBe(403);
    const retry = await P.post(`/api/revisions/${rev.id}/release/retry-mail`);
    expect(retry.body.mail).toMatchObject({ status: 'sent', attempts: 2, to: [client.email] });
    expect((await P.post(`/api/revisions/${rev.id}/release/retry-mail`)).status).toBe(409);
    const msg = await MailMessage.findOne({ where: { subject: `${project.name}: plan sheet, revision A released` } });
    expect(msg!.attachments[0].checksum).toBe(row!.planSheetChecksum);
  });
});

describe('the diff between revisions', () => {
  it('names a changed J1 restriction, fence height and arm model parameter, and says nothing changed for an unchanged resubmission', async () => {
    const { planner, project, P, R } = await reviewSetup();
    // The model goes through the catalogue route, so its stored parameters are the parsed ones on both sides.
    const params = { family: 'scara', innerLink: 350, outerLink: 250, strokeMin: 0, strokeMax: 200, axes: [{ min: -150, max: 150 }, { min: -145, max: 145 }] };
    const made = await P.post('/api/arm-models').send({ name: `Demo SCARA diff ${process.pid}`, params });
    expect(made.status).toBe(201);
    const modelId: number = made.body.armModel.id;
    const cell = (restrict: { j1Min: number; j1Max: number }, fenceHeight: number) => ({
      ...content(modelId, [4000, 3000]),
      arms: content(modelId, [4000, 3000]).arms.map((a) => (a.id === 'R1' ? { ...a, restrict } : a)),
      boundaries: [{ id: 'F1', kind: 'fence', label: 'Cell guard', height: fenceHeight, points: [[2000, 1000], [7000, 1000], [7000, 5000], [2000, 5000], [2000, 1000]] }],
    });
    const layout = await Layout.create({ projectId: project.id, floorPlanId: null, name: 'Diff cell', content: cell({ j1Min: -120, j1Max: 120 }, 1400), createdBy: planner.id });
    const sendBack = async (id: number) => expect((await R.post(`/api/revisions/${id}/decision`).send({ decision: 'return', comment: 'Raise the fence.' })).status).toBe(200);

    const a = (await P.post(`/api/layouts/${layout.id}/revisions`)).body.revision;
    await sendBack(a.id);
    const live = (await P.get(`/api/layouts/${layout.id}`)).body.layout;
    expect((await P.put(`/api/layouts/${layout.id}`).send({ version: live.version, content: cell({ j1Min: -90, j1Max: 90 }, 2000) })).status).toBe(200);
    expect((await P.put(`/api/arm-models/${modelId}`).send({ name: made.body.armModel.name, params: { ...params, innerLink: 360 } })).status).toBe(200);
    const b = (await P.post(`/api/layouts/${layout.id}/revisions`)).body.revision;

    const detail = await R.get(`/api/revisions/${b.id}`);
    expect(detail.status).toBe(200);
    const diff = detail.body.revision.diff;
    expect(RevisionDiff.safeParse(diff).error?.issues ?? []).toEqual([]);
    expect(diff.previous).toEqual({ id: a.id, letter: 'A' });
    // The layout's version went up with the save: bookkeeping, not a change.
    expect(diff.groups.map((g: { element: string; id: string; title: string; status: string; changes: Array<{ text: string }> }) => [g.element, g.id, g.title, g.status, g.changes.map((c) => c.text)])).toEqual([
      ['arm', 'R1', 'Arm R1 (Picker 1)', 'changed', ['J1 restriction −120…120° → −90…90°']],
      ['armModel', String(modelId), made.body.armModel.name, 'changed', ['inner link length 350 → 360 mm']],
      ['boundary', 'F1', 'Fence F1 (Cell guard)', 'changed', ['height 1400 → 2000 mm']],
    ]);
    // The submit response carries the same diff.
    expect(b.diff).toEqual(diff);

    // Sent back and resubmitted unchanged: revision C has no changes.
    await sendBack(b.id);
    const c = (await P.post(`/api/layouts/${layout.id}/revisions`)).body.revision;
    expect(c.letter).toBe('C');
    expect((await R.get(`/api/revisions/${c.id}`)).body.revision.diff).toEqual({ previous: { id: b.id, letter: 'B' }, groups: [], findings: { added: [], removed: [], changed: [] } });
  });
});

export type { Express };

/** A hand-written ASCII DXF: a 10 m × 6 m hall outline and one wall (from (5000, 0) to (5000, wallEndY)), in mm. */
function hallDxf(wallEndY = 2000): string {
  const g = (code: number, value: string | number) => `${code}\n${value}\n`;
  const outline = g(0, 'LWPOLYLINE') + g(8, 'OUTLINE') + g(90, 4) + g(70, 1) + g(10, 0) + g(20, 0) + g(10, 10000) + g(20, 0) + g(10, 10000) + g(20, 6000) + g(10, 0) + g(20, 6000);
  const wall = g(0, 'LINE') + g(8, 'WALLS') + g(10, 5000) + g(20, 0) + g(11, 5000) + g(21, wallEndY);
  return g(0, 'SECTION') + g(2, 'HEADER') + g(9, '$INSUNITS') + g(70, 4) + g(0, 'ENDSEC') + g(0, 'SECTION') + g(2, 'ENTITIES') + outline + wall + g(0, 'ENDSEC') + g(0, 'EOF');
}

describe('floor plans of revisions', () => {
  it('two revisions of the same layout store one floor-plan row; lists never select the snapshot; the detail shows the plan', async () => {
    const { planner, model, project, P, R } = await reviewSetup();
    const fp = await P.post(`/api/projects/${project.id}/floor-plans`).attach('file', Buffer.from(hallDxf()), 'hall.dxf');
    expect(fp.status).toBe(201);
    const layout = await Layout.create({ projectId: project.id, floorPlanId: fp.body.id, name: 'Hall cell', content: content(model.id, [4000, 3000]), createdBy: planner.id });

    const plansBefore = await SnapshotFloorPlan.count();
    const a = await P.post(`/api/layouts/${layout.id}/revisions`);
    expect(a.status).toBe(201);
    expect((await R.post(`/api/revisions/${a.body.revision.id}/decision`).send({ decision: 'return', comment: 'Move picker 1.' })).status).toBe(200);
    await P.put(`/api/layouts/${layout.id}`).send({ version: layout.version, content: content(model.id, [3000, 3000]) }).expect(200);
    const b = await P.post(`/api/layouts/${layout.id}/revisions`);
    expect(b.status).toBe(201);

    const [rowA, rowB] = await Promise.all([Revision.findByPk(a.body.revision.id), Revision.findByPk(b.body.revision.id)]);
    expect(await SnapshotFloorPlan.count()).toBe(plansBefore + 1);
    expect(rowA!.floorPlanChecksum).toMatch(/^[0-9a-f]{64}$/);
    expect(rowB!.floorPlanChecksum).toBe(rowA!.floorPlanChecksum);
    // The row holds no copy of the plan; the stored plan's key is the sha256 of its canonical JSON.
    expect(rowA!.snapshot.floorPlan).toBeUndefined();
    const stored = (await SnapshotFloorPlan.findByPk(rowA!.floorPlanChecksum!))!;
    expect(sha256(JSON.stringify(sorted(stored.content)))).toBe(rowA!.floorPlanChecksum);
    expect(stored.content.geometry.features.length).toBe(2);
    // Each revision's checksum still covers the whole snapshot, plan included.
    for (const row of [rowA!, rowB!]) expect(sha256(JSON.stringify(sorted(await fullSnapshot(row))))).toBe(row.checksum);

    // The list queries select the columns they show, never the snapshot column itself.
    const sql: string[] = [];
    // Sequelize passes every statement to options.logging (typed only on the constructor's options)
    const opts = (t.sequelize as unknown as { options: { logging: unknown } }).options;
    const logging = opts.logging;
    opts.logging = (q: string) => void sql.push(q);
    try {
      const byLayout = await P.get(`/api/layouts/${layout.id}/revisions`);
      expect(byLayout.status).toBe(200);
      expect(byLayout.body.revisions.map((r: { letter: string; layoutName: string; counts: { arms: number } }) => [r.letter, r.layoutName, r.counts.arms])).toEqual([
        ['A', 'Hall cell', 2],
        ['B', 'Hall cell', 2],
      ]);
      expect((await P.get(`/api/projects/${project.id}/revisions`)).status).toBe(200);
    } finally {
      opts.logging = logging;
    }
    const listQueries = sql.filter((q) => /FROM "revisions"/.test(q));
    expect(listQueries.length).toBe(2);
    for (const q of listQueries) {
      // "snapshot" appears only inside the JSON path expressions that read out the shown figures
      expect(q).not.toMatch(/"snapshot"(?!->)/);
      expect(q).not.toContain('"planSheet"');
    }

    // The detail shows the plan (from the shared row) and the diff against A.
    const detail = await P.get(`/api/revisions/${b.body.revision.id}`);
    expect(detail.status).toBe(200);
    expect(detail.body.revision.snapshot.floorPlan.geometry.features.length).toBe(2);
    expect(detail.body.revision.snapshot.floorPlan.id).toBe(fp.body.id);
    expect(detail.body.revision.diff.previous).toEqual({ id: rowA!.id, letter: 'A' });
    // The same stored plan on both sides: only the arm's move, no floor-plan change.
    expect(detail.body.revision.diff.groups.map((g: { id: string; changes: Array<{ text: string }> }) => [g.id, g.changes.map((c) => c.text)])).toEqual([['R1', ['moved 1000 mm (from 4000, 3000 to 3000, 3000 mm)']]]);
    // The sheet of a revision is drawn from the stored plan.
    const sheet = await getBytes(P, `/api/revisions/${b.body.revision.id}/plan-sheet.pdf`);
    expect(sheet.status).toBe(200);
  });

  it('a layout moved onto another floor plan: the diff gives both stored plans\' checksums, the upload, the file and the drawing', async () => {
    const { planner, model, project, P, R } = await reviewSetup();
    const fp1 = await P.post(`/api/projects/${project.id}/floor-plans`).attach('file', Buffer.from(hallDxf()), 'hall.dxf');
    const fp2 = await P.post(`/api/projects/${project.id}/floor-plans`).attach('file', Buffer.from(hallDxf(2500)), 'hall-b.dxf');
    expect([fp1.status, fp2.status]).toEqual([201, 201]);
    const layout = await Layout.create({ projectId: project.id, floorPlanId: fp1.body.id, name: 'Moved cell', content: content(model.id, [4000, 3000]), createdBy: planner.id });
    const a = (await P.post(`/api/layouts/${layout.id}/revisions`)).body.revision;
    expect((await R.post(`/api/revisions/${a.id}/decision`).send({ decision: 'return', comment: 'Use the new survey.' })).status).toBe(200);
    await P.put(`/api/layouts/${layout.id}`).send({ version: layout.version, floorPlanId: fp2.body.id }).expect(200);
    const b = (await P.post(`/api/layouts/${layout.id}/revisions`)).body.revision;
    const [rowA, rowB] = await Promise.all([Revision.findByPk(a.id), Revision.findByPk(b.id)]);
    expect(rowA!.floorPlanChecksum).not.toBe(rowB!.floorPlanChecksum);
    const plan = b.diff.groups.find((g: { element: string }) => g.element === 'floorPlan');
    expect(plan).toMatchObject({ title: 'Floor plan', status: 'changed' });
    expect(plan.changes.map((c: { text: string }) => c.text)).toEqual([
      `checksum ${rowA!.floorPlanChecksum!.slice(0, 12)} → ${rowB!.floorPlanChecksum!.slice(0, 12)}`,
      `upload no. ${fp1.body.id} → ${fp2.body.id}`,
      'file ‘hall.dxf’ → ‘hall-b.dxf’',
      'drawing changed (2 features)',
    ]);
  });

  it('revisions stored with the plan inside the snapshot move it out in the migration and keep their checksums; down puts it back', async () => {
    const { makeInlineRevisions } = await import('../support/revisionFixtures');
    const planner = await buildUser({ role: 'planner' });
    const model = await buildArmModel();
    const project = await buildProject({ members: [planner] });
    const P = await signedIn(t.app, planner.email, TEST_PASSWORD);
    const fp = await P.post(`/api/projects/${project.id}/floor-plans`).attach('file', Buffer.from(hallDxf()), 'hall.dxf');
    const layout = await Layout.create({ projectId: project.id, floorPlanId: fp.body.id, name: 'Old cell', content: content(model.id, [4000, 3000]), createdBy: planner.id });
    const ids = await makeInlineRevisions(layout);
    const before = await Revision.findAll({ where: { id: ids }, order: [['id', 'ASC']] });
    expect(before.every((r) => r.floorPlanChecksum === null && r.snapshot.floorPlan)).toBe(true);
    // The diff reads such rows' plans from inside their snapshots: the same plan on both sides, no change.
    const inlineDetail = (await P.get(`/api/revisions/${ids[1]}`)).body.revision;
    expect(inlineDetail.snapshot.floorPlan.fileName).toBe('hall.dxf');
    expect(inlineDetail.diff).toMatchObject({ previous: { id: ids[0], letter: 'A' }, groups: [] });

    const migration = await import('../../backend/src/db/migrations/20261202093000-create-snapshot-floor-plans');
    const qi = t.sequelize.getQueryInterface();
    // down: every plan back inline (the rows made by the API above included), table gone
    await migration.down({ context: qi });
    const [inline] = (await t.sequelize.query(`SELECT count(*)::int AS n FROM revisions WHERE jsonb_typeof(snapshot->'floorPlan') = 'object'`)) as [Array<{ n: number }>, unknown];
    expect(inline[0].n).toBeGreaterThanOrEqual(2);
    // up: plans moved out, one row per content, checksums unchanged and still verifying
    await migration.up({ context: qi });
    const after = await Revision.findAll({ where: { id: ids }, order: [['id', 'ASC']] });
    expect(after[0].floorPlanChecksum).toMatch(/^[0-9a-f]{64}$/);
    expect(after[1].floorPlanChecksum).toBe(after[0].floorPlanChecksum);
    for (const [i, row] of after.entries()) {
      expect(row.snapshot.floorPlan).toBeUndefined();
      expect(row.checksum).toBe(before[i].checksum);
      expect(sha256(JSON.stringify(sorted(await fullSnapshot(row))))).toBe(row.checksum);
    }
    await expect(Revision.update({ floorPlanChecksum: null }, { where: { id: ids[0] } })).rejects.toThrow(/immutable/);
  });
});
