// Error answers name fields by their labels and units (shared/schemas/labels.ts): the message and
// every `fields` value are sentences; the keys stay the field paths the forms place them by.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ArmModel, Layout } from '../../backend/src/models';
import { buildArmModel, buildProject, buildUser, TEST_PASSWORD } from '../support/factories';
import { createTestApp, signedIn, type TestApp } from '../support/testApp';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => t.close());

const sample = (file: string) => JSON.parse(readFileSync(path.resolve(__dirname, '../../samples/arm-models', file), 'utf8')) as { name: string; params: Record<string, unknown> };

/** No property name (camelCase), no dotted path, no zod wording in a text people read. */
function expectReadable(text: string) {
  expect(text).not.toMatch(/\b[a-z]+[A-Z]\w*\b/);
  expect(text).not.toMatch(/\b[A-Za-z_]\w*\.(?:[A-Za-z_]\w*|\d+\b)/);
  expect(text).not.toMatch(/Invalid input|Too (big|small)|received/);
}

describe('field messages of the API', () => {
  it('a bad arm model: the message and the fields name the fields by label and unit, and nothing is stored', async () => {
    const planner = await buildUser({ role: 'planner' });
    const agent = await signedIn(t.app, planner.email, TEST_PASSWORD);
    const before = await ArmModel.count();
    const linkage = sample('demo-palletizer-3100.json');
    const params = { ...linkage.params, stopTimeS: 0, fourBar: { ...(linkage.params.fourBar as object), crank: -5 }, upperArm: 'long' };
    const res = await agent.post('/api/arm-models').send({ name: 'Demo Palletizer (broken copy)', params });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid');
    expect(res.body.error.fields).toMatchObject({
      'params.stopTimeS': 'Stop time (category 0) must be greater than 0 s',
      'params.fourBar.crank': 'Crank must be greater than 0 mm',
      'params.upperArm': 'Upper arm must be a number',
    });
    expect(res.body.error.message).toMatch(/^The arm model has invalid fields: (Stop time \(category 0\) must be greater than 0 s|Crank must be greater than 0 mm|Upper arm must be a number) \(and 2 more\)\.$/);
    for (const text of [res.body.error.message, ...Object.values(res.body.error.fields as Record<string, string>)]) expectReadable(text);
    expect(await ArmModel.count()).toBe(before);

    // The kinematics endpoints take a model inline: its fields sit under `model.` and read the same.
    const axes = (linkage.params.axes as Array<Record<string, number>>).map((a, i) => (i === 0 ? { ...a, max: a.min - 1 } : a));
    const inline = await agent.post('/api/kinematics/forward').send({ model: { ...linkage.params, axes }, joints: [0, 0, 0] });
    expect(inline.status).toBe(400);
    expect(inline.body.error.fields).toEqual({ 'model.axes.0.max': 'J1 max must be greater than J1 min' });
    expect(inline.body.error.message).toBe('The model has invalid fields: J1 max must be greater than J1 min.');
  });

  it('a bad cell layout: arms, work points and boundaries go by their ids, fields by label, and the stored layout is unchanged', async () => {
    const planner = await buildUser({ role: 'planner' });
    const model = await buildArmModel();
    const project = await buildProject();
    const agent = await signedIn(t.app, planner.email, TEST_PASSWORD);
    const good = {
      arms: [{ id: 'R1', armModelId: model.id, label: 'Picker 1', x: 4000, y: 3000, yaw: 90, mountHeight: 0 }],
      workPoints: [{ id: 'P1', x: 4300, y: 3200, z: 900 }],
      boundaries: [
        { id: 'F1', kind: 'fence', label: 'Cell guard', points: [[0, 0], [8000, 0], [8000, 6000]], height: 2000 },
        { id: 'O1', kind: 'opening', points: [[2000, 0], [3000, 0]], fenceId: 'F1' },
      ],
      workHeights: [900],
    };
    const created = await agent.post(`/api/projects/${project.id}/layouts`).send({ name: 'Cell A', content: good });
    expect(created.status).toBe(201);
    const id = created.body.layout.id;

    const bad = structuredClone(good) as typeof good & { boundaries: Array<Record<string, unknown>> };
    (bad.arms[0] as Record<string, unknown>).mountHeight = 'high';
    bad.boundaries[0].height = -5;
    bad.boundaries[1].safeguard = { device: 'light-curtain', responseTimeS: 50, stopCategory: 0 };
    (bad.workPoints[0] as Record<string, unknown>).assignedArm = 'R9';
    const res = await agent.put(`/api/layouts/${id}`).send({ version: 1, content: bad });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toMatchObject({
      'content.arms.0.mountHeight': 'Mount height of arm R1 must be a number',
      'content.boundaries.0.height': 'Fence height of fence F1 must be greater than 0 mm',
      'content.boundaries.1.safeguard.responseTimeS': 'Response time of access opening O1 must be at most 30 s',
    });
    expect(res.body.error.message).toMatch(/^The cell layout has invalid fields: .+ \(and \d+ more\)\.$/);
    for (const text of [res.body.error.message, ...Object.values(res.body.error.fields as Record<string, string>)]) expectReadable(text);
    const stored = await Layout.findByPk(id);
    expect(stored!.version).toBe(1);
    expect((stored!.content as typeof good).arms[0].mountHeight).toBe(0);

    // Cross-field checks of the layout (run once each field is well formed) name the item too.
    const crossed = structuredClone(good) as typeof good & { workPoints: Array<Record<string, unknown>> };
    crossed.workPoints[0].assignedArm = 'R9';
    const res2 = await agent.put(`/api/layouts/${id}`).send({ version: 1, content: crossed });
    expect(res2.status).toBe(400);
    expect(res2.body.error).toMatchObject({
      message: 'The cell layout has invalid fields: Work point P1: no arm R9 on this cell layout.',
      fields: { 'content.workPoints.0.assignedArm': 'Work point P1: no arm R9 on this cell layout' },
    });
  });
});
