// Safeguarding checks at layout level against disk-shaped restricted spaces (an arm whose restricted
// space is a disk of radius R round its base), so every plan distance is known exactly. Required
// distances are worked out by hand from the published formulas and tables named beside each check;
// tests/reference/safety.test.ts checks the formulas and tables themselves.
import { describe, expect, it } from 'vitest';
import type { FeatureCollection } from 'geojson';
import { annularSector } from '@shared/geometry/annularSector';
import { createAnalyzer, prepareFloor, type AnalysisInput, type AnalysisResult, type ArmReach, type ArmReachFactory, type Finding } from '@shared/analysis';
import { ArmModelInput } from '@shared/schemas/armModel';
import { LayoutContent, Boundary } from '@shared/schemas/layout';
import { issueSentence } from '@shared/schemas/labels';

/** Models (R 1000 mm each): 1 with both stopping times, 2 with only the category 0 time, 3 stopping in 0.18 s. */
const MODELS: Record<number, { R: number; stop: { 0?: number; 1?: number } }> = {
  1: { R: 1000, stop: { 0: 0.5, 1: 0.7 } },
  2: { R: 1000, stop: { 0: 0.5 } },
  3: { R: 1000, stop: { 0: 0.18 } },
};
const diskReach: ArmReachFactory = (modelId) => {
  const m = MODELS[modelId];
  const full = [annularSector({ cx: 0, cy: 0, rInner: 0, rOuter: m.R, startDeg: 0, endDeg: 360 })];
  const reach: ArmReach = {
    maxReach: m.R,
    zMin: 0,
    zMax: 2000,
    restricted: full,
    bandAt: () => full,
    restrictedBelow: () => full,
    margin: (x, y) => m.R - Math.hypot(x, y),
    envelope: { profile: [[[[0, 0], [m.R, 0], [m.R, 2000], [0, 2000]]]], toleranceMm: 0, j1RangeDeg: { min: -180, max: 180 }, lateralMm: { min: 0, max: 0 } },
    stopTimeS: m.stop,
  };
  return reach;
};

// annularSector draws the disk up to 1 mm outside the circle (its chord tolerance), so measured distances are up to 1 mm short.
const near = (mm: number) => expect.closeTo(mm - 0.5, -0.1); // within 0.63 mm of mm − 0.5
const arm = (id: string, x: number, y: number, model = 1) => ({ id, armModelId: model, label: '', x, y, yaw: 0, mountHeight: 0 });
const input = (over: Partial<AnalysisInput>): AnalysisInput => ({ arms: [], workPoints: [], boundaries: [], workHeights: [900], floor: null, ...over });

/** A straight fence along x = X with an opening from y = −500 to 500 carrying `safeguard`. */
function fenceWithDoor(X: number, safeguard: Boundary['safeguard'], height = 2000): Boundary[] {
  return [
    { id: 'F1', kind: 'fence', label: '', points: [[X, -4000], [X, 4000]], height },
    { id: 'O1', kind: 'opening', label: 'Door', points: [[X, -500], [X, 500]], fenceId: 'F1', safeguard },
  ];
}
const door = { device: 'interlock' as const, responseTimeS: 0.1, stopCategory: 0 as const, approach: 'normal' as const };
const kinds = (r: AnalysisResult, kind: Finding['kind']) => r.findings.filter((f) => f.kind === kind);

describe('safeguarded openings (ISO 13855)', () => {
  it('flags an interlocked door closer than S = 1600·T once, and clears it when the arm moves back', () => {
    // ISO 13855, interlocked guard without guard locking: S = K·T with K = 1600 mm/s;
    // T = 0.1 s response + 0.5 s category 0 stop = 0.6 s → S = 960 mm.
    const a = createAnalyzer(diskReach);
    const close = a.analyze(input({ arms: [arm('R1', 0, 0)], boundaries: fenceWithDoor(1500, door) }));
    const too = kinds(close, 'opening-too-close');
    expect(too).toHaveLength(1);
    expect(too[0].id).toBe('opening-too-close:O1+R1');
    expect(too[0].severity).toBe('critical');
    expect(too[0].data).toMatchObject({ requiredMm: 960, actualMm: near(500) });
    expect(too[0].message).toMatch(/(499|500) mm.*960 mm/);
    const row = close.safeguarding!.openings[0];
    expect(row).toMatchObject({ id: 'O1', device: 'interlock', armId: 'R1', stopField: 'stopTimeS', stopTimeS: 0.5, tS: 0.6, requiredMm: 960, actualMm: near(500), ok: false });
    // The arm 500 mm farther back: 1000 mm ≥ 960 mm.
    const far = a.analyze(input({ arms: [arm('R1', -500, 0)], boundaries: fenceWithDoor(1500, door) }));
    expect(kinds(far, 'opening-too-close')).toHaveLength(0);
    expect(far.safeguarding!.openings[0]).toMatchObject({ actualMm: near(1000), requiredMm: 960, ok: true });
  });

  it('uses the category 1 stopping time for a category 1 safeguard', () => {
    // T = 0.1 + 0.7 = 0.8 s → S = 1600 × 0.8 = 1280 mm (ISO 13855, interlocked guard).
    const r = createAnalyzer(diskReach).analyze(input({ arms: [arm('R1', -500, 0)], boundaries: fenceWithDoor(1500, { ...door, stopCategory: 1 }) }));
    expect(r.safeguarding!.openings[0]).toMatchObject({ stopField: 'stopTimeCat1S', tS: 0.8, requiredMm: 1280, actualMm: near(1000), ok: false });
    expect(kinds(r, 'opening-too-close')).toHaveLength(1);
  });

  it('says the stopping data is missing, and computes no distance, for a model without the category 1 time', () => {
    const r = createAnalyzer(diskReach).analyze(input({ arms: [arm('R1', 0, 0, 2)], boundaries: fenceWithDoor(1500, { ...door, stopCategory: 1 }) }));
    const missing = kinds(r, 'stopping-data-missing');
    expect(missing).toHaveLength(1);
    expect(missing[0].id).toBe('stopping-data-missing:O1+R1');
    expect(missing[0].severity).toBe('warning');
    expect(kinds(r, 'opening-too-close')).toHaveLength(0);
    expect(r.safeguarding!.openings[0]).toMatchObject({ armId: 'R1', stopTimeS: null, tS: null, requiredMm: null, ok: null });
  });

  it('needs no separation distance behind a guard-locking door', () => {
    // ISO 13855: a guard with guard locking stays shut until the hazard has stopped.
    const r = createAnalyzer(diskReach).analyze(input({ arms: [arm('R1', 0, 0, 2)], boundaries: fenceWithDoor(1200, { ...door, device: 'interlock-locking', stopCategory: 1 }) }));
    expect(kinds(r, 'opening-too-close')).toHaveLength(0);
    expect(kinds(r, 'stopping-data-missing')).toHaveLength(0);
    expect(r.safeguarding!.openings[0]).toMatchObject({ requiredMm: 0, actualMm: near(200), ok: true });
  });

  it('takes a light curtain with 14 mm resolution at K = 2000 mm/s and C = 0', () => {
    // ISO 13855: S = 2000·T + 8(d − 14) = 2000 × (0.02 + 0.18) + 0 = 400 mm (≤ 500 mm, so K = 2000 stands).
    const r = createAnalyzer(diskReach).analyze(input({ arms: [arm('R1', 0, 0, 3)], boundaries: fenceWithDoor(1300, { device: 'light-curtain', resolutionMm: 14, responseTimeS: 0.02, stopCategory: 0, approach: 'normal' }) }));
    expect(r.safeguarding!.openings[0]).toMatchObject({ requiredMm: 400, actualMm: near(300), ok: false });
  });
});

describe('fences (ISO 13857)', () => {
  it('checks reach over a fence from the arm\'s envelope top and the fence height', () => {
    // ISO 13857 high-risk reach-over table: hazard height a = 2000 mm (mount 0 + zMax 2000),
    // structure height b = 1400 mm → c = 1100 mm.
    const a = createAnalyzer(diskReach);
    const fence = (x: number): Boundary[] => [{ id: 'F1', kind: 'fence', label: 'Guard', points: [[x, -3000], [x, 3000]], height: 1400 }];
    const close = a.analyze(input({ arms: [arm('R1', 0, 0)], boundaries: fence(2000) }));
    const over = kinds(close, 'fence-reach-over');
    expect(over).toHaveLength(1);
    expect(over[0].id).toBe('fence-reach-over:F1+R1');
    expect(over[0].data).toMatchObject({ requiredMm: 1100, actualMm: near(1000), hazardHeightMm: 2000 });
    expect(close.safeguarding!.fences[0]).toMatchObject({ id: 'F1', heightMm: 1400, hazardHeightMm: 2000, requiredMm: 1100, actualMm: near(1000), ok: false });
    const clear = a.analyze(input({ arms: [arm('R1', 0, 0)], boundaries: fence(2200) }));
    expect(kinds(clear, 'fence-reach-over')).toHaveLength(0);
    expect(clear.safeguarding!.fences[0]).toMatchObject({ requiredMm: 1100, actualMm: near(1200), ok: true });
    // b = 2000 mm at a = 2000 mm → c = 600 mm: the same 1000 mm is enough.
    const tall = a.analyze(input({ arms: [arm('R1', 0, 0)], boundaries: [{ ...fence(2000)[0], height: 2000 }] }));
    expect(tall.safeguarding!.fences[0]).toMatchObject({ requiredMm: 600, ok: true });
  });

  it('says the reach-over table does not cover a fence below 1000 mm', () => {
    const r = createAnalyzer(diskReach).analyze(input({ arms: [arm('R1', 0, 0)], boundaries: [{ id: 'F1', kind: 'fence', label: '', points: [[2000, -3000], [2000, 3000]], height: 900 }] }));
    expect(r.safeguarding!.fences[0]).toMatchObject({ requiredMm: null, ok: null });
    expect(r.safeguarding!.fences[0].note).toMatch(/does not cover fences lower than 1000 mm/);
    expect(kinds(r, 'fence-too-low')).toHaveLength(1);
  });

  it('checks reach through the mesh against s_r for its opening size and shape', () => {
    // ISO 13857 reach-through table (age 14 and over): e = 25 mm slot → s_r ≥ 850 mm; e = 25 mm square → s_r ≥ 120 mm.
    // A 2700 mm fence needs no reach-over distance (c = 0 in the b = 2700 mm column).
    const a = createAnalyzer(diskReach);
    const mesh = (shape: 'slot' | 'square'): Boundary[] => [{ id: 'F1', kind: 'fence', label: '', points: [[1600, -3000], [1600, 3000]], height: 2700, meshMm: 25, meshShape: shape }];
    const slot = a.analyze(input({ arms: [arm('R1', 0, 0)], boundaries: mesh('slot') }));
    const through = kinds(slot, 'fence-reach-through');
    expect(through).toHaveLength(1);
    expect(through[0].data).toMatchObject({ requiredMm: 850, actualMm: near(600) });
    expect(slot.safeguarding!.fences[0]).toMatchObject({ meshMm: 25, meshShape: 'slot', reachThroughMm: 850, requiredMm: 0, ok: false });
    const square = a.analyze(input({ arms: [arm('R1', 0, 0)], boundaries: mesh('square') }));
    expect(kinds(square, 'fence-reach-through')).toHaveLength(0);
    expect(square.safeguarding!.fences[0]).toMatchObject({ reachThroughMm: 120, ok: true });
  });
});

describe('crushing gaps (ISO 13854)', () => {
  const columnAt = (x: number): FeatureCollection => ({
    type: 'FeatureCollection',
    features: [{ type: 'Feature', properties: { layer: 'COLUMNS' }, geometry: { type: 'Polygon', coordinates: [[[x, -150], [x + 300, -150], [x + 300, 150], [x, 150], [x, -150]]] } }],
  });
  const layers = [{ name: 'COLUMNS', role: 'column' as const, height: null }];

  it('flags a 300 mm gap to a column and not a 600 mm one (500 mm for the body)', () => {
    const a = createAnalyzer(diskReach);
    const tight = a.analyze(input({ arms: [arm('R1', 0, 0)], floor: prepareFloor(columnAt(1300), layers) }));
    const gaps = kinds(tight, 'crushing-gap');
    expect(gaps).toHaveLength(1);
    expect(gaps[0].id).toBe('crushing-gap:R1+COLUMNS');
    expect(Number(gaps[0].data!.gapMm)).toBeCloseTo(300, -1);
    const wide = a.analyze(input({ arms: [arm('R1', 0, 0)], floor: prepareFloor(columnAt(1600), layers) }));
    expect(kinds(wide, 'crushing-gap')).toHaveLength(0);
  });

  it('flags a 300 mm gap to a fence, and no gap where the restricted space touches the item', () => {
    const a = createAnalyzer(diskReach);
    const r = a.analyze(input({ arms: [arm('R1', 0, 0)], boundaries: [{ id: 'F1', kind: 'fence', label: '', points: [[1300, -3000], [1300, 3000]], height: 2700 }] }));
    expect(kinds(r, 'crushing-gap').map((f) => f.id)).toEqual(['crushing-gap:R1+F1']);
    const touching = a.analyze(input({ arms: [arm('R1', 0, 0)], floor: prepareFloor(columnAt(900), layers) }));
    expect(kinds(touching, 'crushing-gap')).toHaveLength(0);
  });

  it('leaves out a gap outside the guarded area', () => {
    // The arm stands inside a closed fence; the column stands outside it, 300 mm beyond the restricted space.
    const ring: Boundary = { id: 'F1', kind: 'fence', label: '', points: [[-2000, -2000], [1200, -2000], [1200, 2000], [-2000, 2000], [-2000, -2000]], height: 2700 };
    const r = createAnalyzer(diskReach).analyze(input({ arms: [arm('R1', 0, 0)], boundaries: [ring], floor: prepareFloor(columnAt(1300), layers) }));
    expect(kinds(r, 'crushing-gap').map((f) => f.id)).toEqual(['crushing-gap:R1+F1']);
  });
});

describe('layout schema: safeguards and meshes', () => {
  const fence = { id: 'F1', kind: 'fence', points: [[0, 0], [4000, 0]], height: 2000 };
  const opening = { id: 'O1', kind: 'opening', points: [[1000, 0], [2000, 0]], fenceId: 'F1' };
  const parse = (boundaries: unknown[]) => ({ input: { boundaries }, r: LayoutContent.safeParse({ boundaries }) });
  // The sentences people see: the field's label, the boundary by its kind and id (shared/schemas/labels.ts).
  const messages = ({ input, r }: ReturnType<typeof parse>) => (r.success ? [] : r.error.issues.map((i) => `${i.path.join('.')}: ${issueSentence(i, { input })}`));

  it('takes a safeguard on an opening, defaulting the approach to normal', () => {
    const { r } = parse([fence, { ...opening, safeguard: { device: 'interlock', responseTimeS: 0.05, stopCategory: 1 } }]);
    expect(r.success).toBe(true);
    expect(r.data!.boundaries[1].safeguard).toEqual({ device: 'interlock', responseTimeS: 0.05, stopCategory: 1, approach: 'normal' });
    const mesh = parse([{ ...fence, meshMm: 30, meshShape: 'square' }]);
    expect(mesh.r.success).toBe(true);
  });

  it('names the field of a bad safeguard or mesh', () => {
    expect(messages(parse([{ ...fence, safeguard: { device: 'interlock', responseTimeS: 0.05, stopCategory: 0 } }]))).toContain('boundaries.0.safeguard: Fence F1: only an access opening carries a safeguard');
    expect(messages(parse([fence, { ...opening, safeguard: { device: 'mat', responseTimeS: 0.05, stopCategory: 0 } }]))[0]).toBe('boundaries.1.safeguard.device: Safeguard device of access opening O1 must be one of interlock, interlock-locking, light-curtain, multi-beam or single-beam');
    expect(messages(parse([fence, { ...opening, safeguard: { device: 'interlock', responseTimeS: 0.05, stopCategory: 2 } }]))).toContain('boundaries.1.safeguard.stopCategory: Stop category of access opening O1 must be 0 or 1');
    expect(messages(parse([fence, { ...opening, safeguard: { device: 'light-curtain', responseTimeS: 0.02, stopCategory: 0 } }]))).toContain('boundaries.1.safeguard.resolutionMm: Access opening O1: give the light curtain its resolution (mm)');
    expect(messages(parse([fence, { ...opening, safeguard: { device: 'interlock', responseTimeS: -1, stopCategory: 0 } }]))).toContain('boundaries.1.safeguard.responseTimeS: Response time of access opening O1 must not be negative');
    expect(messages(parse([{ ...fence, meshMm: 150, meshShape: 'slot' }]))[0]).toMatch(/^boundaries\.0\.meshMm: Fence F1: mesh size must be at most 120 mm/);
    expect(messages(parse([{ ...fence, meshMm: 20 }]))).toContain('boundaries.0.meshShape: Fence F1: give the mesh shape with its size');
    expect(messages(parse([fence, { ...opening, meshMm: 20, meshShape: 'slot' }]))).toContain('boundaries.1.meshMm: Access opening O1: only a fence has a mesh');
  });

  it('keeps the category 0 stopping time as stopTimeS and adds stopTimeCat1S to arm models', () => {
    const base = { family: 'scara', innerLink: 325, outerLink: 275, strokeMin: 0, strokeMax: 200, axes: [{ min: -140, max: 140 }, { min: -145, max: 145 }] };
    const ok = ArmModelInput.safeParse({ name: 'Demo SCARA', params: { ...base, stopTimeS: 0.2, stopTimeCat1S: 0.35 } });
    expect(ok.success).toBe(true);
    expect(ok.data!.params).toMatchObject({ stopTimeS: 0.2, stopTimeCat1S: 0.35 });
    const bad = ArmModelInput.safeParse({ name: 'Demo SCARA', params: { ...base, stopTimeCat1S: 0 } });
    expect(bad.success).toBe(false);
    expect(bad.error!.issues[0].path.join('.')).toBe('params.stopTimeCat1S');
  });
});
