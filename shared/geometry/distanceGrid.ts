import { ringArea } from './area';
import { polygonsBounds } from './bounds';
import { nearestSegmentParamRel, pointSegmentDistance2Rel } from './segmentDistance';
import type { Polygon2, Pt, Ring } from './types';

/**
 * Fast exact signed distance to a fixed polygon set, for hot loops (millions of queries).
 *
 * Method: a uniform grid over the padded bounds (a fine level close by, a coarse one far out). For
 * each cell centre c the distance d_c to the boundary is computed once; by the triangle inequality
 * every query point p in that cell has its nearest edge among the edges within d_c + 2h of c
 * (h = half the cell diagonal), so only those are stored, nearest first. Each level is built coarse
 * to fine (a child cell scans only its parent's list), so a fine grid costs little to build. A
 * query scans its cell's list and stops once a lower bound of the next edge's distance (dist(c, e)
 * − |p − c|, or tighter, dist(c, e) + (p − c)·n − |p − c|·s with the cell's lead direction n and
 * spread s, see toQueryLevel) exceeds the best distance found.
 * The sign comes from the nearest feature (region on the left of every edge): the side of the
 * nearest edge, or for a nearest vertex whether that vertex is convex (outside) or reflex (inside).
 * Queries outside the grid fall back to all edges, so the answer is exact everywhere; the grid
 * only makes it fast. upperBound() gives signed distance at the cell centre + |p − c| (signed
 * distance is 1-Lipschitz) without visiting an edge, for callers choosing between lookups.
 * Levels: 128 cells across the fine one (bounds ± half their size), 16 across the coarse one; each
 * cell is one 64-byte record (its first INLINE edges, their centre distances as float32 rounded
 * down, the centre's signed distance rounded up, the lead direction and spread), so a typical
 * query reads one record. A record
 * also bounds the mirror image in x = 0 of its points (maxMirrored, upperBoundMirrored: the two
 * ways a reach profile's (r, z) can reach a bearing, r and −r).
 */
export interface DistanceGrid {
  /** Signed distance to the boundary, mm: positive inside, negative outside, 0 on it. */
  signedDistance(x: number, y: number): number;
  /** A cheap upper bound of signedDistance(x, y) (no edge is visited), mm; Infinity far outside the grid. */
  upperBound(x: number, y: number): number;
  /** max(signedDistance(x, y), signedDistance(−x, y)): the better of a point and its mirror image in x = 0, mm. */
  maxMirrored(x: number, y: number): number;
  /** A cheap upper bound of signedDistance(−x, y), mm (see upperBound). */
  upperBoundMirrored(x: number, y: number): number;
  /**
   * maxMirrored(x, y) given upper bounds ubA of signedDistance(x, y) and ubB of
   * signedDistance(−x, y): the second is looked up only when its bound can beat the first.
   */
  maxMirroredWithin(x: number, y: number, ubA: number, ubB: number): number;
  /** True when the point lies inside or on the boundary. */
  contains(x: number, y: number): boolean;
  /** Number of boundary edges (for diagnostics). */
  readonly edgeCount: number;
}

const CONVEX = 1;
const REFLEX = 0;
const STRAIGHT = 2;
/** Cells across the top level of the coarse-to-fine build. */
const TOP_CELLS = 8;
/** Cells across the fine level and the coarse one (at least). */
const FINE_CELLS = 128;
const COARSE_CELLS = 16;

/**
 * The boundary as directed edges, region on the left of each (outer rings counter-clockwise,
 * holes clockwise), in the polygons' frame, mm. Edge e runs from (ax, ay) by (dx, dy); its end
 * vertices are classified CONVEX, REFLEX or STRAIGHT for the sign of a nearest vertex.
 */
interface Edges {
  count: number;
  ax: Float64Array;
  ay: Float64Array;
  dx: Float64Array;
  dy: Float64Array;
  /** 1/|d|², 0 for a zero-length edge. */
  invLen2: Float64Array;
  startKind: Uint8Array;
  endKind: Uint8Array;
  /** ax, ay, dx, dy, 1/|d|² of each edge side by side (five per edge), for locality in queries. */
  packed: Float64Array;
}

/** One grid level: per cell the edges that can be nearest anywhere in it, nearest to the cell centre first. */
interface Level {
  gx0: number;
  gy0: number;
  nx: number;
  ny: number;
  cell: number;
  invCell: number;
  /** Cell c lists edges[starts[c] .. starts[c + 1]) (CSR layout). */
  starts: Int32Array;
  edges: Int32Array;
  /** Distance from the cell centre to each listed edge, mm (ascending within a cell). */
  dce: Float64Array;
  /** Signed distance at each cell centre, mm (last level only). */
  sdc: Float64Array;
}

/** Drops every vertex equal to the one before it (cyclically), so no edge has zero length from a repeat. */
function dropRepeatedVertices(ring: Readonly<Ring>): Pt[] {
  return ring.filter((p, i) => {
    const q = ring[(i + ring.length - 1) % ring.length];
    return p[0] !== q[0] || p[1] !== q[1];
  });
}

/** The ring wound counter-clockwise when `ccw`, clockwise otherwise (shoelace formula sign). */
function orientRing(ring: Pt[], ccw: boolean): Pt[] {
  return ringArea(ring) > 0 === ccw ? ring : [...ring].reverse();
}

/** CONVEX, REFLEX or STRAIGHT for each vertex of a ring wound with its region on the left (cross product of the adjacent edges). */
function classifyVertices(ring: ReadonlyArray<Pt>): number[] {
  const n = ring.length;
  const kinds: number[] = new Array(n);
  for (let i = 0; i < n; i++) {
    const p = ring[(i + n - 1) % n];
    const v = ring[i];
    const q = ring[(i + 1) % n];
    const cross = (v[0] - p[0]) * (q[1] - v[1]) - (v[1] - p[1]) * (q[0] - v[0]);
    kinds[i] = cross > 0 ? CONVEX : cross < 0 ? REFLEX : STRAIGHT;
  }
  return kinds;
}

/** Collects every ring's edges (rings of fewer than 3 distinct vertices are skipped), region on the left. */
function collectEdges(polygons: ReadonlyArray<Polygon2>): Edges {
  const ax: number[] = [];
  const ay: number[] = [];
  const bx: number[] = [];
  const by: number[] = [];
  const startKind: number[] = [];
  const endKind: number[] = [];
  for (const poly of polygons) {
    poly.forEach((ring0, ri) => {
      const clean = dropRepeatedVertices(ring0);
      if (clean.length < 3) return;
      const ring = orientRing(clean, ri === 0);
      const kinds = classifyVertices(ring);
      const n = ring.length;
      for (let i = 0; i < n; i++) {
        const j = (i + 1) % n;
        ax.push(ring[i][0]);
        ay.push(ring[i][1]);
        bx.push(ring[j][0]);
        by.push(ring[j][1]);
        startKind.push(kinds[i]);
        endKind.push(kinds[j]);
      }
    });
  }
  const count = ax.length;
  const eDx = Float64Array.from(ax.map((v, i) => bx[i] - v));
  const eDy = Float64Array.from(ay.map((v, i) => by[i] - v));
  const invLen2 = Float64Array.from(ax.map((_, i) => {
    const l2 = eDx[i] * eDx[i] + eDy[i] * eDy[i];
    return l2 > 0 ? 1 / l2 : 0;
  }));
  const packed = new Float64Array(5 * count);
  for (let e = 0; e < count; e++) {
    packed[5 * e] = ax[e];
    packed[5 * e + 1] = ay[e];
    packed[5 * e + 2] = eDx[e];
    packed[5 * e + 3] = eDy[e];
    packed[5 * e + 4] = invLen2[e];
  }
  return {
    count,
    ax: Float64Array.from(ax),
    ay: Float64Array.from(ay),
    dx: eDx,
    dy: eDy,
    invLen2,
    startKind: Uint8Array.from(startKind),
    endKind: Uint8Array.from(endKind),
    packed,
  };
}

/**
 * Signs the distance d from (x, y) to its nearest edge e, met at parameter t: a nearest vertex
 * decides by its kind (convex: outside, reflex: inside), a nearest edge interior by the side.
 */
function signByNearestFeature(E: Edges, e: number, t: number, d: number, x: number, y: number): number {
  const kind = t <= 0 ? E.startKind[e] : t >= 1 ? E.endKind[e] : STRAIGHT;
  if (kind === CONVEX) return -d;
  if (kind === REFLEX) return d;
  return E.dx[e] * (y - E.ay[e]) - E.dy[e] * (x - E.ax[e]) > 0 ? d : -d;
}

/** Signed distance from (x, y) over the edges ids[from..to) (every edge when ids is null), mm; −Infinity when there is none. */
function signedDistanceOver(E: Edges, x: number, y: number, ids: Int32Array | null, from: number, to: number): number {
  let best = Infinity;
  let bestEdge = -1;
  for (let k = from; k < to; k++) {
    const e = ids ? ids[k] : k;
    const d2 = pointSegmentDistance2Rel(x - E.ax[e], y - E.ay[e], E.dx[e], E.dy[e], E.invLen2[e]);
    if (d2 < best) {
      best = d2;
      bestEdge = e;
    }
  }
  if (bestEdge < 0) return -Infinity;
  const d = Math.sqrt(best);
  if (d === 0) return 0;
  const t = nearestSegmentParamRel(x - E.ax[bestEdge], y - E.ay[bestEdge], E.dx[bestEdge], E.dy[bestEdge], E.invLen2[bestEdge]);
  return signByNearestFeature(E, bestEdge, t, d, x, y);
}

/**
 * Orders ids[0..n) with their squared distances keys[0..n) nearest first: insertion sort (near
 * linear on nearly sorted input), or for an unsorted long list a native sort of the keys with
 * their slot packed into the low part of each key (an exact integer in a double).
 */
function sortNearestFirst(ids: Int32Array, keys: Float64Array, n: number, packed: Float64Array, unsorted: boolean): void {
  if (unsorted && n > 16) {
    // Keys rounded to 1/2^20 of the largest: ties keep slot order, so the sort is exact up to that rounding.
    let max = 0;
    for (let i = 0; i < n; i++) if (keys[i] > max) max = keys[i];
    const scale = max > 0 ? 1048576 / max : 0;
    for (let i = 0; i < n; i++) packed[i] = Math.floor(keys[i] * scale) * n + i;
    const sorted = packed.subarray(0, n).sort();
    const idsCopy = ids.slice(0, n);
    const keysCopy = keys.slice(0, n);
    for (let i = 0; i < n; i++) {
      const slot = sorted[i] % n;
      ids[i] = idsCopy[slot];
      keys[i] = keysCopy[slot];
    }
  }
  for (let i = 1; i < n; i++) {
    const id = ids[i];
    const key = keys[i];
    let j = i;
    while (j > 0 && keys[j - 1] > key) {
      ids[j] = ids[j - 1];
      keys[j] = keys[j - 1];
      j--;
    }
    ids[j] = id;
    keys[j] = key;
  }
}

/**
 * One grid level over the bounds grown by `pad`, at least `cells` cells across, built coarse to
 * fine: a top level of a few cells scans every edge, and each finer level (cells halved) scans
 * only its parent cell's list — every edge that can be nearest anywhere in a child cell can be
 * nearest somewhere in its parent, so the lists stay exact while the build stays cheap.
 * A cell keeps, of its parent's list, the edges that can be nearest to some point of the cell:
 * those within d_c + 2h of its centre (a point p of the cell is at least dist(c, e) − |p − c| from
 * edge e, and at most d_c + |p − c| from the nearest; h the half diagonal), nearest first.
 */
function buildLevel(E: Edges, bounds: readonly [number, number, number, number], pad: number, cells: number): Level {
  const w = bounds[2] - bounds[0];
  const h = bounds[3] - bounds[1];
  const size = Math.max(w, h, 1);
  const gx0 = bounds[0] - pad;
  const gy0 = bounds[1] - pad;
  const ed = E.packed;
  let depth = 0;
  while (TOP_CELLS << depth < cells) depth++;
  let cell = (size + 2 * pad) / TOP_CELLS;
  let nx = Math.max(1, Math.ceil((w + 2 * pad) / cell));
  let ny = Math.max(1, Math.ceil((h + 2 * pad) / cell));
  // The top level's "parent" is one cell listing every edge.
  let starts = Int32Array.of(0, E.count);
  let edges = new Int32Array(E.count);
  for (let e = 0; e < E.count; e++) edges[e] = e;
  let dce = new Float64Array(0);
  let sdc = new Float64Array(0);
  const rawD = new Float64Array(E.count);
  const candE = new Int32Array(E.count);
  const candD = new Float64Array(E.count);
  const packed = new Float64Array(E.count);
  for (let level = 0; level <= depth; level++) {
    const parentStarts = starts;
    const parentEdges = edges;
    const parentNx = nx;
    if (level > 0) {
      cell /= 2;
      nx *= 2;
      ny *= 2;
    }
    const last = level === depth;
    const reach = cell * Math.SQRT2; // 2h
    const nextStarts = new Int32Array(nx * ny + 1);
    if (last) sdc = new Float64Array(nx * ny);
    let outE = new Int32Array(Math.max(1024, 4 * parentEdges.length));
    let outD = new Float64Array(outE.length);
    let used = 0;
    for (let iy = 0; iy < ny; iy++) {
      const cy = gy0 + (iy + 0.5) * cell;
      const prow = level === 0 ? 0 : (iy >> 1) * parentNx;
      for (let ix = 0; ix < nx; ix++) {
        const cx = gx0 + (ix + 0.5) * cell;
        const pc = level === 0 ? 0 : prow + (ix >> 1);
        const from = parentStarts[pc];
        const to = parentStarts[pc + 1];
        let dc2 = Infinity;
        for (let k = from; k < to; k++) {
          const o = 5 * parentEdges[k];
          const px = cx - ed[o];
          const py = cy - ed[o + 1];
          let t = (px * ed[o + 2] + py * ed[o + 3]) * ed[o + 4];
          t = t < 0 ? 0 : t > 1 ? 1 : t;
          const qx = px - t * ed[o + 2];
          const qy = py - t * ed[o + 3];
          const d2 = qx * qx + qy * qy;
          rawD[k - from] = d2;
          if (d2 < dc2) dc2 = d2;
        }
        const dc = Math.sqrt(dc2);
        const limit = dc + reach + 1e-9 * (1 + dc);
        const limit2 = limit * limit;
        let n = 0;
        for (let k = from; k < to; k++) {
          const d2 = rawD[k - from];
          if (d2 > limit2) continue;
          candE[n] = parentEdges[k];
          candD[n++] = d2;
        }
        // A parent's list is sorted by distance to the parent centre, so a child's is nearly sorted already.
        sortNearestFirst(candE, candD, n, packed, level === 0);
        const c = iy * nx + ix;
        nextStarts[c] = used;
        if (last) sdc[c] = n > 0 ? signedDistanceOver(E, cx, cy, candE, 0, 1) : -Infinity;
        if (used + n > outE.length) {
          const grownE = new Int32Array(2 * (used + n));
          grownE.set(outE.subarray(0, used));
          const grownD = new Float64Array(grownE.length);
          grownD.set(outD.subarray(0, used));
          outE = grownE;
          outD = grownD;
        }
        for (let j = 0; j < n; j++) {
          outE[used] = candE[j];
          outD[used++] = Math.sqrt(candD[j]);
        }
      }
    }
    nextStarts[nx * ny] = used;
    starts = nextStarts;
    edges = outE.subarray(0, used);
    dce = outD.subarray(0, used);
  }
  return { gx0, gy0, nx, ny, cell, invCell: 1 / cell, starts, edges, dce, sdc };
}

/** Edges held in a cell's own record; a longer list continues in the level's overflow arrays. */
const INLINE = 4;
/**
 * 32-bit slots per cell record (64 bytes): signed distance at the centre, list length, overflow
 * start, INLINE edge ids, INLINE centre distances, signed distance at the centre mirrored in
 * x = 0, the lead direction (x, y) and its spread (see toQueryLevel), one slot free.
 */
const SLOTS = 16;
const R_SDC = 0;
const R_COUNT = 1;
const R_OVERFLOW = 2;
const R_EDGES = 3;
const R_DIST = R_EDGES + INLINE;
const R_MIRROR = R_DIST + INLINE;
const R_LEADX = R_MIRROR + 1;
const R_LEADY = R_MIRROR + 2;
const R_SPREAD = R_MIRROR + 3;
/** A cell whose centre lies closer than this to a listed edge (mm) bounds by |p − c| alone (its directions would be unsteady). */
const LEAD_MIN_MM = 1;

/**
 * A level laid out for queries: one 64-byte record per cell (Int32 and Float32 views of one
 * buffer), so a query whose list ends within the first INLINE edges reads one cache line; the
 * rest of a longer list follows in `overEdges` / `overDist`. The Float32 centre distances are
 * rounded down and the centre's signed distance up, so the bounds the query relies on stay bounds.
 *
 * The lower bound of a listed edge at a query point p: with q_e the point of edge e nearest to
 * the cell centre c and n_e = (c − q_e)/|c − q_e|, the whole segment lies in the half-plane
 * (x − q_e)·n_e ≤ 0 (q_e is the projection of c onto a convex set), so
 * dist(p, e) ≥ dist(c, e) + (p − c)·n_e. Writing n_e = n + (n_e − n) for one lead direction n per
 * cell (that of its nearest edge) and s ≥ |n_e − n| over the list (its spread),
 * dist(p, e) ≥ dist(c, e) + (p − c)·n − |p − c|·s, and also ≥ dist(c, e) − |p − c|: the query adds
 * the larger of the two shifts to every listed centre distance. Far from the boundary a cell's
 * edges all lie one way (s small), so the scan stops right after the nearest edge, where
 * |p − c| alone would take every edge within 2|p − c| of it.
 */
interface QueryLevel {
  gx0: number;
  gy0: number;
  nx: number;
  ny: number;
  cell: number;
  invCell: number;
  ints: Int32Array;
  floats: Float32Array;
  overEdges: Int32Array;
  overDist: Float64Array;
}

/** Largest float32 not above v (v ≥ 0 finite). */
const f32Down = (v: number): number => {
  const f = Math.fround(v);
  return f > v ? Math.fround(v * (1 - 2 ** -22)) : f;
};
/** Smallest float32 not below v. */
const f32Up = (v: number): number => {
  if (!Number.isFinite(v)) return v;
  const f = Math.fround(v);
  return f < v ? Math.fround(v + Math.abs(v) * 2 ** -22 + 1e-30) : f;
};

/** The level's CSR lists as cell records (see QueryLevel). */
function toQueryLevel(L: Level, ed: Float64Array): QueryLevel {
  const cells = L.nx * L.ny;
  const { starts, edges, dce, sdc } = L;
  const buffer = new ArrayBuffer(4 * SLOTS * cells);
  const ints = new Int32Array(buffer);
  const floats = new Float32Array(buffer);
  let over = 0;
  for (let c = 0; c < cells; c++) {
    const n = starts[c + 1] - starts[c];
    if (n > INLINE) over += n - INLINE;
  }
  const overEdges = new Int32Array(over);
  const overDist = new Float64Array(over);
  let longest = 0;
  for (let c = 0; c < cells; c++) longest = Math.max(longest, starts[c + 1] - starts[c]);
  const dirX = new Float64Array(longest);
  const dirY = new Float64Array(longest);
  let o = 0;
  for (let c = 0; c < cells; c++) {
    const from = starts[c];
    const n = starts[c + 1] - from;
    const base = c * SLOTS;
    floats[base + R_SDC] = f32Up(sdc[c]);
    ints[base + R_COUNT] = n;
    ints[base + R_OVERFLOW] = o;
    const inline = n < INLINE ? n : INLINE;
    for (let k = 0; k < inline; k++) {
      ints[base + R_EDGES + k] = edges[from + k];
      floats[base + R_DIST + k] = f32Down(dce[from + k]);
    }
    for (let k = inline; k < n; k++) {
      overEdges[o] = edges[from + k];
      overDist[o++] = dce[from + k];
    }
    // Lead direction and spread (see above); none (spread 1, so the shift is −|p − c|) when an
    // edge passes within LEAD_MIN_MM of the centre.
    const ix = c % L.nx;
    const cx = L.gx0 + (ix + 0.5) * L.cell;
    const cy = L.gy0 + ((c - ix) / L.nx + 0.5) * L.cell;
    let leadX = 0;
    let leadY = 0;
    let spread = 1;
    if (n > 0 && dce[from] >= LEAD_MIN_MM) {
      // Each edge's direction; the two extreme ones by their turn from the nearest edge's (all
      // within a right angle of it, or no lead), and the lead between those two.
      let ok = true;
      let loK = 0;
      let hiK = 0;
      let lo = 0;
      let hi = 0;
      for (let k = 0; k < n; k++) {
        const o5 = 5 * edges[from + k];
        const px = cx - ed[o5];
        const py = cy - ed[o5 + 1];
        const t = nearestSegmentParamRel(px, py, ed[o5 + 2], ed[o5 + 3], ed[o5 + 4]);
        const ux = px - t * ed[o5 + 2];
        const uy = py - t * ed[o5 + 3];
        const len = Math.sqrt(ux * ux + uy * uy);
        if (!(len >= LEAD_MIN_MM)) {
          ok = false;
          break;
        }
        dirX[k] = ux / len;
        dirY[k] = uy / len;
        const turn = dirX[0] * dirY[k] - dirY[0] * dirX[k];
        if (dirX[0] * dirX[k] + dirY[0] * dirY[k] <= 0) {
          ok = false;
          break;
        }
        if (turn < lo) {
          lo = turn;
          loK = k;
        } else if (turn > hi) {
          hi = turn;
          hiK = k;
        }
      }
      if (ok) {
        const mx = dirX[loK] + dirX[hiK];
        const my = dirY[loK] + dirY[hiK];
        const ml = Math.sqrt(mx * mx + my * my);
        leadX = Math.fround(mx / ml);
        leadY = Math.fround(my / ml);
        let maxDev2 = 0;
        for (let k = 0; k < n; k++) {
          const devX = dirX[k] - leadX;
          const devY = dirY[k] - leadY;
          const dev2 = devX * devX + devY * devY;
          if (dev2 > maxDev2) maxDev2 = dev2;
        }
        const maxDev = Math.sqrt(maxDev2);
        if (maxDev < 1) spread = f32Up(maxDev + 1e-6);
        else {
          leadX = 0;
          leadY = 0;
        }
      }
    }
    floats[base + R_LEADX] = leadX;
    floats[base + R_LEADY] = leadY;
    floats[base + R_SPREAD] = spread;
  }
  return { gx0: L.gx0, gy0: L.gy0, nx: L.nx, ny: L.ny, cell: L.cell, invCell: L.invCell, ints, floats, overEdges, overDist };
}

/**
 * What a query at offset (ox, oy) cells from the centre of the cell whose record starts at base
 * adds to each listed centre distance for a lower bound of that edge's distance, mm: the larger of
 * −|p − c| and (p − c)·lead − |p − c|·spread (toQueryLevel), each rounded the safe way.
 */
function shiftAt(floats: Float32Array, base: number, ox: number, oy: number, cell: number): number {
  const scale = cell * (1 + 1e-12);
  const off = Math.sqrt(ox * ox + oy * oy) * scale + 1e-9;
  const lead = (ox * floats[base + R_LEADX] + oy * floats[base + R_LEADY]) * scale - off * floats[base + R_SPREAD] - 1e-9;
  return lead > -off ? lead : -off;
}

/** Signed distance at the centre of the cell at grid coordinates (fx, fy) of L plus the distance to that centre, mm (1-Lipschitz bound). */
function upperBoundInCell(L: QueryLevel, fx: number, fy: number): number {
  const ix = fx | 0;
  const iy = fy | 0;
  const ox = fx - ix - 0.5;
  const oy = fy - iy - 0.5;
  return L.floats[(iy * L.nx + ix) * SLOTS + R_SDC] + Math.sqrt(ox * ox + oy * oy) * L.cell * (1 + 1e-12) + 1e-9;
}

/**
 * The queries over a built grid. A class, so that every grid's methods are the same functions:
 * a hot caller's call site then has one target the compiler inlines, whichever grid it meets
 * (closures made anew per grid would each be a target of their own, never inlined, and every
 * number passed to or from a call that is not inlined is boxed, one heap allocation each).
 */
class GridQuery implements DistanceGrid {
  readonly edgeCount: number;
  private readonly ed: Float64Array;
  private readonly fgx0: number;
  private readonly fgy0: number;
  private readonly fnx: number;
  private readonly fny: number;
  private readonly fInv: number;
  private readonly fCell: number;
  private readonly fInts: Int32Array;
  private readonly fFloats: Float32Array;
  /** The point of a query (io[0], io[1]), its answer (io[2]) and the scan's shift (io[3]): see fineQuery. */
  private readonly io = new Float64Array(4);

  constructor(
    private readonly E: Edges,
    private readonly fine: QueryLevel,
    private readonly coarse: QueryLevel,
  ) {
    this.edgeCount = E.count;
    this.ed = E.packed;
    this.fgx0 = fine.gx0;
    this.fgy0 = fine.gy0;
    this.fnx = fine.nx;
    this.fny = fine.ny;
    this.fInv = fine.invCell;
    this.fCell = fine.cell * (1 + 1e-12);
    this.fInts = fine.ints;
    this.fFloats = fine.floats;
    // Each fine cell also bounds the mirror image of its points: sd(−p) ≤ sd(−c) + |p − c|.
    for (let c = 0; c < this.fnx * this.fny; c++) {
      const cx = this.fgx0 + ((c % this.fnx) + 0.5) * fine.cell;
      const cy = this.fgy0 + (Math.floor(c / this.fnx) + 0.5) * fine.cell;
      this.fFloats[c * SLOTS + R_MIRROR] = f32Up(this.signedDistance(-cx, cy));
    }
  }

  /**
   * The scan of cell c of level L (nearest first, stopping once the next edge's lower bound
   * cannot beat the best), its INLINE record entries then the overflow; the general form of the
   * fine-level loop in fineQuery, used for the coarse level. The
   * point, the shift and the answer go through io, as for fineQuery.
   */
  private scanCell(L: QueryLevel, c: number): void {
    const io = this.io;
    const x = io[0];
    const y = io[1];
    const shift = io[3];
    const { ints, floats, overEdges, overDist } = L;
    const ed = this.ed;
    const base = c * SLOTS;
    const n = ints[base + R_COUNT];
    const over = ints[base + R_OVERFLOW] - INLINE;
    let best = Infinity;
    let bestEdge = -1;
    let bestT = 0;
    for (let k = 0; k < n; k++) {
      const lb = (k < INLINE ? floats[base + R_DIST + k] : overDist[over + k]) + shift;
      if (lb > 0 && lb * lb >= best) break;
      const e = k < INLINE ? ints[base + R_EDGES + k] : overEdges[over + k];
      const o = 5 * e;
      const px = x - ed[o];
      const py = y - ed[o + 1];
      let t = (px * ed[o + 2] + py * ed[o + 3]) * ed[o + 4];
      t = t < 0 ? 0 : t > 1 ? 1 : t;
      const qx = px - t * ed[o + 2];
      const qy = py - t * ed[o + 3];
      const d2 = qx * qx + qy * qy;
      if (d2 < best) {
        best = d2;
        bestEdge = e;
        bestT = t;
      }
    }
    if (bestEdge < 0) io[2] = signedDistanceOver(this.E, x, y, null, 0, this.E.count);
    else io[2] = best === 0 ? 0 : signByNearestFeature(this.E, bestEdge, bestT, Math.sqrt(best), x, y);
  }

  /** The query off the fine level (point and answer in io): the coarse level, else every edge. */
  private farQuery(): void {
    const io = this.io;
    const coarse = this.coarse;
    const fx = (io[0] - coarse.gx0) * coarse.invCell;
    const fy = (io[1] - coarse.gy0) * coarse.invCell;
    if (!(fx >= 0 && fy >= 0 && fx < coarse.nx && fy < coarse.ny)) {
      io[2] = signedDistanceOver(this.E, io[0], io[1], null, 0, this.E.count);
      return;
    }
    const ix = fx | 0;
    const iy = fy | 0;
    const c = iy * coarse.nx + ix;
    io[3] = shiftAt(coarse.floats, c * SLOTS, fx - ix - 0.5, fy - iy - 0.5, coarse.cell);
    this.scanCell(coarse, c);
  }

  /**
   * The hottest loop of the analysis, written out in one piece (helpers handing back a second
   * value measured 15–20 % slower): the fine cell's record entries nearest first, stopping once
   * the next edge's lower bound cannot beat the best distance found, a list longer than its record
   * carried on in the overflow arrays (not scanned again from the start); a point off the fine
   * level goes to the coarse level's scan. It takes its point from io[0],
   * io[1] and leaves its answer in io[2]: it is too large to inline, so numbers passed to it or
   * returned would be boxed; signedDistance, small enough to inline, fills the slots.
   */
  private fineQuery(): void {
    const io = this.io;
    const x = io[0];
    const y = io[1];
    const fx = (x - this.fgx0) * this.fInv;
    const fy = (y - this.fgy0) * this.fInv;
    if (!(fx >= 0 && fy >= 0 && fx < this.fnx && fy < this.fny)) {
      this.farQuery();
      return;
    }
    const ed = this.ed;
    const fInts = this.fInts;
    const fFloats = this.fFloats;
    const fCell = this.fCell;
    const ix = fx | 0;
    const iy = fy | 0;
    // Offset of p from the cell centre, in cells.
    const ox = fx - ix - 0.5;
    const oy = fy - iy - 0.5;
    const base = (iy * this.fnx + ix) * SLOTS;
    const n = fInts[base + R_COUNT];
    // Lower bound of edge e at p: its centre distance plus this (toQueryLevel; shiftAt written out).
    const off = Math.sqrt(ox * ox + oy * oy) * fCell + 1e-9;
    const lead = (ox * fFloats[base + R_LEADX] + oy * fFloats[base + R_LEADY]) * fCell - off * fFloats[base + R_SPREAD] - 1e-9;
    const shift = lead > -off ? lead : -off;
    let best = Infinity;
    let bestEdge = -1;
    let bestT = 0;
    // A list longer than its record runs on in the overflow arrays, from where the record ends.
    const { overEdges, overDist } = this.fine;
    const over = fInts[base + R_OVERFLOW] - INLINE;
    for (let k = 0; k < n; k++) {
      const lb = (k < INLINE ? fFloats[base + R_DIST + k] : overDist[over + k]) + shift;
      if (lb > 0 && lb * lb >= best) break;
      // pointSegmentDistance2Rel written out, keeping t
      const e = k < INLINE ? fInts[base + R_EDGES + k] : overEdges[over + k];
      const o = 5 * e;
      const px = x - ed[o];
      const py = y - ed[o + 1];
      let t = (px * ed[o + 2] + py * ed[o + 3]) * ed[o + 4];
      t = t < 0 ? 0 : t > 1 ? 1 : t;
      const qx = px - t * ed[o + 2];
      const qy = py - t * ed[o + 3];
      const d2 = qx * qx + qy * qy;
      if (d2 < best) {
        best = d2;
        bestEdge = e;
        bestT = t;
      }
    }
    if (bestEdge < 0) io[2] = signedDistanceOver(this.E, x, y, null, 0, this.E.count);
    else io[2] = best === 0 ? 0 : signByNearestFeature(this.E, bestEdge, bestT, Math.sqrt(best), x, y);
  }

  signedDistance(x: number, y: number): number {
    const io = this.io;
    io[0] = x;
    io[1] = y;
    this.fineQuery();
    return io[2];
  }

  /** Offset of (x, y) from its fine cell's centre, mm, plus rounding slack (the bounds' |p − c|). */
  private offsetMm(fx: number, fy: number): number {
    const ox = fx - (fx | 0) - 0.5;
    const oy = fy - (fy | 0) - 0.5;
    return Math.sqrt(ox * ox + oy * oy) * this.fCell + 1e-9;
  }

  // Same level pick; no edge is visited.
  upperBound(x: number, y: number): number {
    const fx = (x - this.fgx0) * this.fInv;
    const fy = (y - this.fgy0) * this.fInv;
    if (!(fx >= 0 && fy >= 0 && fx < this.fnx && fy < this.fny)) {
      const coarse = this.coarse;
      const cx = (x - coarse.gx0) * coarse.invCell;
      const cy = (y - coarse.gy0) * coarse.invCell;
      if (!(cx >= 0 && cy >= 0 && cx < coarse.nx && cy < coarse.ny)) return Infinity;
      return upperBoundInCell(coarse, cx, cy);
    }
    return this.fFloats[((fy | 0) * this.fnx + (fx | 0)) * SLOTS + R_SDC] + this.offsetMm(fx, fy);
  }

  maxMirroredWithin(x: number, y: number, ubA: number, ubB: number): number {
    const first = ubA >= ubB ? x : -x;
    const m1 = this.signedDistance(first, y);
    if ((ubA >= ubB ? ubB : ubA) <= m1) return m1;
    const m2 = this.signedDistance(-first, y);
    return m1 > m2 ? m1 : m2;
  }

  // The fine cell of (x, y) holds both bounds; off the fine level, the general ones.
  maxMirrored(x: number, y: number): number {
    const fx = (x - this.fgx0) * this.fInv;
    const fy = (y - this.fgy0) * this.fInv;
    if (!(fx >= 0 && fy >= 0 && fx < this.fnx && fy < this.fny)) return this.maxMirroredWithin(x, y, this.upperBound(x, y), this.upperBound(-x, y));
    const off = this.offsetMm(fx, fy);
    const base = ((fy | 0) * this.fnx + (fx | 0)) * SLOTS;
    return this.maxMirroredWithin(x, y, this.fFloats[base + R_SDC] + off, this.fFloats[base + R_MIRROR] + off);
  }

  upperBoundMirrored(x: number, y: number): number {
    const fx = (x - this.fgx0) * this.fInv;
    const fy = (y - this.fgy0) * this.fInv;
    if (!(fx >= 0 && fy >= 0 && fx < this.fnx && fy < this.fny)) return this.upperBound(-x, y);
    return this.fFloats[((fy | 0) * this.fnx + (fx | 0)) * SLOTS + R_MIRROR] + this.offsetMm(fx, fy);
  }

  contains(x: number, y: number): boolean {
    return this.signedDistance(x, y) >= 0;
  }
}

/** Builds a DistanceGrid over non-overlapping polygons (outer rings and holes), mm, in the polygons' frame. */
export function buildDistanceGrid(polygons: ReadonlyArray<Polygon2>, opts: { maxCells?: number } = {}): DistanceGrid {
  const E = collectEdges(polygons);
  const bounds = polygonsBounds(polygons);
  if (!bounds || E.count === 0) {
    return {
      signedDistance: () => -Infinity,
      upperBound: () => -Infinity,
      maxMirrored: () => -Infinity,
      upperBoundMirrored: () => -Infinity,
      maxMirroredWithin: () => -Infinity,
      contains: () => false,
      edgeCount: 0,
    };
  }
  const size = Math.max(bounds[2] - bounds[0], bounds[3] - bounds[1], 1);
  // A fine level around the polygons and a coarse one far beyond them; outside both, all edges.
  const fine = toQueryLevel(buildLevel(E, bounds, size * 0.5 + 1, opts.maxCells ?? FINE_CELLS), E.packed);
  const coarse = toQueryLevel(buildLevel(E, bounds, size * 2.5 + 1, COARSE_CELLS), E.packed);
  return new GridQuery(E, fine, coarse);
}
