import { clipOffset, clipUnion } from '../geometry/clipper';
import { pointSegmentDistance } from '../geometry/segmentDistance';
import { DEFAULT_CHORD_TOLERANCE_MM, GRID_MM } from '../geometry/tolerance';
import type { Polygon2, Pt, Ring } from '../geometry/types';
import type { ReachProfile } from './types';

/**
 * Exact boundary tracing of a two-parameter reach region, shared by the scara, articulated and
 * linkage families, and slicing of profiles.
 *
 * Why this method: the region swept by a planar two-link chain over a joint domain D is the image
 * of D under a smooth map. We split D into pieces on which the map is one-to-one — at the
 * singular curves (full stretch ψ ≡ 0 and full fold ψ ≡ 180°, and, for a four-bar, the rocker's
 * dead points) and into chunks of < 360° of the first joint. The image of each piece is then the
 * region bounded by the image of the piece's boundary: the joint-limit curves (each limit held
 * while the other joint sweeps) and the stretched/folded arcs. Each boundary edge is traced by
 * adaptive bisection in joint space until the curve's points at a quarter, half and three quarters
 * of each step lie within tol/2 of the chord (a four-bar near toggle bends unevenly, so the midpoint
 * alone is not enough); the pieces are united with integer clipping (clipper-lib) and the union is
 * grown outward by the larger of tol/2 and the worst chord error accepted (plus the 0.01 mm
 * grid), so the polygon contains the true region and exceeds it by at most about tol. A handful of pieces with a few hundred vertices each keeps
 * this fast (a few ms), unlike unions of thousands of strips.
 */

/** Map from joint parameters (u, v) in radians to a point in the plane, mm, written to out. */
export type JointMap = (u: number, v: number, out: Pt) => void;

/** A convex polygon in joint space (u, v), radians; vertices in order. */
export type JointPiece = Array<[number, number]>;

const MIN_PARAM_STEP = 0.05;
const MAX_DEPTH = 22;

/** Largest distance of the map's points at a quarter, a half and three quarters of a joint-space step from the chord p0–p1, mm. */
function chordError(map: JointMap, u0: number, v0: number, u1: number, v1: number, p0: Pt, p1: Pt, pm: Pt): number {
  const q: Pt = [0, 0];
  let dev = pointSegmentDistance(pm[0], pm[1], p0[0], p0[1], p1[0], p1[1]);
  for (const f of [0.25, 0.75]) {
    map(u0 + f * (u1 - u0), v0 + f * (v1 - v0), q);
    dev = Math.max(dev, pointSegmentDistance(q[0], q[1], p0[0], p0[1], p1[0], p1[1]));
  }
  return dev;
}

/** Worst chord error accepted while tracing (mm), kept per traceRegion call so the outward growth can cover it. */
let acceptedChordError = 0;

function traceEdge(map: JointMap, u0: number, v0: number, u1: number, v1: number, p0: Pt, p1: Pt, tolHalf: number, out: Pt[], depth: number): void {
  const um = (u0 + u1) / 2;
  const vm = (v0 + v1) / 2;
  const pm: Pt = [0, 0];
  map(um, vm, pm);
  // the midpoint alone misses chords whose curve bends unevenly (a four-bar near toggle): the
  // quarter points are checked as well, and the worst error accepted is measured
  const dev = chordError(map, u0, v0, u1, v1, p0, p1, pm);
  if (dev > tolHalf && depth < MAX_DEPTH) {
    traceEdge(map, u0, v0, um, vm, p0, pm, tolHalf, out, depth + 1);
    traceEdge(map, um, vm, u1, v1, pm, p1, tolHalf, out, depth + 1);
    return;
  }
  if (dev > acceptedChordError) acceptedChordError = dev;
  out.push(p1);
}

/** Ring traced through the map along the boundary of one joint-space piece, chords within tolHalf, mm. */
export function tracePiece(map: JointMap, piece: Readonly<JointPiece>, tolHalf: number): Ring {
  const ring: Pt[] = [];
  const n = piece.length;
  for (let i = 0; i < n; i++) {
    const [u0, v0] = piece[i];
    const [u1, v1] = piece[(i + 1) % n];
    const len = Math.hypot(u1 - u0, v1 - v0);
    const k = Math.max(1, Math.ceil(len / MIN_PARAM_STEP));
    let prev: Pt = [0, 0];
    map(u0, v0, prev);
    if (i === 0) ring.push(prev);
    for (let j = 1; j <= k; j++) {
      const ua = u0 + ((j - 1) / k) * (u1 - u0);
      const va = v0 + ((j - 1) / k) * (v1 - v0);
      const ub = u0 + (j / k) * (u1 - u0);
      const vb = v0 + (j / k) * (v1 - v0);
      const next: Pt = [0, 0];
      map(ub, vb, next);
      traceEdge(map, ua, va, ub, vb, prev, next, tolHalf, ring, 0);
      prev = next;
    }
  }
  ring.pop(); // the last point repeats the first
  return ring;
}

/**
 * Region swept by the map over the union of the joint pieces (each one-to-one), mm: traced
 * boundaries united by integer clipping, then grown outward so it contains the true region and
 * exceeds it by at most tol.
 */
export function traceRegion(map: JointMap, pieces: ReadonlyArray<JointPiece>, tol: number = DEFAULT_CHORD_TOLERANCE_MM): Polygon2[] {
  if (!(tol > 0)) throw new Error('tol must be greater than 0');
  const tolHalf = tol / 2;
  acceptedChordError = 0;
  const rings: Polygon2[] = [];
  for (const piece of pieces) {
    if (piece.length < 3) continue;
    const ring = tracePiece(map, piece, tolHalf);
    if (ring.length >= 3) rings.push([ring]);
  }
  if (rings.length === 0) return [];
  // grown by the larger of tol/2 and the worst chord error accepted (above tol/2 only where the
  // bisection depth ran out)
  return clipOffset(clipUnion(rings), Math.max(tolHalf, acceptedChordError) + GRID_MM, { join: 'miter' });
}

/** Clips a convex joint-space polygon to the half-plane a·u + b·v ≤ c (Sutherland–Hodgman). */
export function clipPieceHalfPlane(piece: Readonly<JointPiece>, a: number, b: number, c: number): JointPiece {
  const out: JointPiece = [];
  const n = piece.length;
  for (let i = 0; i < n; i++) {
    const p = piece[i];
    const q = piece[(i + 1) % n];
    const fp = a * p[0] + b * p[1] - c;
    const fq = a * q[0] + b * q[1] - c;
    if (fp <= 0) out.push(p);
    if ((fp < 0 && fq > 0) || (fp > 0 && fq < 0)) {
      const t = fp / (fp - fq);
      out.push([p[0] + t * (q[0] - p[0]), p[1] + t * (q[1] - p[1])]);
    }
  }
  return out;
}

/** Splits a sorted interval [lo, hi] at the given cut values (radians), keeping pieces of positive length. */
export function splitInterval(lo: number, hi: number, cuts: Iterable<number>): Array<[number, number]> {
  const inner = [...cuts].filter((c) => c > lo + 1e-12 && c < hi - 1e-12).sort((x, y) => x - y);
  const pts = [lo, ...inner, hi];
  const out: Array<[number, number]> = [];
  for (let i = 0; i + 1 < pts.length; i++) if (pts[i + 1] - pts[i] > 1e-12) out.push([pts[i], pts[i + 1]]);
  return out;
}

/** Multiples of `step` (radians) strictly inside (lo, hi). */
export function multiplesInside(lo: number, hi: number, step: number, phase = 0): number[] {
  const out: number[] = [];
  for (let k = Math.ceil((lo - phase) / step); phase + k * step < hi; k++) {
    const v = phase + k * step;
    if (v > lo) out.push(v);
  }
  return out;
}

/** Profile statistics from traced (r, z) polygons; r signed, mm. */
export function profileFromPolygons(polygons: Polygon2[], toleranceMm: number): ReachProfile {
  let maxReach = 0;
  let minAbs = Infinity;
  let rMin = Infinity;
  let rMax = -Infinity;
  let zMin = Infinity;
  let zMax = -Infinity;
  for (const p of polygons) {
    for (const ring of p) {
      for (const [r, z] of ring) {
        const a = Math.abs(r);
        if (a > maxReach) maxReach = a;
        if (a < minAbs) minAbs = a;
        if (r < rMin) rMin = r;
        if (r > rMax) rMax = r;
        if (z < zMin) zMin = z;
        if (z > zMax) zMax = z;
      }
    }
  }
  if (polygons.length === 0) return { polygons, toleranceMm, method: 'exact', maxReach: 0, minReach: 0, zMin: 0, zMax: 0 };
  // The region crosses the J1 axis when it has points on both sides, or touches it.
  const minReach = rMin <= 0 && rMax >= 0 ? 0 : minAbs;
  return { polygons, toleranceMm, method: 'exact', maxReach, minReach, zMin, zMax };
}

/**
 * Radial intervals [r0, r1] (signed r, sorted, mm) where the horizontal line at height z crosses
 * the profile's polygons (even–odd crossings over every ring).
 */
export function profileSliceAt(profile: Pick<ReachProfile, 'polygons'>, z: number): Array<[number, number]> {
  const xs: number[] = [];
  for (const p of profile.polygons) {
    for (const ring of p) {
      const n = ring.length;
      for (let i = 0, j = n - 1; i < n; j = i++) {
        const [ri, zi] = ring[i];
        const [rj, zj] = ring[j];
        if (zi > z !== zj > z) xs.push(ri + ((z - zi) * (rj - ri)) / (zj - zi));
      }
    }
  }
  return pairUp(xs);
}

/**
 * Height intervals [z0, z1] (sorted, mm) where the vertical line at signed radial distance r crosses
 * the profile's polygons (even–odd crossings over every ring): the vertical slice beside the
 * horizontal `profileSliceAt`.
 */
export function profileColumnAt(profile: Pick<ReachProfile, 'polygons'>, r: number): Array<[number, number]> {
  const zs: number[] = [];
  for (const p of profile.polygons) {
    for (const ring of p) {
      const n = ring.length;
      for (let i = 0, j = n - 1; i < n; j = i++) {
        const [ri, zi] = ring[i];
        const [rj, zj] = ring[j];
        if (ri > r !== rj > r) zs.push(zi + ((r - ri) * (zj - zi)) / (rj - ri));
      }
    }
  }
  return pairUp(zs);
}

/**
 * `profileColumnAt` for many radial distances over one profile: the edges are bucketed by r once,
 * so each column tests only the edges that span it. Same crossings, same intervals, mm.
 */
export function profileColumnIndex(profile: Pick<ReachProfile, 'polygons'>): (r: number) => Array<[number, number]> {
  const edges: number[] = [];
  let rMin = Infinity;
  let rMax = -Infinity;
  for (const p of profile.polygons) {
    for (const ring of p) {
      const n = ring.length;
      for (let i = 0, j = n - 1; i < n; j = i++) {
        edges.push(ring[i][0], ring[i][1], ring[j][0], ring[j][1]);
        rMin = Math.min(rMin, ring[i][0]);
        rMax = Math.max(rMax, ring[i][0]);
      }
    }
  }
  const count = edges.length / 4;
  if (count === 0) return () => [];
  const buckets = Math.max(1, Math.min(1024, count));
  const width = (rMax - rMin) / buckets || 1;
  const bucketOf = (r: number) => Math.min(buckets - 1, Math.max(0, Math.floor((r - rMin) / width)));
  const start = new Int32Array(buckets + 1);
  for (let e = 0; e < count; e++) {
    const a = bucketOf(Math.min(edges[4 * e], edges[4 * e + 2]));
    const b = bucketOf(Math.max(edges[4 * e], edges[4 * e + 2]));
    for (let k = a; k <= b; k++) start[k + 1]++;
  }
  for (let k = 0; k < buckets; k++) start[k + 1] += start[k];
  const fill = start.slice(0, buckets);
  const members = new Int32Array(start[buckets]);
  for (let e = 0; e < count; e++) {
    const a = bucketOf(Math.min(edges[4 * e], edges[4 * e + 2]));
    const b = bucketOf(Math.max(edges[4 * e], edges[4 * e + 2]));
    for (let k = a; k <= b; k++) members[fill[k]++] = e;
  }
  return (r) => {
    if (!(r >= rMin && r <= rMax)) return [];
    const k = bucketOf(r);
    const zs: number[] = [];
    for (let m = start[k]; m < start[k + 1]; m++) {
      const e = 4 * members[m];
      const ri = edges[e];
      const zi = edges[e + 1];
      const rj = edges[e + 2];
      const zj = edges[e + 3];
      if (ri > r !== rj > r) zs.push(zi + ((r - ri) * (zj - zi)) / (rj - ri));
    }
    return pairUp(zs);
  };
}

/** Sorted crossings taken two by two into intervals, touching ones merged. */
function pairUp(xs: number[]): Array<[number, number]> {
  xs.sort((a, b) => a - b);
  const out: Array<[number, number]> = [];
  for (let i = 0; i + 1 < xs.length; i += 2) {
    const a = xs[i];
    const b = xs[i + 1];
    const last = out[out.length - 1];
    if (last && a - last[1] <= 1e-9) last[1] = b;
    else if (b > a) out.push([a, b]);
  }
  return out;
}

/** Radial extent of the profile over all heights: the union of every slice (signed r intervals, mm). */
export function profileProjection(profile: Pick<ReachProfile, 'polygons'>): Array<[number, number]> {
  const spans: Array<[number, number]> = [];
  for (const p of profile.polygons) {
    let lo = Infinity;
    let hi = -Infinity;
    for (const [r] of p[0] ?? []) {
      if (r < lo) lo = r;
      if (r > hi) hi = r;
    }
    if (lo <= hi) spans.push([lo, hi]);
  }
  spans.sort((a, b) => a[0] - b[0]);
  const out: Array<[number, number]> = [];
  for (const s of spans) {
    const last = out[out.length - 1];
    if (last && s[0] <= last[1]) last[1] = Math.max(last[1], s[1]);
    else out.push([s[0], s[1]]);
  }
  return out;
}

/**
 * A planar two-link chain: end point = origin + l1·(cos u, sin u) + l2·(cos(u + rel(s) + phase),
 * sin(…)) + offset, over u ∈ uRange, s ∈ sRange (optionally u + s ∈ sumRange), radians and mm.
 * With rel the identity this is the planar 2R arm (Spong et al.; Siciliano et al. §2.9).
 */
export interface TwoLinkSpec {
  origin: Pt;
  l1: number;
  l2: number;
  /** Constant angle added to the second link (an elbow offset folded into an effective link), rad. */
  phase?: number;
  /** Constant offset of the end point (a flange offset), mm. */
  offset?: Pt;
  uRange: [number, number];
  sRange: [number, number];
  /** Band lo ≤ u + s ≤ hi, rad (a motor range when s is the crank angle relative to link 1). */
  sumRange?: [number, number];
  /** Relative angle of link 2 to link 1 from s, rad (default: s itself). Must be defined on feasible s. */
  rel?: (s: number) => number;
  /** Whether s is feasible (assembles, within coupled limits); constant between break points. */
  feasible?: (s: number) => boolean;
  /** Values of s where rel stops being monotone or feasibility changes, rad. */
  breaks?: number[];
}

/** End point of a two-link chain for joint values (u, s), mm (planar 2R forward kinematics). */
export function twoLinkPoint(spec: Readonly<TwoLinkSpec>, u: number, s: number, out: Pt): void {
  const rel = spec.rel ? spec.rel(s) : s;
  const a2 = u + rel + (spec.phase ?? 0);
  out[0] = spec.origin[0] + spec.l1 * Math.cos(u) + spec.l2 * Math.cos(a2) + (spec.offset ? spec.offset[0] : 0);
  out[1] = spec.origin[1] + spec.l1 * Math.sin(u) + spec.l2 * Math.sin(a2) + (spec.offset ? spec.offset[1] : 0);
}

/**
 * Joint-space pieces on which the two-link map is one-to-one: u in chunks of at most 180°, s split
 * at the break points and where the effective elbow angle rel(s) + phase passes a multiple of 180°
 * (full stretch / full fold), infeasible s intervals dropped, the sum band clipped in.
 */
export function twoLinkPieces(spec: Readonly<TwoLinkSpec>): JointPiece[] {
  const [u0, u1] = spec.uRange;
  const [s0, s1] = spec.sRange;
  const phase = spec.phase ?? 0;
  const cuts: number[] = [...(spec.breaks ?? [])];
  if (!spec.rel) cuts.push(...multiplesInside(s0, s1, Math.PI, -phase));
  const sIntervals = splitInterval(s0, s1, cuts).filter(([a, b]) => {
    const mid = (a + b) / 2;
    return spec.feasible ? spec.feasible(mid) : true;
  });
  const uChunks = Math.max(1, Math.ceil((u1 - u0) / Math.PI - 1e-9));
  const pieces: JointPiece[] = [];
  for (let k = 0; k < uChunks; k++) {
    const ua = u0 + ((u1 - u0) * k) / uChunks;
    const ub = u0 + ((u1 - u0) * (k + 1)) / uChunks;
    for (const [sa, sb] of sIntervals) {
      let piece: JointPiece = [
        [ua, sa],
        [ub, sa],
        [ub, sb],
        [ua, sb],
      ];
      if (spec.sumRange) {
        piece = clipPieceHalfPlane(piece, 1, 1, spec.sumRange[1]);
        piece = clipPieceHalfPlane(piece, -1, -1, -spec.sumRange[0]);
      }
      if (piece.length >= 3 && Math.abs(pieceArea(piece)) > 1e-14) pieces.push(piece);
    }
  }
  return pieces;
}

function pieceArea(p: Readonly<JointPiece>): number {
  let s = 0;
  for (let i = 0, j = p.length - 1; i < p.length; j = i++) s += (p[j][0] - p[i][0]) * (p[j][1] + p[i][1]);
  return s / 2;
}

/** Region reached by the end point of a two-link chain over its joint domain, mm (exact boundary tracing, see the file comment). */
export function twoLinkRegion(spec: Readonly<TwoLinkSpec>, tol: number = DEFAULT_CHORD_TOLERANCE_MM): Polygon2[] {
  const map: JointMap = (u, s, out) => twoLinkPoint(spec, u, s, out);
  return traceRegion(map, twoLinkPieces(spec), tol);
}

/** Range of |end point − origin| over the s range for the plain 2R case (rel = identity, no band), mm. */
export function twoLinkRadialRange(l1: number, l2: number, sRange: [number, number], phase = 0): [number, number] {
  const rho = (psi: number) => Math.sqrt(Math.max(0, l1 * l1 + l2 * l2 + 2 * l1 * l2 * Math.cos(psi)));
  const [a, b] = [sRange[0] + phase, sRange[1] + phase];
  let lo = Math.min(rho(a), rho(b));
  let hi = Math.max(rho(a), rho(b));
  if (multiplesInside(a - 1e-15, b + 1e-15, 2 * Math.PI).length > 0) hi = l1 + l2;
  if (multiplesInside(a - 1e-15, b + 1e-15, 2 * Math.PI, Math.PI).length > 0) lo = Math.abs(l1 - l2);
  return [lo, hi];
}
