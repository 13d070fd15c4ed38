import type { Feature, Geometry } from 'geojson';
import type { PlanFeatureProps } from '../../../../shared/schemas/floorPlan';
import { toCcwRing, type OpenPath } from './planBuilder';

/**
 * Joins open paths of the same layer whose ends lie within `tol` mm of each other into chains
 * (ends matched through a hash grid of cell size tol, grouped by union–find). A chain that comes
 * back to where it started becomes a closed ring (Polygon); the others stay LineStrings. Chains
 * stop where more than two ends meet, so T-junctions are never guessed through.
 */
export function joinPaths(paths: readonly OpenPath[], tol: number): Array<Feature<Geometry, PlanFeatureProps>> {
  const n = paths.length;
  const ends = 2 * n;
  const ex = new Float64Array(ends);
  const ey = new Float64Array(ends);
  const layerIds = new Int32Array(n);
  const layerIndex = new Map<string, number>();
  for (let i = 0; i < n; i++) {
    const c = paths[i].coords;
    ex[2 * i] = c[0];
    ey[2 * i] = c[1];
    ex[2 * i + 1] = c[c.length - 2];
    ey[2 * i + 1] = c[c.length - 1];
    let id = layerIndex.get(paths[i].layer);
    if (id === undefined) layerIndex.set(paths[i].layer, (id = layerIndex.size));
    layerIds[i] = id;
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
  const cell = tol > 0 ? tol : 1e-6;
  const grid = new Map<number, number[]>();
  const key = (ix: number, iy: number) => (Math.imul(ix | 0, 73856093) ^ Math.imul(iy | 0, 19349663)) | 0;
  const tol2 = tol * tol;
  // A bucket keeps only distinct points: an end at exactly the point of one already there
  // (duplicated drawings, arrays with zero spacing) is joined through it and not stored, so a
  // pile of copies costs no pairwise comparisons.
  for (let e = 0; e < ends; e++) {
    const x = ex[e];
    const y = ey[e];
    let twin = false;
    const ix = Math.floor(x / cell);
    const iy = Math.floor(y / cell);
    const lid = layerIds[e >> 1];
    for (let dx = -1; dx <= 1; dx++) {
      for (let dy = -1; dy <= 1; dy++) {
        const bucket = grid.get(key(ix + dx, iy + dy));
        if (!bucket) continue;
        for (const o of bucket) {
          if (layerIds[o >> 1] !== lid) continue;
          const ddx = ex[o] - x;
          const ddy = ey[o] - y;
          if (ddx * ddx + ddy * ddy <= tol2) {
            const ra = find(e);
            const rb = find(o);
            if (ra !== rb) parent[ra] = rb;
            if (ddx === 0 && ddy === 0) twin = true;
          }
        }
      }
    }
    if (twin) continue;
    const k = key(ix, iy);
    const bucket = grid.get(k);
    if (bucket) bucket.push(e);
    else grid.set(k, [e]);
  }

  // ends at each node
  const members = new Map<number, number[]>();
  for (let e = 0; e < ends; e++) {
    const r = find(e);
    const list = members.get(r);
    if (list) list.push(e);
    else members.set(r, [e]);
  }
  const degree = (node: number) => members.get(node)!.length;

  const used = new Uint8Array(n);
  const out: Array<Feature<Geometry, PlanFeatureProps>> = [];

  /** Walks a chain starting at end `e` (the chain leaves through path e>>1). */
  const walk = (startEnd: number) => {
    const startNode = find(startEnd);
    const coords: number[] = [];
    const kinds = new Set<string>();
    let parts = 0;
    let e = startEnd;
    for (;;) {
      const p = e >> 1;
      used[p] = 1;
      parts++;
      kinds.add(paths[p].entity);
      const c = paths[p].coords;
      const forward = (e & 1) === 0;
      const skipFirst = coords.length > 0 ? 1 : 0;
      if (forward) {
        for (let i = skipFirst * 2; i < c.length; i += 2) coords.push(c[i], c[i + 1]);
      } else {
        for (let i = c.length - 2 - skipFirst * 2; i >= 0; i -= 2) coords.push(c[i], c[i + 1]);
      }
      const other = e ^ 1;
      const node = find(other);
      if (node === startNode) {
        emit(coords, paths[p].layer, parts, kinds, true);
        return;
      }
      if (degree(node) !== 2) break;
      const [a, b] = members.get(node)!;
      const next = a === other ? b : a;
      if (used[next >> 1]) break;
      e = next;
    }
    emit(coords, paths[startEnd >> 1].layer, parts, kinds, false);
  };

  const emit = (coords: number[], layer: string, parts: number, kinds: Set<string>, closed: boolean) => {
    const entity = parts === 1 ? [...kinds][0] : 'JOINED';
    const props: PlanFeatureProps = { layer, entity, closed };
    if (parts > 1) props.parts = parts;
    if (closed) {
      // the ring's last point lies within tol of its first: close on the first
      let c = coords;
      if (c.length >= 4) c = c.slice(0, -2);
      if (c.length >= 6) {
        out.push({ type: 'Feature', properties: props, geometry: { type: 'Polygon', coordinates: [toCcwRing(c)] } });
        return;
      }
      props.closed = false;
    }
    const line: Array<[number, number]> = [];
    for (let i = 0; i < coords.length; i += 2) line.push([coords[i], coords[i + 1]]);
    out.push({ type: 'Feature', properties: props, geometry: { type: 'LineString', coordinates: line } });
  };

  // open chains first: they start at nodes where one or more than two ends meet
  for (let e = 0; e < ends; e++) {
    if (used[e >> 1]) continue;
    if (degree(find(e)) !== 2) walk(e);
  }
  // what is left lies on cycles
  for (let e = 0; e < ends; e += 2) {
    if (!used[e >> 1]) walk(e);
  }
  return out;
}
