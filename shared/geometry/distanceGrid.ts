import { polygonsBounds, ringArea } from './area';
import type { Polygon2 } from './types';

/**
 * Fast exact signed distance to a fixed polygon set, for hot loops (millions of queries).
 *
 * Method: a uniform grid over the padded bounds (a fine level close by, a coarse one far out). For
 * each cell centre c the distance d_c to the boundary is computed once; by the triangle inequality
 * every query point p in that cell has its nearest edge among the edges within d_c + 2h of c
 * (h = half the cell diagonal), so only those are stored, nearest first. Each level is built coarse
 * to fine (a child cell scans only its parent's list), so a fine grid costs little to build. A
 * query scans its cell's list and stops once dist(c, e) − |p − c| exceeds the best distance found.
 * The sign comes from the nearest feature (region on the left of every edge): the side of the
 * nearest edge, or for a nearest vertex whether that vertex is convex (outside) or reflex (inside).
 * Queries outside the grid fall back to all edges, so the answer is exact everywhere; the grid
 * only makes it fast. upperBound() gives signed distance at the cell centre + |p − c| (signed
 * distance is 1-Lipschitz) without visiting an edge, for callers choosing between lookups.
 */
export interface DistanceGrid {
  /** Signed distance to the boundary, mm: positive inside, negative outside, 0 on it. */
  signedDistance(x: number, y: number): number;
  /** A cheap upper bound of signedDistance(x, y) (no edge is visited), mm; Infinity far outside the grid. */
  upperBound(x: number, y: number): number;
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

/** Builds a DistanceGrid over non-overlapping polygons (outer rings and holes), mm. */
export function buildDistanceGrid(polygons: ReadonlyArray<Polygon2>, opts: { maxCells?: number } = {}): DistanceGrid {
  const ax: number[] = [];
  const ay: number[] = [];
  const bx: number[] = [];
  const by: number[] = [];
  const startKind: number[] = [];
  const endKind: number[] = [];
  for (const poly of polygons) {
    poly.forEach((ring0, ri) => {
      const clean = ring0.filter((p, i) => {
        const q = ring0[(i + ring0.length - 1) % ring0.length];
        return p[0] !== q[0] || p[1] !== q[1];
      });
      if (clean.length < 3) return;
      const area = ringArea(clean);
      const wantCcw = ri === 0;
      const ring = area > 0 === wantCcw ? clean : [...clean].reverse();
      const n = ring.length;
      const kinds: number[] = new Array(n);
      for (let i = 0; i < n; i++) {
        const p = ring[(i + n - 1) % n];
        const v = ring[i];
        const q = ring[(i + 1) % n];
        const cross = (v[0] - p[0]) * (q[1] - v[1]) - (v[1] - p[1]) * (q[0] - v[0]);
        kinds[i] = cross > 0 ? CONVEX : cross < 0 ? REFLEX : STRAIGHT;
      }
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
  const E = ax.length;
  const eAx = Float64Array.from(ax);
  const eAy = Float64Array.from(ay);
  const eDx = Float64Array.from(ax.map((v, i) => bx[i] - v));
  const eDy = Float64Array.from(ay.map((v, i) => by[i] - v));
  const eInvLen2 = Float64Array.from(ax.map((_, i) => {
    const l2 = eDx[i] * eDx[i] + eDy[i] * eDy[i];
    return l2 > 0 ? 1 / l2 : 0;
  }));
  const eStart = Uint8Array.from(startKind);
  const eEnd = Uint8Array.from(endKind);

  /**
   * Signed distance from p using the edges listed in idx[from..to) (or all when idx is null); with
   * lower bounds lb2 (squared, ascending) the scan stops once no further edge can be nearer.
   */
  const evaluate = (x: number, y: number, idx: Int32Array | null, lb2: Float64Array | null, from: number, to: number): number => {
    let best = Infinity;
    let bestEdge = -1;
    let bestT = 0;
    for (let k = from; k < to; k++) {
      if (lb2 !== null && lb2[k] >= best) break;
      const e = idx ? idx[k] : k;
      const px = x - eAx[e];
      const py = y - eAy[e];
      let t = (px * eDx[e] + py * eDy[e]) * eInvLen2[e];
      if (t < 0) t = 0;
      else if (t > 1) t = 1;
      const qx = px - t * eDx[e];
      const qy = py - t * eDy[e];
      const d2 = qx * qx + qy * qy;
      if (d2 < best) {
        best = d2;
        bestEdge = e;
        bestT = t;
      }
    }
    if (bestEdge < 0) return -Infinity;
    const d = Math.sqrt(best);
    if (d === 0) return 0;
    const kind = bestT <= 0 ? eStart[bestEdge] : bestT >= 1 ? eEnd[bestEdge] : STRAIGHT;
    if (kind === CONVEX) return -d;
    if (kind === REFLEX) return d;
    const side = eDx[bestEdge] * (y - eAy[bestEdge]) - eDy[bestEdge] * (x - eAx[bestEdge]);
    return side > 0 ? d : -d;
  };

  const bounds = polygonsBounds(polygons);
  if (!bounds || E === 0) {
    return { signedDistance: () => -Infinity, upperBound: () => -Infinity, contains: () => false, edgeCount: 0 };
  }
  const w = bounds[2] - bounds[0];
  const h = bounds[3] - bounds[1];
  const size = Math.max(w, h, 1);
  const maxCells = opts.maxCells ?? 256;

  interface Level {
    gx0: number;
    gy0: number;
    nx: number;
    ny: number;
    cell: number;
    invCell: number;
    starts: Int32Array;
    edges: Int32Array;
    /** Distance from the cell centre to each listed edge, mm (ascending within a cell). */
    dce: Float64Array;
    /** Signed distance at each cell centre, mm (last level only). */
    sdc: Float64Array;
  }
  /**
   * One grid level over the bounds grown by `pad`, at least `cells` cells across, built coarse to
   * fine: a top level of a few cells scans every edge, and each finer level (cells halved) scans
   * only its parent cell's list — every edge that can be nearest anywhere in a child cell can be
   * nearest somewhere in its parent, so the lists stay exact while the build stays cheap.
   */
  const buildLevel = (pad: number, cells: number): Level => {
    const gx0 = bounds[0] - pad;
    const gy0 = bounds[1] - pad;
    let depth = 0;
    while (TOP_CELLS << depth < cells) depth++;
    let cell = (size + 2 * pad) / TOP_CELLS;
    let nx = Math.max(1, Math.ceil((w + 2 * pad) / cell));
    let ny = Math.max(1, Math.ceil((h + 2 * pad) / cell));
    let starts = new Int32Array(nx * ny + 1);
    let edges: Int32Array = new Int32Array(0);
    let dce = new Float64Array(0);
    let sdc = new Float64Array(0);
    // Per cell: candidate edges and their squared centre distances.
    const rawD = new Float64Array(E);
    const candE = new Int32Array(E);
    const candD = new Float64Array(E);
    const packed = new Float64Array(E);
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
      const halfDiag = (cell * Math.SQRT2) / 2;
      const nextStarts = new Int32Array(nx * ny + 1);
      if (last) sdc = new Float64Array(nx * ny);
      let outE = new Int32Array(Math.max(1024, 4 * edges.length));
      let outD = new Float64Array(outE.length);
      let used = 0;
      for (let iy = 0; iy < ny; iy++) {
        const cy = gy0 + (iy + 0.5) * cell;
        for (let ix = 0; ix < nx; ix++) {
          const cx = gx0 + (ix + 0.5) * cell;
          const pc = (iy >> 1) * parentNx + (ix >> 1);
          const from = level === 0 ? 0 : parentStarts[pc];
          const to = level === 0 ? E : parentStarts[pc + 1];
          let dc2 = Infinity;
          for (let k = from; k < to; k++) {
            const e = level === 0 ? k : parentEdges[k];
            const px = cx - eAx[e];
            const py = cy - eAy[e];
            let t = (px * eDx[e] + py * eDy[e]) * eInvLen2[e];
            if (t < 0) t = 0;
            else if (t > 1) t = 1;
            const qx = px - t * eDx[e];
            const qy = py - t * eDy[e];
            const d2 = qx * qx + qy * qy;
            rawD[k - from] = d2;
            if (d2 < dc2) dc2 = d2;
          }
          const dc = Math.sqrt(dc2);
          const limit = dc + 2 * halfDiag + 1e-9 * (1 + dc);
          const limit2 = limit * limit;
          // Keep the edges within the limit (a point p of the cell is at least dist(c, e) − |p − c|
          // from edge e, and at most dc + |p − c| from the nearest), nearest first. A parent's list
          // is sorted by distance to the parent centre, so a child's is nearly sorted already.
          let n = 0;
          for (let k = from; k < to; k++) {
            const d2 = rawD[k - from];
            if (d2 > limit2) continue;
            candE[n] = level === 0 ? k : parentEdges[k];
            candD[n++] = d2;
          }
          sortNearestFirst(candE, candD, n, packed, level === 0);
          const c = iy * nx + ix;
          nextStarts[c] = used;
          if (last) sdc[c] = n > 0 ? evaluate(cx, cy, candE, null, 0, 1) : -Infinity;
          if (used + n > outE.length) {
            const grownE = new Int32Array(2 * (used + n));
            grownE.set(outE.subarray(0, used));
            outE = grownE;
            const grownD = new Float64Array(grownE.length);
            grownD.set(outD.subarray(0, used));
            outD = grownD;
          }
          for (let j = 0; j < n; j++) {
            outE[used] = candE[j];
            outD[used] = Math.sqrt(candD[j]);
            used++;
          }
        }
      }
      nextStarts[nx * ny] = used;
      starts = nextStarts;
      edges = outE.slice(0, used);
      dce = outD.slice(0, used);
    }
    return { gx0, gy0, nx, ny, cell, invCell: 1 / cell, starts, edges, dce, sdc };
  };
  // A fine level around the polygons and a coarse one far beyond them; outside both, all edges.
  const fine = buildLevel(size * 0.5 + 1, maxCells);
  const coarse = buildLevel(size * 2.5 + 1, 32);

  // Edge data interleaved for locality: ax, ay, dx, dy, 1/len².
  const ed = new Float64Array(5 * E);
  for (let e = 0; e < E; e++) {
    ed[5 * e] = eAx[e];
    ed[5 * e + 1] = eAy[e];
    ed[5 * e + 2] = eDx[e];
    ed[5 * e + 3] = eDy[e];
    ed[5 * e + 4] = eInvLen2[e];
  }
  const signedDistance = (x: number, y: number): number => {
    let L = fine;
    let fx = (x - L.gx0) * L.invCell;
    let fy = (y - L.gy0) * L.invCell;
    if (!(fx >= 0 && fy >= 0 && fx < L.nx && fy < L.ny)) {
      L = coarse;
      fx = (x - L.gx0) * L.invCell;
      fy = (y - L.gy0) * L.invCell;
      if (!(fx >= 0 && fy >= 0 && fx < L.nx && fy < L.ny)) return evaluate(x, y, null, null, 0, E);
    }
    const ix = fx | 0;
    const iy = fy | 0;
    const c = iy * L.nx + ix;
    // Offset of p from the cell centre, mm: edge e is at least dist(c, e) − off from p.
    const ox = fx - ix - 0.5;
    const oy = fy - iy - 0.5;
    const off = Math.sqrt(ox * ox + oy * oy) * L.cell * (1 + 1e-12) + 1e-9;
    const starts = L.starts;
    const cellEdges = L.edges;
    const dce = L.dce;
    const to = starts[c + 1];
    let best = Infinity;
    let bestEdge = -1;
    let bestT = 0;
    for (let k = starts[c]; k < to; k++) {
      const lb = dce[k] - off;
      if (lb > 0 && lb * lb >= best) break;
      const o = 5 * cellEdges[k];
      const px = x - ed[o];
      const py = y - ed[o + 1];
      const dx = ed[o + 2];
      const dy = ed[o + 3];
      let t = (px * dx + py * dy) * ed[o + 4];
      if (t < 0) t = 0;
      else if (t > 1) t = 1;
      const qx = px - t * dx;
      const qy = py - t * dy;
      const d2 = qx * qx + qy * qy;
      if (d2 < best) {
        best = d2;
        bestEdge = o / 5;
        bestT = t;
      }
    }
    if (bestEdge < 0) return evaluate(x, y, null, null, 0, E);
    if (best === 0) return 0;
    const d = Math.sqrt(best);
    const kind = bestT <= 0 ? eStart[bestEdge] : bestT >= 1 ? eEnd[bestEdge] : STRAIGHT;
    if (kind === CONVEX) return -d;
    if (kind === REFLEX) return d;
    const o = 5 * bestEdge;
    return ed[o + 2] * (y - ed[o + 1]) - ed[o + 3] * (x - ed[o]) > 0 ? d : -d;
  };
  /** Signed distance is 1-Lipschitz: at most its value at the cell centre plus the distance to it. */
  const upperBound = (x: number, y: number): number => {
    let L = fine;
    let fx = (x - L.gx0) * L.invCell;
    let fy = (y - L.gy0) * L.invCell;
    if (!(fx >= 0 && fy >= 0 && fx < L.nx && fy < L.ny)) {
      L = coarse;
      fx = (x - L.gx0) * L.invCell;
      fy = (y - L.gy0) * L.invCell;
      if (!(fx >= 0 && fy >= 0 && fx < L.nx && fy < L.ny)) return Infinity;
    }
    const ix = fx | 0;
    const iy = fy | 0;
    const ox = fx - ix - 0.5;
    const oy = fy - iy - 0.5;
    return L.sdc[iy * L.nx + ix] + Math.sqrt(ox * ox + oy * oy) * L.cell * (1 + 1e-12) + 1e-9;
  };
  return {
    signedDistance,
    upperBound,
    contains: (x, y) => signedDistance(x, y) >= 0,
    edgeCount: E,
  };
}
