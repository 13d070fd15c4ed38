/**
 * The DXF floor-plan import engine. Call `parseInWorker` from request handlers (large files
 * never block the event loop) and `importDxf` where blocking is fine (seeding, scripts, tests).
 */
export { importDxf, type ImportOptions } from './importDxf';
export { parseInWorker, parseInWorkerPacked, type WorkerOptions } from './parseInWorker';
export { packedGeometryJson, type PackedResult } from './transfer';
export { DxfImportError, isDxfImportError, DXF_IMPORT_ERROR_CODES, type DxfImportErrorCode } from './errors';
export { UNIT_NAMES, unitToMm, unitFromInsunits, unitLabel, resolveUnits, type UnitName } from './units';
export { guessLayerRole, defaultLayerHeight } from './layerRoles';
export { DEFAULT_CHORD_TOLERANCE_MM, DEFAULT_JOIN_TOLERANCE_MM, MAX_COORDINATE_MM } from './limits';
export type { ImportResult, ImportLayer, LayerRole, PlanFeatureProps } from '@shared/schemas/floorPlan';
