/**
 * Distance from a point to a segment: orthogonal projection onto the segment's line, clamped to
 * its ends. Planar, mm, in whatever single frame both are given in (plan, arm or a side view).
 *
 * Two forms with their own rounding, both pinned by results compared byte for byte: the plain
 * form (divides by |b − a|²) for one-off checks, and the squared, pre-computed form (edge start,
 * direction and 1/|b − a|² stored once, point given relative to the start) for the hot loops of
 * DistanceGrid. They agree to a few ulps, not bit for bit; keep each caller on its form.
 */

/** Parameter t ∈ [0, 1] of the point a + t·(b − a) nearest to (x, y); 0 for a degenerate segment. */
export function nearestSegmentParam(x: number, y: number, ax: number, ay: number, bx: number, by: number): number {
  const dx = bx - ax;
  const dy = by - ay;
  const len2 = dx * dx + dy * dy;
  const t = len2 > 0 ? ((x - ax) * dx + (y - ay) * dy) / len2 : 0;
  return t < 0 ? 0 : t > 1 ? 1 : t;
}

/** The point of segment (ax, ay)–(bx, by) nearest to (x, y), mm. */
export function nearestPointOnSegment(x: number, y: number, ax: number, ay: number, bx: number, by: number): [number, number] {
  const t = nearestSegmentParam(x, y, ax, ay, bx, by);
  return [ax + t * (bx - ax), ay + t * (by - ay)];
}

/** Euclidean distance from (x, y) to the segment (ax, ay)–(bx, by), mm (orthogonal projection clamped to the ends). */
export function pointSegmentDistance(x: number, y: number, ax: number, ay: number, bx: number, by: number): number {
  const t = nearestSegmentParam(x, y, ax, ay, bx, by);
  const ex = ax + t * (bx - ax) - x;
  const ey = ay + t * (by - ay) - y;
  return Math.sqrt(ex * ex + ey * ey);
}

/**
 * Hot-loop form, parameter: t ∈ [0, 1] of the nearest point for a point given relative to the
 * segment start, (px, py) = p − a, with direction (dx, dy) = b − a and invLen2 = 1/|b − a|² (0 for
 * a degenerate segment; it must be finite, so |b − a| above ~1e-154 mm), mm.
 */
export function nearestSegmentParamRel(px: number, py: number, dx: number, dy: number, invLen2: number): number {
  const t = (px * dx + py * dy) * invLen2;
  return t < 0 ? 0 : t > 1 ? 1 : t;
}

/** Hot-loop form, squared distance (mm²) from p to the segment, arguments as nearestSegmentParamRel. */
export function pointSegmentDistance2Rel(px: number, py: number, dx: number, dy: number, invLen2: number): number {
  const t = nearestSegmentParamRel(px, py, dx, dy, invLen2);
  const qx = px - t * dx;
  const qy = py - t * dy;
  return qx * qx + qy * qy;
}
