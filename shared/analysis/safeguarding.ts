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
import type { ArmPlacement, Zone } from '../schemas/layout';
import { itemHits, makeFinding, type BBox } from './clearance';
import { mm } from './messages';
import { polylineDistanceToPolygons, subtractOpenings } from './segments';
import type { ArmReach, Finding, PreparedFloor, SafeguardFenceRow, SafeguardingResult, SafeguardOpeningRow } from './types';

/** Fences farther than this from a restricted space need no reach-over or reach-through distance (the largest value of either table), mm. */
export const FENCE_SAFEGUARD_RANGE_MM = Math.max(...REACH_OVER_ROWS.flatMap((r) => r.cMm), ...REACH_THROUGH_ROWS.map((r) => r.slot));

// The layout schema repeats shared/safety's device and mesh lists (schemas import only zod); passing
// a safeguard to separationDistance and indexing DEVICE_TEXT with it keeps the two lists the same.
const DEVICE_TEXT: Record<SafeguardDevice, string> = {
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
  /** opening id → plan distance from the detection line, mm. */
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
export function fenceSolidParts(f: Zone, zones: ReadonlyArray<Zone>): Array<Array<[number, number]>> {
  const cuts = zones.filter((o) => o.kind === 'opening' && o.fenceId === f.id && o.points.length === 2).map((o) => [o.points[0], o.points[1]] as const);
  return subtractOpenings(f.points as Array<[number, number]>, cuts as never);
}

/** Closed fence rings (first and last point within 1 mm): the guarded areas. */
function guardedAreas(zones: ReadonlyArray<Zone>): Polygon2[] {
  const out: Polygon2[] = [];
  for (const z of zones) {
    if (z.kind !== 'fence' || z.points.length < 4) continue;
    const a = z.points[0];
    const b = z.points[z.points.length - 1];
    if (Math.hypot(a[0] - b[0], a[1] - b[1]) <= 1) out.push([z.points.slice(0, -1).map(([x, y]) => [x, y] as [number, number])]);
  }
  return out;
}

/**
 * Shortest gap between a region (its edges, flat [ax, ay, bx, by, …]) and a set of segments, with
 * the spot midway across it; only region edges within `pad` of the segments' box are measured.
 * Crossings are not detected here (the caller has ruled them out).
 */
function nearestGap(edges: Float64Array, segs: ReadonlyArray<readonly [readonly [number, number], readonly [number, number]]>, box: BBox, pad: number): { d: number; at: [number, number]; onItem: [number, number] } | null {
  let best: { d: number; at: [number, number]; onItem: [number, number] } | null = null;
  // (px, py) lies on the region when `fromRegion`, else on the item; the other end is its nearest point on the segment.
  const consider = (px: number, py: number, ax: number, ay: number, bx: number, by: number, fromRegion: boolean) => {
    const d = pointSegmentDistance(px, py, ax, ay, bx, by);
    if (!best || d < best.d) {
      const q = nearestPointOnSegment(px, py, ax, ay, bx, by);
      best = { d, at: [(px + q[0]) / 2, (py + q[1]) / 2], onItem: fromRegion ? q : [px, py] };
    }
  };
  for (let e = 0; e < edges.length; e += 4) {
    const ax = edges[e], ay = edges[e + 1], bx = edges[e + 2], by = edges[e + 3];
    if (Math.max(ax, bx) < box[0] - pad || Math.min(ax, bx) > box[2] + pad || Math.max(ay, by) < box[1] - pad || Math.min(ay, by) > box[3] + pad) continue;
    for (const [c, d] of segs) {
      consider(ax, ay, c[0], c[1], d[0], d[1], true);
      consider(bx, by, c[0], c[1], d[0], d[1], true);
      consider(c[0], c[1], ax, ay, bx, by, false);
      consider(d[0], d[1], ax, ay, bx, by, false);
    }
  }
  return best;
}

function regionEdges(region: Polygon2[]): Float64Array {
  const out: number[] = [];
  for (const poly of region) {
    for (const ring of poly) {
      for (let k = 0; k < ring.length; k++) {
        const a = ring[k];
        const b = ring[(k + 1) % ring.length];
        out.push(a[0], a[1], b[0], b[1]);
      }
    }
  }
  return Float64Array.from(out);
}

function segmentsOf(rings: ReadonlyArray<ReadonlyArray<readonly [number, number]>>, closed: boolean) {
  const segs: Array<readonly [readonly [number, number], readonly [number, number]]> = [];
  for (const r of rings) {
    const n = closed ? r.length : r.length - 1;
    for (let k = 0; k < n; k++) segs.push([r[k], r[(k + 1) % r.length]]);
  }
  return segs;
}

/**
 * One arm's measurements for the safeguarding checks (cached per arm by the analyzer while the arm,
 * the floor and the zones stay the same): distances to the safeguarded openings and the fences near
 * it, and the crushing gaps narrower than CRUSHING_GAP_BODY_MM between its restricted space and a
 * wall, column, obstacle or fence. A gap to structure counts when the item's nearest point lies
 * inside a closed fence (the guarded area), or anywhere when the layout has no closed fence.
 */
export function measureArmSafeguarding(p: SafeguardArm, floor: PreparedFloor | null, zones: ReadonlyArray<Zone>): ArmSafeguardMeasure {
  const out: ArmSafeguardMeasure = { openings: new Map(), fences: new Map(), crushing: [] };
  if (!p.restricted.length || !p.bbox) return out;
  const id = p.arm.id;
  const name = armName(p.arm);
  for (const o of zones) {
    if (o.kind === 'opening' && o.safeguard && o.points.length === 2) out.openings.set(o.id, polylineDistanceToPolygons(o.points, p.restricted));
  }
  let edges: Float64Array | null = null;
  const guarded = guardedAreas(zones);
  for (const f of zones) {
    if (f.kind !== 'fence' || !boxNear(p.bbox, f.points, FENCE_SAFEGUARD_RANGE_MM)) continue;
    const solid = fenceSolidParts(f, zones).filter((l) => boxNear(p.bbox, l, FENCE_SAFEGUARD_RANGE_MM));
    if (!solid.length) continue;
    const d = Math.min(...solid.map((l) => polylineDistanceToPolygons(l, p.restricted)));
    if (d > FENCE_SAFEGUARD_RANGE_MM) continue;
    out.fences.set(f.id, d);
    if (d > 0 && d < CRUSHING_GAP_BODY_MM) {
      edges ??= regionEdges(p.restricted);
      const segs = segmentsOf(solid, false);
      const b = solid.flat();
      const gap = nearestGap(edges, segs, [Math.min(...b.map((q) => q[0])), Math.min(...b.map((q) => q[1])), Math.max(...b.map((q) => q[0])), Math.max(...b.map((q) => q[1]))], CRUSHING_GAP_BODY_MM);
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
      // An item the restricted space enters is reach into structure (clearance.ts), not a gap.
      if (itemHits(s, p.restricted)) continue;
      edges ??= regionEdges(p.restricted);
      const segs = [...segmentsOf(s.polygons.flat(), true), ...segmentsOf(s.lines, false)];
      const gap = nearestGap(edges, segs, bb, CRUSHING_GAP_BODY_MM);
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
function openingCheck(o: Zone, arms: ReadonlyArray<{ p: SafeguardArm; m: ArmSafeguardMeasure }>): { row: SafeguardOpeningRow; findings: Finding[] } {
  const g = o.safeguard!;
  const label = o.label || o.id;
  const stopField: SafeguardOpeningRow['stopField'] = g.stopCategory === 1 ? 'stopTimeCat1S' : 'stopTimeS';
  const measured = measuredFor(arms, (m) => m.openings.get(o.id));
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
        row = { ...base, stopTimeS: stop, note: `No separation distance: ${err instanceof Error ? err.message : err}` };
        if (i === 0) findings.push(makeFinding('computation-failed', ['safeguard', o.id, p.arm.id], { arms: [p.arm.id], points: [], geometry: null, at, message: `Could not compute the separation distance of access opening ${label} for ${armName(p.arm)} (${err instanceof Error ? err.message : err}); check it by hand.` }));
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
function fenceCheck(f: Zone, arms: ReadonlyArray<{ p: SafeguardArm; m: ArmSafeguardMeasure }>): { row: SafeguardFenceRow; findings: Finding[] } {
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
export function safeguardingChecks(arms: ReadonlyArray<{ p: SafeguardArm; m: ArmSafeguardMeasure }>, zones: ReadonlyArray<Zone>): { result: SafeguardingResult; findings: Finding[] } {
  const result: SafeguardingResult = { openings: [], fences: [] };
  const findings: Finding[] = [];
  for (const z of zones) {
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
        findings.push(makeFinding('computation-failed', ['fence', z.id], { arms: [], points: [], geometry: null, at: null, message: `Could not compute the ISO 13857 distances of fence ${z.label || z.id} (${err instanceof Error ? err.message : err}); check them by hand.` }));
      }
    }
  }
  for (const { m } of arms) findings.push(...m.crushing);
  return { result, findings };
}
