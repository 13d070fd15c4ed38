// Plan sheet PDF of a layout's working copy: parsed back with pdfjs-dist (an independent PDF reader),
// rendered with poppler's pdftoppm, measured on the page's drawing operators.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readDemoCatalogue } from '../../backend/src/db/demoCatalogue';
import { DEMO_FLOOR_PLAN_FILE } from '../../backend/src/db/demoFloorPlan';
import { readDemoLayout } from '../../backend/src/db/demoLayout';
import { ArmModel, FloorPlan, Layout } from '../../backend/src/models';
import { importDxf } from '../../backend/src/services/dxf';
import { CAUTIONS, DRAFT_MARK, loadLayoutSheetInput, renderPlanSheet } from '../../backend/src/services/planSheet';
import { SAFEGUARDING_CAUTION } from '../../backend/src/services/planSheet/safeguardingSheet';
import { LATO_RANGES, latoHas, sheetText } from '../../backend/src/services/planSheet/fonts';
import { buildProject, buildUser, TEST_PASSWORD } from '../support/factories';
import { createTestApp, signedIn, type TestApp } from '../support/testApp';

// pdfjs-dist 5.6 (the line that supports Node 20.19) reads the PDF back, legacy build for Node.
const pdfjs = await import('pdfjs-dist/legacy/build/pdf.mjs');

const MM_TO_PT = 72 / 25.4; // PDF user space unit is 1/72 inch (ISO 32000-1 §8.3.2.3)

let t: TestApp;
let demoLayoutId: number;
let pairLayoutId: number;
let planner: Awaited<ReturnType<typeof buildUser>>;
let reviewer: Awaited<ReturnType<typeof buildUser>>;
let client: Awaited<ReturnType<typeof buildUser>>;

beforeAll(async () => {
  t = await createTestApp();
  planner = await buildUser({ role: 'planner', name: 'Pat Planner' });
  reviewer = await buildUser({ role: 'reviewer' });
  client = await buildUser({ role: 'client' });
  const project = await buildProject({ name: 'Fernhill line 3', members: [client] });
  const ids = new Map<string, number>();
  for (const m of readDemoCatalogue()) {
    const row = await ArmModel.create({ name: `${m.name} (${process.pid})`, family: m.params.family, params: m.params as Record<string, unknown>, createdBy: null });
    ids.set(m.name, row.id);
  }
  const r = importDxf(readFileSync(DEMO_FLOOR_PLAN_FILE));
  const fp = await FloorPlan.create({
    projectId: project.id, fileName: 'fernhill-hall.dxf', originalDxf: readFileSync(DEMO_FLOOR_PLAN_FILE), units: r.units, unitsSource: r.unitsSource,
    bounds: r.bounds, layers: r.layers, geometry: r.geometry, createdBy: planner.id,
  });
  const demo = readDemoLayout((n) => ids.get(n));
  demoLayoutId = (await Layout.create({ projectId: project.id, floorPlanId: fp.id, name: demo.name, content: demo.content, createdBy: planner.id })).id;
  const scara = ids.get('Demo SCARA 600')!;
  pairLayoutId = (
    await Layout.create({
      projectId: project.id, floorPlanId: null, name: 'Two bases 10 m apart', createdBy: planner.id,
      content: {
        arms: [
          { id: 'A1', armModelId: scara, label: 'West', x: 0, y: 0, yaw: 0, mountHeight: 0 },
          { id: 'A2', armModelId: scara, label: 'East', x: 10000, y: 0, yaw: 0, mountHeight: 0 },
        ],
        workPoints: [], boundaries: [], workHeights: [],
      },
    })
  ).id;
});
afterAll(async () => t.close());

async function pages(pdf: Buffer) {
  const doc = await pdfjs.getDocument({ data: new Uint8Array(pdf), useSystemFonts: false }).promise;
  const out: Array<{ view: number[]; text: string; page: Awaited<ReturnType<typeof doc.getPage>> }> = [];
  for (let i = 1; i <= doc.numPages; i++) {
    const page = await doc.getPage(i);
    const tc = await page.getTextContent();
    const text = tc.items.map((it) => ('str' in it ? it.str : '')).join(' ').replace(/\s+/g, ' ');
    out.push({ view: page.view, text, page });
  }
  return out;
}

describe('plan sheet PDF', () => {
  it('carries the title block, arm labels, findings, cautions, scale and draft mark on A3 landscape', async () => {
    const a = await signedIn(t.app, planner.email, TEST_PASSWORD);
    const res = await a.get(`/api/layouts/${demoLayoutId}/plan-sheet.pdf`).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    const pdf = res.body as Buffer;
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    const ps = await pages(pdf);
    expect(ps.length).toBeGreaterThanOrEqual(6);
    // A3 is 420 × 297 mm (ISO 216); in points 420·72/25.4 = 1190.55 and 297·72/25.4 = 841.89.
    for (const p of ps) {
      expect(p.view[2]).toBeCloseTo(1190.55, 1);
      expect(p.view[3]).toBeCloseTo(841.89, 1);
    }
    const all = ps.map((p) => p.text).join(' ');
    const input = await loadLayoutSheetInput((await Layout.findByPk(demoLayoutId))!);
    for (const field of ['Fernhill line 3', 'Fernhill Biscuit Works', 'Packing hall', 'Fernhill line 3 — cell layout', 'working copy', 'Pat Planner', `1 of ${ps.length}`, `${ps.length} of ${ps.length}`]) {
      expect(ps[0].text + ps[ps.length - 1].text).toContain(field);
    }
    for (const arm of input.layout.content.arms) expect(ps[0].text).toContain(`${arm.id} ${arm.label}`);
    // Long messages wrap in the findings table; pdfjs returns one item per line, so the first
    // 40 characters (always on the first line at this column width) are what can be matched.
    expect(input.analysis.findings.length).toBeGreaterThan(0);
    for (const f of input.analysis.findings) expect(all).toContain(f.message.slice(0, 40));
    expect(all).toMatch(/Critical|Warning/); // severities in words (SEVERITY_LABEL), never raw values
    // Cautions on every page: the standards named and the competent-person sentence.
    for (const p of ps) {
      expect(p.text).toContain('ISO 12100');
      expect(p.text).toContain('ISO 10218-2');
      expect(p.text).toContain('competent person');
      expect(p.text).toContain('nominal kinematics');
      expect(p.text).toContain('DRAFT — not for construction');
    }
    expect(CAUTIONS.length).toBe(4);
    expect(ps[0].text).toMatch(/1:(20|25|50|100|200|250|500)\b/);
    // The demo hall is about 24 m × 16 m: at 1:100 it is 240 × 160 mm and fits the A3 drawing
    // area; at 1:50 (480 mm) it does not — so the automatic scale is 1:100.
    expect(ps[0].text).toContain('1:100');
  });

  it('draws to scale: two arm bases 10 m apart are 10 m / N apart on paper', async () => {
    const a = await signedIn(t.app, planner.email, TEST_PASSWORD);
    const got = await a.get(`/api/layouts/${pairLayoutId}/plan-sheet.pdf?scale=100&sheets=plan`).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(got.status).toBe(200);
    const [p] = await pages(got.body as Buffer);
    const ops = await p.page.getOperatorList();
    // Base symbols are circles of radius 2 mm: paths whose bounding box is 4 mm (11.34 pt) square.
    const side = 4 * MM_TO_PT;
    const centres: Array<[number, number]> = [];
    ops.fnArray.forEach((fn, i) => {
      if (fn !== pdfjs.OPS.constructPath) return;
      const mm = ops.argsArray[i][2] as ArrayLike<number>;
      if (Math.abs(mm[2] - mm[0] - side) < 0.05 && Math.abs(mm[3] - mm[1] - side) < 0.05) centres.push([(mm[0] + mm[2]) / 2, (mm[1] + mm[3]) / 2]);
    });
    expect(centres.length).toBe(2);
    // 10 000 mm at 1:100 = 100 mm on paper = 283.46 pt; both bases at plan y = 0 share a paper y.
    expect(Math.abs(centres[1][0] - centres[0][0])).toBeCloseTo(100 * MM_TO_PT, 1);
    expect(centres[1][1]).toBeCloseTo(centres[0][1], 2);
    expect(centres[1][0]).toBeGreaterThan(centres[0][0]); // east is to the right
    expect(p.text).toContain('1:100');
  });

  it('renders every page with pdftoppm, and two renders of the same input are byte-identical', async () => {
    const input = await loadLayoutSheetInput((await Layout.findByPk(demoLayoutId))!);
    const opts = { size: 'A3' as const, draft: true, createdAt: new Date('2025-03-01T09:00:00Z') };
    const a = await renderPlanSheet(input, opts);
    const b = await renderPlanSheet(input, opts);
    expect(Buffer.compare(a, b)).toBe(0);
    const c = await renderPlanSheet(input, { ...opts, createdAt: new Date('2025-03-02T09:00:00Z') });
    expect(Buffer.compare(a, c)).not.toBe(0);
    const dir = mkdtempSync(path.join(os.tmpdir(), 'rf-sheet-'));
    try {
      writeFileSync(path.join(dir, 'sheet.pdf'), a);
      const r = spawnSync('pdftoppm', ['-r', '30', '-png', path.join(dir, 'sheet.pdf'), path.join(dir, 'page')], { encoding: 'utf8' });
      expect(r.status, r.stderr).toBe(0);
      expect(r.stderr).toBe('');
      const n = (await pages(a)).length;
      expect(readdirSync(dir).filter((f) => f.endsWith('.png')).length).toBe(n);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('other sizes and a chosen scale; bad options get 400 naming the option', async () => {
    const a = await signedIn(t.app, planner.email, TEST_PASSWORD);
    const a4 = await a.get(`/api/layouts/${demoLayoutId}/plan-sheet.pdf?size=A4&scale=200&sheets=plan,findings`).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(a4.status).toBe(200);
    const ps = await pages(a4.body as Buffer);
    expect(ps.length).toBe(2);
    // A4 landscape 297 × 210 mm = 841.89 × 595.28 pt.
    expect(ps[0].view[2]).toBeCloseTo(841.89, 1);
    expect(ps[0].view[3]).toBeCloseTo(595.28, 1);
    expect(ps[0].text).toContain('1:200');
    for (const [q, field] of [['size=B2', 'size'], ['scale=30', 'scale'], ['scale=abc', 'scale'], ['sheets=plan,cover', 'sheets'], ['sheets=', 'sheets']] as const) {
      const bad = await a.get(`/api/layouts/${demoLayoutId}/plan-sheet.pdf?${q}`);
      expect(bad.status, q).toBe(400);
      expect(bad.body.error.fields, q).toHaveProperty([field]);
      expect(bad.body.error.message, q).toContain(field);
    }
  });

  it('prints the Safeguarding sheet: per opening and fence the distances and verdicts, the stopping data and its source, the caution', async () => {
    const a = await signedIn(t.app, planner.email, TEST_PASSWORD);
    const fetchPdf = async (id: number) => {
      const res = await a.get(`/api/layouts/${id}/plan-sheet.pdf?sheets=safeguarding`).buffer(true).parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      });
      expect(res.status).toBe(200);
      return (await pages(res.body as Buffer)).map((p) => p.text).join(' ');
    };
    const demo = await fetchPdf(demoLayoutId);
    const input = await loadLayoutSheetInput((await Layout.findByPk(demoLayoutId))!);
    const door = input.analysis.safeguarding!.openings[0];
    // The demo door: interlocked, category 1, the palletizer's category 1 time; ISO 13855 S = 1600·T.
    expect(door).toMatchObject({ id: 'O1', device: 'interlock', stopField: 'stopTimeCat1S' });
    expect(door.requiredMm).toBeCloseTo(1600 * door.tS!, 6);
    for (const text of ['Safeguarding', 'separation distance (ISO 13855)', 'O1 Pallet exchange', 'interlocked guard', String(Math.round(door.requiredMm!)), String(Math.round(door.actualMm!)), 'too close',
      'reach over and reach through (ISO 13857)', 'F1 Cell guard', 'Stopping data used', 'stop time, category 1', `${door.stopTimeS} s`, 'competent person under ISO 13855']) {
      expect(demo).toContain(text);
    }
    const model = input.models.find((m) => m.id === door.armModelId)!;
    expect(demo).toContain(model.name.slice(0, 20));
    // A model without a category 1 time behind a category 1 door: said where the value would be.
    const bare = await ArmModel.create({ name: `No stop data (${process.pid})`, family: 'scara', params: { family: 'scara', innerLink: 500, outerLink: 500, strokeMin: 0, strokeMax: 300, axes: [{ min: -180, max: 180 }, { min: -180, max: 180 }] }, createdBy: null });
    const project = await buildProject();
    const lacking = await Layout.create({
      projectId: project.id, floorPlanId: null, name: 'Door without stop data', createdBy: planner.id,
      content: {
        arms: [{ id: 'R1', armModelId: bare.id, label: '', x: 0, y: 0, yaw: 0, mountHeight: 0 }], workPoints: [], workHeights: [],
        boundaries: [
          { id: 'F1', kind: 'fence', label: '', points: [[1500, -3000], [1500, 3000]], height: 2000 },
          { id: 'O1', kind: 'opening', label: '', points: [[1500, -500], [1500, 500]], fenceId: 'F1', safeguard: { device: 'interlock', responseTimeS: 0.1, stopCategory: 1, approach: 'normal' } },
        ],
      },
    });
    const text = await fetchPdf(lacking.id);
    expect(text).toContain('not computed');
    expect(text).toContain('not given in the arm model');
    expect(text).toContain('data missing');
  });

  it('reviewers may fetch the working copy; clients and strangers may not', async () => {
    const rv = await signedIn(t.app, reviewer.email, TEST_PASSWORD);
    expect((await rv.get(`/api/layouts/${pairLayoutId}/plan-sheet.pdf?sheets=plan`)).status).toBe(200);
    const cl = await signedIn(t.app, client.email, TEST_PASSWORD);
    expect((await cl.get(`/api/layouts/${pairLayoutId}/plan-sheet.pdf`)).status).toBe(403);
    expect((await cl.get(`/api/layouts/${pairLayoutId}/layout.dxf`)).status).toBe(403);
    const anon = await (await import('supertest')).default(t.app).get(`/api/layouts/${pairLayoutId}/plan-sheet.pdf`);
    expect(anon.status).toBe(401);
  });

  it("keeps to Lato's glyphs: the charset table matches the font's cmap as fontconfig reads it", () => {
    // fontconfig's fc-query reads the TTF's cmap independently of jsPDF (fontconfig documentation, %{charset}).
    for (const style of ['400Regular/Lato_400Regular.ttf', '700Bold/Lato_700Bold.ttf']) {
      const file = path.resolve('node_modules/@expo-google-fonts/lato', style);
      const r = spawnSync('fc-query', ['-f', '%{charset}', file], { encoding: 'utf8' });
      expect(r.status, r.stderr).toBe(0);
      const ranges = r.stdout.trim().split(/\s+/).map((part) => {
        const [a, b] = part.split('-').map((h) => parseInt(h, 16));
        return [a, b ?? a];
      });
      expect(ranges).toEqual(LATO_RANGES.map(([a, b]) => [a, b]));
    }
    for (const text of [...CAUTIONS, SAFEGUARDING_CAUTION, DRAFT_MARK, 'Reach band at 900 mm', 'Area m²', 'Yaw °', '−12', '×']) {
      for (const ch of text) expect(latoHas(ch.codePointAt(0)!), `${text}: ${ch}`).toBe(true);
    }
    for (const missing of ['✓', '✗', '→', '↑']) expect(latoHas(missing.codePointAt(0)!)).toBe(false);
    expect(sheetText('ok ✓ → done')).toBe('ok ? ? done');
  });
});
