import type { FeatureCollection } from 'geojson';
import type { Sequelize } from 'sequelize';
import type { ImportResult, UnitName } from '@shared/schemas/floorPlan';
import { packedGeometryJson, parseInWorkerPacked } from './dxf';

/**
 * An import as it is stored: everything but the geometry as ImportResult has it, the geometry as
 * its JSON text (exactly JSON.stringify of ImportResult.geometry), written straight from the
 * worker's packed arrays, so the GeoJSON objects of a large plan (an array per position) are never
 * made on the request thread.
 */
export interface ReadFloorPlan extends Omit<ImportResult, 'geometry'> {
  geometryJson: string;
}

/**
 * Reads an uploaded DXF into plan geometry in a worker thread (backend/src/services/dxf), so one
 * large drawing never blocks other requests; failures come back as DxfImportError.
 */
export async function readFloorPlan(bytes: Uint8Array, opts: { units?: UnitName } = {}): Promise<ReadFloorPlan> {
  const packed = await parseInWorkerPacked(bytes, opts);
  return { ...packed.meta, geometryJson: packedGeometryJson(packed) };
}

/**
 * The value that stores geometry JSON text in FloorPlan.geometry (JSONB) as it is: a literal in
 * the INSERT or UPDATE, typed as the attribute for the model's create and update. A query that
 * stores it must not return the geometry (`returning` without it), or the database's answer
 * would be parsed into the objects this avoids.
 */
export function storedGeometry(sequelize: Sequelize, geometryJson: string): FeatureCollection {
  return sequelize.literal(`${sequelize.escape(geometryJson)}::jsonb`) as unknown as FeatureCollection;
}
