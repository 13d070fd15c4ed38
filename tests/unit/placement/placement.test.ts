// Placement search against closed-form geometry: a full-range SCARA (two equal links, J1 and J2
// over ±180°) reaches the annulus |L1 − L2| ≤ r ≤ L1 + L2 (law of cosines on the 2R chain), so the
// spots that reach a point form the same annulus around it, and the spot that reaches every point of
// a circle best is its centre.
import { describe, expect, it } from 'vitest';
import { cellReasonText, createAnalyzer, placementSearch, type PlacementQuery } from '@shared/analysis';
import { cellAt } from '../../../frontend/src/components/layout/placementMapDraw';
import { armReachFor } from '@shared/analysis/armReach';
import type { WorkPoint, Boundary } from '@shared/schemas/layout';
import { polygonsArea } from '@shared/geometry/area';
import { clipIntersect } from '@shared/geometry/clipper';
import { armPose } from '@shared/geometry/frames';

const scara = (inner: number, outer: number) => ({
  family: 'scara',
  innerLink: inner,
  outerLink: outer,
  strokeMin: 0,
  strokeMax: 400,
  axes: [{ min: -180, max: 180 }, { min: -180, max: 180 }],
});
const FULL600 = scara(300, 300);

const centre = { x: 5000, y: 3000 };
const circle = (n: number, r: number, z = 300): WorkPoint[] =>
  Array.from({ length: n }, (_, i) => ({ id: `P${i + 1}`, x: centre.x + r * Math.cos((2 * Math.PI * i) / n), y: centre.y + r * Math.sin((2 * Math.PI * i) / n), z, approach: 'top', tag: '' }));

const query = (over: Partial<PlacementQuery> = {}): PlacementQuery => ({
  reach: armReachFor(FULL600, undefined),
  points: circle(12, 500),
  minMarginMm: 0,
  yawMinDeg: 0,
  yawMaxDeg: 360,
  yawStepDeg: 30,
  mountHeightMm: 0,
  floor: null,
  boundaries: [],
  gridMm: 10,
  ...over,
});

describe('placement search', () => {
  it('puts the best candidate at the centre of a circle of points, and the analysis agrees with its margin', () => {
    const q = query();
    const r = placementSearch(q);
    expect(r.candidates.length).toBeGreaterThan(0);
    const best = r.candidates[0];
    // One grid step (10 mm) of the centre.
    expect(Math.hypot(best.x - centre.x, best.y - centre.y)).toBeLessThanOrEqual(10);
    // At the centre every point is 500 mm away from a 600 mm reach: about 100 mm margin (geometry).
    expect(best.worstMarginMm).toBeGreaterThan(85);
    expect(best.worstMarginMm).toBeLessThan(101);
    const analyzer = createAnalyzer(() => armReachFor(FULL600, undefined));
    const res = analyzer.analyze({ arms: [{ id: 'R9', armModelId: 1, label: '', x: best.x, y: best.y, yaw: best.yawDeg, mountHeight: 0 }], workPoints: q.points as WorkPoint[], boundaries: [], workHeights: [300], floor: null });
    const margins = q.points.map((p) => res.coverage[p.id].R9);
    for (const m of margins) expect(m).toBeGreaterThanOrEqual(0);
    expect(Math.abs(Math.min(...margins) - best.worstMarginMm)).toBeLessThanOrEqual(1);
    expect(res.findings.filter((f) => f.kind === 'unreached-point')).toHaveLength(0);
  });

  it('finds no spot when a keep-out under the only good spots meets every restricted space, and says so', () => {
    const keepout: Boundary = { id: 'K1', kind: 'keepout', label: 'Drive cabinet', points: [[4900, 2900], [5100, 2900], [5100, 3100], [4900, 3100]] };
    const r = placementSearch(query({ points: circle(12, 150), boundaries: [keepout] }));
    // Near the centre the restricted space (a 600 mm disc) covers the keep-out, so no spot within
    // 600 mm + the keep-out's half-diagonal of it qualifies; with points 150 mm off centre nothing does.
    expect(r.candidates).toHaveLength(0);
    expect(r.limits.every((l) => l.reason.includes('keep-out Drive cabinet'))).toBe(true);
  });

  it('moves the candidates out of a keep-out laid over the best spot', () => {
    // J1 restricted to ±60°: the restricted space is a sector, so the arm can stand with a keep-out behind it.
    const reach = armReachFor(FULL600, { j1Min: -60, j1Max: 60 });
    const q = query({ reach, points: circle(6, 100), yawStepDeg: 15 });
    const before = placementSearch(q).candidates[0];
    const K: Boundary = { id: 'K2', kind: 'keepout', label: 'Pallet lane', points: [[before.x - 150, before.y - 150], [before.x + 150, before.y - 150], [before.x + 150, before.y + 150], [before.x - 150, before.y + 150]] };
    const after = placementSearch({ ...q, boundaries: [K] });
    expect(after.candidates.length).toBeGreaterThan(0);
    const inK = (x: number, y: number) => Math.abs(x - before.x) <= 150 && Math.abs(y - before.y) <= 150;
    for (const c of after.candidates) expect(inK(c.x, c.y)).toBe(false);
    // Independent check with the clipper intersection the analysis uses: no candidate's restricted space overlaps K.
    for (const c of after.candidates) {
      const placed = armPose({ x: c.x, y: c.y, yaw: c.yawDeg }).placePolygons(reach.restricted);
      expect(polygonsArea(clipIntersect(placed, [[K.points.map(([x, y]) => [x, y] as [number, number])]]))).toBeLessThan(1);
    }
  });

  it('names the point that no base reaches and by how much', () => {
    const pts = circle(4, 300);
    // 1 200 mm over the floor: the stroke ends at 400 mm, so this point is out of every reach.
    pts.push({ id: 'P7', x: centre.x, y: centre.y + 200, z: 1200, approach: 'top', tag: '' });
    const r = placementSearch(query({ points: pts }));
    expect(r.candidates).toHaveLength(0);
    expect(r.feasibleAreaM2).toBe(0);
    const p7 = r.limits.find((l) => l.pointId === 'P7')!;
    expect(p7.reason).toMatch(/^P7 is out of reach at its height/);
    // Flange target 1 200 mm over a stroke ending at 400 mm: 800 mm short (scara stroke margin).
    expect(p7.shortMm).toBeCloseTo(800, 0);
    // Cells that far short are not evaluated one by one: their text gives a lower bound (800 mm less
    // the margin's largest change across a coarse cell) and the point that limits nearby.
    const texts = new Set(Array.from(r.map.reason, (_v, k) => cellReasonText(r.map, r.names, k)!.replace(/\d+/, 'N')));
    expect([...texts]).toEqual(['out of reach by at least N mm (P7 is short nearby)']);
  });

  it('gives a feasible area for one point equal to the annulus π(R² − r²) within 1 %', () => {
    // Links 350 and 250 mm: reach from 100 to 600 mm (law of cosines, J2 = ±180° and 0°).
    const reach = armReachFor(scara(350, 250), undefined);
    const r = placementSearch(query({ reach, points: [{ id: 'P1', x: centre.x, y: centre.y, z: 200, approach: 'top' }] }));
    const ring = (Math.PI * (600 ** 2 - 100 ** 2)) / 1e6; // ring area formula, m²
    expect(Math.abs(r.feasibleAreaM2 - ring) / ring).toBeLessThan(0.01);
    // A base right under the point is inside the 100 mm hole: the hover text says by how much.
    const k = cellAt(r.map, centre.x + 1, centre.y + 1);
    const short = 100 - Math.hypot(r.map.origin[0] + ((k % r.map.cols) + 0.5) * 50 - centre.x, r.map.origin[1] + (Math.floor(k / r.map.cols) + 0.5) * 50 - centre.y);
    const text = cellReasonText(r.map, r.names, k)!;
    expect(text).toMatch(/^P1 out of reach by \d+ mm$/);
    expect(Math.abs(Number(/by (\d+)/.exec(text)![1]) - short)).toBeLessThanOrEqual(1.5); // the margin's distance grid is exact to about 1 mm
  });

  it('refuses a query it cannot answer with a message naming the field', () => {
    expect(() => placementSearch(query({ points: [] }))).toThrow(/work point/);
    expect(() => placementSearch(query({ yawStepDeg: 0 }))).toThrow(/yawStepDeg/);
  });
});
