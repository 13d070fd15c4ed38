// Helpers shared by the DXF import tests (not a test file itself).
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { polygonArea } from 'd3';
import type { Feature, Geometry, LineString, Polygon, Position } from 'geojson';
import type { ImportResult, PlanFeatureProps } from '@shared/schemas/floorPlan';

export const SAMPLES_DIR = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../../samples/floor-plans');

export function readSample(file: string): string {
  return readFileSync(path.join(SAMPLES_DIR, file), 'utf8');
}

export type PlanFeature = Feature<Geometry, PlanFeatureProps>;

export function featuresOn(r: ImportResult, layer: string): PlanFeature[] {
  return r.geometry.features.filter((f) => f.properties.layer === layer);
}

export function polygonsOn(r: ImportResult, layer: string): Position[][] {
  return featuresOn(r, layer)
    .filter((f) => f.geometry.type === 'Polygon')
    .map((f) => (f.geometry as Polygon).coordinates[0]);
}

export function linesOn(r: ImportResult, layer: string): Position[][] {
  return featuresOn(r, layer)
    .filter((f) => f.geometry.type === 'LineString')
    .map((f) => (f.geometry as LineString).coordinates);
}

/** Planar area of a closed ring by d3's polygonArea (an independent shoelace implementation). */
export function d3Area(ring: Position[]): number {
  return Math.abs(polygonArea(ring.map((p) => [p[0], p[1]] as [number, number])));
}

/** Shoelace formula written out here, independent of the import code. */
export function shoelace(ring: Position[]): number {
  let s = 0;
  for (let i = 0; i + 1 < ring.length; i++) s += ring[i][0] * ring[i + 1][1] - ring[i + 1][0] * ring[i][1];
  return s / 2;
}

/** Every coordinate of a result, flattened. */
export function allPositions(r: ImportResult): Position[] {
  const out: Position[] = [];
  for (const f of r.geometry.features) {
    const g = f.geometry;
    if (g.type === 'Point') out.push(g.coordinates);
    else if (g.type === 'LineString') out.push(...g.coordinates);
    else if (g.type === 'Polygon') for (const ring of g.coordinates) out.push(...ring);
  }
  return out;
}

/** Largest distance from the midpoint of each chord of `pts` to the curve, measured by `dist`. */
export function maxChordError(pts: Position[], dist: (x: number, y: number) => number): number {
  let worst = 0;
  for (let i = 0; i + 1 < pts.length; i++) {
    const mx = (pts[i][0] + pts[i + 1][0]) / 2;
    const my = (pts[i][1] + pts[i + 1][1]) / 2;
    worst = Math.max(worst, dist(mx, my));
  }
  return worst;
}

/** Distance from (x, y) to a densely sampled curve (brute force, independent of the importer). */
export function densePolylineDistance(curve: (t: number) => [number, number], t0: number, t1: number, n = 20000) {
  const xs = new Float64Array(n + 1);
  const ys = new Float64Array(n + 1);
  for (let i = 0; i <= n; i++) {
    const [x, y] = curve(t0 + ((t1 - t0) * i) / n);
    xs[i] = x;
    ys[i] = y;
  }
  return (x: number, y: number) => {
    let best = Number.POSITIVE_INFINITY;
    for (let i = 0; i < n; i++) {
      const ux = xs[i + 1] - xs[i];
      const uy = ys[i + 1] - ys[i];
      const vx = x - xs[i];
      const vy = y - ys[i];
      const uu = ux * ux + uy * uy;
      const t = uu > 0 ? Math.min(1, Math.max(0, (vx * ux + vy * uy) / uu)) : 0;
      const d = Math.hypot(vx - t * ux, vy - t * uy);
      if (d < best) best = d;
    }
    return best;
  };
}

/** DXF text from group-code/value pairs (a hand-written file, for cases the sample writer cannot make). */
export function rawDxf(groups: ReadonlyArray<readonly [number, string | number]>): string {
  let s = '';
  for (const [c, v] of groups) s += `${c}\n${v}\n`;
  return s;
}

/** Groups of a LINE on `layer` from a to b (R12 style: no handles, no subclass markers). */
export function lineGroups(layer: string, a: readonly [number, number], b: readonly [number, number]): Array<[number, string | number]> {
  return [[0, 'LINE'], [8, layer], [10, a[0]], [20, a[1]], [30, 0], [11, b[0]], [21, b[1]], [31, 0]];
}

/** A whole file: HEADER groups (may be empty), then an ENTITIES section of the given groups. */
export function entitiesDxf(
  entities: ReadonlyArray<readonly [number, string | number]>,
  header: ReadonlyArray<readonly [number, string | number]> = [[9, '$INSUNITS'], [70, 4]],
): string {
  return rawDxf([
    [0, 'SECTION'], [2, 'HEADER'], ...header, [0, 'ENDSEC'],
    [0, 'SECTION'], [2, 'ENTITIES'], ...entities, [0, 'ENDSEC'],
    [0, 'EOF'],
  ]);
}
