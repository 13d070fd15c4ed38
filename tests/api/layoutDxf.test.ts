// DXF export of a layout, read back with the project's own importer (importDxf, which reads with
// dxf-parser): the same geometry comes back within 0.01 mm, in mm ($INSUNITS 4 = millimetres,
// DXF reference, HEADER section — value from memory, also checked by the importer's unit tests).
import type { Feature, Geometry } from 'geojson';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { geoJSONToPolygons } from '@shared/geometry/geojson';
import { readDemoCatalogue } from '../../backend/src/db/demoCatalogue';
import { readDemoLayout } from '../../backend/src/db/demoLayout';
import { ArmModel, Layout } from '../../backend/src/models';
import { importDxf } from '../../backend/src/services/dxf';
import { DXF_LAYERS, layoutDxf, loadLayoutSheetInput } from '../../backend/src/services/planSheet';
import { summarizeArms } from '../../backend/src/services/planSheet/armSummary';
import { CAUTIONS } from '@shared/safety';
import { buildProject, buildUser, TEST_PASSWORD } from '../support/factories';
import { createTestApp, signedIn, type TestApp } from '../support/testApp';

const TOL = 0.01;
let t: TestApp;
let layoutId: number;
let plannerEmail: string;

beforeAll(async () => {
  t = await createTestApp();
  const planner = await buildUser({ role: 'planner' });
  plannerEmail = planner.email;
  const project = await buildProject();
  const ids = new Map<string, number>();
  for (const m of readDemoCatalogue()) {
    ids.set(m.name, (await ArmModel.create({ name: `${m.name} dxf ${process.pid}`, family: m.params.family, params: m.params as Record<string, unknown>, createdBy: null })).id);
  }
  const demo = readDemoLayout((n) => ids.get(n));
  layoutId = (await Layout.create({ projectId: project.id, floorPlanId: null, name: demo.name, content: demo.content, createdBy: planner.id })).id;
});
afterAll(async () => t.close());

type F = Feature<Geometry, { layer: string; text?: string; closed: boolean }>;

/** Every vertex of `want` has a vertex of `got` within TOL, and the counts match. */
function sameRings(got: Array<Array<[number, number]>>, want: Array<Array<[number, number]>>) {
  expect(got.length).toBe(want.length);
  const key = (r: Array<[number, number]>) => r.reduce((s, [x, y]) => s + x + y, 0) / r.length;
  const g = [...got].sort((a, b) => key(a) - key(b));
  const w = [...want].sort((a, b) => key(a) - key(b));
  w.forEach((ring, i) => {
    expect(g[i].length).toBe(ring.length);
    for (const [x, y] of ring) {
      const d = Math.min(...g[i].map(([gx, gy]) => Math.hypot(gx - x, gy - y)));
      expect(d).toBeLessThan(TOL);
    }
  });
}

describe('layout DXF export', () => {
  it('round-trips through the importer: arms, spaces, bands, shared zones, points, fences, boundaries', async () => {
    const a = await signedIn(t.app, plannerEmail, TEST_PASSWORD);
    const res = await a.get(`/api/layouts/${layoutId}/layout.dxf`);
    expect(res.status).toBe(200);
    expect(res.headers['content-disposition']).toContain('.dxf');
    const back = importDxf(res.text);
    expect(back.insunits).toBe(4);
    expect(back.units).toBe('mm');

    const input = await loadLayoutSheetInput((await Layout.findByPk(layoutId))!);
    const content = input.layout.content;
    const features = back.geometry.features as F[];
    const on = (layer: string) => features.filter((f) => f.properties.layer === layer);
    const layerNames = new Set(back.layers.map((l) => l.name));
    for (const l of [DXF_LAYERS.arms, DXF_LAYERS.maxSpace, DXF_LAYERS.restricted, DXF_LAYERS.band(content.workHeights[0]), DXF_LAYERS.shared, DXF_LAYERS.points, DXF_LAYERS.fences, DXF_LAYERS.boundaries]) {
      expect(layerNames.has(l), l).toBe(true);
    }

    // Arm labels sit on the base points.
    const labels = on(DXF_LAYERS.arms).filter((f) => f.geometry.type === 'Point');
    for (const arm of content.arms) {
      const f = labels.find((l) => l.properties.text === `${arm.id} ${arm.label}`);
      expect(f, arm.id).toBeDefined();
      const [x, y] = (f!.geometry as { coordinates: number[] }).coordinates;
      expect(Math.hypot(x - arm.x, y - arm.y)).toBeLessThan(TOL);
    }
    // Work point ids on their points.
    const pts = on(DXF_LAYERS.points).filter((f) => f.geometry.type === 'Point');
    expect(pts.length).toBe(content.workPoints.length);
    for (const p of content.workPoints) {
      const f = pts.find((l) => l.properties.text === p.id)!;
      const [x, y] = (f.geometry as { coordinates: number[] }).coordinates;
      expect(Math.hypot(x - p.x, y - p.y)).toBeLessThan(TOL);
    }

    const polyRings = (layer: string) =>
      on(layer).flatMap((f) => (f.geometry.type === 'Polygon' || f.geometry.type === 'MultiPolygon' ? geoJSONToPolygons(f.geometry).flat() : []));
    const arms = summarizeArms({ models: input.models, analysis: input.analysis, content });
    sameRings(polyRings(DXF_LAYERS.maxSpace), arms.flatMap((s) => s.maxSpace.flat()));
    sameRings(polyRings(DXF_LAYERS.restricted), arms.flatMap((s) => s.restricted.flat()));
    const h = content.workHeights[0];
    sameRings(
      polyRings(DXF_LAYERS.band(h)),
      content.arms.flatMap((arm) => geoJSONToPolygons(input.analysis.regions[arm.id].bands.find((b) => b.height === h)?.geometry ?? null).flat()),
    );
    expect(input.analysis.sharedZones.length).toBeGreaterThan(0);
    sameRings(polyRings(DXF_LAYERS.shared), input.analysis.sharedZones.flatMap((s) => geoJSONToPolygons(s.geometry).flat()));

    // Fences as polylines with their corners (a fence that returns to its start comes back as the
    // importer's closed outline, a polygon); keep-outs and operator areas as closed outlines.
    const fenceShapes = on(DXF_LAYERS.fences).flatMap((f) =>
      f.geometry.type === 'LineString' ? [f.geometry.coordinates] : f.geometry.type === 'Polygon' ? [[...f.geometry.coordinates[0]]] : [],
    );
    for (const z of content.boundaries.filter((z0) => z0.kind === 'fence')) {
      const match = fenceShapes.find((c) => {
        const want = z.points;
        const ring = c.length === want.length ? c : c.slice(0, -1);
        const open = want[0][0] === want[want.length - 1][0] && want[0][1] === want[want.length - 1][1] ? want.slice(0, -1) : want;
        if (ring.length !== (c.length === want.length ? want.length : open.length)) return false;
        const ref = c.length === want.length ? want : open;
        return ref.every(([x, y]) => ring.some(([gx, gy]) => Math.hypot(gx - x, gy - y) < TOL));
      });
      expect(match, `${z.id}: ${JSON.stringify(z.points)} vs ${JSON.stringify(fenceShapes)}`).toBeDefined();
    }
    sameRings(
      polyRings(DXF_LAYERS.boundaries),
      content.boundaries.filter((z) => z.kind === 'keepout' || z.kind === 'operator').map((z) => z.points.map(([x, y]) => [x, y] as [number, number])),
    );
  });
});

describe('labels that try to write DXF records of their own', () => {
  // A DXF file is group-code / value line pairs (DXF reference, general structure): a value holding
  // "\n0\nLINE\n8\nEVIL…" would end the TEXT and start a LINE on layer EVIL.
  const EVIL = 'R1\n0\nLINE\n8\nEVIL\n10\n0\n20\n0\n11\n99999\n21\n99999';

  it('are refused by the API with 400 naming the field', async () => {
    const a = await signedIn(t.app, plannerEmail, TEST_PASSWORD);
    const layout = (await Layout.findByPk(layoutId))!;
    const content = layout.content as { arms: Array<{ label: string }> };
    const res = await a.put(`/api/layouts/${layoutId}`).send({ version: layout.version, content: { ...content, arms: content.arms.map((x, i) => (i === 0 ? { ...x, label: EVIL } : x)) } });
    expect(res.status).toBe(400);
    expect(res.body.error.fields['content.arms.0.label']).toBe('Label of arm R1: use one line of text without control characters');
    const named = await a.put(`/api/layouts/${layoutId}`).send({ version: layout.version, name: 'Cell\r\nBcc: someone' });
    expect(named.status).toBe(400);
    expect(named.body.error.fields.name).toBe('Name: use one line of text without control characters');
    expect((await Layout.findByPk(layoutId))!.version).toBe(layout.version);
  });

  it('written directly through layoutDxf give no extra entity when read back with the importer', async () => {
    const input = await loadLayoutSheetInput((await Layout.findByPk(layoutId))!);
    const clean = importDxf(layoutDxf(input, { createdAt: new Date() }));
    const content = input.layout.content;
    const evil = { ...input, layout: { ...input.layout, content: { ...content, arms: content.arms.map((x, i) => (i === 0 ? { ...x, label: EVIL } : x)) } } };
    const back = importDxf(layoutDxf(evil, { createdAt: new Date() }));
    expect(back.layers.map((l) => l.name)).not.toContain('EVIL');
    expect(back.geometry.features.length).toBe(clean.geometry.features.length);
    const texts = (back.geometry.features as F[]).filter((f) => f.geometry.type === 'Point' && f.properties.layer === DXF_LAYERS.arms).map((f) => f.properties.text);
    expect(texts).toContain(`${content.arms[0].id} R1 0 LINE 8 EVIL 10 0 20 0 11 99999 21 99999`);
  });
});

describe('notes in the DXF export', () => {
  it('carry what the file is, working copy or revision, the date and every caution: 999 comments and RF_NOTES text', async () => {
    const input = await loadLayoutSheetInput((await Layout.findByPk(layoutId))!);
    const at = new Date('2026-03-04T05:06:07Z');
    const text = layoutDxf(input, { createdAt: at });
    // Group code 999 is a comment (DXF reference, general structure — from memory); dxf-parser skips it.
    const lines = text.split('\n');
    const comments: string[] = [];
    for (let i = 0; lines[i] === '999'; i += 2) comments.push(lines[i + 1]);
    expect(comments[0]).toBe(`Ringfence cell layout drawing · cell layout ${input.layout.name} · Working copy (not a revision) · exported 2026-03-04 05:06 UTC`);
    for (const c of CAUTIONS) expect(comments).toContain(c);
    const back = importDxf(text);
    const notes = (back.geometry.features as F[]).filter((f) => f.properties.layer === DXF_LAYERS.notes).map((f) => f.properties.text);
    expect(notes).toEqual(comments);
    // A revision's export says its letter and state.
    const rev = layoutDxf({ ...input, revision: { letter: 'B', state: 'signed_off', submittedBy: null, decidedBy: null, decidedAt: null, releasedAt: null } }, { createdAt: at });
    expect(rev.split('\n')[1]).toContain('· Revision B · Signed off ·');
  });
});
