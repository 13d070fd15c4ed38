/**
 * Pure edits of a layout's content (plan mm, x east, y north; yaw in degrees CCW from +x). Every
 * function returns new content and leaves its input untouched, so the history can keep both.
 */
import { nearestPointOnSegment, pointSegmentDistance } from '@shared/geometry';
import type { ArmPlacement, LayoutContent, Boundary } from '@shared/schemas/layout';
import { ID_PREFIX } from '@shared/words';

type XY = [number, number];
type BoundaryKind = Boundary['kind'];

/** Id prefix of each boundary kind: F fence, K keep-out, A operator area, G opening (gap). */
/** Id prefixes of new boundaries: the same as the demo's (F1, O1, K1, OP1). */
export const BOUNDARY_PREFIX: Record<BoundaryKind, string> = { fence: ID_PREFIX.fence, keepout: ID_PREFIX.keepout, operator: ID_PREFIX.operator, opening: ID_PREFIX.opening };

/** The lowest free id `prefix<n>` (n ≥ 1) among `ids`: R1, R2 … after a delete the gap is reused. */
export function nextFreeId(prefix: string, ids: Iterable<string>): string {
  const taken = new Set(ids);
  for (let n = 1; ; n++) if (!taken.has(`${prefix}${n}`)) return `${prefix}${n}`;
}

/** Yaw brought into (−180°, 180°], rounded to 0.001° so repeated steps do not drift. */
export function normalizeYaw(deg: number): number {
  if (!Number.isFinite(deg)) throw new Error('yaw must be a finite number');
  let y = ((((deg + 180) % 360) + 360) % 360) - 180;
  if (y === -180) y = 180;
  y = Math.round(y * 1000) / 1000;
  return Object.is(y, -0) ? 0 : y;
}

/** Rounds a plan length to 0.1 mm (what the inspector shows and a drag can mean). */
export const roundMm = (v: number) => Math.round(v * 10) / 10;

function armIndex(content: LayoutContent, id: string): number {
  const i = content.arms.findIndex((a) => a.id === id);
  if (i < 0) throw new Error(`id: no arm ${id} on this cell layout`);
  return i;
}

function withArm(content: LayoutContent, id: string, patch: (a: ArmPlacement) => ArmPlacement): LayoutContent {
  const i = armIndex(content, id);
  const arms = content.arms.slice();
  arms[i] = patch(arms[i]);
  return { ...content, arms };
}

/** Places a new arm of a model at a plan point (mm) with the next free id R1, R2 …; returns the content and the id. */
export function addArm(content: LayoutContent, armModelId: number, at: XY, yaw = 0): { content: LayoutContent; id: string } {
  const id = nextFreeId(ID_PREFIX.arm, content.arms.map((a) => a.id));
  const arm: ArmPlacement = { id, armModelId, label: '', x: roundMm(at[0]), y: roundMm(at[1]), yaw: normalizeYaw(yaw), mountHeight: 0 };
  return { content: { ...content, arms: [...content.arms, arm] }, id };
}

/** Adds a work point at a plan point (mm) and height z (mm), top approach, with the next free id P1, P2 …. */
export function addWorkPoint(content: LayoutContent, at: XY, z: number): { content: LayoutContent; id: string } {
  if (!Number.isFinite(z)) throw new Error('z must be a finite number');
  const id = nextFreeId(ID_PREFIX.workPoint, content.workPoints.map((p) => p.id));
  const point = { id, x: roundMm(at[0]), y: roundMm(at[1]), z: roundMm(z), approach: 'top' as const, tag: '' };
  return { content: { ...content, workPoints: [...content.workPoints, point] }, id };
}

/** Moves an arm's base to a plan point, mm. */
export function moveArm(content: LayoutContent, id: string, x: number, y: number): LayoutContent {
  return withArm(content, id, (a) => ({ ...a, x: roundMm(x), y: roundMm(y) }));
}

/** Moves an arm's base by (dx, dy) mm. */
export function nudgeArm(content: LayoutContent, id: string, dx: number, dy: number): LayoutContent {
  const a = content.arms[armIndex(content, id)];
  return moveArm(content, id, a.x + dx, a.y + dy);
}

/** Sets an arm's yaw (deg CCW from +x), normalised. */
export function setArmYaw(content: LayoutContent, id: string, yaw: number): LayoutContent {
  return withArm(content, id, (a) => ({ ...a, yaw: normalizeYaw(yaw) }));
}

/** Turns an arm by `delta` degrees (positive = counter-clockwise seen from above). */
export function rotateArm(content: LayoutContent, id: string, delta: number): LayoutContent {
  const a = content.arms[armIndex(content, id)];
  return setArmYaw(content, id, a.yaw + delta);
}

/** Replaces an arm's editable fields (from the inspector form); the id stays. */
export function updateArm(content: LayoutContent, id: string, patch: Partial<Omit<ArmPlacement, 'id'>>): LayoutContent {
  return withArm(content, id, (a) => {
    const next: ArmPlacement = { ...a, ...patch, id: a.id };
    if ('restrict' in patch && patch.restrict === undefined) delete next.restrict;
    return next;
  });
}

/** Copies an arm with the next free id, offset by (dx, dy) mm (default 500 mm east and south). */
export function duplicateArm(content: LayoutContent, id: string, offset: XY = [500, -500]): { content: LayoutContent; id: string } {
  const src = content.arms[armIndex(content, id)];
  const newId = nextFreeId(ID_PREFIX.arm, content.arms.map((a) => a.id));
  const copy: ArmPlacement = { ...src, id: newId, x: roundMm(src.x + offset[0]), y: roundMm(src.y + offset[1]) };
  if (src.restrict) copy.restrict = { ...src.restrict };
  return { content: { ...content, arms: [...content.arms, copy] }, id: newId };
}

/** Removes an arm; work points assigned to it become unassigned (the schema allows no dangling arm). */
export function removeArm(content: LayoutContent, id: string): LayoutContent {
  armIndex(content, id);
  return {
    ...content,
    arms: content.arms.filter((a) => a.id !== id),
    workPoints: content.workPoints.some((p) => p.assignedArm === id)
      ? content.workPoints.map((p) => {
          if (p.assignedArm !== id) return p;
          const { assignedArm: _gone, ...rest } = p;
          return rest;
        })
      : content.workPoints,
  };
}

/** Nearest point of a polyline to p (perpendicular foot on a segment, clamped to its ends). */
export function nearestOnPolyline(line: ReadonlyArray<XY>, p: XY): { point: XY; segment: number; distance: number } | null {
  let best: { point: XY; segment: number; distance: number } | null = null;
  for (let i = 0; i + 1 < line.length; i++) {
    const [ax, ay] = line[i];
    const [bx, by] = line[i + 1];
    const q: XY = nearestPointOnSegment(p[0], p[1], ax, ay, bx, by);
    const d = pointSegmentDistance(p[0], p[1], ax, ay, bx, by);
    if (!best || d < best.distance) best = { point: q, segment: i, distance: d };
  }
  return best;
}

/** The fence nearest a plan point and the distance to it, mm; null when the layout has no fence. */
export function nearestFence(content: LayoutContent, p: XY): { fence: Boundary; distance: number } | null {
  let best: { fence: Boundary; distance: number } | null = null;
  for (const z of content.boundaries) {
    if (z.kind !== 'fence') continue;
    const n = nearestOnPolyline(z.points as XY[], p);
    if (n && (!best || n.distance < best.distance)) best = { fence: z, distance: n.distance };
  }
  return best;
}

const roundXY = (p: XY): XY => [roundMm(p[0]), roundMm(p[1])];

/** Both ends of an opening snapped onto its fence (nearest points of the fence polyline). */
export function snapOpening(fence: Boundary, a: XY, b: XY): [XY, XY] {
  const line = fence.points as XY[];
  const pa = nearestOnPolyline(line, a);
  const pb = nearestOnPolyline(line, b);
  if (!pa || !pb) throw new Error('fence: needs at least 2 points');
  return [roundXY(pa.point), roundXY(pb.point)];
}

/**
 * Adds a boundary drawn with the tools. Fences need a height; an opening's two clicks are snapped onto
 * the fence nearest the first click and carry its `fenceId`. Returns the content and the new id.
 */
export function addBoundary(
  content: LayoutContent,
  kind: BoundaryKind,
  points: ReadonlyArray<XY>,
  opts: { height?: number; label?: string } = {},
): { content: LayoutContent; id: string } {
  const id = nextFreeId(BOUNDARY_PREFIX[kind], content.boundaries.map((z) => z.id));
  let boundary: Boundary;
  if (kind === 'opening') {
    if (points.length !== 2) throw new Error('points: an opening is two clicks on a fence');
    const near = nearestFence(content, points[0]);
    if (!near) throw new Error('points: draw a fence before its opening');
    boundary = { id, kind, label: opts.label ?? '', points: snapOpening(near.fence, points[0], points[1]), fenceId: near.fence.id };
  } else {
    const need = kind === 'fence' ? 2 : 3;
    if (points.length < need) throw new Error(`points: a ${kind === 'fence' ? 'fence' : 'polygon'} needs at least ${need} points`);
    boundary = { id, kind, label: opts.label ?? '', points: points.map(roundXY) };
    if (kind === 'fence') {
      if (!(opts.height !== undefined && opts.height > 0)) throw new Error('height: a fence needs a height above 0');
      boundary.height = opts.height;
    }
  }
  return { content: { ...content, boundaries: [...content.boundaries, boundary] }, id };
}

/** Moves one vertex of a boundary; an opening's vertex stays on its fence, and a fence's openings follow it. */
export function moveBoundaryVertex(content: LayoutContent, boundaryId: string, index: number, to: XY): LayoutContent {
  const zi = content.boundaries.findIndex((z) => z.id === boundaryId);
  if (zi < 0) throw new Error(`boundaryId: no boundary ${boundaryId} on this cell layout`);
  const boundary = content.boundaries[zi];
  if (!Number.isInteger(index) || index < 0 || index >= boundary.points.length) throw new Error(`index: boundary ${boundaryId} has no vertex ${index}`);
  const boundaries = content.boundaries.slice();
  if (boundary.kind === 'opening') {
    const fence = boundaries.find((z) => z.id === boundary.fenceId);
    const pts = boundary.points.slice() as XY[];
    pts[index] = to;
    boundaries[zi] = { ...boundary, points: fence ? snapOpening(fence, pts[0], pts[1]) : pts.map(roundXY) };
    return { ...content, boundaries };
  }
  const pts = boundary.points.slice() as XY[];
  pts[index] = roundXY(to);
  const moved: Boundary = { ...boundary, points: pts };
  boundaries[zi] = moved;
  if (boundary.kind === 'fence') {
    boundaries.forEach((z, i) => {
      if (z.kind === 'opening' && z.fenceId === boundary.id) boundaries[i] = { ...z, points: snapOpening(moved, z.points[0] as XY, z.points[1] as XY) };
    });
  }
  return { ...content, boundaries };
}

/** Changes a boundary's label or (fences) height. */
export function updateBoundary(content: LayoutContent, boundaryId: string, patch: { label?: string; height?: number }): LayoutContent {
  const zi = content.boundaries.findIndex((z) => z.id === boundaryId);
  if (zi < 0) throw new Error(`boundaryId: no boundary ${boundaryId} on this cell layout`);
  const boundaries = content.boundaries.slice();
  boundaries[zi] = { ...boundaries[zi], ...patch };
  return { ...content, boundaries };
}

/**
 * Sets an opening's safeguard or a fence's mesh; null removes the field (only openings carry a
 * safeguard, only fences a mesh — the layout schema checks the values).
 */
export function setBoundarySafeguarding(
  content: LayoutContent,
  boundaryId: string,
  patch: { safeguard?: Boundary['safeguard'] | null; mesh?: { meshMm: number; meshShape: NonNullable<Boundary['meshShape']> } | null },
): LayoutContent {
  const zi = content.boundaries.findIndex((z) => z.id === boundaryId);
  if (zi < 0) throw new Error(`boundaryId: no boundary ${boundaryId} on this cell layout`);
  const z = content.boundaries[zi];
  if (patch.safeguard !== undefined && z.kind !== 'opening') throw new Error(`safeguard: boundary ${boundaryId} is not an access opening`);
  if (patch.mesh !== undefined && z.kind !== 'fence') throw new Error(`mesh: boundary ${boundaryId} is not a fence`);
  const next: Boundary = { ...z };
  if (patch.safeguard === null) delete next.safeguard;
  else if (patch.safeguard) next.safeguard = patch.safeguard;
  if (patch.mesh === null) {
    delete next.meshMm;
    delete next.meshShape;
  } else if (patch.mesh) {
    next.meshMm = patch.mesh.meshMm;
    next.meshShape = patch.mesh.meshShape;
  }
  const boundaries = content.boundaries.slice();
  boundaries[zi] = next;
  return { ...content, boundaries };
}

/** Removes a boundary; removing a fence removes the openings cut into it. */
export function removeBoundary(content: LayoutContent, boundaryId: string): LayoutContent {
  if (!content.boundaries.some((z) => z.id === boundaryId)) throw new Error(`boundaryId: no boundary ${boundaryId} on this cell layout`);
  return { ...content, boundaries: content.boundaries.filter((z) => z.id !== boundaryId && !(z.kind === 'opening' && z.fenceId === boundaryId)) };
}

/** Work heights (mm above the floor): distinct, finite, sorted ascending. */
export function setWorkHeights(content: LayoutContent, heights: ReadonlyArray<number>): LayoutContent {
  const clean = [...new Set(heights.filter(Number.isFinite).map(roundMm))].sort((a, b) => a - b);
  return { ...content, workHeights: clean };
}
