import ClipperLib from 'clipper-lib';
import { ringArea } from './area';
import { GRID_MM } from './tolerance';
import type { Polygon2, Ring } from './types';

/**
 * Robust planar boolean operations and offsetting on millimetre polygons through clipper-lib
 * (integer Vatti clipping). Coordinates are scaled to integer units of GRID_MM (0.01 mm), which is
 * also the snapping grid; results come back as polygons with outer rings counter-clockwise and
 * holes clockwise.
 */
const SCALE = 1 / GRID_MM;

function ringToPath(ring: Readonly<Ring>, ccw: boolean): ClipperLib.Path {
  const path: ClipperLib.Path = [];
  // (an indexed loop: destructuring each vertex goes through the iterator protocol, a heap object per vertex)
  for (let i = 0; i < ring.length; i++) {
    const X = Math.round(ring[i][0] * SCALE);
    const Y = Math.round(ring[i][1] * SCALE);
    const last = path[path.length - 1];
    if (!last || last.X !== X || last.Y !== Y) path.push({ X, Y });
  }
  if (path.length > 1 && path[0].X === path[path.length - 1].X && path[0].Y === path[path.length - 1].Y) path.pop();
  const area = ringArea(ring);
  if (area !== 0 && area > 0 !== ccw) path.reverse();
  return path;
}

/** Polygons → clipper paths with outer rings positive and holes negative (so non-zero filling is right). */
function toPaths(polygons: ReadonlyArray<Polygon2>): ClipperLib.Paths {
  const paths: ClipperLib.Paths = [];
  for (const p of polygons) {
    p.forEach((ring, i) => {
      const path = ringToPath(ring, i === 0);
      if (path.length >= 3) paths.push(path);
    });
  }
  return paths;
}

function pathToRing(path: ClipperLib.Path): Ring {
  return path.map((pt) => [pt.X / SCALE, pt.Y / SCALE]);
}

function orient(ring: Ring, ccw: boolean): Ring {
  const a = ringArea(ring);
  return a !== 0 && a > 0 !== ccw ? ring.reverse() : ring;
}

function treeToPolygons(tree: ClipperLib.PolyTree): Polygon2[] {
  const out: Polygon2[] = [];
  const visitOuter = (node: ClipperLib.PolyNode): void => {
    const poly: Polygon2 = [orient(pathToRing(node.Contour()), true)];
    for (const hole of node.Childs()) {
      poly.push(orient(pathToRing(hole.Contour()), false));
      for (const island of hole.Childs()) visitOuter(island);
    }
    out.push(poly);
  };
  for (const child of tree.Childs()) visitOuter(child);
  return out;
}

function execute(clipType: ClipperLib.ClipType, subject: ClipperLib.Paths, clip: ClipperLib.Paths): Polygon2[] {
  const c = new ClipperLib.Clipper();
  if (subject.length) c.AddPaths(subject, ClipperLib.PolyType.ptSubject, true);
  if (clip.length) c.AddPaths(clip, ClipperLib.PolyType.ptClip, true);
  const tree = new ClipperLib.PolyTree();
  const ok = c.Execute(clipType, tree, ClipperLib.PolyFillType.pftNonZero, ClipperLib.PolyFillType.pftNonZero);
  if (!ok) throw new Error('polygon clipping failed');
  return treeToPolygons(tree);
}

/**
 * Union of polygons (each polygon's outer ring is taken as filled whatever its winding, holes
 * subtract), mm; integer Vatti clipping on the 0.01 mm grid.
 */
export function clipUnion(polygons: ReadonlyArray<Polygon2>): Polygon2[] {
  return execute(ClipperLib.ClipType.ctUnion, toPaths(polygons), []);
}

type Box = [number, number, number, number];

function pathsBox(paths: ClipperLib.Paths): Box | null {
  let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
  for (const path of paths) {
    for (const { X, Y } of path) {
      if (X < x0) x0 = X;
      if (X > x1) x1 = X;
      if (Y < y0) y0 = Y;
      if (Y > y1) y1 = Y;
    }
  }
  return x0 <= x1 ? [x0, y0, x1, y1] : null;
}

/** Polygons converted once for clipping (integer paths and their bounding box), to clip against many others. */
export interface ClipShape {
  readonly paths: ClipperLib.Paths;
  readonly box: Box | null;
}

/** Polygons → a ClipShape; the polygons must not change while the shape is in use. */
export function clipShape(polygons: ReadonlyArray<Polygon2>): ClipShape {
  const paths = toPaths(polygons);
  return { paths, box: pathsBox(paths) };
}

/** Which sides of the box a point lies strictly beyond: 1 left, 2 right, 4 below, 8 above (0 inside or on it). */
function outcode(X: number, Y: number, box: Box): number {
  return (X < box[0] ? 1 : X > box[2] ? 2 : 0) | (Y < box[1] ? 4 : Y > box[3] ? 8 : 0);
}

/**
 * The paths with every run of vertices that lie strictly beyond one side of `box` shortened to its
 * two ends: the chord that replaces the run lies beyond that side too, so the winding number
 * changes only outside the box and every point inside it (with every edge that reaches it) is
 * kept exactly — no new vertex, no rounding. A path left with fewer than three vertices lies
 * wholly outside and is dropped. Paths with nothing to drop are handed back as they are.
 */
export function cropPathsToBox(paths: ClipperLib.Paths, box: Box): ClipperLib.Paths {
  const out: ClipperLib.Paths = [];
  for (const path of paths) {
    const n = path.length;
    const kept: ClipperLib.Path = [path[0]];
    // acc: the sides every vertex of the current run (from the last kept vertex) lies beyond;
    // pending: the run's last vertex, dropped if the next vertex still shares a side with the run.
    let acc = outcode(path[0].X, path[0].Y, box);
    let pending = -1;
    for (let i = 1; i <= n; i++) {
      const p = path[i === n ? 0 : i];
      const c = outcode(p.X, p.Y, box);
      if ((acc & c) !== 0) {
        acc &= c;
        pending = i;
        continue;
      }
      if (pending >= 0) {
        kept.push(path[pending]);
        acc = outcode(path[pending].X, path[pending].Y, box);
        pending = -1;
        if ((acc & c) !== 0) {
          acc &= c;
          pending = i;
          continue;
        }
      }
      if (i < n) kept.push(p);
      acc = c;
    }
    if (kept.length === n) out.push(path);
    else if (kept.length >= 3) out.push(kept);
  }
  return out;
}

/**
 * Intersection of two prepared shapes, mm: empty at once when their bounding boxes do not meet,
 * else integer Vatti clipping of the paths, each first cropped (exactly, cropPathsToBox) to the
 * box both bounding boxes share — a large region against a small one then costs little more than
 * the small one's edges.
 */
export function clipIntersectShapes(a: ClipShape, b: ClipShape): Polygon2[] {
  if (!a.box || !b.box) return [];
  if (a.box[0] > b.box[2] || b.box[0] > a.box[2] || a.box[1] > b.box[3] || b.box[1] > a.box[3]) return [];
  const box: Box = [Math.max(a.box[0], b.box[0]), Math.max(a.box[1], b.box[1]), Math.min(a.box[2], b.box[2]), Math.min(a.box[3], b.box[3])];
  const pa = cropPathsToBox(a.paths, box);
  const pb = cropPathsToBox(b.paths, box);
  if (!pa.length || !pb.length) return [];
  return execute(ClipperLib.ClipType.ctIntersection, pa, pb);
}

/** Intersection of two polygon sets, mm (integer Vatti clipping; see clipIntersectShapes). */
export function clipIntersect(a: ReadonlyArray<Polygon2>, b: ReadonlyArray<Polygon2>): Polygon2[] {
  return clipIntersectShapes(clipShape(a), clipShape(b));
}

/** Difference a − b of two polygon sets, mm (integer Vatti clipping). */
export function clipDifference(a: ReadonlyArray<Polygon2>, b: ReadonlyArray<Polygon2>): Polygon2[] {
  return execute(ClipperLib.ClipType.ctDifference, toPaths(a), toPaths(b));
}

/**
 * Grows polygons outward by `delta` mm (Minkowski sum with a disk), erring outward: round corners
 * are built with chords of at most `arcToleranceMm` and the whole offset is enlarged by that
 * amount, so the result contains the exact offset and exceeds it by ≤ arcToleranceMm.
 * `join: 'miter'` (miter limit 2, squared beyond) also contains the round offset.
 */
export function clipOffset(
  polygons: ReadonlyArray<Polygon2>,
  delta: number,
  opts: { join?: 'round' | 'miter'; arcToleranceMm?: number } = {},
): Polygon2[] {
  if (!Number.isFinite(delta)) throw new Error('delta must be a finite number');
  if (delta === 0) return clipUnion(polygons);
  const arcTol = opts.arcToleranceMm ?? 0.5;
  const join = opts.join ?? 'round';
  const off = new ClipperLib.ClipperOffset(2, arcTol * SCALE);
  off.AddPaths(
    toPaths(polygons),
    join === 'round' ? ClipperLib.JoinType.jtRound : ClipperLib.JoinType.jtMiter,
    ClipperLib.EndType.etClosedPolygon,
  );
  const tree = new ClipperLib.PolyTree();
  const grow = join === 'round' && delta > 0 ? delta + arcTol : delta;
  off.Execute(tree, grow * SCALE);
  return treeToPolygons(tree);
}
