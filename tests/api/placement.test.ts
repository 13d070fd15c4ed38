// Placement search over the API on the seeded demo: the same answer as the shared code the editor's
// worker runs, an empty list with reasons when nothing qualifies, and clear messages for bad input.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { placementSearch, prepareFloor, type FloorLayer } from '@shared/analysis';
import { armReachFor } from '@shared/analysis/armReach';
import { placementQueryOf, presentPlacement } from '@shared/analysis/placementRequest';
import type { LayoutContent } from '@shared/schemas/layout';
import { PlacementSearchInput } from '@shared/schemas/placement';
import { seedDemoIfEmpty } from '../../backend/src/db/seed';
import { featureSeedSteps } from '../../backend/src/features';
import { ArmModel, FloorPlan, Layout } from '../../backend/src/models';
import { buildUser, TEST_PASSWORD } from '../support/factories';
import { createTestApp, signedIn, type TestApp } from '../support/testApp';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
  await seedDemoIfEmpty(t.sequelize, { bcryptCost: 4, steps: featureSeedSteps() });
});
afterAll(async () => t.close());

async function login(role: 'planner' | 'reviewer') {
  const u = await buildUser({ role });
  return signedIn(t.app, u.email, TEST_PASSWORD);
}

describe('POST /api/layouts/:id/placement-search', () => {
  it('answers the infeed points with candidates, the map and the area, exactly as the shared code does', async () => {
    const layout = (await Layout.findOne({ where: { name: 'Fernhill line 3 — cell layout' } }))!;
    const scara = (await ArmModel.findOne({ where: { name: 'Demo SCARA 600' } }))!;
    const agent = await login('planner');
    const body = { armModelId: scara.id, armId: 'R1', pointIds: ['P1', 'P2', 'P3'], minMarginMm: 20, yawMinDeg: -180, yawMaxDeg: 180, yawStepDeg: 15, mountHeightMm: 400, gridMm: 10 };
    const res = await agent.post(`/api/layouts/${layout.id}/placement-search`).send(body);
    expect(res.status).toBe(200);
    expect(res.body.candidates.length).toBeGreaterThan(0);
    expect(Object.keys(res.body.candidates[0]).sort()).toEqual(['fenceLengthMm', 'limitingPointId', 'sharedZoneM2', 'worstMarginMm', 'x', 'y', 'yawDeg']);
    expect(res.body.candidates[0].worstMarginMm).toBeGreaterThanOrEqual(20);
    expect(res.body.feasibleAreaM2).toBeGreaterThan(0);
    const cells = res.body.cells;
    expect(cells.worstMarginMm).toHaveLength(cells.cols * cells.rows);

    const plan = (await FloorPlan.findByPk(layout.floorPlanId!))!;
    const models = new Map((await ArmModel.findAll()).map((m) => [m.id, m.params]));
    const q = placementQueryOf(PlacementSearchInput.parse(body), layout.content as LayoutContent, prepareFloor(plan.geometry, plan.layers as FloorLayer[]), (id, r) => armReachFor(models.get(id), r));
    expect(res.body).toEqual(JSON.parse(JSON.stringify(presentPlacement(placementSearch(q)))));
  });

  it('returns 200 with no candidates and a reason per point when no spot qualifies', async () => {
    const layout = (await Layout.findOne({ where: { name: 'Fernhill line 3 — cell layout' } }))!;
    const scara = (await ArmModel.findOne({ where: { name: 'Demo SCARA 600' } }))!;
    const agent = await login('reviewer');
    // The infeed (P1) and the pallet (P16) are about 8 m apart: no 600 mm arm reaches both.
    const res = await agent.post(`/api/layouts/${layout.id}/placement-search`).send({ armModelId: scara.id, pointIds: ['P1', 'P16'], yawStepDeg: 30 });
    expect(res.status).toBe(200);
    expect(res.body.candidates).toEqual([]);
    expect(res.body.feasibleAreaM2).toBe(0);
    expect(res.body.limits.map((l: { pointId: string }) => l.pointId)).toEqual(['P1', 'P16']);
    for (const l of res.body.limits) expect(l.reason.startsWith(`${l.pointId} `)).toBe(true);
  });

  it('names the bad field or the unknown point', async () => {
    const layout = (await Layout.findOne({ where: { name: 'Fernhill line 3 — cell layout' } }))!;
    const agent = await login('planner');
    const a = await agent.post(`/api/layouts/${layout.id}/placement-search`).send({ armModelId: 1, pointIds: [], yawStepDeg: 0 });
    expect(a.status).toBe(400);
    expect(a.body.error.fields.pointIds).toMatch(/at least one work point/);
    expect(a.body.error.fields.yawStepDeg).toMatch(/Yaw step/);
    const b = await agent.post(`/api/layouts/${layout.id}/placement-search`).send({ armModelId: 1, pointIds: ['P999'] });
    expect(b.status).toBe(400);
    expect(b.body.error.message).toMatch(/No work point P999/);
    const c = await request(t.app).post(`/api/layouts/${layout.id}/placement-search`).send({ armModelId: 1, pointIds: ['P1'] });
    expect(c.status).toBe(401);
  });
});
