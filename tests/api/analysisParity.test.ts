// The editor's Web Worker session and the server give the same analysis of the seeded demo layout
// (the same shared code on the same stored models, floor plan and content).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { armReachFor } from '@shared/analysis/armReach';
import type { LayoutContent } from '@shared/schemas/layout';
import { seedDemoIfEmpty } from '../../backend/src/db/seed';
import { featureSeedSteps } from '../../backend/src/features';
import { ArmModel, FloorPlan, Layout } from '../../backend/src/models';
import { analyzeLayout } from '../../backend/src/services/layoutAnalysis';
import { createAnalysisSession } from '../../frontend/src/workers/analysisSession';
import { prepareFloor, type FloorLayer } from '@shared/analysis/floor';
import { sectionOf } from '@shared/analysis/section';
import { DEMO_PASSWORD } from '../../backend/src/db/seed';
import { createTestApp, signedIn, type TestApp } from '../support/testApp';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
  await seedDemoIfEmpty(t.sequelize, { bcryptCost: 4, steps: featureSeedSteps() });
});
afterAll(async () => t.close());

describe('server and worker analyses', () => {
  it('are identical for the demo layout, and stay identical after an arm moves', async () => {
    const layout = (await Layout.findOne({ where: { name: 'Fernhill line 3 — cell layout' } }))!;
    const content = layout.content as LayoutContent;
    const models = await ArmModel.findAll();
    const plan = (await FloorPlan.findByPk(layout.floorPlanId!))!;

    const session = createAnalysisSession(armReachFor);
    session.receive({ type: 'models', models: models.map((m) => ({ id: m.id, params: m.params })) });
    session.receive({ type: 'floor', floor: { geometry: plan.geometry, layers: plan.layers as FloorLayer[] } });
    session.receive({ type: 'content', seq: 1, content });
    const worker = session.run()!.analysis;
    const server = await analyzeLayout(layout);

    const strip = (r: typeof server) => ({ findings: r.findings, sharedZones: r.sharedZones, coverage: JSON.parse(JSON.stringify(r.coverage)), regions: r.regions, safeguarding: r.safeguarding });
    expect(strip(worker)).toEqual(strip(server));
    expect(server.findings.length).toBeGreaterThan(3);
    // The demo's access opening carries a safeguard: both sides measure it the same.
    expect(server.safeguarding!.openings.map((o) => o.id)).toEqual(['O1']);
    expect(server.safeguarding!.openings[0].requiredMm).toBeGreaterThan(0);
    expect(server.safeguarding!.fences.length).toBeGreaterThan(0);

    // Move R2 in the worker (as a drag would), then commit the same move on the server.
    const moved = { ...content, arms: content.arms.map((a) => (a.id === 'R2' ? { ...a, x: a.x + 400 } : a)) };
    // …and with the door switched to a light curtain, so a second safeguard kind is compared too.
    const curtain = { device: 'light-curtain' as const, resolutionMm: 30, responseTimeS: 0.02, stopCategory: 0 as const, approach: 'normal' as const };
    moved.boundaries = content.boundaries.map((z) => (z.id === 'O1' ? { ...z, safeguard: curtain } : z));
    session.receive({ type: 'content', seq: 2, content: { ...content, boundaries: moved.boundaries } });
    session.receive({ type: 'drag', seq: 3, pose: { armId: 'R2', x: moved.arms[1].x, y: moved.arms[1].y, yaw: moved.arms[1].yaw } });
    const during = session.run()!.analysis;
    const after = await analyzeLayout(layout, moved);
    expect(strip(during)).toEqual(strip(after));

    // The section the worker sends with the result is the shared core's, on the server's own inputs.
    const line: [[number, number], [number, number]] = [[14000, 5600], [25000, 5600]];
    session.receive({ type: 'section', line });
    const view = session.run()!;
    const params = new Map(models.map((m) => [m.id, m.params]));
    const expected = sectionOf({
      line,
      floor: prepareFloor(plan.geometry, plan.layers as FloorLayer[]),
      boundaries: moved.boundaries,
      arms: moved.arms.map((a) => ({ id: a.id, label: a.label, pose: a, envelope: armReachFor(params.get(a.armModelId), a.restrict).envelope })),
    });
    expect(view.section).toEqual(expected);
    expect(view.section!.arms.map((c) => c.id)).toContain('R3');
    expect(view.section!.dimensions.length).toBeGreaterThan(0);
  });

  it("the server's first view of the stored layout is the worker's first result, maximum spaces included", async () => {
    const layout = (await Layout.findOne({ where: { name: 'Fernhill line 3 — cell layout' } }))!;
    const models = await ArmModel.findAll();
    const plan = (await FloorPlan.findByPk(layout.floorPlanId!))!;
    const session = createAnalysisSession(armReachFor);
    session.receive({ type: 'models', models: models.map((m) => ({ id: m.id, params: m.params })) });
    session.receive({ type: 'floor', floor: { geometry: plan.geometry, layers: plan.layers as FloorLayer[] } });
    session.receive({ type: 'content', seq: 1, content: layout.content as LayoutContent });
    const worker = session.run()!;

    const agent = await signedIn(t.app, 'planner@fernhill.test', DEMO_PASSWORD);
    const res = await agent.get(`/api/layouts/${layout.id}/analysis`);
    expect(res.status).toBe(200);
    expect(res.body.version).toBe(layout.version);
    const strip = (r: typeof worker.analysis) => JSON.parse(JSON.stringify({ findings: r.findings, sharedZones: r.sharedZones, coverage: r.coverage, regions: r.regions, safeguarding: r.safeguarding }));
    expect(strip(res.body.analysis)).toEqual(strip(worker.analysis));
    expect(res.body.maxSpaces).toEqual(JSON.parse(JSON.stringify(worker.maxSpaces)));
    expect(Object.keys(res.body.maxSpaces).sort()).toEqual((layout.content as LayoutContent).arms.map((a) => a.id).sort());
    // Asked for at most N reach checks: 413 naming the counts when the layout needs more, 400 for a bad N.
    const small = await agent.get(`/api/layouts/${layout.id}/analysis?maxChecks=10`);
    expect(small.status).toBe(413);
    expect(small.body.error.code).toBe('analysis_too_large');
    expect((await agent.get(`/api/layouts/${layout.id}/analysis?maxChecks=1000000`)).status).toBe(200);
    expect((await agent.get(`/api/layouts/${layout.id}/analysis?maxChecks=lots`)).status).toBe(400);
    // A layout this user cannot see is not analysed for them.
    expect((await agent.get('/api/layouts/999999/analysis')).status).toBe(404);
  });
});
