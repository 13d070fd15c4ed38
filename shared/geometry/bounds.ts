import type { Polygon2 } from './types';

/** Axis-aligned bounds, mm, in the frame of the points they were taken from. */
export interface Bounds {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

/** Bounds that contain nothing yet (every point added grows them). */
export function emptyBounds(): Bounds {
  return { minX: Infinity, minY: Infinity, maxX: -Infinity, maxY: -Infinity };
}

/** Grows the bounds to contain (x, y), mm (in place; returns them). */
export function addToBounds(b: Bounds, x: number, y: number): Bounds {
  if (x < b.minX) b.minX = x;
  if (x > b.maxX) b.maxX = x;
  if (y < b.minY) b.minY = y;
  if (y > b.maxY) b.maxY = y;
  return b;
}

/** True when no point was added. */
export function isEmptyBounds(b: Readonly<Bounds>): boolean {
  return !(b.minX <= b.maxX);
}

/** Bounds of points [x, y], mm; null when there are none. */
export function pointsBounds(points: Iterable<Readonly<[number, number]> | readonly number[]>): Bounds | null {
  const b = emptyBounds();
  for (const p of points) addToBounds(b, p[0], p[1]);
  return isEmptyBounds(b) ? null : b;
}

/** Axis-aligned bounds [minX, minY, maxX, maxY] of every ring of the polygons, mm; null when empty. */
export function polygonsBounds(polygons: ReadonlyArray<Polygon2>): [number, number, number, number] | null {
  const b = emptyBounds();
  for (const p of polygons) for (const ring of p) for (const [x, y] of ring) addToBounds(b, x, y);
  return isEmptyBounds(b) ? null : [b.minX, b.minY, b.maxX, b.maxY];
}

/** The bounds grown by `pad` on every side, mm (new object). */
export function padBounds(b: Readonly<Bounds>, pad: number): Bounds {
  return { minX: b.minX - pad, minY: b.minY - pad, maxX: b.maxX + pad, maxY: b.maxY + pad };
}
