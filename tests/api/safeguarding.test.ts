// Safeguarding distance routes: the shared ISO 13855 / ISO 13857 functions through HTTP, with
// worked values derived from the standards' formulas and tables (see tests/reference/safety.test.ts).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildUser, TEST_PASSWORD } from '../support/factories';
import { createTestApp, signedIn, type TestApp } from '../support/testApp';

let t: TestApp;
let agent: Awaited<ReturnType<typeof signedIn>>;
beforeAll(async () => {
  t = await createTestApp();
  const u = await buildUser({ role: 'reviewer' });
  agent = await signedIn(t.app, u.email, TEST_PASSWORD);
});
afterAll(async () => t.close());

describe('POST /api/safeguarding/separation', () => {
  it('gives S, K, C and the formula (ISO 13855: T = 0.2 s, d = 14 mm → 400 mm; multi-beam T = 0.3 s → 1330 mm)', async () => {
    const a = await agent.post('/api/safeguarding/separation').send({ device: 'light-curtain', resolutionMm: 14, responseTimeS: 0.02, stopTimeS: 0.18 });
    expect(a.status).toBe(200);
    expect(a.body).toMatchObject({ sMm: 400, kMmPerS: 2000, cMm: 0 });
    expect(a.body.formula).toMatch(/2000 mm\/s/);
    const b = await agent.post('/api/safeguarding/separation').send({ device: 'multi-beam', beams: 3, responseTimeS: 0.02, stopTimeS: 0.28 });
    expect(b.body.sMm).toBe(1330);
    const c = await agent.post('/api/safeguarding/separation').send({ device: 'light-curtain', resolutionMm: 14, responseTimeS: 0, stopTimeS: 0.32 });
    expect(c.body).toMatchObject({ sMm: 512, kMmPerS: 1600 });
  });
  it('answers 400 naming the field for missing or absurd input', async () => {
    const missing = await agent.post('/api/safeguarding/separation').send({ device: 'light-curtain', responseTimeS: 0.02, stopTimeS: 0.18 });
    expect(missing.status).toBe(400);
    expect(missing.body.error.fields).toHaveProperty('resolutionMm');
    const negative = await agent.post('/api/safeguarding/separation').send({ device: 'interlock', responseTimeS: -0.1, stopTimeS: 0.18 });
    expect(negative.status).toBe(400);
    expect(negative.body.error.fields).toHaveProperty('responseTimeS');
    const noStop = await agent.post('/api/safeguarding/separation').send({ device: 'interlock', responseTimeS: 0.01 });
    expect(noStop.status).toBe(400);
    expect(noStop.body.error.fields).toHaveProperty('stopTimeS');
    const device = await agent.post('/api/safeguarding/separation').send({ device: 'mat', responseTimeS: 0.01, stopTimeS: 0.1 });
    expect(device.status).toBe(400);
    expect(device.body.error.fields).toHaveProperty('device');
  });
});

describe('POST /api/safeguarding/reach-over and reach-through', () => {
  it('reads the ISO 13857 tables (a = 2400, b = 1400 → 900 mm; 20 mm square mesh → 120 mm)', async () => {
    const over = await agent.post('/api/safeguarding/reach-over').send({ hazardHeightMm: 2400, structureHeightMm: 1400 });
    expect(over.status).toBe(200);
    expect(over.body).toEqual({ distanceMm: 900, rowMm: 2400, columnMm: 1400 });
    const through = await agent.post('/api/safeguarding/reach-through').send({ openingMm: 20, shape: 'square' });
    expect(through.body).toEqual({ distanceMm: 120 });
  });
  it('answers 422 with the sentence when the table does not cover the structure, 400 for bad fields', async () => {
    const low = await agent.post('/api/safeguarding/reach-over').send({ hazardHeightMm: 2000, structureHeightMm: 900 });
    expect(low.status).toBe(422);
    expect(low.body.error.message).toMatch(/does not cover structures lower than 1000 mm/);
    const shape = await agent.post('/api/safeguarding/reach-through').send({ openingMm: 20, shape: 'hexagon' });
    expect(shape.status).toBe(400);
    expect(shape.body.error.fields).toHaveProperty('shape');
  });
});
