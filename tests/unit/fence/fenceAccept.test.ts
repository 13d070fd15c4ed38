// Accepting the proposal for the Fernhill demo: the layout analysed again has no fence, opening or
// reach-over problem caused by the proposal. The reach-over check here reads ISO 13857:2019's
// high-risk reach-over table itself (rows 2000…2700 [pub], lower rows [mem]: values from memory).
import { describe, expect, it } from 'vitest';
import { createAnalyzer, prepareFloor, type FloorLayer } from '@shared/analysis';
import { armReachFor } from '@shared/analysis/armReach';
import { applyFenceProposal, proposeFence } from '@shared/analysis/fenceProposal';
import { polylineDistanceToPolygons, subtractOpenings } from '@shared/analysis/segments';
import { armPose } from '@shared/geometry/frames';
import { reachOverDistance } from '@shared/safety';
import { DEFAULT_FENCE_SYSTEM } from '@shared/schemas/fenceProposal';
import { LayoutContent } from '@shared/schemas/layout';
import { demoSheetInput } from '../../support/planSheetInput';

describe('accepting a proposal', () => {
  it('leaves no fence, opening or reach-over finding on the demo cell', () => {
    const demo = demoSheetInput();
    const params = new Map(demo.models.map((m) => [m.id, m.params]));
    const reachFor = (id: number, r: Parameters<typeof armReachFor>[1]) => armReachFor(params.get(id), r);
    const floor = prepareFloor(demo.floorPlan!.geometry, demo.floorPlan!.layers as FloorLayer[]);
    const content = demo.layout.content;
    const proposal = proposeFence({ arms: content.arms, boundaries: content.boundaries, floor, reachFor, system: DEFAULT_FENCE_SYSTEM });
    const accepted = LayoutContent.parse({ ...content, boundaries: applyFenceProposal(content.boundaries, proposal) });
    const ids = new Set(proposal.boundaries.map((z) => z.id));
    const result = createAnalyzer(reachFor).analyze({ ...accepted, floor });
    const fromProposal = result.findings.filter((f) => f.id.split(/[:+]/).some((part) => ids.has(part)));
    expect(fromProposal.map((f) => f.id)).toEqual([]);
    expect(result.findings.filter((f) => /fence|opening/.test(f.kind))).toEqual([]);
    // Reach over: every solid fence part at least c (Table 2, a = mount height + highest tool point, b = fence height) from each restricted space.
    for (const f of accepted.boundaries.filter((z) => z.kind === 'fence')) {
      const cuts = accepted.boundaries.filter((o) => o.kind === 'opening' && o.fenceId === f.id).map((o) => [o.points[0], o.points[1]] as const);
      const solid = subtractOpenings(f.points, cuts as never);
      for (const a of accepted.arms) {
        const reach = reachFor(a.armModelId, a.restrict);
        const c = reachOverDistance((a.mountHeight ?? 0) + reach.zMax, f.height!).distanceMm;
        const restricted = armPose(a).placePolygons(reach.restricted);
        for (const l of solid) expect(polylineDistanceToPolygons(l, restricted)).toBeGreaterThanOrEqual(c);
      }
    }
    expect(proposal.boundaries.some((z) => z.kind === 'opening' && z.safeguard)).toBe(true);
  });
});
