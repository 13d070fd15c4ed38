// Heavy work (analysis, reach, plan sheets) runs in the worker pool: the server keeps answering
// while it runs, a task past its time budget is stopped with 503, and oversized requests are
// refused with the counts and the cap.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD, seedDemoIfEmpty } from '../../backend/src/db/seed';
import { featureSeedSteps } from '../../backend/src/features';
import { ArmModel, Layout } from '../../backend/src/models';
import { heavyTasksInFlight } from '../../backend/src/services/workerPool';
import { heavyLayoutContent } from '../support/heavyLayout';
import { createTestApp, signedIn, type TestApp } from '../support/testApp';

let t: TestApp;
let layoutId: number;
let modelIds: number[];
beforeAll(async () => {
  t = await createTestApp();
  await seedDemoIfEmpty(t.sequelize, { bcryptCost: 4, steps: featureSeedSteps() });
  const layout = (await Layout.findOne({ where: { name: 'Fernhill line 3 — cell layout' } }))!;
  layoutId = layout.id;
  modelIds = (await ArmModel.findAll({ where: { builtIn: true }, attributes: ['id'], order: [['id', 'ASC']] })).map((m) => m.id).slice(0, 4);
});
afterAll(async () => t.close());

const planner = () => signedIn(t.app, 'planner@fernhill.test', DEMO_PASSWORD);

describe('heavy work in the pool', () => {
  it('/api/health answers while four heavy analyses run, before any of them is done', async () => {
    const agent = await planner();
    const content = heavyLayoutContent(modelIds);
    let done = 0;
    const heavy = Array.from({ length: 4 }, () =>
      agent
        .post(`/api/layouts/${layoutId}/analysis`)
        .send({ content })
        .then((r) => {
          done++;
          return r;
        }),
    );
    // Wait until all four analyses are with the pool (a condition, not a time), then ask for health.
    // On the request thread they would never all be under way at once: each would block the others.
    for (let i = 0; i < 2000 && heavyTasksInFlight() < 4; i++) await new Promise((r) => setTimeout(r, 10));
    expect(heavyTasksInFlight()).toBe(4);
    const health = await request(t.app).get('/api/health');
    const [doneWhenHealthAnswered, inFlightWhenHealthAnswered] = [done, heavyTasksInFlight()];
    expect(health.status).toBe(200);
    expect(health.body).toEqual({ ok: true, db: 'up' });
    // Health was answered while heavy work was still running elsewhere, before any analysis had answered.
    expect(doneWhenHealthAnswered).toBe(0);
    expect(inFlightWhenHealthAnswered).toBeGreaterThan(0);
    const results = await Promise.all(heavy);
    for (const r of results) {
      expect([200, 503]).toContain(r.status);
      if (r.status === 200) expect(Object.keys(r.body.regions).sort()).toEqual(content.arms.map((a) => a.id).sort());
      else expect(['busy', 'too_slow']).toContain(r.body.error.code);
    }
    expect(results.some((r) => r.status === 200)).toBe(true);
  });

  it('refuses an analysis of more arms × work points × heights than the cap, with the numbers (413)', async () => {
    const capped = t.appWith({ ANALYSIS_MAX_CHECKS: '1000' });
    const agent = await signedIn(capped, 'planner@fernhill.test', DEMO_PASSWORD);
    const res = await agent.post(`/api/layouts/${layoutId}/analysis`).send({ content: heavyLayoutContent(modelIds, 4, 100, [0, 500, 1000]) });
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('analysis_too_large');
    // 4 arms × 100 points × 3 heights = 1 200 checks against a cap of 1 000
    expect(res.body.error.message).toContain('4 arms × 100 work points × 3 work heights = 1 200 reach checks');
    expect(res.body.error.message).toContain('at most 1 000');
    expect(res.body.limits).toEqual({ arms: 4, workPoints: 100, workHeights: 3, checks: 1200, maxChecks: 1000 });
  });

  it('the reach of an inline chain and the working-copy plan sheet come from the pool with the in-process answers', async () => {
    const agent = await planner();
    const params = (await ArmModel.findByPk(modelIds[0]))!.params;
    const reach = await agent.post('/api/kinematics/reach').send({ model: params, heights: [0, 500] });
    expect(reach.status).toBe(200);
    const { reachSummary } = await import('../../backend/src/workers/heavyTasks');
    const { parseArmParams } = await import('@shared/kinematics/families');
    expect(reach.body).toEqual(JSON.parse(JSON.stringify(reachSummary(parseArmParams(params), [0, 500]))));
    const pdf = await agent.get(`/api/layouts/${layoutId}/plan-sheet.pdf`);
    expect(pdf.status).toBe(200);
    expect(pdf.headers['content-type']).toBe('application/pdf');
  });

  // Last: it swaps the process's pool for one with a tiny time budget.
  it('a task past its time budget is stopped and answered 503 too_slow with a sentence', async () => {
    const hurried = t.appWith({ HEAVY_TASK_TIMEOUT_MS: '100' });
    const agent = await signedIn(hurried, 'planner@fernhill.test', DEMO_PASSWORD);
    const res = await agent.post(`/api/layouts/${layoutId}/analysis`).send({ content: heavyLayoutContent(modelIds) });
    expect(res.status).toBe(503);
    expect(res.body.error.code).toBe('too_slow');
    expect(res.body.error.message).toBe('The analysis took longer than 0.1 s and was stopped; split the cell layout or try again.');
    // the server goes on answering
    expect((await request(hurried).get('/api/health')).status).toBe(200);
  });
});
