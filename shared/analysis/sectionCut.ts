import { toRadians } from '../geometry/angles';
import { clipUnion } from '../geometry/clipper';
import { armPose, type PosePlacement } from '../geometry/frames';
import { planPoint, type Polygon2, type Pt } from '../geometry/types';
import { profileColumnIndex } from '../kinematics/profile';
import type { ArmEnvelope } from './types';

/**
 * One arm's space cut by the vertical plane of a section line (see section.ts for the section
 * coordinates: s along the line from its start, z above the floor, mm). The space is the arm's
 * envelope, a side profile in (r, z) turned about J1 over its J1 range. The line is sampled along s;
 * at each s the plan point is taken into the arm frame, and when its bearing can be reached within
 * the J1 range (allowing for the sideways spread of the reach plane) the profile's vertical slice at
 * that radial distance is the cut there. The entry and exit of each piece are found by bisection to
 * well under a millimetre, so distances read off the cut carry only the envelope's own tolerance.
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

/** One arm's space cut by the section plane: polygons in (s, z) and the s-spans they cover, mm. */
export interface SectionCut {
  id: string;
  label: string;
  polygons: Polygon2[];
  spans: Array<[number, number]>;
  zMin: number;
  zMax: number;
}

/** At most this many sample columns per arm; the step grows beyond the tolerance on very long cuts. */
const MAX_COLUMNS = 3000;
/** Smallest sample step, mm (an exact profile states tolerance 0). */
const MIN_STEP_MM = 1;
/** Bisection steps at each entry and exit of a cut (halves the sample step each time). */
const EDGE_BISECTIONS = 30;
const ANGLE_EPS = 1e-9;

export interface Frame {
  ax: number;
  ay: number;
  dx: number;
  dy: number;
  length: number;
}

export function frameOf(line: SectionLine): Frame {
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
    if (h === 0) return iv;
    for (const p of iv) {
      p[0] += h;
      p[1] += h;
    }
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
  for (let m = 0; m < list.length; m++) {
    if (!overlaps(a, list[m])) continue;
    count++;
    last = m;
  }
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
