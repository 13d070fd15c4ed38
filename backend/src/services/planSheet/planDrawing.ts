import type { jsPDF } from 'jspdf';
import type { Geometry, Position } from 'geojson';
import { isReached } from '@shared/analysis';
import { addToBounds, emptyBounds, isEmptyBounds, padBounds } from '@shared/geometry';
import { armPose } from '@shared/geometry';
import { geoJSONToPolygons } from '@shared/geometry';
import type { Polygon2 } from '@shared/geometry';
import type { Boundary } from '@shared/schemas/layout';
import { BOUNDARY_STYLES } from '@shared/style/boundaryStyles';
import { PLAN_NORTH } from '@shared/words';
import type { ArmSummary } from './armSummary';
import { sheetText } from './fonts';
import { drawingArea, planToPaper, type Box, type Extent, type PageFrame } from './paper';
import { addLinePath, fillPolygons, hatchPolygons, strokePolygons, withOpacity, type Rgb, type ToPaper } from './pdfPaths';
import type { PlanSheetInput } from './types';

/** Muted per-arm colours (cycled). */
export const ARM_COLOURS: readonly Rgb[] = [
  [31, 94, 160], [190, 92, 30], [40, 128, 80], [122, 72, 158], [158, 44, 76], [22, 124, 134], [110, 100, 30], [70, 70, 150],
];
const INK: Rgb = [28, 34, 48];
const GREY: Rgb = [120, 124, 132];
const { armBase: ARM_BASE, maxSpace: MAX_SPACE, restricted: RESTRICTED, band: BAND, shared: SHARED, fence: FENCE, opening: OPENING, operator: OPERATOR, keepout: KEEPOUT } = BOUNDARY_STYLES;
const { pointReached: POINT_REACHED, pointUnreached: POINT_UNREACHED } = BOUNDARY_STYLES;
/** Radius of an arm's base symbol on paper, mm. */
export const BASE_SYMBOL_RADIUS_MM = 2;
/** Work-point labels are left off past this many points (the coverage sheet lists them all). */
const POINT_LABEL_LIMIT = 1500;

/** The extent a plan sheet fits: the floor plan's bounds, or the layout's arms (with reach), boundaries and points. */
export function planExtent(input: PlanSheetInput, arms: ArmSummary[]): Extent {
  if (input.floorPlan) return input.floorPlan.bounds;
  const box = emptyBounds();
  const add = (x: number, y: number) => addToBounds(box, x, y);
  for (const a of arms) {
    const r = a.maxSpaceRadius ?? 0;
    add(a.arm.x - r, a.arm.y - r);
    add(a.arm.x + r, a.arm.y + r);
  }
  for (const z of input.layout.content.boundaries) for (const [x, y] of z.points) add(x, y);
  for (const p of input.layout.content.workPoints) add(p.x, p.y);
  if (isEmptyBounds(box)) return { minX: -5000, minY: -5000, maxX: 5000, maxY: 5000 };
  return padBounds(box, Math.max(box.maxX - box.minX, box.maxY - box.minY, 1000) * 0.04);
}

function rings(g: Geometry): { polygons: Polygon2[]; lines: Position[][] } {
  switch (g.type) {
    case 'Polygon':
    case 'MultiPolygon':
      return { polygons: geoJSONToPolygons(g), lines: [] };
    case 'LineString':
      return { polygons: [], lines: [g.coordinates] };
    case 'MultiLineString':
      return { polygons: [], lines: g.coordinates };
    default:
      return { polygons: [], lines: [] };
  }
}

export function drawFloor(doc: jsPDF, input: PlanSheetInput, toPaper: ToPaper): void {
  const fp = input.floorPlan;
  if (!fp) return;
  const roles = new Map(fp.layers.map((l) => [l.name, l.role]));
  // Draw order: floor outline, obstacles, columns, walls (heavier items on top).
  const order = ['outline', 'obstacle', 'column', 'wall'] as const;
  for (const role of order) {
    for (const f of fp.geometry.features) {
      const layer = String((f.properties as { layer?: unknown } | null)?.layer ?? '');
      if (roles.get(layer) !== role || !f.geometry) continue;
      const { polygons, lines } = rings(f.geometry);
      const pts = lines.map((l) => l.map((p) => [p[0], p[1]] as [number, number]));
      if (role === 'outline') {
        strokePolygons(doc, polygons, toPaper, INK, 0.5);
        doc.setLineWidth(0.5);
      } else if (role === 'wall') {
        fillPolygons(doc, polygons, toPaper, [90, 94, 102], 1);
        strokePolygons(doc, polygons, toPaper, INK, 0.25);
        doc.setLineWidth(0.45);
      } else if (role === 'column') {
        fillPolygons(doc, polygons, toPaper, [60, 64, 72], 1);
        strokePolygons(doc, polygons, toPaper, INK, 0.2);
        doc.setLineWidth(0.35);
      } else {
        fillPolygons(doc, polygons, toPaper, [205, 208, 214], 1);
        strokePolygons(doc, polygons, toPaper, [90, 94, 102], 0.18);
        doc.setLineWidth(0.2);
      }
      doc.setDrawColor(INK[0], INK[1], INK[2]);
      for (const l of pts) {
        addLinePath(doc, l, toPaper);
        doc.stroke();
      }
    }
  }
}

export function label(doc: jsPDF, text: string, x: number, y: number, pt: number, rgb: Rgb = INK, bold = false, align: 'left' | 'center' | 'right' = 'left'): void {
  doc.setFont('Lato', bold ? 'bold' : 'normal');
  doc.setFontSize(pt);
  doc.setTextColor(rgb[0], rgb[1], rgb[2]);
  doc.text(sheetText(text), x, y, { align });
}

function longestSegmentMid(points: ReadonlyArray<[number, number]>): [number, number] {
  let best = 0, at: [number, number] = points[0];
  for (let i = 1; i < points.length; i++) {
    const [x0, y0] = points[i - 1], [x1, y1] = points[i];
    const len = Math.hypot(x1 - x0, y1 - y0);
    if (len > best) {
      best = len;
      at = [(x0 + x1) / 2, (y0 + y1) / 2];
    }
  }
  return at;
}

function centroid(points: ReadonlyArray<[number, number]>): [number, number] {
  let sx = 0, sy = 0;
  for (const [x, y] of points) {
    sx += x;
    sy += y;
  }
  return [sx / points.length, sy / points.length];
}

function drawBoundaries(doc: jsPDF, boundaries: ReadonlyArray<Boundary>, toPaper: ToPaper): void {
  for (const z of boundaries.filter((z0) => z0.kind === 'operator')) {
    const poly: Polygon2[] = [[z.points.map(([x, y]) => [x, y] as [number, number])]];
    fillPolygons(doc, poly, toPaper, OPERATOR.paper.fill.colour, OPERATOR.paper.fill.opacity);
    strokePolygons(doc, poly, toPaper, OPERATOR.paper.colour, OPERATOR.paper.width, [...OPERATOR.paper.dash]);
    const [cx, cy] = toPaper(...centroid(z.points));
    label(doc, `${z.id} operator area${z.label ? ` — ${z.label}` : ''}`, cx, cy, 6, OPERATOR.paper.label, true, 'center');
  }
  for (const z of boundaries.filter((z0) => z0.kind === 'keepout')) {
    const poly: Polygon2[] = [[z.points.map(([x, y]) => [x, y] as [number, number])]];
    for (const angle of KEEPOUT.paper.hatch.angles) hatchPolygons(doc, poly, toPaper, KEEPOUT.paper.colour, KEEPOUT.paper.hatch.spacing, angle, KEEPOUT.paper.hatch.width);
    strokePolygons(doc, poly, toPaper, KEEPOUT.paper.colour, KEEPOUT.paper.width);
    const [cx, cy] = toPaper(...centroid(z.points));
    label(doc, `${z.id} keep-out${z.label ? ` — ${z.label}` : ''}`, cx, cy, 6, KEEPOUT.paper.label, true, 'center');
  }
  for (const z of boundaries.filter((z0) => z0.kind === 'fence')) {
    doc.setDrawColor(...FENCE.paper.colour);
    doc.setLineWidth(FENCE.paper.width);
    addLinePath(doc, z.points, toPaper);
    doc.stroke();
    // Post marks at the corners.
    for (const [x, y] of z.points) {
      const [px, py] = toPaper(x, y);
      doc.setFillColor(...FENCE.paper.colour);
      doc.rect(px - 0.6, py - 0.6, 1.2, 1.2, 'F');
    }
    const [mx, my] = toPaper(...longestSegmentMid(z.points));
    label(doc, `${z.id}${z.label ? ` ${z.label}` : ''} fence h ${Math.round(z.height ?? 0)}`, mx, my - 1.4, 5.5, FENCE.paper.label, true, 'center');
  }
  for (const z of boundaries.filter((z0) => z0.kind === 'opening')) {
    const [a, b] = z.points;
    const [ax, ay] = toPaper(a[0], a[1]);
    const [bx, by] = toPaper(b[0], b[1]);
    // The gap: paper-white over the fence line, then the jambs across it.
    doc.setDrawColor(...OPENING.paper.gap.colour);
    doc.setLineWidth(OPENING.paper.gap.width);
    doc.line(ax, ay, bx, by);
    const len = Math.hypot(bx - ax, by - ay) || 1;
    const nx = -(by - ay) / len, ny = (bx - ax) / len;
    doc.setDrawColor(...OPENING.paper.colour);
    doc.setLineWidth(OPENING.paper.width);
    doc.line(ax - nx * 1.5, ay - ny * 1.5, ax + nx * 1.5, ay + ny * 1.5);
    doc.line(bx - nx * 1.5, by - ny * 1.5, bx + nx * 1.5, by + ny * 1.5);
    doc.setLineDashPattern([...OPENING.paper.gap.centreDash], 0);
    doc.setLineWidth(OPENING.paper.gap.centreWidth);
    doc.line(ax, ay, bx, by);
    doc.setLineDashPattern([], 0);
    label(doc, `${z.id} opening${z.label ? ` ${z.label}` : ''}`, (ax + bx) / 2 + nx * 3, (ay + by) / 2 + ny * 3 + 1, 5.5, OPENING.paper.label, false, 'center');
  }
}

function drawArms(doc: jsPDF, arms: ArmSummary[], toPaper: ToPaper): void {
  arms.forEach((a, i) => {
    const c = ARM_COLOURS[i % ARM_COLOURS.length];
    if (a.restricted.length) fillPolygons(doc, a.restricted, toPaper, c, RESTRICTED.paper.fill.opacity);
  });
  arms.forEach((a, i) => {
    const c = ARM_COLOURS[i % ARM_COLOURS.length];
    if (a.maxSpace.length) strokePolygons(doc, a.maxSpace, toPaper, c, MAX_SPACE.paper.width, [...MAX_SPACE.paper.dash]);
    if (a.restricted.length) strokePolygons(doc, a.restricted, toPaper, c, RESTRICTED.paper.width);
    if (a.band?.polygons.length) strokePolygons(doc, a.band.polygons, toPaper, c, BAND.paper.width, [...BAND.paper.dash]);
  });
  arms.forEach((a, i) => {
    const c = ARM_COLOURS[i % ARM_COLOURS.length];
    const [x, y] = toPaper(a.arm.x, a.arm.y);
    doc.setFillColor(255, 255, 255);
    doc.setDrawColor(c[0], c[1], c[2]);
    doc.setLineWidth(ARM_BASE.paper.width);
    doc.circle(x, y, BASE_SYMBOL_RADIUS_MM, 'FD');
    // J1 zero's plan direction [cos, sin]; paper y points down.
    const { cos, sin } = armPose(a.arm);
    doc.line(x, y, x + cos * BASE_SYMBOL_RADIUS_MM * 1.9, y - sin * BASE_SYMBOL_RADIUS_MM * 1.9);
    label(doc, a.title, x + BASE_SYMBOL_RADIUS_MM + 1, y + BASE_SYMBOL_RADIUS_MM + 2.6, 6.5, c, true);
  });
}

function drawPoints(doc: jsPDF, input: PlanSheetInput, toPaper: ToPaper): void {
  const pts = input.layout.content.workPoints;
  const cov = input.analysis.coverage;
  const withLabels = pts.length <= POINT_LABEL_LIMIT;
  for (const p of pts) {
    const [x, y] = toPaper(p.x, p.y);
    const margins = Object.values(cov[p.id] ?? {});
    const reached = margins.some(isReached);
    const look = (reached ? POINT_REACHED : POINT_UNREACHED).paper;
    const c: Rgb = look.colour;
    doc.setDrawColor(c[0], c[1], c[2]);
    doc.setLineWidth(look.width);
    doc.line(x - 0.9, y - 0.9, x + 0.9, y + 0.9);
    doc.line(x - 0.9, y + 0.9, x + 0.9, y - 0.9);
    if (withLabels) label(doc, p.id, x + 1.1, y - 0.9, 4.5, c);
  }
}

function niceStep(paperTarget: number, n: number): number {
  const steps = [100, 200, 250, 500, 1000, 2000, 2500, 5000, 10000, 20000, 25000, 50000];
  const want = paperTarget * n;
  return steps.find((s) => s >= want) ?? steps[steps.length - 1];
}

/** Scale bar (five alternating segments with their lengths) and the ratio text, paper mm. */
export function drawScaleBar(doc: jsPDF, x: number, y: number, n: number, sizeName: string): void {
  const step = niceStep(12, n); // plan mm per segment, at least 12 mm on paper each
  const segPaper = step / n;
  for (let i = 0; i < 5; i++) {
    doc.setDrawColor(INK[0], INK[1], INK[2]);
    doc.setLineWidth(0.2);
    if (i % 2 === 0) doc.setFillColor(INK[0], INK[1], INK[2]);
    else doc.setFillColor(255, 255, 255);
    doc.rect(x + i * segPaper, y, segPaper, 1.6, 'FD');
  }
  const fmt = (mm: number) => (mm >= 1000 ? `${+(mm / 1000).toFixed(2)} m` : `${mm} mm`);
  for (let i = 0; i <= 5; i++) label(doc, i === 0 ? '0' : fmt(step * i), x + i * segPaper, y + 4.6, 5.5, INK, false, 'center');
  label(doc, `1:${n}`, x + 5 * segPaper + 8, y + 2.2, 11, INK, true);
  label(doc, `at ${sizeName} · plan mm`, x + 5 * segPaper + 8, y + 5.6, 5.5, GREY);
}

/** Reference arrow: plan north (the drawing's +y) pointing up on paper; floor plans carry no true north. */
function drawNorthArrow(doc: jsPDF, cx: number, cy: number): void {
  const r = 5.5;
  doc.setDrawColor(INK[0], INK[1], INK[2]);
  doc.setLineWidth(0.25);
  doc.circle(cx, cy, r, 'S');
  doc.setFillColor(INK[0], INK[1], INK[2]);
  doc.triangle(cx, cy - r + 0.6, cx - 2, cy + 2.6, cx, cy + 1.2, 'F');
  doc.setFillColor(255, 255, 255);
  doc.triangle(cx, cy - r + 0.6, cx + 2, cy + 2.6, cx, cy + 1.2, 'FD');
  label(doc, PLAN_NORTH.mark, cx, cy - r - 1.2, 7, INK, true, 'center');
  label(doc, PLAN_NORTH.label, cx, cy + r + 3, 4.5, GREY, false, 'center');
}

/** Legend in the side column's top part; returns the height used, mm. */
function drawLegend(doc: jsPDF, box: Box, arms: ArmSummary[], firstHeight: number | undefined): number {
  const x = box.x + 4;
  let y = box.y + 6;
  label(doc, 'Legend', x, y, 8, INK, true);
  y += 5;
  const row = (draw: (sx: number, sy: number) => void, text: string) => {
    draw(x, y - 1.6);
    label(doc, text, x + 14, y, 6.2);
    y += 4.6;
  };
  const sw = (sx: number, sy: number) => [[[[sx, sy - 1.4], [sx + 10, sy - 1.4], [sx + 10, sy + 1.4], [sx, sy + 1.4]]]] as Polygon2[];
  const id: ToPaper = (px, py) => [px, py];
  row((sx, sy) => {
    doc.setDrawColor(INK[0], INK[1], INK[2]);
    doc.setLineWidth(0.25);
    doc.setFillColor(255, 255, 255);
    doc.circle(sx + 5, sy, BASE_SYMBOL_RADIUS_MM * 0.8, 'FD');
  }, ARM_BASE.legend);
  row((sx, sy) => strokePolygons(doc, sw(sx, sy), id, MAX_SPACE.paper.legendColour, MAX_SPACE.paper.width, [...MAX_SPACE.paper.dash]), MAX_SPACE.legend);
  row((sx, sy) => {
    fillPolygons(doc, sw(sx, sy), id, ARM_COLOURS[0], RESTRICTED.paper.fill.opacity);
    strokePolygons(doc, sw(sx, sy), id, ARM_COLOURS[0], RESTRICTED.paper.width);
  }, RESTRICTED.legend);
  row((sx, sy) => strokePolygons(doc, sw(sx, sy), id, BAND.paper.legendColour, BAND.paper.width, [...BAND.paper.dash]), firstHeight === undefined ? `${BAND.legend} (no work height set)` : `${BAND.legend} at ${Math.round(firstHeight)} mm`);
  row((sx, sy) => {
    for (const angle of SHARED.paper.hatch.angles) hatchPolygons(doc, sw(sx, sy), id, SHARED.paper.colour, SHARED.paper.hatch.legendSpacing, angle, SHARED.paper.hatch.width);
    strokePolygons(doc, sw(sx, sy), id, SHARED.paper.colour, SHARED.paper.width);
  }, SHARED.legend);
  row((sx, sy) => {
    doc.setDrawColor(...FENCE.paper.colour);
    doc.setLineWidth(FENCE.paper.width);
    doc.line(sx, sy, sx + 10, sy);
  }, FENCE.legend);
  row((sx, sy) => {
    doc.setDrawColor(...OPENING.paper.colour);
    doc.setLineWidth(OPENING.paper.width);
    doc.line(sx + 2, sy - 1.4, sx + 2, sy + 1.4);
    doc.line(sx + 8, sy - 1.4, sx + 8, sy + 1.4);
    doc.setLineWidth(OPENING.paper.gap.centreWidth);
    doc.setLineDashPattern([...OPENING.paper.gap.centreDash], 0);
    doc.line(sx + 2, sy, sx + 8, sy);
    doc.setLineDashPattern([], 0);
  }, OPENING.legend);
  row((sx, sy) => {
    fillPolygons(doc, sw(sx, sy), id, OPERATOR.paper.fill.colour, OPERATOR.paper.fill.opacity);
    strokePolygons(doc, sw(sx, sy), id, OPERATOR.paper.colour, OPERATOR.paper.width, [...OPERATOR.paper.dash]);
  }, OPERATOR.legend);
  row((sx, sy) => {
    for (const angle of KEEPOUT.paper.hatch.angles) hatchPolygons(doc, sw(sx, sy), id, KEEPOUT.paper.colour, KEEPOUT.paper.hatch.legendSpacing, angle, KEEPOUT.paper.hatch.width);
    strokePolygons(doc, sw(sx, sy), id, KEEPOUT.paper.colour, KEEPOUT.paper.width);
  }, KEEPOUT.legend);
  row((sx, sy) => {
    doc.setDrawColor(...POINT_REACHED.paper.colour);
    doc.setLineWidth(POINT_REACHED.paper.width);
    doc.line(sx + 4, sy - 0.9, sx + 6, sy + 0.9);
    doc.line(sx + 4, sy + 0.9, sx + 6, sy - 0.9);
    doc.setDrawColor(...POINT_UNREACHED.paper.colour);
    doc.line(sx + 7.5, sy - 0.9, sx + 9.5, sy + 0.9);
    doc.line(sx + 7.5, sy + 0.9, sx + 9.5, sy - 0.9);
  }, POINT_REACHED.legend);
  y += 1;
  // Arm colour key.
  const perCol = Math.ceil(arms.length / 2);
  arms.slice(0, 24).forEach((a, i) => {
    const c = ARM_COLOURS[i % ARM_COLOURS.length];
    const col = i < Math.min(perCol, 12) ? 0 : 1;
    const rowI = col === 0 ? i : i - Math.min(perCol, 12);
    const ax = x + col * (box.w / 2 - 2);
    const ay = y + rowI * 3.6;
    doc.setFillColor(c[0], c[1], c[2]);
    doc.rect(ax, ay - 2, 3, 2.2, 'F');
    label(doc, a.title.slice(0, 26), ax + 4.2, ay, 5.6, INK);
  });
  y += Math.min(perCol, 12) * 3.6 + (arms.length > 24 ? 3.6 : 0);
  if (arms.length > 24) label(doc, `… and ${arms.length - 24} more arms (see the arm schedule)`, x, y - 1, 5.6, GREY);
  return y - box.y + 2;
}

/** Draws the plan sheet's content: floor, regions, boundaries, arms, points, scale bar, reference arrow, legend. */
export function drawPlan(doc: jsPDF, frame: PageFrame, input: PlanSheetInput, arms: ArmSummary[], extent: Extent, n: number, sizeName: string): number {
  const area = drawingArea(frame);
  const toPaper = planToPaper(extent, area, n);
  doc.saveGraphicsState();
  doc.rect(area.x, area.y, area.w, area.h, null);
  doc.clip();
  doc.discardPath();
  drawFloor(doc, input, toPaper);
  drawArms(doc, arms, toPaper);
  for (const s of input.analysis.sharedZones) {
    const polys = geoJSONToPolygons(s.geometry);
    if (!polys.length) continue;
    for (const angle of SHARED.paper.hatch.angles) hatchPolygons(doc, polys, toPaper, SHARED.paper.colour, SHARED.paper.hatch.spacing, angle, SHARED.paper.hatch.width);
    strokePolygons(doc, polys, toPaper, SHARED.paper.colour, SHARED.paper.width);
  }
  drawBoundaries(doc, input.layout.content.boundaries, toPaper);
  drawPoints(doc, input, toPaper);
  doc.restoreGraphicsState();
  // Bottom strip: scale bar and ratio; the reference arrow in the drawing area's top-right corner.
  drawScaleBar(doc, area.x + 2, area.y + area.h + 6, n, sizeName);
  withOpacity(doc, 0.92, () => {
    doc.setFillColor(255, 255, 255);
    doc.circle(area.x + area.w - 9, area.y + 10, 7.5, 'F');
  });
  drawNorthArrow(doc, area.x + area.w - 9, area.y + 10);
  doc.setDrawColor(INK[0], INK[1], INK[2]);
  doc.setLineWidth(0.15);
  doc.line(frame.main.x, area.y + area.h + 2, frame.main.x + frame.main.w, area.y + area.h + 2);
  return drawLegend(doc, frame.side, arms, input.layout.content.workHeights[0]);
}
