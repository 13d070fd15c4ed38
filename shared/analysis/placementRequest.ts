import { armPose } from '../geometry/frames';
import { ReadableError } from '../schemas/errors';
import type { LayoutContent } from '../schemas/layout';
import type { PlacementSearchDto, PlacementSearchInput } from '../schemas/placement';
import type { PlacementQuery, PlacementResult } from './placement';
import { roundMargin } from './reached';
import type { ArmReachFactory, PreparedFloor } from './types';

/**
 * The placement search of a layout, as the server and the editor's worker both ask it: the request's
 * points looked up in the content, the other placed arms' restricted spaces for ranking, the
 * layout's boundaries and floor. Throws a message naming the problem for unknown points or arms.
 */
export function placementQueryOf(req: Readonly<PlacementSearchInput>, content: Readonly<LayoutContent>, floor: PreparedFloor | null, reachFor: ArmReachFactory): PlacementQuery {
  const byId = new Map(content.workPoints.map((p) => [p.id, p]));
  const missing = req.pointIds.filter((id) => !byId.has(id));
  if (missing.length) throw new ReadableError(`No work point ${missing.slice(0, 3).join(', ')}${missing.length > 3 ? ' …' : ''} on this cell layout`);
  if (req.armId && !content.arms.some((a) => a.id === req.armId)) throw new ReadableError(`No arm ${req.armId} on this cell layout`);
  const neighbours = content.arms
    .filter((a) => a.id !== req.armId)
    .flatMap((a) => {
      try {
        return [{ id: a.id, restricted: armPose(a).placePolygons(reachFor(a.armModelId, a.restrict).restricted) }];
      } catch {
        return []; // an arm whose reach cannot be built is reported by the analysis, not here
      }
    });
  return {
    reach: reachFor(req.armModelId, req.restrict),
    points: [...new Set(req.pointIds)].map((id) => byId.get(id)!),
    minMarginMm: req.minMarginMm,
    yawMinDeg: req.yawMinDeg,
    yawMaxDeg: req.yawMaxDeg,
    yawStepDeg: req.yawStepDeg,
    mountHeightMm: req.mountHeightMm,
    floor,
    boundaries: content.boundaries,
    neighbours,
    gridMm: req.gridMm,
  };
}

/** The search result as the API sends it (margins to 0.1 mm, infeasible cells null). */
export function presentPlacement(r: Readonly<PlacementResult>): PlacementSearchDto {
  const m = r.map;
  return {
    candidates: r.candidates.map((c) => ({ x: c.x, y: c.y, yawDeg: c.yawDeg, worstMarginMm: roundMargin(c.worstMarginMm), sharedZoneM2: c.sharedZoneM2, fenceLengthMm: c.fenceLengthMm, limitingPointId: c.limitingPointId })),
    feasibleAreaM2: Math.round(r.feasibleAreaM2 * 1e4) / 1e4,
    cells: { gridMm: m.gridMm, origin: [m.origin[0], m.origin[1]], cols: m.cols, rows: m.rows, worstMarginMm: Array.from(m.worstMarginMm, (v) => (Number.isNaN(v) ? null : roundMargin(v))) },
    limits: r.limits.map((l) => ({ pointId: l.pointId, reason: l.reason, shortMm: l.shortMm == null ? null : Math.round(l.shortMm * 10) / 10 })),
  };
}
