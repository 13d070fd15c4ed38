import { polygonsBounds, ringArea } from './area';
import type { Polygon2 } from './types';

/**
 * Fast exact signed distance to a fixed polygon set, for hot loops (millions of queries).
 *
 * Method: a uniform grid over the padded bounds (a fine level close by, a coarse one far out). For each cell centre c the distance d_c to the
 * boundary is computed once; by the triangle inequality every query point p in that cell has its
 * nearest edge among the edges within d_c + 2h of c (h = half the cell diagonal), so only those are
 * stored and tested. The sign comes from the nearest feature (region on the left of every edge):
 * the side of the nearest edge, or for a nearest vertex whether that vertex is convex (outside) or
 * reflex (inside). Queries outside the grid fall back to all edges, so the answer is exact
 * everywhere; the grid only makes it fast.
 */
export interface DistanceGrid {
  /** Signed distance to the boundary, mm: positive inside, negative outside, 0 on it. */
  signedDistance(x: number, y: number): number;
  /** True when the point lies inside or on the boundary. */
  contains(x: number, y: number): boolean;
  /** Number of boundary edges (for diagnostics). */
  readonly edgeCount: number;
}

const CONVEX = 1;
const REFLEX = 0;
const STRAIGHT = 2;

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
    return { signedDistance: () => -Infinity, contains: () => false, edgeCount: 0 };
  }
  const w = bounds[2] - bounds[0];
  const h = bounds[3] - bounds[1];
  const size = Math.max(w, h, 1);
  const maxCells = opts.maxCells ?? 64;

  interface Level {
    gx0: number;
    gy0: number;
    nx: number;
    ny: number;
    invCell: number;
    starts: Int32Array;
    edges: Int32Array;
    lb2: Float64Array;
  }
  /** One grid level over the bounds grown by `pad` with `cells` cells across. */
  const buildLevel = (pad: number, cells: number): Level => {
    const gx0 = bounds[0] - pad;
    const gy0 = bounds[1] - pad;
    const cell = (size + 2 * pad) / cells;
    const nx = Math.max(1, Math.ceil((w + 2 * pad) / cell));
    const ny = Math.max(1, Math.ceil((h + 2 * pad) / cell));
    const halfDiag = (cell * Math.SQRT2) / 2;
    const starts = new Int32Array(nx * ny + 1);
    const lists: number[] = [];
    const bounds2: number[] = [];
    const dist = new Float64Array(E);
    const order: number[] = [];
    for (let iy = 0; iy < ny; iy++) {
      const cy = gy0 + (iy + 0.5) * cell;
      for (let ix = 0; ix < nx; ix++) {
        const cx = gx0 + (ix + 0.5) * cell;
        let dc = Infinity;
        for (let e = 0; e < E; e++) {
          const px = cx - eAx[e];
          const py = cy - eAy[e];
          let t = (px * eDx[e] + py * eDy[e]) * eInvLen2[e];
          if (t < 0) t = 0;
          else if (t > 1) t = 1;
          const qx = px - t * eDx[e];
          const qy = py - t * eDy[e];
          const d = Math.sqrt(qx * qx + qy * qy);
          dist[e] = d;
          if (d < dc) dc = d;
        }
        const limit = dc + 2 * halfDiag + 1e-9 * (1 + dc);
        starts[iy * nx + ix] = lists.length;
        order.length = 0;
        for (let e = 0; e < E; e++) if (dist[e] <= limit) order.push(e);
        // Nearest first: a point in the cell is at least dist(c, e) − h from edge e.
        order.sort((p, q) => dist[p] - dist[q]);
        for (const e of order) {
          lists.push(e);
          const lb = dist[e] - halfDiag;
          bounds2.push(lb > 0 ? lb * lb : 0);
        }
      }
    }
    starts[nx * ny] = lists.length;
    return { gx0, gy0, nx, ny, invCell: 1 / cell, starts, edges: Int32Array.from(lists), lb2: Float64Array.from(bounds2) };
  };
  // A fine level around the polygons and a coarse one far beyond them; outside both, all edges.
  const fine = buildLevel(size * 0.5 + 1, maxCells);
  const coarse = buildLevel(size * 2.5 + 1, 24);

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
    const c = (fy | 0) * L.nx + (fx | 0);
    const starts = L.starts;
    const cellEdges = L.edges;
    const cellBounds = L.lb2;
    const to = starts[c + 1];
    let best = Infinity;
    let bestEdge = -1;
    let bestT = 0;
    for (let k = starts[c]; k < to; k++) {
      if (cellBounds[k] >= best) break;
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
  return {
    signedDistance,
    contains: (x, y) => signedDistance(x, y) >= 0,
    edgeCount: E,
  };
}
