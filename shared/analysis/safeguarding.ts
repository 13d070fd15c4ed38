/**
 * Safeguarding checks of a layout (docs/analysis.md "Safeguarding"): the ISO 13855 separation
 * distance of each safeguarded access opening, the ISO 13857 reach-over and reach-through distances
 * of each fence, and ISO 13854 crushing gaps between a restricted space and structure or fences.
 * The formulas are those of shared/safety; this file measures the layout and compares.
 */
import { pointInPolygons } from '../geometry/pointInPolygon';
import { nearestPointOnSegment, pointSegmentDistance } from '../geometry/segmentDistance';
import type { Polygon2 } from '../geometry/types';
import {
  CRUSHING_GAP_BODY_MM,
  REACH_OVER_MIN_STRUCTURE_MM,
  REACH_OVER_ROWS,
  REACH_THROUGH_ROWS,
  reachOverDistance,
  reachThroughDistance,
  separationDistance,
  type SafeguardDevice,
} from '../safety';
import type { ArmPlacement, Boundary } from '../schemas/layout';
import { makeFinding, regionEdges, type BBox } from './clearance';
import { mm, reasonOf } from './messages';
import { polylineDistanceToPolygons, segmentsIntersectXY, subtractOpenings } from './segments';
import type { ArmReach, Finding, PreparedFloor, SafeguardFenceRow, SafeguardingResult, SafeguardOpeningRow, StructureItem } from './types';

/** Fences farther than this from a restricted space need no reach-over or reach-through distance (the largest value of either table), mm. */
export const FENCE_SAFEGUARD_RANGE_MM = Math.max(...REACH_OVER_ROWS.flatMap((r) => r.cMm), ...REACH_THROUGH_ROWS.map((r) => r.slot));

// The layout schema repeats shared/safety's device and mesh lists (schemas import only zod); passing
// a safeguard to separationDistance and indexing DEVICE_TEXT with it keeps the two lists the same.
/** What each safeguarding device is called in messages. */
export const DEVICE_TEXT: Record<SafeguardDevice, string> = {
  interlock: 'interlocked guard',
  'interlock-locking': 'interlocked guard with guard locking',
  'light-curtain': 'light curtain',
  'multi-beam': 'multi-beam device',
  'single-beam': 'single beam',
};

/** What the safeguarding checks need of one placed arm (plan mm). */
export interface SafeguardArm {
  arm: ArmPlacement;
  reach: ArmReach;
  restricted: Polygon2[];
  bbox: BBox | null;
}

/** Distances of one arm's restricted space to the safeguarded openings and nearby fences, and its crushing-gap findings. */
export interface ArmSafeguardMeasure {
  /** opening id → plan distance from the detection line, mm (filled when an opening check needs it). */
  openings: Map<string, number>;
  /** fence id → plan distance from its solid parts, mm (only fences within FENCE_SAFEGUARD_RANGE_MM). */
  fences: Map<string, number>;
  crushing: Finding[];
}

const round1 = (v: number) => Math.round(v * 10) / 10;
const sec = (v: number) => String(Math.round(v * 1000) / 1000);
const armName = (a: ArmPlacement) => a.label || a.id;

function boxNear(b: BBox | null, pts: ReadonlyArray<readonly [number, number]>, pad: number): boolean {
  if (!b) return false;
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (const [x, y] of pts) {
    if (x < minX) minX = x;
    if (x > maxX) maxX = x;
    if (y < minY) minY = y;
    if (y > maxY) maxY = y;
  }
  return minX <= b[2] + pad && b[0] - pad <= maxX && minY <= b[3] + pad && b[1] - pad <= maxY;
}

/** The fence's parts left when its openings are cut out. */
export function fenceSolidParts(f: Boundary, boundaries: ReadonlyArray<Boundary>): Array<Array<[number, number]>> {
  const cuts = boundaries.filter((o) => o.kind === 'opening' && o.fenceId === f.id && o.points.length === 2).map((o) => [o.points[0], o.points[1]] as const);
  return subtractOpenings(f.points as Array<[number, number]>, cuts as never);
}

/** Closed fence rings (first and last point within 1 mm): the guarded areas. */
function guardedAreas(boundaries: ReadonlyArray<Boundary>): Polygon2[] {
  const out: Polygon2[] = [];
  for (const z of boundaries) {
    if (z.kind !== 'fence' || z.points.length < 4) continue;
    const a = z.points[0];
    const b = z.points[z.points.length - 1];
    if (Math.hypot(a[0] - b[0], a[1] - b[1]) <= 1) out.push([z.points.slice(0, -1).map(([x, y]) => [x, y] as [number, number])]);
  }
  return out;
}

/** A region's edges (flat [ax, ay, bx, by, …]) bucketed in square cells, so a query reads only the edges near it. */
interface EdgeGrid {
  edges: Float64Array;
  cell: number;
  cells: Map<number, number[]>;
  stamp: Uint32Array;
  query: number;
}

const GRID_CELL_MM = 500;
const cellKey = (ix: number, iy: number) => ix * 1_000_003 + iy;

function edgeGrid(region: Polygon2[]): EdgeGrid {
  const edges = regionEdges(region);
  const cells = new Map<number, number[]>();
  for (let e = 0; e < edges.length; e += 4) {
    const x0 = Math.floor(Math.min(edges[e], edges[e + 2]) / GRID_CELL_MM), x1 = Math.floor(Math.max(edges[e], edges[e + 2]) / GRID_CELL_MM);
    const y0 = Math.floor(Math.min(edges[e + 1], edges[e + 3]) / GRID_CELL_MM), y1 = Math.floor(Math.max(edges[e + 1], edges[e + 3]) / GRID_CELL_MM);
    for (let ix = x0; ix <= x1; ix++) {
      for (let iy = y0; iy <= y1; iy++) {
        const k = cellKey(ix, iy);
        let list = cells.get(k);
        if (!list) cells.set(k, (list = []));
        list.push(e);
      }
    }
  }
  return { edges, cell: GRID_CELL_MM, cells, stamp: new Uint32Array(edges.length / 4), query: 0 };
}

/**
 * Shortest gap under `pad` between a region's edges and a set of segments, the spot midway across
 * it and the nearest point on the segments (null when there is none: pairs `pad` or more apart are
 * not measured, and only edges in the grid cells within `pad` of the segments' box are read). A
 * crossing gives a gap of 0 at once.
 */
function nearestGap(g: EdgeGrid, segs: ReadonlyArray<readonly [readonly [number, number], readonly [number, number]]>, box: BBox, pad: number): { d: number; at: [number, number]; onItem: [number, number] } | null {
  // The best pair so far, kept as numbers: (px, py) lies on the region when `fromRegion`, else on
  // the item; its other end is the nearest point on the segment (ax, ay)–(bx, by).
  let bestD = pad;
  let bpx = 0, bpy = 0, bax = 0, bay = 0, bbx = 0, bby = 0, bFromRegion = false;
  const consider = (px: number, py: number, ax: number, ay: number, bx: number, by: number, fromRegion: boolean) => {
    const d = pointSegmentDistance(px, py, ax, ay, bx, by);
    if (d < bestD) {
      bestD = d;
      bpx = px; bpy = py; bax = ax; bay = ay; bbx = bx; bby = by; bFromRegion = fromRegion;
    }
  };
  const q = ++g.query;
  const edges = g.edges;
  const x0 = Math.floor((box[0] - pad) / g.cell), x1 = Math.floor((box[2] + pad) / g.cell);
  const y0 = Math.floor((box[1] - pad) / g.cell), y1 = Math.floor((box[3] + pad) / g.cell);
  for (let ix = x0; ix <= x1; ix++) {
    for (let iy = y0; iy <= y1; iy++) {
      const list = g.cells.get(cellKey(ix, iy));
      if (!list) continue;
      for (const e of list) {
        if (g.stamp[e / 4] === q) continue;
        g.stamp[e / 4] = q;
        const ax = edges[e], ay = edges[e + 1], bx = edges[e + 2], by = edges[e + 3];
        // Edges farther from the box than the best gap so far cannot beat it.
        const r = bestD;
        if (Math.max(ax, bx) < box[0] - r || Math.min(ax, bx) > box[2] + r || Math.max(ay, by) < box[1] - r || Math.min(ay, by) > box[3] + r) continue;
        const eMinX = Math.min(ax, bx), eMaxX = Math.max(ax, bx), eMinY = Math.min(ay, by), eMaxY = Math.max(ay, by);
        for (const [c, d] of segs) {
          // Boxes farther apart than the best gap so far: no crossing, and no pair of points nearer.
          if (Math.min(c[0], d[0]) - eMaxX > bestD || eMinX - Math.max(c[0], d[0]) > bestD || Math.min(c[1], d[1]) - eMaxY > bestD || eMinY - Math.max(c[1], d[1]) > bestD) continue;
          if (segmentsIntersectXY(ax, ay, bx, by, c[0], c[1], d[0], d[1])) return { d: 0, at: [c[0], c[1]], onItem: [c[0], c[1]] };
          consider(ax, ay, c[0], c[1], d[0], d[1], true);
          consider(bx, by, c[0], c[1], d[0], d[1], true);
          consider(c[0], c[1], ax, ay, bx, by, false);
          consider(d[0], d[1], ax, ay, bx, by, false);
        }
      }
    }
  }
  if (bestD === pad) return null;
  const near = nearestPointOnSegment(bpx, bpy, bax, bay, bbx, bby);
  return { d: bestD, at: [(bpx + near[0]) / 2, (bpy + near[1]) / 2], onItem: bFromRegion ? near : [bpx, bpy] };
}

/** With no edge crossing, one vertex each way tells whether the item and the region are nested. */
function itemInside(s: StructureItem, region: Polygon2[]): boolean {
  const v = s.polygons[0]?.[0]?.[0] ?? s.lines[0]?.[0];
  if (v && pointInPolygons(v[0], v[1], region)) return true;
  const w = region[0]?.[0]?.[0];
  return !!w && s.polygons.some((poly) => pointInPolygons(w[0], w[1], [poly]));
}

function segmentsOf(rings: ReadonlyArray<ReadonlyArray<readonly [number, number]>>, closed: boolean) {
  const segs: Array<readonly [readonly [number, number], readonly [number, number]]> = [];
  for (const r of rings) {
    const n = closed ? r.length : r.length - 1;
    for (let k = 0; k < n; k++) segs.push([r[k], r[(k + 1) % r.length]]);
  }
  return segs;
}

/** A structure item's outline and lines as segments, made once per item (items are shared by every arm of the floor). */
const itemSegs = new WeakMap<StructureItem, ReturnType<typeof segmentsOf>>();
function itemSegments(s: StructureItem): ReturnType<typeof segmentsOf> {
  let segs = itemSegs.get(s);
  if (!segs) itemSegs.set(s, (segs = [...segmentsOf(s.polygons.flat(), true), ...segmentsOf(s.lines, false)]));
  return segs;
}

/**
 * One arm's measurements for the safeguarding checks (cached per arm by the analyzer while the arm,
 * the floor and the boundaries stay the same): distances to the safeguarded openings and the fences near
 * it, and the crushing gaps narrower than CRUSHING_GAP_BODY_MM between its restricted space and a
 * wall, column, obstacle or fence. A gap to structure counts when the item's nearest point lies
 * inside a closed fence (the guarded area), or anywhere when the layout has no closed fence.
 */
export function measureArmSafeguarding(p: SafeguardArm, floor: PreparedFloor | null, boundaries: ReadonlyArray<Boundary>): ArmSafeguardMeasure {
  const out: ArmSafeguardMeasure = { openings: new Map(), fences: new Map(), crushing: [] };
  if (!p.restricted.length || !p.bbox) return out;
  const id = p.arm.id;
  const name = armName(p.arm);
  let grid: EdgeGrid | null = null;
  const guarded = guardedAreas(boundaries);
  for (const f of boundaries) {
    if (f.kind !== 'fence' || !boxNear(p.bbox, f.points, FENCE_SAFEGUARD_RANGE_MM)) continue;
    const solid = fenceSolidParts(f, boundaries).filter((l) => boxNear(p.bbox, l, FENCE_SAFEGUARD_RANGE_MM));
    // Only segments that can come within range of the restricted space (it lies within maxReach of the base).
    let d = Infinity;
    for (const l of solid) {
      for (let k = 0; k + 1 < l.length; k++) {
        if (pointSegmentDistance(p.arm.x, p.arm.y, l[k][0], l[k][1], l[k + 1][0], l[k + 1][1]) - p.reach.maxReach > FENCE_SAFEGUARD_RANGE_MM) continue;
        d = Math.min(d, polylineDistanceToPolygons([l[k], l[k + 1]], p.restricted));
      }
    }
    if (d > FENCE_SAFEGUARD_RANGE_MM) continue;
    out.fences.set(f.id, d);
    if (d > 0 && d < CRUSHING_GAP_BODY_MM) {
      grid ??= edgeGrid(p.restricted);
      const segs = segmentsOf(solid, false);
      const b = solid.flat();
      const gap = nearestGap(grid, segs, [Math.min(...b.map((q) => q[0])), Math.min(...b.map((q) => q[1])), Math.max(...b.map((q) => q[0])), Math.max(...b.map((q) => q[1]))], CRUSHING_GAP_BODY_MM);
      out.crushing.push(makeFinding('crushing-gap', [id, f.id], {
        arms: [id], points: [], geometry: null, at: gap?.at ?? null,
        message: `${name}: a gap of only ${mm(d)} mm between the restricted space and fence ${f.label || f.id}; a person standing there can be crushed (ISO 13854 keeps at least ${CRUSHING_GAP_BODY_MM} mm for the body). Close the gap or widen it.`,
        data: { gapMm: mm(d) },
      }));
    }
  }
  if (floor) {
    const byLayer = new Map<string, { d: number; at: [number, number]; items: number; role: string }>();
    for (const s of floor.structures) {
      const bb = s.bbox;
      if (bb[0] > p.bbox[2] + CRUSHING_GAP_BODY_MM || p.bbox[0] > bb[2] + CRUSHING_GAP_BODY_MM || bb[1] > p.bbox[3] + CRUSHING_GAP_BODY_MM || p.bbox[1] > bb[3] + CRUSHING_GAP_BODY_MM) continue;
      // The restricted space lies within maxReach of the base: an item's box farther than that plus the gap is out.
      const dx = Math.max(bb[0] - p.arm.x, 0, p.arm.x - bb[2]);
      const dy = Math.max(bb[1] - p.arm.y, 0, p.arm.y - bb[3]);
      if (Math.hypot(dx, dy) > p.reach.maxReach + CRUSHING_GAP_BODY_MM) continue;
      // An item inside the restricted space, or the restricted space inside the item, is reach
      // into structure (clearance.ts), not a gap; so is an item an edge crosses (nearestGap gives
      // 0 then). The nesting test, a few point-in-polygon tests, goes first: it spares the gap
      // search of every item a vertex of which lies inside.
      if (itemInside(s, p.restricted)) continue;
      grid ??= edgeGrid(p.restricted);
      const gap = nearestGap(grid, itemSegments(s), bb, CRUSHING_GAP_BODY_MM);
      if (!gap || gap.d <= 0 || gap.d >= CRUSHING_GAP_BODY_MM) continue;
      if (guarded.length && !pointInPolygons(gap.onItem[0], gap.onItem[1], guarded)) continue;
      const prev = byLayer.get(s.layer);
      if (!prev) byLayer.set(s.layer, { d: gap.d, at: gap.at, items: 1, role: s.role });
      else {
        prev.items++;
        if (gap.d < prev.d) Object.assign(prev, { d: gap.d, at: gap.at });
      }
    }
    for (const [layer, g] of byLayer) {
      out.crushing.push(makeFinding('crushing-gap', [id, layer], {
        arms: [id], points: [], geometry: null, at: g.at,
        message: `${name}: a gap of only ${mm(g.d)} mm between the restricted space and ${g.items === 1 ? `${g.role === 'obstacle' ? 'an' : 'a'} ${g.role}` : `${g.items} ${g.role}s`} on layer ${layer}; a person standing there can be crushed (ISO 13854 keeps at least ${CRUSHING_GAP_BODY_MM} mm for the body). Close the gap or widen it.`,
        data: { gapMm: mm(g.d), items: g.items },
      }));
    }
  }
  return out;
}

interface Measured {
  p: SafeguardArm;
  d: number;
}

function measuredFor(arms: ReadonlyArray<{ p: SafeguardArm; m: ArmSafeguardMeasure }>, pick: (m: ArmSafeguardMeasure) => number | undefined): Measured[] {
  const list: Measured[] = [];
  for (const { p, m } of arms) {
    const d = pick(m);
    if (d !== undefined) list.push({ p, d });
  }
  return list.sort((a, b) => a.d - b.d || (a.p.arm.id < b.p.arm.id ? -1 : 1));
}

/** ISO 13855 checks of one safeguarded opening against every arm (findings) and the row for the one that governs it. */
function openingCheck(o: Boundary, arms: ReadonlyArray<{ p: SafeguardArm; m: ArmSafeguardMeasure }>): { row: SafeguardOpeningRow; findings: Finding[] } {
  const g = o.safeguard!;
  const label = o.label || o.id;
  const stopField: SafeguardOpeningRow['stopField'] = g.stopCategory === 1 ? 'stopTimeCat1S' : 'stopTimeS';
  // Arms in order of a lower bound on their distance (the restricted space lies within maxReach of
  // the base); an arm's exact distance is measured only when it could be the nearest or too close.
  const [s0, s1] = o.points as Array<[number, number]>;
  const cands = arms
    .filter(({ p }) => p.restricted.length)
    .map(({ p, m }) => ({ p, m, lb: Math.max(0, pointSegmentDistance(p.arm.x, p.arm.y, s0[0], s0[1], s1[0], s1[1]) - p.reach.maxReach) }))
    .sort((a, b) => a.lb - b.lb || (a.p.arm.id < b.p.arm.id ? -1 : 1));
  const measured: Measured[] = [];
  let nearestD = Infinity;
  for (const c of cands) {
    const stop = c.p.reach.stopTimeS?.[g.stopCategory];
    let sArm = 0;
    if (stop !== undefined && g.device !== 'interlock-locking') {
      try {
        sArm = separationDistance({ ...g, stopTimeS: stop }).sMm;
      } catch {
        sArm = 0;
      }
    }
    if (c.lb > nearestD && c.lb >= sArm) continue;
    let d = c.m.openings.get(o.id);
    if (d === undefined) c.m.openings.set(o.id, (d = polylineDistanceToPolygons(o.points, c.p.restricted)));
    measured.push({ p: c.p, d });
    nearestD = Math.min(nearestD, d);
  }
  measured.sort((a, b) => a.d - b.d || (a.p.arm.id < b.p.arm.id ? -1 : 1));
  const findings: Finding[] = [];
  const empty: SafeguardOpeningRow = { id: o.id, device: g.device, stopCategory: g.stopCategory, armId: null, armModelId: null, stopField, stopTimeS: null, tS: null, requiredMm: null, actualMm: null, ok: null, note: 'No arm with a restricted space is placed.' };
  if (!measured.length) return { row: empty, findings };
  const at = o.points[0] as [number, number];
  let governing: { row: SafeguardOpeningRow; margin: number } | null = null;
  let nearestRow: SafeguardOpeningRow | null = null;
  for (let i = 0; i < measured.length; i++) {
    const { p, d } = measured[i];
    const actual = round1(d);
    const stop = p.reach.stopTimeS?.[g.stopCategory];
    const base = { ...empty, armId: p.arm.id, armModelId: p.arm.armModelId, actualMm: actual };
    let row: SafeguardOpeningRow;
    if (stop === undefined) {
      if (g.device === 'interlock-locking') {
        row = { ...base, requiredMm: 0, ok: true, note: 'Guard locking keeps the guard shut until the arm has stopped: no separation distance is needed.' };
      } else {
        row = { ...base, note: `The arm model gives no category ${g.stopCategory} stopping time (${stopField}): the separation distance cannot be computed.` };
        if (i === 0) {
          findings.push(makeFinding('stopping-data-missing', [o.id, p.arm.id], {
            arms: [p.arm.id], points: [], geometry: null, at,
            message: `${armName(p.arm)} is nearest to access opening ${label}, but its arm model gives no category ${g.stopCategory} stopping time, so the ISO 13855 separation distance cannot be computed; enter the maker's measured value in the model.`,
            data: { stopCategory: g.stopCategory },
          }));
        }
      }
    } else {
      let s;
      try {
        s = separationDistance({ ...g, stopTimeS: stop });
      } catch (err) {
        const why = reasonOf(err);
        row = { ...base, stopTimeS: stop, note: `No separation distance${why ? `: ${why}` : ''}` };
        if (i === 0) findings.push(makeFinding('computation-failed', ['safeguard', o.id, p.arm.id], { arms: [p.arm.id], points: [], geometry: null, at, message: `Could not compute the separation distance of access opening ${label} for ${armName(p.arm)}${why ? ` (${why})` : ''}; check it by hand.` }));
        if (i === 0) nearestRow = row;
        continue;
      }
      const ok = actual >= s.sMm;
      row = { ...base, stopTimeS: stop, tS: Math.round(s.tS * 1000) / 1000, requiredMm: s.sMm, ok, note: s.formula };
      if (!ok) {
        findings.push(makeFinding('opening-too-close', [o.id, p.arm.id], {
          arms: [p.arm.id], points: [], geometry: null, at,
          message: `Access opening ${label}: its ${DEVICE_TEXT[g.device]} is ${mm(actual)} mm from the restricted space of ${armName(p.arm)}; ISO 13855 asks for at least ${mm(s.sMm)} mm (T = ${sec(g.responseTimeS)} s response + ${sec(stop)} s category ${g.stopCategory} stop). Move the safeguard or the arm, or shorten the stopping time.`,
          data: { requiredMm: s.sMm, actualMm: actual, tS: row.tS!, stopCategory: g.stopCategory },
        }));
        if (!governing || actual - s.sMm < governing.margin) governing = { row, margin: actual - s.sMm };
      }
    }
    if (i === 0) nearestRow = row;
  }
  return { row: governing?.row ?? nearestRow ?? empty, findings };
}

/** ISO 13857 checks of one fence against the arms near it (findings) and the row for the one that governs it. */
function fenceCheck(f: Boundary, arms: ReadonlyArray<{ p: SafeguardArm; m: ArmSafeguardMeasure }>): { row: SafeguardFenceRow; findings: Finding[] } {
  const b = f.height ?? 0;
  const label = f.label || f.id;
  const mesh = f.meshMm !== undefined && f.meshShape ? { e: f.meshMm, shape: f.meshShape } : null;
  const through = mesh ? reachThroughDistance(mesh.e, mesh.shape).distanceMm : null;
  const covered = b >= REACH_OVER_MIN_STRUCTURE_MM;
  const findings: Finding[] = [];
  const row0: SafeguardFenceRow = { id: f.id, heightMm: b, armId: null, hazardHeightMm: null, requiredMm: null, actualMm: null, meshMm: mesh?.e ?? null, meshShape: mesh?.shape ?? null, reachThroughMm: through, ok: true, note: `No restricted space within ${FENCE_SAFEGUARD_RANGE_MM} mm.` };
  let governing: { row: SafeguardFenceRow; margin: number } | null = null;
  for (const { p, d } of measuredFor(arms, (m) => m.fences.get(f.id))) {
    const actual = round1(d);
    const a = Math.round(p.arm.mountHeight + p.reach.zMax);
    const over = covered ? reachOverDistance(a, b) : null;
    const required = over?.distanceMm ?? null;
    const overOk = required === null || actual >= required;
    const throughOk = through === null || actual >= through;
    const note = covered
      ? `c from ISO 13857 table row a = ${over!.rowMm} mm, column b = ${over!.columnMm} mm${through !== null ? `; s_r for a ${mesh!.e} mm ${mesh!.shape} mesh` : ''}.`
      : `ISO 13857's reach-over table does not cover fences lower than ${REACH_OVER_MIN_STRUCTURE_MM} mm: this one does not keep people from reaching over.`;
    const row: SafeguardFenceRow = { ...row0, armId: p.arm.id, hazardHeightMm: a, requiredMm: required, actualMm: actual, ok: covered ? overOk && throughOk : throughOk ? null : false, note };
    if (!overOk) {
      findings.push(makeFinding('fence-reach-over', [f.id, p.arm.id], {
        arms: [p.arm.id], points: [], geometry: null, at: f.points[0] as [number, number],
        message: `Fence ${label} (${mm(b)} mm high) is ${mm(actual)} mm from the restricted space of ${armName(p.arm)}, whose reach goes up to ${a} mm; against reaching over, ISO 13857 asks for ${required} mm. Raise the fence or move it away.`,
        data: { requiredMm: required!, actualMm: actual, hazardHeightMm: a, heightMm: b },
      }));
    }
    if (!throughOk) {
      findings.push(makeFinding('fence-reach-through', [f.id, p.arm.id], {
        arms: [p.arm.id], points: [], geometry: null, at: f.points[0] as [number, number],
        message: `Fence ${label}: its ${mesh!.e} mm ${mesh!.shape} mesh is ${mm(actual)} mm from the restricted space of ${armName(p.arm)}; against reaching through, ISO 13857 asks for ${through} mm. Use a finer mesh or move the fence.`,
        data: { requiredMm: through!, actualMm: actual, meshMm: mesh!.e },
      }));
    }
    const margin = actual - Math.max(required ?? 0, through ?? 0);
    if (!governing || margin < governing.margin) governing = { row, margin };
  }
  return { row: governing?.row ?? row0, findings };
}

/** The safeguarding rows and findings of a layout from its arms' cached measurements. */
export function safeguardingChecks(arms: ReadonlyArray<{ p: SafeguardArm; m: ArmSafeguardMeasure }>, boundaries: ReadonlyArray<Boundary>): { result: SafeguardingResult; findings: Finding[] } {
  const result: SafeguardingResult = { openings: [], fences: [] };
  const findings: Finding[] = [];
  for (const z of boundaries) {
    if (z.kind === 'opening' && z.safeguard && z.points.length === 2) {
      const c = openingCheck(z, arms);
      result.openings.push(c.row);
      findings.push(...c.findings);
    } else if (z.kind === 'fence') {
      try {
        const c = fenceCheck(z, arms);
        result.fences.push(c.row);
        findings.push(...c.findings);
      } catch (err) {
        const why = reasonOf(err);
        findings.push(makeFinding('computation-failed', ['fence', z.id], { arms: [], points: [], geometry: null, at: null, message: `Could not compute the ISO 13857 distances of fence ${z.label || z.id}${why ? ` (${why})` : ''}; check them by hand.` }));
      }
    }
  }
  for (const { m } of arms) findings.push(...m.crushing);
  return { result, findings };
}
