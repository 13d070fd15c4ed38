import { polygonArea } from '../geometry/area';
import { geoJSONToPolygons } from '../geometry/geojson';
import { convexHull } from '../geometry/hull';
import type { Pt } from '../geometry/types';
import { ReadableError } from '../schemas/errors';
import type { ArmPlacement, LayoutContent } from '../schemas/layout';
import { bestAlone, placementSteps, type PlacementNeighbour, type PlacementPoint } from './placement';
import { armPose } from '../geometry/frames';
import type { AnalysisResult, ArmReach, PreparedFloor } from './types';
import type { Boundary } from '../schemas/layout';

/**
 * Auto-layout: placements of several arms (from models with how many of each) and an assignment of
 * work points to them such that every point is reached with the margin. Greedy and deterministic:
 * a group of points (at first all of them) goes to the smallest model that still has arms left and
 * has a placement-search candidate for the whole group (ranked by least shared zone with the arms
 * placed so far, then the shortest guard line); a group no model can take is split in two (2-means,
 * first centre chosen by the seeded generator, the second the point farthest from it) and each half
 * is tried again. Points no model reaches from any base are reported, never dropped.
 */

export interface AutoLayoutModel {
  armModelId: number;
  count: number;
  reach: ArmReach;
}

export interface AutoLayoutQuery {
  models: ReadonlyArray<AutoLayoutModel>;
  points: ReadonlyArray<PlacementPoint>;
  minMarginMm: number;
  mountHeightMm: number;
  floor: PreparedFloor | null;
  boundaries: ReadonlyArray<Boundary>;
  seed: number;
  /** Wall-clock budget, ms (default 10 000). */
  timeLimitMs?: number;
  /** Ids already used on the layout (new arms get the next free R<n>). */
  takenIds?: ReadonlyArray<string>;
  /** Clock, ms (tests inject one). */
  now?: () => number;
}

export interface AutoLayoutArm {
  id: string;
  armModelId: number;
  x: number;
  y: number;
  yawDeg: number;
  mountHeightMm: number;
  pointIds: string[];
  worstMarginMm: number;
}

export interface AutoLayoutResult {
  arms: AutoLayoutArm[];
  /** Points no model reaches with the margin from any base. */
  unreachable: string[];
  /** Points some model reaches, but which no arm left (or the time left) could take. */
  unassigned: string[];
  timedOut: boolean;
}

export interface AutoLayoutProgress {
  progress: number;
  placed: number;
}

/** mulberry32: a small seeded generator, so the same input gives the same proposal. */
function seeded(seed: number) {
  let a = seed | 0;
  return () => {
    a = (a + 0x6d2b79f5) | 0;
    let t = Math.imul(a ^ (a >>> 15), 1 | a);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Two groups by 2-means (Lloyd's iteration, 12 rounds at most) in plan. */
function splitTwo(group: PlacementPoint[], rand: () => number): [PlacementPoint[], PlacementPoint[]] {
  const first = group[Math.floor(rand() * group.length)];
  let far = group[0], fd = -1;
  for (const p of group) {
    const d = Math.hypot(p.x - first.x, p.y - first.y);
    if (d > fd) { fd = d; far = p; }
  }
  let c1: Pt = [first.x, first.y], c2: Pt = [far.x, far.y];
  let a: PlacementPoint[] = [], b: PlacementPoint[] = [];
  for (let round = 0; round < 12; round++) {
    a = []; b = [];
    for (const p of group) (Math.hypot(p.x - c1[0], p.y - c1[1]) <= Math.hypot(p.x - c2[0], p.y - c2[1]) ? a : b).push(p);
    if (!a.length || !b.length) break;
    const mean = (g: PlacementPoint[]): Pt => [g.reduce((s, p) => s + p.x, 0) / g.length, g.reduce((s, p) => s + p.y, 0) / g.length];
    const n1 = mean(a), n2 = mean(b);
    if (n1[0] === c1[0] && n1[1] === c1[1] && n2[0] === c2[0] && n2[1] === c2[1]) break;
    c1 = n1; c2 = n2;
  }
  if (!a.length || !b.length) {
    const h = Math.ceil(group.length / 2);
    return [group.slice(0, h), group.slice(h)];
  }
  return [a, b];
}

/** The auto-layout as steps (progress between placement searches); the return value is the proposal. */
export function* autoLayoutSteps(q: AutoLayoutQuery): Generator<AutoLayoutProgress, AutoLayoutResult, void> {
  if (!q.points.length) throw new ReadableError('Choose at least one work point');
  if (!q.models.length) throw new ReadableError('Choose at least one arm model');
  const now = q.now ?? (() => (typeof performance !== 'undefined' ? performance.now() : Date.now()));
  const deadline = now() + (q.timeLimitMs ?? 10_000);
  const rand = seeded(q.seed);
  const left = new Map(q.models.map((m) => [m.armModelId, m.count]));
  const models = [...q.models].sort((a, b) => a.reach.maxReach - b.reach.maxReach || a.armModelId - b.armModelId);

  // Which models reach each point at all (from their best base), with the margin.
  const alone = new Map<string, number>();
  const reaches = (m: AutoLayoutModel, p: PlacementPoint) => {
    const key = `${m.armModelId}|${p.z}|${p.approach ?? 'top'}`;
    if (!alone.has(key)) alone.set(key, bestAlone(m.reach, p.z - q.mountHeightMm, p.approach ?? 'top'));
    return alone.get(key)! >= q.minMarginMm;
  };
  const unreachable = q.points.filter((p) => !models.some((m) => reaches(m, p))).map((p) => p.id);
  const gone = new Set(unreachable);
  const queue: PlacementPoint[][] = [q.points.filter((p) => !gone.has(p.id))].filter((g) => g.length);
  const arms: AutoLayoutArm[] = [];
  const neighbours: PlacementNeighbour[] = [];
  const unassigned: string[] = [];
  const taken = new Set(q.takenIds ?? []);
  let next = 1;
  const newId = () => {
    while (taken.has(`R${next}`)) next++;
    taken.add(`R${next}`);
    return `R${next}`;
  };
  let timedOut = false;
  const total = queue[0]?.length ?? 0;
  let done = 0;

  while (queue.length) {
    const group = queue.shift()!;
    if (now() > deadline) {
      timedOut = true;
      unassigned.push(...group.map((p) => p.id));
      continue;
    }
    let box = [Infinity, Infinity, -Infinity, -Infinity];
    for (const p of group) box = [Math.min(box[0], p.x), Math.min(box[1], p.y), Math.max(box[2], p.x), Math.max(box[3], p.y)];
    const span = Math.hypot(box[2] - box[0], box[3] - box[1]);
    let placed = false;
    for (const m of models) {
      if ((left.get(m.armModelId) ?? 0) <= 0 || span > 2 * m.reach.maxReach || !group.every((p) => reaches(m, p))) continue;
      const it = placementSteps({
        reach: m.reach, points: group, minMarginMm: q.minMarginMm, yawMinDeg: -180, yawMaxDeg: 180, yawStepDeg: 15,
        mountHeightMm: q.mountHeightMm, floor: q.floor, boundaries: q.boundaries, neighbours, gridMm: 25, candidateCount: 3,
      });
      let s = it.next();
      while (!s.done) {
        if (now() > deadline) break;
        s = it.next();
      }
      if (!s.done) {
        timedOut = true;
        break;
      }
      const best = s.value.candidates[0];
      if (!best) continue;
      const id = newId();
      arms.push({ id, armModelId: m.armModelId, x: best.x, y: best.y, yawDeg: best.yawDeg, mountHeightMm: q.mountHeightMm, pointIds: group.map((p) => p.id), worstMarginMm: best.worstMarginMm });
      neighbours.push({ id, restricted: armPose({ x: best.x, y: best.y, yaw: best.yawDeg }).placePolygons(m.reach.restricted) });
      left.set(m.armModelId, (left.get(m.armModelId) ?? 0) - 1);
      placed = true;
      break;
    }
    if (placed) {
      done += group.length;
    } else if (timedOut) {
      unassigned.push(...group.map((p) => p.id));
    } else if (group.length > 1 && [...left.values()].some((n) => n > 0)) {
      const [a, b] = splitTwo(group, rand);
      queue.unshift(a, b);
    } else {
      unassigned.push(...group.map((p) => p.id));
      done += group.length;
    }
    yield { progress: total ? done / total : 1, placed: arms.length };
  }
  return { arms, unreachable, unassigned, timedOut };
}

/** Runs the auto-layout to the end. */
export function autoLayout(q: AutoLayoutQuery): AutoLayoutResult {
  const it = autoLayoutSteps(q);
  for (;;) {
    const s = it.next();
    if (s.done) return s.value;
  }
}

/** The layout content with the proposal's arms in place of the current ones, and its points assigned to them. */
export function proposalContent(content: Readonly<LayoutContent>, r: Readonly<AutoLayoutResult>): LayoutContent {
  const owner = new Map<string, string>();
  for (const a of r.arms) for (const p of a.pointIds) owner.set(p, a.id);
  const arms: ArmPlacement[] = r.arms.map((a) => ({ id: a.id, armModelId: a.armModelId, label: '', x: a.x, y: a.y, yaw: a.yawDeg, mountHeight: a.mountHeightMm }));
  return {
    ...content,
    arms,
    workPoints: content.workPoints.map((p) => {
      const { assignedArm: _drop, ...rest } = p;
      const o = owner.get(p.id);
      return o ? { ...rest, assignedArm: o } : rest;
    }),
  };
}

/** Scores of an analysed layout, for comparing the current layout with a proposal: shared zone (m²), guarded area (convex hull of every restricted space, m²), unreached points. */
export function layoutScore(a: Readonly<AnalysisResult>): { sharedZoneM2: number; guardedAreaM2: number; unreachedPoints: number } {
  const shared = a.sharedZones.reduce((s, o) => s + o.areaM2, 0);
  const pts: Pt[] = [];
  for (const id of Object.keys(a.regions)) for (const poly of geoJSONToPolygons(a.regions[id].restricted)) for (const v of poly[0] ?? []) pts.push(v);
  const hull = convexHull(pts);
  return {
    sharedZoneM2: Math.round(shared * 100) / 100,
    guardedAreaM2: hull.length >= 3 ? Math.round(Math.abs(polygonArea([hull])) / 1e4) / 100 : 0,
    unreachedPoints: a.findings.filter((f) => f.kind === 'unreached-point').length,
  };
}
