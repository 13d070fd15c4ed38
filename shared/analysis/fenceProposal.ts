/**
 * Guard-ring proposal: closed fence lines around the arms' restricted spaces, far enough from them
 * against reaching through the mesh and over the top (ISO 13857) plus the planner's clearance,
 * built from straight runs at right angles, around columns and obstacles, closed on walls where
 * allowed, with doors where people need access; then split into panels, posts and doors.
 *
 * Method, per arm: distance to keep D = max(s_r, c) + clearance, with s_r the reach-through distance
 * of the mesh and c the reach-over distance for the panel height b and the hazard height
 * a = mount height + highest tool-point height. The restricted space grown by D (its Minkowski sum
 * with a disk) is the area the fence must not enter. Each ring is the axis-aligned
 * box of its arms' grown areas: of all rectilinear rings around an orthogonally convex region the
 * box is the shortest (its perimeter equals the region's box perimeter), and it needs only four
 * corners. Arms whose boxes overlap share a ring; otherwise two groups share one when that ring is
 * shorter than the two apart. Columns and obstacles the ring would cross (grown by a post width)
 * are taken inside it; walls close a side when the side can move onto a wall face without coming
 * nearer than D. The minimum distance is measured again on the final fence lines.
 */
import { polygonsArea } from '../geometry/area';
import { polygonsBounds } from '../geometry/bounds';
import { armPose } from '../geometry/frames';
import { distanceToBoundary, pointInPolygons } from '../geometry/pointInPolygon';
import type { Polygon2, Pt, Ring } from '../geometry/types';
import { CRUSHING_GAP_BODY_MM, NotCoveredError, reachOverDistance, reachThroughDistance, SafeguardInputError, separationDistance } from '../safety';
import { ReadableError } from '../schemas/errors';
import type { FenceSystem } from '../schemas/fenceProposal';
import type { ArmPlacement, Boundary } from '../schemas/layout';
import { fenceLinesOf, fenceParts, type BomLine, type FenceParts } from './fenceBom';
import { reasonOf } from './messages';
import { boxOverlap, boxUnion, obstacleBoxes, perimeter, routeAroundObstacles, snapToWalls, splitOnWalls, wallFacesOf, type Box } from './fenceRing';
import { polylineDistanceToPolygons, segmentsIntersect } from './segments';
import type { ArmReach, ArmReachFactory, PreparedFloor } from './types';

/** Response time assumed for a door interlock switch and its logic, s (planning value; use the device's data). */
export const DOOR_INTERLOCK_RESPONSE_S = 0.1;

/** Bad input to the proposal: names the field (null when it is about the layout as a whole). */
export class FenceProposalError extends ReadableError {
  constructor(
    readonly field: string | null,
    message: string,
  ) {
    super(message);
    this.name = 'FenceProposalError';
  }
}

export interface FenceProposalInput {
  arms: ReadonlyArray<ArmPlacement>;
  boundaries: ReadonlyArray<Boundary>;
  floor: PreparedFloor | null;
  reachFor: ArmReachFactory;
  /** Stopping time of an arm model (s), when its data has one. */
  stopTimeS?: (armModelId: number) => number | undefined;
  system: Readonly<FenceSystem>;
}

/** The distance one arm's restricted space needs to the fence, and where it comes from, mm. */
export interface RequiredDistance {
  armId: string;
  reachThroughMm: number;
  reachOverMm: number;
  hazardHeightMm: number;
  clearanceMm: number;
  requiredMm: number;
}

export interface ProposedRing {
  id: string;
  arms: string[];
  /** The closed ring (counter-clockwise, first point not repeated), plan mm. */
  ring: Pt[];
  /** Stretches of the ring closed by a wall (no panels), plan mm. */
  wallStretches: Array<[Pt, Pt]>;
  /** Smallest distance of the ring's fence lines to any restricted space, less that arm's required distance, mm (≥ 0 when kept). */
  worstMarginMm: number;
  areaM2: number;
}

export interface FenceProposal {
  boundaries: Boundary[];
  bom: BomLine[];
  lengthMm: number;
  areaEnclosedM2: number;
  notes: string[];
  rings: ProposedRing[];
  required: RequiredDistance[];
  parts: FenceParts;
  /** The fence system the proposal was built from. */
  system: FenceSystem;
}

interface Placed {
  arm: ArmPlacement;
  reach: ArmReach;
  restricted: Polygon2[];
  required: RequiredDistance;
  grownBox: Box;
  hazardBox: Box;
}

const r1 = (v: number) => Math.round(v * 10) / 10;

/** The distance to keep for one arm (see the file comment), mm. */
function requiredFor(arm: ArmPlacement, reach: ArmReach, system: Readonly<FenceSystem>): RequiredDistance {
  const hazardHeightMm = (arm.mountHeight ?? 0) + reach.zMax;
  let through: number, over: number;
  try {
    through = reachThroughDistance(system.meshMm, system.meshShape).distanceMm;
  } catch (err) {
    if (err instanceof SafeguardInputError || err instanceof NotCoveredError) throw new FenceProposalError('meshMm', err.message);
    throw err;
  }
  try {
    over = reachOverDistance(Math.max(0, hazardHeightMm), system.panelHeightMm).distanceMm;
  } catch (err) {
    if (err instanceof SafeguardInputError || err instanceof NotCoveredError) throw new FenceProposalError('panelHeightMm', err.message);
    throw err;
  }
  // Never nearer than the gap that keeps a body from being crushed between the arm and the fence (ISO 13854).
  const requiredMm = Math.max(Math.max(through, over) + system.clearanceMm, CRUSHING_GAP_BODY_MM);
  return { armId: arm.id, reachThroughMm: through, reachOverMm: over, hazardHeightMm: r1(hazardHeightMm), clearanceMm: system.clearanceMm, requiredMm };
}

/** Smallest (distance − required) from fence lines to the arms' restricted spaces, mm. */
function worstMargin(lines: ReadonlyArray<ReadonlyArray<Pt>>, placed: ReadonlyArray<Placed>): number {
  let worst = Infinity;
  for (const p of placed) {
    for (const l of lines) {
      const b = polygonsBounds([[l as Ring]]);
      if (b && !boxOverlap(b as Box, p.hazardBox, p.required.requiredMm + 1)) continue;
      worst = Math.min(worst, polylineDistanceToPolygons(l, p.restricted) - p.required.requiredMm);
    }
  }
  return worst;
}

interface DoorNeed {
  at: Pt;
  label: string;
  /** Clear width wanted, mm (the largest stocked door that fits it is taken). */
  widthMm: number | null;
}

/** Where people need to come in: operator areas, and the openings already drawn in the layout's fences. */
function doorNeeds(boundaries: ReadonlyArray<Boundary>): DoorNeed[] {
  const out: DoorNeed[] = [];
  for (const z of boundaries) {
    if (z.kind === 'operator' && z.points.length >= 3) {
      const b = polygonsBounds([[z.points.map(([x, y]) => [x, y] as Pt)]]);
      if (b) out.push({ at: [(b[0] + b[2]) / 2, (b[1] + b[3]) / 2], label: `operator area ${z.label || z.id}`, widthMm: Math.max(b[2] - b[0], b[3] - b[1]) });
    }
    if (z.kind === 'opening' && z.points.length === 2) {
      const [a, c] = z.points;
      out.push({ at: [(a[0] + c[0]) / 2, (a[1] + c[1]) / 2], label: `access opening ${z.label || z.id}`, widthMm: Math.hypot(c[0] - a[0], c[1] - a[1]) });
    }
  }
  return out;
}

/** A door of clear width w on a fence line near a point: centred on the nearest segment that takes it with a post's room to spare at both ends. */
function placeDoor(lines: ReadonlyArray<ReadonlyArray<Pt>>, at: Readonly<Pt>, w: number, post: number, taken: ReadonlyArray<{ line: number; a: Pt; b: Pt }>): { line: number; a: Pt; b: Pt } | null {
  const cands: Array<{ d: number; line: number; a: Pt; b: Pt }> = [];
  lines.forEach((l, li) => {
    for (let k = 0; k + 1 < l.length; k++) {
      const p = l[k], q = l[k + 1];
      const L = Math.hypot(q[0] - p[0], q[1] - p[1]);
      const margin = w / 2 + 1.5 * post;
      if (L < 2 * margin) continue;
      const ux = (q[0] - p[0]) / L, uy = (q[1] - p[1]) / L;
      const t = Math.min(L - margin, Math.max(margin, (at[0] - p[0]) * ux + (at[1] - p[1]) * uy));
      const c: Pt = [p[0] + ux * t, p[1] + uy * t];
      const a: Pt = [c[0] - (ux * w) / 2, c[1] - (uy * w) / 2];
      const b: Pt = [c[0] + (ux * w) / 2, c[1] + (uy * w) / 2];
      const clash = taken.some((d) => d.line === li && segmentsIntersect(a, b, d.a, d.b));
      if (!clash) cands.push({ d: Math.hypot(c[0] - at[0], c[1] - at[1]), line: li, a, b });
    }
  });
  cands.sort((u, v) => u.d - v.d);
  return cands[0] ?? null;
}

/** Ids not used by the boundaries that stay in the layout. */
function freshId(base: string, used: Set<string>): string {
  let id = base;
  for (let k = 2; used.has(id); k++) id = `${base}-${k}`;
  used.add(id);
  return id;
}

/**
 * Proposes guard rings for a layout (see the file comment): fences and door openings as layout
 * boundaries, their bill of materials, total length (doors included), enclosed area, and notes.
 * Throws FenceProposalError for a layout without arms or options the standards do not cover.
 */
export function proposeFence(input: Readonly<FenceProposalInput>): FenceProposal {
  const { system } = input;
  if (!input.arms.length) throw new FenceProposalError(null, 'The cell layout has no arms: place at least one arm before proposing a guard ring.');
  const notes: string[] = [];
  const placed: Placed[] = [];
  for (const arm of input.arms) {
    let reach: ArmReach;
    try {
      reach = input.reachFor(arm.armModelId, arm.restrict);
    } catch (err) {
      notes.push(`${arm.label || arm.id}: its reach cannot be computed (${reasonOf(err) ?? 'check its arm model and its J1 limits'}); it is left out of the proposal.`);
      continue;
    }
    const restricted = armPose(arm).placePolygons(reach.restricted);
    const hazardBox = polygonsBounds(restricted) as Box | null;
    if (!hazardBox) continue;
    const required = requiredFor(arm, reach, system);
    // The box of the restricted space grown by D (Minkowski sum with a disk of radius D) is exactly
    // its own box padded by D on every side, so no offset polygon is needed for a box ring.
    const d = required.requiredMm;
    const grownBox: Box = [hazardBox[0] - d, hazardBox[1] - d, hazardBox[2] + d, hazardBox[3] + d];
    placed.push({ arm, reach, restricted, required, grownBox, hazardBox });
  }
  if (!placed.length) throw new FenceProposalError(null, 'No arm of the cell layout has a reach that can be computed, so there is nothing to fence.');

  // Groups: overlapping boxes must share a ring; otherwise merge while one ring is shorter than two.
  let groups = placed.map((p) => ({ members: [p], box: p.grownBox }));
  const post = system.postWidthMm;
  for (let changed = true; changed; ) {
    changed = false;
    outer: for (let i = 0; i < groups.length; i++) {
      for (let j = i + 1; j < groups.length; j++) {
        const a = groups[i], b = groups[j];
        const u = boxUnion(a.box, b.box);
        if (boxOverlap(a.box, b.box, 2 * post) || perimeter(u) <= perimeter(a.box) + perimeter(b.box)) {
          groups[i] = { members: [...a.members, ...b.members], box: u };
          groups.splice(j, 1);
          changed = true;
          break outer;
        }
      }
    }
  }
  groups = groups.sort((a, b) => a.box[0] - b.box[0] || a.box[1] - b.box[1]);

  const faces = system.useWalls ? wallFacesOf(input.floor) : [];
  const obstacles = obstacleBoxes(input.floor, post, !system.useWalls);
  const used = new Set(input.boundaries.filter((z) => z.kind !== 'fence' && z.kind !== 'opening').map((z) => z.id));
  const boundaries: Boundary[] = [];
  const rings: ProposedRing[] = [];
  const needs = doorNeeds(input.boundaries);
  const usedNeeds = new Set<number>();
  let routed = 0;

  groups.forEach((g, gi) => {
    const hazard = g.members.map((m) => m.hazardBox).reduce(boxUnion);
    const build = (useFaces: boolean) => {
      const box = useFaces && faces.length ? snapToWalls(g.box, hazard, faces) : g.box;
      const { ring, taken } = routeAroundObstacles(box, obstacles);
      const split = useFaces ? splitOnWalls(ring, faces) : { lines: [[...ring, ring[0]]], wall: [] as Array<[Pt, Pt]> };
      return { ring, taken, split, margin: worstMargin(split.lines, placed) };
    };
    let r = build(system.useWalls);
    // A wall face that brings a fence line too near a restricted space is not used.
    if (system.useWalls && r.margin < -0.5) r = build(false);
    routed += r.taken;
    const ringId = freshId(`GR${gi + 1}`, used);
    const ringLabel = `Guard ring ${gi + 1}`;
    const fenceIds: string[] = [];
    r.split.lines.forEach((l, li) => {
      const id = r.split.lines.length === 1 ? ringId : freshId(`${ringId}.${li + 1}`, used);
      if (r.split.lines.length > 1) used.add(id);
      fenceIds.push(id);
      boundaries.push({ id, kind: 'fence', label: r.split.lines.length === 1 ? ringLabel : `${ringLabel} part ${li + 1}`, height: system.panelHeightMm, points: l.map((p) => [r1(p[0]), r1(p[1])] as [number, number]), meshMm: system.meshMm, meshShape: system.meshShape });
    });

    // Doors: at each access need nearest to this ring; one on the longest run when none is marked.
    const ringBox = polygonsBounds([[r.ring]]) as Box;
    const doorsHere: Array<{ line: number; a: Pt; b: Pt; label: string }> = [];
    const widths = [...system.doorWidthsMm].sort((a, b) => a - b);
    needs.forEach((n, ni) => {
      if (usedNeeds.has(ni)) return;
      const near = n.at[0] >= ringBox[0] - 3000 && n.at[0] <= ringBox[2] + 3000 && n.at[1] >= ringBox[1] - 3000 && n.at[1] <= ringBox[3] + 3000;
      if (!near) return;
      // One door serves needs close together (an operator area in front of an opening, say).
      if (doorsHere.some((d) => Math.hypot((d.a[0] + d.b[0]) / 2 - n.at[0], (d.a[1] + d.b[1]) / 2 - n.at[1]) < 3000)) {
        usedNeeds.add(ni);
        return;
      }
      const w = [...widths].reverse().find((x) => n.widthMm == null || x <= n.widthMm + 1) ?? widths[0];
      const d = placeDoor(r.split.lines, n.at, w, post, doorsHere);
      if (d) {
        usedNeeds.add(ni);
        doorsHere.push({ ...d, label: n.label });
      } else notes.push(`${ringLabel}: no straight run takes a ${w} mm door near the ${n.label}; place it by hand.`);
    });
    if (!doorsHere.length) {
      let best: { line: number; k: number; L: number } | null = null;
      r.split.lines.forEach((l, li) => {
        for (let k = 0; k + 1 < l.length; k++) {
          const L = Math.hypot(l[k + 1][0] - l[k][0], l[k + 1][1] - l[k][1]);
          if (!best || L > best.L) best = { line: li, k, L };
        }
      });
      const b = best as { line: number; k: number; L: number } | null;
      if (b) {
        const l = r.split.lines[b.line];
        const mid: Pt = [(l[b.k][0] + l[b.k + 1][0]) / 2, (l[b.k][1] + l[b.k + 1][1]) / 2];
        const d = placeDoor(r.split.lines, mid, widths[0], post, doorsHere);
        if (d) {
          doorsHere.push({ ...d, label: 'maintenance access' });
          notes.push(`${ringLabel}: no operator area or opening marks where people come in; one ${widths[0]} mm door is placed mid-way along the longest run — move it to the real access.`);
        }
      }
    }
    doorsHere.forEach((d, di) => {
      // ISO 13855 for an interlocked guard without locking: S = 1600 mm/s × (response + stopping time).
      const segment = [d.a, d.b];
      let needLocking = false;
      for (const m of g.members) {
        const stop = input.stopTimeS?.(m.arm.armModelId);
        const gap = polylineDistanceToPolygons(segment, m.restricted);
        if (stop == null) {
          needLocking = true;
          continue;
        }
        const s = separationDistance({ device: 'interlock', responseTimeS: DOOR_INTERLOCK_RESPONSE_S, stopTimeS: stop }).sMm;
        if (gap < s) needLocking = true;
      }
      const id = freshId(`${ringId}.D${di + 1}`, used);
      if (needLocking) notes.push(`Door ${id} (${d.label}): the stopping time of an arm behind it is unknown or the door is nearer than ISO 13855's S = 1600 mm/s × T, so it gets an interlock with guard locking.`);
      boundaries.push({
        id,
        kind: 'opening',
        label: `Door ${gi + 1}.${di + 1}`,
        fenceId: fenceIds[d.line],
        points: [[r1(d.a[0]), r1(d.a[1])], [r1(d.b[0]), r1(d.b[1])]],
        safeguard: { device: needLocking ? 'interlock-locking' : 'interlock', responseTimeS: DOOR_INTERLOCK_RESPONSE_S, stopCategory: 0, approach: 'normal' },
      });
    });

    const areaM2 = Math.abs(polygonsArea([[r.ring]])) / 1e6;
    rings.push({ id: ringId, arms: g.members.map((m) => m.arm.id), ring: r.ring, wallStretches: r.split.wall, worstMarginMm: r1(r.margin), areaM2: Math.round(areaM2 * 1000) / 1000 });
    const outline = input.floor?.outline ?? [];
    if (outline.length && r.ring.some(([x, y]) => !pointInPolygons(x, y, outline) && distanceToBoundary(x, y, outline) > 1)) {
      notes.push(`${ringLabel}: part of the ring lies outside the floor outline; move the arms or close that side by hand.`);
    }
    if (r.margin < -0.5) notes.push(`${ringLabel}: a fence line comes ${r1(-r.margin)} mm nearer to a restricted space than required; check the plan.`);
    if (r.split.wall.length) notes.push(`${ringLabel}: ${r.split.wall.length} stretch${r.split.wall.length === 1 ? '' : 'es'} closed by a wall (no panels there); the wall must be solid to the panel height at least.`);
  });

  if (routed) notes.push(`${routed} column${routed === 1 ? '' : 's'} or obstacle${routed === 1 ? '' : 's'} in the way taken inside the ring.`);
  if (input.boundaries.some((z) => z.kind === 'fence')) notes.push('Accepting the proposal replaces the fences and openings drawn in the cell layout.');
  const reqText = [...new Set(placed.map((p) => `${p.arm.label || p.arm.id}: ${p.required.requiredMm} mm (reach-through ${p.required.reachThroughMm}, reach-over ${p.required.reachOverMm} at hazard height ${p.required.hazardHeightMm} mm, clearance ${p.required.clearanceMm}; at least ${CRUSHING_GAP_BODY_MM} mm against crushing, ISO 13854)`))];
  notes.push(`Distance kept from each restricted space (ISO 13857 tables plus the planner's clearance, 150 mm being common practice): ${reqText.join('; ')}.`);
  notes.push('A planning estimate from nominal kinematics: it does not replace the risk assessment (ISO 12100), ISO 10218-2 or the maker\'s stopping data; a competent person designs and validates the final safeguarding under local codes.');

  const parts = fenceParts(fenceLinesOf(boundaries), system, faces);
  const areaEnclosedM2 = Math.round(rings.reduce((s, r) => s + r.areaM2, 0) * 1000) / 1000;
  return { boundaries, bom: parts.bom, lengthMm: Math.round(parts.lengthMm), areaEnclosedM2, notes, rings, required: placed.map((p) => p.required), parts, system: { ...system } };
}

/** The layout's boundaries with its fences and openings replaced by a proposal's (other boundaries kept, in order). */
export function applyFenceProposal(boundaries: ReadonlyArray<Boundary>, proposal: Readonly<Pick<FenceProposal, 'boundaries'>>): Boundary[] {
  return [...boundaries.filter((z) => z.kind !== 'fence' && z.kind !== 'opening'), ...proposal.boundaries];
}
