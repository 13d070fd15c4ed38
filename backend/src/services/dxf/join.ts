import type { Feature, Geometry } from 'geojson';
import type { PlanFeatureProps } from '@shared/schemas/floorPlan';
import { closeCcwRing, type OpenPath, type Position2 } from './planBuilder';

/** What joining found: gaps bridged, and the open ends of chains that did not close. */
export interface JoinStats {
  /** Places where ends that did not coincide exactly were joined (within the tolerance). */
  gapsClosed: number;
  /** Number of open chain ends (where one end meets nothing), per layer. */
  openByLayer: Map<string, number>;
  /** Open chain ends per layer, plan mm: at most MAX_LISTED_ENDS of each layer. */
  ends: Map<string, Array<{ layer: string; x: number; y: number }>>;
  /** Paths shorter than the tolerance, dropped (their ends still join their neighbours). */
  degenerate: number;
}

/** Most open ends listed with positions per layer (the count is always complete). */
export const MAX_LISTED_ENDS = 500;

/** True when every position of `c` lies within `tol` of its first (a path shorter than the tolerance). */
function isDegenerate(c: readonly Position2[], tol: number): boolean {
  const p0 = c[0];
  const x0 = p0[0];
  const y0 = p0[1];
  const t2 = tol * tol;
  for (let i = 1; i < c.length; i++) {
    const p = c[i];
    const dx = p[0] - x0;
    const dy = p[1] - y0;
    if (dx * dx + dy * dy > t2) return false;
  }
  return true;
}

/**
 * Joins open paths of the same layer whose ends lie within `tol` mm of each other into chains
 * (ends matched through a hash grid of cell size tol, grouped by union–find). A chain that comes
 * back to where it started becomes a closed ring (Polygon); the others stay LineStrings. Chains
 * stop where more than two ends meet, so T-junctions are never guessed through. A path that lies
 * wholly within `tol` of its start is dropped, but its ends still link the ends around it, so a
 * chain runs on through it. The paths' positions (and a path's own array, where it forms a chain
 * alone) are reused in the output; `stats` (when given) receives the gaps closed and the ends left open.
 */
export function joinPaths(paths: readonly OpenPath[], tol: number, stats?: JoinStats): Array<Feature<Geometry, PlanFeatureProps>> {
  const n = paths.length;
  const ends = 2 * n;
  const ex = new Float64Array(ends);
  const ey = new Float64Array(ends);
  const layerIds = new Int32Array(n);
  const layerIndex = new Map<string, number>();
  const degenerate = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    const c = paths[i].coords;
    const a = c[0];
    const b = c[c.length - 1];
    ex[2 * i] = a[0];
    ey[2 * i] = a[1];
    ex[2 * i + 1] = b[0];
    ey[2 * i + 1] = b[1];
    let id = layerIndex.get(paths[i].layer);
    if (id === undefined) layerIndex.set(paths[i].layer, (id = layerIndex.size));
    layerIds[i] = id;
    if (isDegenerate(c, tol)) degenerate[i] = 1;
  }

  // union–find over end points
  const parent = new Int32Array(ends);
  for (let i = 0; i < ends; i++) parent[i] = i;
  const find = (a: number): number => {
    while (parent[a] !== a) {
      parent[a] = parent[parent[a]];
      a = parent[a];
    }
    return a;
  };
  const union = (a: number, b: number) => {
    const ra = find(a);
    const rb = find(b);
    if (ra !== rb) parent[ra] = rb;
  };

  // hash grid of cell size 2·tol: heads of per-cell lists, linked through `next`. A point's
  // partners within tol lie in its own cell or the neighbours on the side of the half it is in,
  // so four cells are searched, not nine.
  const cell = tol > 0 ? 2 * tol : 1e-6;
  const tol2 = tol * tol;
  // Cells are hashed into a table of 2^k lists; cells that share a list only cost a few more
  // distance checks (every candidate's distance is checked), never a wrong join.
  let size = 1024;
  while (size < 4 * ends) size *= 2;
  const mask = size - 1;
  const heads = new Int32Array(size).fill(-1);
  const next = new Int32Array(ends).fill(-1);
  const key = (ix: number, iy: number) => (Math.imul(ix | 0, 73856093) ^ Math.imul(iy | 0, 19349663)) & mask;
  for (let e = 0; e < ends; e++) {
    const x = ex[e];
    const y = ey[e];
    const fx = x / cell;
    const fy = y / cell;
    const ix = Math.floor(fx);
    const iy = Math.floor(fy);
    const sx = fx - ix < 0.5 ? -1 : 1;
    const sy = fy - iy < 0.5 ? -1 : 1;
    const lid = layerIds[e >> 1];
    // A list keeps only distinct points: an end at exactly the point of one already there
    // (duplicated drawings, arrays with zero spacing) is joined through it and not stored, so a
    // pile of copies costs no pairwise comparisons.
    let twin = false;
    for (let cx = 0; cx < 2; cx++) {
      for (let cy = 0; cy < 2; cy++) {
        let o = heads[key(ix + cx * sx, iy + cy * sy)];
        while (o !== -1) {
          if (layerIds[o >> 1] === lid) {
            const ddx = ex[o] - x;
            const ddy = ey[o] - y;
            if (ddx * ddx + ddy * ddy <= tol2) {
              union(e, o);
              if (ddx === 0 && ddy === 0) twin = true;
            }
          }
          o = next[o];
        }
      }
    }
    if (twin) continue;
    const k = key(ix, iy);
    next[e] = heads[k];
    heads[k] = e;
  }

  // per node (root): how many ends meet there, and the first two of them
  const degree = new Int32Array(ends);
  const first = new Int32Array(ends).fill(-1);
  const second = new Int32Array(ends).fill(-1);
  const root = new Int32Array(ends);
  // a node whose ends do not all lie at one point is a gap closed within the tolerance
  const nodeX = new Float64Array(ends).fill(Number.NaN);
  const nodeY = new Float64Array(ends);
  const gap = new Uint8Array(ends);
  for (let e = 0; e < ends; e++) {
    const r = find(e);
    root[e] = r;
    if (Number.isNaN(nodeX[r])) {
      nodeX[r] = ex[e];
      nodeY[r] = ey[e];
    } else if (nodeX[r] !== ex[e] || nodeY[r] !== ey[e]) gap[r] = 1;
    if (degenerate[e >> 1]) continue;
    const d = degree[r]++;
    if (d === 0) first[r] = e;
    else if (d === 1) second[r] = e;
  }

  const used = new Uint8Array(n);
  for (let i = 0; i < n; i++) if (degenerate[i]) used[i] = 1;
  const out: Array<Feature<Geometry, PlanFeatureProps>> = [];

  const emit = (coords: Position2[], layer: string, parts: number, entity: string, closed: boolean) => {
    const props: PlanFeatureProps = { layer, entity: parts === 1 ? entity : 'JOINED', closed };
    if (parts > 1) props.parts = parts;
    if (closed) {
      // the ring's last point lies within tol of its first: close on the first
      const ring = coords.length >= 2 ? coords.slice(0, -1) : coords;
      if (ring.length >= 3) {
        out.push({ type: 'Feature', properties: props, geometry: { type: 'Polygon', coordinates: [closeCcwRing(ring)] } });
        return;
      }
      props.closed = false;
    }
    out.push({ type: 'Feature', properties: props, geometry: { type: 'LineString', coordinates: coords } });
  };

  /**
   * The positions of a chain of path ends (each entering its path), in one array of its exact
   * length; a chain of one path run forwards is that path's own array.
   */
  const assemble = (chain: readonly number[]): Position2[] => {
    const e0 = chain[0];
    const c0 = paths[e0 >> 1].coords;
    if (chain.length === 1 && (e0 & 1) === 0) return c0;
    let total = c0.length;
    for (let k = 1; k < chain.length; k++) total += paths[chain[k] >> 1].coords.length - 1;
    const coords: Position2[] = total <= 65_536 ? new Array<Position2>(total) : [];
    let at = 0;
    for (let k = 0; k < chain.length; k++) {
      const e = chain[k];
      const c = paths[e >> 1].coords;
      const skip = k === 0 ? 0 : 1; // a later path's first position is the one before it
      if ((e & 1) === 0) for (let i = skip; i < c.length; i++) coords[at++] = c[i];
      else for (let i = c.length - 1 - skip; i >= 0; i--) coords[at++] = c[i];
    }
    return coords;
  };

  const chain: number[] = [];
  /** Walks a chain leaving through end `startEnd` (of path startEnd >> 1). */
  const walk = (startEnd: number) => {
    const startNode = root[startEnd];
    const p0 = startEnd >> 1;
    chain.length = 0;
    let closed = false;
    let e = startEnd;
    for (;;) {
      used[e >> 1] = 1;
      chain.push(e);
      const other = e ^ 1;
      const node = root[other];
      if (node === startNode) {
        closed = true;
        break;
      }
      if (degree[node] !== 2) break;
      const nextEnd = first[node] === other ? second[node] : first[node];
      if (used[nextEnd >> 1]) break;
      e = nextEnd;
    }
    emit(assemble(chain), paths[p0].layer, chain.length, paths[p0].entity, closed);
  };

  // open chains first: they start at nodes where one or more than two ends meet
  for (let e = 0; e < ends; e++) {
    if (!used[e >> 1] && degree[root[e]] !== 2) walk(e);
  }
  // what is left lies on cycles
  for (let e = 0; e < ends; e += 2) {
    if (!used[e >> 1]) walk(e);
  }
  if (stats) {
    for (let e = 0; e < ends; e++) {
      const r = root[e];
      if (r !== e) continue;
      if (gap[r] && degree[r] >= 2) stats.gapsClosed++;
      if (degree[r] === 1) {
        const layer = paths[first[r] >> 1].layer;
        stats.openByLayer.set(layer, (stats.openByLayer.get(layer) ?? 0) + 1);
        let list = stats.ends.get(layer);
        if (!list) stats.ends.set(layer, (list = []));
        if (list.length < MAX_LISTED_ENDS) list.push({ layer, x: nodeX[r], y: nodeY[r] });
      }
    }
    for (let i = 0; i < n; i++) stats.degenerate += degenerate[i];
  }
  return out;
}
