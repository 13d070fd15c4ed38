import { MAX_SEGMENTS_PER_CURVE } from './limits';

/** Counts curves whose segment count had to be capped (coarser than the tolerance). */
export interface CurveStats {
  capped: number;
}

/**
 * Segments needed so that an arc of radius r and sweep |sweep| (radians) stays within `tol` of
 * its chords: sagitta r(1 − cos(Δ/2)) ≤ tol, so Δ ≤ 2·acos(1 − tol/r); at least one segment per
 * 45° so small arcs keep their shape.
 */
export function arcSegmentCount(r: number, sweep: number, tol: number, stats?: CurveStats): number {
  const a = Math.abs(sweep);
  let n = Math.ceil(a / (Math.PI / 4) - 1e-9);
  if (tol < r) {
    const step = 2 * Math.acos(1 - tol / r);
    n = Math.max(n, Math.ceil(a / step - 1e-9));
  }
  if (!(n >= 1)) n = 1;
  if (n > MAX_SEGMENTS_PER_CURVE) {
    if (stats) stats.capped++;
    n = MAX_SEGMENTS_PER_CURVE;
  }
  return n;
}

/**
 * Pushes points (x, y, z triples) of the circular arc centred (cx, cy), radius r, from angle a0
 * through `sweep` radians (positive = counter-clockwise); the first point only when `withFirst`.
 */
export function pushArc(
  out: number[],
  cx: number,
  cy: number,
  r: number,
  a0: number,
  sweep: number,
  z: number,
  tol: number,
  withFirst: boolean,
  stats?: CurveStats,
): void {
  const n = arcSegmentCount(r, sweep, tol, stats);
  for (let i = withFirst ? 0 : 1; i <= n; i++) {
    const a = a0 + (sweep * i) / n;
    out.push(cx + r * Math.cos(a), cy + r * Math.sin(a), z);
  }
}

/**
 * Pushes the points after (x1, y1) of the polyline segment to (x2, y2) with bulge b — the
 * tangent of a quarter of the included angle, positive counter-clockwise (DXF reference,
 * LWPOLYLINE group 42). Included angle θ = 4·atan(b); the centre lies d(1 − b²)/(4b) to the left
 * of the chord's midpoint, where d is the chord length. A zero bulge pushes only the end point.
 */
export function pushBulge(
  out: number[],
  x1: number,
  y1: number,
  x2: number,
  y2: number,
  b: number,
  z: number,
  tol: number,
  stats?: CurveStats,
): void {
  const dx = x2 - x1;
  const dy = y2 - y1;
  const d = Math.hypot(dx, dy);
  if (b === 0 || d === 0) {
    out.push(x2, y2, z);
    return;
  }
  const theta = 4 * Math.atan(b);
  const h = (d * (1 - b * b)) / (4 * b); // signed distance of the centre left of the chord
  const mx = (x1 + x2) / 2;
  const my = (y1 + y2) / 2;
  const cx = mx - (dy / d) * h;
  const cy = my + (dx / d) * h;
  const r = Math.hypot(x1 - cx, y1 - cy);
  const a0 = Math.atan2(y1 - cy, x1 - cx);
  const n = arcSegmentCount(r, theta, tol, stats);
  for (let i = 1; i < n; i++) {
    const a = a0 + (theta * i) / n;
    out.push(cx + r * Math.cos(a), cy + r * Math.sin(a), z);
  }
  out.push(x2, y2, z); // the exact end vertex, not a recomputed one
}

/**
 * Pushes points of the ellipse c + u·cos t + v·sin t for t from t0 through `sweep` (radians),
 * u the major half-axis vector and v the minor one. Linear interpolation errs by at most
 * Δt²/8 · max|P''| and |P''| ≤ |u|, so Δt = √(8·tol/|u|) keeps every chord within tol.
 */
export function pushEllipse(
  out: number[],
  c: readonly [number, number, number],
  u: readonly [number, number, number],
  v: readonly [number, number, number],
  t0: number,
  sweep: number,
  tol: number,
  stats?: CurveStats,
): void {
  const a = Math.hypot(u[0], u[1], u[2]);
  const a45 = Math.ceil(Math.abs(sweep) / (Math.PI / 4) - 1e-9);
  let n = a > 0 ? Math.ceil(Math.abs(sweep) / Math.sqrt((8 * tol) / a) - 1e-9) : 1;
  n = Math.max(n, a45, 1);
  if (n > MAX_SEGMENTS_PER_CURVE) {
    if (stats) stats.capped++;
    n = MAX_SEGMENTS_PER_CURVE;
  }
  for (let i = 0; i <= n; i++) {
    const t = t0 + (sweep * i) / n;
    const ct = Math.cos(t);
    const st = Math.sin(t);
    out.push(c[0] + u[0] * ct + v[0] * st, c[1] + u[1] * ct + v[1] * st, c[2] + u[2] * ct + v[2] * st);
  }
}
