import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createMigrator } from '../../backend/src/db/migrate';
import { FloorPlan, Layout, ProjectLayerRoles, User } from '../../backend/src/models';
import { importDxf } from '../../backend/src/services/dxf';
import { buildProject, buildUser, TEST_PASSWORD } from '../support/factories';
import { createTestApp, signedIn, type TestApp } from '../support/testApp';

/** A hand-written ASCII DXF: a 10 m × 6 m outline (LWPOLYLINE) and one wall line, in the given $INSUNITS. */
function tinyDxf(insunits = 4): string {
  const g = (code: number, value: string | number) => `${code}\n${value}\n`;
  const head = g(0, 'SECTION') + g(2, 'HEADER') + g(9, '$INSUNITS') + g(70, insunits) + g(0, 'ENDSEC');
  const outline =
    g(0, 'LWPOLYLINE') + g(8, 'OUTLINE') + g(90, 4) + g(70, 1) +
    g(10, 0) + g(20, 0) + g(10, 10000) + g(20, 0) + g(10, 10000) + g(20, 6000) + g(10, 0) + g(20, 6000);
  const wall = g(0, 'LINE') + g(8, 'WALLS') + g(10, 5000) + g(20, 0) + g(30, 0) + g(11, 5000) + g(21, 4000) + g(31, 0);
  return head + g(0, 'SECTION') + g(2, 'ENTITIES') + outline + wall + g(0, 'ENDSEC') + g(0, 'EOF');
}

/** A closed square outline of side `s` drawing units at (x, y), on layer `layer`, in the given $INSUNITS. */
function squareDxf(s: number, opts: { x?: number; y?: number; layer?: string; insunits?: number; wall?: string } = {}): string {
  const g = (code: number, value: string | number) => `${code}\n${value}\n`;
  const { x = 0, y = 0, layer = 'OUTLINE', insunits = 4 } = opts;
  const head = g(0, 'SECTION') + g(2, 'HEADER') + g(9, '$INSUNITS') + g(70, insunits) + g(0, 'ENDSEC');
  const outline =
    g(0, 'LWPOLYLINE') + g(8, layer) + g(90, 4) + g(70, 1) +
    g(10, x) + g(20, y) + g(10, x + s) + g(20, y) + g(10, x + s) + g(20, y + s) + g(10, x) + g(20, y + s);
  const wall = opts.wall ? g(0, 'LINE') + g(8, opts.wall) + g(10, x) + g(20, y) + g(11, x + s / 2) + g(21, y) : '';
  return head + g(0, 'SECTION') + g(2, 'ENTITIES') + outline + wall + g(0, 'ENDSEC') + g(0, 'EOF');
}

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => t.close());

async function plannerAgent() {
  const planner = await buildUser({ role: 'planner' });
  return signedIn(t.app, planner.email, TEST_PASSWORD);
}

describe('floor-plan upload', () => {
  it('imports an ASCII DXF into mm, lists layers with guessed roles, and keeps the original bytes', async () => {
    const agent = await plannerAgent();
    const project = await buildProject();
    const text = tinyDxf(4);
    const res = await agent.post(`/api/projects/${project.id}/floor-plans`).attach('file', Buffer.from(text), 'hall.dxf');
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ units: 'mm', unitsSource: 'header', bounds: { minX: 0, minY: 0, maxX: 10000, maxY: 6000 } });
    const roles = Object.fromEntries(res.body.layers.map((l: { name: string; role: string }) => [l.name, l.role]));
    expect(roles).toEqual({ OUTLINE: 'outline', WALLS: 'wall' });
    const full = await agent.get(`/api/floor-plans/${res.body.id}`);
    expect(full.body.geometry.type).toBe('FeatureCollection');
    expect(full.body.geometry.features.length).toBe(2);
    const src = await agent.get(`/api/floor-plans/${res.body.id}/source`).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(src.status).toBe(200);
    expect((src.body as Buffer).toString('utf8')).toBe(text);
    const list = await agent.get(`/api/projects/${project.id}/floor-plans`);
    expect(list.body.floorPlans.map((p: { id: number }) => p.id)).toEqual([res.body.id]);
    expect(list.body.floorPlans[0].geometry).toBeUndefined();
  });

  it('answers binary DXF, random bytes and empty files with a clear 4xx and stores nothing', async () => {
    const agent = await plannerAgent();
    const project = await buildProject();
    const before = await FloorPlan.count();
    const binary = Buffer.concat([Buffer.from('AutoCAD Binary DXF\r\n\x1a\x00', 'latin1'), Buffer.alloc(64, 7)]);
    const bin = await agent.post(`/api/projects/${project.id}/floor-plans`).attach('file', binary, 'plan.dxf');
    expect(bin.status).toBe(415);
    expect(bin.body.error.message).toMatch(/ASCII/i);
    const junk = await agent.post(`/api/projects/${project.id}/floor-plans`).attach('file', Buffer.from([0xff, 0xd8, 0xff, 0xe0, 0, 1, 2, 3, 250, 251]), 'photo.dxf');
    expect(junk.status).toBe(415);
    const truncated = await agent.post(`/api/projects/${project.id}/floor-plans`).attach('file', Buffer.from(tinyDxf().slice(0, 180)), 'cut.dxf');
    expect(truncated.status).toBeGreaterThanOrEqual(400);
    expect(truncated.status).toBeLessThan(500);
    expect(truncated.body.error.message.length).toBeGreaterThan(10);
    const empty = await agent.post(`/api/projects/${project.id}/floor-plans`).attach('file', Buffer.alloc(0), 'empty.dxf');
    expect(empty.status).toBe(400);
    const nofile = await agent.post(`/api/projects/${project.id}/floor-plans`).field('note', 'x');
    expect(nofile.status).toBe(400);
    expect(await FloorPlan.count()).toBe(before);
    expect((await request(t.app).get('/api/health')).status).toBe(200);
  });

  it('refuses a file over the size cap with 413 naming the cap', async () => {
    const small = t.appWith({ UPLOAD_LIMIT_MB: '0.001' });
    const planner = await buildUser({ role: 'planner' });
    const agent = await signedIn(small, planner.email, TEST_PASSWORD);
    const project = await buildProject();
    const res = await agent.post(`/api/projects/${project.id}/floor-plans`).attach('file', Buffer.from(tinyDxf() + ' '.repeat(4000)), 'big.dxf');
    expect(res.status).toBe(413);
    expect(res.body.error.message).toMatch(/0 MB|0\.\d+ MB|limit/);
  });

  it('changes layer roles and heights, and re-reads the drawing when the unit changes (inches → ×25.4)', async () => {
    const agent = await plannerAgent();
    const project = await buildProject();
    const up = await agent.post(`/api/projects/${project.id}/floor-plans`).attach('file', Buffer.from(tinyDxf(1)), 'inches.dxf');
    expect(up.status).toBe(201);
    expect(up.body.units).toBe('in');
    expect(up.body.bounds.maxX).toBeCloseTo(254000, 6);
    const roles = await agent.patch(`/api/floor-plans/${up.body.id}`).send({ layers: [{ name: 'WALLS', role: 'obstacle', height: 1200 }] });
    expect(roles.status).toBe(200);
    expect(roles.body.layers.find((l: { name: string }) => l.name === 'WALLS')).toMatchObject({ role: 'obstacle', height: 1200 });
    const units = await agent.patch(`/api/floor-plans/${up.body.id}`).send({ units: 'mm' });
    expect(units.status).toBe(200);
    expect(units.body).toMatchObject({ units: 'mm', unitsSource: 'chosen' });
    expect(units.body.bounds.maxX).toBeCloseTo(10000, 6);
    // the planner's role choice survives the re-read
    expect(units.body.layers.find((l: { name: string }) => l.name === 'WALLS')).toMatchObject({ role: 'obstacle', height: 1200 });
    const bad = await agent.patch(`/api/floor-plans/${up.body.id}`).send({ layers: [{ name: 'NOPE', role: 'wall' }] });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty(['layers.0.name']);
  });

  it('refuses to delete a plan a layout uses (409 naming it), deletes an unused one', async () => {
    const agent = await plannerAgent();
    const project = await buildProject();
    const up = await agent.post(`/api/projects/${project.id}/floor-plans`).attach('file', Buffer.from(tinyDxf()), 'hall.dxf');
    const layout = await Layout.create({ projectId: project.id, floorPlanId: up.body.id, name: 'Cell layout', content: { arms: [], workPoints: [], boundaries: [], workHeights: [] }, createdBy: null });
    const refused = await agent.delete(`/api/floor-plans/${up.body.id}`);
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toContain('Cell layout');
    await layout.destroy();
    expect((await agent.delete(`/api/floor-plans/${up.body.id}`)).status).toBe(204);
    expect(await FloorPlan.findByPk(up.body.id)).toBeNull();
  });

  it('lets clients and reviewers read but never upload', async () => {
    const client = await buildUser({ role: 'client' });
    const reviewer = await buildUser({ role: 'reviewer' });
    const project = await buildProject({ members: [client] });
    const agent = await plannerAgent();
    const up = await agent.post(`/api/projects/${project.id}/floor-plans`).attach('file', Buffer.from(tinyDxf()), 'hall.dxf');
    for (const u of [client, reviewer]) {
      const a = await signedIn(t.app, u.email, TEST_PASSWORD);
      expect((await a.get(`/api/floor-plans/${up.body.id}`)).status).toBe(200);
      expect((await a.post(`/api/projects/${project.id}/floor-plans`).attach('file', Buffer.from(tinyDxf()), 'x.dxf')).status).toBe(403);
      expect((await a.patch(`/api/floor-plans/${up.body.id}`).send({ units: 'm' })).status).toBe(403);
    }
    const outsider = await buildUser({ role: 'client' });
    const o = await signedIn(t.app, outsider.email, TEST_PASSWORD);
    expect((await o.get(`/api/floor-plans/${up.body.id}`)).status).toBe(404);
  });
});

describe('demo floor plan', () => {
  it('seeds the Fernhill hall into the demo project through the real importer', async () => {
    const { seedDemoIfEmpty } = await import('../../backend/src/db/seed');
    const { featureSeedSteps } = await import('../../backend/src/features');
    const { User } = await import('../../backend/src/models');
    await User.destroy({ where: {}, cascade: true });
    expect(await seedDemoIfEmpty(t.sequelize, { bcryptCost: 4, steps: featureSeedSteps() })).toBe(true);
    const plans = await FloorPlan.findAll();
    const demo = plans.find((p) => p.fileName === 'fernhill-hall.dxf');
    expect(demo).toBeDefined();
    expect(demo!.units).toBe('mm');
    // the demo hall is about 24 m × 16 m (docs/product.md "Demo scenario")
    expect(demo!.bounds.maxX - demo!.bounds.minX).toBeGreaterThan(20000);
    expect(demo!.bounds.maxY - demo!.bounds.minY).toBeGreaterThan(14000);
  });

  it('seeds the Fernhill line 3 layout on that hall; its analysis reaches every work point and finds the pickers\' shared zone', async () => {
    const { Layout } = await import('../../backend/src/models');
    const { analyzeLayout } = await import('../../backend/src/services/layoutAnalysis');
    const layout = await Layout.findOne({ where: { name: 'Fernhill line 3 — cell layout' } });
    expect(layout).not.toBeNull();
    expect(layout!.floorPlanId).not.toBeNull();
    const result = await analyzeLayout(layout!);
    const ids = result.findings.map((f) => f.id);
    expect(ids).toContain('shared-zone:R1+R2');
    expect(result.findings.filter((f) => f.kind === 'unreached-point')).toEqual([]);
    expect(result.findings.filter((f) => f.kind === 'computation-failed')).toEqual([]);
  });
});

describe('import limits', () => {
  /** Many short lines on one layer: a drawing that takes a worker a while to read. */
  function manyLines(n: number): string {
    const g = (code: number, value: string | number) => `${code}\n${value}\n`;
    let body = '';
    for (let i = 0; i < n; i++) body += g(0, 'LINE') + g(8, 'WALLS') + g(10, i * 10) + g(20, 0) + g(11, i * 10) + g(21, 500 + (i % 7));
    return g(0, 'SECTION') + g(2, 'HEADER') + g(9, '$INSUNITS') + g(70, 4) + g(0, 'ENDSEC') + g(0, 'SECTION') + g(2, 'ENTITIES') + body + g(0, 'ENDSEC') + g(0, 'EOF');
  }

  it('beyond the configured number of imports at once, an upload gets 429 with Retry-After and a sentence; nothing half-stored', async () => {
    const one = t.appWith({ DXF_IMPORT_CONCURRENCY: '1' });
    const planner = await buildUser({ role: 'planner' });
    const agent = await signedIn(one, planner.email, TEST_PASSWORD);
    const project = await buildProject();
    const big = Buffer.from(manyLines(40_000));
    const [a, b] = await Promise.all([
      agent.post(`/api/projects/${project.id}/floor-plans`).attach('file', big, 'a.dxf'),
      new Promise((r) => setTimeout(r, 50)).then(() => agent.post(`/api/projects/${project.id}/floor-plans`).attach('file', Buffer.from(tinyDxf()), 'b.dxf')),
    ]);
    expect(a.status).toBe(201);
    expect(b.status).toBe(429);
    expect(b.headers['retry-after']).toMatch(/^\d+$/);
    expect(b.body.error.code).toBe('imports_busy');
    expect(b.body.error.message).toMatch(/being read on this server right now.*try again in \d+ seconds/);
    expect(await FloorPlan.count({ where: { projectId: project.id } })).toBe(1);
    // the slot is free again once the first import is done
    const c = await agent.post(`/api/projects/${project.id}/floor-plans`).attach('file', Buffer.from(tinyDxf()), 'c.dxf');
    expect(c.status).toBe(201);
  });

  it('a small drawing with a huge block array is refused with 400 naming the count and the cap', async () => {
    const g = (code: number, value: string | number) => `${code}\n${value}\n`;
    let block = '';
    for (let i = 0; i < 10; i++) block += g(0, 'LINE') + g(8, '0') + g(10, i * 10) + g(20, 0) + g(11, i * 10) + g(21, 5);
    const text =
      g(0, 'SECTION') + g(2, 'HEADER') + g(9, '$INSUNITS') + g(70, 4) + g(0, 'ENDSEC') +
      g(0, 'SECTION') + g(2, 'BLOCKS') + g(0, 'BLOCK') + g(8, '0') + g(2, 'TILE') + g(70, 0) + g(10, 0) + g(20, 0) + g(3, 'TILE') + block + g(0, 'ENDBLK') + g(8, '0') + g(0, 'ENDSEC') +
      g(0, 'SECTION') + g(2, 'ENTITIES') + g(0, 'INSERT') + g(8, 'FLOOR') + g(2, 'TILE') + g(10, 0) + g(20, 0) + g(70, 1000) + g(71, 1000) + g(44, 200) + g(45, 200) + g(0, 'ENDSEC') + g(0, 'EOF');
    const agent = await plannerAgent();
    const project = await buildProject();
    const res = await agent.post(`/api/projects/${project.id}/floor-plans`).attach('file', Buffer.from(text), 'tiles.dxf');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('dxf_too_complex');
    expect(res.body.error.message).toContain('10 000 000');
    expect(res.body.error.message).toContain('2 000 000');
    expect(await FloorPlan.count({ where: { projectId: project.id } })).toBe(0);
  });
});

describe('real drawings: unit plausibility, local origin, saved layer roles', () => {
  it('says when the extent is implausible for the unit and offers the unit that fits; choosing it makes it plausible', async () => {
    const agent = await plannerAgent();
    const project = await buildProject();
    // 870 units read as mm = 0.87 m; in inches (25.4 mm exactly, NIST SP 811) 22 m
    const up = await agent.post(`/api/projects/${project.id}/floor-plans`).attach('file', Buffer.from(squareDxf(870)), 'house.dxf');
    expect(up.status).toBe(201);
    expect(up.body.unitCheck).toMatchObject({ plausible: false, suggestion: { units: 'in' } });
    expect(up.body.unitCheck.message).toContain('in inches it would be 22 m');
    expect(up.body.warnings).toContain(up.body.unitCheck.message);
    const fixed = await agent.patch(`/api/floor-plans/${up.body.id}`).send({ units: up.body.unitCheck.suggestion.units });
    expect(fixed.status).toBe(200);
    expect(fixed.body.unitCheck).toMatchObject({ plausible: true, suggestion: null });
    expect(fixed.body.bounds.maxX).toBeCloseTo(870 * 25.4, 6);
  });

  it('stores the local origin of a map-grid drawing with the plan and answers it', async () => {
    const agent = await plannerAgent();
    const project = await buildProject();
    const up = await agent
      .post(`/api/projects/${project.id}/floor-plans`)
      .attach('file', Buffer.from(squareDxf(30_000, { x: 512_345_678, y: 5_012_345_678 })), 'site.dxf');
    expect(up.status).toBe(201);
    expect(up.body.origin).toEqual({ x: 512_345_000, y: 5_012_345_000 });
    expect(up.body.bounds).toEqual({ minX: 678, minY: 678, maxX: 30_678, maxY: 30_678 });
    const row = await FloorPlan.findByPk(up.body.id);
    expect(row!.origin).toEqual({ x: 512_345_000, y: 5_012_345_000 });
    expect(row!.notes).toEqual({ ignored: [], unread: [] });

    // a layout drawn on it is exported where the building lies in its drawing
    const planner = await User.findOne({ where: {}, order: [['id', 'DESC']] });
    const layout = await Layout.create({
      projectId: project.id,
      floorPlanId: up.body.id,
      name: 'On the site plan',
      content: { arms: [], workPoints: [], workHeights: [], boundaries: [{ id: 'K1', kind: 'keepout', label: '', points: [[1000, 1000], [5000, 1000], [5000, 4000]] }] },
      createdBy: planner!.id,
    });
    const dxf = await agent.get(`/api/layouts/${layout.id}/layout.dxf`);
    expect(dxf.status).toBe(200);
    const back = importDxf(dxf.text); // read back with the importer, which moves it to a local origin again
    expect(back.origin.x + back.bounds.minX).toBeCloseTo(512_345_000 + 1000, 3);
    expect(back.origin.y + back.bounds.maxY).toBeCloseTo(5_012_345_000 + 4000, 3);
  });

  it('saves layer roles for the project and applies them to the next upload (names matched ignoring case)', async () => {
    const agent = await plannerAgent();
    const project = await buildProject();
    const empty = await agent.get(`/api/projects/${project.id}/layer-roles`);
    expect(empty.body).toEqual({ layers: [], updatedAt: null });
    const bad = await agent.put(`/api/projects/${project.id}/layer-roles`).send({ layers: [{ name: 'L-17', role: 'roof', height: null }] });
    expect(bad.status).toBe(400);
    expect(await ProjectLayerRoles.count({ where: { projectId: project.id } })).toBe(0);
    const saved = await agent
      .put(`/api/projects/${project.id}/layer-roles`)
      .send({ layers: [{ name: 'L-17', role: 'outline', height: null }, { name: 'L-20', role: 'wall', height: 2400 }] });
    expect(saved.status).toBe(200);
    expect((await ProjectLayerRoles.findByPk(project.id))!.layers).toHaveLength(2);
    // without the saved roles both layers would be guessed as obstacles
    const up = await agent
      .post(`/api/projects/${project.id}/floor-plans`)
      .attach('file', Buffer.from(squareDxf(20_000, { layer: 'l-17', wall: 'L-20' })), 'next.dxf');
    expect(up.status).toBe(201);
    const roles = Object.fromEntries(up.body.layers.map((l: { name: string; role: string; height: number | null }) => [l.name, [l.role, l.height]]));
    expect(roles).toEqual({ 'l-17': ['outline', null], 'L-20': ['wall', 2400] });
    expect(up.body.warnings).toContain('2 layers take their roles from the roles saved for this project.');
    const other = await buildProject();
    const elsewhere = await agent.post(`/api/projects/${other.id}/floor-plans`).attach('file', Buffer.from(squareDxf(20_000, { layer: 'L-17' })), 'x.dxf');
    expect(elsewhere.body.layers[0].role).toBe('obstacle');
    const reviewer = await buildUser({ role: 'reviewer' });
    const r = await signedIn(t.app, reviewer.email, TEST_PASSWORD);
    expect((await r.put(`/api/projects/${project.id}/layer-roles`).send({ layers: [] })).status).toBe(403);
  });

  it('the migration that adds the origin, notes and saved roles goes down and up again', async () => {
    const m = createMigrator(t.sequelize);
    const name = '20261202094000-add-floor-plan-origin-and-layer-roles';
    const all = (await m.executed()).map((x) => x.name);
    const i = all.indexOf(name);
    expect(i).toBeGreaterThanOrEqual(0);
    await m.down({ to: name });
    const qi = t.sequelize.getQueryInterface();
    expect(Object.keys(await qi.describeTable('floor_plans'))).not.toContain('origin');
    expect((await qi.showAllTables()).map(String)).not.toContain('project_layer_roles');
    await m.up();
    expect(Object.keys(await qi.describeTable('floor_plans'))).toEqual(expect.arrayContaining(['origin', 'notes']));
    expect((await qi.showAllTables()).map(String)).toContain('project_layer_roles');
  });
});
