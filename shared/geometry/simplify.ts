import { clipOffset } from './clipper';
import { pointSegmentDistance } from './segmentDistance';
import type { Polygon2, Pt, Ring } from './types';

/**
 * Douglas–Peucker simplification of a closed ring, mm: every dropped vertex lies within `eps` of
 * the kept polyline. Rings that would fall below 3 points are returned unchanged.
 */
export function simplifyRing(ring: Readonly<Ring>, eps: number): Ring {
  const n = ring.length;
  if (n <= 4 || !(eps > 0)) return ring.map((p) => [p[0], p[1]] as Pt);
  // Split the closed ring at vertex 0 and the vertex farthest from it.
  let far = 0;
  let farD = -1;
  for (let i = 1; i < n; i++) {
    const d = Math.hypot(ring[i][0] - ring[0][0], ring[i][1] - ring[0][1]);
    if (d > farD) {
      farD = d;
      far = i;
    }
  }
  const keep = new Uint8Array(n);
  keep[0] = 1;
  keep[far] = 1;
  const stack: Array<[number, number]> = [
    [0, far],
    [far, n],
  ];
  while (stack.length) {
    const [a, b] = stack.pop()!;
    const pa = ring[a % n];
    const pb = ring[b % n];
    let best = -1;
    let at = -1;
    for (let i = a + 1; i < b; i++) {
      const d = pointSegmentDistance(ring[i][0], ring[i][1], pa[0], pa[1], pb[0], pb[1]);
      if (d > best) {
        best = d;
        at = i;
      }
    }
    if (at >= 0 && best > eps) {
      keep[at] = 1;
      stack.push([a, at], [at, b]);
    }
  }
  const out: Ring = [];
  for (let i = 0; i < n; i++) if (keep[i]) out.push([ring[i][0], ring[i][1]]);
  return out.length >= 3 ? out : ring.map((p) => [p[0], p[1]] as Pt);
}

/** Douglas–Peucker simplification of every ring of the polygons, mm (see simplifyRing). */
export function simplifyPolygons(polygons: ReadonlyArray<Polygon2>, eps: number): Polygon2[] {
  return polygons.map((p) => p.map((r) => simplifyRing(r, eps)));
}

/**
 * Outward simplification, mm: Douglas–Peucker at `eps`, then the result grown by `eps` (mitred
 * offset, Clipper), so the region contains the original (to Clipper's integer grid) and lies
 * within 2·eps outside it.
 */
export function simplifyPolygonsOutward(polygons: ReadonlyArray<Polygon2>, eps: number): Polygon2[] {
  if (!(eps > 0) || !Number.isFinite(eps)) throw new Error('eps: expected a positive number');
  return clipOffset(simplifyPolygons(polygons, eps), eps, { join: 'miter' });
}
