// POST /api/layouts/:id/fence-proposal on the seeded demo: the guard ring, its BOM and notes; bad
// options answered 400 naming the field, a layout without arms 400 with a sentence.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedDemoIfEmpty, DEMO_PASSWORD } from '../../backend/src/db/seed';
import { featureSeedSteps } from '../../backend/src/features';
import { Layout } from '../../backend/src/models';
import { createTestApp, signedIn, type TestApp } from '../support/testApp';

let t: TestApp;
let planner: Awaited<ReturnType<typeof signedIn>>;
let layout: Layout;
beforeAll(async () => {
  t = await createTestApp();
  await seedDemoIfEmpty(t.sequelize, { bcryptCost: 4, steps: featureSeedSteps() });
  planner = await signedIn(t.app, 'planner@fernhill.test', DEMO_PASSWORD);
  layout = (await Layout.findOne({ where: { name: 'Fernhill line 3 — cell layout' } }))!;
});
afterAll(async () => t.close());

describe('POST /api/layouts/:id/fence-proposal', () => {
  it('proposes fences and doors with a bill of materials for the demo cell, storing nothing', async () => {
    const before = layout.version;
    const r = await planner.post(`/api/layouts/${layout.id}/fence-proposal`).send({ panelWidthsMm: [500, 1000, 1500], clearanceMm: 150 });
    expect(r.status).toBe(200);
    expect(r.body.boundaries.some((z: { kind: string }) => z.kind === 'fence')).toBe(true);
    const doors = r.body.boundaries.filter((z: { kind: string }) => z.kind === 'opening');
    expect(doors.length).toBeGreaterThan(0);
    for (const d of doors) expect(['interlock', 'interlock-locking']).toContain(d.safeguard.device);
    expect(r.body.bom.find((b: { item: string }) => b.item === 'floor anchor').quantity).toBeGreaterThan(0);
    for (const b of r.body.bom.filter((x: { item: string }) => x.item === 'panel')) expect(b.size).toMatch(/^(500|1000|1500) × 2000 mm$/);
    expect(r.body.lengthMm).toBeGreaterThan(10_000);
    expect(r.body.areaEnclosedM2).toBeGreaterThan(10);
    expect(r.body.notes.join(' ')).toMatch(/ISO 13857/);
    await layout.reload();
    expect(layout.version).toBe(before);
  });

  it('proposes for unsaved content sent with the options', async () => {
    const content = { ...(layout.content as object), boundaries: [] };
    const r = await planner.post(`/api/layouts/${layout.id}/fence-proposal`).send({ content });
    expect(r.status).toBe(200);
    expect(r.body.notes.join(' ')).not.toMatch(/replaces the fences/);
  });

  it('answers 400 naming the field for bad options', async () => {
    const cases: Array<[object, string]> = [
      [{ panelWidthsMm: [] }, 'panelWidthsMm'],
      [{ panelWidthsMm: [1000, -5] }, 'panelWidthsMm.1'],
      [{ panelHeightMm: 900 }, 'panelHeightMm'],
      [{ meshMm: 150 }, 'meshMm'],
      [{ meshShape: 'hexagon' }, 'meshShape'],
      [{ postWidthMm: 'wide' }, 'postWidthMm'],
      [{ doorWidthsMm: [100] }, 'doorWidthsMm.0'],
      [{ useWalls: 'yes' }, 'useWalls'],
      [{ colour: 'green' }, '_'],
    ];
    for (const [body, field] of cases) {
      const r = await planner.post(`/api/layouts/${layout.id}/fence-proposal`).send(body);
      expect(r.status, JSON.stringify(body)).toBe(400);
      expect(Object.keys(r.body.error.fields), JSON.stringify(body)).toContain(field);
    }
  });

  it('answers 400 with a sentence for a layout without arms', async () => {
    const r = await planner.post(`/api/layouts/${layout.id}/fence-proposal`).send({ content: { arms: [], workPoints: [], boundaries: [], workHeights: [] } });
    expect(r.status).toBe(400);
    expect(r.body.error.message).toMatch(/has no arms/);
  });
});
