// Arm catalogue API and the kinematics endpoints, against a real PostgreSQL.
import { readdirSync } from 'node:fs';
import { polygonArea } from 'd3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_CATALOGUE_DIR, ensureBuiltInCatalogue, readDemoCatalogue } from '../../backend/src/db/demoCatalogue';
import { ArmModel, AuditEvent, Layout } from '../../backend/src/models';
import { ArmModelInput } from '../../backend/src/services/armModels';
import { buildProject, buildUser, TEST_PASSWORD } from '../support/factories';
import { createTestApp, signedIn, type TestApp } from '../support/testApp';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
  await ensureBuiltInCatalogue(t.sequelize);
});
afterAll(async () => t.close());

/**
 * Anthropomorphic 3R arm (Siciliano et al., Robotics: Modelling, Planning and Control, §2.9.3)
 * with a base height d1, written as a standard DH chain: J1 vertical (α = 90°, d = d1), then two
 * parallel links a2, a3. d1 = 300, a2 = 500, a3 = 400 mm.
 */
function threeR(limits: { j2?: [number, number]; j3?: [number, number] } = {}) {
  const [j2min, j2max] = limits.j2 ?? [-180, 180];
  const [j3min, j3max] = limits.j3 ?? [-180, 180];
  return {
    family: 'chain',
    convention: 'standard',
    joints: [
      { type: 'revolute', a: 0, alpha: 90, d: 300, theta: 0, min: -180, max: 180 },
      { type: 'revolute', a: 500, alpha: 0, d: 0, theta: 0, min: j2min, max: j2max },
      { type: 'revolute', a: 400, alpha: 0, d: 0, theta: 0, min: j3min, max: j3max },
    ],
    tool: { x: 0, y: 0, z: 0 },
    payloadKg: 5,
    stopTimeS: 0.3,
  };
}

/** The same anthropomorphic arm in the articulated family: J2 = upper arm from horizontal, J3 = forearm relative to it. */
function articulated3R(j1: [number, number] = [-180, 180]) {
  return {
    family: 'articulated',
    shoulderHeight: 300,
    shoulderOffset: 0,
    upperArm: 500,
    forearm: 400,
    axes: [
      { min: j1[0], max: j1[1] },
      { min: -180, max: 180 },
      { min: -180, max: 180 },
    ],
  };
}

/**
 * A linkage arm whose four-bar (crank a = 300, coupler b = 1100, rocker c = 320, ground d = 1150 mm)
 * cannot close at every crank angle: it assembles only while f ≤ b + c, with
 * f² = a² + d² − 2ad·cos θ2 (law of cosines, Norton, Design of Machinery, ch. 4). At θ2 = 180°
 * f = a + d = 1450 > b + c = 1420 [derived].
 */
function linkageArm() {
  return {
    family: 'linkage',
    shoulderHeight: 700,
    shoulderOffset: 250,
    upperArm: 1150,
    forearm: 1300,
    flangeOffset: { horizontal: 200, vertical: -150 },
    fourBar: { ground: 1150, crank: 300, coupler: 1100, rocker: 320, branch: 'crossed' },
    interiorAngle: { min: 10, max: 350 },
    axes: [
      { min: -180, max: 180 },
      { min: -40, max: 90, zeroOffset: 90, direction: -1 },
      { min: -180, max: 180 },
    ],
  };
}

/** Planar area of a GeoJSON Polygon / MultiPolygon in mm² (d3.polygonArea per ring, holes subtracted). */
function geoArea(g: { type: string; coordinates: number[][][] | number[][][][] }): number {
  const polys = (g.type === 'Polygon' ? [g.coordinates] : g.coordinates) as number[][][][];
  let sum = 0;
  for (const poly of polys) poly.forEach((ring, i) => (sum += (i === 0 ? 1 : -1) * Math.abs(polygonArea(ring as Array<[number, number]>))));
  return sum;
}

let seq = 0;
const uniqueName = (stem: string) => `${stem} ${++seq}-${process.pid}`;

async function planner() {
  const u = await buildUser({ role: 'planner' });
  return { user: u, agent: await signedIn(t.app, u.email, TEST_PASSWORD) };
}

describe('demo catalogue samples', () => {
  it('parses every samples/arm-models/*.json with the arm model schema and seeds each as built-in', async () => {
    const files = readdirSync(DEMO_CATALOGUE_DIR).filter((f) => f.endsWith('.json'));
    expect(files.length).toBeGreaterThan(0);
    const samples = readDemoCatalogue();
    expect(samples).toHaveLength(files.length);
    for (const s of samples) expect(ArmModelInput.safeParse(s).success).toBe(true);
    for (const s of samples) {
      const row = await ArmModel.findOne({ where: { name: s.name } });
      expect(row?.builtIn, s.name).toBe(true);
      expect(row?.family).toBe(s.params.family);
    }
  });

  it('upserts idempotently: a second start creates and changes nothing; a drifted built-in is refreshed', async () => {
    const count = await ArmModel.count();
    expect(await ensureBuiltInCatalogue(t.sequelize)).toEqual({ created: [], updated: [] });
    expect(await ArmModel.count()).toBe(count);
    const first = readDemoCatalogue()[0];
    const row = (await ArmModel.findOne({ where: { name: first.name } }))!;
    await row.update({ params: { ...row.params, payloadKg: 999 } });
    expect(await ensureBuiltInCatalogue(t.sequelize)).toEqual({ created: [], updated: [first.name] });
    await row.reload();
    expect(row.params).toEqual(first.params);
  });
});

describe('arm models', () => {
  it('every signed-in role reads the catalogue, with reach figures; anonymous gets 401', async () => {
    const client = await buildUser({ role: 'client' });
    const agent = await signedIn(t.app, client.email, TEST_PASSWORD);
    const list = await agent.get('/api/arm-models');
    expect(list.status).toBe(200);
    const names = list.body.armModels.map((m: { name: string }) => m.name);
    for (const s of readDemoCatalogue()) expect(names).toContain(s.name);
    const builtIn = list.body.armModels.find((m: { builtIn: boolean }) => m.builtIn);
    expect(builtIn.maxReach).toBeGreaterThan(0);
    expect(Object.keys(builtIn).sort()).toEqual(['builtIn', 'createdAt', 'createdBy', 'family', 'id', 'maxReach', 'minReach', 'name', 'params', 'reach', 'updatedAt']);
    const one = await agent.get(`/api/arm-models/${builtIn.id}`);
    expect(one.status).toBe(200);
    expect(one.body.armModel.name).toBe(builtIn.name);
    expect((await agent.get('/api/arm-models/99999999')).status).toBe(404);
    const anon = await (await import('supertest')).default(t.app).get('/api/arm-models');
    expect(anon.status).toBe(401);
  });

  it('a planner creates a model: 201, stored with its family, audited; the reach is that of the planar 2R annulus', async () => {
    const { user, agent } = await planner();
    const name = uniqueName('Test 3R');
    const res = await agent.post('/api/arm-models').send({ name, params: threeR() });
    expect(res.status).toBe(201);
    expect(res.body.armModel).toMatchObject({ name, family: 'chain', builtIn: false, createdBy: user.id });
    // Planar 2R with unlimited elbow reaches the annulus |l1 − l2| … l1 + l2 (Spong, Hutchinson &
    // Vidyasagar, Robot Modeling and Control, planar elbow arm): 100 … 900 mm here. The sampled
    // profile states its own tolerance; the reach lies within it.
    expect(Math.abs(res.body.armModel.maxReach - 900)).toBeLessThanOrEqual(20);
    const row = await ArmModel.findByPk(res.body.armModel.id);
    expect(row).toMatchObject({ name, family: 'chain', builtIn: false });
    const ev = await AuditEvent.findOne({ where: { action: 'armModel.create', entityId: String(row!.id) } });
    expect(ev?.actorId).toBe(user.id);
  });

  it('rejects invalid parameters with a message per field and stores nothing', async () => {
    const { agent } = await planner();
    const before = await ArmModel.count();
    const bad = threeR();
    bad.joints[1] = { ...bad.joints[1], min: 40, max: 10 };
    (bad.joints[2] as Record<string, unknown>).a = 'long';
    const res = await agent.post('/api/arm-models').send({ name: '   ', params: bad });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty(['name']);
    expect(res.body.error.fields).toHaveProperty(['params.joints.1.max']);
    expect(res.body.error.fields).toHaveProperty(['params.joints.2.a']);
    const noFamily = await agent.post('/api/arm-models').send({ name: uniqueName('No family'), params: { joints: [] } });
    expect(noFamily.status).toBe(400);
    expect(Object.keys(noFamily.body.error.fields).some((k) => k.startsWith('params'))).toBe(true);
    expect(await ArmModel.count()).toBe(before);
  });

  it('a duplicate name (any letter case) is 409 and stores nothing', async () => {
    const { agent } = await planner();
    const name = uniqueName('Dup arm');
    expect((await agent.post('/api/arm-models').send({ name, params: threeR() })).status).toBe(201);
    const before = await ArmModel.count();
    const dup = await agent.post('/api/arm-models').send({ name: name.toUpperCase(), params: threeR() });
    expect(dup.status).toBe(409);
    expect(dup.body.error.fields).toHaveProperty(['name']);
    expect(await ArmModel.count()).toBe(before);
  });

  it('reviewer and client may not write (403); nothing changes', async () => {
    const before = await ArmModel.count();
    for (const role of ['reviewer', 'client'] as const) {
      const u = await buildUser({ role });
      const agent = await signedIn(t.app, u.email, TEST_PASSWORD);
      expect((await agent.post('/api/arm-models').send({ name: uniqueName('Nope'), params: threeR() })).status).toBe(403);
    }
    expect(await ArmModel.count()).toBe(before);
  });

  it('updates an own model (audited); built-ins are read-only (409, unchanged) and can be duplicated', async () => {
    const { user, agent } = await planner();
    const created = await agent.post('/api/arm-models').send({ name: uniqueName('Edit me'), params: threeR() });
    const id = created.body.armModel.id;
    const renamed = uniqueName('Edited');
    const put = await agent.put(`/api/arm-models/${id}`).send({ name: renamed, params: threeR({ j2: [-90, 90] }) });
    expect(put.status).toBe(200);
    expect(put.body.armModel.name).toBe(renamed);
    expect((await ArmModel.findByPk(id))!.params).toMatchObject({ joints: [{}, { min: -90, max: 90 }, {}] });
    expect(await AuditEvent.count({ where: { action: 'armModel.update', entityId: String(id), actorId: user.id } })).toBe(1);

    const builtIn = (await ArmModel.findOne({ where: { builtIn: true } }))!;
    const putBuiltIn = await agent.put(`/api/arm-models/${builtIn.id}`).send({ name: builtIn.name, params: threeR() });
    expect(putBuiltIn.status).toBe(409);
    expect(putBuiltIn.body.error.message).toMatch(/built-in/i);
    expect((await agent.delete(`/api/arm-models/${builtIn.id}`)).status).toBe(409);
    const after = (await ArmModel.findByPk(builtIn.id))!;
    expect(after.params).toEqual(builtIn.params);

    const copy = await agent.post('/api/arm-models').send({ name: `${builtIn.name} (copy ${seq})`, params: builtIn.params });
    expect(copy.status).toBe(201);
    expect(copy.body.armModel.builtIn).toBe(false);
  });

  it('a model placed in a layout cannot be deleted (409 naming the layout); once removed it can (204, audited)', async () => {
    const { user, agent } = await planner();
    const created = await agent.post('/api/arm-models').send({ name: uniqueName('In use'), params: threeR() });
    const id = created.body.armModel.id;
    const project = await buildProject({ name: 'Line 3 end-of-line cell (test)' });
    const layout = await Layout.create({
      projectId: project.id,
      floorPlanId: null,
      name: 'Case packer bay',
      content: { arms: [{ id: 'R1', armModelId: id, label: 'Packer', x: 0, y: 0, yaw: 0, mountHeight: 0 }], workPoints: [], boundaries: [], workHeights: [] },
      createdBy: null,
    });
    const del = await agent.delete(`/api/arm-models/${id}`);
    expect(del.status).toBe(409);
    expect(del.body.error.message).toContain('Case packer bay');
    expect(del.body.layouts).toEqual([{ id: layout.id, name: 'Case packer bay', projectId: project.id, projectName: project.name }]);
    expect(await ArmModel.findByPk(id)).not.toBeNull();

    await layout.destroy();
    expect((await agent.delete(`/api/arm-models/${id}`)).status).toBe(204);
    expect(await ArmModel.findByPk(id)).toBeNull();
    expect(await AuditEvent.count({ where: { action: 'armModel.delete', entityId: String(id), actorId: user.id } })).toBe(1);
  });
});

describe('kinematics endpoints', () => {
  it('forward: inline parameters match the anthropomorphic 3R closed form', async () => {
    const { agent } = await planner();
    const res = await agent.post('/api/kinematics/forward').send({ model: threeR(), joints: [45, 30, -60] });
    expect(res.status).toBe(200);
    // Siciliano et al. §2.9.3 with d1 added to z: θ = (45°, 30°, −60°) → (551.1, 551.1, 350.0) mm [derived, docs/sources.md].
    expect(res.body.tool.x).toBeCloseTo(551.1, 1);
    expect(res.body.tool.y).toBeCloseTo(551.1, 1);
    expect(res.body.tool.z).toBeCloseTo(350.0, 6);
    expect(res.body.frames.map((f: { label: string }) => f.label)).toEqual(['base', 'J1', 'J2', 'J3', 'tool']);
    // The elbow (frame J2) sits at a2 from the shoulder: (a2 cos θ2 cos θ1, a2 cos θ2 sin θ1, d1 + a2 sin θ2).
    const elbow = res.body.frames[2].origin;
    expect(elbow.x).toBeCloseTo(500 * Math.cos(Math.PI / 6) * Math.SQRT1_2, 6);
    expect(elbow.z).toBeCloseTo(300 + 250, 6);
  });

  it('forward: a stored model by {id}; out-of-limits is 422 with the reason; bad input is 400 / 404', async () => {
    const { agent } = await planner();
    const created = await agent.post('/api/arm-models').send({ name: uniqueName('By id'), params: threeR({ j2: [-90, 90] }) });
    const id = created.body.armModel.id;
    const ok = await agent.post('/api/kinematics/forward').send({ model: { id }, joints: [0, 90, 0] });
    expect(ok.status).toBe(200);
    // Straight up: z = d1 + a2 + a3 = 1200 mm, on the J1 axis.
    expect(ok.body.tool.z).toBeCloseTo(1200, 6);
    expect(Math.hypot(ok.body.tool.x, ok.body.tool.y)).toBeLessThan(1e-6);

    const out = await agent.post('/api/kinematics/forward').send({ model: { id }, joints: [0, 120, 0] });
    expect(out.status).toBe(422);
    expect(out.body.reason).toBe('out-of-limits');
    expect(out.body.axis).toBe(2);
    expect(out.body.error.message).toMatch(/J2/);
    expect(JSON.stringify(out.body)).not.toMatch(/NaN|null/);

    const count = await agent.post('/api/kinematics/forward').send({ model: { id }, joints: [0, 0] });
    expect(count.status).toBe(422);
    expect(count.body.reason).toBe('bad-joint-count');

    const badJoint = await agent.post('/api/kinematics/forward').send({ model: { id }, joints: [0, 'x', 0] });
    expect(badJoint.status).toBe(400);
    expect(badJoint.body.error.fields).toHaveProperty(['joints.1']);

    const badModel = threeR();
    (badModel.joints[1] as Record<string, unknown>).a = -1e9;
    const bm = await agent.post('/api/kinematics/forward').send({ model: badModel, joints: [0, 0, 0] });
    expect(bm.status).toBe(400);
    expect(bm.body.error.fields).toHaveProperty(['model.joints.1.a']);

    expect((await agent.post('/api/kinematics/forward').send({ model: { id: 99999999 }, joints: [0, 0, 0] })).status).toBe(404);
  });

  it('reach: profile, tolerance and reaches of a stored model; the same for inline parameters', async () => {
    const { agent } = await planner();
    const created = await agent.post('/api/arm-models').send({ name: uniqueName('Reach'), params: threeR() });
    const byId = await agent.post('/api/kinematics/reach').send({ model: { id: created.body.armModel.id } });
    expect(byId.status).toBe(200);
    const { tolerance, maxReach, minReach, profile } = byId.body;
    expect(tolerance).toBeGreaterThan(0);
    // Planar 2R annulus |l1 − l2| … l1 + l2 = 100 … 900 mm about the shoulder (Spong et al., planar
    // elbow arm), within the stated tolerance. The annulus crosses the J1 axis (at z = 300 ± 100 … 900),
    // so the smallest horizontal reach of the region is 0.
    expect(Math.abs(maxReach - 900)).toBeLessThanOrEqual(tolerance + 1e-9);
    expect(minReach).toBe(0);
    expect(profile.polygons.length).toBeGreaterThan(0);
    // The annulus is centred on the shoulder (z = d1 = 300 mm): its height runs 300 ± 900 mm.
    expect(Math.abs(profile.zMax - 1200)).toBeLessThanOrEqual(tolerance + 1e-9);
    const inline = await agent.post('/api/kinematics/reach').send({ model: threeR() });
    expect(inline.status).toBe(200);
    expect(inline.body.maxReach).toBe(maxReach);
  });

  it('forward, articulated family: the wrist centre matches the anthropomorphic 3R closed form', async () => {
    const { agent } = await planner();
    const res = await agent.post('/api/kinematics/forward').send({ model: articulated3R(), joints: [45, 30, -60] });
    expect(res.status).toBe(200);
    // Siciliano et al. §2.9.3 with d1 = 300 added to z: θ = (45°, 30°, −60°) → (551.1, 551.1, 350.0) mm [derived, docs/sources.md].
    expect(res.body.wrist.x).toBeCloseTo(551.1, 1);
    expect(res.body.wrist.y).toBeCloseTo(551.1, 1);
    expect(res.body.wrist.z).toBeCloseTo(350.0, 6);
  });

  it('forward, linkage family: a pose whose four-bar cannot close is 422 not-assemblable, never NaN', async () => {
    const { agent } = await planner();
    const created = await agent.post('/api/arm-models').send({ name: uniqueName('Palletizer test'), params: linkageArm() });
    expect(created.status).toBe(201);
    // J2 = 0 → upper arm vertical (kinematic 90°); J3 = −90 → crank absolute −90°: θ2 = −180° from the upper arm.
    const res = await agent.post('/api/kinematics/forward').send({ model: { id: created.body.armModel.id }, joints: [0, 0, -90] });
    expect(res.status).toBe(422);
    expect(res.body.reason).toBe('not-assemblable');
    expect(res.body.error.code).toBe('not_assemblable');
    expect(JSON.stringify(res.body)).not.toMatch(/NaN/);
    // θ2 = −90° − 90° + 120° = −60°: f² = a² + d² − 2ad·cos 60° → f ≈ 1035 mm ≤ 1420: it closes.
    const ok = await agent.post('/api/kinematics/forward').send({ model: { id: created.body.armModel.id }, joints: [0, 0, 30] });
    expect(ok.status).toBe(200);
    expect(Number.isFinite(ok.body.tool.x)).toBe(true);
  });

  it('reach bands: a slice through the 3R annulus gives two annular sectors of (θ/2)(R² − r²) each', async () => {
    const { agent } = await planner();
    const res = await agent.post('/api/kinematics/reach').send({ model: articulated3R([-45, 45]), heights: [300, 5000] });
    expect(res.status).toBe(200);
    const [atShoulder, above] = res.body.bands;
    expect(atShoulder.height).toBe(300);
    // At the shoulder height the profile (annulus 100 … 900 mm about the shoulder, Spong et al.) is
    // cut at r ∈ ±[100, 900]; over J1 = −45 … 45° that is a 90° sector in front and one turned 180°
    // behind: 2 × (π/2)/2 × (900² − 100²) = 1 256 637 mm² (annular sector area [derived, docs/sources.md]).
    // The band errs outward (outer arcs circumscribed), so it may be a little larger, never smaller.
    const expected = (Math.PI / 2) * (900 ** 2 - 100 ** 2);
    const area = geoArea(atShoulder.geometry);
    expect(area).toBeGreaterThanOrEqual(expected * 0.999);
    expect(area).toBeLessThanOrEqual(expected * 1.01);
    // Above the reach (z = 5000 mm > 300 + 900) the band is empty.
    expect(geoArea(above.geometry)).toBe(0);
    const bad = await agent.post('/api/kinematics/reach').send({ model: articulated3R(), heights: ['high'] });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty(['heights.0']);
  });

  it('anonymous callers get 401 on both endpoints', async () => {
    const request = (await import('supertest')).default;
    expect((await request(t.app).post('/api/kinematics/forward').send({ model: threeR(), joints: [0, 0, 0] })).status).toBe(401);
    expect((await request(t.app).post('/api/kinematics/reach').send({ model: threeR() })).status).toBe(401);
  });
});

describe('stored reach figures', () => {
  it('are computed when a model is saved, and the list reads them from the row instead of recomputing', async () => {
    const { agent } = await planner();
    const created = await agent.post('/api/arm-models').send({ name: uniqueName('Stored reach 3R'), params: threeR() });
    expect(created.status).toBe(201);
    // Fully stretched, the tool point of the 3R arm lies a2 + a3 = 900 mm from the J1 axis, and its
    // highest point is d1 + a2 + a3 = 1200 mm (sum of link lengths; textbook geometry of a planar
    // chain); the stored profile may lie outside the true region by at most its tolerance.
    const row = (await ArmModel.findByPk(created.body.armModel.id))!;
    const s = row.reachSummary!;
    expect(['exact', 'sampled']).toContain(s.method);
    expect(Math.abs(s.maxReach - 900)).toBeLessThanOrEqual(s.toleranceMm + 1e-6);
    expect(Math.abs(s.zMax - 1200)).toBeLessThanOrEqual(s.toleranceMm + 1e-6);
    expect(created.body.armModel.maxReach).toBe(s.maxReach);

    // Change only the stored figures: a list that recomputed profiles would still say 900 mm.
    await t.sequelize.query(`UPDATE arm_models SET "reachSummary" = jsonb_set("reachSummary", '{maxReach}', '12345') WHERE id = :id`, {
      replacements: { id: row.id },
    });
    const list = await agent.get('/api/arm-models');
    const listed = list.body.armModels.find((m: { id: number }) => m.id === row.id);
    expect(listed.maxReach).toBe(12345);

    // Saving new parameters stores new figures (a2 = 600: 1000 mm stretched).
    const changed = threeR();
    changed.joints[1].a = 600;
    const updated = await agent.put(`/api/arm-models/${row.id}`).send({ name: row.name, params: changed });
    expect(updated.status).toBe(200);
    const after = (await ArmModel.findByPk(row.id))!.reachSummary!;
    expect(Math.abs(after.maxReach - 1000)).toBeLessThanOrEqual(after.toleranceMm + 1e-6);
    expect(updated.body.armModel.maxReach).toBe(after.maxReach);
  });

  it('are filled in for existing rows by the migration, whose down removes the column again', async () => {
    const migration = await import('../../backend/src/db/migrations/20261202092000-add-arm-model-reach-summary');
    const qi = t.sequelize.getQueryInterface();
    await migration.down({ context: qi });
    expect(Object.keys(await qi.describeTable('arm_models'))).not.toContain('reachSummary');
    await migration.up({ context: qi });
    const [rows] = (await t.sequelize.query('SELECT params, "reachSummary" FROM arm_models')) as [Array<{ params: unknown; reachSummary: { maxReach: number } | null }>, unknown];
    expect(rows.length).toBeGreaterThan(0);
    for (const r of rows) expect(r.reachSummary?.maxReach ?? 0).toBeGreaterThan(0);
  });
});
