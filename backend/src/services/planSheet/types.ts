/**
 * Plan sheet input and options — the contract between the plan-sheet renderer and its callers
 * (the working-copy route and the revision/release flow).
 *
 * PlanSheetInput — everything one sheet set shows, already loaded; the renderer does no I/O:
 *   project     name, client and site printed in the title block.
 *   layout      id, name and content (shared/schemas/layout.ts LayoutContent: arms, work points,
 *               boundaries, work heights; plan mm, degrees).
 *   floorPlan   the floor plan's GeoJSON geometry (plan mm), its layers with roles
 *               (outline/wall/column/obstacle/ignore; ignored layers are not drawn) and bounds (mm);
 *               null when the layout has no floor plan (the sheet then fits the layout's extent).
 *   analysis    the shared analysis result (shared/analysis/types.ts AnalysisResult) for `layout.content`.
 *   models      the arm models the arms use (id, name, family, params as stored; lengths mm, degrees).
 *   revision    the revision the sheet shows, or null for the working copy (title block then says
 *               "working copy"); dates are ISO strings or Dates.
 *   history     revision history rows, oldest first (letter, state, when, by whom, note).
 *   drawnBy     display name of who drew the layout; reviewedBy: reviewer's display name or null.
 *
 * PlanSheetOptions —
 *   size        paper size, always landscape: A3 (default in the route), A4 or A1.
 *   scale       N of the ratio 1:N from the standard series; omitted = the largest of the series that
 *               fits the floor plan (or the layout's extent) in the drawing area.
 *   sheets      which sheets, in print order plan → schedule → coverage → boundaries → safeguarding → fences →
 *               findings → history; omitted = all but `fences` (the fence parts: plan with numbered panels
 *               and the bill of materials), which is printed when named.
 *   draft       true = a diagonal "DRAFT — not for construction" mark on every page.
 *   createdAt   the date printed and written into the PDF metadata; same input + same createdAt →
 *               byte-identical PDF.
 */
import type { FeatureCollection } from 'geojson';
import type { AnalysisResult } from '@shared/analysis';
import type { LayoutContent } from '@shared/schemas/layout';

export type SheetSize = 'A3' | 'A4' | 'A1';
export const SHEET_SIZES: readonly SheetSize[] = ['A3', 'A4', 'A1'];
/** Standard drawing scales 1:N. */
export const SCALE_SERIES = [20, 25, 50, 100, 200, 250, 500] as const;
export type SheetScale = (typeof SCALE_SERIES)[number];
export const SHEET_KINDS = ['plan', 'schedule', 'coverage', 'boundaries', 'safeguarding', 'fences', 'findings', 'history'] as const;
export type SheetKind = (typeof SHEET_KINDS)[number];
/** The sheets printed when none are named: all but the fence-parts sheet, which is asked for by name. */
export const DEFAULT_SHEET_KINDS: readonly SheetKind[] = SHEET_KINDS.filter((k) => k !== 'fences');

export interface PlanSheetFloorLayer {
  name: string;
  role: 'outline' | 'wall' | 'column' | 'obstacle' | 'ignore';
  height: number | null;
  color?: string;
}

export interface PlanSheetInput {
  project: { name: string; clientName: string | null; siteName: string | null };
  layout: { id: number; name: string; content: LayoutContent };
  floorPlan: {
    geometry: FeatureCollection;
    layers: PlanSheetFloorLayer[];
    bounds: { minX: number; minY: number; maxX: number; maxY: number };
    /** Where the plan's 0,0 lies in the floor plan's drawing, mm (0,0 unless it was moved at import). */
    origin?: { x: number; y: number };
  } | null;
  analysis: AnalysisResult;
  models: Array<{ id: number; name: string; family: string; params: Record<string, unknown> }>;
  revision: {
    letter: string;
    state: string;
    submittedBy: string | null;
    decidedBy: string | null;
    decidedAt: Date | string | null;
    releasedAt: Date | string | null;
  } | null;
  history: Array<{ letter: string; state: string; at: Date | string; by: string | null; note: string | null }>;
  drawnBy: string;
  reviewedBy: string | null;
}

export interface PlanSheetOptions {
  size: SheetSize;
  scale?: SheetScale;
  sheets?: SheetKind[];
  draft: boolean;
  createdAt: Date;
}
