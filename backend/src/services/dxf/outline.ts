/** Orientation of the triangle a, b, c: > 0 counter-clockwise, < 0 clockwise, 0 collinear. */
function orient(ax: number, ay: number, bx: number, by: number, cx: number, cy: number): number {
  return (bx - ax) * (cy - ay) - (by - ay) * (cx - ax);
}

function onSegment(ax: number, ay: number, bx: number, by: number, px: number, py: number): boolean {
  return Math.min(ax, bx) <= px && px <= Math.max(ax, bx) && Math.min(ay, by) <= py && py <= Math.max(ay, by);
}

/** True when segments ab and cd share a point (orientation test, touching included). */
export function segmentsIntersect(
  ax: number, ay: number, bx: number, by: number,
  cx: number, cy: number, dx: number, dy: number,
): boolean {
  const o1 = orient(ax, ay, bx, by, cx, cy);
  const o2 = orient(ax, ay, bx, by, dx, dy);
  const o3 = orient(cx, cy, dx, dy, ax, ay);
  const o4 = orient(cx, cy, dx, dy, bx, by);
  if (((o1 > 0 && o2 < 0) || (o1 < 0 && o2 > 0)) && ((o3 > 0 && o4 < 0) || (o3 < 0 && o4 > 0))) return true;
  if (o1 === 0 && onSegment(ax, ay, bx, by, cx, cy)) return true;
  if (o2 === 0 && onSegment(ax, ay, bx, by, dx, dy)) return true;
  if (o3 === 0 && onSegment(cx, cy, dx, dy, ax, ay)) return true;
  if (o4 === 0 && onSegment(cx, cy, dx, dy, bx, by)) return true;
  return false;
}

/**
 * True when a closed ring (GeoJSON positions, last = first) crosses or touches itself anywhere
 * but at the shared ends of neighbouring edges; null when the ring has more than `maxEdges`
 * edges (the pairwise test is quadratic).
 */
export function ringSelfIntersects(ring: ReadonlyArray<readonly [number, number] | number[]>, maxEdges = 4000): boolean | null {
  const n = ring.length - 1;
  if (n < 3) return false;
  if (n > maxEdges) return null;
  const minX = new Float64Array(n);
  const maxX = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    minX[i] = Math.min(ring[i][0], ring[i + 1][0]);
    maxX[i] = Math.max(ring[i][0], ring[i + 1][0]);
  }
  for (let i = 0; i < n; i++) {
    const [ax, ay] = ring[i];
    const [bx, by] = ring[i + 1];
    for (let j = i + 2; j < n; j++) {
      if (i === 0 && j === n - 1) continue; // neighbours through the closing vertex
      if (maxX[j] < minX[i] || minX[j] > maxX[i]) continue;
      const [cx, cy] = ring[j];
      const [dx, dy] = ring[j + 1];
      if (segmentsIntersect(ax, ay, bx, by, cx, cy, dx, dy)) return true;
    }
  }
  return false;
}
