import type { Geometry } from 'geojson';
import type { ImportResult, UnitName } from '../../../../shared/schemas/floorPlan';
import { DxfImportError } from './errors';
import { MAX_COORDINATE_MM, roundMm } from './limits';
import { isUnitsWarning, unitLabel, unitToMm } from './units';

function scaleGeometry(g: Geometry, k: number): Geometry {
  const s = (p: number[]) => [roundMm(p[0] * k), roundMm(p[1] * k)];
  switch (g.type) {
    case 'Point':
      return { type: 'Point', coordinates: s(g.coordinates) };
    case 'LineString':
      return { type: 'LineString', coordinates: g.coordinates.map(s) };
    case 'Polygon':
      return { type: 'Polygon', coordinates: g.coordinates.map((r) => r.map(s)) };
    default:
      return g;
  }
}

/**
 * The same import read in another drawing unit, without the file: every coordinate, label
 * height and the bounds scaled by mm(newUnits)/mm(old). Layer heights are the planner's
 * millimetres and stay. Curves keep the chords of the first reading, so scaling up widens their
 * error; the result says so and carries the grown chord tolerance. The input is not changed.
 */
export function rescaleImport(result: ImportResult, newUnits: UnitName): ImportResult {
  const k = unitToMm(newUnits) / unitToMm(result.units);
  const b = result.bounds;
  const far = Math.max(Math.abs(b.minX), Math.abs(b.minY), Math.abs(b.maxX), Math.abs(b.maxY)) * k;
  if (!(far <= MAX_COORDINATE_MM)) {
    throw new DxfImportError(
      'bad-coordinates',
      `Read in ${unitLabel(newUnits).toLowerCase()}, the drawing would reach ${(far / 1e6).toPrecision(3)} km from its origin, which no floor plan does. Choose another unit.`,
    );
  }
  const tol = result.chordToleranceMm * Math.max(k, 1);
  const warnings = result.warnings.filter((w) => !isUnitsWarning(w));
  if (k > 1 && newUnits !== result.units) {
    warnings.push(
      `The unit was changed from ${unitLabel(result.units).toLowerCase()} to ${unitLabel(newUnits).toLowerCase()} after reading; curves keep their first approximation and may now stray up to ${Number(tol.toPrecision(3))} mm from the true curve. Import the file again with this unit for full detail.`,
    );
  }
  return {
    ...result,
    units: newUnits,
    unitsSource: 'chosen',
    bounds: {
      minX: roundMm(b.minX * k),
      minY: roundMm(b.minY * k),
      maxX: roundMm(b.maxX * k),
      maxY: roundMm(b.maxY * k),
    },
    layers: result.layers.map((l) => ({ ...l })),
    geometry: {
      type: 'FeatureCollection',
      features: result.geometry.features.map((f) => ({
        ...f,
        properties:
          f.properties.textHeight === undefined
            ? { ...f.properties }
            : { ...f.properties, textHeight: roundMm(f.properties.textHeight * k) },
        geometry: scaleGeometry(f.geometry, k),
      })),
    },
    warnings,
    stats: { ...result.stats, skipped: { ...result.stats.skipped } },
    chordToleranceMm: tol,
  };
}
