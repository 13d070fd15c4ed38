import { pointSegmentDistance } from './segmentDistance';
import type { Polygon2, Ring } from './types';

/** True when (x, y) lies inside the ring by the even–odd (crossing number) rule. */
export function pointInRing(x: number, y: number, ring: Readonly<Ring>): boolean {
  let inside = false;
  const n = ring.length;
  for (let i = 0, j = n - 1; i < n; j = i++) {
    const yi = ring[i][1];
    const yj = ring[j][1];
    if (yi > y !== yj > y) {
      const xi = ring[i][0];
      const xj = ring[j][0];
      if (x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside;
    }
  }
  return inside;
}

/** True when (x, y) lies inside the polygon (inside the outer ring, outside every hole); even–odd rule. */
export function pointInPolygon(x: number, y: number, polygon: Readonly<Polygon2>): boolean {
  let inside = false;
  for (const ring of polygon) if (pointInRing(x, y, ring)) inside = !inside;
  return inside;
}

/** True when (x, y) lies inside any of the non-overlapping polygons. */
export function pointInPolygons(x: number, y: number, polygons: ReadonlyArray<Polygon2>): boolean {
  for (const p of polygons) if (pointInPolygon(x, y, p)) return true;
  return false;
}

/** Distance from (x, y) to the nearest boundary edge of the polygons, mm (unsigned). */
export function distanceToBoundary(x: number, y: number, polygons: ReadonlyArray<Polygon2>): number {
  let best = Infinity;
  for (const p of polygons) {
    for (const ring of p) {
      const n = ring.length;
      for (let i = 0, j = n - 1; i < n; j = i++) {
        const d = pointSegmentDistance(x, y, ring[j][0], ring[j][1], ring[i][0], ring[i][1]);
        if (d < best) best = d;
      }
    }
  }
  return best;
}

/**
 * Signed distance from (x, y) to the boundary of the polygons, mm: positive inside, negative
 * outside (brute force over every edge; the reference for the fast DistanceGrid).
 */
export function signedDistanceToPolygons(x: number, y: number, polygons: ReadonlyArray<Polygon2>): number {
  const d = distanceToBoundary(x, y, polygons);
  if (d === Infinity) return -Infinity;
  return pointInPolygons(x, y, polygons) ? d : -d;
}
