import type { MultiPolygon, Polygon, Position } from 'geojson';
import { ringArea } from './area';
import type { Polygon2, Pt, Ring } from './types';

/** Planar GeoJSON area geometry in mm (plan or arm frame; never longitude/latitude). */
export type AreaGeometry = Polygon | MultiPolygon;

/**
 * Closes a ring for GeoJSON (repeats the first point at the end), counter-clockwise when `ccw`.
 * A new array of the ring's own position arrays (not copied: positions are never changed in place).
 */
export function ringToPositions(ring: Readonly<Ring>, ccw: boolean): Position[] {
  const pts: Position[] = ring.slice();
  const area = ringArea(ring);
  if ((area > 0) !== ccw && area !== 0) pts.reverse();
  if (pts.length > 0) pts.push([pts[0][0], pts[0][1]]);
  return pts;
}

/** Opens a GeoJSON ring (drops the repeated closing point). */
export function positionsToRing(positions: ReadonlyArray<Position>): Ring {
  const ring: Ring = positions.map((p) => [p[0], p[1]] as Pt);
  if (ring.length > 1) {
    const a = ring[0];
    const b = ring[ring.length - 1];
    if (a[0] === b[0] && a[1] === b[1]) ring.pop();
  }
  return ring;
}

/**
 * Polygons → one GeoJSON geometry, mm: a Polygon for one, a MultiPolygon otherwise (an empty
 * MultiPolygon when there is nothing). Outer rings counter-clockwise, holes clockwise (RFC 7946).
 */
export function polygonsToGeoJSON(polygons: ReadonlyArray<Polygon2>): AreaGeometry {
  const coords = polygons
    .filter((p) => p.length > 0 && p[0].length >= 3)
    .map((p) => p.map((ring, i) => ringToPositions(ring, i === 0)));
  if (coords.length === 1) return { type: 'Polygon', coordinates: coords[0] };
  return { type: 'MultiPolygon', coordinates: coords };
}

/** GeoJSON Polygon/MultiPolygon → polygons with open rings, mm. */
export function geoJSONToPolygons(geometry: Readonly<AreaGeometry> | null | undefined): Polygon2[] {
  if (!geometry) return [];
  if (geometry.type === 'Polygon') return [geometry.coordinates.map(positionsToRing)];
  if (geometry.type === 'MultiPolygon') return geometry.coordinates.map((p) => p.map(positionsToRing));
  throw new Error('geometry must be a Polygon or MultiPolygon');
}

/** Applies a point map to every vertex of the polygons (new arrays; the input is untouched). */
export function mapPolygons(polygons: ReadonlyArray<Polygon2>, fn: (x: number, y: number) => Pt): Polygon2[] {
  return polygons.map((p) => p.map((ring) => ring.map(([x, y]) => fn(x, y))));
}
