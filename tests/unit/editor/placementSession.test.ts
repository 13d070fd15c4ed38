// The placement worker's session (run here without a worker): progress while it runs, a map before
// the end, the same result as the server's call of the shared search, cancel between slices, and
// the edits that place an arm at a candidate as one content change.
import { describe, expect, it } from 'vitest';
import { placementSearch } from '@shared/analysis';
import { armReachFor } from '@shared/analysis/armReach';
import { placementQueryOf } from '@shared/analysis/placementRequest';
import type { LayoutContent } from '@shared/schemas/layout';
import { PlacementSearchInput } from '@shared/schemas/placement';
import { chosenPoints, placeAtCandidate, pointTags } from '../../../frontend/src/editor/placementEdits';
import type { FromPlacementWorker } from '../../../frontend/src/workers/placementProtocol';
import { createPlacementSession } from '../../../frontend/src/workers/placementSession';

const SCARA = { family: 'scara', innerLink: 300, outerLink: 300, strokeMin: 0, strokeMax: 400, axes: [{ min: -180, max: 180 }, { min: -150, max: 150 }] };
const content: LayoutContent = {
  arms: [{ id: 'R1', armModelId: 1, label: '', x: 0, y: 0, yaw: 0, mountHeight: 0 }],
  workPoints: [
    { id: 'P1', x: 3000, y: 0, z: 200, approach: 'top', tag: 'left' },
    { id: 'P2', x: 3300, y: 200, z: 200, approach: 'top', tag: 'left', assignedArm: 'R1' },
    { id: 'P3', x: 3100, y: -250, z: 200, approach: 'top', tag: 'right' },
  ],
  boundaries: [],
  workHeights: [200],
};
const models = [{ id: 1, params: SCARA }];

function run(request: PlacementSearchInput, cancelAfter = Infinity) {
  const out: FromPlacementWorker[] = [];
  const queue: Array<() => void> = [];
  let clock = 0;
  const s = createPlacementSession(armReachFor, (m) => out.push(m), (fn) => queue.push(fn), () => (clock += 5));
  s.receive({ type: 'search', id: 1, request, content, models, floor: null });
  let slices = 0;
  while (queue.length) {
    if (++slices > cancelAfter) s.receive({ type: 'cancel', id: 1 });
    queue.shift()!();
  }
  return out;
}

describe('placement worker session', () => {
  it('posts progress and a map before the result, and the result equals the server call', () => {
    const request = PlacementSearchInput.parse({ armModelId: 1, pointIds: ['P1', 'P2', 'P3'], yawStepDeg: 30 });
    const out = run(request);
    const maps = out.filter((m) => m.type === 'map');
    expect(maps.length).toBeGreaterThan(0);
    expect(out.findIndex((m) => m.type === 'map')).toBeLessThan(out.findIndex((m) => m.type === 'searched'));
    const done = out.find((m) => m.type === 'searched')!;
    const server = placementSearch(placementQueryOf(request, content, null, (id, r) => armReachFor(models[id - 1].params, r)));
    expect(done.type === 'searched' && done.result.candidates).toEqual(server.candidates);
    expect(done.type === 'searched' && done.result.feasibleAreaM2).toBe(server.feasibleAreaM2);
  });

  it('stops between slices when cancelled', () => {
    const out = run(PlacementSearchInput.parse({ armModelId: 1, pointIds: ['P1', 'P2', 'P3'], yawStepDeg: 5 }), 1);
    expect(out.at(-1)).toEqual({ type: 'cancelled', id: 1 });
    expect(out.some((m) => m.type === 'searched')).toBe(false);
  });

  it('names an unknown point', () => {
    const out = run(PlacementSearchInput.parse({ armModelId: 1, pointIds: ['P9'] }));
    expect(out).toEqual([{ type: 'error', id: 1, message: 'No work point P9 on this cell layout' }]);
  });
});

describe('placement edits', () => {
  it('chooses points by selection, tag and assignment', () => {
    expect(chosenPoints(content, { kind: 'selected', id: 'P3' })).toEqual(['P3']);
    expect(chosenPoints(content, { kind: 'tag', tag: 'left' })).toEqual(['P1', 'P2']);
    expect(chosenPoints(content, { kind: 'unassigned' })).toEqual(['P1', 'P3']);
    expect(pointTags(content)).toEqual(['left', 'right']);
  });

  it('moves a placed arm or adds a new one at a candidate, leaving the input untouched', () => {
    const frozen = structuredClone(content);
    const moved = placeAtCandidate(content, { x: 3105, y: 15, yawDeg: 270 }, { armId: 'R1' });
    expect(moved.content.arms).toEqual([{ ...content.arms[0], x: 3105, y: 15, yaw: -90 }]);
    const added = placeAtCandidate(content, { x: 3105, y: 15, yawDeg: 30 }, { armModelId: 1, mountHeight: 250, restrict: { j1Min: -90, j1Max: 90 } });
    expect(added.id).toBe('R2');
    expect(added.content.arms[1]).toEqual({ id: 'R2', armModelId: 1, label: '', x: 3105, y: 15, yaw: 30, mountHeight: 250, restrict: { j1Min: -90, j1Max: 90 } });
    expect(content).toEqual(frozen);
    expect(() => placeAtCandidate(content, { x: 0, y: 0, yawDeg: 0 }, { armId: 'R9' })).toThrow(/No arm R9/);
  });
});

describe('placement worker session: auto-layout', () => {
  it('posts a proposal with both layouts scored by the same analysis', () => {
    const out: FromPlacementWorker[] = [];
    const queue: Array<() => void> = [];
    const s = createPlacementSession(armReachFor, (m) => out.push(m), (fn) => queue.push(fn));
    s.receive({ type: 'auto', id: 4, request: { models: [{ armModelId: 1, count: 2 }], pointIds: ['P1', 'P2', 'P3'], minMarginMm: 0, mountHeightMm: 0, seed: 1, timeLimitS: 30 }, content, models, floor: null });
    while (queue.length) queue.shift()!();
    const done = out.find((m) => m.type === 'proposed');
    expect(done?.type).toBe('proposed');
    if (done?.type !== 'proposed') return;
    // The current layout's R1 stands 3 m away: every point unreached; the proposal reaches them all.
    expect(done.scores.current.unreachedPoints).toBe(3);
    expect(done.scores.proposal.unreachedPoints).toBe(0);
    expect(done.proposal.arms).toHaveLength(1);
    expect(done.proposal.workPoints.every((p) => p.assignedArm === done.proposal.arms[0].id)).toBe(true);
  });
});
