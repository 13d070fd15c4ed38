import type { Pt } from './types';

/** Convex hull of plan points (mm), counter-clockwise, by Andrew's monotone chain; fewer than 3 distinct points give them back. */
export function convexHull(points: ReadonlyArray<Readonly<Pt>>): Pt[] {
  const p = points.map(([x, y]) => [x, y] as Pt).sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  if (p.length < 3) return p;
  const cross = (o: Pt, a: Pt, b: Pt) => (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]);
  const lower: Pt[] = [];
  for (const q of p) {
    while (lower.length >= 2 && cross(lower[lower.length - 2], lower[lower.length - 1], q) <= 0) lower.pop();
    lower.push(q);
  }
  const upper: Pt[] = [];
  for (let i = p.length - 1; i >= 0; i--) {
    const q = p[i];
    while (upper.length >= 2 && cross(upper[upper.length - 2], upper[upper.length - 1], q) <= 0) upper.pop();
    upper.push(q);
  }
  lower.pop();
  upper.pop();
  return lower.concat(upper);
}

/** Perimeter of a closed ring of plan points, mm. */
export function ringPerimeter(ring: ReadonlyArray<Readonly<Pt>>): number {
  let s = 0;
  for (let i = 0; i < ring.length; i++) {
    const a = ring[i], b = ring[(i + 1) % ring.length];
    s += Math.hypot(b[0] - a[0], b[1] - a[1]);
  }
  return ring.length > 1 ? s : 0;
}
