import { polygonsArea, polygonsBounds } from '../geometry/area';
import { clipIntersect, clipUnion } from '../geometry/clipper';
import { polygonsToGeoJSON } from '../geometry/geojson';
import { pointInPolygons } from '../geometry/pointInPolygon';
import type { Polygon2 } from '../geometry/types';
import type { ArmPlacement, Zone } from '../schemas/layout';
import { findingId, m2, m2Text, mm, SEVERITY_OF, sortFindings } from './messages';
import { polylineDistanceToPolygons, polylineHitsPolygons, subtractOpenings } from './segments';
import type { AnalysisInput, AnalysisResult, ArmReach, ArmReachFactory, Finding, FindingKind, SharedZone, StructureItem } from './types';

/** Points farther than this outside an arm's maximum-reach circle get that circle's distance as margin, mm. */
export const FAR_MM = 1000;
/** Smallest overlap area that counts, mm² (below it is boolean-op noise). */
const MIN_AREA_MM2 = 1;
/** Kept between the restricted space and a fence before a clearance warning, mm (common practice: 120–200 mm). */
export const FENCE_CLEARANCE_MM = 150;
/** Lowest fixed perimeter guard, mm (ISO 10218-2). */
export const MIN_FENCE_HEIGHT_MM = 1400;

type BBox = [number, number, number, number];

interface PlacedArm {
  arm: ArmPlacement;
  sig: string;
  reach: ArmReach;
  cos: number;
  sin: number;
  restricted: Polygon2[];
  bbox: BBox | null;
  bands: Map<number, Polygon2[]>;
  below: Map<number, Polygon2[]>;
}

/** clipIntersect, with an empty side giving an empty result (clipper refuses two empty inputs). */
function intersect(a: Polygon2[], b: Polygon2[]): Polygon2[] {
  return a.length && b.length ? clipIntersect(a, b) : [];
}

const bboxOverlap = (a: BBox | null, b: BBox | null) => !!a && !!b && a[0] <= b[2] && b[0] <= a[2] && a[1] <= b[3] && b[1] <= a[3];

function place(polys: Polygon2[], p: PlacedArm): Polygon2[] {
  const { x, y } = p.arm;
  return polys.map((poly) => poly.map((ring) => ring.map(([u, v]) => [p.cos * u - p.sin * v + x, p.sin * u + p.cos * v + y] as [number, number])));
}

function armSignature(a: ArmPlacement): string {
  return `${a.id}|${a.armModelId}|${a.x}|${a.y}|${a.yaw}|${a.mountHeight}|${a.restrict ? `${a.restrict.j1Min},${a.restrict.j1Max}` : ''}`;
}

function pointsFingerprint(points: AnalysisInput['workPoints']): string {
  let h = 2166136261;
  const mix = (n: number) => {
    h ^= Math.round(n * 1000) | 0;
    h = Math.imul(h, 16777619);
  };
  for (const p of points) {
    mix(p.x);
    mix(p.y);
    mix(p.z);
    mix(p.approach === 'any' ? 1 : 0);
    for (let i = 0; i < p.id.length; i++) mix(p.id.charCodeAt(i));
  }
  return `${points.length}:${h >>> 0}`;
}

export interface Analyzer {
  /** Full analysis; cached per arm, pair and coverage column, so moving one arm recomputes only its parts. */
  analyze(input: Readonly<AnalysisInput>): AnalysisResult;
  /** How many arm regions, pairs and coverage columns the last call computed afresh (for tests and benchmarks). */
  lastStats(): { arms: number; pairs: number; columns: number };
}

/**
 * Layout analysis (KINEMATICS.md "Analysis"): shared zones of every pair of restricted spaces,
 * coverage of every work point by every arm with signed margins, clearance of restricted spaces to
 * structure (height-aware), floor, fences, openings, operator areas and keep-outs. Pure; the same
 * code runs on the server and in the browser's worker.
 */
export function createAnalyzer(reachFor: ArmReachFactory): Analyzer {
  const arms = new Map<string, PlacedArm>();
  const pairs = new Map<string, { area: number; polys: Polygon2[]; byHeight: Array<{ height: number; areaM2: number }> } | { failed: string }>();
  const columns = new Map<string, Float64Array>();
  let stats = { arms: 0, pairs: 0, columns: 0 };

  function placedArm(a: ArmPlacement, heights: ReadonlyArray<number>): PlacedArm {
    const sig = armSignature(a);
    let p = arms.get(sig);
    if (!p) {
      const reach = reachFor(a.armModelId, a.restrict);
      const yaw = (a.yaw * Math.PI) / 180;
      p = { arm: a, sig, reach, cos: Math.cos(yaw), sin: Math.sin(yaw), restricted: [], bbox: null, bands: new Map(), below: new Map() };
      p.restricted = place(reach.restricted, p);
      p.bbox = polygonsBounds(p.restricted) as BBox | null;
      arms.set(sig, p);
      stats.arms++;
    }
    for (const h of heights) {
      if (!p.bands.has(h)) p.bands.set(h, place(p.reach.bandAt(h - a.mountHeight), p));
    }
    return p;
  }

  function regionBelow(p: PlacedArm, top: number): Polygon2[] | null {
    const zTop = top - p.arm.mountHeight;
    if (zTop >= p.reach.zMax) return p.restricted;
    if (zTop <= p.reach.zMin) return null;
    let r = p.below.get(zTop);
    if (!r) {
      r = place(p.reach.restrictedBelow(zTop), p);
      p.below.set(zTop, r);
    }
    return r;
  }

  function coverageColumn(p: PlacedArm, input: Readonly<AnalysisInput>, fp: string): Float64Array {
    const key = `${p.sig}#${fp}`;
    let col = columns.get(key);
    if (col) return col;
    const pts = input.workPoints;
    col = new Float64Array(pts.length);
    const { x: bx, y: by, mountHeight } = p.arm;
    const reach = p.reach;
    // Beyond this distance from the base the exact test is skipped: the point is more than FAR_MM
    // outside the circle of maximum reach, and its margin is given as that circle's (the true margin
    // is at most this — the region lies inside the circle — and both say "far out of reach").
    const far = reach.maxReach + FAR_MM;
    for (let i = 0; i < pts.length; i++) {
      const pt = pts[i];
      const dx = pt.x - bx;
      const dy = pt.y - by;
      const d2 = dx * dx + dy * dy;
      if (d2 > far * far) {
        // Outside the circle of maximum reach: the margin is at most this (the region lies within it).
        col[i] = reach.maxReach - Math.sqrt(d2);
        continue;
      }
      const u = p.cos * dx + p.sin * dy;
      const v = -p.sin * dx + p.cos * dy;
      col[i] = reach.margin(u, v, pt.z - mountHeight, pt.approach ?? 'top');
    }
    columns.set(key, col);
    stats.columns++;
    return col;
  }

  return {
    lastStats: () => stats,
    analyze(input) {
      const t0 = typeof performance !== 'undefined' ? performance.now() : Date.now();
      stats = { arms: 0, pairs: 0, columns: 0 };
      const findings: Finding[] = [];
      const add = (kind: FindingKind, ids: string[], f: Omit<Finding, 'id' | 'kind' | 'severity'> & { severity?: Finding['severity'] }) =>
        findings.push({ id: findingId(kind, ...ids), kind, severity: f.severity ?? SEVERITY_OF[kind], ...f });
      const heights = [...new Set(input.workHeights)].sort((a, b) => a - b);

      const placed: PlacedArm[] = [];
      for (const a of input.arms) {
        try {
          placed.push(placedArm(a, heights));
        } catch (err) {
          add('unknown-model', [a.id], {
            arms: [a.id], points: [], geometry: null, at: [a.x, a.y],
            message: `${a.label || a.id}: its reach could not be computed (${err instanceof Error ? err.message : 'unknown arm model'}).`,
          });
        }
      }
      const liveSigs = new Set(placed.map((p) => p.sig));
      for (const k of arms.keys()) if (!liveSigs.has(k)) arms.delete(k);

      // Coverage
      const fp = pointsFingerprint(input.workPoints);
      const cols = placed.map((p) => coverageColumn(p, input, fp));
      const liveCols = new Set(placed.map((p) => `${p.sig}#${fp}`));
      for (const k of columns.keys()) if (!liveCols.has(k)) columns.delete(k);
      const coverage: AnalysisResult['coverage'] = {};
      const handovers = new Map<string, string[]>();
      input.workPoints.forEach((pt, i) => {
        const row: Record<string, number> = {};
        const reachedBy: string[] = [];
        placed.forEach((p, j) => {
          const m = cols[j][i];
          row[p.arm.id] = Math.round(m * 10) / 10;
          if (m >= 0) reachedBy.push(p.arm.id);
        });
        coverage[pt.id] = row;
        if (reachedBy.length === 0 && placed.length > 0) {
          const best = placed.reduce<{ id: string; m: number } | null>((b, p, j) => (b && b.m >= cols[j][i] ? b : { id: p.arm.id, m: cols[j][i] }), null);
          add('unreached-point', [pt.id], {
            arms: [], points: [pt.id], geometry: null, at: [pt.x, pt.y],
            message: `Work point ${pt.id}${pt.tag ? ` (${pt.tag})` : ''} is reached by no arm${best ? `; nearest is ${best.id}, ${mm(-best.m)} mm short` : ''}.`,
            data: best ? { shortMm: mm(-best.m), nearestArm: best.id } : undefined,
          });
        }
        if (pt.assignedArm) {
          const j = placed.findIndex((p) => p.arm.id === pt.assignedArm);
          if (j >= 0 && cols[j][i] < 0) {
            add('assigned-unreachable', [pt.id, pt.assignedArm], {
              arms: [pt.assignedArm], points: [pt.id], geometry: null, at: [pt.x, pt.y],
              message: `Work point ${pt.id} is assigned to ${pt.assignedArm}, which cannot reach it (${mm(-cols[j][i])} mm short).`,
              data: { shortMm: mm(-cols[j][i]) },
            });
          }
        }
        if (reachedBy.length >= 2) {
          for (let a = 0; a < reachedBy.length; a++) {
            for (let b = a + 1; b < reachedBy.length; b++) {
              const key = `${reachedBy[a]}+${reachedBy[b]}`;
              const list = handovers.get(key) ?? [];
              list.push(pt.id);
              handovers.set(key, list);
            }
          }
        }
      });
      for (const [key, pts] of handovers) {
        const [a, b] = key.split('+');
        add('handover', [a, b], {
          arms: [a, b], points: pts, geometry: null, at: null,
          message: `${pts.length} work point${pts.length === 1 ? '' : 's'} can be served by both ${a} and ${b} (possible handover): ${pts.slice(0, 6).join(', ')}${pts.length > 6 ? ' …' : ''}.`,
          data: { count: pts.length },
        });
      }

      // Shared zones
      const overlaps: SharedZone[] = [];
      const livePairs = new Set<string>();
      const pointIndex = new Map(input.workPoints.map((p, i) => [p.id, i]));
      for (let i = 0; i < placed.length; i++) {
        for (let j = i + 1; j < placed.length; j++) {
          const A = placed[i];
          const B = placed[j];
          const d = Math.hypot(A.arm.x - B.arm.x, A.arm.y - B.arm.y);
          if (d > A.reach.maxReach + B.reach.maxReach || !bboxOverlap(A.bbox, B.bbox)) continue;
          const [first, second] = A.arm.id < B.arm.id ? [A, B] : [B, A];
          const key = `${first.sig}&${second.sig}&${heights.join(',')}`;
          livePairs.add(key);
          let r = pairs.get(key);
          if (!r) {
            stats.pairs++;
            try {
              const polys = intersect(first.restricted, second.restricted);
              const byHeight = heights.map((h) => ({ height: h, areaM2: m2(polygonsArea(intersect(first.bands.get(h)!, second.bands.get(h)!))) }));
              r = { area: polygonsArea(polys), polys, byHeight };
            } catch (err) {
              r = { failed: err instanceof Error ? err.message : String(err) };
            }
            pairs.set(key, r);
          }
          const ids = [first.arm.id, second.arm.id];
          if ('failed' in r) {
            add('computation-failed', ['overlap', ...ids], {
              arms: ids, points: [], geometry: null, at: null,
              message: `Could not compute the overlap of ${ids.join('/')} (${r.failed}); check it by hand.`,
            });
            continue;
          }
          if (r.area < MIN_AREA_MM2) continue;
          const ci = placed.indexOf(first);
          const cj = placed.indexOf(second);
          const pts = input.workPoints.filter((p) => {
            const k = pointIndex.get(p.id)!;
            return cols[ci][k] >= 0 && cols[cj][k] >= 0;
          }).map((p) => p.id);
          const geometry = polygonsToGeoJSON(r.polys);
          overlaps.push({ arms: [ids[0], ids[1]], areaM2: m2(r.area), points: pts, geometry, byHeight: r.byHeight });
          add('shared-zone', ids, {
            arms: ids, points: pts, geometry, at: centroidOf(r.polys),
            message: `${ids[0]} and ${ids[1]} share ${m2Text(r.area)} m² of restricted space${pts.length ? ` containing ${pts.length} work point${pts.length === 1 ? '' : 's'}` : ''}: plan interlocks or zone-sharing logic.`,
            data: { areaM2: m2(r.area) },
          });
        }
      }
      for (const k of pairs.keys()) if (!livePairs.has(k)) pairs.delete(k);

      // Clearance: floor, structure
      const floor = input.floor;
      for (const p of placed) {
        const id = p.arm.id;
        const name = p.arm.label || id;
        if (floor && floor.boundary.length && !pointInPolygons(p.arm.x, p.arm.y, floor.boundary)) {
          add('base-off-floor', [id], { arms: [id], points: [], geometry: null, at: [p.arm.x, p.arm.y], message: `${name}: its base stands outside the floor boundary.` });
        }
        if (!floor) continue;
        const hits = new Map<string, { items: StructureItem[]; polys: Polygon2[] }>();
        for (const s of floor.structures) {
          if (s.role === 'column' && s.polygons.length && pointInPolygons(p.arm.x, p.arm.y, s.polygons)) {
            add('base-on-column', [id, s.id], { arms: [id], points: [], geometry: polygonsToGeoJSON(s.polygons), at: [p.arm.x, p.arm.y], message: `${name}: its base stands on a column (layer ${s.layer}).` });
            continue;
          }
          if (!bboxOverlap(p.bbox, s.bbox)) continue;
          const region = regionBelow(p, s.top);
          if (!region) continue;
          let hitPolys: Polygon2[] = [];
          let hit = false;
          try {
            if (s.polygons.length) {
              hitPolys = intersect(region, s.polygons);
              hit = polygonsArea(hitPolys) >= MIN_AREA_MM2;
            }
            if (!hit) hit = s.lines.some((l) => polylineHitsPolygons(l, region));
          } catch (err) {
            add('computation-failed', ['structure', id, s.id], { arms: [id], points: [], geometry: null, at: null, message: `Could not check ${name} against ${s.layer} (${err instanceof Error ? err.message : err}).` });
            continue;
          }
          if (!hit) continue;
          const g = hits.get(s.layer) ?? { items: [], polys: [] };
          g.items.push(s);
          g.polys.push(...hitPolys);
          hits.set(s.layer, g);
        }
        for (const [layer, g] of hits) {
          const role = g.items[0].role;
          const top = g.items[0].top;
          const union = g.polys.length ? clipUnion(g.polys) : [];
          add('reach-into-structure', [id, layer], {
            arms: [id], points: [], geometry: union.length ? polygonsToGeoJSON(union) : null, at: union.length ? centroidOf(union) : [p.arm.x, p.arm.y],
            message: `${name}: restricted space reaches into ${g.items.length} ${role}${g.items.length === 1 ? '' : 's'} on layer ${layer}${Number.isFinite(top) ? ` (up to ${mm(top)} mm high)` : ''}.`,
            data: { items: g.items.length, areaM2: m2(polygonsArea(union)) },
          });
        }
      }

      // Zones
      const fences = input.zones.filter((z) => z.kind === 'fence');
      const openings = input.zones.filter((z) => z.kind === 'opening');
      for (const f of fences) {
        if ((f.height ?? 0) < MIN_FENCE_HEIGHT_MM) {
          add('fence-too-low', [f.id], {
            arms: [], points: [], geometry: null, at: f.points[0] as [number, number],
            message: `Fence ${f.label || f.id} is ${mm(f.height ?? 0)} mm high; fixed perimeter guards are at least ${MIN_FENCE_HEIGHT_MM} mm (ISO 10218-2), more where ISO 13857 requires.`,
          });
        }
      }
      for (const p of placed) {
        const id = p.arm.id;
        const name = p.arm.label || id;
        for (const f of fences) {
          const cuts = openings.filter((o) => o.fenceId === f.id).map((o) => [o.points[0], o.points[1]] as const);
          const solid = subtractOpenings(f.points as Array<[number, number]>, cuts as never);
          const near = solid.some((l) => polylineBBoxNear(l, p.bbox, FENCE_CLEARANCE_MM));
          if (!near) continue;
          const dist = Math.min(...solid.map((l) => polylineDistanceToPolygons(l, p.restricted)));
          if (dist === 0) {
            add('reach-beyond-fence', [id, f.id], { arms: [id], points: [], geometry: null, at: [p.arm.x, p.arm.y], message: `${name}: restricted space crosses fence ${f.label || f.id}; a perimeter guard must stay outside the restricted space (ISO 10218-2).` });
          } else if (dist < FENCE_CLEARANCE_MM) {
            add('fence-clearance', [id, f.id], { arms: [id], points: [], geometry: null, at: [p.arm.x, p.arm.y], message: `${name}: only ${mm(dist)} mm between restricted space and fence ${f.label || f.id} (${FENCE_CLEARANCE_MM} mm kept as common practice).`, data: { distanceMm: mm(dist) } });
          }
        }
        for (const o of openings) {
          if (o.points.length === 2 && polylineHitsPolygons(o.points as Array<[number, number]>, p.restricted)) {
            add('reach-through-opening', [id, o.id], { arms: [id], points: [], geometry: null, at: o.points[0] as [number, number], message: `${name}: restricted space reaches through access opening ${o.label || o.id}; safeguard it (interlocked door or light curtain at the ISO 13855 distance).` });
          }
        }
        for (const z of input.zones) {
          if (z.kind !== 'operator' && z.kind !== 'keepout') continue;
          const poly: Polygon2[] = [[z.points.map(([x, y]) => [x, y] as [number, number])]];
          let inter: Polygon2[];
          try {
            inter = intersect(p.restricted, poly);
          } catch (err) {
            add('computation-failed', ['zone', id, z.id], { arms: [id], points: [], geometry: null, at: null, message: `Could not check ${name} against zone ${z.id} (${err instanceof Error ? err.message : err}).` });
            continue;
          }
          const area = polygonsArea(inter);
          if (area < MIN_AREA_MM2) continue;
          const kind: FindingKind = z.kind === 'operator' ? 'reach-into-operator-area' : 'reach-into-keepout';
          add(kind, [id, z.id], {
            arms: [id], points: [], geometry: polygonsToGeoJSON(inter), at: centroidOf(inter),
            message: z.kind === 'operator'
              ? `${name}: restricted space reaches ${m2Text(area)} m² into operator area ${z.label || z.id}; people there need safeguarding.`
              : `${name}: restricted space reaches ${m2Text(area)} m² into keep-out ${z.label || z.id}.`,
            data: { areaM2: m2(area) },
          });
        }
      }

      const regions: AnalysisResult['regions'] = {};
      for (const p of placed) {
        regions[p.arm.id] = {
          restricted: p.restricted.length ? polygonsToGeoJSON(p.restricted) : null,
          bands: heights.map((h) => {
            const b = p.bands.get(h)!;
            return { height: h, geometry: b.length ? polygonsToGeoJSON(b) : null };
          }),
        };
      }
      const t1 = typeof performance !== 'undefined' ? performance.now() : Date.now();
      return { findings: sortFindings(findings), overlaps, coverage, regions, timingMs: Math.round((t1 - t0) * 100) / 100 };
    },
  };
}

function centroidOf(polys: Polygon2[]): [number, number] | null {
  const b = polygonsBounds(polys);
  return b ? [(b[0] + b[2]) / 2, (b[1] + b[3]) / 2] : null;
}

function polylineBBoxNear(line: Array<[number, number]>, bbox: BBox | null, pad: number): boolean {
  if (!bbox) return false;
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (const [x, y] of line) {
    minX = Math.min(minX, x); minY = Math.min(minY, y); maxX = Math.max(maxX, x); maxY = Math.max(maxY, y);
  }
  return minX <= bbox[2] + pad && bbox[0] - pad <= maxX && minY <= bbox[3] + pad && bbox[1] - pad <= maxY;
}

export type { Zone };
