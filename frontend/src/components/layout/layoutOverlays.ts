/**
 * The layout editor's overlays on the plan canvas, bottom to top within each space: plan space
 * (mm, moves with zoom) and screen space (px, keeps its size). One list, so drawing and removal
 * name the same groups. The work points are not here: they are painted on the canvas layer between
 * the two (`POINTS_LAYER`, sceneDraw.ts), above the finding's outline.
 */
import type { OverlayOptions } from '../../plan/planTypes';

export interface LayoutOverlay extends Required<OverlayOptions> {
  name: string;
}

export const LAYOUT_OVERLAYS = {
  patterns: { name: 'layout-patterns', space: 'plan', order: 1 },
  areas: { name: 'layout-areas', space: 'plan', order: 5 },
  reach: { name: 'layout-reach', space: 'plan', order: 10 },
  shared: { name: 'layout-shared', space: 'plan', order: 20 },
  lines: { name: 'layout-lines', space: 'plan', order: 30 },
  finding: { name: 'layout-finding', space: 'plan', order: 45 },
  boundaryMarks: { name: 'layout-boundary-marks', space: 'screen', order: 1 },
  arms: { name: 'layout-arms', space: 'screen', order: 5 },
  handles: { name: 'layout-handles', space: 'screen', order: 6 },
  section: { name: 'layout-section', space: 'screen', order: 3 },
  draft: { name: 'layout-draft', space: 'screen', order: 7 },
} as const satisfies Record<string, LayoutOverlay>;
