import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Layout } from '../../backend/src/models';
import { buildArmModel, buildProject, buildUser, TEST_PASSWORD } from '../support/factories';
import { createTestApp, signedIn, type TestApp } from '../support/testApp';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => t.close());

const content = (armModelId: number) => ({
  arms: [{ id: 'R1', armModelId, label: 'Picker 1', x: 4000, y: 3000, yaw: 90, mountHeight: 0 }],
  workPoints: [{ id: 'P1', x: 4300, y: 3200, z: 900, approach: 'top', tag: 'infeed', assignedArm: 'R1' }],
  boundaries: [
    { id: 'F1', kind: 'fence', points: [[0, 0], [8000, 0], [8000, 6000]], height: 2000 },
    { id: 'O1', kind: 'opening', points: [[2000, 0], [3000, 0]], fenceId: 'F1' },
  ],
  workHeights: [900],
});

describe('layouts', () => {
  it('creates and reads a layout; PUT with a stale version gets 409 and overwrites nothing', async () => {
    const planner = await buildUser({ role: 'planner' });
    const model = await buildArmModel();
    const project = await buildProject();
    const a = await signedIn(t.app, planner.email, TEST_PASSWORD);
    const b = await signedIn(t.app, planner.email, TEST_PASSWORD);
    const created = await a.post(`/api/projects/${project.id}/layouts`).send({ name: 'Cell A', content: content(model.id) });
    expect(created.status).toBe(201);
    const id = created.body.layout.id;
    expect(created.body.layout.version).toBe(1);

    const first = await a.put(`/api/layouts/${id}`).send({ version: 1, name: 'Cell A (moved picker)' });
    expect(first.status).toBe(200);
    expect(first.body.layout.version).toBe(2);
    const stale = await b.put(`/api/layouts/${id}`).send({ version: 1, name: 'Lost update' });
    expect(stale.status).toBe(409);
    expect(stale.body.currentVersion).toBe(2);
    expect((await Layout.findByPk(id))!.name).toBe('Cell A (moved picker)');
  });

  it('names the bad field: unknown arm model, duplicate ids, polygon under 3 points', async () => {
    const planner = await buildUser({ role: 'planner' });
    const model = await buildArmModel();
    const project = await buildProject();
    const a = await signedIn(t.app, planner.email, TEST_PASSWORD);
    const before = await Layout.count();
    const unknown = await a.post(`/api/projects/${project.id}/layouts`).send({ name: 'x', content: content(987654) });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.fields).toHaveProperty(['content.arms.0.armModelId']);
    const c = content(model.id);
    const dup = await a.post(`/api/projects/${project.id}/layouts`).send({ name: 'x', content: { ...c, arms: [c.arms[0], c.arms[0]] } });
    expect(dup.status).toBe(400);
    expect(dup.body.error.fields).toHaveProperty(['content.arms.1.id']);
    const poly = await a
      .post(`/api/projects/${project.id}/layouts`)
      .send({ name: 'x', content: { ...c, boundaries: [{ id: 'K1', kind: 'keepout', points: [[0, 0], [1, 1]] }] } });
    expect(poly.status).toBe(400);
    expect(poly.body.error.fields).toHaveProperty(['content.boundaries.0.points']);
    expect(await Layout.count()).toBe(before);
  });

  it('lets reviewers read but not write layouts, and hides them from clients', async () => {
    const reviewer = await buildUser({ role: 'reviewer' });
    const client = await buildUser({ role: 'client' });
    const model = await buildArmModel();
    const project = await buildProject({ members: [client] });
    const layout = await Layout.create({ projectId: project.id, floorPlanId: null, name: 'L', content: content(model.id), createdBy: null });
    const r = await signedIn(t.app, reviewer.email, TEST_PASSWORD);
    expect((await r.get(`/api/layouts/${layout.id}`)).status).toBe(200);
    expect((await r.put(`/api/layouts/${layout.id}`).send({ version: 1, name: 'no' })).status).toBe(403);
    const c = await signedIn(t.app, client.email, TEST_PASSWORD);
    expect((await c.get(`/api/layouts/${layout.id}`)).status).toBe(403);
    expect((await c.get(`/api/projects/${project.id}/layouts`)).status).toBe(403);
  });
});

describe('layout analysis endpoint', () => {
  it('analyses the stored layout and unsaved content with the shared engine; bad content is a 400', async () => {
    const reviewer = await buildUser({ role: 'reviewer' });
    // Links of zero radius: the whole-arm envelope of a full-range SCARA is then the disk of l1 + l2.
    const linkSizes = { innerLinkRadius: 0, outerLinkRadius: 0, toolRadius: 0 };
    const model = await buildArmModel({ params: { family: 'scara', innerLink: 500, outerLink: 500, strokeMin: 0, strokeMax: 300, axes: [{ min: -180, max: 180 }, { min: -180, max: 180 }], linkSizes } });
    const project = await buildProject();
    const content = {
      arms: [
        { id: 'R1', armModelId: model.id, label: '', x: 0, y: 0, yaw: 0, mountHeight: 0 },
        { id: 'R2', armModelId: model.id, label: '', x: 1000, y: 0, yaw: 0, mountHeight: 0 },
      ],
      workPoints: [{ id: 'P1', x: 500, y: 0, z: 100, approach: 'top', tag: '' }],
      boundaries: [],
      workHeights: [100],
    };
    const layout = await Layout.create({ projectId: project.id, floorPlanId: null, name: 'Analysed', content, createdBy: null });
    const agent = await signedIn(t.app, reviewer.email, TEST_PASSWORD);
    const res = await agent.post(`/api/layouts/${layout.id}/analysis`).send({});
    expect(res.status).toBe(200);
    expect(res.body.sharedZones).toHaveLength(1);
    // two unit disks 1 m apart share 1.22837 m² (Wolfram MathWorld, "Circle-Circle Intersection"); 1 mm chord tolerance errs outward
    expect(res.body.sharedZones[0].areaM2).toBeGreaterThan(1.2283);
    expect(res.body.sharedZones[0].areaM2).toBeLessThan(1.2283 * 1.002);
    expect(res.body.coverage.P1.R1).toBeGreaterThan(0);
    expect(res.body.findings.map((f: { id: string }) => f.id)).toContain('shared-zone:R1+R2');
    expect(typeof res.body.timingMs).toBe('number');
    const moved = await agent.post(`/api/layouts/${layout.id}/analysis`).send({ content: { ...content, arms: [content.arms[0], { ...content.arms[1], x: 5000 }] } });
    expect(moved.status).toBe(200);
    expect(moved.body.sharedZones).toHaveLength(0);
    const bad = await agent.post(`/api/layouts/${layout.id}/analysis`).send({ content: { ...content, arms: [{ ...content.arms[0], x: 'east' }] } });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty(['arms.0.x']);
  });
});

describe('layout analysis endpoint: safeguarding', () => {
  it('returns the safeguarding rows and findings, and refuses a bad safeguard naming its field', async () => {
    const planner = await buildUser({ role: 'planner' });
    // Reach 1000 mm (500 + 500 mm links), category 0 stopping time only.
    const model = await buildArmModel({ params: { family: 'scara', innerLink: 500, outerLink: 500, strokeMin: 0, strokeMax: 300, stopTimeS: 0.5, axes: [{ min: -180, max: 180 }, { min: -180, max: 180 }] } });
    const project = await buildProject();
    const boundaries = (safeguard: Record<string, unknown>) => [
      { id: 'F1', kind: 'fence', points: [[1500, -4000], [1500, 4000]], height: 2000 },
      { id: 'O1', kind: 'opening', points: [[1500, -500], [1500, 500]], fenceId: 'F1', safeguard },
    ];
    const content = { arms: [{ id: 'R1', armModelId: model.id, label: '', x: 0, y: 0, yaw: 0, mountHeight: 0 }], workPoints: [], boundaries: boundaries({ device: 'interlock', responseTimeS: 0.1, stopCategory: 0 }), workHeights: [100] };
    const layout = await Layout.create({ projectId: project.id, floorPlanId: null, name: 'Guarded', content, createdBy: null });
    const agent = await signedIn(t.app, planner.email, TEST_PASSWORD);
    const res = await agent.post(`/api/layouts/${layout.id}/analysis`).send({});
    expect(res.status).toBe(200);
    // ISO 13855, interlocked guard: S = 1600 mm/s × (0.1 + 0.5) s = 960 mm; the door is about 500 mm from the restricted space.
    expect(res.body.safeguarding.openings).toHaveLength(1);
    expect(res.body.safeguarding.openings[0]).toMatchObject({ id: 'O1', device: 'interlock', armId: 'R1', tS: 0.6, requiredMm: 960, ok: false });
    expect(res.body.safeguarding.fences.map((f: { id: string }) => f.id)).toEqual(['F1']);
    expect(res.body.findings.map((f: { id: string }) => f.id)).toContain('opening-too-close:O1+R1');
    // A category 1 safeguard on a model without the category 1 time: no distance, a finding that says so.
    const cat1 = await agent.post(`/api/layouts/${layout.id}/analysis`).send({ content: { ...content, boundaries: boundaries({ device: 'interlock', responseTimeS: 0.1, stopCategory: 1 }) } });
    expect(cat1.status).toBe(200);
    expect(cat1.body.safeguarding.openings[0]).toMatchObject({ requiredMm: null, ok: null });
    expect(cat1.body.findings.map((f: { id: string }) => f.id)).toContain('stopping-data-missing:O1+R1');
    const bad = await agent.post(`/api/layouts/${layout.id}/analysis`).send({ content: { ...content, boundaries: boundaries({ device: 'light-curtain', responseTimeS: 0.02, stopCategory: 0 }) } });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty(['boundaries.1.safeguard.resolutionMm']);
  });
});
