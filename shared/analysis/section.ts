import { toRadians } from '../geometry/angles';
import { clipUnion } from '../geometry/clipper';
import { armPose, type PosePlacement } from '../geometry/frames';
import { pointInPolygons } from '../geometry/pointInPolygon';
import { planPoint, type Polygon2, type Pt } from '../geometry/types';
import { profileColumnIndex } from '../kinematics/profile';
import type { Zone } from '../schemas/layout';
import { subtractOpenings } from './segments';
import type { ArmEnvelope, PreparedFloor, StructureItem } from './types';

/**
 * The section: a side view along a line drawn on the plan. Section coordinates are s = distance
 * along the line from its start A, mm, and z = height above finished floor level, mm. Everything
 * the vertical plane through the line meets is given in (s, z): the floor, structure items with
 * their tops, fences with their heights, and each arm's space cut by the plane.
 *
 * An arm's space is its envelope (a side profile in (r, z) turned about J1 over its J1 range). The
 * plane is sampled along s; at each s the plan point is taken into the arm frame, and when its
 * bearing can be reached within the J1 range (allowing for the sideways spread of the reach plane)
 * the profile's vertical slice at that radial distance is the cut there. The entry and exit of
 * each piece are found by bisection to well under a millimetre, so distances to a fence are exact
 * up to the envelope's own tolerance.
 */

/** A section line: start A and end A′ on the plan, mm. */
export type SectionLine = readonly [readonly [number, number], readonly [number, number]];

/** One placed arm as the section needs it: pose on the plan and its envelope. */
export interface SectionArm {
  id: string;
  label: string;
  pose: Readonly<PosePlacement>;
  envelope: Readonly<ArmEnvelope>;
}

export interface SectionInput {
  line: SectionLine;
  floor: PreparedFloor | null;
  zones: ReadonlyArray<Zone>;
  arms: ReadonlyArray<SectionArm>;
}

/** A structure item crossed by the section: its s-interval and top (null = full height), mm. */
export interface SectionStructure {
  id: string;
  layer: string;
  role: StructureItem['role'];
  s: [number, number];
  top: number | null;
}

/** A solid part of a fence crossed by the section, at s, with the fence's height, mm. */
export interface SectionFence {
  id: string;
  label: string;
  s: number;
  height: number;
}

/** An access opening crossed by the section, at s, mm. */
export interface SectionOpening {
  id: string;
  label: string;
  s: number;
}

/** One arm's space cut by the section plane: polygons in (s, z) and the s-spans they cover, mm. */
export interface SectionCut {
  id: string;
  label: string;
  polygons: Polygon2[];
  spans: Array<[number, number]>;
  zMin: number;
  zMax: number;
}

/**
 * The numbers at a fence (names as in ISO 13857's reach-over tables): b = fence height, a = highest
 * point of any arm space in the section, c = horizontal distance in s from the fence to the nearest
 * arm space (0 when the space reaches the fence's s), mm. `toS` is the s of that nearest space boundary.
 */
export interface SectionDimension {
  fenceId: string;
  s: number;
  b: number;
  a: number | null;
  c: number | null;
  armId: string | null;
  toS: number | null;
}

export interface SectionResult {
  line: [[number, number], [number, number]];
  lengthMm: number;
  /** s-intervals where the line is over the floor (the whole line when the plan has no boundary). */
  floor: Array<[number, number]>;
  structures: SectionStructure[];
  fences: SectionFence[];
  openings: SectionOpening[];
  arms: SectionCut[];
  dimensions: SectionDimension[];
}

/** At most this many sample columns per arm; the step grows beyond the tolerance on very long cuts. */
const MAX_COLUMNS = 3000;
/** Smallest sample step, mm (an exact profile states tolerance 0). */
const MIN_STEP_MM = 1;
/** Bisection steps at each entry and exit of a cut (halves the sample step each time). */
const EDGE_BISECTIONS = 30;
const ANGLE_EPS = 1e-9;

interface Frame {
  ax: number;
  ay: number;
  dx: number;
  dy: number;
  length: number;
}

function frameOf(line: SectionLine): Frame {
  if (!Array.isArray(line) || line.length !== 2 || !line.every((p) => Array.isArray(p) && p.length === 2)) {
    throw new Error('section line: give two plan points [[x, y], [x, y]]');
  }
  const [[ax, ay], [bx, by]] = line;
  for (const [name, v] of [['start x', ax], ['start y', ay], ['end x', bx], ['end y', by]] as const) {
    if (!Number.isFinite(v)) throw new Error(`section line: ${name} must be a finite number`);
  }
  const length = Math.hypot(bx - ax, by - ay);
  if (!(length >= 1)) throw new Error('section line: its two ends must be at least 1 mm apart');
  return { ax, ay, dx: (bx - ax) / length, dy: (by - ay) / length, length };
}

/** Throws a short message when a section line is not two finite plan points at least 1 mm apart. */
export function checkSectionLine(line: SectionLine): void {
  frameOf(line);
}

/** Parameters s (mm along the line) where the section segment crosses segment pq. */
function crossingS(f: Frame, p: Readonly<Pt>, q: Readonly<Pt>, out: number[]): void {
  const ex = q[0] - p[0];
  const ey = q[1] - p[1];
  const den = f.dx * ey - f.dy * ex;
  if (Math.abs(den) < 1e-12) return; // parallel: the midpoint tests decide what is inside
  const wx = p[0] - f.ax;
  const wy = p[1] - f.ay;
  const s = (wx * ey - wy * ex) / den;
  const u = (wx * f.dy - wy * f.dx) / den;
  if (s >= 0 && s <= f.length && u >= 0 && u <= 1) out.push(s);
}

/** s-intervals of the section segment inside polygons (even–odd with holes), mm. */
function insideIntervals(f: Frame, polygons: ReadonlyArray<Polygon2>): Array<[number, number]> {
  const cuts = [0, f.length];
  for (const poly of polygons) for (const ring of poly) for (let i = 0; i < ring.length; i++) crossingS(f, ring[i], ring[(i + 1) % ring.length], cuts);
  cuts.sort((a, b) => a - b);
  const out: Array<[number, number]> = [];
  for (let i = 0; i + 1 < cuts.length; i++) {
    const s0 = cuts[i];
    const s1 = cuts[i + 1];
    if (s1 - s0 < 1e-9) continue;
    const m = (s0 + s1) / 2;
    if (!pointInPolygons(f.ax + f.dx * m, f.ay + f.dy * m, polygons)) continue;
    const last = out[out.length - 1];
    if (last && s0 - last[1] <= 1e-9) last[1] = s1;
    else out.push([s0, s1]);
  }
  return out;
}

function polylineCrossings(f: Frame, line: ReadonlyArray<Readonly<Pt>>): number[] {
  const out: number[] = [];
  for (let i = 0; i + 1 < line.length; i++) crossingS(f, line[i], line[i + 1], out);
  return [...new Set(out)].sort((a, b) => a - b);
}

function structuresCrossed(f: Frame, floor: PreparedFloor | null): SectionStructure[] {
  const out: SectionStructure[] = [];
  for (const item of floor?.structures ?? []) {
    const top = Number.isFinite(item.top) ? item.top : null;
    const base = { id: item.id, layer: item.layer, role: item.role, top };
    for (const s of insideIntervals(f, item.polygons)) out.push({ ...base, s });
    for (const l of item.lines) for (const s of polylineCrossings(f, l)) out.push({ ...base, s: [s, s] });
  }
  return out.sort((a, b) => a.s[0] - b.s[0] || (a.id < b.id ? -1 : 1));
}

/** Whether a J1 interval [lo, hi] (radians) meets the range [min, max] (radians, any winding). */
function meetsRange(lo: number, hi: number, min: number, max: number): boolean {
  const span = max - min;
  if (span >= 2 * Math.PI - ANGLE_EPS) return true;
  const TWO_PI = 2 * Math.PI;
  let d = (lo - min) % TWO_PI;
  if (d < 0) d += TWO_PI;
  return d <= span + ANGLE_EPS || d + (hi - lo) >= TWO_PI - ANGLE_EPS;
}

interface Column {
  s: number;
  iv: Array<[number, number]>;
}

/** Sorted, merged union of interval lists. */
function mergeIntervals(list: Array<[number, number]>): Array<[number, number]> {
  list.sort((a, b) => a[0] - b[0]);
  const out: Array<[number, number]> = [];
  for (const [a, b] of list) {
    const last = out[out.length - 1];
    if (last && a <= last[1] + 1e-9) last[1] = Math.max(last[1], b);
    else out.push([a, b]);
  }
  return out;
}

/**
 * The column function of one arm: z-intervals (plan heights, mm) of its space above the plan point
 * at s along the section. A point at plan distance ρ from the J1 axis lies in the reach plane when
 * J1 = bearing − atan2(e, ±√(ρ² − e²)) for a lateral offset e of the plane; with e spread over
 * [min, max] those J1 values form one interval (the angle is monotone in e), tested against the J1
 * range. The + root is the front of the profile (r > 0), the − root reaching over behind J1 (r < 0).
 */
function columnFn(f: Frame, arm: SectionArm): (s: number) => Array<[number, number]> {
  const pose = armPose(arm.pose);
  const env = arm.envelope;
  const min = toRadians(env.j1RangeDeg.min);
  const max = toRadians(env.j1RangeDeg.max);
  const e0 = env.lateralMm.min;
  const e1 = env.lateralMm.max;
  const columnAt = columnIndexOf(env.profile);
  const h = pose.mountHeightMm;
  const full = max - min >= 2 * Math.PI - ANGLE_EPS;
  const offPlane = Math.sign(e0) === Math.sign(e1) ? Math.min(Math.abs(e0), Math.abs(e1)) : 0;
  const j1At = (bearing: number, rho: number, e: number, side: 1 | -1) => {
    const ec = Math.max(-rho, Math.min(rho, e));
    return bearing - Math.atan2(ec, side * Math.sqrt(Math.max(0, rho * rho - ec * ec)));
  };
  const inReach = (bearing: number, rho: number, side: 1 | -1) => {
    if (full || rho <= 1e-9) return true;
    const a = j1At(bearing, rho, e0, side);
    const b = j1At(bearing, rho, e1, side);
    return meetsRange(Math.min(a, b), Math.max(a, b), min, max);
  };
  const lift = (iv: Array<[number, number]>): Array<[number, number]> => {
    if (h !== 0) for (const p of iv) (p[0] += h), (p[1] += h);
    return iv;
  };
  return (s) => {
    const [u, v] = pose.toArm(planPoint(f.ax + f.dx * s, f.ay + f.dy * s));
    const rho = Math.hypot(u, v);
    if (rho < offPlane) return [];
    const bearing = Math.atan2(v, u);
    const front = inReach(bearing, rho, 1) ? columnAt(rho) : [];
    const back = inReach(bearing, rho, -1) ? columnAt(-rho) : [];
    if (back.length === 0) return lift(front);
    if (front.length === 0) return lift(back);
    return lift(mergeIntervals(front.concat(back)));
  };
}

const columnIndexes = new WeakMap<ReadonlyArray<Polygon2>, (r: number) => Array<[number, number]>>();

/** The column index of an envelope profile, built once per profile object (envelopes are cached per arm model). */
function columnIndexOf(profile: Polygon2[]): (r: number) => Array<[number, number]> {
  let idx = columnIndexes.get(profile);
  if (!idx) columnIndexes.set(profile, (idx = profileColumnIndex({ polygons: profile })));
  return idx;
}

/** Where the section is within reach of an arm at all: [lo, hi] in s, or null. */
function candidateSpan(f: Frame, arm: SectionArm): [number, number] | null {
  let rMax = 0;
  for (const poly of arm.envelope.profile) for (const [r] of poly[0] ?? []) rMax = Math.max(rMax, Math.abs(r));
  if (rMax === 0) return null;
  const e = Math.max(Math.abs(arm.envelope.lateralMm.min), Math.abs(arm.envelope.lateralMm.max));
  const reach = Math.hypot(rMax, e) + 1;
  const wx = arm.pose.x - f.ax;
  const wy = arm.pose.y - f.ay;
  const along = wx * f.dx + wy * f.dy;
  const off = wx * f.dy - wy * f.dx;
  if (Math.abs(off) >= reach) return null;
  const half = Math.sqrt(reach * reach - off * off);
  const lo = Math.max(0, along - half);
  const hi = Math.min(f.length, along + half);
  return hi > lo ? [lo, hi] : null;
}

/** Samples one arm's column function along s, with entries and exits refined by bisection. */
function sampleColumns(f: Frame, arm: SectionArm, span: [number, number]): Column[] {
  const col = columnFn(f, arm);
  const [lo, hi] = span;
  const step = Math.max(arm.envelope.toleranceMm, MIN_STEP_MM, (hi - lo) / MAX_COLUMNS);
  const n = Math.max(1, Math.ceil((hi - lo) / step));
  const raw: Column[] = [];
  for (let i = 0; i <= n; i++) {
    const s = i === n ? hi : lo + ((hi - lo) * i) / n;
    raw.push({ s, iv: col(s) });
  }
  // The point of the line nearest the J1 axis is where the cut is deepest: sample it exactly.
  const along = (arm.pose.x - f.ax) * f.dx + (arm.pose.y - f.ay) * f.dy;
  if (along > lo && along < hi) {
    const k = raw.findIndex((c) => c.s >= along);
    if (k > 0 && raw[k].s !== along) raw.splice(k, 0, { s: along, iv: col(along) });
  }
  const out: Column[] = [];
  for (let i = 0; i < raw.length; i++) {
    const c = raw[i];
    const prev = raw[i - 1];
    if (prev && (prev.iv.length === 0) !== (c.iv.length === 0)) {
      // Bisect between an empty and a filled column; keep the filled end nearest the boundary.
      const prevFilled = prev.iv.length > 0;
      let a = prev.s;
      let b = c.s;
      let edge: Column | null = null;
      for (let k = 0; k < EDGE_BISECTIONS && b - a > 1e-7; k++) {
        const m = (a + b) / 2;
        const iv = col(m);
        if ((iv.length > 0) === prevFilled) a = m;
        else b = m;
        if (iv.length > 0) edge = { s: m, iv };
      }
      if (edge && edge.s !== prev.s && edge.s !== c.s) out.push(edge);
    }
    out.push(c);
  }
  return out;
}

/** Joins sampled columns into (s, z) polygons: runs of one-to-one matched intervals, bridged where they split or merge. */
type Run = { lower: Pt[]; upper: Pt[] };

const overlaps = (a: Readonly<[number, number]>, b: Readonly<[number, number]>) => a[0] <= b[1] && b[0] <= a[1];

/** How many intervals of `list` overlap `a`, and the last one that does (−1 for none). */
function overlapOf(a: Readonly<[number, number]>, list: ReadonlyArray<[number, number]>): { count: number; last: number } {
  let count = 0;
  let last = -1;
  for (let m = 0; m < list.length; m++) if (overlaps(a, list[m])) (count++, (last = m));
  return { count, last };
}

/** Joins sampled columns into (s, z) polygons: runs of one-to-one matched intervals, bridged where they split or merge. */
function columnsToPolygons(cols: ReadonlyArray<Column>): Polygon2[] {
  const pieces: Polygon2[] = [];
  const close = (r: Run) => {
    if (r.lower.length > 1) pieces.push([r.lower.concat(r.upper.reverse())]);
  };
  let runs: Array<Run | null> = [];
  for (let i = 0; i < cols.length; i++) {
    const c = cols[i];
    const prev = i > 0 ? cols[i - 1] : null;
    const next: Array<Run | null> = new Array(c.iv.length).fill(null);
    if (prev) {
      for (let k = 0; k < prev.iv.length; k++) {
        const a = prev.iv[k];
        const run = runs[k];
        const fwd = overlapOf(a, c.iv);
        if (run && fwd.count === 1 && overlapOf(c.iv[fwd.last], prev.iv).count === 1) {
          next[fwd.last] = run;
          continue;
        }
        if (run) close(run);
        for (let m = 0; m < c.iv.length; m++) {
          const b = c.iv[m];
          if (overlaps(a, b)) pieces.push([[[prev.s, a[0]], [c.s, b[0]], [c.s, b[1]], [prev.s, a[1]]]]);
        }
      }
    }
    for (let m = 0; m < c.iv.length; m++) {
      const b = c.iv[m];
      const run = next[m] ?? { lower: [], upper: [] };
      run.lower.push([c.s, b[0]]);
      run.upper.push([c.s, b[1]]);
      next[m] = run;
    }
    runs = next;
  }
  for (const r of runs) if (r) close(r);
  return pieces.length ? clipUnion(pieces) : [];
}

function spansOf(cols: ReadonlyArray<Column>): Array<[number, number]> {
  const spans: Array<[number, number]> = [];
  let open: [number, number] | null = null;
  for (const c of cols) {
    if (c.iv.length) {
      if (open) open[1] = c.s;
      else spans.push((open = [c.s, c.s]));
    } else open = null;
  }
  return spans;
}

/** One arm's space cut by the section plane (see the file comment), (s, z) mm; null when the line misses it. */
export function sectionCutOf(line: SectionLine, arm: SectionArm): SectionCut | null {
  const f = frameOf(line);
  const span = candidateSpan(f, arm);
  if (!span) return null;
  const cols = sampleColumns(f, arm, span);
  const spans = spansOf(cols);
  if (spans.length === 0) return null;
  let zMin = Infinity;
  let zMax = -Infinity;
  for (const c of cols) for (const [z0, z1] of c.iv) {
    if (z0 < zMin) zMin = z0;
    if (z1 > zMax) zMax = z1;
  }
  return { id: arm.id, label: arm.label, polygons: columnsToPolygons(cols), spans, zMin, zMax };
}

/**
 * The side view along a section line (plan mm): floor extent, structure pieces, fences and
 * openings crossed, each arm's space cut by the vertical plane, and the b/a/c numbers at each
 * fence, all in section coordinates (s along the line from its start, z above the floor), mm.
 */
export function sectionOf(input: Readonly<SectionInput>): SectionResult {
  const f = frameOf(input.line);
  const floor = input.floor && input.floor.boundary.length ? insideIntervals(f, input.floor.boundary) : [[0, f.length] as [number, number]];
  const structures = structuresCrossed(f, input.floor);

  const fences: SectionFence[] = [];
  const openings: SectionOpening[] = [];
  const openingZones = input.zones.filter((z) => z.kind === 'opening');
  for (const z of input.zones) {
    if (z.kind === 'fence') {
      const cuts = openingZones.filter((o) => o.fenceId === z.id).map((o) => [o.points[0], o.points[1]] as const);
      for (const part of subtractOpenings(z.points, cuts)) {
        for (const s of polylineCrossings(f, part)) fences.push({ id: z.id, label: z.label || z.id, s, height: z.height ?? 0 });
      }
    } else if (z.kind === 'opening') {
      for (const s of polylineCrossings(f, z.points)) openings.push({ id: z.id, label: z.label || z.id, s });
    }
  }
  fences.sort((a, b) => a.s - b.s);
  openings.sort((a, b) => a.s - b.s);

  const arms: SectionCut[] = [];
  for (const arm of input.arms) {
    const cut = sectionCutOf(input.line, arm);
    if (cut) arms.push(cut);
  }
  const a = arms.length ? Math.max(...arms.map((c) => c.zMax)) : null;
  const dimensions: SectionDimension[] = fences.map((fence) => {
    let best: { c: number; armId: string; toS: number } | null = null;
    for (const cut of arms) {
      for (const [s0, s1] of cut.spans) {
        const cand = fence.s < s0 ? { c: s0 - fence.s, toS: s0 } : fence.s > s1 ? { c: fence.s - s1, toS: s1 } : { c: 0, toS: fence.s };
        if (!best || cand.c < best.c) best = { ...cand, armId: cut.id };
      }
    }
    return { fenceId: fence.id, s: fence.s, b: fence.height, a, c: best?.c ?? null, armId: best?.armId ?? null, toS: best?.toS ?? null };
  });

  const [[ax, ay], [bx, by]] = input.line;
  return { line: [[ax, ay], [bx, by]], lengthMm: f.length, floor, structures, fences, openings, arms, dimensions };
}
