import { MAX_SEGMENTS_PER_CURVE } from './limits';
import type { CurveStats } from './curves';

type P3 = [number, number, number];

/** A B-spline curve: degree, knot vector, control points (x, y, z) and optional weights. */
export interface BSpline {
  degree: number;
  knots: number[];
  points: P3[];
  weights?: number[];
}

/** Why a spline's data cannot be evaluated as given, or null when it can. */
export function bsplineProblem(s: BSpline): string | null {
  const p = s.degree;
  const n = s.points.length;
  if (!Number.isInteger(p) || p < 1 || p > 11) return 'degree';
  if (n < p + 1) return 'control points';
  if (s.knots.length !== n + p + 1) return 'knots';
  for (let i = 1; i < s.knots.length; i++) if (!(s.knots[i] >= s.knots[i - 1])) return 'knots';
  if (!(s.knots[p] < s.knots[n])) return 'knots';
  return null;
}

/** Clamped uniform knot vector for n control points of degree p (used when a file has none). */
export function clampedUniformKnots(n: number, p: number): number[] {
  const k: number[] = [];
  for (let i = 0; i < n + p + 1; i++) k.push(i <= p ? 0 : i >= n ? n - p : i - p);
  return k;
}

/**
 * Point of a (rational) B-spline at parameter t by de Boor's algorithm in homogeneous
 * coordinates (Piegl & Tiller, The NURBS Book, algorithms A2.1 and A4.1 in de Boor's form).
 */
export function deBoor(s: BSpline, t: number): P3 {
  const p = s.degree;
  const U = s.knots;
  const n = s.points.length;
  // span k with U[k] <= t < U[k+1], k in [p, n-1]; the end of the domain belongs to the last span
  let lo = p;
  let hi = n - 1;
  if (t >= U[n]) {
    while (hi > p && !(U[hi] < U[hi + 1])) hi--;
    lo = hi;
  } else {
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (U[mid] <= t) lo = mid;
      else hi = mid - 1;
    }
  }
  const k = lo;
  const dx: number[] = [];
  const dy: number[] = [];
  const dz: number[] = [];
  const dw: number[] = [];
  for (let j = 0; j <= p; j++) {
    const P = s.points[j + k - p];
    const w = s.weights ? s.weights[j + k - p] : 1;
    dx.push(P[0] * w);
    dy.push(P[1] * w);
    dz.push(P[2] * w);
    dw.push(w);
  }
  for (let r = 1; r <= p; r++) {
    for (let j = p; j >= r; j--) {
      const a0 = U[j + k - p];
      const den = U[j + 1 + k - r] - a0;
      const alpha = den === 0 ? 0 : (t - a0) / den;
      dx[j] = (1 - alpha) * dx[j - 1] + alpha * dx[j];
      dy[j] = (1 - alpha) * dy[j - 1] + alpha * dy[j];
      dz[j] = (1 - alpha) * dz[j - 1] + alpha * dz[j];
      dw[j] = (1 - alpha) * dw[j - 1] + alpha * dw[j];
    }
  }
  const w = dw[p];
  return [dx[p] / w, dy[p] / w, dz[p] / w];
}

function distToSegment(p: P3, a: P3, b: P3): number {
  const ux = b[0] - a[0];
  const uy = b[1] - a[1];
  const uz = b[2] - a[2];
  const vx = p[0] - a[0];
  const vy = p[1] - a[1];
  const vz = p[2] - a[2];
  const uu = ux * ux + uy * uy + uz * uz;
  const t = uu > 0 ? Math.min(1, Math.max(0, (vx * ux + vy * uy + vz * uz) / uu)) : 0;
  return Math.hypot(vx - t * ux, vy - t * uy, vz - t * uz);
}

/**
 * Pushes points of the curve f over the parameter breaks (ascending), subdividing each piece
 * until the curve's points at ¼, ½ and ¾ of a piece lie within `tol` of its chord (adaptive
 * subdivision); the first point only when `withFirst`. At most MAX_SEGMENTS_PER_CURVE segments.
 */
export function pushAdaptive(
  out: number[],
  f: (t: number) => P3,
  breaks: readonly number[],
  tol: number,
  withFirst: boolean,
  stats?: CurveStats,
): void {
  let budget = MAX_SEGMENTS_PER_CURVE;
  let capped = false;
  let prev = f(breaks[0]);
  if (withFirst) out.push(prev[0], prev[1], prev[2]);
  for (let i = 0; i + 1 < breaks.length; i++) {
    const a = breaks[i];
    const b = breaks[i + 1];
    if (!(b > a)) continue;
    // depth-first: a stack of intervals, right halves pushed first
    const stack: Array<[number, number, number]> = [[a, b, 0]];
    while (stack.length > 0) {
      const [t0, t1, depth] = stack.pop()!;
      const p1 = f(t1);
      let ok = depth >= 16 || budget <= stack.length + 1;
      if (!ok) {
        const h = (t1 - t0) / 4;
        ok =
          distToSegment(f(t0 + 2 * h), prev, p1) <= tol &&
          distToSegment(f(t0 + h), prev, p1) <= tol &&
          distToSegment(f(t0 + 3 * h), prev, p1) <= tol;
      } else if (depth < 16) {
        capped = true;
      }
      if (ok) {
        out.push(p1[0], p1[1], p1[2]);
        prev = p1;
        budget--;
      } else {
        const m = (t0 + t1) / 2;
        stack.push([m, t1, depth + 1], [t0, m, depth + 1]);
      }
    }
  }
  if (capped && stats) stats.capped++;
}

/** Parameter breaks of a B-spline: its distinct knots inside the domain, each span halved. */
export function bsplineBreaks(s: BSpline): number[] {
  const p = s.degree;
  const U = s.knots;
  const n = s.points.length;
  const out: number[] = [];
  for (let i = p; i <= n; i++) {
    if (out.length === 0 || U[i] > out[out.length - 1]) {
      if (out.length > 0) {
        const prev = out[out.length - 1];
        for (let j = 1; j < p; j++) out.push(prev + ((U[i] - prev) * j) / p);
      }
      out.push(U[i]);
    }
    if (out.length > MAX_SEGMENTS_PER_CURVE) break;
  }
  return out;
}

/**
 * Centripetal Catmull–Rom curve through the points (Barry–Goldman pyramidal form, α = ½),
 * as a function on [0, m] for m + 1 points; end tangents are mirrored neighbours. Used for a
 * SPLINE that stores only its fit points.
 */
export function catmullRom(points: readonly P3[], closed: boolean): { f: (t: number) => P3; segments: number } {
  const P = points;
  const m = closed ? P.length : P.length - 1;
  const at = (i: number): P3 => {
    if (closed) return P[((i % P.length) + P.length) % P.length];
    if (i < 0) return [2 * P[0][0] - P[1][0], 2 * P[0][1] - P[1][1], 2 * P[0][2] - P[1][2]];
    if (i > P.length - 1) {
      const a = P[P.length - 1];
      const b = P[P.length - 2];
      return [2 * a[0] - b[0], 2 * a[1] - b[1], 2 * a[2] - b[2]];
    }
    return P[i];
  };
  const lerp = (a: P3, b: P3, ta: number, tb: number, t: number): P3 => {
    const d = tb - ta;
    const u = d === 0 ? 0 : (t - ta) / d;
    return [a[0] + (b[0] - a[0]) * u, a[1] + (b[1] - a[1]) * u, a[2] + (b[2] - a[2]) * u];
  };
  const gap = (a: P3, b: P3) => Math.max(Math.sqrt(Math.hypot(b[0] - a[0], b[1] - a[1], b[2] - a[2])), 1e-9);
  const f = (t: number): P3 => {
    const i = Math.min(Math.max(Math.floor(t), 0), m - 1);
    const u = t - i;
    const p0 = at(i - 1);
    const p1 = at(i);
    const p2 = at(i + 1);
    const p3 = at(i + 2);
    const t0 = 0;
    const t1 = t0 + gap(p0, p1);
    const t2 = t1 + gap(p1, p2);
    const t3 = t2 + gap(p2, p3);
    const tt = t1 + (t2 - t1) * u;
    const a1 = lerp(p0, p1, t0, t1, tt);
    const a2 = lerp(p1, p2, t1, t2, tt);
    const a3 = lerp(p2, p3, t2, t3, tt);
    const b1 = lerp(a1, a2, t0, t2, tt);
    const b2 = lerp(a2, a3, t1, t3, tt);
    return lerp(b1, b2, t1, t2, tt);
  };
  return { f, segments: m };
}
