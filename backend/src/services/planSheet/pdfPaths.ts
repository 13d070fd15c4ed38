import { GState, type jsPDF } from 'jspdf';
import { addToBounds, emptyBounds, isEmptyBounds } from '@shared/geometry';
import type { Polygon2 } from '@shared/geometry';
import { pathWriter } from './pdfText';

export type Rgb = readonly [number, number, number];
export type ToPaper = (x: number, y: number) => [number, number];

/** Adds the rings of the polygons to the current path (paper mm), each ring closed. */
export function addPolygonPath(doc: jsPDF, polygons: ReadonlyArray<Polygon2>, toPaper: ToPaper): number {
  const path = pathWriter(doc);
  let rings = 0;
  for (const poly of polygons) {
    for (const ring of poly) {
      if (ring.length < 2) continue;
      const [x0, y0] = toPaper(ring[0][0], ring[0][1]);
      path.move(x0, y0);
      for (let i = 1; i < ring.length; i++) {
        const [x, y] = toPaper(ring[i][0], ring[i][1]);
        path.line(x, y);
      }
      path.close();
      rings += 1;
    }
  }
  path.flush();
  return rings;
}

/** Adds an open polyline to the current path (paper mm). */
export function addLinePath(doc: jsPDF, points: ReadonlyArray<readonly [number, number]>, toPaper: ToPaper, closed = false): void {
  if (points.length < 2) return;
  const path = pathWriter(doc);
  const [x0, y0] = toPaper(points[0][0], points[0][1]);
  path.move(x0, y0);
  for (let i = 1; i < points.length; i++) {
    const [x, y] = toPaper(points[i][0], points[i][1]);
    path.line(x, y);
  }
  if (closed) path.close();
  path.flush();
}

/** Runs `draw` at an opacity (PDF ExtGState), then restores full opacity. */
export function withOpacity(doc: jsPDF, opacity: number, draw: () => void): void {
  doc.saveGraphicsState();
  doc.setGState(new GState({ opacity, 'stroke-opacity': opacity }));
  draw();
  doc.restoreGraphicsState();
}

/** Fills polygons (even-odd, so holes stay open) at an opacity. */
export function fillPolygons(doc: jsPDF, polygons: ReadonlyArray<Polygon2>, toPaper: ToPaper, rgb: Rgb, opacity: number): void {
  withOpacity(doc, opacity, () => {
    doc.setFillColor(rgb[0], rgb[1], rgb[2]);
    if (addPolygonPath(doc, polygons, toPaper) > 0) doc.fillEvenOdd();
  });
}

/** Strokes polygon outlines; `dash` in paper mm (empty = solid). */
export function strokePolygons(doc: jsPDF, polygons: ReadonlyArray<Polygon2>, toPaper: ToPaper, rgb: Rgb, width: number, dash: number[] = []): void {
  doc.setDrawColor(rgb[0], rgb[1], rgb[2]);
  doc.setLineWidth(width);
  doc.setLineDashPattern(dash, 0);
  if (addPolygonPath(doc, polygons, toPaper) > 0) doc.stroke();
  doc.setLineDashPattern([], 0);
}

/**
 * Hatches polygons with parallel lines (paper spacing mm, angle degrees on paper), clipped to the
 * polygons with an even-odd clipping path.
 */
export function hatchPolygons(doc: jsPDF, polygons: ReadonlyArray<Polygon2>, toPaper: ToPaper, rgb: Rgb, spacing: number, angleDeg: number, width = 0.12): void {
  // Bounds on paper of the outer rings.
  const box = emptyBounds();
  for (const p of polygons) for (const [x, y] of p[0] ?? []) addToBounds(box, ...toPaper(x, y));
  if (isEmptyBounds(box)) return;
  const { minX, minY, maxX, maxY } = box;
  doc.saveGraphicsState();
  if (addPolygonPath(doc, polygons, toPaper) === 0) {
    doc.restoreGraphicsState();
    return;
  }
  doc.clipEvenOdd();
  doc.discardPath();
  doc.setDrawColor(rgb[0], rgb[1], rgb[2]);
  doc.setLineWidth(width);
  const a = (angleDeg * Math.PI) / 180;
  const dx = Math.cos(a), dy = -Math.sin(a);
  const nx = -dy, ny = dx;
  const cx = (minX + maxX) / 2, cy = (minY + maxY) / 2;
  const half = Math.hypot(maxX - minX, maxY - minY) / 2 + spacing;
  const path = pathWriter(doc);
  for (let t = -half; t <= half; t += spacing) {
    const ox = cx + nx * t, oy = cy + ny * t;
    path.move(ox - dx * half, oy - dy * half);
    path.line(ox + dx * half, oy + dy * half);
  }
  path.flush();
  doc.stroke();
  doc.restoreGraphicsState();
}
