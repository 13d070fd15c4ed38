import { polygonsArea } from '../geometry/area';
import { pointsBounds, polygonsBounds } from '../geometry/bounds';
import { clipIntersect, clipIntersectShapes, clipShape, clipUnion, type ClipShape } from '../geometry/clipper';
import { polygonsToGeoJSON } from '../geometry/geojson';
import { pointInPolygons } from '../geometry/pointInPolygon';
import type { Polygon2 } from '../geometry/types';
import type { ArmPlacement, Boundary } from '../schemas/layout';
import { findingId, m2, m2Text, mm, reasonOf, SEVERITY_OF } from './messages';
import { polylineDistanceToPolygons, polylineHitsPolygons, segmentsIntersectXY, subtractOpenings } from './segments';
import type { Finding, FindingKind, PreparedFloor, StructureItem } from './types';

/** Smallest overlap area that counts, mm² (below it is boolean-op noise). */
export const MIN_AREA_MM2 = 1;
/** Kept between the restricted space and a fence before a clearance warning, mm (common practice: 120–200 mm). */
export const FENCE_CLEARANCE_MM = 150;
/** Lowest fixed perimeter guard, mm (ISO 10218-2). */
export const MIN_FENCE_HEIGHT_MM = 1400;

export type BBox = [number, number, number, number];

export const bboxOverlap = (a: BBox | null, b: BBox | null) => !!a && !!b && a[0] <= b[2] && b[0] <= a[2] && a[1] <= b[3] && b[1] <= a[3];

/** clipIntersect, with an empty side giving an empty result (clipper refuses two empty inputs). */
export function intersect(a: Polygon2[], b: Polygon2[]): Polygon2[] {
  return a.length && b.length ? clipIntersect(a, b) : [];
}

/** Each cached arm region's clipper form, made once (regions are cached per arm and never changed). */
const regionShapes = new WeakMap<Polygon2[], ClipShape>();
function regionShape(region: Polygon2[]): ClipShape {
  let s = regionShapes.get(region);
  if (!s) regionShapes.set(region, (s = clipShape(region)));
  return s;
}

/** intersect() of a cached arm region and other polygons, the region converted for clipping once. */
function intersectRegion(region: Polygon2[], b: Polygon2[]): Polygon2[] {
  return region.length && b.length ? clipIntersectShapes(regionShape(region), clipShape(b)) : [];
}

export function centroidOf(polys: Polygon2[]): [number, number] | null {
  const b = polygonsBounds(polys);
  return b ? [(b[0] + b[2]) / 2, (b[1] + b[3]) / 2] : null;
}

export function makeFinding(kind: FindingKind, ids: string[], f: Omit<Finding, 'id' | 'kind' | 'severity'>): Finding {
  return { id: findingId(kind, ...ids), kind, severity: SEVERITY_OF[kind], ...f };
}

/** What the clearance checks need of one placed arm (plan mm). */
export interface ClearanceArm {
  arm: ArmPlacement;
  restricted: Polygon2[];
  bbox: BBox | null;
  /** Restricted space of the reach below a plan height (null when nothing reaches that low). */
  below(top: number): Polygon2[] | null;
}

/** A region's edges as a flat list [ax, ay, bx, by, …], built once per region (regions are cached per arm). */
const edgeCache = new WeakMap<Polygon2[], Float64Array>();
export function regionEdges(region: Polygon2[]): Float64Array {
  let e = edgeCache.get(region);
  if (!e) {
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
    e = Float64Array.from(out);
    edgeCache.set(region, e);
  }
  return e;
}

/** True when any segment of the polyline crosses a region edge (region edges prefiltered by the item's box). */
function crossesEdges(line: ReadonlyArray<readonly [number, number]>, closed: boolean, edges: Float64Array, box: BBox): boolean {
  const n = closed ? line.length : line.length - 1;
  for (let e = 0; e < edges.length; e += 4) {
    const ax = edges[e], ay = edges[e + 1], bx = edges[e + 2], by = edges[e + 3];
    if (Math.max(ax, bx) < box[0] || Math.min(ax, bx) > box[2] || Math.max(ay, by) < box[1] || Math.min(ay, by) > box[3]) continue;
    for (let k = 0; k < n; k++) {
      const c = line[k];
      const d = line[k + 1 === line.length ? 0 : k + 1];
      if (segmentsIntersectXY(ax, ay, bx, by, c[0], c[1], d[0], d[1])) return true;
    }
  }
  return false;
}

/**
 * True when a structure item enters the region. With no edge crossing, two simple shapes are either
 * nested or apart, so one vertex each way settles it.
 */
function itemHits(s: StructureItem, region: Polygon2[]): boolean {
  const edges = regionEdges(region);
  for (const poly of s.polygons) {
    for (const ring of poly) if (crossesEdges(ring, true, edges, s.bbox)) return true;
    const v = poly[0]?.[0];
    if (v && pointInPolygons(v[0], v[1], region)) return true;
    const w = region[0]?.[0]?.[0];
    if (w && pointInPolygons(w[0], w[1], [poly])) return true;
  }
  for (const l of s.lines) {
    if (crossesEdges(l, false, edges, s.bbox)) return true;
    if (l[0] && pointInPolygons(l[0][0], l[0][1], region)) return true;
  }
  return false;
}

/**
 * The structure items the arm's restricted space (below each item's top) enters, by layer; a
 * column under the base goes to `onColumn` instead. (A loop of its own, indexed: it runs over
 * every item of the floor for every arm.)
 */
function structureHits(p: ClearanceArm, structures: ReadonlyArray<StructureItem>, onColumn: (s: StructureItem) => void): Map<string, StructureItem[]> {
  const hits = new Map<string, StructureItem[]>();
  const x = p.arm.x;
  const y = p.arm.y;
  const box = p.bbox;
  for (let i = 0; i < structures.length; i++) {
    const s = structures[i];
    const sb = s.bbox;
    if (s.role === 'column' && s.polygons.length && x >= sb[0] && x <= sb[2] && y >= sb[1] && y <= sb[3] && pointInPolygons(x, y, s.polygons)) {
      onColumn(s);
      continue;
    }
    if (!box || sb[0] > box[2] || box[0] > sb[2] || sb[1] > box[3] || box[1] > sb[3]) continue;
    const region = p.below(s.top);
    if (!region || !itemHits(s, region)) continue;
    const list = hits.get(s.layer);
    if (list) list.push(s);
    else hits.set(s.layer, [s]);
  }
  return hits;
}

/** Clearance findings of one arm: floor outline, columns under the base, structure by height, fences, openings, operator areas, keep-outs. */
export function armClearance(p: ClearanceArm, floor: PreparedFloor | null, boundaries: ReadonlyArray<Boundary>): Finding[] {
  const out: Finding[] = [];
  const id = p.arm.id;
  const name = p.arm.label || id;
  const at: [number, number] = [p.arm.x, p.arm.y];
  if (floor && floor.outline.length && !pointInPolygons(p.arm.x, p.arm.y, floor.outline)) {
    out.push(makeFinding('base-off-floor', [id], { arms: [id], points: [], geometry: null, at, message: `${name}: its base stands outside the floor outline.` }));
  }
  if (floor) {
    const hits = structureHits(p, floor.structures, (s) => {
      out.push(makeFinding('base-on-column', [id, s.id], { arms: [id], points: [], geometry: polygonsToGeoJSON(s.polygons), at, message: `${name}: its base stands on a column (layer ${s.layer}).` }));
    });
    for (const [layer, items] of hits) {
      const { role, top } = items[0];
      let union: Polygon2[] = [];
      try {
        const byTop = new Map<number, Polygon2[]>();
        for (const s of items) {
          let list = byTop.get(s.top);
          if (!list) byTop.set(s.top, (list = []));
          for (const poly of s.polygons) list.push(poly);
        }
        const parts: Polygon2[] = [];
        for (const [t, polys] of byTop) for (const part of intersectRegion(p.below(t) ?? [], polys)) parts.push(part);
        // One clip per height already merges its items; only several heights need a union.
        union = byTop.size > 1 && parts.length ? clipUnion(parts) : parts;
      } catch (err) {
        const why = reasonOf(err);
        out.push(makeFinding('computation-failed', ['structure', id, layer], { arms: [id], points: [], geometry: null, at: null, message: `Could not measure ${name} against layer ${layer}${why ? ` (${why})` : ''}; check it by hand.` }));
      }
      out.push(makeFinding('reach-into-structure', [id, layer], {
        arms: [id], points: [], geometry: union.length ? polygonsToGeoJSON(union) : null, at: union.length ? centroidOf(union) : at,
        message: `${name}: restricted space reaches into ${items.length} ${role}${items.length === 1 ? '' : 's'} on layer ${layer}${Number.isFinite(top) ? ` (up to ${mm(top)} mm high)` : ''}.`,
        data: { items: items.length, areaM2: m2(polygonsArea(union)) },
      }));
    }
  }

  const fences = boundaries.filter((z) => z.kind === 'fence');
  const openings = boundaries.filter((z) => z.kind === 'opening');
  for (const f of fences) {
    const cuts = openings.filter((o) => o.fenceId === f.id).map((o) => [o.points[0], o.points[1]] as const);
    const solid = subtractOpenings(f.points as Array<[number, number]>, cuts as never);
    if (!solid.some((l) => polylineBBoxNear(l, p.bbox, FENCE_CLEARANCE_MM))) continue;
    const dist = Math.min(...solid.map((l) => polylineDistanceToPolygons(l, p.restricted)));
    const label = f.label || f.id;
    if (dist === 0) {
      out.push(makeFinding('reach-beyond-fence', [id, f.id], { arms: [id], points: [], geometry: null, at, message: `${name}: restricted space crosses fence ${label}; a perimeter guard must stay outside the restricted space (ISO 10218-2).` }));
    } else if (dist < FENCE_CLEARANCE_MM) {
      out.push(makeFinding('fence-clearance', [id, f.id], { arms: [id], points: [], geometry: null, at, message: `${name}: only ${mm(dist)} mm between restricted space and fence ${label} (${FENCE_CLEARANCE_MM} mm kept as common practice).`, data: { distanceMm: mm(dist) } }));
    }
  }
  for (const o of openings) {
    if (o.points.length === 2 && polylineHitsPolygons(o.points as Array<[number, number]>, p.restricted)) {
      out.push(makeFinding('reach-through-opening', [id, o.id], { arms: [id], points: [], geometry: null, at: o.points[0] as [number, number], message: `${name}: restricted space reaches through access opening ${o.label || o.id}; safeguard it (interlocked door or light curtain at the ISO 13855 distance).` }));
    }
  }
  for (const z of boundaries) {
    if (z.kind !== 'operator' && z.kind !== 'keepout') continue;
    const poly: Polygon2[] = [[z.points.map(([x, y]) => [x, y] as [number, number])]];
    let inter: Polygon2[];
    try {
      inter = intersectRegion(p.restricted, poly);
    } catch (err) {
      const why = reasonOf(err);
      const what = z.kind === 'operator' ? 'operator area' : 'keep-out';
      out.push(makeFinding('computation-failed', ['boundary', id, z.id], { arms: [id], points: [], geometry: null, at: null, message: `Could not check ${name} against ${what} ${z.label || z.id}${why ? ` (${why})` : ''}; check it by hand.` }));
      continue;
    }
    const area = polygonsArea(inter);
    if (area < MIN_AREA_MM2) continue;
    const operator = z.kind === 'operator';
    out.push(makeFinding(operator ? 'reach-into-operator-area' : 'reach-into-keepout', [id, z.id], {
      arms: [id], points: [], geometry: polygonsToGeoJSON(inter), at: centroidOf(inter),
      message: operator
        ? `${name}: restricted space reaches ${m2Text(area)} m² into operator area ${z.label || z.id}; people there need safeguarding.`
        : `${name}: restricted space reaches ${m2Text(area)} m² into keep-out ${z.label || z.id}.`,
      data: { areaM2: m2(area) },
    }));
  }
  return out;
}

/** Fence height findings (no arm involved). */
export function fenceFindings(boundaries: ReadonlyArray<Boundary>): Finding[] {
  return boundaries
    .filter((z) => z.kind === 'fence' && (z.height ?? 0) < MIN_FENCE_HEIGHT_MM)
    .map((f) =>
      makeFinding('fence-too-low', [f.id], {
        arms: [], points: [], geometry: null, at: f.points[0] as [number, number],
        message: `Fence ${f.label || f.id} is ${mm(f.height ?? 0)} mm high; fixed perimeter guards are at least ${MIN_FENCE_HEIGHT_MM} mm (ISO 10218-2), more where ISO 13857 requires.`,
      }),
    );
}

function polylineBBoxNear(line: Array<[number, number]>, bbox: BBox | null, pad: number): boolean {
  if (!bbox) return false;
  const b = pointsBounds(line);
  if (!b) return false;
  const { minX, minY, maxX, maxY } = b;
  return minX <= bbox[2] + pad && bbox[0] - pad <= maxX && minY <= bbox[3] + pad && bbox[1] - pad <= maxY;
}
