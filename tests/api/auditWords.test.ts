// The audit log as the admin page reads it: GET /api/admin/audit words each event from the shared
// table (shared/audit) — a sign-off as "Signed off revision A" on the revision by letter and cell
// layout, a cell layout edit as "Edited cell layout" with its changes as lines, kinds in words,
// references by name — and gives no stored detail or JSON for people to read. The product's own
// words (docs/glossary.md); no outside source applies.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildArmModel, buildProject, buildUser, TEST_PASSWORD } from '../support/factories';
import { createTestApp, signedIn, type TestApp } from '../support/testApp';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => t.close());

const content = (modelId: number, fenceHeight: number, arms: number) => ({
  arms: Array.from({ length: arms }, (_, i) => ({ id: `R${i + 1}`, armModelId: modelId, label: '', x: 1000 + 2500 * i, y: 3000, yaw: 0, mountHeight: 0 })),
  workPoints: [{ id: 'P1', x: 1400, y: 3000, z: 100, approach: 'any', tag: '' }],
  boundaries: [{ id: 'F1', kind: 'fence', label: '', points: [[0, 0], [8000, 0]], height: fenceHeight }],
  workHeights: [100],
});

interface Event {
  action: string;
  entity: string;
  entityId: string | null;
  words: { action: string; kind: string; item: string | null; details: string[] };
}

describe('audit log in words', () => {
  it('words a cell layout edit and a sign-off, with no stored details or JSON in the answer', async () => {
    const planner = await buildUser({ role: 'planner' });
    const reviewer = await buildUser({ role: 'reviewer' });
    const admin = await buildUser({ role: 'admin' });
    const model = await buildArmModel({ name: 'Audit picker S4' });
    const project = await buildProject({ members: [planner], name: 'Audit line' });
    const P = await signedIn(t.app, planner.email, TEST_PASSWORD);
    const R = await signedIn(t.app, reviewer.email, TEST_PASSWORD);
    const A = await signedIn(t.app, admin.email, TEST_PASSWORD);

    const created = await P.post(`/api/projects/${project.id}/layouts`).send({ name: 'Cell 1', content: content(model.id, 2000, 1) });
    expect(created.status).toBe(201);
    const layoutId = created.body.layout.id;
    const edit = await P.put(`/api/layouts/${layoutId}`).send({ version: 1, name: 'Cell 2', content: content(model.id, 2200, 2) });
    expect(edit.status).toBe(200);
    const sub = await P.post(`/api/layouts/${layoutId}/revisions`);
    expect(sub.status).toBe(201);
    const revId = sub.body.revision.id;
    expect((await R.post(`/api/revisions/${revId}/decision`).send({ decision: 'sign_off', comment: 'Fence height is right.' })).status).toBe(200);

    const layoutLog = await A.get('/api/admin/audit').query({ entity: 'layout', entityId: String(layoutId) });
    expect(layoutLog.status).toBe(200);
    const update = (layoutLog.body.events as Event[]).find((e) => e.action === 'layout.update')!;
    expect(update.words).toEqual({
      action: 'Edited cell layout',
      kind: 'Cell layout',
      item: 'Cell 2',
      details: ['Name: Cell 1 → Cell 2', 'Arms: 1 → 2', 'Arm R2 added', 'Height of guard fence F1: 2000 mm → 2200 mm'],
    });
    const create = (layoutLog.body.events as Event[]).find((e) => e.action === 'layout.create')!;
    expect(create.words).toMatchObject({ action: 'Created cell layout', kind: 'Cell layout', item: 'Cell 2', details: ['Project: Audit line', 'Name: Cell 1'] });

    const revLog = await A.get('/api/admin/audit').query({ action: 'revision.', entityId: String(revId) });
    const signOff = (revLog.body.events as Event[]).find((e) => e.action === 'revision.sign_off')!;
    expect(signOff.words).toEqual({ action: 'Signed off revision A', kind: 'Revision', item: 'A of Cell 2', details: ['Comment: “Fence height is right.”'] });
    const submit = (revLog.body.events as Event[]).find((e) => e.action === 'revision.submit')!;
    expect(submit.words.action).toBe('Submitted revision A');
    expect(submit.words.details).toEqual([expect.stringMatching(/^From working copy version: 2$/), expect.stringMatching(/^Checksum: [0-9a-f]{12}$/)]);

    // Nothing raw for people: no stored details, and no line of words holds JSON or a code name.
    const all = await A.get('/api/admin/audit').query({ pageSize: 200 });
    for (const e of all.body.events as Array<Event & { details?: unknown }>) {
      expect(e).not.toHaveProperty('details');
      for (const text of [e.words.action, e.words.kind, ...e.words.details]) {
        expect(text, e.action).not.toMatch(/[{}"]|\b(floorPlan|armModel|sign_off|layoutId)\b/);
      }
    }
    expect((all.body.events as Event[]).some((e) => e.words.action === 'Signed in')).toBe(true);
  });

  it('names a reference that is gone "(removed)" and keeps the name a deleted item stored', async () => {
    const planner = await buildUser({ role: 'planner' });
    const admin = await buildUser({ role: 'admin' });
    const model = await buildArmModel({ name: 'Short-lived picker' });
    const other = await buildArmModel({ name: 'Kept picker' });
    const project = await buildProject({ members: [planner] });
    const P = await signedIn(t.app, planner.email, TEST_PASSWORD);
    const A = await signedIn(t.app, admin.email, TEST_PASSWORD);
    const created = await P.post(`/api/projects/${project.id}/layouts`).send({ name: 'Swap cell', content: content(model.id, 2000, 1) });
    const layoutId = created.body.layout.id;
    expect((await P.put(`/api/layouts/${layoutId}`).send({ version: 1, content: content(other.id, 2000, 1) })).status).toBe(200);
    await model.destroy();
    expect((await P.delete(`/api/layouts/${layoutId}`)).status).toBe(204);

    const log = await A.get('/api/admin/audit').query({ entity: 'layout', entityId: String(layoutId) });
    const events = log.body.events as Event[];
    expect(events.find((e) => e.action === 'layout.update')!.words.details).toEqual(['Arm model of arm R1: (removed) → Kept picker']);
    expect(events.find((e) => e.action === 'layout.delete')!.words).toEqual({ action: 'Deleted cell layout', kind: 'Cell layout', item: 'Swap cell', details: [] });
  });
});
