import { appendArc, circleRing } from './arc';
import { toRadians } from './angles';
import { DEFAULT_CHORD_TOLERANCE_MM, assertFinite } from './tolerance';
import type { Degrees, Polygon2, Pt } from './types';

export interface AnnularSectorSpec {
  /** Centre, mm. */
  cx: number;
  cy: number;
  /** Radii, mm (0 ≤ rInner < rOuter). */
  rInner: number;
  rOuter: number;
  /** Bearing of the first edge and of the second, degrees counter-clockwise from +x (end ≥ start). */
  startDeg: Degrees;
  endDeg: Degrees;
  /** Chord tolerance, mm (default 1). */
  toleranceMm?: number;
}

/**
 * Polygon of an annular sector (outer ring counter-clockwise), mm. The outer arc is circumscribed
 * and the inner arc inscribed, so the polygon contains the exact sector and exceeds it by at most
 * the tolerance. A sweep of 360° or more gives the full annulus (a disk when rInner is 0).
 */
export function annularSector(spec: Readonly<AnnularSectorSpec>): Polygon2 {
  const { cx, cy, rInner, rOuter, startDeg, endDeg } = spec;
  const tol = spec.toleranceMm ?? DEFAULT_CHORD_TOLERANCE_MM;
  assertFinite('cx', cx);
  assertFinite('cy', cy);
  assertFinite('rInner', rInner);
  assertFinite('rOuter', rOuter);
  assertFinite('startDeg', startDeg);
  assertFinite('endDeg', endDeg);
  if (rInner < 0) throw new Error('rInner must not be negative');
  if (!(rOuter > rInner)) throw new Error('rOuter must be greater than rInner');
  if (!(endDeg >= startDeg)) throw new Error('endDeg must not be less than startDeg');
  if (!(tol > 0)) throw new Error('toleranceMm must be greater than 0');
  const sweep = endDeg - startDeg;
  if (sweep >= 360 - 1e-9) {
    const outer = circleRing(cx, cy, rOuter, 'outer', tol);
    if (rInner <= 0) return [outer];
    return [outer, circleRing(cx, cy, rInner, 'inner', tol).reverse()];
  }
  const a0 = toRadians(startDeg);
  const a1 = toRadians(endDeg);
  const ring: Pt[] = [];
  appendArc(ring, cx, cy, rOuter, a0, a1, 'outer', tol);
  if (rInner > 0) appendArc(ring, cx, cy, rInner, a1, a0, 'inner', tol);
  else ring.push([cx, cy]);
  return [ring];
}

/** Area of an annular sector, A = (θ/2)(R² − r²) with θ in radians (capped at 2π), mm². */
export function sectorArea(rInner: number, rOuter: number, sweepDeg: Degrees): number {
  const theta = toRadians(Math.min(Math.max(sweepDeg, 0), 360));
  return (theta / 2) * (rOuter * rOuter - rInner * rInner);
}
