import { toRadians } from '../geometry/angles';
import { appendArc, circleRing } from '../geometry/arc';
import { clipIntersect, clipOffset, clipUnion } from '../geometry/clipper';
import { polygonsToGeoJSON, type AreaGeometry } from '../geometry/geojson';
import { DEFAULT_CHORD_TOLERANCE_MM } from '../geometry/tolerance';
import type { Polygon2, Pt } from '../geometry/types';
import type { ArmParams, ScaraParams } from '../schemas/armModel';
import { familyOf, reachProfileOf } from './families';
import { profileProjection, profileSliceAt } from './profile';
import { scaraPlanRegion } from './scara';

/**
 * Plan regions of an arm in its ARM frame (origin on the J1 axis at the base plate, x along J1's
 * kinematic zero), planar mm, as polygons or GeoJSON. `placeRegion` puts them on the plan.
 *
 * Reading of the spaces (documented choice, docs/kinematics.md "Plan regions"):
 * - Reach band at height z (the TOOL POINT's height): the profile is of the flange/wrist point and
 *   the tool points straight down by toolLength (scara/articulated/linkage), so the profile is
 *   sliced at z + toolLength; a chain's profile is of its tool point and is sliced at z. The radial
 *   intervals become annular sectors over the J1 range (negative r: turned 180°). A scara's band is
 *   its planar 2R region whenever the flange height is inside the stroke.
 * - Maximum space: the profile projected over all heights (a down-pointing tool only extends the
 *   profile downward, which does not change its plan projection) over the full J1 range, grown in
 *   plan by payloadRadius — and, for articulated and chain arms, by toolLength as well, because a
 *   wrist can tilt the tool. Restricted space: the same under the placement's restricting J1 limits.
 * - The arm's own link bodies and base are not part of these regions (they are tool/payload
 *   envelopes); plan sheets carry the caution that regions are planning estimates.
 * Arcs: outer arcs circumscribed, inner arcs inscribed (chord tolerance 1 mm), erring toward space.
 */

/** Restricting J1 limits set on a placement, controller degrees. */
export interface J1Restrict {
  j1Min: number;
  j1Max: number;
}

/** J1 limits of a model in controller degrees. */
export function j1ControllerLimits(model: ArmParams): { min: number; max: number } {
  if (model.family === 'chain') return { min: model.joints[0].min, max: model.joints[0].max };
  return { min: model.axes[0].min, max: model.axes[0].max };
}

/**
 * Kinematic J1 range (degrees) of a model, narrowed by restricting controller limits when given
 * (intersected with the model's own); throws when they do not overlap.
 */
export function j1KinematicRange(model: ArmParams, restrict?: Readonly<J1Restrict> | null): { min: number; max: number } {
  const fam = familyOf(model);
  if (!restrict) return fam.j1Range(model);
  const own = j1ControllerLimits(model);
  const min = Math.max(own.min, restrict.j1Min);
  const max = Math.min(own.max, restrict.j1Max);
  if (!(Number.isFinite(min) && Number.isFinite(max)) || !(min < max)) {
    throw new Error(`restrict: J1 ${restrict.j1Min}…${restrict.j1Max}° does not overlap the model's J1 range ${own.min}…${own.max}°`);
  }
  const narrowed: ArmParams =
    model.family === 'chain'
      ? { ...model, joints: [{ ...model.joints[0], min, max }, ...model.joints.slice(1)] }
      : ({ ...model, axes: [{ ...model.axes[0], min, max }, ...model.axes.slice(1)] } as ArmParams);
  return fam.j1Range(narrowed);
}

/** How far below the profile point the tool point hangs, mm (toolLength for the down-pointing families, 0 for chain). */
export function toolDrop(model: ArmParams): number {
  return model.family === 'chain' ? 0 : (model.toolLength ?? 0);
}

/** Plan growth of the spaces, mm: payloadRadius, plus toolLength where the tool can tilt (articulated, chain). */
export function spaceGrowth(model: ArmParams): number {
  const tool = model.toolLength ?? 0;
  const payload = model.payloadRadius ?? 0;
  return model.family === 'articulated' || model.family === 'chain' ? tool + payload : payload;
}

/**
 * Plan region swept by the in-plane radial interval [r0, r1] (signed r, mm) of a reach plane offset
 * laterally by e (mm) as its bearing turns over [a0, a1] (radians): annular sectors for e = 0
 * (negative r turned 180°), sectors with edges turned by atan2(e, r) otherwise.
 */
export function bandSectors(r0: number, r1: number, a0: number, a1: number, e = 0, tol = DEFAULT_CHORD_TOLERANCE_MM): Polygon2[] {
  const out: Polygon2[] = [];
  const parts: Array<[number, number]> = r0 < 0 && r1 > 0 ? [[r0, 0], [0, r1]] : [[r0, r1]];
  const full = a1 - a0 >= 2 * Math.PI - 1e-12;
  for (const [p0, p1] of parts) {
    if (!(p1 > p0)) continue;
    const outerR = Math.abs(p1) >= Math.abs(p0) ? p1 : p0;
    const innerR = outerR === p1 ? p0 : p1;
    const rhoOut = Math.hypot(outerR, e);
    const rhoIn = p0 < 0 && p1 > 0 ? Math.abs(e) : Math.min(Math.hypot(p0, e), Math.hypot(p1, e));
    if (full) {
      const poly: Polygon2 = [circleRing(0, 0, rhoOut, 'outer', tol)];
      if (rhoIn > tol) poly.push(circleRing(0, 0, rhoIn, 'inner', tol).reverse());
      out.push(poly);
      continue;
    }
    const dOut = Math.atan2(e, outerR);
    const dIn = Math.atan2(e, innerR);
    const ring: Pt[] = [];
    appendArc(ring, 0, 0, rhoOut, a0 + dOut, a1 + dOut, 'outer', tol);
    const rhoInner = Math.hypot(innerR, e);
    if (rhoInner > 0) appendArc(ring, 0, 0, rhoInner, a1 + dIn, a0 + dIn, 'inner', tol);
    else ring.push([0, 0]);
    out.push([ring]);
  }
  return out;
}

/**
 * Sectors of profile intervals over a J1 range. Profile r carries the plan distance from the J1 axis
 * (sign = side); with a lateral offset e the in-plane radius is ±√(r² − e²).
 */
function sectorsOver(intervals: ReadonlyArray<[number, number]>, range: { min: number; max: number }, e: number, tol: number): Polygon2[] {
  const a0 = toRadians(range.min);
  const a1 = toRadians(range.max);
  const inPlane = (r: number) => (e === 0 ? r : Math.sign(r) * Math.sqrt(Math.max(0, r * r - e * e)));
  const polys: Polygon2[] = [];
  for (const [r0, r1] of intervals) polys.push(...bandSectors(inPlane(r0), inPlane(r1), a0, a1, e, tol));
  return polys.length ? clipUnion(polys) : [];
}

function grow(polys: Polygon2[], by: number, tol: number): Polygon2[] {
  if (!(by > 0) || polys.length === 0) return polys;
  return clipOffset(polys, by, { join: 'round', arcToleranceMm: Math.min(tol, by / 4) });
}

/** Reach band of the tool point at arm-frame height zArm (mm) over the (restricted) J1 range: plan polygons, arm frame, mm. */
export function bandPolygons(model: ArmParams, zArm: number, restrict?: Readonly<J1Restrict> | null, tol = DEFAULT_CHORD_TOLERANCE_MM): Polygon2[] {
  if (!Number.isFinite(zArm)) throw new Error('zArm must be a finite number');
  const range = j1KinematicRange(model, restrict);
  const zFlange = zArm + toolDrop(model);
  if (model.family === 'scara') {
    const s = model as ScaraParams;
    if (zFlange < s.strokeMin || zFlange > s.strokeMax) return [];
    return scaraPlanRegion(s, range, tol);
  }
  const profile = reachProfileOf(model);
  return sectorsOver(profileSliceAt(profile, zFlange), range, familyOf(model).lateralOffset(model), tol);
}

/** Space (tool and payload envelope) over all heights under the given J1 range, plan polygons, arm frame, mm. */
function spacePolygons(model: ArmParams, range: { min: number; max: number }, zTop: number, tol: number): Polygon2[] {
  let base: Polygon2[];
  if (model.family === 'scara') {
    const s = model as ScaraParams;
    const lowest = s.strokeMin - toolDrop(model) - (s.payloadRadius ?? 0);
    base = zTop >= lowest ? scaraPlanRegion(s, range, tol) : [];
  } else {
    const profile = reachProfileOf(model);
    // A part of the space below zTop comes from profile points up to zTop + tool drop (+ payload).
    const zCut = zTop + toolDrop(model) + (model.payloadRadius ?? 0);
    let polys = profile.polygons;
    if (zCut < profile.zMax) {
      const r = profile.maxReach + 10;
      const box: Polygon2 = [[[-r, profile.zMin - 10], [r, profile.zMin - 10], [r, zCut], [-r, zCut]]];
      polys = zCut <= profile.zMin ? [] : clipIntersect(profile.polygons, [box]);
    }
    base = sectorsOver(profileProjection({ polygons: polys }), range, familyOf(model).lateralOffset(model), tol);
  }
  return grow(base, spaceGrowth(model), tol);
}

/** Maximum space in plan over the model's full J1 range (see the file comment), arm frame, mm. */
export function maximumSpacePolygons(model: ArmParams, tol = DEFAULT_CHORD_TOLERANCE_MM): Polygon2[] {
  return spacePolygons(model, j1KinematicRange(model), Infinity, tol);
}

/** Restricted space in plan under the placement's restricting J1 limits (controller degrees), arm frame, mm. */
export function restrictedSpacePolygons(model: ArmParams, restrict?: Readonly<J1Restrict> | null, tol = DEFAULT_CHORD_TOLERANCE_MM): Polygon2[] {
  return spacePolygons(model, j1KinematicRange(model, restrict), Infinity, tol);
}

/** Plan projection of the part of the restricted space below arm-frame height zArmTop (mm), arm frame, mm. */
export function restrictedBelowPolygons(model: ArmParams, zArmTop: number, restrict?: Readonly<J1Restrict> | null, tol = DEFAULT_CHORD_TOLERANCE_MM): Polygon2[] {
  if (Number.isNaN(zArmTop)) throw new Error('zArmTop must be a number');
  return spacePolygons(model, j1KinematicRange(model, restrict), zArmTop, tol);
}

/** Reach band at arm-frame height zArm of the tool point as planar GeoJSON in the arm frame, mm. */
export function bandAt(model: ArmParams, zArm: number, restrict?: Readonly<J1Restrict> | null): AreaGeometry {
  return polygonsToGeoJSON(bandPolygons(model, zArm, restrict));
}
