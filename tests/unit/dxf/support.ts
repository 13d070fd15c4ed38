// Helpers shared by the DXF import tests (not a test file itself).
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { polygonArea } from 'd3';
import fc from 'fast-check';
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

/** Words a damaged file may hold where another belongs (fuzzing). */
export const WORDS = ['0', '2', '5', '8', '10', '20', '30', '42', '70', '90', 'SECTION', 'ENDSEC', 'EOF', 'ENTITIES', 'BLOCKS', 'TABLES',
  'TABLE', 'ENDTAB', 'LAYER', 'VPORT', 'BLOCK', 'ENDBLK', 'INSERT', 'COLUMN', 'POLYLINE', 'VERTEX', 'SEQEND', 'LWPOLYLINE', 'LINE',
  'ARC', 'CIRCLE', 'SPLINE', 'ELLIPSE', 'TEXT', 'MTEXT', 'HATCH', '\u0000', '', '  ', '1e300', 'NaN', 'Infinity', '-1'];

export type Mutation =
  | { kind: 'drop'; at: number; count: number }
  | { kind: 'swapCodes'; a: number; b: number }
  | { kind: 'number'; at: number; value: string }
  | { kind: 'truncate'; at: number }
  | { kind: 'garbage'; at: number; text: string }
  | { kind: 'duplicate'; at: number; count: number };

const numberText = fc.oneof(
  fc.double({ noNaN: false }).map(String),
  fc.integer({ min: -1e9, max: 1e9 }).map(String),
  fc.constantFrom('1e300', '-1e300', 'NaN', 'Infinity', '-Infinity', '-0', '0', '99999999', '-1', '1e-300', '4', '6', '1'),
);

/** One damage done to a file's lines: drop, swap codes, change a number, cut off, insert, repeat. */
export const mutation: fc.Arbitrary<Mutation> = fc.oneof(
  fc.record({ kind: fc.constant('drop' as const), at: fc.nat(), count: fc.integer({ min: 1, max: 4 }) }),
  fc.record({ kind: fc.constant('swapCodes' as const), a: fc.nat(), b: fc.nat() }),
  fc.record({ kind: fc.constant('number' as const), at: fc.nat(), value: numberText }),
  fc.record({ kind: fc.constant('truncate' as const), at: fc.nat() }),
  fc.record({ kind: fc.constant('garbage' as const), at: fc.nat(), text: fc.oneof(fc.constantFrom(...WORDS), fc.string({ maxLength: 12 })) }),
  fc.record({ kind: fc.constant('duplicate' as const), at: fc.nat(), count: fc.integer({ min: 1, max: 40 }) }),
);

/** Applies the mutations to a copy of the sample's lines. */
export function mutate(lines: readonly string[], ops: readonly Mutation[]): string {
  let l = [...lines];
  for (const o of ops) {
    const n = Math.max(l.length, 1);
    switch (o.kind) {
      case 'drop':
        l.splice(o.at % n, o.count);
        break;
      case 'swapCodes': {
        const a = (o.a % n) & ~1; // group code lines are the even ones
        const b = (o.b % n) & ~1;
        if (a < l.length && b < l.length) [l[a], l[b]] = [l[b], l[a]];
        break;
      }
      case 'number': {
        // change the value of a numeric group (an odd line holding a number), else any line
        const start = (o.at % n) | 1;
        let i = start;
        while (i < l.length && !/^\s*-?[\d.]+(e-?\d+)?\s*$/i.test(l[i])) i += 2;
        l[i < l.length ? i : o.at % n] = o.value;
        break;
      }
      case 'truncate':
        l = l.slice(0, o.at % n);
        break;
      case 'garbage':
        l.splice(o.at % (n + 1), 0, o.text);
        break;
      case 'duplicate': {
        const at = o.at % n;
        l.splice(at, 0, ...l.slice(at, at + o.count));
        break;
      }
    }
  }
  return l.join('\n');
}
