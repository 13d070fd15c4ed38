import type { ImportResult, UnitName } from '@shared/schemas/floorPlan';
import { importDxf } from './dxf/importDxf';

/** Reads an uploaded DXF into plan geometry (backend/src/services/dxf). */
export async function readFloorPlan(bytes: Uint8Array, opts: { units?: UnitName } = {}): Promise<ImportResult> {
  return importDxf(bytes, opts);
}
