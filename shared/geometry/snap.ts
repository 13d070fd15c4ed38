import { GRID_MM } from './tolerance';
import type { Polygon2, Pt, Ring } from './types';

/** Rounds a coordinate to the grid (default 0.01 mm). */
export function snapValue(v: number, grid: number = GRID_MM): number {
  const s = Math.round(v / grid) * grid;
  return Object.is(s, -0) ? 0 : Number(s.toFixed(10));
}

/** Snaps a ring to the grid and drops consecutive duplicates (and a repeated closing point). */
export function snapRing(ring: Readonly<Ring>, grid: number = GRID_MM): Ring {
  const out: Ring = [];
  for (const [x, y] of ring) {
    const p: Pt = [snapValue(x, grid), snapValue(y, grid)];
    const last = out[out.length - 1];
    if (!last || last[0] !== p[0] || last[1] !== p[1]) out.push(p);
  }
  if (out.length > 1) {
    const a = out[0];
    const b = out[out.length - 1];
    if (a[0] === b[0] && a[1] === b[1]) out.pop();
  }
  return out;
}

/** Snaps every ring of the polygons to the grid; rings left with fewer than 3 points are dropped. */
export function snapPolygons(polygons: ReadonlyArray<Polygon2>, grid: number = GRID_MM): Polygon2[] {
  const out: Polygon2[] = [];
  for (const p of polygons) {
    const rings = p.map((r) => snapRing(r, grid));
    if (rings.length === 0 || rings[0].length < 3) continue;
    out.push([rings[0], ...rings.slice(1).filter((r) => r.length >= 3)]);
  }
  return out;
}
