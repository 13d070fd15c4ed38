import { pointInPolygons } from '../geometry/pointInPolygon';
import type { Polygon2 } from '../geometry/types';
import type { Boundary } from '../schemas/layout';
import { bboxOverlap, type BBox } from './clearance';
import { segmentsIntersect } from './segments';
import type { ArmReach, PreparedFloor } from './types';

/**
 * Site tests of a candidate base for the placement search, in the plan frame (mm): the base point on
 * the floor and off structure, and the restricted space (turned to the candidate's yaw) out of
 * walls, columns and obstacles (by height), keep-outs and operator areas. Each test is a translation
 * of precomputed turned regions plus box prefilters, so a cell costs a few box checks unless
 * something is near.
 */

/** Why a base fails the site tests; `ref` indexes `SiteContext.items` or `SiteContext.areas`. */
export type SiteVerdict =
  | { ok: true }
  | { ok: false; kind: 'off-floor' }
  | { ok: false; kind: 'base-on-structure'; ref: number }
  | { ok: false; kind: 'into-structure'; ref: number }
  | { ok: false; kind: 'into-keepout' | 'into-operator'; ref: number };

/** A thing the restricted space must stay out of: its plan outline and lines, box and the arm-frame top height it is tested below. */
export interface SiteItem {
  id: string;
  label: string;
  polygons: Polygon2[];
  lines: Array<Array<[number, number]>>;
  bbox: BBox;
  /** Plan height of its top (mm above floor; Infinity = full height). */
  top: number;
}

/** One region turned to one yaw (arm frame rotated, not yet shifted): polygons, flat edge list and box. */
interface TurnedRegion {
  polys: Polygon2[];
  edges: Float64Array;
  box: BBox | null;
  /** Largest distance of the region from the J1 axis, mm. */
  radius: number;
}

/** Whether a region looks the same at every yaw: every ring a circle about the J1 axis (to 1 mm). */
export function isTurnInvariant(polys: ReadonlyArray<Polygon2>): boolean {
  for (const poly of polys) {
    for (const ring of poly) {
      let lo = Infinity, hi = -Infinity;
      for (const [u, v] of ring) {
        const r = Math.hypot(u, v);
        if (r < lo) lo = r;
        if (r > hi) hi = r;
      }
      if (hi - lo > 1) return false;
    }
  }
  return true;
}

/** Distance from (x, y) to a box, mm (0 inside). */
function boxDistance(b: BBox, x: number, y: number): number {
  const dx = x < b[0] ? b[0] - x : x > b[2] ? x - b[2] : 0;
  const dy = y < b[1] ? b[1] - y : y > b[3] ? y - b[3] : 0;
  return Math.hypot(dx, dy);
}

export interface SiteContext {
  floor: PreparedFloor | null;
  /** Walls, columns and obstacles of the floor. */
  items: SiteItem[];
  /** Keep-outs and operator areas of the layout. */
  areas: Array<SiteItem & { kind: 'keepout' | 'operator' }>;
  /** Test a base at plan (x, y) with the yaw of index `yawIndex`. */
  test(x: number, y: number, yawIndex: number): SiteVerdict;
  /** True when the restricted space looks the same at every yaw (full J1 range): the site verdict does not depend on the yaw. */
  turnInvariant: boolean;
  /** Whether the base point alone stands on the floor and off structure (no restricted-space test). */
  baseVerdict(x: number, y: number): SiteVerdict;
}

function turn(polys: ReadonlyArray<Polygon2>, yawDeg: number): TurnedRegion {
  const a = (yawDeg * Math.PI) / 180;
  const c = Math.cos(a), s = Math.sin(a);
  const out: Polygon2[] = polys.map((poly) => poly.map((ring) => ring.map(([u, v]) => [c * u - s * v, s * u + c * v] as [number, number])));
  const edges: number[] = [];
  let radius = 0;
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (const poly of out) {
    for (const ring of poly) {
      for (let k = 0; k < ring.length; k++) {
        const p = ring[k], q = ring[(k + 1) % ring.length];
        edges.push(p[0], p[1], q[0], q[1]);
        radius = Math.max(radius, Math.hypot(p[0], p[1]));
        if (p[0] < minX) minX = p[0];
        if (p[0] > maxX) maxX = p[0];
        if (p[1] < minY) minY = p[1];
        if (p[1] > maxY) maxY = p[1];
      }
    }
  }
  return { polys: out, edges: Float64Array.from(edges), box: out.length ? [minX, minY, maxX, maxY] : null, radius };
}

/** True when the item, shifted by (−dx, −dy) into the turned region's frame, meets the region (edge crossing, or one inside the other). */
function itemMeets(item: SiteItem, r: TurnedRegion, dx: number, dy: number): boolean {
  if (boxDistance(item.bbox, dx, dy) > r.radius) return false;
  const b: BBox = [item.bbox[0] - dx, item.bbox[1] - dy, item.bbox[2] - dx, item.bbox[3] - dy];
  if (!bboxOverlap(r.box, b)) return false;
  const shift = (p: readonly [number, number]): [number, number] => [p[0] - dx, p[1] - dy];
  const crosses = (line: ReadonlyArray<readonly [number, number]>, closed: boolean) => {
    const n = closed ? line.length : line.length - 1;
    const e = r.edges;
    for (let i = 0; i < e.length; i += 4) {
      const ax = e[i], ay = e[i + 1], bx = e[i + 2], by = e[i + 3];
      if (Math.max(ax, bx) < b[0] || Math.min(ax, bx) > b[2] || Math.max(ay, by) < b[1] || Math.min(ay, by) > b[3]) continue;
      for (let k = 0; k < n; k++) {
        if (segmentsIntersect([ax, ay], [bx, by], shift(line[k]), shift(line[(k + 1) % line.length]))) return true;
      }
    }
    return false;
  };
  for (const poly of item.polygons) {
    for (const ring of poly) if (crosses(ring, true)) return true;
    const v = poly[0]?.[0];
    if (v && pointInPolygons(v[0] - dx, v[1] - dy, r.polys)) return true;
    const w = r.polys[0]?.[0]?.[0];
    if (w && pointInPolygons(w[0] + dx, w[1] + dy, [poly])) return true;
  }
  for (const l of item.lines) {
    if (crosses(l, false)) return true;
    if (l[0] && pointInPolygons(l[0][0] - dx, l[0][1] - dy, r.polys)) return true;
  }
  return false;
}

const boxOf = (polys: Polygon2[]): BBox => {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (const p of polys) for (const [x, y] of p[0] ?? []) {
    if (x < minX) minX = x;
    if (x > maxX) maxX = x;
    if (y < minY) minY = y;
    if (y > maxY) maxY = y;
  }
  return [minX, minY, maxX, maxY];
};

/**
 * Builds the site tests for one arm reach at the given yaws (deg) and mount height (mm), against the
 * floor's structure and the layout's keep-outs and operator areas (obstacles under the work points
 * excepted for the restricted space). Turned regions are built lazily,
 * once per yaw (and per structure height), so only yaws that pass the margin test cost anything.
 */
export function siteContext(reach: ArmReach, yawsDeg: ReadonlyArray<number>, mountHeightMm: number, floor: PreparedFloor | null, boundaries: ReadonlyArray<Boundary>, workPoints: ReadonlyArray<{ x: number; y: number }> = []): SiteContext {
  const items: SiteItem[] = (floor?.structures ?? []).map((s) => ({ id: s.id, label: s.id, polygons: s.polygons, lines: s.lines, bbox: s.bbox, top: s.top }));
  // An obstacle under one of the chosen work points is the machine the arm serves: the reach must
  // enter it, so it only blocks the base. Walls and columns always count.
  const served = new Set<number>();
  (floor?.structures ?? []).forEach((s, i) => {
    if (s.role === 'obstacle' && s.polygons.length && workPoints.some((p) => pointInPolygons(p.x, p.y, s.polygons))) served.add(i);
  });
  const areas = boundaries
    .filter((z): z is Boundary & { kind: 'keepout' | 'operator' } => z.kind === 'keepout' || z.kind === 'operator')
    .map((z) => {
      const polygons: Polygon2[] = [[z.points.map(([x, y]) => [x, y] as [number, number])]];
      return { id: z.id, label: z.label || z.id, kind: z.kind, polygons, lines: [], bbox: boxOf(polygons), top: Infinity };
    });
  const restricted = new Map<number, TurnedRegion>();
  const invariant = isTurnInvariant(reach.restricted);
  const below = new Map<string, TurnedRegion | null>();
  const restrictedAt = (yi0: number) => {
    const yi = invariant ? 0 : yi0;
    let r = restricted.get(yi);
    if (!r) restricted.set(yi, (r = turn(reach.restricted, yawsDeg[yi])));
    return r;
  };
  const belowAt = (yi0: number, top: number): TurnedRegion | null => {
    const yi = invariant ? 0 : yi0;
    const zTop = top - mountHeightMm;
    if (zTop >= reach.zMax) return restrictedAt(yi);
    if (zTop <= reach.zMin) return null;
    const key = `${yi}|${zTop}`;
    if (!below.has(key)) below.set(key, turn(reach.restrictedBelow(zTop), yawsDeg[yi]));
    return below.get(key)!;
  };

  function baseVerdict(x: number, y: number): SiteVerdict {
    if (floor && floor.outline.length && !pointInPolygons(x, y, floor.outline)) return { ok: false, kind: 'off-floor' };
    for (let i = 0; i < items.length; i++) {
      const s = items[i];
      if (x < s.bbox[0] || x > s.bbox[2] || y < s.bbox[1] || y > s.bbox[3]) continue;
      if (s.polygons.length && pointInPolygons(x, y, s.polygons)) return { ok: false, kind: 'base-on-structure', ref: i };
    }
    return { ok: true };
  }

  return {
    floor,
    items,
    areas,
    baseVerdict,
    turnInvariant: invariant,
    test(x, y, yi) {
      const base = baseVerdict(x, y);
      if (!base.ok) return base;
      const full = restrictedAt(yi);
      if (!full.box) return { ok: true };
      const reachBox: BBox = [full.box[0] + x, full.box[1] + y, full.box[2] + x, full.box[3] + y];
      for (let i = 0; i < areas.length; i++) {
        if (bboxOverlap(reachBox, areas[i].bbox) && itemMeets(areas[i], full, x, y)) return { ok: false, kind: areas[i].kind === 'operator' ? 'into-operator' : 'into-keepout', ref: i };
      }
      for (let i = 0; i < items.length; i++) {
        if (served.has(i) || !bboxOverlap(reachBox, items[i].bbox)) continue;
        const region = belowAt(yi, items[i].top);
        if (region && itemMeets(items[i], region, x, y)) return { ok: false, kind: 'into-structure', ref: i };
      }
      return { ok: true };
    },
  };
}
