import { SCALE_SERIES, type SheetScale, type SheetSize } from './types';

/** Landscape paper sizes, mm (ISO 216). */
export const PAPER_MM: Record<SheetSize, { w: number; h: number }> = {
  A4: { w: 297, h: 210 },
  A3: { w: 420, h: 297 },
  A1: { w: 841, h: 594 },
};

export interface Box {
  x: number;
  y: number;
  w: number;
  h: number;
}

/** Where things go on one landscape page, paper mm from the top-left corner. */
export interface PageFrame {
  paper: { w: number; h: number };
  /** Inside the border. */
  border: Box;
  /** Left part: the plan or the tables. */
  main: Box;
  /** Right column: legend/notes, cautions, title block (top to bottom). */
  side: Box;
}

/** The frame of a page of a given size: 10 mm margins (8 on A4), a side column 92 mm wide (80 on A4). */
export function pageFrame(size: SheetSize): PageFrame {
  const paper = PAPER_MM[size];
  const m = size === 'A4' ? 8 : 10;
  const sideW = size === 'A4' ? 80 : 92;
  const border: Box = { x: m, y: m, w: paper.w - 2 * m, h: paper.h - 2 * m };
  const side: Box = { x: border.x + border.w - sideW, y: border.y, w: sideW, h: border.h };
  const main: Box = { x: border.x, y: border.y, w: border.w - sideW, h: border.h };
  return { paper, border, main, side };
}

/** The plan's drawing area inside the main box: 4 mm inset, a 16 mm strip kept at the bottom for the scale bar. */
export function drawingArea(frame: PageFrame): Box {
  const inset = 4;
  return { x: frame.main.x + inset, y: frame.main.y + inset, w: frame.main.w - 2 * inset, h: frame.main.h - 2 * inset - 16 };
}

export interface Extent {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

/**
 * The largest drawing scale of the standard series (smallest N of 1:N) at which the extent (plan mm)
 * fits the area (paper mm); the smallest scale of the series (1:500) when nothing fits.
 */
export function autoScale(extent: Extent, area: { w: number; h: number }): SheetScale {
  const w = Math.max(extent.maxX - extent.minX, 1);
  const h = Math.max(extent.maxY - extent.minY, 1);
  for (const n of SCALE_SERIES) if (w / n <= area.w && h / n <= area.h) return n;
  return SCALE_SERIES[SCALE_SERIES.length - 1];
}

/** Plan mm → paper mm at 1:N, the extent's centre on the area's centre, plan y north = up on paper. */
export function planToPaper(extent: Extent, area: Box, n: number): (x: number, y: number) => [number, number] {
  const cx = (extent.minX + extent.maxX) / 2;
  const cy = (extent.minY + extent.maxY) / 2;
  const px = area.x + area.w / 2;
  const py = area.y + area.h / 2;
  return (x, y) => [px + (x - cx) / n, py - (y - cy) / n];
}
