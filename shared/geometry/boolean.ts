import { difference, featureCollection, intersect, polygon as turfPolygon, multiPolygon as turfMultiPolygon, union } from '@turf/turf';
import type { Feature, MultiPolygon, Polygon } from 'geojson';
import { geoJSONToPolygons, polygonsToGeoJSON, type AreaGeometry } from './geojson';
import { snapPolygons } from './snap';

/**
 * Safe wrappers around turf's planar boolean operations (polyclip) on millimetre geometry.
 * Inputs are snapped to the 0.01 mm grid first (nearly coincident edges are turf's known failure
 * mode); a failure comes back as a value, never as an exception.
 */
export type BooleanResult = { ok: true; geometry: AreaGeometry | null } | { ok: false; reason: string };

function toFeature(g: Readonly<AreaGeometry>): Feature<Polygon | MultiPolygon> | null {
  const polys = snapPolygons(geoJSONToPolygons(g));
  if (polys.length === 0) return null;
  const snapped = polygonsToGeoJSON(polys);
  return snapped.type === 'Polygon' ? turfPolygon(snapped.coordinates) : turfMultiPolygon(snapped.coordinates);
}

function run(fn: () => Feature<Polygon | MultiPolygon> | null): BooleanResult {
  try {
    const f = fn();
    return { ok: true, geometry: f ? (f.geometry as AreaGeometry) : null };
  } catch (err) {
    return { ok: false, reason: err instanceof Error ? err.message : String(err) };
  }
}

/** Union of planar Polygon/MultiPolygon geometries in mm (turf union after snapping); null when empty. */
export function safeUnion(geometries: ReadonlyArray<Readonly<AreaGeometry>>): BooleanResult {
  return run(() => {
    const feats = geometries.map(toFeature).filter((f): f is Feature<Polygon | MultiPolygon> => f !== null);
    if (feats.length === 0) return null;
    if (feats.length === 1) return feats[0];
    return union(featureCollection(feats));
  });
}

/** Intersection of two planar geometries in mm (turf intersect after snapping); null when they do not overlap. */
export function safeIntersect(a: Readonly<AreaGeometry>, b: Readonly<AreaGeometry>): BooleanResult {
  return run(() => {
    const fa = toFeature(a);
    const fb = toFeature(b);
    if (!fa || !fb) return null;
    return intersect(featureCollection([fa, fb]));
  });
}

/** Difference a − b of two planar geometries in mm (turf difference after snapping); null when nothing is left. */
export function safeDifference(a: Readonly<AreaGeometry>, b: Readonly<AreaGeometry>): BooleanResult {
  return run(() => {
    const fa = toFeature(a);
    if (!fa) return null;
    const fb = toFeature(b);
    if (!fb) return fa;
    return difference(featureCollection([fa, fb]));
  });
}
