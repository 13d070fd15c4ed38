import type { Polygon2 } from '../geometry/types';
import { ReadableError } from '../schemas/errors';
import type { Boundary } from '../schemas/layout';
import { candidateScores } from './placementRank';
import { siteContext, type SiteContext, type SiteVerdict } from './placementSite';
import type { ArmReach, PreparedFloor } from './types';

/**
 * Placement search: every base position (plan mm) and best yaw (deg) on a grid where one arm reaches
 * every chosen work point with at least the minimum margin, stands on the floor off structure, and
 * keeps its restricted space out of structure (by height), keep-outs and operator areas.
 *
 * The worst margin of a base is max over yaws of min over points of the reach's signed margin (the
 * same `margin` the coverage uses). It is evaluated coarse to fine: a coarse grid over the box where
 * every point is within maximum reach, a map grid inside coarse cells that can still pass (margins
 * are distances, so a cell more than a few half-diagonals short cannot contain a passing spot), the
 * final grid along the map's feasible edge (for the area) and around the best spots (candidates).
 * Site tests run only where the margin test passes. The search is a generator so the Web Worker can
 * post progress and stop between steps; the server runs it to the end.
 */

/** A work point to reach (plan mm, z above floor). */
export interface PlacementPoint {
  id: string;
  x: number;
  y: number;
  z: number;
  approach?: 'top' | 'any';
}

/** An arm already on the layout: its id and its restricted space placed on the plan (mm). */
export interface PlacementNeighbour {
  id: string;
  restricted: Polygon2[];
}

export interface PlacementQuery {
  /** The arm's reach under its restricting J1 limits (armReachFor). */
  reach: ArmReach;
  points: ReadonlyArray<PlacementPoint>;
  minMarginMm: number;
  yawMinDeg: number;
  yawMaxDeg: number;
  yawStepDeg: number;
  mountHeightMm: number;
  floor: PreparedFloor | null;
  boundaries: ReadonlyArray<Boundary>;
  neighbours?: ReadonlyArray<PlacementNeighbour>;
  /** Final resolution, mm (default 10). */
  gridMm?: number;
  /** How many candidates to return (default 5). */
  candidateCount?: number;
}

/** Cell reason codes (`PlacementMap.reason`). */
export const REASON = { ok: 0, pointShort: 1, offFloor: 2, baseOnStructure: 3, intoStructure: 4, intoKeepout: 5, intoOperator: 6, farShort: 7 } as const;

/** The placement map: cell (i, j) has its centre at origin + ((i + ½)·gridMm, (j + ½)·gridMm), index j·cols + i. */
export interface PlacementMap {
  gridMm: number;
  origin: [number, number];
  cols: number;
  rows: number;
  /** Worst margin of the cell's best yaw, mm; NaN = infeasible. */
  worstMarginMm: Float64Array;
  /** Best yaw, deg (NaN where no yaw passes). */
  yawDeg: Float64Array;
  /** REASON code; `reasonRef` indexes `names.points`, `names.items` or `names.areas`; `reasonValue` is a shortfall, mm. */
  reason: Uint8Array;
  reasonRef: Int32Array;
  reasonValue: Float32Array;
}

export interface PlacementNames {
  points: string[];
  /** Structure items: id and role. */
  items: Array<{ id: string; role: string }>;
  /** Keep-outs and operator areas: label. */
  areas: string[];
}

export interface PlacementCandidate {
  x: number;
  y: number;
  yawDeg: number;
  worstMarginMm: number;
  /** The point with the smallest margin there. */
  limitingPointId: string;
  /** Restricted space shared with the arms already placed, m². */
  sharedZoneM2: number;
  /** Perimeter of the convex hull around the restricted spaces of this arm and the placed ones, mm. */
  fenceLengthMm: number;
}

/** The most limiting reason for one point (always listed; the answer when nothing is feasible). */
export interface PointLimit {
  pointId: string;
  reason: string;
  /** How far short of the minimum margin, mm, when the margin is what limits; else null. */
  shortMm: number | null;
}

export interface PlacementResult {
  map: PlacementMap;
  names: PlacementNames;
  candidates: PlacementCandidate[];
  feasibleAreaM2: number;
  limits: PointLimit[];
}

/** What the generator yields between steps: progress 0…1 and the map as far as it is refined. */
export interface PlacementProgress {
  progress: number;
  stage: 'coarse' | 'map' | 'edge' | 'candidates';
  map: PlacementMap;
  names: PlacementNames;
}

const COARSE_MM = 250;
const MAP_MM = 50;
/** Bound on how fast a worst margin changes as the base moves (mm per mm): 1 for distances; J1 arc margins can change up to about √(π² + 1) ≈ 3.3. */
const MARGIN_SLOPE = 3.3;
const MAX_YAWS = 721;
/** How many other passing yaws a cell tries when the best one fails a site test. */
const ALT_YAWS = 8;

/** The yaws a query allows, deg: yawMin, yawMin + step, … ≤ yawMax; a full turn does not repeat its end. */
export function yawList(minDeg: number, maxDeg: number, stepDeg: number): number[] {
  if (!(stepDeg > 0)) throw new Error('yawStepDeg must be greater than 0');
  if (!(maxDeg >= minDeg)) throw new Error('yawMaxDeg must not be below yawMinDeg');
  const n = Math.floor((maxDeg - minDeg) / stepDeg + 1e-9) + 1;
  if (n > MAX_YAWS) throw new Error(`too many yaw steps (${n}); use a larger yawStepDeg`);
  const out: number[] = [];
  for (let k = 0; k < n; k++) out.push(Math.round((minDeg + k * stepDeg) * 1e6) / 1e6);
  if (out.length > 1 && maxDeg - minDeg >= 360 - 1e-9 && Math.abs(out[out.length - 1] - out[0] - 360) < 1e-6) out.pop();
  return out;
}

interface Evaluator {
  /** Max over yaws of min over points of margin at base (x, y): value, yaw index, limiting point index. */
  margin(x: number, y: number, hint: number): { m: number; yi: number; pi: number };
  /** Yaw indices whose worst margin passes, best first. */
  passingYaws(x: number, y: number): Array<{ m: number; yi: number; pi: number }>;
}

function evaluator(q: PlacementQuery, yaws: number[]): Evaluator {
  const n = q.points.length;
  const px = Float64Array.from(q.points, (p) => p.x);
  const py = Float64Array.from(q.points, (p) => p.y);
  const pz = Float64Array.from(q.points, (p) => p.z - q.mountHeightMm);
  const pa = q.points.map((p) => p.approach ?? 'top');
  // cos and sin as the arm pose computes them ((deg·π)/180), so a candidate's margins equal the analysis' ones.
  const cs = Float64Array.from(yaws, (d) => Math.cos((d * Math.PI) / 180));
  const sn = Float64Array.from(yaws, (d) => Math.sin((d * Math.PI) / 180));
  const order = Int32Array.from({ length: n }, (_, i) => i);
  const margin = q.reach.margin;
  const worstAt = (x: number, y: number, yi: number, floor: number): { m: number; pi: number } => {
    const c = cs[yi], s = sn[yi];
    let worst = Infinity, wp = order[0];
    for (let k = 0; k < n; k++) {
      const i = order[k];
      const dx = px[i] - x, dy = py[i] - y;
      const m = margin(c * dx + s * dy, -s * dx + c * dy, pz[i], pa[i]);
      if (m < worst) {
        worst = m;
        wp = i;
        if (worst < floor) break;
      }
    }
    return { m: worst, pi: wp };
  };
  return {
    margin(x, y, hint) {
      let best = -Infinity, by = 0, bp = order[0];
      const count = yaws.length;
      const start = hint >= 0 && hint < count ? hint : 0;
      for (let k = 0; k < count; k++) {
        const yi = (start + k) % count;
        const r = worstAt(x, y, yi, best);
        if (r.m > best) {
          best = r.m;
          by = yi;
          bp = r.pi;
        }
      }
      // Try the limiting point first next time: it ends most yaws after one margin.
      const at = order.indexOf(bp);
      if (at > 0) {
        order.copyWithin(1, 0, at);
        order[0] = bp;
      }
      return { m: best, yi: by, pi: bp };
    },
    passingYaws(x, y) {
      const out: Array<{ m: number; yi: number; pi: number }> = [];
      for (let yi = 0; yi < yaws.length; yi++) {
        const r = worstAt(x, y, yi, q.minMarginMm);
        if (r.m >= q.minMarginMm) out.push({ m: r.m, yi, pi: r.pi });
      }
      return out.sort((a, b) => b.m - a.m || a.yi - b.yi);
    },
  };
}

interface CellOutcome {
  m: number;
  yi: number;
  reason: number;
  ref: number;
  value: number;
}

const SITE_REASON: Record<Exclude<SiteVerdict, { ok: true }>['kind'], number> = {
  'off-floor': REASON.offFloor,
  'base-on-structure': REASON.baseOnStructure,
  'into-structure': REASON.intoStructure,
  'into-keepout': REASON.intoKeepout,
  'into-operator': REASON.intoOperator,
};

/** One cell: the margin test for every yaw, then the site tests for the passing yaws, best first. */
function evalCell(ev: Evaluator, site: SiteContext, minMargin: number, x: number, y: number, hint: number): CellOutcome {
  const r = ev.margin(x, y, hint);
  if (!(r.m >= minMargin)) return { m: r.m, yi: r.yi, reason: REASON.pointShort, ref: r.pi, value: minMargin - r.m };
  const base = site.baseVerdict(x, y);
  if (!base.ok) return { m: r.m, yi: r.yi, reason: SITE_REASON[base.kind], ref: 'ref' in base ? base.ref : -1, value: 0 };
  let v = site.test(x, y, r.yi);
  if (v.ok) return { m: r.m, yi: r.yi, reason: REASON.ok, ref: -1, value: 0 };
  const first = v;
  if (!site.turnInvariant) {
    // Other yaws that pass the margin, best first: up to ALT_YAWS of them, spread over the list.
    const alts = ev.passingYaws(x, y).filter((a) => a.yi !== r.yi);
    const stride = Math.max(1, Math.ceil(alts.length / ALT_YAWS));
    for (let k = 0; k < alts.length; k += stride) {
      v = site.test(x, y, alts[k].yi);
      if (v.ok) return { m: alts[k].m, yi: alts[k].yi, reason: REASON.ok, ref: -1, value: 0 };
    }
  }
  return { m: r.m, yi: r.yi, reason: SITE_REASON[(first as Exclude<SiteVerdict, { ok: true }>).kind], ref: 'ref' in first ? first.ref : -1, value: 0 };
}

function emptyMap(gridMm: number, origin: [number, number], cols: number, rows: number): PlacementMap {
  const n = cols * rows;
  return {
    gridMm, origin, cols, rows,
    worstMarginMm: new Float64Array(n).fill(NaN),
    yawDeg: new Float64Array(n).fill(NaN),
    reason: new Uint8Array(n).fill(REASON.pointShort),
    reasonRef: new Int32Array(n).fill(-1),
    reasonValue: new Float32Array(n),
  };
}

function store(map: PlacementMap, k: number, o: CellOutcome, yaws: number[]) {
  const ok = o.reason === REASON.ok;
  map.worstMarginMm[k] = ok ? o.m : NaN;
  map.yawDeg[k] = ok ? yaws[o.yi] : NaN;
  map.reason[k] = o.reason;
  map.reasonRef[k] = o.ref;
  map.reasonValue[k] = o.value;
}

/** Checks the query's numbers once, with messages naming the field. */
function checkQuery(q: PlacementQuery) {
  if (q.points.length === 0) throw new ReadableError('Choose at least one work point');
  if (!Number.isFinite(q.minMarginMm)) throw new Error('minMarginMm must be a number');
  if (!Number.isFinite(q.mountHeightMm)) throw new Error('mountHeightMm must be a number');
  const g = q.gridMm ?? 10;
  if (!(g >= 1 && g <= MAP_MM)) throw new Error(`gridMm must be between 1 and ${MAP_MM} mm`);
}

/** The placement search as steps (see the file comment); the generator's return value is the result. */
export function* placementSteps(q: PlacementQuery): Generator<PlacementProgress, PlacementResult, void> {
  checkQuery(q);
  const yaws = yawList(q.yawMinDeg, q.yawMaxDeg, q.yawStepDeg);
  const fine = q.gridMm ?? 10;
  const ev = evaluator(q, yaws);
  const site = siteContext(q.reach, yaws, q.mountHeightMm, q.floor, q.boundaries, q.points);
  const names: PlacementNames = {
    points: q.points.map((p) => p.id),
    items: (q.floor?.structures ?? []).map((s) => ({ id: s.id, role: s.role })),
    areas: site.areas.map((a) => `${a.kind === 'operator' ? 'operator area' : 'keep-out'} ${a.label}`),
  };
  const R = q.reach.maxReach;
  // Every point within maximum reach: the intersection of the points' reach squares (and the floor's box).
  let minX = -Infinity, minY = -Infinity, maxX = Infinity, maxY = Infinity;
  for (const p of q.points) {
    minX = Math.max(minX, p.x - R);
    maxX = Math.min(maxX, p.x + R);
    minY = Math.max(minY, p.y - R);
    maxY = Math.min(maxY, p.y + R);
  }
  if (q.floor?.outline.length) {
    let fx0 = Infinity, fy0 = Infinity, fx1 = -Infinity, fy1 = -Infinity;
    for (const poly of q.floor.outline) for (const [x, y] of poly[0] ?? []) {
      fx0 = Math.min(fx0, x); fx1 = Math.max(fx1, x); fy0 = Math.min(fy0, y); fy1 = Math.max(fy1, y);
    }
    minX = Math.max(minX, fx0); maxX = Math.min(maxX, fx1); minY = Math.max(minY, fy0); maxY = Math.min(maxY, fy1);
  }
  const ox = Math.floor(minX / COARSE_MM) * COARSE_MM;
  const oy = Math.floor(minY / COARSE_MM) * COARSE_MM;
  const ccols = maxX > minX ? Math.ceil((maxX - ox) / COARSE_MM) : 0;
  const crows = maxY > minY ? Math.ceil((maxY - oy) / COARSE_MM) : 0;
  const coarse = emptyMap(COARSE_MM, [ox, oy], ccols, crows);
  let hint = 0;
  for (let j = 0; j < crows; j++) {
    for (let i = 0; i < ccols; i++) {
      const o = evalCell(ev, site, q.minMarginMm, ox + (i + 0.5) * COARSE_MM, oy + (j + 0.5) * COARSE_MM, hint);
      hint = o.yi;
      store(coarse, j * ccols + i, o, yaws);
      // Keep the margin of infeasible-by-margin cells too: the map level prunes with it.
      if (o.reason !== REASON.ok) coarse.yawDeg[j * ccols + i] = o.m;
    }
  }
  yield { progress: 0.1, stage: 'coarse', map: coarse, names };

  // Map level: subdivide every coarse cell that may hold a passing spot.
  const sub = COARSE_MM / MAP_MM;
  const map = emptyMap(MAP_MM, [ox, oy], ccols * sub, crows * sub);
  const pruneBy = MARGIN_SLOPE * COARSE_MM * Math.SQRT1_2;
  let lastYield = 0;
  for (let cj = 0; cj < crows; cj++) {
    for (let ci = 0; ci < ccols; ci++) {
      const ck = cj * ccols + ci;
      const cm = coarse.reason[ck] === REASON.ok ? coarse.worstMarginMm[ck] : coarse.yawDeg[ck];
      const prune = coarse.reason[ck] === REASON.pointShort && cm + pruneBy < q.minMarginMm;
      for (let sj = 0; sj < sub; sj++) {
        for (let si = 0; si < sub; si++) {
          const i = ci * sub + si, j = cj * sub + sj, k = j * map.cols + i;
          if (prune) {
            // Not evaluated: short by at least the coarse shortfall less the slope over the distance.
            const d = Math.hypot((si + 0.5) * MAP_MM - COARSE_MM / 2, (sj + 0.5) * MAP_MM - COARSE_MM / 2);
            map.reason[k] = REASON.farShort;
            map.reasonRef[k] = coarse.reasonRef[ck];
            map.reasonValue[k] = coarse.reasonValue[ck] - MARGIN_SLOPE * d;
            continue;
          }
          const o = evalCell(ev, site, q.minMarginMm, ox + (i + 0.5) * MAP_MM, oy + (j + 0.5) * MAP_MM, hint);
          hint = o.yi;
          store(map, k, o, yaws);
        }
      }
    }
    if (cj - lastYield >= 2 || cj === crows - 1) {
      lastYield = cj;
      yield { progress: 0.1 + 0.6 * ((cj + 1) / Math.max(1, crows)), stage: 'map', map, names };
    }
  }

  // Feasible area: whole map cells inside, the final grid in cells on the feasible edge.
  const fineSub = Math.max(1, Math.round(MAP_MM / fine));
  const fineStep = MAP_MM / fineSub;
  const feasibleAt = (k: number) => !Number.isNaN(map.worstMarginMm[k]);
  let area = 0;
  for (let j = 0; j < map.rows; j++) {
    for (let i = 0; i < map.cols; i++) {
      const k = j * map.cols + i;
      const f = feasibleAt(k);
      let edge = false;
      for (let dj = -1; dj <= 1 && !edge; dj++) for (let di = -1; di <= 1 && !edge; di++) {
        const ni = i + di, nj = j + dj;
        const nf = ni >= 0 && nj >= 0 && ni < map.cols && nj < map.rows ? feasibleAt(nj * map.cols + ni) : false;
        if (nf !== f) edge = true;
      }
      if (!edge) {
        if (f) area += MAP_MM * MAP_MM;
        continue;
      }
      let count = 0;
      const x0 = ox + i * MAP_MM, y0 = oy + j * MAP_MM;
      for (let b = 0; b < fineSub; b++) for (let a = 0; a < fineSub; a++) {
        const o = evalCell(ev, site, q.minMarginMm, x0 + (a + 0.5) * fineStep, y0 + (b + 0.5) * fineStep, hint);
        hint = o.yi;
        if (o.reason === REASON.ok) count++;
      }
      area += count * fineStep * fineStep;
    }
  }
  yield { progress: 0.85, stage: 'edge', map, names };

  // Candidates: the best map cells, apart from each other, refined on the final grid around each.
  const order: number[] = [];
  for (let k = 0; k < map.worstMarginMm.length; k++) if (feasibleAt(k)) order.push(k);
  order.sort((a, b) => map.worstMarginMm[b] - map.worstMarginMm[a] || a - b);
  const want = q.candidateCount ?? 5;
  const picked: Array<{ x: number; y: number }> = [];
  const apart = 2 * COARSE_MM;
  for (const k of order) {
    if (picked.length >= want * 2) break;
    const x = ox + ((k % map.cols) + 0.5) * MAP_MM, y = oy + (Math.floor(k / map.cols) + 0.5) * MAP_MM;
    if (picked.some((p) => Math.hypot(p.x - x, p.y - y) < apart)) continue;
    picked.push({ x, y });
  }
  const refined: Array<{ x: number; y: number; yi: number; m: number; pi: number }> = [];
  for (const p of picked) {
    let best: { x: number; y: number; yi: number; m: number; pi: number } | null = null;
    const half = Math.round(MAP_MM / fineStep);
    for (let b = -half; b <= half; b++) for (let a = -half; a <= half; a++) {
      const x = p.x + a * fineStep, y = p.y + b * fineStep;
      const o = evalCell(ev, site, q.minMarginMm, x, y, hint);
      hint = o.yi;
      if (o.reason !== REASON.ok) continue;
      if (!best || o.m > best.m) best = { x, y, yi: o.yi, m: o.m, pi: ev.margin(x, y, o.yi).pi };
    }
    if (best) refined.push(best);
  }
  yield { progress: 0.92, stage: 'candidates', map, names };
  const scored = refined.map((c) => ({ c, ...candidateScores(q.reach, c.x, c.y, yaws[c.yi], q.neighbours ?? []) }));
  const bucket = (m: number) => Math.floor(m / fine);
  scored.sort((a, b) => bucket(b.c.m) - bucket(a.c.m) || a.sharedZoneM2 - b.sharedZoneM2 || a.fenceLengthMm - b.fenceLengthMm || b.c.m - a.c.m);
  const candidates: PlacementCandidate[] = scored.slice(0, want).map(({ c, sharedZoneM2, fenceLengthMm }) => ({
    x: c.x, y: c.y, yawDeg: yaws[c.yi], worstMarginMm: c.m, limitingPointId: q.points[c.pi].id, sharedZoneM2, fenceLengthMm,
  }));
  const limits = pointLimits(q, yaws, map, names, coarse);
  return { map, names, candidates, feasibleAreaM2: area / 1e6, limits };
}

/** Runs the whole search (the server's way). */
export function placementSearch(q: PlacementQuery): PlacementResult {
  const it = placementSteps(q);
  for (;;) {
    const s = it.next();
    if (s.done) return s.value;
  }
}

/** Best margin one point alone can have from any base (max over the arm frame, sampled at maxReach/60), mm; arm-frame height zArm. */
export function bestAlone(reach: ArmReach, zArm: number, approach: 'top' | 'any'): number {
  const R = reach.maxReach;
  const step = Math.max(5, R / 60);
  let best = -Infinity;
  for (let v = -R; v <= R; v += step) for (let u = -R; u <= R; u += step) {
    const m = reach.margin(u, v, zArm, approach);
    if (m > best) best = m;
  }
  return best;
}

const mmText = (v: number) => String(Math.max(0, Math.round(v)));

/** The text of a cell's reason (hover), or null for a feasible cell. */
export function cellReasonText(map: PlacementMap, names: PlacementNames, k: number): string | null {
  const ref = map.reasonRef[k];
  switch (map.reason[k]) {
    case REASON.ok: return null;
    case REASON.pointShort: return `${names.points[ref] ?? 'a work point'} out of reach by ${mmText(map.reasonValue[k])} mm`;
    case REASON.farShort: return `out of reach by at least ${mmText(map.reasonValue[k])} mm (${names.points[ref] ?? 'a work point'} is short nearby)`;
    case REASON.offFloor: return 'base outside the floor';
    case REASON.baseOnStructure: return `base on ${names.items[ref]?.role ?? 'structure'} ${names.items[ref]?.id ?? ''}`.trim();
    case REASON.intoStructure: return `restricted space enters ${names.items[ref]?.role ?? 'structure'} ${names.items[ref]?.id ?? ''}`.trim();
    case REASON.intoKeepout:
    case REASON.intoOperator: return `restricted space enters ${names.areas[ref] ?? 'an area'}`;
    default: return null;
  }
}

/** Per point, what limits it most: out of reach at its height anywhere, short at the best compromise spot, or the site test that rules out the spots where it is reached. */
function pointLimits(q: PlacementQuery, yaws: number[], map: PlacementMap, names: PlacementNames, coarse: PlacementMap): PointLimit[] {
  // The best compromise spot: the coarse cell with the largest worst margin, feasible or not.
  let bk = -1, bm = -Infinity;
  for (let k = 0; k < coarse.reason.length; k++) {
    const m = coarse.reason[k] === REASON.ok ? coarse.worstMarginMm[k] : coarse.yawDeg[k];
    if (m > bm) { bm = m; bk = k; }
  }
  const siteCounts = new Map<string, number>();
  for (let k = 0; k < map.reason.length; k++) {
    if (map.reason[k] === REASON.ok || map.reason[k] === REASON.pointShort || map.reason[k] === REASON.farShort) continue;
    const t = cellReasonText(map, names, k)!;
    siteCounts.set(t, (siteCounts.get(t) ?? 0) + 1);
  }
  const topSite = [...siteCounts].sort((a, b) => b[1] - a[1] || (a[0] < b[0] ? -1 : 1))[0]?.[0] ?? null;
  const bx = bk >= 0 ? coarse.origin[0] + ((bk % coarse.cols) + 0.5) * coarse.gridMm : NaN;
  const by = bk >= 0 ? coarse.origin[1] + (Math.floor(bk / coarse.cols) + 0.5) * coarse.gridMm : NaN;
  const alone = new Map<string, number>();
  return q.points.map((p) => {
    const zArm = p.z - q.mountHeightMm;
    const key = `${zArm}|${p.approach ?? 'top'}`;
    if (!alone.has(key)) alone.set(key, bestAlone(q.reach, zArm, p.approach ?? 'top'));
    const a = alone.get(key)!;
    if (a < q.minMarginMm) return { pointId: p.id, reason: `${p.id} is out of reach at its height (${Math.round(p.z)} mm) by ${mmText(q.minMarginMm - a)} mm from any base`, shortMm: q.minMarginMm - a };
    if (bk < 0) return { pointId: p.id, reason: `${p.id} cannot be reached together with the other points: no base is within maximum reach of all of them`, shortMm: null };
    if (coarse.reason[bk] === REASON.pointShort && names.points[coarse.reasonRef[bk]] === p.id) {
      return { pointId: p.id, reason: `${p.id} out of reach by ${mmText(coarse.reasonValue[bk])} mm at the best compromise spot`, shortMm: coarse.reasonValue[bk] };
    }
    const single = evaluator({ ...q, points: [p] }, yaws).margin(bx, by, 0);
    if (single.m < q.minMarginMm) return { pointId: p.id, reason: `${p.id} out of reach by ${mmText(q.minMarginMm - single.m)} mm at the best compromise spot`, shortMm: q.minMarginMm - single.m };
    return { pointId: p.id, reason: topSite ? `${p.id} is reached, but where all points are reached: ${topSite}` : `${p.id} is reached`, shortMm: null };
  });
}
