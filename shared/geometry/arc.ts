import { DEFAULT_CHORD_TOLERANCE_MM, assertFinite } from './tolerance';
import type { Pt, Ring } from './types';

/**
 * Arc discretisation with a chord tolerance, placed so the polygon errs toward MORE space:
 * - an arc on the convex side of a region ("outer" arc: the region lies inside the circle) is
 *   CIRCUMSCRIBED — its polygon runs along tangents, outside the circle by at most the tolerance;
 * - an arc on the concave side ("inner" arc: the region lies outside the circle) is INSCRIBED —
 *   chords cut into the circle by at most the tolerance (the sagitta).
 * Either way the polygon contains the true region and exceeds it by ≤ tolerance.
 */
export type ArcSide = 'outer' | 'inner';

const MAX_STEP = Math.PI / 2;

/** Largest angular step (rad) whose circumscribed polygon stays within tol of radius r (r·(sec(h/2) − 1) ≤ tol). */
export function outerArcStep(r: number, tol: number): number {
  if (r <= tol) return MAX_STEP;
  return Math.min(MAX_STEP, 2 * Math.acos(r / (r + tol)));
}

/** Largest angular step (rad) whose chords stay within tol of radius r (sagitta r·(1 − cos(h/2)) ≤ tol). */
export function innerArcStep(r: number, tol: number): number {
  if (r <= tol) return MAX_STEP;
  return Math.min(MAX_STEP, 2 * Math.acos(1 - tol / r));
}

/**
 * Appends the polyline of a circular arc (centre cx, cy; radius r; from angle a0 to a1 in radians,
 * either direction) to `out`, mm. Both end points lie exactly on the arc; "outer" adds tangent
 * corner points (circumscribed), "inner" adds chord points (inscribed). The first point is
 * skipped when `skipFirst` (for joining consecutive boundary pieces).
 */
export function appendArc(
  out: Pt[],
  cx: number,
  cy: number,
  r: number,
  a0: number,
  a1: number,
  side: ArcSide,
  tol: number = DEFAULT_CHORD_TOLERANCE_MM,
  skipFirst = false,
): void {
  const sweep = a1 - a0;
  if (!skipFirst) out.push([cx + r * Math.cos(a0), cy + r * Math.sin(a0)]);
  if (r <= 0 || sweep === 0) {
    if (skipFirst) out.push([cx + r * Math.cos(a1), cy + r * Math.sin(a1)]);
    return;
  }
  const hMax = side === 'outer' ? outerArcStep(r, tol) : innerArcStep(r, tol);
  const n = Math.max(1, Math.ceil(Math.abs(sweep) / hMax - 1e-9));
  const h = sweep / n;
  if (side === 'outer') {
    const rc = r / Math.cos(h / 2);
    for (let k = 0; k < n; k++) {
      const a = a0 + (k + 0.5) * h;
      out.push([cx + rc * Math.cos(a), cy + rc * Math.sin(a)]);
    }
  } else {
    for (let k = 1; k < n; k++) {
      const a = a0 + k * h;
      out.push([cx + r * Math.cos(a), cy + r * Math.sin(a)]);
    }
  }
  out.push([cx + r * Math.cos(a1), cy + r * Math.sin(a1)]);
}

/** Points of a circular arc from a0 to a1 (radians), circumscribed ("outer") or inscribed ("inner"), mm. */
export function arcPoints(
  cx: number,
  cy: number,
  r: number,
  a0: number,
  a1: number,
  side: ArcSide,
  tol: number = DEFAULT_CHORD_TOLERANCE_MM,
): Pt[] {
  assertFinite('r', r);
  if (r < 0) throw new Error('r must not be negative');
  if (!(tol > 0)) throw new Error('tol must be greater than 0');
  const out: Pt[] = [];
  appendArc(out, cx, cy, r, a0, a1, side, tol);
  return out;
}

/**
 * Closed counter-clockwise ring approximating a full circle, mm: "outer" is circumscribed (a
 * tangent polygon, for a disk's boundary), "inner" inscribed (for a hole's boundary).
 */
export function circleRing(cx: number, cy: number, r: number, side: ArcSide, tol: number = DEFAULT_CHORD_TOLERANCE_MM): Ring {
  assertFinite('r', r);
  if (!(r > 0)) throw new Error('r must be greater than 0');
  const hMax = side === 'outer' ? outerArcStep(r, tol) : innerArcStep(r, tol);
  const n = Math.max(8, Math.ceil((2 * Math.PI) / hMax));
  const h = (2 * Math.PI) / n;
  const rc = side === 'outer' ? r / Math.cos(h / 2) : r;
  const ring: Ring = [];
  for (let k = 0; k < n; k++) {
    const a = k * h;
    ring.push([cx + rc * Math.cos(a), cy + rc * Math.sin(a)]);
  }
  return ring;
}
