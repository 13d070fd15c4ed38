/**
 * The rectilinear geometry of a guard ring (plan mm): boxes, wall faces a side may close on,
 * obstacles taken inside the ring, and the ring split into fence lines and wall stretches. Used by
 * fenceProposal.ts; see docs/fences.md.
 */
import { polygonsArea } from '../geometry/area';
import { clipDifference, clipUnion } from '../geometry/clipper';
import type { Polygon2, Pt, Ring } from '../geometry/types';
import { intersect } from './clearance';
import type { PreparedFloor } from './types';

/** A ring side may move outward onto a wall face at most this far, mm. */
export const WALL_SNAP_MM = 1500;

/** An axis-aligned box [minX, minY, maxX, maxY], plan mm. */
export type Box = [number, number, number, number];

/** True when two boxes overlap or come within `pad` mm of each other. */
export const boxOverlap = (a: Box, b: Box, pad = 0) => a[0] - pad <= b[2] && b[0] - pad <= a[2] && a[1] - pad <= b[3] && b[1] - pad <= a[3];
/** The smallest box holding both. */
export const boxUnion = (a: Box, b: Box): Box => [Math.min(a[0], b[0]), Math.min(a[1], b[1]), Math.max(a[2], b[2]), Math.max(a[3], b[3])];
/** Perimeter of a box, mm. */
export const perimeter = (b: Box) => 2 * (b[2] - b[0] + b[3] - b[1]);
const boxRing = (b: Box): Ring => [[b[0], b[1]], [b[2], b[1]], [b[2], b[3]], [b[0], b[3]]];

/** Wall faces of the floor (plan mm segments): full-height wall items' edges and lines, and the floor outline (the hall's own walls). */
export function wallFacesOf(floor: PreparedFloor | null): Array<[Pt, Pt]> {
  const out: Array<[Pt, Pt]> = [];
  if (!floor) return out;
  const addRing = (ring: ReadonlyArray<Pt>, closed: boolean) => {
    const n = closed ? ring.length : ring.length - 1;
    for (let k = 0; k < n; k++) out.push([[ring[k][0], ring[k][1]], [ring[(k + 1) % ring.length][0], ring[(k + 1) % ring.length][1]]]);
  };
  for (const s of floor.structures) {
    if (s.role !== 'wall' || Number.isFinite(s.top)) continue;
    for (const poly of s.polygons) for (const ring of poly) addRing(ring, true);
    for (const l of s.lines) addRing(l, false);
  }
  for (const poly of floor.outline) for (const ring of poly) addRing(ring, true);
  return out;
}

const horizontal = (f: readonly [Pt, Pt]) => Math.abs(f[0][1] - f[1][1]) < 1;
const vertical = (f: readonly [Pt, Pt]) => Math.abs(f[0][0] - f[1][0]) < 1;

/**
 * Moves the sides of a ring box onto wall faces where a wall covers most of the side, lies beyond
 * the restricted spaces and is no more than WALL_SNAP_MM outside the box. Returns the new box.
 */
export function snapToWalls(box: Box, hazard: Box, faces: ReadonlyArray<[Pt, Pt]>): Box {
  const b: Box = [...box];
  const overlapLen = (lo: number, hi: number, a: number, c: number) => Math.max(0, Math.min(hi, Math.max(a, c)) - Math.max(lo, Math.min(a, c)));
  // side: 0 = west (x = b[0]), 1 = south, 2 = east, 3 = north.
  for (let side = 0; side < 4; side++) {
    const alongX = side === 1 || side === 3;
    const lo = alongX ? box[0] : box[1];
    const hi = alongX ? box[2] : box[3];
    let best: { at: number; cover: number } | null = null;
    for (const f of faces) {
      if (alongX ? !horizontal(f) : !vertical(f)) continue;
      const at = alongX ? f[0][1] : f[0][0];
      const cover = alongX ? overlapLen(lo, hi, f[0][0], f[1][0]) : overlapLen(lo, hi, f[0][1], f[1][1]);
      if (cover < 0.5 * (hi - lo)) continue;
      // Beyond the hazard on this side, and not far outside the box.
      const ok =
        side === 0 ? at <= hazard[0] && at >= box[0] - WALL_SNAP_MM
        : side === 1 ? at <= hazard[1] && at >= box[1] - WALL_SNAP_MM
        : side === 2 ? at >= hazard[2] && at <= box[2] + WALL_SNAP_MM
        : at >= hazard[3] && at <= box[3] + WALL_SNAP_MM;
      if (!ok) continue;
      // The face nearest the hazard is the one the ring meets.
      const nearer = !best || (side < 2 ? at > best.at : at < best.at);
      if (nearer || (best && at === best.at && cover > best.cover)) best = { at, cover };
    }
    if (best) b[side === 0 ? 0 : side === 1 ? 1 : side === 2 ? 2 : 3] = best.at;
  }
  return b;
}

/** Obstacles a fence may not pass through (plan boxes grown by a post width): columns, obstacles, and walls unless they close the ring. */
export function obstacleBoxes(floor: PreparedFloor | null, grow: number, withWalls: boolean): Box[] {
  if (!floor) return [];
  return floor.structures
    .filter((s) => s.role !== 'wall' || withWalls)
    .filter((s) => Number.isFinite(s.bbox[0]))
    .map((s) => [s.bbox[0] - grow, s.bbox[1] - grow, s.bbox[2] + grow, s.bbox[3] + grow] as Box);
}

/** The ring region with every obstacle it would cross taken inside (union of boxes), as one outer ring. */
export function routeAroundObstacles(start: Box, obstacles: ReadonlyArray<Box>): { ring: Ring; taken: number } {
  let region: Polygon2[] = [[boxRing(start)]];
  let bbox: Box = [...start];
  let taken = 0;
  const done = new Set<number>();
  for (let pass = 0; pass < 50; pass++) {
    let grew = false;
    obstacles.forEach((o, i) => {
      if (done.has(i) || !boxOverlap(o, bbox)) return;
      const op: Polygon2[] = [[boxRing(o)]];
      const inside = intersect(op, region);
      if (!inside.length || polygonsArea(inside) < 1) return;
      const outside = clipDifference(op, region);
      done.add(i);
      if (!outside.length || polygonsArea(outside) < 1) return; // enclosed: the ring does not touch it
      region = clipUnion([...region, ...op]);
      bbox = boxUnion(bbox, o);
      taken++;
      grew = true;
    });
    if (!grew) break;
  }
  // The largest outer ring (holes are inside the ring and need no fence).
  const outer = region.map((p) => p[0]).sort((a, b) => Math.abs(polygonsArea([[b]])) - Math.abs(polygonsArea([[a]])))[0];
  return { ring: simplifyRectilinear(outer), taken };
}

/** Drops repeated and collinear points of a ring. */
function simplifyRectilinear(ring: Ring): Ring {
  const pts: Ring = [];
  for (const p of ring) if (!pts.length || Math.hypot(p[0] - pts[pts.length - 1][0], p[1] - pts[pts.length - 1][1]) > 0.5) pts.push([p[0], p[1]]);
  if (pts.length > 1 && Math.hypot(pts[0][0] - pts[pts.length - 1][0], pts[0][1] - pts[pts.length - 1][1]) <= 0.5) pts.pop();
  let changed = true;
  while (changed && pts.length > 3) {
    changed = false;
    for (let i = 0; i < pts.length; i++) {
      const a = pts[(i - 1 + pts.length) % pts.length], b = pts[i], c = pts[(i + 1) % pts.length];
      const cross = (b[0] - a[0]) * (c[1] - b[1]) - (b[1] - a[1]) * (c[0] - b[0]);
      if (Math.abs(cross) < 1e-3 * Math.hypot(b[0] - a[0], b[1] - a[1]) * Math.hypot(c[0] - b[0], c[1] - b[1]) + 1e-9) {
        pts.splice(i, 1);
        changed = true;
        break;
      }
    }
  }
  return pts;
}

/**
 * The ring's edges split into fence lines and wall stretches: the parts of an edge lying on a wall
 * face (within 1 mm, parallel) are closed by the wall. Fence lines start at a corner.
 */
export function splitOnWalls(ring: Ring, faces: ReadonlyArray<[Pt, Pt]>): { lines: Pt[][]; wall: Array<[Pt, Pt]> } {
  type Piece = { a: Pt; b: Pt; wall: boolean };
  const pieces: Piece[] = [];
  for (let k = 0; k < ring.length; k++) {
    const a = ring[k], b = ring[(k + 1) % ring.length];
    const L = Math.hypot(b[0] - a[0], b[1] - a[1]);
    if (L < 1e-6) continue;
    const ux = (b[0] - a[0]) / L, uy = (b[1] - a[1]) / L;
    const spans: Array<[number, number]> = [];
    for (const f of faces) {
      const offLine = (q: Pt) => Math.abs((q[0] - a[0]) * uy - (q[1] - a[1]) * ux);
      if (offLine(f[0]) > 1 || offLine(f[1]) > 1) continue;
      const t0 = (f[0][0] - a[0]) * ux + (f[0][1] - a[1]) * uy;
      const t1 = (f[1][0] - a[0]) * ux + (f[1][1] - a[1]) * uy;
      const lo = Math.max(0, Math.min(t0, t1)), hi = Math.min(L, Math.max(t0, t1));
      if (hi - lo > 1) spans.push([lo, hi]);
    }
    spans.sort((u, v) => u[0] - v[0]);
    const merged: Array<[number, number]> = [];
    for (const s of spans) {
      const last = merged[merged.length - 1];
      if (last && s[0] <= last[1] + 1) last[1] = Math.max(last[1], s[1]);
      else merged.push([...s]);
    }
    const at = (t: number): Pt => [a[0] + ux * t, a[1] + uy * t];
    let t = 0;
    for (const [lo, hi] of merged) {
      if (lo > t + 1) pieces.push({ a: at(t), b: at(lo), wall: false });
      pieces.push({ a: at(lo), b: at(hi), wall: true });
      t = hi;
    }
    if (L > t + 1) pieces.push({ a: at(t), b: b, wall: false });
    else if (pieces.length) pieces[pieces.length - 1].b = [b[0], b[1]];
  }
  const wall = pieces.filter((p) => p.wall).map((p) => [p.a, p.b] as [Pt, Pt]);
  if (!wall.length) return { lines: [[...ring.map((p) => [p[0], p[1]] as Pt), [ring[0][0], ring[0][1]]]], wall };
  // Rotate so the pieces start just after a wall stretch, then collect runs of fence pieces.
  const first = pieces.findIndex((p) => p.wall);
  const ordered = [...pieces.slice(first), ...pieces.slice(0, first)];
  const lines: Pt[][] = [];
  let cur: Pt[] = [];
  for (const p of ordered) {
    if (p.wall) {
      if (cur.length > 1) lines.push(cur);
      cur = [];
    } else {
      if (!cur.length) cur.push(p.a);
      cur.push(p.b);
    }
  }
  if (cur.length > 1) lines.push(cur);
  return { lines, wall };
}
