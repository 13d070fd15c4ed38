// Guard-ring proposal against disk-shaped restricted spaces (an arm reaching every point within R of
// its base): the distances come from ISO 13857's tables, the panel arithmetic from the run lengths.
import { describe, expect, it } from 'vitest';
import { annularSector } from '@shared/geometry/annularSector';
import { pointInPolygons } from '@shared/geometry/pointInPolygon';
import { pointSegmentDistance } from '@shared/geometry/segmentDistance';
import type { Polygon2, Pt } from '@shared/geometry/types';
import type { ArmReach, ArmReachFactory, PreparedFloor } from '@shared/analysis';
import { applyFenceProposal, FenceProposalError, proposeFence } from '@shared/analysis/fenceProposal';
import { DEFAULT_FENCE_SYSTEM, FenceSystemInput } from '@shared/schemas/fenceProposal';
import type { ArmPlacement, Boundary } from '@shared/schemas/layout';

/** model id = reach radius in mm; highest tool-point height 2000 mm above the mounting face. */
const diskReach: ArmReachFactory = (modelId) => {
  const full = [annularSector({ cx: 0, cy: 0, rInner: 0, rOuter: modelId, startDeg: 0, endDeg: 360 })];
  const envelope = { profile: [[[[0, 0], [modelId, 0], [modelId, 2000], [0, 2000]]]] as Polygon2[], toleranceMm: 0, j1RangeDeg: { min: -180, max: 180 }, lateralMm: { min: 0, max: 0 } };
  const reach: ArmReach = { maxReach: modelId, zMin: 0, zMax: 2000, restricted: full, bandAt: () => full, restrictedBelow: () => full, margin: (x, y) => modelId - Math.hypot(x, y), envelope };
  return reach;
};
const arm = (id: string, x: number, y: number, R = 1000): ArmPlacement => ({ id, armModelId: R, label: '', x, y, yaw: 0, mountHeight: 0 });
const restrictedOf = (a: ArmPlacement): Polygon2[] => diskReach(a.armModelId, undefined).restricted.map((p) => p.map((r) => r.map(([x, y]) => [x + a.x, y + a.y] as Pt)));

// ISO 13857:2019 reaching through regular openings (age 14 and over): square 12 < e ≤ 20 mm →
// s_r = 120 mm [pub]. ISO 13857:2019 reaching over, high risk: hazard height a = 2000 mm, structure
// height b = 2000 mm → c = 600 mm [pub] (the 2000…2700 rows were checked against a published
// reproduction of the table). Clearance 150 mm [practice] (common practice: 120–200 mm).
// The required distance is the larger of the two plus the clearance [derived].
const REQUIRED_MM = Math.max(120, 600) + 150;

/** Smallest distance between the fence lines (every 10 mm along them) and a region's edges, brute force. */
function sampledDistance(lines: ReadonlyArray<ReadonlyArray<readonly [number, number]>>, region: Polygon2[]): number {
  let best = Infinity;
  for (const l of lines) {
    for (let i = 0; i + 1 < l.length; i++) {
      const [a, b] = [l[i], l[i + 1]];
      const n = Math.max(1, Math.ceil(Math.hypot(b[0] - a[0], b[1] - a[1]) / 10));
      for (let k = 0; k <= n; k++) {
        const x = a[0] + ((b[0] - a[0]) * k) / n, y = a[1] + ((b[1] - a[1]) * k) / n;
        for (const poly of region) for (const r of poly) for (let e = 0; e < r.length; e++) {
          const p = r[e], q = r[(e + 1) % r.length];
          best = Math.min(best, pointSegmentDistance(x, y, p[0], p[1], q[0], q[1]));
        }
      }
    }
  }
  return best;
}

const fences = (boundaries: Boundary[]) => boundaries.filter((z) => z.kind === 'fence');
const propose = (arms: ArmPlacement[], extra: Partial<{ boundaries: Boundary[]; floor: PreparedFloor | null; useWalls: boolean }> = {}) =>
  proposeFence({ arms, boundaries: extra.boundaries ?? [], floor: extra.floor ?? null, reachFor: diskReach, system: { ...DEFAULT_FENCE_SYSTEM, useWalls: extra.useWalls ?? true } });

describe('guard-ring proposal', () => {
  it('keeps the ISO 13857 distance plus clearance from a single arm in the open and encloses it', () => {
    const a = arm('R1', 5000, 4000);
    const p = propose([a]);
    expect(p.required[0]).toMatchObject({ reachThroughMm: 120, reachOverMm: 600, requiredMm: REQUIRED_MM });
    expect(p.rings).toHaveLength(1);
    const lines = fences(p.boundaries).map((f) => f.points);
    const restricted = restrictedOf(a);
    const d = sampledDistance(lines, restricted);
    expect(d).toBeGreaterThanOrEqual(REQUIRED_MM - 0.5);
    // A box ring: no more than the disk's box padded by the distance (and the offset's arc tolerance).
    expect(d).toBeLessThan(REQUIRED_MM + 5);
    for (const poly of restricted) for (const [x, y] of poly[0]) expect(pointInPolygons(x, y, [[p.rings[0].ring]])).toBe(true);
    // Right angles only: every edge parallel to a plan axis.
    const ring = p.rings[0].ring;
    ring.forEach((q, i) => {
      const r = ring[(i + 1) % ring.length];
      expect(Math.min(Math.abs(q[0] - r[0]), Math.abs(q[1] - r[1]))).toBeLessThan(0.01);
    });
  });

  it('splits every run into panels and posts that add up to its length within one post width', () => {
    const p = propose([arm('R1', 0, 0)]);
    const post = DEFAULT_FENCE_SYSTEM.postWidthMm;
    for (const run of p.parts.runs) expect(Math.abs(run.builtMm - run.lengthMm)).toBeLessThanOrEqual(post);
    // The runs and the doors (clear width plus a post) make up the whole fence line.
    const runs = p.parts.runs.reduce((s, r) => s + r.lengthMm, 0);
    const doors = p.parts.doors.reduce((s, d) => s + d.widthMm + post, 0);
    expect(Math.abs(runs + doors - p.lengthMm)).toBeLessThanOrEqual(p.parts.runs.length + 1);
    // The ring of a disk of 1000 mm: a square of side 2 × (1000 + 750) mm (the disk's polygon errs
    // outward by its chord tolerance, a few millimetres at most).
    expect(Math.abs(p.lengthMm - 4 * 2 * (1000 + REQUIRED_MM))).toBeLessThan(20);
    for (const pn of p.parts.panels) expect(pn.cutFromMm == null ? DEFAULT_FENCE_SYSTEM.panelWidthsMm.includes(pn.widthMm) : pn.widthMm <= pn.cutFromMm).toBe(true);
    const bomPanels = p.bom.filter((b) => b.item.startsWith('panel')).reduce((s, b) => s + b.quantity, 0);
    expect(bomPanels).toBe(p.parts.panels.length);
    const bomPosts = p.bom.filter((b) => b.item.startsWith('post')).reduce((s, b) => s + b.quantity, 0);
    expect(bomPosts).toBe(p.parts.posts.length);
    expect(p.bom.find((b) => b.item === 'post, corner')?.quantity).toBe(4);
    expect(p.bom.find((b) => b.item === 'floor anchor')?.quantity).toBe(2 * bomPosts);
    expect(p.bom.find((b) => b.item === 'interlock')?.quantity).toBe(p.parts.doors.length);
  });

  it('puts two arms close together in one ring and two far apart in two rings', () => {
    expect(propose([arm('R1', 0, 0), arm('R2', 2500, 0)]).rings).toHaveLength(1);
    // Boxes of side 3500 mm: two apart are shorter than one around both once the gap exceeds a side.
    const far = propose([arm('R1', 0, 0), arm('R2', 12000, 0)]);
    expect(far.rings).toHaveLength(2);
    expect(far.rings.map((r) => r.arms)).toEqual([['R1'], ['R2']]);
    const near = propose([arm('R1', 0, 0), arm('R2', 5000, 0)]);
    expect(near.rings).toHaveLength(1);
    expect(near.lengthMm).toBeLessThan(2 * 4 * 3500);
  });

  it('closes the ring on a wall when walls may be used, with no panel along the wall', () => {
    // A full-height wall 150 mm thick whose south face runs 1500 mm north of the arm, 10 m long.
    const wall: Polygon2 = [[[-5000, 1500], [5000, 1500], [5000, 1650], [-5000, 1650]]];
    const floor: PreparedFloor = { outline: [], structures: [{ id: 'WALLS#0', layer: 'WALLS', role: 'wall', top: Infinity, polygons: [wall], lines: [], bbox: [-5000, 1500, 5000, 1650] }] };
    const p = propose([arm('R1', 0, 0)], { floor });
    expect(p.rings[0].wallStretches).toHaveLength(1);
    const [a, b] = p.rings[0].wallStretches[0];
    expect(a[1]).toBeCloseTo(1500, 3);
    expect(b[1]).toBeCloseTo(1500, 3);
    const fs = fences(p.boundaries);
    expect(fs).toHaveLength(1);
    const pts = fs[0].points;
    expect(pts[0][1]).toBeCloseTo(1500, 3);
    expect(pts[pts.length - 1][1]).toBeCloseTo(1500, 3);
    for (let i = 0; i + 1 < pts.length; i++) expect(pts[i][1] === 1500 && pts[i + 1][1] === 1500).toBe(false);
    for (const pn of p.parts.panels) expect(Math.abs(pn.at[1] - 1500)).toBeGreaterThan(1);
    expect(p.bom.find((x) => x.item === 'post, wall-fixing')?.quantity).toBe(2);
    expect(sampledDistance([pts], restrictedOf(arm('R1', 0, 0)))).toBeGreaterThanOrEqual(REQUIRED_MM - 0.5);
    // Without walls the same layout gets a closed ring with four corners.
    const closed = propose([arm('R1', 0, 0)], { floor, useWalls: false });
    expect(closed.rings[0].wallStretches).toHaveLength(0);
    expect(closed.bom.find((x) => x.item === 'post, wall-fixing')).toBeUndefined();
  });

  it('routes around a column the ring would cross and keeps it out of every fence line', () => {
    // A 400 mm column centred on the line the east side would take (x = 1750).
    const col: Polygon2 = [[[1550, -200], [1950, -200], [1950, 200], [1550, 200]]];
    const floor: PreparedFloor = { outline: [], structures: [{ id: 'COLUMNS#0', layer: 'COLUMNS', role: 'column', top: Infinity, polygons: [col], lines: [], bbox: [1550, -200, 1950, 200] }] };
    const p = propose([arm('R1', 0, 0)], { floor });
    const pts = fences(p.boundaries)[0].points;
    expect(sampledDistance([pts], [col])).toBeGreaterThanOrEqual(DEFAULT_FENCE_SYSTEM.postWidthMm - 0.5);
    expect(pointInPolygons(1750, 0, [[p.rings[0].ring]])).toBe(true);
  });

  it('says so when a ring leaves the floor, and closes it on the floor outline when walls may be used', () => {
    const floor: PreparedFloor = { outline: [[[[0, 0], [3000, 0], [3000, 6000], [0, 6000]]]], structures: [] };
    const open = propose([arm('R1', 1200, 3000)], { floor, useWalls: false });
    expect(open.notes.join(' ')).toMatch(/outside the floor outline/);
    const walled = propose([arm('R1', 1200, 3000)], { floor });
    expect(walled.notes.join(' ')).not.toMatch(/outside the floor outline/);
    expect(walled.rings[0].wallStretches.length).toBeGreaterThan(0);
  });

  it('puts a door with an interlock at the operator area', () => {
    const op: Boundary = { id: 'OP1', kind: 'operator', label: 'Loading', points: [[-1000, -3500], [1000, -3500], [1000, -2000], [-1000, -2000]] };
    const p = propose([arm('R1', 0, 0)], { boundaries: [op] });
    const doors = p.boundaries.filter((z) => z.kind === 'opening');
    expect(doors).toHaveLength(1);
    expect(doors[0].safeguard?.device).toMatch(/^interlock/);
    expect(doors[0].points.every(([, y]) => Math.abs(y - -(1000 + REQUIRED_MM)) < 5)).toBe(true);
    expect(Math.hypot(doors[0].points[1][0] - doors[0].points[0][0], 0)).toBe(2000);
    // The operator area stays in the layout when the proposal is applied; old fences go.
    const old: Boundary = { id: 'F1', kind: 'fence', label: '', height: 2000, points: [[0, 0], [1, 1]] };
    const boundaries = applyFenceProposal([op, old], p);
    expect(boundaries.map((z) => z.id)).toEqual(['OP1', ...p.boundaries.map((z) => z.id)]);
  });

  it('refuses a layout without arms with a sentence, and options the standards do not cover by field', () => {
    expect(() => propose([])).toThrow(FenceProposalError);
    expect(() => propose([])).toThrow(/no arms/);
    const bad = FenceSystemInput.safeParse({ panelWidthsMm: [], meshMm: 200, panelHeightMm: 900 });
    expect(bad.success).toBe(false);
    const paths = bad.error!.issues.map((i) => String(i.path[0]));
    expect(paths).toEqual(expect.arrayContaining(['panelWidthsMm', 'meshMm', 'panelHeightMm']));
  });
});
