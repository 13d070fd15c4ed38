import type { Feature, Geometry } from 'geojson';
import type { PlanFeatureProps } from '@shared/schemas/floorPlan';
import { DxfImportError } from './errors';
import { MAX_COORDINATE_MM, MAX_OUTPUT_POINTS, roundMm } from './limits';
import type { Affine } from './transform';

export type Position2 = [number, number];

/** The limit and the rounding of limits.ts, held here for the per-point loop. */
const MAX_MM = MAX_COORDINATE_MM;
const round = roundMm;
/** Longest point list made at its full size at once (longer ones grow as they fill). */
const PRESIZED_POINTS = 4096;

/** An open plan polyline waiting to be joined: positions in plan mm. */
export interface OpenPath {
  layer: string;
  entity: string;
  coords: Position2[];
}

/** Names an entity for messages: type, handle from the file, block it sits in. */
export interface EntityRef {
  type: string;
  handle?: string;
  block?: string;
}

export function describeEntity(ref: EntityRef): string {
  let s = `a ${ref.type} entity`;
  if (ref.handle) s += ` (handle ${ref.handle})`;
  if (ref.block) s += ` in block "${ref.block}"`;
  return s;
}

/** Signed area of an open ring of positions (shoelace formula); positive = counter-clockwise. */
export function ringSignedArea(ring: readonly Position2[]): number {
  let s = 0;
  const n = ring.length;
  for (let i = 0; i < n; i++) {
    const a = ring[i];
    const b = ring[i + 1 === n ? 0 : i + 1];
    s += a[0] * b[1] - b[0] * a[1];
  }
  return s / 2;
}

/**
 * Closes an open ring into a GeoJSON ring, counter-clockwise (RFC 7946 §3.1.6): reversed (in
 * place) when clockwise, then a new array with the first position repeated (as a copy) at the end.
 */
export function closeCcwRing(ring: Position2[]): Position2[] {
  if (ringSignedArea(ring) < 0) ring.reverse();
  // (concat makes an array of the exact length; a push would leave spare room in it)
  return ring.concat([[ring[0][0], ring[0][1]]]);
}

/**
 * Collects what entities draw, in plan millimetres: closed rings and labels become features at
 * once, open paths are kept for joining. Checks every coordinate (finite, within
 * MAX_COORDINATE_MM) and the size limits, counts entities per layer and skipped entities.
 */
export class PlanBuilder {
  readonly features: Array<Feature<Geometry, PlanFeatureProps>> = [];
  readonly open: OpenPath[] = [];
  readonly layerCounts = new Map<string, number>();
  readonly skipped = new Map<string, number>();
  entities = 0;
  private points = 0;
  /** Bounding box of every position added so far, mm. */
  minX = Number.POSITIVE_INFINITY;
  minY = Number.POSITIVE_INFINITY;
  maxX = Number.NEGATIVE_INFINITY;
  maxY = Number.NEGATIVE_INFINITY;

  /** Counts an entity that was not drawn; `reason` is shown in the warning. */
  skip(type: string, reason: string): void {
    const key = `${type} (${reason})`;
    this.skipped.set(key, (this.skipped.get(key) ?? 0) + 1);
  }

  private count(layer: string): void {
    this.entities++;
    this.layerCounts.set(layer, (this.layerCounts.get(layer) ?? 0) + 1);
  }

  private spend(n: number): void {
    this.points += n;
    if (this.points > MAX_OUTPUT_POINTS) {
      throw new DxfImportError(
        'too-complex',
        `The drawing expands to more than ${MAX_OUTPUT_POINTS.toLocaleString('en')} points, more than one floor plan import may hold. Remove detail the plan does not need (furniture, hatching, dimensions) and try again.`,
      );
    }
  }

  private project(m: Affine, pts: readonly number[], ref: EntityRef): Position2[] {
    // sized up front (a pushed array keeps spare room for ever), unless very long
    const n = pts.length / 3;
    const out: Position2[] = n <= PRESIZED_POINTS ? new Array<Position2>(n) : [];
    let k = 0;
    let px = Number.NaN;
    let py = Number.NaN;
    const m0 = m[0];
    const m1 = m[1];
    const m2 = m[2];
    const m3 = m[3];
    const m4 = m[4];
    const m5 = m[5];
    const m6 = m[6];
    const m7 = m[7];
    let minX = this.minX;
    let minY = this.minY;
    let maxX = this.maxX;
    let maxY = this.maxY;
    for (let i = 0; i < pts.length; i += 3) {
      const a = pts[i];
      const b = pts[i + 1];
      const c = pts[i + 2];
      const X = m0 * a + m1 * b + m2 * c + m3;
      const Y = m4 * a + m5 * b + m6 * c + m7;
      if (!(Math.abs(X) <= MAX_MM) || !(Math.abs(Y) <= MAX_MM)) badPoint(X, Y, ref);
      const x = round(X);
      const y = round(Y);
      if (x === px && y === py) continue;
      out[k++] = [x, y];
      px = x;
      py = y;
      if (x < minX) minX = x;
      if (x > maxX) maxX = x;
      if (y < minY) minY = y;
      if (y > maxY) maxY = y;
    }
    this.minX = minX;
    this.minY = minY;
    this.maxX = maxX;
    this.maxY = maxY;
    if (k < out.length) out.length = k;
    return out;
  }

  /** Adds what one entity draws: points (x, y, z triples) in the frame that `m` maps to plan mm. */
  path(ref: EntityRef, layer: string, closed: boolean, pts: readonly number[], m: Affine): void {
    const c = this.project(m, pts, ref);
    const n = c.length;
    if (closed && n >= 2 && c[0][0] === c[n - 1][0] && c[0][1] === c[n - 1][1]) c.pop();
    if (closed && c.length >= 3) {
      this.spend(c.length + 1);
      this.count(layer);
      this.features.push({
        type: 'Feature',
        properties: { layer, entity: ref.type, closed: true },
        geometry: { type: 'Polygon', coordinates: [closeCcwRing(c)] },
      });
      return;
    }
    if (c.length < 2) {
      this.skip(ref.type, 'zero size');
      return;
    }
    this.spend(c.length);
    this.count(layer);
    this.open.push({ layer, entity: ref.type, coords: c });
  }

  /** Adds a text label at local point p with direction d and up vector u (its height). */
  label(
    ref: EntityRef,
    layer: string,
    text: string,
    p: readonly [number, number, number],
    d: readonly [number, number, number],
    u: readonly [number, number, number],
    m: Affine,
  ): void {
    const [[x, y]] = this.project(m, p, ref);
    const dx = m[0] * d[0] + m[1] * d[1] + m[2] * d[2];
    const dy = m[4] * d[0] + m[5] * d[1] + m[6] * d[2];
    const ux = m[0] * u[0] + m[1] * u[1] + m[2] * u[2];
    const uy = m[4] * u[0] + m[5] * u[1] + m[6] * u[2];
    let rotation = (Math.atan2(dy, dx) * 180) / Math.PI;
    if (!Number.isFinite(rotation)) rotation = 0;
    rotation = Math.round(rotation * 1e6) / 1e6;
    if (rotation <= -180) rotation += 360;
    const h = Math.hypot(ux, uy);
    if (!(h <= MAX_COORDINATE_MM)) badPoint(h, h, ref);
    this.spend(1);
    this.count(layer);
    this.features.push({
      type: 'Feature',
      properties: { layer, entity: ref.type, closed: false, text, textHeight: roundMm(h), rotation: rotation || 0 },
      geometry: { type: 'Point', coordinates: [x, y] },
    });
  }
}

/** Throws the 'bad-coordinates' error for a point that is not finite or lies too far out. */
export function badPoint(x: number, y: number, ref: EntityRef): never {
  const v = Math.abs(x) <= MAX_COORDINATE_MM ? y : x;
  const what = Number.isFinite(v)
    ? `a coordinate of ${v.toExponential(3)} mm, too far from the drawing origin to be placed to 0.1 mm`
    : 'a coordinate that is not a number';
  const who = describeEntity(ref);
  throw new DxfImportError(
    'bad-coordinates',
    `The file holds ${who} with ${what}. Check the drawing (or its unit) and export it again.`,
  );
}
