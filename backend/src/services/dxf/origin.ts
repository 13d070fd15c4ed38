import type { Feature, Geometry, Position } from 'geojson';
import type { ImportBounds, PlanFeatureProps, PlanOrigin } from '@shared/schemas/floorPlan';
import { roundMm } from './limits';

/**
 * A drawing whose extent reaches farther than this from its own origin is moved to a local
 * origin at import, mm (10 km): no building floor is that large (see PLAUSIBLE_EXTENT_MM), so such
 * coordinates are a map grid (site plans drawn in national grid eastings and northings).
 */
export const LOCAL_ORIGIN_BEYOND_MM = 10_000_000;

/**
 * The local origin of a drawing (plan mm): the lower-left corner of its extent rounded down to
 * whole metres, or 0,0 when the drawing lies within LOCAL_ORIGIN_BEYOND_MM of its own origin.
 */
export function localOrigin(b: ImportBounds): PlanOrigin {
  const far = Math.max(Math.abs(b.minX), Math.abs(b.maxX), Math.abs(b.minY), Math.abs(b.maxY));
  if (!(far > LOCAL_ORIGIN_BEYOND_MM)) return { x: 0, y: 0 };
  return { x: Math.floor(b.minX / 1000) * 1000, y: Math.floor(b.minY / 1000) * 1000 };
}

/**
 * Moves every position of `features` and `bounds` by −origin, in place (each position object
 * once, even where features share one). Subtracting a whole number of millimetres from a
 * coordinate of the same magnitude is exact in float64.
 */
export function moveToOrigin(features: ReadonlyArray<Feature<Geometry, PlanFeatureProps>>, bounds: ImportBounds, o: PlanOrigin): void {
  if (o.x === 0 && o.y === 0) return;
  const seen = new Set<Position>();
  const move = (p: Position) => {
    if (seen.has(p)) return;
    seen.add(p);
    p[0] = roundMm(p[0] - o.x);
    p[1] = roundMm(p[1] - o.y);
  };
  for (const f of features) {
    const g = f.geometry;
    if (g.type === 'Point') move(g.coordinates);
    else if (g.type === 'LineString') for (const p of g.coordinates) move(p);
    else if (g.type === 'Polygon') for (const ring of g.coordinates) for (const p of ring) move(p);
  }
  bounds.minX = roundMm(bounds.minX - o.x);
  bounds.maxX = roundMm(bounds.maxX - o.x);
  bounds.minY = roundMm(bounds.minY - o.y);
  bounds.maxY = roundMm(bounds.maxY - o.y);
}
