import { polygonsArea } from '../geometry/area';
import { polygonsBounds } from '../geometry/bounds';
import { clipIntersectShapes, clipShape, type ClipShape } from '../geometry/clipper';
import { intersectionArea } from '../geometry/intersectionArea';
import { armPose, type ArmPose } from '../geometry/frames';
import { polygonsToGeoJSON, type AreaGeometry } from '../geometry/geojson';
import { type Polygon2 } from '../geometry/types';
import type { ArmPlacement, WorkPoint } from '../schemas/layout';
import { armClearance, bboxOverlap, centroidOf, fenceFindings, makeFinding, MIN_AREA_MM2, type BBox } from './clearance';
import { m2, m2Text, mm, reasonOf, sortFindings } from './messages';
import { buildPointGrid, pointsNear, type PointGrid } from './pointGrid';
import { isReached, roundMargin, shortfallText } from './reached';
import { measureArmSafeguarding, safeguardingChecks, type ArmSafeguardMeasure } from './safeguarding';
import type { AnalysisInput, AnalysisResult, ArmReach, ArmReachFactory, Finding, PreparedFloor, SharedZone } from './types';

export { FENCE_CLEARANCE_MM, MIN_FENCE_HEIGHT_MM } from './clearance';

/** Points farther than this outside an arm's maximum-reach circle are "far": no margin is listed for that arm, mm. */
export const FAR_MM = 1000;

interface PlacedArm {
  arm: ArmPlacement;
  sig: string;
  reach: ArmReach;
  pose: ArmPose;
  restricted: Polygon2[];
  bbox: BBox | null;
  bands: Map<number, Polygon2[]>;
  bandBoxes: Map<number, BBox | null>;
  /** The restricted space and the bands converted once for clipping against every neighbour. */
  shapes: { restricted: ClipShape; bands: Map<number, ClipShape> };
  below: Map<number, Polygon2[] | null>;
  geo: { restricted: AreaGeometry | null; bands: Map<number, AreaGeometry | null> };
  clearance: { key: string; findings: Finding[] } | null;
  safeguard: { key: string; measure: ArmSafeguardMeasure } | null;
}

interface Column {
  armId: string;
  near: Int32Array;
  margins: Float64Array;
}

interface PairResult {
  sharedZone: SharedZone | null;
  findings: Finding[];
}

function armSignature(a: ArmPlacement): string {
  return `${a.id}|${a.armModelId}|${a.x}|${a.y}|${a.yaw}|${a.mountHeight}|${a.restrict ? `${a.restrict.j1Min},${a.restrict.j1Max}` : ''}|${a.label}`;
}

/** FNV-1a over what the point checks read: ids, coordinates, approach, tag, assigned arm. */
function pointsFingerprint(points: ReadonlyArray<WorkPoint>): string {
  let h = 2166136261;
  const mix = (n: number) => {
    h ^= n | 0;
    h = Math.imul(h, 16777619);
  };
  const mixStr = (s: string | undefined) => {
    if (!s) return mix(7);
    for (let i = 0; i < s.length; i++) mix(s.charCodeAt(i));
  };
  for (const p of points) {
    mix(Math.round(p.x * 1000));
    mix(Math.round(p.y * 1000));
    mix(Math.round(p.z * 1000));
    mix(p.approach === 'any' ? 1 : 0);
    mixStr(p.id);
    mixStr(p.tag);
    mixStr(p.assignedArm);
  }
  return `${points.length}:${h >>> 0}`;
}

const floorIds = new WeakMap<object, number>();
let nextFloorId = 1;
function floorKey(floor: PreparedFloor | null): number {
  if (!floor) return 0;
  let id = floorIds.get(floor);
  if (!id) floorIds.set(floor, (id = nextFloorId++));
  return id;
}

export interface Analyzer {
  /**
   * Full analysis, cached per arm, pair and coverage column, so that moving one arm recomputes only
   * its regions, its pairs, its coverage column and the work points near it. The result's
   * `coverage` object is kept by the analyzer and updated in place by the next call.
   * Inputs are only read; an edit passes new arrays (the same work-point array is taken to hold
   * the same points, so it is not fingerprinted again).
   */
  analyze(input: Readonly<AnalysisInput>): AnalysisResult;
  /** How many arm regions, pairs and coverage columns the last call computed afresh (for tests and benchmarks). */
  lastStats(): { arms: number; pairs: number; columns: number };
  /**
   * Indices (into the last call's work points) of the points whose coverage row the last call
   * changed, ascending; null when it built every row anew (first call, other work points) or the
   * call before it threw. Rows not listed are the objects, with the values, they were after the
   * call before.
   */
  lastCoverageChanges(): Int32Array | null;
}

/**
 * Layout analysis (docs/analysis.md "The checks"): shared zones of every pair of restricted spaces,
 * coverage of every work point by every arm with signed margins (arms more than FAR_MM beyond their
 * reach are left out of a point's row), clearance of restricted spaces to structure (height-aware),
 * floor, fences, openings, operator areas and keep-outs. Pure; the same code runs on the server and
 * in the browser's worker.
 */
export function createAnalyzer(reachFor: ArmReachFactory): Analyzer {
  const arms = new Map<string, PlacedArm>();
  const pairs = new Map<string, PairResult>();
  const columns = new Map<string, Column>();
  let fp = '';
  // The work-point array last fingerprinted: inputs are never changed in place (every edit makes new
  // arrays), so the same array has the same fingerprint and a drag need not hash every point again.
  let fpOf: ReadonlyArray<WorkPoint> | null = null;
  let grid: PointGrid | null = null;
  let coverage: Record<string, Record<string, number>> = {};
  let pointFindings: Array<Finding[] | null> = [];
  // What each point's findings were made from (nearest arm, its margin, the assigned arm's margin or
  // Infinity when it has none): a row that changes but not in these keeps its finding objects.
  let madeFromBest: Array<string | null> = [];
  let madeFromBestM = new Float64Array(0);
  let madeFromAssignedM = new Float64Array(0);
  let placedKey = '';
  let stats = { arms: 0, pairs: 0, columns: 0 };
  let coverageChanges: Int32Array | null = null;
  // False while a call runs and after one that threw: the next call then reports every row as changed.
  let lastCompleted = true;

  function placedArm(a: ArmPlacement, heights: ReadonlyArray<number>): PlacedArm {
    const sig = armSignature(a);
    let p = arms.get(sig);
    if (!p) {
      const reach = reachFor(a.armModelId, a.restrict);
      const pose = armPose(a);
      const restricted = pose.placePolygons(reach.restricted);
      p = { arm: a, pose, sig, reach, restricted, bbox: polygonsBounds(restricted) as BBox | null, bands: new Map(), bandBoxes: new Map(), shapes: { restricted: clipShape(restricted), bands: new Map() }, below: new Map(), geo: { restricted: restricted.length ? polygonsToGeoJSON(restricted) : null, bands: new Map() }, clearance: null, safeguard: null };
      arms.set(sig, p);
      stats.arms++;
    }
    for (const h of heights) {
      if (!p.bands.has(h)) {
        const band = p.pose.placePolygons(p.reach.bandAt(p.pose.toArmZ(h)));
        p.bands.set(h, band);
        p.bandBoxes.set(h, polygonsBounds(band) as BBox | null);
        p.shapes.bands.set(h, clipShape(band));
        p.geo.bands.set(h, band.length ? polygonsToGeoJSON(band) : null);
      }
    }
    return p;
  }

  function below(p: PlacedArm, top: number): Polygon2[] | null {
    const zTop = p.pose.toArmZ(top);
    if (zTop >= p.reach.zMax) return p.restricted;
    if (zTop <= p.reach.zMin) return null;
    if (!p.below.has(zTop)) p.below.set(zTop, p.pose.placePolygons(p.reach.restrictedBelow(zTop)));
    return p.below.get(zTop)!;
  }

  function column(p: PlacedArm, points: ReadonlyArray<WorkPoint>): Column {
    const near = pointsNear(grid!, p.arm.x, p.arm.y, p.reach.maxReach + FAR_MM);
    const margins = new Float64Array(near.length);
    const pose = p.pose;
    for (let k = 0; k < near.length; k++) {
      const pt = points[near[k]];
      margins[k] = p.reach.margin(pose.armX(pt.x, pt.y), pose.armY(pt.x, pt.y), pose.toArmZ(pt.z), pt.approach ?? 'top');
    }
    stats.columns++;
    return { armId: p.arm.id, near, margins };
  }

  /**
   * The findings of point i from its coverage row. With `reuse`, the previous findings are returned
   * as they are when what they are made of is unchanged (only while the placed arms and the points
   * stay the same).
   */
  function pointChecks(i: number, pt: WorkPoint, row: Record<string, number>, placedIds: Set<string>, reuse: boolean): Finding[] | null {
    let best: string | null = null;
    let bestM = -Infinity;
    let reached = false;
    for (const id in row) {
      const m = row[id];
      if (isReached(m)) reached = true;
      // equal margins go to the smaller arm id, so the order of the row's entries never matters
      if (m > bestM || (m === bestM && best !== null && id < best)) {
        bestM = m;
        best = id;
      }
    }
    const assignedM = pt.assignedArm ? row[pt.assignedArm] ?? Infinity : Infinity;
    if (reuse && madeFromBest[i] === best && madeFromBestM[i] === bestM && madeFromAssignedM[i] === assignedM) return pointFindings[i];
    madeFromBest[i] = best;
    madeFromBestM[i] = bestM;
    madeFromAssignedM[i] = assignedM;
    let out: Finding[] | null = null;
    if (!reached && placedIds.size > 0) {
      out = [makeFinding('unreached-point', [pt.id], {
        arms: [], points: [pt.id], geometry: null, at: [pt.x, pt.y],
        message: `Work point ${pt.id}${pt.tag ? ` (${pt.tag})` : ''} is not reached by any arm${best ? `; nearest is ${best}, ${shortfallText(-bestM)} mm short` : `; no arm comes within ${FAR_MM} mm of it`}.`,
        data: best ? { shortMm: mm(-bestM), nearestArm: best } : undefined,
      })];
    }
    if (pt.assignedArm && placedIds.has(pt.assignedArm)) {
      const m = row[pt.assignedArm];
      if (m === undefined || !isReached(m)) {
        (out ??= []).push(makeFinding('assigned-unreachable', [pt.id, pt.assignedArm], {
          arms: [pt.assignedArm], points: [pt.id], geometry: null, at: [pt.x, pt.y],
          message: `Work point ${pt.id} is assigned to ${pt.assignedArm}, which cannot reach it (${m === undefined ? `more than ${FAR_MM} mm` : `${shortfallText(-m)} mm`} short).`,
          data: m === undefined ? undefined : { shortMm: mm(-m) },
        }));
      }
    }
    return out;
  }

  function pairResult(first: PlacedArm, second: PlacedArm, heights: number[], points: ReadonlyArray<WorkPoint>): PairResult {
    const ids = [first.arm.id, second.arm.id];
    let polys: Polygon2[];
    try {
      polys = clipIntersectShapes(first.shapes.restricted, second.shapes.restricted);
    } catch (err) {
      const why = reasonOf(err);
      return { sharedZone: null, findings: [makeFinding('computation-failed', ['overlap', ...ids], { arms: ids, points: [], geometry: null, at: null, message: `Could not compute the shared zone of ${ids[0]} and ${ids[1]}${why ? ` (${why})` : ''}; check it by hand.` })] };
    }
    const area = polygonsArea(polys);
    if (area < MIN_AREA_MM2) return { sharedZone: null, findings: [] };
    const byHeight = heights.map((h) => {
      if (!bboxOverlap(first.bandBoxes.get(h) ?? null, second.bandBoxes.get(h) ?? null)) return { height: h, areaM2: 0 };
      // the area alone, from the two boundaries; the intersection is built only when they touch
      const sa = first.shapes.bands.get(h)!, sb = second.shapes.bands.get(h)!;
      let a: number | null = intersectionArea(sa, sb);
      if (a === null) {
        try {
          a = polygonsArea(clipIntersectShapes(sa, sb));
        } catch {
          a = NaN;
        }
      }
      return { height: h, areaM2: m2(a) };
    });
    // Work points both arms reach: both coverage columns list their points in ascending order, so
    // one merge walk finds the common ones (in work-point order).
    const ca = columns.get(first.sig)!;
    const cb = columns.get(second.sig)!;
    const inside: string[] = [];
    for (let i = 0, j = 0; i < ca.near.length && j < cb.near.length;) {
      const pa = ca.near[i];
      const pb = cb.near[j];
      if (pa < pb) i++;
      else if (pb < pa) j++;
      else {
        if (isReached(ca.margins[i]) && isReached(cb.margins[j])) inside.push(points[pa].id);
        i++;
        j++;
      }
    }
    const geometry = polygonsToGeoJSON(polys);
    const sharedZone: SharedZone = { arms: [ids[0], ids[1]], areaM2: m2(area), points: inside, geometry, byHeight };
    const findings = [
      makeFinding('shared-zone', ids, {
        arms: ids, points: inside, geometry, at: centroidOf(polys),
        message: `${ids[0]} and ${ids[1]} share ${m2Text(area)} m² of restricted space${inside.length ? ` containing ${inside.length} work point${inside.length === 1 ? '' : 's'}` : ''}: plan interlocks or shared-zone logic.`,
        data: { areaM2: m2(area) },
      }),
    ];
    if (inside.length) {
      findings.push(makeFinding('handover', ids, {
        arms: ids, points: inside, geometry: null, at: null,
        message: `${inside.length} work point${inside.length === 1 ? '' : 's'} can be served by both ${ids[0]} and ${ids[1]} (possible handover): ${inside.slice(0, 6).join(', ')}${inside.length > 6 ? ' …' : ''}.`,
        data: { count: inside.length },
      }));
    }
    stats.pairs++;
    return { sharedZone, findings };
  }

  return {
    lastStats: () => stats,
    lastCoverageChanges: () => coverageChanges,
    analyze(input) {
      const t0 = typeof performance !== 'undefined' ? performance.now() : Date.now();
      stats = { arms: 0, pairs: 0, columns: 0 };
      // Until this call completes, every row may have changed (a call that throws leaves it so,
      // and the call after it too, since rows the failed call changed are in no list).
      coverageChanges = null;
      const afterCompleted = lastCompleted;
      lastCompleted = false;
      const heights = [...new Set(input.workHeights)].sort((a, b) => a - b);
      const points = input.workPoints;
      const small: Finding[] = [];

      const placed: PlacedArm[] = [];
      for (const a of input.arms) {
        try {
          placed.push(placedArm(a, heights));
        } catch (err) {
          const why = reasonOf(err);
          small.push(makeFinding('unknown-model', [a.id], {
            arms: [a.id], points: [], geometry: null, at: [a.x, a.y],
            message: `${a.label || a.id}: its reach could not be computed (${why ?? 'check its arm model and its J1 limits'}).`,
          }));
        }
      }
      const live = new Set(placed.map((p) => p.sig));
      for (const k of arms.keys()) if (!live.has(k)) arms.delete(k);
      const placedIds = new Set(placed.map((p) => p.arm.id));

      // Coverage: columns per arm over the points near it; rows updated in place.
      const nextFp = points === fpOf ? fp : pointsFingerprint(points);
      fpOf = points;
      let dirty: Uint8Array;
      const rowsAnew = nextFp !== fp;
      if (rowsAnew) {
        fp = nextFp;
        grid = buildPointGrid(points);
        coverage = {};
        for (const p of points) coverage[p.id] = {};
        columns.clear();
        pairs.clear();
        pointFindings = new Array(points.length).fill(null);
        madeFromBest = new Array(points.length).fill(null);
        madeFromBestM = new Float64Array(points.length);
        madeFromAssignedM = new Float64Array(points.length);
        dirty = new Uint8Array(points.length).fill(1);
      } else {
        dirty = new Uint8Array(points.length);
      }
      // Adding or removing an arm changes which points are unreached or wrongly assigned anywhere.
      const nextPlacedKey = [...placedIds].sort().join(',');
      const idsChanged = nextPlacedKey !== placedKey;
      placedKey = nextPlacedKey;
      // New columns are written first; then the entries of columns no longer placed are removed,
      // except where the same arm's new column wrote them again (a moved arm keeps most of its
      // points, and overwriting a property costs far less than deleting and adding it).
      const freshByArm = new Map<string, Column>();
      for (const p of placed) {
        if (columns.has(p.sig)) continue;
        const col = column(p, points);
        columns.set(p.sig, col);
        freshByArm.set(col.armId, col);
        for (let k = 0; k < col.near.length; k++) {
          coverage[points[col.near[k]].id][col.armId] = roundMargin(col.margins[k]);
          dirty[col.near[k]] = 1;
        }
      }
      for (const [sig, col] of columns) {
        if (live.has(sig)) continue;
        const again = freshByArm.get(col.armId)?.near;
        // both lists of point indices are ascending: walk them together
        for (let k = 0, j = 0; k < col.near.length; k++) {
          const i = col.near[k];
          if (again) {
            while (j < again.length && again[j] < i) j++;
            if (j < again.length && again[j] === i) continue;
          }
          delete coverage[points[i].id][col.armId];
          dirty[i] = 1;
        }
        columns.delete(sig);
      }
      let changedRows = 0;
      for (let i = 0; i < points.length; i++) {
        if (dirty[i]) {
          changedRows++;
          pointFindings[i] = pointChecks(i, points[i], coverage[points[i].id], placedIds, !idsChanged && !rowsAnew);
        } else if (idsChanged) pointFindings[i] = pointChecks(i, points[i], coverage[points[i].id], placedIds, false);
      }
      let changes: Int32Array | null = null;
      if (!rowsAnew) {
        changes = new Int32Array(changedRows);
        for (let i = 0, k = 0; k < changedRows; i++) if (dirty[i]) changes[k++] = i;
      }

      // Shared zones (pairs cached by both arms' signatures, the heights and the points).
      const sharedZones: SharedZone[] = [];
      const livePairs = new Set<string>();
      for (let i = 0; i < placed.length; i++) {
        for (let j = i + 1; j < placed.length; j++) {
          const A = placed[i];
          const B = placed[j];
          const dx = A.arm.x - B.arm.x, dy = A.arm.y - B.arm.y, apart = A.reach.maxReach + B.reach.maxReach;
          if (dx * dx + dy * dy > apart * apart || !bboxOverlap(A.bbox, B.bbox)) continue;
          const [first, second] = A.arm.id < B.arm.id ? [A, B] : [B, A];
          const key = `${first.sig}&${second.sig}&${heights.join(',')}`;
          livePairs.add(key);
          let r = pairs.get(key);
          if (!r) {
            r = pairResult(first, second, heights, points);
            pairs.set(key, r);
          }
          if (r.sharedZone) sharedZones.push(r.sharedZone);
          small.push(...r.findings);
        }
      }
      for (const k of pairs.keys()) if (!livePairs.has(k)) pairs.delete(k);

      // Clearance per arm, cached while the arm, the floor and the boundaries stay the same.
      const envKey = `${floorKey(input.floor)}|${JSON.stringify(input.boundaries)}`;
      for (const p of placed) {
        if (p.clearance?.key !== envKey) {
          p.clearance = { key: envKey, findings: armClearance({ arm: p.arm, restricted: p.restricted, bbox: p.bbox, below: (top) => below(p, top) }, input.floor, input.boundaries) };
        }
        small.push(...p.clearance.findings);
      }
      small.push(...fenceFindings(input.boundaries));

      // Safeguarding: each arm's distances to openings, fences and structure cached like its clearance.
      const measured = placed.map((p) => {
        if (p.safeguard?.key !== envKey) p.safeguard = { key: envKey, measure: measureArmSafeguarding(p, input.floor, input.boundaries) };
        return { p, m: p.safeguard.measure };
      });
      const safeguarding = safeguardingChecks(measured, input.boundaries);
      small.push(...safeguarding.findings);

      // Most severe first; point findings (all critical) in work-point order after the other critical ones.
      sortFindings(small);
      const findings: Finding[] = [];
      let k = 0;
      while (k < small.length && small[k].severity === 'critical') findings.push(small[k++]);
      for (let i = 0; i < pointFindings.length; i++) {
        const pf = pointFindings[i];
        if (pf === null) continue;
        for (let j = 0; j < pf.length; j++) findings.push(pf[j]);
      }
      while (k < small.length) findings.push(small[k++]);

      const regions: AnalysisResult['regions'] = {};
      for (const p of placed) {
        regions[p.arm.id] = { restricted: p.geo.restricted, bands: heights.map((h) => ({ height: h, geometry: p.geo.bands.get(h) ?? null })) };
      }
      const t1 = typeof performance !== 'undefined' ? performance.now() : Date.now();
      coverageChanges = afterCompleted ? changes : null;
      lastCompleted = true;
      return { findings, sharedZones, coverage, regions, safeguarding: safeguarding.result, timingMs: Math.round((t1 - t0) * 100) / 100 };
    },
  };
}
