// Auto-layout on two clusters 8 m apart: no 600 mm arm (nor a 1 400 mm one) reaches both, so the
// greedy split must give one arm per cluster, and the shared analysis must find every point reached.
import { describe, expect, it } from 'vitest';
import { autoLayout, createAnalyzer, layoutScore, proposalContent } from '@shared/analysis';
import { armReachFor } from '@shared/analysis/armReach';
import type { LayoutContent, WorkPoint } from '@shared/schemas/layout';

const SMALL = { family: 'scara', innerLink: 300, outerLink: 300, strokeMin: 0, strokeMax: 400, axes: [{ min: -180, max: 180 }, { min: -150, max: 150 }] };
const LARGE = { family: 'scara', innerLink: 800, outerLink: 600, strokeMin: 0, strokeMax: 600, axes: [{ min: -170, max: 170 }, { min: -150, max: 150 }] };
const params: Record<number, unknown> = { 1: SMALL, 2: LARGE };
const reachFor = (id: number, r?: { j1Min: number; j1Max: number }) => armReachFor(params[id], r);

const cluster = (prefix: string, cx: number, cy: number): WorkPoint[] =>
  Array.from({ length: 6 }, (_, i) => ({ id: `${prefix}${i + 1}`, x: cx + 250 * Math.cos(i), y: cy + 250 * Math.sin(i), z: 200, approach: 'top', tag: '' }));

describe('auto-layout', () => {
  it('places one arm per well-separated cluster and reaches every point; deterministic for a seed', () => {
    const points = [...cluster('A', 2000, 2000), ...cluster('B', 10000, 2000)];
    const q = {
      models: [{ armModelId: 1, count: 1, reach: reachFor(1) }, { armModelId: 2, count: 1, reach: reachFor(2) }],
      points, minMarginMm: 10, mountHeightMm: 0, floor: null, boundaries: [], seed: 7, timeLimitMs: 60_000,
    };
    const r = autoLayout(q);
    expect(r.unreachable).toEqual([]);
    expect(r.unassigned).toEqual([]);
    expect(r.arms).toHaveLength(2);
    const owners = r.arms.map((a) => a.pointIds.map((p) => p[0]));
    for (const o of owners) expect(new Set(o).size).toBe(1); // each arm serves one cluster only
    expect(JSON.stringify(autoLayout(q))).toBe(JSON.stringify(r));

    const content: LayoutContent = { arms: [], workPoints: points, boundaries: [], workHeights: [200] };
    const proposal = proposalContent(content, r);
    const analysis = createAnalyzer((id, restrict) => reachFor(id, restrict)).analyze({ ...proposal, floor: null });
    for (const p of points) expect(analysis.coverage[p.id][p.assignedArm ?? proposal.workPoints.find((w) => w.id === p.id)!.assignedArm!]).toBeGreaterThanOrEqual(10);
    expect(layoutScore(analysis).unreachedPoints).toBe(0);
    expect(layoutScore(analysis).sharedZoneM2).toBe(0);
  });

  it('reports a point no model reaches instead of dropping it', () => {
    const points = [...cluster('A', 2000, 2000), { id: 'HIGH', x: 2000, y: 2000, z: 3000, approach: 'top' as const, tag: '' }];
    const r = autoLayout({ models: [{ armModelId: 1, count: 2, reach: reachFor(1) }], points, minMarginMm: 0, mountHeightMm: 0, floor: null, boundaries: [], seed: 1 });
    expect(r.unreachable).toEqual(['HIGH']);
    expect(r.arms.flatMap((a) => a.pointIds).sort()).toEqual(points.slice(0, 6).map((p) => p.id).sort());
  });
});
