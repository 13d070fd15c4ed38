/**
 * The whole moving arm: link sizes and the swept envelope of everything that moves.
 *
 * Every moving link is a capsule: the segment between two consecutive joint points of the same
 * forward kinematics the tool point uses, grown by the link's radius (half-width). The tool is a
 * capsule from the flange to the tool point with the tool radius, the payload a ball of
 * payloadRadius around the tool point. The base and the turret below the J2 axis are not part of
 * the envelope (they stay over the base footprint).
 *
 * The envelope profile is the region of the arm's (r, z) half-plane (r signed, the plan distance
 * from the J1 axis; z above the base plate, mm) that those capsules sweep when every axis but J1
 * moves, with `lateralMm` the sideways spread of every capsule point off the plane through J1.
 * Plan regions turn it over the J1 range (planRegions.ts). Methods (docs/kinematics.md,
 * "Whole-arm envelope"):
 * - articulated, linkage: exact polygons. The upper arm sweeps a circular sector about the J2 axis.
 *   A point at fraction t of the forearm, E + t·(W − E), moves with rank 2 in (J2, J3) for t > 0
 *   inside each one-to-one piece of the joint domain, so the forearm's swept region is bounded by
 *   the elbow and wrist sweeps and by the forearm at the pieces' boundary poses: those boundary
 *   poses are traced (convex hulls of consecutive forearm positions, chord error measured), united
 *   with the wrist region, and the holes are filled. Tool, payload and rear parts: Minkowski sums
 *   and offsets of the traced regions (see each family).
 * - scara: the same in plan: link 1 a sector about J1, link 2 the filled union of the flange
 *   region, the link at the J1 limits (sectors about the elbow) and the link at the J2 limits
 *   turned over the J1 range (exact annular pieces).
 * - chain: sampled. A lattice over the joints that move the links up to the wrist; every
 *   lattice pose's link centre lines are stamped into an (r, z) raster, each class of capsule is
 *   grown by its radius plus the lattice allowance δ (the measured largest movement to the nearest
 *   lattice pose) with an exact Euclidean distance transform, and the union is traced. Everything
 *   beyond the wrist point (the wrist links, the tool and the payload) is bounded by a ball around
 *   it whose radius is the sum of those link lengths (triangle inequality) and the largest radius.
 */
import { contours } from 'd3';
import { toRadians } from '../geometry/angles';
import { appendArc, circleRing } from '../geometry/arc';
import { clipIntersect, clipOffset, clipUnion } from '../geometry/clipper';
import { pointSegmentDistance } from '../geometry/segmentDistance';
import { simplifyPolygonsOutward } from '../geometry/simplify';
import { DEFAULT_CHORD_TOLERANCE_MM, GRID_MM } from '../geometry/tolerance';
import type { Polygon2, Pt, Ring } from '../geometry/types';
import { canonicalJson } from '../canonicalJson';
import type { ArmParams, ArticulatedParams, ChainParams, LinkageParams, ScaraParams } from '../schemas/armModel';
import { axisKinematicDeg, axisKinematicRangeDeg, axisKinematicRangeRad, effectiveForearm } from './articulated';
import { chainDhJoints, chainJointVariable } from './chain';
import { mat4Identity, mat4Multiply, modifiedDhTransform, standardDhTransform, type Mat4 } from './dh';
import { forwardModel, reachProfileOf } from './families';
import { linkageRelAngle, linkageTwoLinkSpec } from './linkage';
import { twoLinkPieces, type TwoLinkSpec } from './profile';
import { scaraPlanRegion } from './scara';
import type { Vec3 } from './types';

/** Link sizes of a scara, mm. */
export interface ScaraLinkSizes {
  innerLinkRadius: number;
  outerLinkRadius: number;
  toolRadius: number;
}
/** Link sizes of an articulated arm, mm. */
export interface ArticulatedLinkSizes {
  upperArmRadius: number;
  forearmRadius: number;
  toolRadius: number;
}
/** Link sizes of a linkage arm, mm: rearLength reaches behind the J2 and J3 axes (counterweight side, crank, coupler). */
export interface LinkageLinkSizes extends ArticulatedLinkSizes {
  rearLength: number;
  rearRadius: number;
}
/** Link sizes of a DH chain, mm: one radius for every link, one for the last link up to the tool point. */
export interface ChainLinkSizes {
  linkRadius: number;
  toolRadius: number;
}

/** Defaults for missing link-size fields, mm (invented, plausible half-widths for arms of these sizes). */
export const LINK_SIZE_DEFAULTS = {
  scara: { innerLinkRadius: 60, outerLinkRadius: 50, toolRadius: 25 } satisfies ScaraLinkSizes,
  articulated: { upperArmRadius: 100, forearmRadius: 80, toolRadius: 50 } satisfies ArticulatedLinkSizes,
  linkage: { upperArmRadius: 150, forearmRadius: 120, toolRadius: 100, rearLength: 300, rearRadius: 120 } satisfies LinkageLinkSizes,
  chain: { linkRadius: 100, toolRadius: 50 } satisfies ChainLinkSizes,
} as const;

/** The model's link sizes with the defaults filled in, mm. */
export function linkSizesOf(model: ScaraParams): ScaraLinkSizes;
export function linkSizesOf(model: ArticulatedParams): ArticulatedLinkSizes;
export function linkSizesOf(model: LinkageParams): LinkageLinkSizes;
export function linkSizesOf(model: ChainParams): ChainLinkSizes;
export function linkSizesOf(model: ArmParams): ScaraLinkSizes | ArticulatedLinkSizes | LinkageLinkSizes | ChainLinkSizes;
export function linkSizesOf(model: ArmParams): ScaraLinkSizes | ArticulatedLinkSizes | LinkageLinkSizes | ChainLinkSizes {
  const given = (model.linkSizes ?? {}) as Record<string, number | undefined>;
  const defaults = LINK_SIZE_DEFAULTS[model.family] as Record<string, number>;
  const out: Record<string, number> = {};
  for (const k of Object.keys(defaults)) out[k] = given[k] ?? defaults[k];
  return out as never;
}

/** One capsule of the moving arm: segment a–b (arm frame, mm) grown by radius (a = b for a ball). */
export interface Capsule {
  a: Vec3;
  b: Vec3;
  radius: number;
  label: string;
}

/** Envelope of the whole moving arm in its (r, z) half-plane, arm frame, mm. */
export interface EnvelopeProfile {
  polygons: Polygon2[];
  /** The outline contains every capsule and exceeds the swept region by at most this, mm. */
  toleranceMm: number;
  method: 'exact' | 'sampled';
  /** Sideways spread of every capsule point off the plane through J1 (J1 at kinematic 0), mm. */
  lateralMm: { min: number; max: number };
  maxReach: number;
  zMin: number;
  zMax: number;
  /** scara only: the plan envelope over the full J1 range (link sweeps), arm frame. */
  plan?: Polygon2[];
}

const TAU = 2 * Math.PI;

/* ---------------------------------------------------------------- capsules from forward kinematics */

const v3 = (x: number, y: number, z: number): Vec3 => ({ x, y, z });

/**
 * The capsules of the arm at one pose (controller joint values), arm frame, mm, from forward()'s
 * frames; null when the pose gives no tool point. The envelope contains every one of them.
 */
export function bodyCapsules(model: ArmParams, joints: readonly number[]): Capsule[] | null {
  const fk = forwardModel(model, joints);
  if (!fk.ok) return null;
  const at = (label: string) => {
    const f = fk.frames.find((fr) => fr.label === label);
    if (!f) throw new Error(`frame ${label} missing`);
    return f.origin;
  };
  const payload = model.payloadRadius ?? 0;
  const tool = model.toolLength ?? 0;
  const caps: Capsule[] = [];
  if (model.family === 'scara') {
    const s = linkSizesOf(model);
    const base = v3(0, 0, fk.wrist.z);
    caps.push({ a: base, b: at('elbow'), radius: s.innerLinkRadius, label: 'inner link' });
    caps.push({ a: at('elbow'), b: fk.wrist, radius: s.outerLinkRadius, label: 'outer link' });
    caps.push({ a: fk.wrist, b: fk.tool, radius: s.toolRadius, label: 'tool' });
    caps.push({ a: fk.tool, b: fk.tool, radius: payload, label: 'payload' });
    return caps;
  }
  if (model.family === 'articulated' || model.family === 'linkage') {
    const s: ArticulatedLinkSizes = model.family === 'linkage' ? linkSizesOf(model) : linkSizesOf(model);
    const S = at('shoulder');
    const E = at('elbow');
    const W = at('wrist');
    caps.push({ a: S, b: E, radius: s.upperArmRadius, label: 'upper arm' });
    caps.push({ a: E, b: W, radius: s.forearmRadius, label: 'forearm' });
    if (model.family === 'articulated') {
      // the wrist can tilt the tool: the tool and payload are bounded by a ball around the wrist centre
      caps.push({ a: W, b: fk.tool, radius: s.toolRadius, label: 'tool' });
      caps.push({ a: fk.tool, b: fk.tool, radius: payload, label: 'payload' });
      return caps;
    }
    const l = s as LinkageLinkSizes;
    const F = at('flange');
    caps.push({ a: W, b: F, radius: s.forearmRadius, label: 'flange bracket' });
    caps.push({ a: F, b: fk.tool, radius: s.toolRadius, label: 'tool' });
    caps.push({ a: fk.tool, b: fk.tool, radius: payload, label: 'payload' });
    // rear parts from the same angles: the upper arm and the forearm behind J2/J3, the crank and the coupler
    const lp = model as LinkageParams;
    const t1 = toRadians(axisKinematicDeg(lp.axes[0], joints[0]));
    const c1 = Math.cos(t1), s1 = Math.sin(t1);
    const inPlane = (r: number, z: number) => v3(r * c1, r * s1, z);
    const rOf = (p: Vec3) => p.x * c1 + p.y * s1;
    const rS = rOf(S), rE = rOf(E), rW = rOf(W);
    const lu = Math.hypot(rE - rS, E.z - S.z), lf = Math.hypot(rW - rE, W.z - E.z);
    const du = [(rE - rS) / lu, (E.z - S.z) / lu];
    const df = [(rW - rE) / lf, (W.z - E.z) / lf];
    caps.push({ a: S, b: inPlane(rS - l.rearLength * du[0], S.z - l.rearLength * du[1]), radius: l.rearRadius, label: 'upper arm rear' });
    caps.push({ a: E, b: inPlane(rE - l.rearLength * df[0], E.z - l.rearLength * df[1]), radius: l.rearRadius, label: 'forearm rear' });
    const fb = lp.fourBar;
    const u = toRadians(axisKinematicDeg(lp.axes[1], joints[1]));
    const m3 = toRadians(axisKinematicDeg(lp.axes[2], joints[2]));
    const crankLen = fb ? fb.crank : l.rearLength;
    const C = inPlane(rS + crankLen * Math.cos(m3), S.z + crankLen * Math.sin(m3));
    const rel = linkageRelAngle(lp, m3 - u);
    if (rel !== null) {
      const rock = fb ? u + rel - toRadians(fb.rockerToForearm ?? 0) : m3;
      const rockLen = fb ? fb.rocker : l.rearLength;
      const K = inPlane(rE + rockLen * Math.cos(rock), E.z + rockLen * Math.sin(rock));
      caps.push({ a: S, b: C, radius: l.rearRadius, label: 'crank' });
      caps.push({ a: C, b: K, radius: l.rearRadius, label: 'coupler' });
    }
    return caps;
  }
  const s = linkSizesOf(model);
  const frames = fk.frames.filter((f) => /^J\d+$/.test(f.label)).map((f) => f.origin);
  for (let i = 0; i + 1 < frames.length; i++) caps.push({ a: frames[i], b: frames[i + 1], radius: s.linkRadius, label: `link ${i + 1}` });
  caps.push({ a: frames[frames.length - 1], b: fk.tool, radius: s.toolRadius, label: 'tool' });
  // toolLength on a chain is tooling beyond the tool point that the wrist can point any way
  caps.push({ a: fk.tool, b: fk.tool, radius: tool + Math.max(s.toolRadius, payload), label: 'tooling and payload' });
  return caps;
}

/* ---------------------------------------------------------------- polygon helpers */

/** Circular sector with apex (cx, cy), radius r, angles a0…a1 (rad): a disc for 360° or more; outer arc circumscribed. */
export function sectorPolygon(cx: number, cy: number, r: number, a0: number, a1: number, tol = DEFAULT_CHORD_TOLERANCE_MM): Polygon2 {
  if (a1 - a0 >= TAU - 1e-12) return [circleRing(cx, cy, r, 'outer', tol)];
  const ring: Pt[] = [[cx, cy]];
  appendArc(ring, cx, cy, r, a0, a1, 'outer', tol);
  return [ring];
}

/** Outward simplification before a large offset, mm (the result lies within 2·this outside). */
const GROW_SIMPLIFY_MM = 1;

/** Polygons grown by `by` mm (round joins, arcs erring outward), simplified outward first when they have many vertices. */
function grow(polys: Polygon2[], by: number, tol = DEFAULT_CHORD_TOLERANCE_MM): Polygon2[] {
  if (polys.length === 0) return polys;
  if (!(by > 0)) return clipUnion(polys);
  let verts = 0;
  for (const p of polys) for (const ring of p) verts += ring.length;
  const src = verts > 64 ? simplifyPolygonsOutward(polys, GROW_SIMPLIFY_MM) : polys;
  return clipOffset(src, by, { join: 'round', arcToleranceMm: Math.min(tol, by / 4) });
}

function translate(polys: ReadonlyArray<Polygon2>, dx: number, dy: number): Polygon2[] {
  return polys.map((p) => p.map((ring) => ring.map(([x, y]): Pt => [x + dx, y + dy])));
}

/** Outer rings only: the holes filled. */
function fillHoles(polys: ReadonlyArray<Polygon2>): Polygon2[] {
  return polys.map((p) => [p[0]]);
}

/** Convex hull of a few points (Andrew's monotone chain), counter-clockwise. */
function hull(points: Pt[]): Ring {
  const pts = [...points].sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  if (pts.length < 3) return pts;
  const cross = (o: Pt, a: Pt, b: Pt) => (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]);
  const lower: Pt[] = [];
  for (const p of pts) {
    while (lower.length >= 2 && cross(lower[lower.length - 2], lower[lower.length - 1], p) <= 0) lower.pop();
    lower.push(p);
  }
  const upper: Pt[] = [];
  for (let i = pts.length - 1; i >= 0; i--) {
    const p = pts[i];
    while (upper.length >= 2 && cross(upper[upper.length - 2], upper[upper.length - 1], p) <= 0) upper.pop();
    upper.push(p);
  }
  return lower.slice(0, -1).concat(upper.slice(0, -1));
}

/** Minkowski sum of polygons with the segment from 0 to (vx, vy): the polygons, their translate, and every edge swept along v. */
export function minkowskiSegment(polys: ReadonlyArray<Polygon2>, vx: number, vy: number): Polygon2[] {
  if (Math.hypot(vx, vy) < GRID_MM) return clipUnion(polys);
  const parts: Polygon2[] = [...polys, ...translate(polys, vx, vy)];
  for (const p of polys) {
    for (const ring of p) {
      for (let i = 0; i < ring.length; i++) {
        const a = ring[i];
        const b = ring[(i + 1) % ring.length];
        parts.push([[a, b, [b[0] + vx, b[1] + vy], [a[0] + vx, a[1] + vy]]]);
      }
    }
  }
  return clipUnion(parts);
}

/* ---------------------------------------------------------------- planar two-link families */

/**
 * The link of a two-link chain (elbow → end point, without the end offset) at the boundary poses of
 * each one-to-one joint piece: convex hulls of consecutive positions. Each boundary edge is split
 * until the link's end points at the quarter, middle and three-quarter poses lie within tolHalf of
 * the chords; `worst` is the largest such distance found on the accepted steps (the hulls are grown by it).
 */
function linkAtBoundaryPoses(spec: Readonly<TwoLinkSpec>, tolHalf: number): { hulls: Polygon2[]; worst: number } {
  const phase = spec.phase ?? 0;
  const [ox, oy] = spec.origin;
  const pose = (u: number, s: number, out: Float64Array) => {
    const rel = spec.rel ? spec.rel(s) : s;
    const a2 = u + rel + phase;
    out[0] = ox + spec.l1 * Math.cos(u);
    out[1] = oy + spec.l1 * Math.sin(u);
    out[2] = out[0] + spec.l2 * Math.cos(a2);
    out[3] = out[1] + spec.l2 * Math.sin(a2);
  };
  const hulls: Polygon2[] = [];
  let worst = 0;
  const q = new Float64Array(4);
  const chordDev = (p0: Float64Array, p1: Float64Array, u0: number, s0: number, u1: number, s1: number): number => {
    let dev = 0;
    for (const f of [0.25, 0.5, 0.75]) {
      pose(u0 + f * (u1 - u0), s0 + f * (s1 - s0), q);
      dev = Math.max(dev, pointSegmentDistance(q[0], q[1], p0[0], p0[1], p1[0], p1[1]), pointSegmentDistance(q[2], q[3], p0[2], p0[3], p1[2], p1[3]));
    }
    return dev;
  };
  const step = (u0: number, s0: number, u1: number, s1: number, p0: Float64Array, p1: Float64Array, depth: number): void => {
    const dev = chordDev(p0, p1, u0, s0, u1, s1);
    if (dev > tolHalf && depth < 24) {
      const um = (u0 + u1) / 2, sm = (s0 + s1) / 2;
      const pm = new Float64Array(4);
      pose(um, sm, pm);
      step(u0, s0, um, sm, p0, pm, depth + 1);
      step(um, sm, u1, s1, pm, p1, depth + 1);
      return;
    }
    if (dev > worst) worst = dev;
    const h = hull([
      [p0[0], p0[1]],
      [p0[2], p0[3]],
      [p1[0], p1[1]],
      [p1[2], p1[3]],
    ]);
    if (h.length >= 3) hulls.push([h]);
  };
  for (const piece of twoLinkPieces(spec)) {
    for (let i = 0; i < piece.length; i++) {
      const [u0, s0] = piece[i];
      const [u1, s1] = piece[(i + 1) % piece.length];
      const k = Math.max(1, Math.ceil(Math.hypot(u1 - u0, s1 - s0) / 0.1));
      let prev = new Float64Array(4);
      pose(u0, s0, prev);
      for (let j = 1; j <= k; j++) {
        const next = new Float64Array(4);
        const ua = u0 + ((j - 1) / k) * (u1 - u0), sa = s0 + ((j - 1) / k) * (s1 - s0);
        const ub = u0 + (j / k) * (u1 - u0), sb = s0 + (j / k) * (s1 - s0);
        pose(ub, sb, next);
        step(ua, sa, ub, sb, prev, next, 0);
        prev = next;
      }
    }
  }
  return { hulls, worst };
}

/** Chord tolerance of the forearm's boundary hulls, mm (half of it is the accepted chord error). */
const HULL_TOL_MM = 2;

function planarEnvelope(model: ArticulatedParams | LinkageParams): EnvelopeProfile {
  const sizes: ArticulatedLinkSizes = model.family === 'linkage' ? linkSizesOf(model) : linkSizesOf(model);
  const fa = effectiveForearm(model.forearm, model.elbowOffset ?? 0);
  const spec: TwoLinkSpec =
    model.family === 'linkage'
      ? { ...linkageTwoLinkSpec(model), offset: undefined }
      : {
          origin: [model.shoulderOffset, model.shoulderHeight],
          l1: model.upperArm,
          l2: fa.length,
          phase: fa.phase,
          uRange: axisKinematicRangeRad(model.axes[1]),
          sRange: axisKinematicRangeRad(model.axes[2]),
        };
  const profile = reachProfileOf(model);
  const off: Pt = model.family === 'linkage' ? [model.flangeOffset?.horizontal ?? 0, model.flangeOffset?.vertical ?? 0] : [0, 0];
  const wristRegion = off[0] !== 0 || off[1] !== 0 ? translate(profile.polygons, -off[0], -off[1]) : profile.polygons;
  const [sx, sy] = spec.origin;
  const [u0, u1] = spec.uRange;
  const upperFan = [sectorPolygon(sx, sy, spec.l1, u0, u1)];
  const { hulls, worst } = linkAtBoundaryPoses(spec, HULL_TOL_MM / 2);
  const forearmSweep = fillHoles(clipUnion([...wristRegion, ...clipOffset(clipUnion(hulls), worst + GRID_MM, { join: 'miter' })]));
  const payload = model.payloadRadius ?? 0;
  const tool = model.toolLength ?? 0;
  const parts: Polygon2[] = [...grow(upperFan, sizes.upperArmRadius), ...grow(forearmSweep, sizes.forearmRadius)];
  let lateral = Math.max(sizes.upperArmRadius, sizes.forearmRadius);
  if (model.family === 'articulated') {
    // a tilting tool and its payload stay within toolLength (+ the larger radius) of the wrist centre
    const ball = tool + Math.max(sizes.toolRadius, payload);
    parts.push(...grow(wristRegion, ball));
    lateral = Math.max(lateral, ball);
  } else {
    const l = sizes as LinkageLinkSizes;
    const fb = model.fourBar;
    // the rear parts (upper arm and forearm behind J2/J3, crank, coupler) stay within the larger of
    // rearLength, crank and rocker of the upper arm: the coupler's ends lie within crank of the J2
    // axis and within rocker of the elbow, and the distance to a segment is convex
    const rear = Math.max(l.rearLength, fb ? Math.max(fb.crank, fb.rocker) : 0) + l.rearRadius;
    parts.push(...grow(upperFan, rear));
    if (off[0] !== 0 || off[1] !== 0) parts.push(...grow(minkowskiSegment(wristRegion, off[0], off[1]), sizes.forearmRadius));
    parts.push(...grow(minkowskiSegment(profile.polygons, 0, -tool), sizes.toolRadius));
    if (payload > 0) parts.push(...grow(translate(profile.polygons, 0, -tool), payload));
    lateral = Math.max(lateral, rear, sizes.toolRadius, payload);
  }
  const joined = clipUnion(parts);
  // A ball that crosses the plane x = 0 (in-plane x, side y) maps partly to the other sign of
  // r = ±√(x² + y²): its points there are the mirror images of points of the same ball on this side
  // (reflecting x only brings a point nearer the ball's centre), all within √2 × the radius of the
  // J1 axis. So the envelope holds the mirror of its part within that distance of the axis.
  const near = Math.SQRT2 * lateral + GRID_MM;
  const ext = extent(joined);
  const band: Polygon2 = [[[-near, ext.zMin - 1], [near, ext.zMin - 1], [near, ext.zMax + 1], [-near, ext.zMax + 1]]];
  const mirrored = clipIntersect(joined, [band]).map((p) => p.map((ring) => ring.map(([r, z]): Pt => [-r, z]).reverse()));
  const polygons = mirrored.length ? clipUnion([...joined, ...mirrored]) : joined;
  return {
    ...extent(polygons),
    polygons,
    toleranceMm: profile.toleranceMm + HULL_TOL_MM / 2 + 2 * GROW_SIMPLIFY_MM + DEFAULT_CHORD_TOLERANCE_MM + GRID_MM,
    method: 'exact',
    lateralMm: { min: -lateral, max: lateral },
  };
}

function extent(polygons: Polygon2[]): { maxReach: number; zMin: number; zMax: number } {
  let maxReach = 0, zMin = Infinity, zMax = -Infinity;
  for (const p of polygons) {
    for (const [r, z] of p[0]) {
      maxReach = Math.max(maxReach, Math.abs(r));
      zMin = Math.min(zMin, z);
      zMax = Math.max(zMax, z);
    }
  }
  return polygons.length ? { maxReach, zMin, zMax } : { maxReach: 0, zMin: 0, zMax: 0 };
}

/* ---------------------------------------------------------------- scara (plan) */

/**
 * Region swept in plan by the segment from p to q turned about the origin over [a0, a1] (rad):
 * split where its distance from the origin is smallest, each part bounded by its two turned copies
 * and the arcs of its nearest and farthest points (exact; outer arcs circumscribed, inner inscribed).
 */
export function turnedSegmentSweep(p: Pt, q: Pt, a0: number, a1: number, tol = DEFAULT_CHORD_TOLERANCE_MM): Polygon2[] {
  const dx = q[0] - p[0], dy = q[1] - p[1];
  const len2 = dx * dx + dy * dy;
  const t = len2 > 0 ? Math.min(1, Math.max(0, -(p[0] * dx + p[1] * dy) / len2)) : 0;
  const m: Pt = [p[0] + t * dx, p[1] + t * dy];
  const pieces: Array<[Pt, Pt]> = [];
  if (t > 0) pieces.push([m, p]);
  if (t < 1) pieces.push([m, q]);
  const rot = (pt: Pt, a: number): Pt => [pt[0] * Math.cos(a) - pt[1] * Math.sin(a), pt[0] * Math.sin(a) + pt[1] * Math.cos(a)];
  const full = a1 - a0 >= TAU - 1e-12;
  const out: Polygon2[] = [];
  for (const [near, far] of pieces) {
    const rn = Math.hypot(near[0], near[1]);
    const rf = Math.hypot(far[0], far[1]);
    if (full) {
      const poly: Polygon2 = [circleRing(0, 0, rf, 'outer', tol)];
      if (rn > tol) poly.push(circleRing(0, 0, rn, 'inner', tol).reverse());
      out.push(poly);
      continue;
    }
    const phN = Math.atan2(near[1], near[0]);
    const phF = Math.atan2(far[1], far[0]);
    const ring: Pt[] = [rot(near, a0), rot(far, a0)];
    appendArc(ring, 0, 0, rf, phF + a0, phF + a1, 'outer', tol, true);
    ring.push(rot(near, a1));
    if (rn > 0) appendArc(ring, 0, 0, rn, phN + a1, phN + a0, 'inner', tol, true);
    out.push([ring]);
  }
  return out.length ? clipUnion(out) : [];
}

/** Plan sweeps of a scara's links over a kinematic J1 range (deg), arm frame, mm: link 1, link 2 (holes filled), tool and payload — each grown by its radius. */
export function scaraLinkSweeps(model: ScaraParams, j1KinDeg?: { min: number; max: number }, tol = DEFAULT_CHORD_TOLERANCE_MM): { inner: Polygon2[]; outer: Polygon2[]; tool: Polygon2[] } {
  const sizes = linkSizesOf(model);
  const j1 = j1KinDeg ?? axisKinematicRangeDeg(model.axes[0]);
  const j2 = axisKinematicRangeDeg(model.axes[1]);
  const a0 = toRadians(j1.min), a1 = toRadians(j1.max);
  const b0 = toRadians(j2.min), b1 = toRadians(j2.max);
  const l1 = model.innerLink, l2 = model.outerLink;
  const flange = scaraPlanRegion(model, j1, tol);
  const inner = grow([sectorPolygon(0, 0, l1, a0, a1, tol)], sizes.innerLinkRadius, tol);
  const e0: Pt = [l1, 0];
  const x: Polygon2[] = [...flange];
  for (const b of [b0, b1]) x.push(...turnedSegmentSweep(e0, [l1 + l2 * Math.cos(b), l2 * Math.sin(b)], a0, a1, tol));
  if (a1 - a0 < TAU - 1e-12) {
    for (const a of [a0, a1]) x.push(sectorPolygon(l1 * Math.cos(a), l1 * Math.sin(a), l2, a + b0, a + b1, tol));
  }
  const outer = grow(fillHoles(clipUnion(x)), sizes.outerLinkRadius, tol);
  const tool = grow(flange, Math.max(sizes.toolRadius, model.payloadRadius ?? 0), tol);
  return { inner, outer, tool };
}

/** A scara's plan envelope over a kinematic J1 range (deg): the union of its link sweeps, arm frame, mm. */
export function scaraPlanEnvelope(model: ScaraParams, j1KinDeg?: { min: number; max: number }, tol = DEFAULT_CHORD_TOLERANCE_MM): Polygon2[] {
  const { inner, outer, tool } = scaraLinkSweeps(model, j1KinDeg, tol);
  return clipUnion([...inner, ...outer, ...tool]);
}

function scaraEnvelope(model: ScaraParams): EnvelopeProfile {
  const sizes = linkSizesOf(model);
  const plan = scaraPlanEnvelope(model);
  let maxReach = 0;
  for (const p of plan) for (const [x, y] of p[0]) maxReach = Math.max(maxReach, Math.hypot(x, y));
  const zMin = model.strokeMin - (model.toolLength ?? 0) - (model.payloadRadius ?? 0);
  const zMax = model.strokeMax + Math.max(sizes.innerLinkRadius, sizes.outerLinkRadius, sizes.toolRadius);
  const ring: Ring = [
    [0, zMin],
    [maxReach, zMin],
    [maxReach, zMax],
    [0, zMax],
  ];
  return { polygons: [[ring]], toleranceMm: DEFAULT_CHORD_TOLERANCE_MM, method: 'exact', lateralMm: { min: 0, max: 0 }, maxReach, zMin, zMax, plan };
}

/* ---------------------------------------------------------------- chain (sampled) */

/** Lattice poses at most; the allowance δ follows from it. */
const CHAIN_LATTICE_POSES = 16_000;

/**
 * Squared Euclidean distance transform (cells²) of a binary raster: for every cell, the squared
 * distance to the nearest marked cell (1e20 when none is marked). Rows first, by two scans for the
 * nearest marked cell of the row; then columns, by the lower envelope of parabolas
 * (Felzenszwalb–Huttenlocher) over the cells whose row distance is finite.
 */
export function squaredDistanceTransform(mask: Uint8Array, w: number, h: number): Float64Array {
  const out = new Float64Array(w * h);
  distanceTransform(mask, w, h, out, null, 0);
  return out;
}

/** Marks in `into` every cell within `limit` cells (Euclidean) of a marked cell of `mask` (the transform above, thresholded as it is written). */
export function markWithinDistance(mask: Uint8Array, w: number, h: number, limit: number, into: Uint8Array): void {
  distanceTransform(mask, w, h, new Float64Array(w * h), into, limit * limit);
}

/** The transform into `out`; with `into`, the column pass marks the cells whose squared distance is ≤ lim2 instead of writing them to `out`. */
function distanceTransform(mask: Uint8Array, w: number, h: number, out: Float64Array, into: Uint8Array | null, lim2: number): void {
  const INF = 1e20;
  // rows with no marked cell are left out of the column pass (their distances are all INF)
  const marked = new Uint8Array(h);
  for (let j = 0; j < h; j++) {
    const row = j * w;
    if (mask.subarray(row, row + w).indexOf(1) < 0) continue;
    marked[j] = 1;
    let last = -1;
    for (let i = 0; i < w; i++) {
      if (mask[row + i]) last = i;
      out[row + i] = last < 0 ? INF : i - last;
    }
    last = -1;
    for (let i = w - 1; i >= 0; i--) {
      if (mask[row + i]) last = i;
      let d = out[row + i];
      if (last >= 0 && last - i < d) d = last - i;
      out[row + i] = d * d;
    }
  }
  const f = new Float64Array(h), zz = new Float64Array(h + 1);
  const v = new Int32Array(h);
  for (let i = 0; i < w; i++) {
    // lower envelope of the parabolas (q − y)² + f[q] of the finite cells q of column i
    let k = -1;
    for (let q = 0, c = i; q < h; q++, c += w) {
      if (!marked[q]) continue;
      const fq = out[c];
      f[q] = fq;
      if (fq >= INF) continue;
      if (k < 0) {
        k = 0;
        v[0] = q;
        zz[0] = -INF;
        zz[1] = INF;
        continue;
      }
      const gq = fq + q * q;
      let s = (gq - (f[v[k]] + v[k] * v[k])) / (2 * q - 2 * v[k]);
      while (s <= zz[k]) {
        k--;
        s = (gq - (f[v[k]] + v[k] * v[k])) / (2 * q - 2 * v[k]);
      }
      k++;
      v[k] = q;
      zz[k] = s;
      zz[k + 1] = INF;
    }
    if (k < 0) {
      // no marked cell in the whole raster
      if (!into) for (let q = 0, c = i; q < h; q++, c += w) out[c] = INF;
      continue;
    }
    k = 0;
    for (let q = 0, c = i; q < h; q++, c += w) {
      while (zz[k + 1] < q) k++;
      const dq = q - v[k];
      const d = dq * dq + f[v[k]];
      if (into) {
        if (d <= lim2) into[c] = 1;
      } else out[c] = d;
    }
  }
}

function chainEnvelope(p: ChainParams): EnvelopeProfile {
  const sizes = linkSizesOf(p);
  const n = p.joints.length;
  const w = n >= 6 ? 4 : n;
  const dh = chainDhJoints(p);
  // everything beyond the wrist point stays within the sum of the link lengths after it (triangle inequality)
  let tail = Math.hypot(p.tool.x, p.tool.y, p.tool.z) + (p.toolLength ?? 0);
  for (let i = w; i < n; i++) {
    const j = p.joints[i];
    const dMax = j.type === 'prismatic' ? Math.max(...[j.min, j.max].map((v) => Math.abs(j.d + chainJointVariable(j, v)))) : Math.abs(j.d);
    tail += Math.hypot(j.a, dMax);
  }
  const rTail = tail + Math.max(sizes.linkRadius, sizes.toolRadius, p.payloadRadius ?? 0);
  const rLink = sizes.linkRadius;
  // controller ranges: J1 at kinematic 0, joints 2…w over their limits
  const j0 = p.joints[0];
  const c1 = -((j0.zeroOffset ?? 0) + j0.theta) / (j0.direction ?? 1);
  const standard = p.convention === 'standard';
  const link: Mat4 = new Float64Array(16), a: Mat4 = mat4Identity(), b: Mat4 = new Float64Array(16);
  const pts = new Float64Array(3 * w);
  const q = new Float64Array(n);
  /** Origins of frames 1…w for controller values q (only the first w used), arm frame. */
  const origins = (out: Float64Array) => {
    mat4Identity(a);
    let cur = a, nxt = b;
    for (let i = 0; i < w; i++) {
      const jd = dh[i];
      const v = chainJointVariable(p.joints[i], q[i]);
      const th = jd.kind === 'revolute' ? jd.theta + v : jd.theta;
      const d = jd.kind === 'prismatic' ? jd.d + v : jd.d;
      if (standard) standardDhTransform(th, d, jd.a, jd.alpha, link);
      else modifiedDhTransform(jd.alpha, jd.a, th, d, link);
      mat4Multiply(cur, link, nxt);
      const t = cur;
      cur = nxt;
      nxt = t;
      out[3 * i] = cur[3];
      out[3 * i + 1] = cur[7];
      out[3 * i + 2] = cur[11];
    }
  };
  q[0] = c1;
  const mids = p.joints.map((j) => (j.min + j.max) / 2);
  for (let i = 1; i < n; i++) q[i] = mids[i];
  // free joints: those among 2…w that move a frame origin up to the wrist
  const free: number[] = [];
  const base = new Float64Array(3 * w), moved = new Float64Array(3 * w);
  for (let i = 1; i < w; i++) {
    let moves = false;
    for (const f of [0.2, 0.5, 0.8]) {
      for (let k = 1; k < n; k++) q[k] = p.joints[k].min + f * (p.joints[k].max - p.joints[k].min);
      origins(base);
      q[i] += 1e-3 * (p.joints[i].max - p.joints[i].min);
      origins(moved);
      for (let k = 0; k < 3 * w; k++) if (Math.abs(moved[k] - base[k]) > 1e-9) moves = true;
    }
    if (moves) free.push(i);
  }
  for (let i = 1; i < n; i++) q[i] = mids[i];
  // sensitivity per free joint: largest movement of any origin per unit of the joint's range
  const sens = free.map(() => 0);
  const probes = 64;
  for (let s = 0; s < probes; s++) {
    for (let f = 0; f < free.length; f++) {
      const j = p.joints[free[f]];
      q[free[f]] = j.min + (((s * (2 * f + 3) * 0.6180339887) % 1) + 1) % 1 * (j.max - j.min);
    }
    origins(base);
    for (let f = 0; f < free.length; f++) {
      const j = p.joints[free[f]];
      const keep = q[free[f]];
      const h = 1e-4 * (j.max - j.min);
      q[free[f]] = keep + (keep + h <= j.max ? h : -h);
      origins(moved);
      q[free[f]] = keep;
      for (let k = 0; k < w; k++) {
        const dd = Math.hypot(moved[3 * k] - base[3 * k], moved[3 * k + 1] - base[3 * k + 1], moved[3 * k + 2] - base[3 * k + 2]) / 1e-4;
        if (dd > sens[f]) sens[f] = dd;
      }
    }
  }
  // 10 % above the measured sensitivity, for the curvature between probes
  for (let f = 0; f < sens.length; f++) sens[f] *= 1.1;
  // nodes per free joint in proportion to its sensitivity, within the pose budget
  const nodesAt = (sc: number) => sens.map((sv) => Math.max(2, Math.ceil(sv * sc) + 1));
  const total = (ns: number[]) => ns.reduce((x, y) => x * y, 1);
  let lo = 0, hi = 1;
  while (total(nodesAt(hi)) <= CHAIN_LATTICE_POSES && hi < 1e6) hi *= 2;
  for (let it = 0; it < 40; it++) {
    const mid = (lo + hi) / 2;
    if (total(nodesAt(mid)) <= CHAIN_LATTICE_POSES) lo = mid;
    else hi = mid;
  }
  const nodes = nodesAt(lo);
  // a pose lies within half a lattice step of its nearest node in every free joint
  const delta = sens.reduce((acc, sv, f) => acc + sv / (2 * (nodes[f] - 1)), 0);
  // pass 1: every lattice pose's origins
  const poses = total(nodes);
  const all = new Float64Array(3 * w * poses);
  const idx = new Array<number>(free.length).fill(0);
  for (let m = 0; m < poses; m++) {
    let rest = m;
    for (let f = 0; f < free.length; f++) {
      idx[f] = rest % nodes[f];
      rest = Math.floor(rest / nodes[f]);
      const j = p.joints[free[f]];
      q[free[f]] = j.min + (idx[f] / (nodes[f] - 1)) * (j.max - j.min);
    }
    origins(pts);
    all.set(pts, 3 * w * m);
  }
  let rMin = Infinity, rMax = -Infinity, zMin = Infinity, zMax = -Infinity;
  for (let k = 0; k < all.length; k += 3) {
    const r = Math.sqrt(all[k] * all[k] + all[k + 1] * all[k + 1]);
    rMin = Math.min(rMin, all[k] >= 0 ? r : -r);
    rMax = Math.max(rMax, all[k] >= 0 ? r : -r);
    zMin = Math.min(zMin, all[k + 2]);
    zMax = Math.max(zMax, all[k + 2]);
  }
  const span = Math.max(rMax - rMin, zMax - zMin) + 2 * rTail;
  const cell = Math.max(2, span / 600);
  const pad = Math.max(rTail, rLink) + delta + 6 * cell;
  const r0 = Math.min(rMin, -rMax) - pad, z0 = zMin - pad;
  const W = Math.ceil((Math.max(rMax, -rMin) - r0 + pad) / cell) + 1;
  const H = Math.ceil((zMax + pad - z0) / cell) + 1;
  const linkMask = new Uint8Array(W * H), tailMask = new Uint8Array(W * H);
  let yLo = Infinity, yHi = -Infinity;
  /** Spacing of the stamped points along a link, mm (a point of the link lies within half of it of one). */
  const spacing = 2 * cell;
  const stamp = (mask: Uint8Array, x: number, y: number, z: number, mirrorWithin: number) => {
    const rho = Math.sqrt(x * x + y * y);
    const r = x >= 0 ? rho : -rho;
    const row = Math.floor((z - z0) / cell) * W;
    mask[row + Math.floor((r - r0) / cell)] = 1;
    // a ball that crosses the plane x = 0 maps partly to the other sign of r: stamp the mirror too
    if (x <= mirrorWithin && x >= -mirrorWithin) mask[row + Math.floor((-r - r0) / cell)] = 1;
  };
  const linkMirror = rLink + delta + spacing / 2 + cell;
  const tailMirror = rTail + delta + cell;
  // link k (origin k to origin k + 1) moves only with joints 1 … k + 1: it is the same in every pose
  // whose later free joints sit at their first node, i.e. in the first linkPoses[k] poses (the first
  // free joint's index runs fastest), so it is stamped in those alone
  const linkPoses = Array.from({ length: Math.max(0, w - 1) }, (_, k) =>
    free.reduce((acc, jf, f) => (jf <= k + 1 ? acc * nodes[f] : acc), 1),
  );
  for (let m = 0; m < poses; m++) {
    const o = 3 * w * m;
    for (let k = 0; k < w; k++) {
      // side distance is linear along a link: its extremes are at the joint points
      const y = all[o + 3 * k + 1];
      const rad = k === w - 1 ? rTail : rLink;
      if (y - rad < yLo) yLo = y - rad;
      if (y + rad > yHi) yHi = y + rad;
    }
    for (let k = 0; k + 1 < w; k++) {
      if (m >= linkPoses[k]) continue;
      const ax = all[o + 3 * k], ay = all[o + 3 * k + 1], az = all[o + 3 * k + 2];
      const dx = all[o + 3 * k + 3] - ax, dy = all[o + 3 * k + 4] - ay, dz = all[o + 3 * k + 5] - az;
      const steps = Math.max(1, Math.ceil(Math.sqrt(dx * dx + dy * dy + dz * dz) / spacing));
      for (let s = 0; s <= steps; s++) {
        const t = s / steps;
        stamp(linkMask, ax + t * dx, ay + t * dy, az + t * dz, linkMirror);
      }
    }
    stamp(tailMask, all[o + 3 * w - 3], all[o + 3 * w - 2], all[o + 3 * w - 1], tailMirror);
  }
  // a capsule point lies within radius + δ (lattice) + spacing/2 of a stamped point, and two cell
  // centres within √2·cell of their points
  const grown = new Uint8Array(W * H);
  for (const [mask, radius] of [
    [linkMask, w > 1 ? rLink : -1],
    [tailMask, rTail],
  ] as Array<[Uint8Array, number]>) {
    if (radius < 0) continue;
    markWithinDistance(mask, W, H, (radius + delta + (radius === rTail ? 0 : spacing / 2) + Math.SQRT2 * cell) / cell, grown);
  }
  // one more cell, so the traced iso-line passes outside every marked cell
  const dil = new Uint8Array(W * H);
  for (let j = 1; j < H - 1; j++) {
    for (let i = 1; i < W - 1; i++) {
      const c = j * W + i;
      if (grown[c] || grown[c - 1] || grown[c + 1] || grown[c - W] || grown[c + W] || grown[c - W - 1] || grown[c - W + 1] || grown[c + W - 1] || grown[c + W + 1]) dil[c] = 1;
    }
  }
  const [multi] = contours().size([W, H]).thresholds([0.5])(dil as unknown as number[]);
  const polygons: Polygon2[] = multi.coordinates.map((poly) => poly.map((ring): Ring => ring.slice(0, -1).map(([gx, gy]) => [r0 + gx * cell, z0 + gy * cell] as Pt)));
  return {
    ...extent(polygons),
    polygons,
    toleranceMm: Math.ceil(delta + spacing / 2 + 3 * cell),
    method: 'sampled',
    lateralMm: { min: yLo - delta, max: yHi + delta },
  };
}

/* ---------------------------------------------------------------- entry points */

/** The whole-arm envelope profile, built afresh (the tool-point profile it starts from is cached), mm. */
export function buildEnvelopeProfile(model: ArmParams): EnvelopeProfile {
  if (model.family === 'scara') return scaraEnvelope(model);
  if (model.family === 'chain') return chainEnvelope(model);
  return planarEnvelope(model);
}

const ENVELOPE_CACHE_SIZE = 64;
const envelopeCache = new Map<string, EnvelopeProfile>();

/** The whole-arm envelope profile of any family (see the file comment), computed once per distinct parameter set, mm. */
export function envelopeProfileOf(model: ArmParams): EnvelopeProfile {
  const key = canonicalJson(model);
  const hit = envelopeCache.get(key);
  if (hit) {
    envelopeCache.delete(key);
    envelopeCache.set(key, hit);
    return hit;
  }
  const env = buildEnvelopeProfile(model);
  envelopeCache.set(key, env);
  while (envelopeCache.size > ENVELOPE_CACHE_SIZE) envelopeCache.delete(envelopeCache.keys().next().value as string);
  return env;
}
