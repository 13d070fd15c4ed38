import type { ClipShape } from './clipper';
import { GRID_MM } from './tolerance';

/**
 * Area of the intersection of two prepared shapes (ClipShape: integer paths on the 0.01 mm grid,
 * outer rings positive, holes negative, rings of one shape neither crossing nor overlapping), mm²,
 * without building the intersection.
 *
 * Method: by Green's theorem the area of A ∩ B is the shoelace sum over its boundary, and that
 * boundary is the part of A's rings inside B plus the part of B's rings inside A. Each ring is cut
 * where it crosses the other shape's edges; whether a piece lies inside alternates at every
 * crossing, so one point-in-shape test per stretch of ring that enters the other's bounding box
 * fixes it. Edges outside the other shape's bounding box cannot lie inside it and cost nothing
 * beyond a box test. Crossings are found through a uniform grid over the common box. Orientation
 * tests are exact (integer coordinates below 2^26 in magnitude give exact products).
 *
 * Returns null when the shapes are not in general position (a vertex on an edge of the other
 * shape, edges overlapping along a line, overlapping rings within a shape, or coordinates too
 * large for exact tests): the caller
 * then builds the intersection instead. Intersection vertices are exact here, where a boolean
 * operation rounds them to the grid, so the two areas agree to well under a square millimetre.
 *
 * Written here because the polygon libraries in use (clipper-lib, turf) only return the
 * intersection's geometry, and building it costs several times this for an area alone.
 */
export function intersectionArea(a: ClipShape, b: ClipShape): number | null {
  if (!a.box || !b.box) return 0;
  const ox0 = Math.max(a.box[0], b.box[0]), oy0 = Math.max(a.box[1], b.box[1]);
  const ox1 = Math.min(a.box[2], b.box[2]), oy1 = Math.min(a.box[3], b.box[3]);
  if (ox0 > ox1 || oy0 > oy1) return 0;
  const lim = 2 ** 26;
  for (const v of [a.box[0], a.box[1], a.box[2], a.box[3], b.box[0], b.box[1], b.box[2], b.box[3]]) if (Math.abs(v) >= lim) return null;
  const A = packed(a);
  const B = packed(b);
  const ea = edgesInBox(A, ox0, oy0, ox1, oy1);
  const eb = edgesInBox(B, ox0, oy0, ox1, oy1);
  const crossings = findCrossings(A, B, ea, eb, ox0, oy0, ox1, oy1);
  if (!crossings) return null;
  // the shoelace sum about the common box's centre keeps the products small
  const cx = (ox0 + ox1) / 2, cy = (oy0 + oy1) / 2;
  const sa = insideSum(A, B, b.box, crossings.a, cx, cy);
  if (sa === null) return null;
  const sb = insideSum(B, A, a.box, crossings.b, cx, cy);
  if (sb === null) return null;
  return ((sa + sb) / 2) * GRID_MM * GRID_MM;
}

/** A shape's rings as flat integer coordinates: ring r holds vertices start[r] … start[r + 1] − 1. */
interface Packed {
  xs: Float64Array;
  ys: Float64Array;
  start: Int32Array;
  /** Ring of every vertex. */
  ring: Int32Array;
}

const packedOf = new WeakMap<ClipShape, Packed>();

function packed(shape: ClipShape): Packed {
  let p = packedOf.get(shape);
  if (p) return p;
  let n = 0;
  for (const path of shape.paths) n += path.length;
  const xs = new Float64Array(n), ys = new Float64Array(n), start = new Int32Array(shape.paths.length + 1);
  let k = 0;
  shape.paths.forEach((path, r) => {
    start[r] = k;
    for (const pt of path) {
      xs[k] = pt.X;
      ys[k] = pt.Y;
      k++;
    }
  });
  start[shape.paths.length] = k;
  const ring = new Int32Array(n);
  for (let r = 0; r < shape.paths.length; r++) ring.fill(r, start[r], start[r + 1]);
  p = { xs, ys, start, ring };
  packedOf.set(shape, p);
  return p;
}

/** Index of the vertex after vertex i on its ring (ring r). */
const nextOf = (p: Packed, r: number, i: number): number => (i + 1 < p.start[r + 1] ? i + 1 : p.start[r]);

/** Edges (by their first vertex) whose bounding box meets the box, ascending. */
function edgesInBox(p: Packed, x0: number, y0: number, x1: number, y1: number): Int32Array {
  const out: number[] = [];
  for (let r = 0; r + 1 < p.start.length; r++) {
    for (let i = p.start[r]; i < p.start[r + 1]; i++) {
      const j = nextOf(p, r, i);
      const ax = p.xs[i], ay = p.ys[i], bx = p.xs[j], by = p.ys[j];
      if ((ax < x0 && bx < x0) || (ax > x1 && bx > x1) || (ay < y0 && by < y0) || (ay > y1 && by > y1)) continue;
      out.push(i);
    }
  }
  return Int32Array.from(out);
}

/** Sign of the cross product (b − a) × (c − a), exact for the coordinates allowed above. */
function orient(ax: number, ay: number, bx: number, by: number, cx: number, cy: number): number {
  return (bx - ax) * (cy - ay) - (by - ay) * (cx - ax);
}

/**
 * Winding test of (x, y) against a shape: 1 inside, 0 outside, −1 on an edge (not general
 * position) or where rings overlap. Non-zero filling; half-open rule for vertices at the point's height.
 */
function inside(p: Packed, x: number, y: number): number {
  let w = 0;
  for (let r = 0; r + 1 < p.start.length; r++) {
    for (let i = p.start[r]; i < p.start[r + 1]; i++) {
      const j = nextOf(p, r, i);
      const ax = p.xs[i], ay = p.ys[i], bx = p.xs[j], by = p.ys[j];
      if ((ay > y) === (by > y)) {
        // no upward or downward crossing of the point's height; still on the edge when horizontal through it
        if (ay === y && by === y && Math.min(ax, bx) <= x && x <= Math.max(ax, bx)) return -1;
        if (ay === y && ax === x) return -1;
        continue;
      }
      const o = orient(ax, ay, bx, by, x, y);
      if (o === 0) return -1;
      if (by > ay) {
        if (o > 0) w++;
      } else if (o < 0) w--;
    }
  }
  // a clean shape winds 0 or 1 times (±1 with either orientation): more means overlapping rings
  if (w > 1 || w < -1) return -1;
  return w !== 0 ? 1 : 0;
}

/** Per edge (by first vertex) of each shape, the parameters along it where the other shape's edges cross it. */
interface Crossings {
  a: Map<number, number[]>;
  b: Map<number, number[]>;
}

/** Every proper crossing of an edge of A with an edge of B within the common box; null at a touch or overlap. */
function findCrossings(A: Packed, B: Packed, ea: Int32Array, eb: Int32Array, x0: number, y0: number, x1: number, y1: number): Crossings | null {
  const g = Math.max(1, Math.min(64, Math.round(Math.sqrt(eb.length / 2))));
  const cw = (x1 - x0) / g || 1, ch = (y1 - y0) / g || 1;
  const cellRange = (lo: number, hi: number, origin: number, size: number): [number, number] => [
    Math.max(0, Math.min(g - 1, Math.floor((lo - origin) / size))),
    Math.max(0, Math.min(g - 1, Math.floor((hi - origin) / size))),
  ];
  // B's edges by the cells their boxes cover
  const cells: number[][] = Array.from({ length: g * g }, () => []);
  const ringOfB = B.ring;
  for (let k = 0; k < eb.length; k++) {
    const i = eb[k], j = nextOf(B, ringOfB[i], i);
    const [c0, c1] = cellRange(Math.min(B.xs[i], B.xs[j]), Math.max(B.xs[i], B.xs[j]), x0, cw);
    const [r0, r1] = cellRange(Math.min(B.ys[i], B.ys[j]), Math.max(B.ys[i], B.ys[j]), y0, ch);
    for (let r = r0; r <= r1; r++) for (let c = c0; c <= c1; c++) cells[r * g + c].push(k);
  }
  const seen = new Int32Array(eb.length).fill(-1);
  const out: Crossings = { a: new Map(), b: new Map() };
  const ringOfA = A.ring;
  for (let m = 0; m < ea.length; m++) {
    const i = ea[m], j = nextOf(A, ringOfA[i], i);
    const ax = A.xs[i], ay = A.ys[i], bx = A.xs[j], by = A.ys[j];
    const axLo = Math.min(ax, bx), axHi = Math.max(ax, bx), ayLo = Math.min(ay, by), ayHi = Math.max(ay, by);
    const [c0, c1] = cellRange(axLo, axHi, x0, cw);
    const [r0, r1] = cellRange(ayLo, ayHi, y0, ch);
    for (let r = r0; r <= r1; r++) {
      for (let c = c0; c <= c1; c++) {
        for (const k of cells[r * g + c]) {
          if (seen[k] === m) continue;
          seen[k] = m;
          const p = eb[k], q = nextOf(B, ringOfB[p], p);
          const px = B.xs[p], py = B.ys[p], qx = B.xs[q], qy = B.ys[q];
          if (Math.max(px, qx) < axLo || Math.min(px, qx) > axHi || Math.max(py, qy) < ayLo || Math.min(py, qy) > ayHi) continue;
          const o1 = orient(ax, ay, bx, by, px, py);
          const o2 = orient(ax, ay, bx, by, qx, qy);
          if ((o1 > 0 && o2 > 0) || (o1 < 0 && o2 < 0)) continue;
          const o3 = orient(px, py, qx, qy, ax, ay);
          const o4 = orient(px, py, qx, qy, bx, by);
          if ((o3 > 0 && o4 > 0) || (o3 < 0 && o4 < 0)) continue;
          // the boxes meet and neither edge lies wholly to one side of the other: a zero means a touch
          if (o1 === 0 || o2 === 0 || o3 === 0 || o4 === 0) return null;
          push(out.a, i, o3 / (o3 - o4));
          push(out.b, p, o1 / (o1 - o2));
        }
      }
    }
  }
  return out;
}

function push(map: Map<number, number[]>, key: number, t: number): void {
  const list = map.get(key);
  if (list) list.push(t);
  else map.set(key, [t]);
}

/**
 * Twice the shoelace sum of the pieces of S's rings that lie inside O (coordinates about (cx, cy)),
 * given where O's edges cross S's edges; null when a ring's vertex lies on O's boundary.
 */
function insideSum(S: Packed, O: Packed, box: readonly [number, number, number, number], cuts: Map<number, number[]>, cx: number, cy: number): number | null {
  const [bx0, by0, bx1, by1] = box;
  let sum = 0;
  for (let r = 0; r + 1 < S.start.length; r++) {
    // state: 1 inside O, 0 outside, −2 not known yet (after a stretch outside O's box)
    let state = -2;
    for (let i = S.start[r]; i < S.start[r + 1]; i++) {
      const j = nextOf(S, r, i);
      const ax = S.xs[i], ay = S.ys[i], bx = S.xs[j], by = S.ys[j];
      if ((ax < bx0 && bx < bx0) || (ax > bx1 && bx > bx1) || (ay < by0 && by < by0) || (ay > by1 && by > by1)) {
        state = -2; // wholly outside O's box, so outside O
        continue;
      }
      if (state === -2) {
        const w = ax < bx0 || ax > bx1 || ay < by0 || ay > by1 ? 0 : inside(O, ax, ay);
        if (w < 0) return null;
        state = w;
      }
      const ts = cuts.get(i);
      let t0 = 0;
      let x0 = ax - cx, y0 = ay - cy;
      if (ts) {
        if (ts.length > 1) ts.sort((u, v) => u - v);
        for (const t of ts) {
          const x1 = ax + t * (bx - ax) - cx, y1 = ay + t * (by - ay) - cy;
          if (state === 1) sum += x0 * y1 - x1 * y0;
          state = 1 - state;
          x0 = x1;
          y0 = y1;
          t0 = t;
        }
      }
      if (t0 < 1 && state === 1) sum += x0 * (by - cy) - (bx - cx) * y0;
    }
  }
  return sum;
}
