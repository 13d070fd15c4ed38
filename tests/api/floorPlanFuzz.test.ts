// Bad and mutated DXF uploads through the HTTP API: always a clear 4xx or a complete 201, never a
// 5xx, and the floor_plans table holds exactly the uploads that succeeded.
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { FloorPlan } from '../../backend/src/models';
import { buildProject, buildUser, TEST_PASSWORD } from '../support/factories';
import { createTestApp, signedIn, type TestApp } from '../support/testApp';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => t.close());

const g = (code: number, value: string | number) => `${code}\n${value}\n`;
const withEntities = (entities: string, header = g(9, '$INSUNITS') + g(70, 4)) =>
  g(0, 'SECTION') + g(2, 'HEADER') + header + g(0, 'ENDSEC') + g(0, 'SECTION') + g(2, 'ENTITIES') + entities + g(0, 'ENDSEC') + g(0, 'EOF');
const line = (x1: string | number, y1: string | number, x2: string | number, y2: string | number, layer = 'WALLS') =>
  g(0, 'LINE') + g(8, layer) + g(10, x1) + g(20, y1) + g(30, 0) + g(11, x2) + g(21, y2) + g(31, 0);

describe('bad floor-plan files through the API', () => {
  it('answers each with a clear 4xx message and stores nothing', async () => {
    const planner = await buildUser({ role: 'planner' });
    const agent = await signedIn(t.app, planner.email, TEST_PASSWORD);
    const project = await buildProject();
    const bowtie = g(0, 'LWPOLYLINE') + g(8, 'OUTLINE') + g(90, 4) + g(70, 1) + g(10, 0) + g(20, 0) + g(10, 1000) + g(20, 1000) + g(10, 1000) + g(20, 0) + g(10, 0) + g(20, 1000);
    const cases: Array<[string, string, RegExp]> = [
      ['huge coordinates', withEntities(line('1e300', 0, 1000, 0)), /coordinate|large|finite/i],
      ['NaN coordinates', withEntities(line('NaN', 0, 1000, 0)), /./],
      ['no entities', withEntities(''), /entit|nothing|empty/i],
      ['missing EOF', withEntities(line(0, 0, 1000, 0)).replace(/0\nEOF\n$/, ''), /./],
    ];
    const before = await FloorPlan.count();
    let accepted = 0;
    for (const [what, text, message] of cases) {
      const res = await agent.post(`/api/projects/${project.id}/floor-plans`).attach('file', Buffer.from(text), `${what}.dxf`);
      if (what === 'missing EOF' && res.status === 201) {
        accepted++; // a reader may accept a file whose only flaw is the missing EOF marker
        continue;
      }
      expect(res.status, what).toBeGreaterThanOrEqual(400);
      expect(res.status, what).toBeLessThan(500);
      expect(res.body.error.message, what).toMatch(message);
    }
    expect(await FloorPlan.count()).toBe(before + accepted);
    // a self-intersecting outline imports, with a warning saying so
    const res = await agent.post(`/api/projects/${project.id}/floor-plans`).attach('file', Buffer.from(withEntities(bowtie)), 'bowtie.dxf');
    expect(res.status).toBe(201);
    expect(res.body.warnings.join(' ')).toMatch(/cross|intersect/i);
    expect((await request(t.app).get('/api/health')).status).toBe(200);
  });

  it('survives mutated sample files: never a 5xx, never a partial row', async () => {
    const planner = await buildUser({ role: 'planner' });
    const agent = await signedIn(t.app, planner.email, TEST_PASSWORD);
    const project = await buildProject();
    const lines = readFileSync('samples/floor-plans/fernhill-hall-r12.dxf', 'utf8').split('\n');
    const mutation = fc.oneof(
      fc.record({ kind: fc.constant('drop'), at: fc.nat(), n: fc.integer({ min: 1, max: 40 }) }),
      fc.record({ kind: fc.constant('swap'), at: fc.nat(), n: fc.constant(0) }),
      fc.record({ kind: fc.constant('number'), at: fc.nat(), n: fc.integer({ min: -1e9, max: 1e9 }) }),
      fc.record({ kind: fc.constant('truncate'), at: fc.nat(), n: fc.constant(0) }),
    );
    let ok = 0;
    const runs = Number(process.env.FUZZ_API_RUNS ?? 40);
    await fc.assert(
      fc.asyncProperty(fc.array(mutation, { minLength: 1, maxLength: 4 }), async (muts) => {
        let ls = lines.slice();
        for (const m of muts) {
          const at = m.at % Math.max(1, ls.length);
          if (m.kind === 'drop') ls.splice(at, m.n);
          else if (m.kind === 'swap' && at + 1 < ls.length) [ls[at], ls[at + 1]] = [ls[at + 1], ls[at]];
          else if (m.kind === 'number') ls[at] = String(m.n);
          else if (m.kind === 'truncate') ls = ls.slice(0, at);
        }
        const res = await agent.post(`/api/projects/${project.id}/floor-plans`).attach('file', Buffer.from(ls.join('\n')), 'mutated.dxf');
        expect(res.status).toBeLessThan(500);
        if (res.status === 201) ok++;
        else expect(typeof res.body.error.message).toBe('string');
      }),
      { numRuns: runs, seed: 20261201 },
    );
    expect(await FloorPlan.count({ where: { projectId: project.id } })).toBe(ok);
  }, 120_000);
});
