import { polygonsArea } from '../geometry/area';
import { armPose } from '../geometry/frames';
import { convexHull, ringPerimeter } from '../geometry/hull';
import type { Polygon2, Pt } from '../geometry/types';
import { bboxOverlap, intersect, MIN_AREA_MM2, type BBox } from './clearance';
import type { ArmReach } from './types';

const boxOf = (polys: ReadonlyArray<Polygon2>): BBox | null => {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (const p of polys) for (const [x, y] of p[0] ?? []) {
    if (x < minX) minX = x;
    if (x > maxX) maxX = x;
    if (y < minY) minY = y;
    if (y > maxY) maxY = y;
  }
  return minX <= maxX ? [minX, minY, maxX, maxY] : null;
};

/**
 * How a candidate base (plan mm, yaw deg) ranks after its margin: the restricted space it would share
 * with the arms already placed (m², the same clipper intersection the shared-zone check uses) and the
 * length of the shortest closed guard line around all their restricted spaces (perimeter of the
 * convex hull, mm) — a lower bound for any fence that encloses them.
 */
export function candidateScores(reach: ArmReach, x: number, y: number, yawDeg: number, neighbours: ReadonlyArray<{ restricted: Polygon2[] }>): { sharedZoneM2: number; fenceLengthMm: number } {
  const mine = armPose({ x, y, yaw: yawDeg }).placePolygons(reach.restricted);
  const box = boxOf(mine);
  let shared = 0;
  const pts: Pt[] = [];
  for (const p of mine) for (const v of p[0] ?? []) pts.push(v);
  for (const n of neighbours) {
    for (const p of n.restricted) for (const v of p[0] ?? []) pts.push(v);
    if (!bboxOverlap(box, boxOf(n.restricted))) continue;
    const a = polygonsArea(intersect(mine, n.restricted));
    if (a >= MIN_AREA_MM2) shared += a;
  }
  return { sharedZoneM2: Math.round(shared / 1e4) / 100, fenceLengthMm: Math.round(ringPerimeter(convexHull(pts))) };
}
