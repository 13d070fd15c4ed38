import { toRadians } from '../geometry/angles';
import { appendArc, circleRing } from '../geometry/arc';
import { clipIntersect, clipUnion } from '../geometry/clipper';
import { polygonsToGeoJSON, type AreaGeometry } from '../geometry/geojson';
import { DEFAULT_CHORD_TOLERANCE_MM } from '../geometry/tolerance';
import type { Polygon2, Pt } from '../geometry/types';
import type { ArmParams, ScaraParams } from '../schemas/armModel';
import { ReadableError } from '../schemas/errors';
import { withUnit } from '../schemas/labels';
import { familyOf, reachProfileOf } from './families';
import { profileProjection, profileSliceAt } from './profile';
import { scaraPlanRegion } from './scara';
import { envelopeProfileOf, scaraPlanEnvelope } from './envelope';
import type { ReachProfile } from './types';

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
 * - Maximum space: the whole-arm envelope (envelope.ts: links, tool and payload as capsules) projected
 *   over all heights and turned over the full J1 range, its edges moved out by the envelope's
 *   sideways spread. Restricted space: the same under the placement's restricting J1 limits. A
 *   scara's is the union of its links' plan sweeps. The base below the J2 axis is not included.
 * - A chain's tool point swings to the side of the plane through J1: bands turn their edges by its
 *   full sideways spread over the sampled poses (spreadSectors).
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
    throw new ReadableError(`its J1 limits ${withUnit(restrict.j1Min, '°')} to ${withUnit(restrict.j1Max, '°')} do not overlap the arm model's J1 range ${withUnit(own.min, '°')} to ${withUnit(own.max, '°')}`);
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
 * Plan region swept by the radial interval [r0, r1] (signed plan distance from the J1 axis, mm) of
 * a reach plane whose points lie anywhere from yLo to yHi to its side (mm), as its bearing turns
 * over [a0, a1] (radians). A point at plan distance ρ and side distance y has bearing
 * J1 + asin(y/ρ) (in front of the axis) or J1 + π − asin(y/ρ) (behind it), so the start and end
 * edges are straight lines parallel to the limit bearings at side distances yLo / yHi (in front) or
 * yHi / yLo (behind); within max(|yLo|, |yHi|) of the axis a disc. yLo = yHi = 0 is bandSectors.
 */
export function spreadSectors(r0: number, r1: number, a0: number, a1: number, yLo: number, yHi: number, tol = DEFAULT_CHORD_TOLERANCE_MM): Polygon2[] {
  if (yLo === 0 && yHi === 0) return bandSectors(r0, r1, a0, a1, 0, tol);
  const out: Polygon2[] = [];
  const yAbs = Math.max(Math.abs(yLo), Math.abs(yHi));
  let disc = false;
  const parts: Array<[number, number]> = r0 < 0 && r1 > 0 ? [[r0, 0], [0, r1]] : [[r0, r1]];
  for (const [p0, p1] of parts) {
    if (!(p1 > p0)) continue;
    const front = p1 > 0;
    const rhoOut = Math.max(Math.abs(p0), Math.abs(p1));
    const rhoIn = Math.min(Math.abs(p0), Math.abs(p1));
    if (rhoIn <= yAbs) disc = true;
    if (rhoOut <= yAbs) continue;
    const yStart = front ? yLo : yHi;
    const yEnd = front ? yHi : yLo;
    const shift = (y: number, rho: number) => {
      const t = Math.asin(Math.max(-1, Math.min(1, y / rho)));
      return front ? t : Math.PI - t;
    };
    const sOut = a0 + shift(yStart, rhoOut);
    const eOut = a1 + shift(yEnd, rhoOut);
    if (eOut - sOut >= 2 * Math.PI - 1e-12) {
      const poly: Polygon2 = [circleRing(0, 0, rhoOut, 'outer', tol)];
      if (rhoIn > tol) poly.push(circleRing(0, 0, rhoIn, 'inner', tol).reverse());
      out.push(poly);
      continue;
    }
    const ring: Pt[] = [];
    appendArc(ring, 0, 0, rhoOut, sOut, eOut, 'outer', tol);
    if (rhoIn > yAbs) {
      appendArc(ring, 0, 0, rhoIn, a1 + shift(yEnd, rhoIn), a0 + shift(yStart, rhoIn), 'inner', tol);
    } else {
      // the edge lines down to their foot on the J1 axis' perpendicular; the disc covers the rest
      ring.push([-Math.sin(a1) * yEnd, Math.cos(a1) * yEnd]);
      ring.push([-Math.sin(a0) * yStart, Math.cos(a0) * yStart]);
    }
    out.push([ring]);
  }
  if (disc && yAbs > 0) out.push([circleRing(0, 0, yAbs, 'outer', tol)]);
  return out;
}

/**
 * Sectors of profile intervals over a J1 range. Profile r carries the plan distance from the J1
 * axis (sign = side); the plane's points lie from yLo to yHi to its side (spreadSectors).
 */
function sectorsOver(intervals: ReadonlyArray<[number, number]>, range: { min: number; max: number }, yLo: number, yHi: number, tol: number): Polygon2[] {
  const a0 = toRadians(range.min);
  const a1 = toRadians(range.max);
  const polys: Polygon2[] = [];
  for (const [r0, r1] of intervals) polys.push(...spreadSectors(r0, r1, a0, a1, yLo, yHi, tol));
  return polys.length ? clipUnion(polys) : [];
}

/**
 * Sideways spread of the tool point off the plane through J1, mm: the full range over the sampled
 * poses for a chain (a wrist swings the tool sideways), 0 for the families whose tool point stays
 * in that plane.
 */
export function toolLateralSpread(model: ArmParams): { min: number; max: number } {
  if (model.family !== 'chain') return { min: 0, max: 0 };
  const lat = (reachProfileOf(model) as ReachProfile & { lateral?: { min: number; max: number } }).lateral;
  if (!lat) return { min: 0, max: 0 };
  const clean = (v: number) => (Math.abs(v) < 1e-9 ? 0 : v);
  return { min: clean(lat.min), max: clean(lat.max) };
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
  const spread = toolLateralSpread(model);
  return sectorsOver(profileSliceAt(profile, zFlange), range, spread.min, spread.max, tol);
}

/** Whole-arm envelope in plan, the part below arm-frame height zTop, under the given J1 range, arm frame, mm. */
function spacePolygons(model: ArmParams, range: { min: number; max: number }, zTop: number, tol: number): Polygon2[] {
  const env = envelopeProfileOf(model);
  if (zTop < env.zMin) return [];
  if (model.family === 'scara') return scaraPlanEnvelope(model as ScaraParams, range, tol);
  let polys = env.polygons;
  if (zTop < env.zMax) {
    const r = env.maxReach + 10;
    const box: Polygon2 = [[[-r, env.zMin - 10], [r, env.zMin - 10], [r, zTop], [-r, zTop]]];
    polys = clipIntersect(env.polygons, [box]);
  }
  return sectorsOver(profileProjection({ polygons: polys }), range, env.lateralMm.min, env.lateralMm.max, tol);
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
