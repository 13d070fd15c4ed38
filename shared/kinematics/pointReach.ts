import { canonicalJson } from '../canonicalJson';
import { toRadians } from '../geometry/angles';
import { clipOffset } from '../geometry/clipper';
import { buildDistanceGrid, type DistanceGrid } from '../geometry/distanceGrid';
import { simplifyPolygonsOutward } from '../geometry/simplify';
import { armPose } from '../geometry/frames';
import { planPoint, type Polygon2 } from '../geometry/types';
import type { ArmParams, ScaraParams } from '../schemas/armModel';
import type { ReachProfile } from './types';
import { reachProfileOf } from './families';
import { bandPolygons, j1KinematicRange, restrictedBelowPolygons, restrictedSpacePolygons, toolDrop, toolLateralSpread, type J1Restrict } from './planRegions';
import { envelopeProfileOf, type EnvelopeProfile } from './envelope';
import { scaraPlanRegion } from './scara';

/**
 * Coverage of a work point: a cheap, exact test in the arm's own frame against a region built once
 * per (model, restricting limits).
 * - articulated, linkage, chain: the point's bearing must lie in the (restricted) J1 range — or in
 *   the range turned by 180° for negative r, considered only when the profile reaches behind the
 *   J1 axis — and its (r, z) inside the profile; a chain with a
 *   lateral offset e reaches the point at in-plane r = ±√(ρ² − e²) with J1 = bearing − atan2(e, r).
 * - scara: the plan position against the arm-frame 2R region (restricted J1 included), the height
 *   against the stroke.
 * - Default 'top' approach: the tool points down, so the flange target is z + toolLength. 'any':
 *   for articulated and chain arms the tool may point any way in the reach plane, so the point must
 *   lie within toolLength of the profile (the profile grown by toolLength); scara and linkage tools
 *   are held vertical by construction, so 'any' is the same as 'top'.
 * Margin: signed distance to the boundary in mm (negative outside). The J1-limit edges count as
 * arc lengths at the point's radius; inside both, the smaller of the two distances; outside one,
 * that (negative) distance; outside both, −√(a² + b²).
 * One check is a grid lookup plus a few edge distances (DistanceGrid); the second way to a bearing
 * is looked up only when the grid's edge-free upper bound says it could win. A sampled (chain)
 * outline is first simplified outward (see outlineSimplifyMm).
 */

/** A point in the arm frame, mm; approach default 'top'. */
export interface ArmTarget {
  x: number;
  y: number;
  z: number;
  approach?: 'top' | 'any';
}

/** A point in the plan frame, mm (z above finished floor level); approach default 'top'. */
export interface PlanTarget {
  x: number;
  y: number;
  z: number;
  approach?: 'top' | 'any';
}

/** Result of a coverage check: reached, and the signed distance to the reach boundary, mm. */
export interface PointReachResult {
  reached: boolean;
  marginMm: number;
}

/** Where an arm stands on the plan: position (mm), yaw (deg CCW from +x), mount height (mm), restricting J1 limits (controller deg). */
export interface ReachPlacement {
  /** Field names as in the layout JSON: x, y and mountHeight in mm, yaw in degrees. */
  x: number;
  y: number;
  yaw: number;
  mountHeight: number;
  restrict?: J1Restrict | null;
}

/**
 * The one rule for "reached": a signed margin (mm) of zero or more. It lives here, where margins
 * are defined, because the kinematics layer may not import the analysis; `shared/analysis`
 * re-exports it, and the editor, the plan sheet and the CSV use it from there.
 */
export function isReached(marginMm: number): boolean {
  return marginMm >= 0;
}

/** Hot-loop form: margin only (mm, ≥ 0 reached) of an arm-frame point. */
export type MarginFn = (x: number, y: number, z: number, approach?: 'top' | 'any') => number;

function combine(a: number, b: number): number {
  if (a >= 0 && b >= 0) return a < b ? a : b;
  if (a < 0 && b < 0) return -Math.sqrt(a * a + b * b);
  return a < b ? a : b;
}

/**
 * Douglas–Peucker tolerance for a sampled (chain) outline, mm: half a raster cell (a sixth of the
 * stated tolerance). The raster contour steps in diagonal zigzags of about a third of a cell; at
 * half a cell they go, and the outward simplification keeps the margin's region between the
 * profile's outline and one cell (a third of the stated tolerance) outside it, still containing
 * every sample.
 */
function outlineSimplifyMm(profile: ReachProfile): number {
  const cell = (profile as ReachProfile & { cellMm?: number }).cellMm;
  return (cell !== undefined && cell > 0 ? cell : profile.toleranceMm / 3) / 2;
}

/** Margin region (polygons and distance grid) of each cached reach profile. */
const regionCache = new WeakMap<ReachProfile, { polygons: Polygon2[]; grid: DistanceGrid }>();

const HALF_PI = Math.PI / 2;

function buildMargin(model: ArmParams, restrict: J1Restrict | null | undefined, shareRegion: boolean): MarginFn {
  const drop = toolDrop(model);
  if (model.family === 'scara') {
    const s = model as ScaraParams;
    const grid = buildDistanceGrid(scaraPlanRegion(s, j1KinematicRange(model, restrict)));
    const zLo = s.strokeMin;
    const zHi = s.strokeMax;
    const io = new Float64Array(3);
    return viaSlots(io, () => {
      const z = io[2];
      const zf = z + drop;
      const dz = zf - zLo < zHi - zf ? zf - zLo : zHi - zf;
      return combine(grid.signedDistance(io[0], io[1]), dz);
    });
  }
  const profile = reachProfileOf(model);
  const range = j1KinematicRange(model, restrict);
  // A point exactly on a J1 limit is reached: allow the same 1e-9 as the axis limit checks.
  const a0 = toRadians(range.min) - 1e-9;
  const a1 = toRadians(range.max) + 1e-9;
  // The tool point's side distance off the plane through J1 lies anywhere in [yLo, yHi] (a chain's
  // wrist swings it; 0 for the other families): the J1 window at plan distance ρ widens to
  // [a0 + asin(yLo/ρ), a1 + asin(yHi/ρ)] in front of the axis, [a0 + π − asin(yHi/ρ), a1 + π − asin(yLo/ρ)] behind it.
  const spread = toolLateralSpread(model);
  const yLo = spread.min;
  const yHi = spread.max;
  const sideways = yLo !== 0 || yHi !== 0;
  // The region and its grid depend on the profile alone, not on the restricting limits: shared.
  let region = shareRegion ? regionCache.get(profile) : undefined;
  if (!region) {
    const polys = profile.method === 'sampled' ? simplifyPolygonsOutward(profile.polygons, outlineSimplifyMm(profile)) : profile.polygons;
    region = { polygons: polys, grid: buildDistanceGrid(polys) };
    if (shareRegion) regionCache.set(profile, region);
  }
  const { polygons, grid } = region;
  const tiltable = model.family === 'articulated' || model.family === 'chain';
  const reachTool = model.toolLength ?? 0;
  let anyGrid: DistanceGrid | null = null;
  const anyGridOf = (): DistanceGrid => {
    if (!anyGrid) {
      const grown = clipOffset(polygons, reachTool, { join: 'round', arcToleranceMm: 0.25 });
      anyGrid = buildDistanceGrid(grown);
    }
    return anyGrid;
  };
  const hasNegative = polygons.some((p) => p[0].some(([r]) => r < 0));
  const TWO_PI = 2 * Math.PI;
  if (a1 - a0 >= TWO_PI - 1e-9) {
    // A full J1 window (widened further by any sideways spread): no J1 edge applies, so the margin
    // is the profile distance of the better way to the bearing, and no angle is needed.
    const io = new Float64Array(3);
    return viaSlots(io, (approach) => {
      const x = io[0];
      const y = io[1];
      const z = io[2];
      const tilt = approach === 'any' && tiltable && reachTool > 0;
      const g = tilt ? anyGridOf() : grid;
      const zt = tilt ? z : z + drop;
      const rho = Math.sqrt(x * x + y * y);
      if (rho < 1e-9) return g.signedDistance(0, zt);
      if (!hasNegative) return g.signedDistance(rho, zt);
      // The better way to the bearing, the second looked up only when the grid's bound says it could win.
      return g.maxMirrored(rho, zt);
    });
  }
  /** Arc length (mm) at radius rho from bearing b to the nearer edge of the window [lo, hi]: positive inside, negative outside. */
  const arcIn = (b: number, lo: number, hi: number, rho: number): number => {
    const span = hi - lo;
    if (span >= TWO_PI - 1e-9) return Infinity;
    let t = b - lo;
    t -= TWO_PI * Math.floor(t / TWO_PI);
    if (t <= span) return rho * (t < span - t ? t : span - t);
    const o = t - span;
    const u = TWO_PI - t;
    return -rho * (o < u ? o : u);
  };
  const asinClamped = (v: number) => Math.asin(v > 1 ? 1 : v < -1 ? -1 : v);
  // A fixed window [a0, a1] (no sideways spread): the arc margin is ρ·(half-span − φ) with φ ∈ [0, π]
  // the angle between the point's bearing and the window's centre line, and behind the axis
  // (window turned by π) ρ·(half-span − (π − φ)): one atan2 serves both ways.
  const half = (a1 - a0) / 2;
  const cc = Math.cos(a0 + half);
  const sc = Math.sin(a0 + half);
  /** J1 arc margins of the way in front of the axis (A) and behind it (B) for a point at bearing b, plan distance rho (sideways spread only). */
  const arcFront = (b: number, rho: number): number => arcIn(b, a0 + asinClamped(yLo / rho), a1 + asinClamped(yHi / rho), rho);
  const arcBack = (b: number, rho: number): number => arcIn(b, a0 + Math.PI - asinClamped(yHi / rho), a1 + Math.PI - asinClamped(yLo / rho), rho);
  const io = new Float64Array(3);
  return viaSlots(io, (approach) => {
    const x = io[0];
    const y = io[1];
    const z = io[2];
    const tilt = approach === 'any' && tiltable && reachTool > 0;
    const g = tilt ? anyGridOf() : grid;
    const zt = tilt ? z : z + drop;
    const rho = Math.sqrt(x * x + y * y);
    // On the J1 axis every bearing is the same point: no J1 edge applies there.
    if (rho < 1e-9) return g.signedDistance(0, zt);
    // Profiles carry the plan distance from the J1 axis as |r|.
    let arcA: number;
    let arcB = 0;
    let bearing = 0;
    // The grid's bounds of both ways, taken once (NaN until then).
    let ubGA = NaN;
    let ubGB = NaN;
    if (sideways) {
      bearing = Math.atan2(y, x);
      arcA = arcFront(bearing, rho);
    } else {
      const crs = cc * y - sc * x;
      const dot = cc * x + sc * y;
      const ac = crs < 0 ? -crs : crs;
      // Lower bounds of both arcs without an angle (sin φ = ac/ρ; φ ≤ π/2·sin φ in front of the
      // centre line, φ ≤ π − sin φ behind it, and the mirror bounds for the way behind): an arc
      // at least as large as its way's distance (and ≥ 0) leaves combine() at that distance.
      const slack = 1e-9 * (1 + rho);
      const lbA = (dot >= 0 ? rho * half - HALF_PI * ac : rho * (half - Math.PI) + ac) - slack;
      if (!hasNegative) {
        const d = g.signedDistance(rho, zt);
        if (lbA >= (d > 0 ? d : 0)) return d;
        return combine(d, rho * (half - Math.atan2(ac, dot)));
      }
      const lbB = (dot >= 0 ? rho * (half - Math.PI) + ac : rho * half - HALF_PI * ac) - slack;
      ubGA = g.upperBound(rho, zt);
      ubGB = g.upperBoundMirrored(rho, zt);
      if (lbA >= (ubGA > 0 ? ubGA : 0) && lbB >= (ubGB > 0 ? ubGB : 0)) return g.maxMirroredWithin(rho, zt, ubGA, ubGB);
      const phi = Math.atan2(ac, dot);
      arcA = rho * (half - phi);
      arcB = rho * (half - Math.PI + phi);
    }
    if (!hasNegative) return combine(g.signedDistance(rho, zt), arcA);
    // combine(d, arc) ≤ min(d, arc), and the grid bounds d from above without visiting an edge, so
    // an option is looked up (or even its arc computed) only when its upper bound can beat the
    // other's margin.
    if (ubGA !== ubGA) {
      ubGA = g.upperBound(rho, zt);
      ubGB = g.upperBoundMirrored(rho, zt);
    }
    const gB = ubGB;
    const ubA = Math.min(arcA, ubGA);
    // With a sideways spread the way behind's arc costs two asin: worked out only when needed.
    let arcKnown = !sideways;
    if (!arcKnown && ubA < gB) {
      arcB = arcBack(bearing, rho);
      arcKnown = true;
    }
    const ubB = arcKnown ? Math.min(arcB, gB) : gB;
    const aFirst = ubA >= ubB;
    const first = aFirst ? rho : -rho;
    const m1 = combine(g.signedDistance(first, zt), aFirst ? arcA : arcB);
    if ((aFirst ? ubB : ubA) <= m1) return m1;
    if (!arcKnown) {
      arcB = arcBack(bearing, rho);
      if (arcB <= m1) return m1;
    }
    const m2 = combine(g.signedDistance(-first, zt), aFirst ? arcB : arcA);
    return m1 > m2 ? m1 : m2;
  });
}

/**
 * A margin function that hands its point to `margin` through io[0..2]. A number passed to a call
 * that is not inlined is boxed (one heap allocation each) and the margins themselves are too large
 * to inline; this small closure is inlined where a hot call site meets one margin function, and
 * where it is not, the point is boxed once, not again on the way into the margin.
 */
function viaSlots(io: Float64Array, margin: (approach?: 'top' | 'any') => number): MarginFn {
  return (x, y, z, approach) => {
    io[0] = x;
    io[1] = y;
    io[2] = z;
    return margin(approach);
  };
}

const marginCache = new WeakMap<object, Map<string, MarginFn>>();

/** The margin function of a model under restricting J1 limits, built once and cached (per model object). */
export function marginFnOf(model: ArmParams, restrict?: J1Restrict | null): MarginFn {
  let byRestrict = marginCache.get(model);
  if (!byRestrict) {
    byRestrict = new Map();
    marginCache.set(model, byRestrict);
  }
  const key = restrict ? `${restrict.j1Min}|${restrict.j1Max}` : '-';
  let fn = byRestrict.get(key);
  if (!fn) {
    fn = buildMargin(model, restrict, true);
    byRestrict.set(key, fn);
  }
  return fn;
}

/**
 * The margin function built afresh: the reach profile from its cache, the margin region and its
 * distance grid built anew and kept by nobody (what the first marginFnOf call of a model costs;
 * the kinematics benchmark times it).
 */
export function buildMarginFn(model: ArmParams, restrict?: J1Restrict | null): MarginFn {
  return buildMargin(model, restrict, false);
}

/** Coverage check of an arm-frame point for the hot loop: `(point) => {reached, marginMm}` (see the file comment). */
export function makePointReach(model: ArmParams, restrict?: J1Restrict | null): (point: Readonly<ArmTarget>) => PointReachResult {
  const margin = marginFnOf(model, restrict);
  return (p) => {
    const m = margin(p.x, p.y, p.z, p.approach);
    return { reached: isReached(m), marginMm: m };
  };
}

/** Coverage of a plan point (mm) by a placed arm: transform into the arm frame, then the cached region test. */
export function pointReach(model: ArmParams, placement: Readonly<ReachPlacement>, point: Readonly<PlanTarget>): PointReachResult {
  const pose = armPose(placement);
  const [u, v] = pose.toArm(planPoint(point.x, point.y));
  const m = marginFnOf(model, placement.restrict)(u, v, pose.toArmZ(point.z), point.approach);
  return { reached: isReached(m), marginMm: m };
}

/** The whole-arm envelope as the analysis hands it on: (r, z) profile, tolerance, J1 range and sideways spread. */
export interface ArmEnvelope {
  /** (r, z) arm frame, mm: r the signed plan distance from the J1 axis, z above the base plate. */
  profile: Polygon2[];
  toleranceMm: number;
  /** Kinematic J1 range, degrees, restricting limits applied. */
  j1RangeDeg: { min: number; max: number };
  /** Sideways spread of the reach plane's points off the plane through J1, mm. */
  lateralMm: { min: number; max: number };
}

/**
 * Everything the layout analysis needs of one model under restricting limits, arm frame, mm:
 * restricted space (the whole-arm envelope), bands and margins (the tool point), the restricted
 * space below a height, and the envelope's vertical extent and (r, z) profile.
 */
export function armReach(model: ArmParams, restrict?: J1Restrict | null) {
  const restricted = restrictedSpacePolygons(model, restrict);
  let maxReach = 0;
  for (const p of restricted) for (const [x, y] of p[0]) maxReach = Math.max(maxReach, Math.hypot(x, y));
  const env: EnvelopeProfile = envelopeProfileOf(model);
  const margin = marginFnOf(model, restrict);
  const envelope: ArmEnvelope = {
    profile: env.polygons,
    toleranceMm: env.toleranceMm,
    j1RangeDeg: j1KinematicRange(model, restrict),
    lateralMm: { ...env.lateralMm },
  };
  return {
    key: canonicalJson({ model, restrict: restrict ?? null }),
    maxReach,
    zMin: env.zMin,
    zMax: env.zMax,
    restricted,
    envelope,
    bandAt: (zArm: number): Polygon2[] => bandPolygons(model, zArm, restrict),
    restrictedBelow: (zArmTop: number): Polygon2[] => restrictedBelowPolygons(model, zArmTop, restrict),
    margin: (x: number, y: number, z: number, approach: 'top' | 'any' = 'top'): number => margin(x, y, z, approach),
  };
}
