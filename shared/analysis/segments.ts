import { pointInPolygons } from '../geometry/pointInPolygon';
import { nearestSegmentParam, pointSegmentDistance } from '../geometry/segmentDistance';
import type { Polygon2 } from '../geometry/types';

type P = readonly [number, number];

function orient(px: number, py: number, qx: number, qy: number, rx: number, ry: number): number {
  return (qx - px) * (ry - py) - (qy - py) * (rx - px);
}

function onSegment(px: number, py: number, qx: number, qy: number, rx: number, ry: number): boolean {
  return Math.min(px, qx) <= rx && rx <= Math.max(px, qx) && Math.min(py, qy) <= ry && ry <= Math.max(py, qy);
}

/** True when segments ab and cd intersect or touch (orientation test, planar). */
export function segmentsIntersect(a: P, b: P, c: P, d: P): boolean {
  return segmentsIntersectXY(a[0], a[1], b[0], b[1], c[0], c[1], d[0], d[1]);
}

/** segmentsIntersect of (ax, ay)–(bx, by) and (cx, cy)–(dx, dy), taking plain numbers (no point arrays in hot loops). */
export function segmentsIntersectXY(ax: number, ay: number, bx: number, by: number, cx: number, cy: number, dx: number, dy: number): boolean {
  // Bounding boxes first: most pairs in a clearance check are far apart.
  if (Math.max(ax, bx) < Math.min(cx, dx) || Math.max(cx, dx) < Math.min(ax, bx)) return false;
  if (Math.max(ay, by) < Math.min(cy, dy) || Math.max(cy, dy) < Math.min(ay, by)) return false;
  const d1 = orient(cx, cy, dx, dy, ax, ay);
  const d2 = orient(cx, cy, dx, dy, bx, by);
  const d3 = orient(ax, ay, bx, by, cx, cy);
  const d4 = orient(ax, ay, bx, by, dx, dy);
  if (((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0))) return true;
  return (
    (d1 === 0 && onSegment(cx, cy, dx, dy, ax, ay)) ||
    (d2 === 0 && onSegment(cx, cy, dx, dy, bx, by)) ||
    (d3 === 0 && onSegment(ax, ay, bx, by, cx, cy)) ||
    (d4 === 0 && onSegment(ax, ay, bx, by, dx, dy))
  );
}

/** Shortest distance between segments ab and cd, mm (0 when they cross). */
export function segmentDistance(a: P, b: P, c: P, d: P): number {
  if (segmentsIntersect(a, b, c, d)) return 0;
  return Math.min(
    pointSegmentDistance(a[0], a[1], c[0], c[1], d[0], d[1]),
    pointSegmentDistance(b[0], b[1], c[0], c[1], d[0], d[1]),
    pointSegmentDistance(c[0], c[1], a[0], a[1], b[0], b[1]),
    pointSegmentDistance(d[0], d[1], a[0], a[1], b[0], b[1]),
  );
}

/** True when an open polyline enters or crosses a polygon region. */
export function polylineHitsPolygons(line: ReadonlyArray<P>, polygons: ReadonlyArray<Polygon2>): boolean {
  for (const p of line) if (pointInPolygons(p[0], p[1], polygons)) return true;
  for (let i = 0; i + 1 < line.length; i++) {
    for (const poly of polygons) {
      for (const r of poly) {
        for (let k = 0; k < r.length; k++) {
          if (segmentsIntersect(line[i], line[i + 1], r[k], r[(k + 1) % r.length])) return true;
        }
      }
    }
  }
  return false;
}

/** Shortest distance from an open polyline to a polygon region's boundary, mm (0 when it enters). */
export function polylineDistanceToPolygons(line: ReadonlyArray<P>, polygons: ReadonlyArray<Polygon2>): number {
  if (polylineHitsPolygons(line, polygons)) return 0;
  let best = Infinity;
  for (let i = 0; i + 1 < line.length; i++) {
    for (const poly of polygons) {
      for (const r of poly) {
        for (let k = 0; k < r.length; k++) best = Math.min(best, segmentDistance(line[i], line[i + 1], r[k], r[(k + 1) % r.length]));
      }
    }
  }
  return best;
}

/** The parts of a polyline's segments that lie within `cut` distance of other segments are removed. */
export function subtractOpenings(line: ReadonlyArray<P>, openings: ReadonlyArray<readonly [P, P]>, tol = 1): Array<Array<[number, number]>> {
  // Cut each fence segment at the projections of the opening ends; drop pieces whose midpoint lies on an opening.
  const out: Array<Array<[number, number]>> = [];
  let current: Array<[number, number]> = [];
  for (let i = 0; i + 1 < line.length; i++) {
    const a = line[i];
    const b = line[i + 1];
    const dx = b[0] - a[0];
    const dy = b[1] - a[1];
    const ts = new Set<number>([0, 1]);
    for (const [p, q] of openings) {
      for (const e of [p, q]) {
        // Strictly inside (0, 1) the clamped parameter is the projection itself; at the ends it adds nothing.
        const t = nearestSegmentParam(e[0], e[1], a[0], a[1], b[0], b[1]);
        if (t > 0 && t < 1 && pointSegmentDistance(e[0], e[1], a[0], a[1], b[0], b[1]) <= tol) ts.add(t);
      }
    }
    const sorted = [...ts].sort((u, v) => u - v);
    for (let k = 0; k + 1 < sorted.length; k++) {
      const t0 = sorted[k];
      const t1 = sorted[k + 1];
      const p0: [number, number] = [a[0] + dx * t0, a[1] + dy * t0];
      const p1: [number, number] = [a[0] + dx * t1, a[1] + dy * t1];
      const mid: [number, number] = [(p0[0] + p1[0]) / 2, (p0[1] + p1[1]) / 2];
      const inOpening = openings.some(([p, q]) => pointSegmentDistance(mid[0], mid[1], p[0], p[1], q[0], q[1]) <= tol);
      if (inOpening) {
        if (current.length > 1) out.push(current);
        current = [];
      } else {
        if (current.length === 0) current.push(p0);
        current.push(p1);
      }
    }
  }
  if (current.length > 1) out.push(current);
  return out;
}
