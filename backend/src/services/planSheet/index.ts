/**
 * Plan sheets: `renderPlanSheet(input, opts)` → PDF bytes; `loadLayoutSheetInput(layout)` builds the
 * input of a layout's working copy; `layoutDxf(input)` → DXF text for CAD. Types in ./types.ts.
 */
export * from './types';
export { renderPlanSheet } from './renderPlanSheet';
export { loadLayoutSheetInput } from './loadLayoutSheetInput';
export { CAUTIONS, DRAFT_MARK } from './sheetPages';
export { layoutDxf, DXF_LAYERS, DXF_BASE_RADIUS_MM, DXF_POINT_RADIUS_MM } from './layoutDxf';
