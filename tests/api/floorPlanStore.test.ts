// The geometry an upload stores (its JSON text written from the import worker's packed arrays)
// against what uploads stored before: JSON.stringify of the GeoJSON the worker result rebuilds,
// compared as PostgreSQL's own jsonb text of each (the database as the outside check).
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseInWorker } from '../../backend/src/services/dxf';
import { DxfWriter } from '../../samples/make-samples';
import { buildProject, buildUser, TEST_PASSWORD } from '../support/factories';
import { createTestApp, signedIn, type TestApp } from '../support/testApp';
import { SAMPLES_DIR } from '../unit/dxf/support';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => t.close());

async function storedText(id: number): Promise<string> {
  const [row] = await t.sequelize.query<{ g: string }>('SELECT geometry::text AS g FROM floor_plans WHERE id = $1', { bind: [id], type: QueryTypes.SELECT });
  return row.g;
}

async function asJsonb(json: string): Promise<string> {
  const [row] = await t.sequelize.query<{ g: string }>('SELECT $1::jsonb::text AS g', { bind: [json], type: QueryTypes.SELECT });
  return row.g;
}

describe('stored floor-plan geometry', () => {
  it('is for every sample plan, uploaded and re-read in another unit, what the GeoJSON path stored', async () => {
    const planner = await buildUser({ role: 'planner' });
    const agent = await signedIn(t.app, planner.email, TEST_PASSWORD);
    const project = await buildProject();
    const files = readdirSync(SAMPLES_DIR).filter((f) => f.toLowerCase().endsWith('.dxf'));
    expect(files.length).toBeGreaterThanOrEqual(4);
    // and a label with the characters SQL and JSON quote: ' \ " and text beyond ASCII
    const quoted = new DxfWriter().insunits(4).layer('OUTLINE', 5).layer('TEXT', 2);
    quoted.polyline('OUTLINE', [[0, 0], [10000, 0], [10000, 6000], [0, 6000]], true);
    quoted.text('TEXT', [500, 500], 150, `Bay 'A' \\ "north" – Größe ½`);
    const plans = [...files.map((f) => ({ file: f, bytes: readFileSync(path.join(SAMPLES_DIR, f)) })), { file: 'quoted.dxf', bytes: Buffer.from(quoted.toString()) }];
    for (const { file, bytes } of plans) {
      const up = await agent.post(`/api/projects/${project.id}/floor-plans`).attach('file', bytes, file);
      expect(up.status, file).toBe(201);
      expect(up.body.geometry).toBeUndefined();
      const before = await parseInWorker(bytes);
      if (file === 'quoted.dxf') expect(before.geometry.features.some((f) => f.properties.text === `Bay 'A' \\ "north" – Größe ½`)).toBe(true);
      expect(await storedText(up.body.id), file).toBe(await asJsonb(JSON.stringify(before.geometry)));
      const full = await agent.get(`/api/floor-plans/${up.body.id}`);
      expect(full.body.geometry, file).toEqual(before.geometry);

      const units = before.units === 'cm' ? 'mm' : 'cm';
      const patched = await agent.patch(`/api/floor-plans/${up.body.id}`).send({ units });
      expect(patched.status, file).toBe(200);
      const rescaled = await parseInWorker(bytes, { units });
      expect(await storedText(up.body.id), file).toBe(await asJsonb(JSON.stringify(rescaled.geometry)));
      expect(patched.body.geometry, file).toEqual(rescaled.geometry);
    }
  }, 180_000);
});
