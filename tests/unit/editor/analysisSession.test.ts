// The worker's session: drag poses reach the analysis, reach regions are built once per model and
// restricting limits, maximum spaces are placed by the arm's pose. Disk-shaped reach stands in for a
// kinematic family, so the expected areas are closed forms.
import { describe, expect, it } from 'vitest';
import { annularSector } from '@shared/geometry/annularSector';
import { polygonsArea } from '@shared/geometry/area';
import { positionsToRing } from '@shared/geometry/geojson';
import type { ArmReach } from '@shared/analysis/types';
import type { Polygon2 } from '@shared/geometry/types';
import type { LayoutContent } from '@shared/schemas/layout';
import { contentWithPose, createAnalysisSession, placePolygons } from '../../../frontend/src/workers/analysisSession';

/** params = { R } → a disk of radius R mm at every height; a half disk (J1 0…180°) when restricted to that. */
const diskBuilder = (calls: string[]) => (params: unknown, restrict: { j1Min: number; j1Max: number } | undefined): ArmReach => {
  const R = (params as { R: number }).R;
  calls.push(`${R}|${restrict ? `${restrict.j1Min},${restrict.j1Max}` : '-'}`);
  const full = [annularSector({ cx: 0, cy: 0, rInner: 0, rOuter: R, startDeg: restrict?.j1Min ?? 0, endDeg: restrict?.j1Max ?? 360 })];
  const envelope = { profile: [[[[0, 0], [R, 0], [R, 2000], [0, 2000]]]] as Polygon2[], toleranceMm: 0, j1RangeDeg: { min: restrict?.j1Min ?? -180, max: restrict?.j1Max ?? 180 }, lateralMm: { min: 0, max: 0 } };
  return { maxReach: R, zMin: 0, zMax: 2000, restricted: full, bandAt: () => full, restrictedBelow: () => full, margin: (x, y) => R - Math.hypot(x, y), envelope };
};

const content = (): LayoutContent => ({
  arms: [
    { id: 'R1', armModelId: 1, label: '', x: 0, y: 0, yaw: 0, mountHeight: 0 },
    { id: 'R2', armModelId: 1, label: '', x: 5000, y: 0, yaw: 0, mountHeight: 0 },
  ],
  workPoints: [],
  boundaries: [],
  workHeights: [900],
});

describe('analysis worker session', () => {
  it('analyses the drag pose: the shared zone appears when one arm is dragged onto the other', () => {
    const calls: string[] = [];
    const s = createAnalysisSession(diskBuilder(calls));
    s.receive({ type: 'models', models: [{ id: 1, params: { R: 1000 } }] });
    expect(s.receive({ type: 'content', seq: 1, content: content() })).toBe(true);
    expect(s.run()!.analysis.sharedZones).toHaveLength(0);
    // Dragged to 1000 mm from R1: two unit disks (×1000 mm) with centres 1 apart overlap by the
    // circle–circle lens area 1.22837 (Wolfram MathWorld, "Circle-Circle Intersection", r = R = d = 1).
    s.receive({ type: 'drag', seq: 2, pose: { armId: 'R2', x: 1000, y: 0, yaw: 30 } });
    const r = s.run()!;
    expect(r.dragging).toBe(true);
    expect(r.seq).toBe(2);
    expect(r.placed.R2).toEqual([1000, 0, 30]);
    expect(r.analysis.sharedZones[0].areaM2).toBeCloseTo(1.22837, 2);
    expect(r.analysis.findings.map((f) => f.id)).toContain('shared-zone:R1+R2');
    // New content ends the drag.
    s.receive({ type: 'content', seq: 3, content: content() });
    const after = s.run()!;
    expect(after.dragging).toBe(false);
    expect(after.analysis.sharedZones).toHaveLength(0);
  });

  it('builds each model × restricting limits once, however many poses a drag goes through', () => {
    const calls: string[] = [];
    const s = createAnalysisSession(diskBuilder(calls));
    s.receive({ type: 'models', models: [{ id: 1, params: { R: 1000 } }] });
    const c = content();
    c.arms[1] = { ...c.arms[1], restrict: { j1Min: 0, j1Max: 180 } };
    s.receive({ type: 'content', seq: 1, content: c });
    s.run();
    for (let i = 0; i < 30; i++) {
      s.receive({ type: 'drag', seq: 2 + i, pose: { armId: 'R2', x: 5000 - i * 100, y: 0, yaw: 0 } });
      s.run();
    }
    // Unrestricted (R1, and every maximum space) and the 0…180° restriction of R2: two builds only.
    expect(calls.sort()).toEqual(['1000|-', '1000|0,180']);
    expect(s.analyzer().lastStats().arms).toBe(1); // only the dragged arm was placed afresh in the last run
  });

  it('places the maximum space by the arm pose and reports an unknown model as a finding', () => {
    const s = createAnalysisSession(diskBuilder([]));
    s.receive({ type: 'models', models: [{ id: 1, params: { R: 1000 } }] });
    const c = content();
    c.arms[1] = { ...c.arms[1], armModelId: 99 };
    s.receive({ type: 'content', seq: 1, content: c });
    const r = s.run()!;
    const g = r.maxSpaces.R1!;
    const ring = positionsToRing(g.type === 'Polygon' ? g.coordinates[0] : g.coordinates[0][0]);
    // Disk area πR² (outer arcs circumscribed, so at least that and within 0.5 %).
    const area = polygonsArea([[ring]]);
    expect(area).toBeGreaterThanOrEqual(Math.PI * 1e6);
    expect(area / (Math.PI * 1e6)).toBeLessThan(1.005);
    expect(r.maxSpaces.R2).toBeNull();
    expect(r.analysis.findings.find((f) => f.kind === 'unknown-model')?.arms).toEqual(['R2']);
  });

  it('turns and moves arm-frame polygons like a rotation about the base (90° maps x onto y)', () => {
    const [[ring]] = placePolygons([[[[1000, 0], [0, 0], [0, 500]]]], 100, 200, 90);
    expect(ring[0][0]).toBeCloseTo(100, 9);
    expect(ring[0][1]).toBeCloseTo(1200, 9);
    expect(ring[2][0]).toBeCloseTo(-400, 9);
    const c = content();
    expect(contentWithPose(c, null)).toBe(c);
    expect(contentWithPose(c, { armId: 'R9', x: 1, y: 1, yaw: 1 })).toBe(c);
  });
});
