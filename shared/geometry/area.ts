import type { Polygon2, Ring } from './types';

/** Signed area of a ring by the shoelace formula, mm² (positive counter-clockwise). */
export function ringArea(ring: Readonly<Ring>): number {
  const n = ring.length;
  if (n < 3) return 0;
  let s = 0;
  for (let i = 0, j = n - 1; i < n; j = i++) {
    s += (ring[j][0] - ring[i][0]) * (ring[j][1] + ring[i][1]);
  }
  return s / 2;
}

/** Area of a polygon (outer ring minus holes) by the shoelace formula, mm², orientation-free. */
export function polygonArea(polygon: Readonly<Polygon2>): number {
  if (polygon.length === 0) return 0;
  let a = Math.abs(ringArea(polygon[0]));
  for (let i = 1; i < polygon.length; i++) a -= Math.abs(ringArea(polygon[i]));
  return a;
}

/** Total area of non-overlapping polygons (shoelace formula), mm². */
export function polygonsArea(polygons: ReadonlyArray<Polygon2>): number {
  let a = 0;
  for (const p of polygons) a += polygonArea(p);
  return a;
}
