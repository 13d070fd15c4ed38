import type { ImportResult, UnitName } from '@shared/schemas/floorPlan';
import { parseInWorker } from './dxf';

/**
 * Reads an uploaded DXF into plan geometry in a worker thread (backend/src/services/dxf), so one
 * large drawing never blocks other requests; failures come back as DxfImportError.
 */
export function readFloorPlan(bytes: Uint8Array, opts: { units?: UnitName } = {}): Promise<ImportResult> {
  return parseInWorker(bytes, opts);
}
