/**
 * Plan sheets: `renderPlanSheet(input, opts)` → PDF bytes; `loadLayoutSheetInput(layout)` builds the
 * input of a layout's working copy; `layoutDxf(input)` → DXF text for CAD. Types in ./types.ts.
 */
export {
  type PlanSheetFloorLayer,
  type PlanSheetInput,
  type PlanSheetOptions,
  SCALE_SERIES,
  SHEET_KINDS,
  SHEET_SIZES,
  type SheetKind,
  type SheetScale,
  type SheetSize,
} from './types';
export { renderPlanSheet } from './renderPlanSheet';
export { loadLayoutSheetInput } from './loadLayoutSheetInput';
export { CAUTIONS, DRAFT_MARK } from './sheetPages';
export { layoutDxf, DXF_LAYERS, DXF_BASE_RADIUS_MM, DXF_POINT_RADIUS_MM } from './layoutDxf';
