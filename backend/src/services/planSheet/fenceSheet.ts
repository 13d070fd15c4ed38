import { fenceLinesOf, fenceParts, type FenceParts } from '@shared/analysis';
import { prepareFloor, type FloorLayer } from '@shared/analysis';
import { wallFacesOf } from '@shared/analysis';
import { DEFAULT_FENCE_SYSTEM } from '@shared/schemas/fenceProposal';
import { BOUNDARY_STYLES } from '@shared/style/boundaryStyles';
import { autoScale, planToPaper, type Box, type Extent } from './paper';
import { addLinePath } from './pdfPaths';
import { drawFloor, drawScaleBar, label } from './planDrawing';
import type { SheetPages } from './sheetPages';
import { drawTable, type Column, type Row } from './table';
import type { PlanSheetInput } from './types';

const { fence: FENCE, opening: OPENING } = BOUNDARY_STYLES;
const INK: [number, number, number] = [28, 34, 48];
const GREY: [number, number, number] = [110, 116, 126];
/** Above this many panels only every fifth number is printed on the plan (the table lists them all). */
const NUMBER_EVERY_LIMIT = 400;

/** Fence parts of the layout's fences, counted with the default fence system and the floor's walls. */
export function layoutFenceParts(input: PlanSheetInput): FenceParts {
  const floor = input.floorPlan ? prepareFloor(input.floorPlan.geometry, input.floorPlan.layers as FloorLayer[]) : null;
  return fenceParts(fenceLinesOf(input.layout.content.boundaries), DEFAULT_FENCE_SYSTEM, wallFacesOf(floor));
}

function fenceExtent(parts: FenceParts, fallback: Extent): Extent {
  const pts = [...parts.posts.map((p) => p.at), ...parts.panels.map((p) => p.at)];
  if (!pts.length) return fallback;
  const xs = pts.map((p) => p[0]), ys = pts.map((p) => p[1]);
  const pad = 1500;
  return { minX: Math.min(...xs) - pad, minY: Math.min(...ys) - pad, maxX: Math.max(...xs) + pad, maxY: Math.max(...ys) + pad };
}

/**
 * The fence-parts sheet: the fences drawn on the floor with every panel numbered and every post
 * marked, then the bill of materials and the panel list (the cautions are on every page).
 */
export function drawFenceParts(pages: SheetPages, input: PlanSheetInput, planExtentMm: Extent, planScale: number): void {
  const doc = pages.doc;
  const parts = layoutFenceParts(input);
  pages.newPage('Fence parts — plan', 'fences');
  const box = pages.contentBox();
  if (!parts.panels.length && !parts.doors.length) {
    label(doc, 'This cell layout has no fences to count.', box.x, box.y + 4, 8, GREY);
    return;
  }
  const area: Box = { x: box.x, y: box.y, w: box.w, h: box.h - 14 };
  const extent = fenceExtent(parts, planExtentMm);
  const n = Math.min(autoScale(extent, area), planScale);
  const toPaper = planToPaper(extent, area, n);
  doc.saveGraphicsState();
  doc.rect(area.x, area.y, area.w, area.h, null);
  doc.clip();
  doc.discardPath();
  drawFloor(doc, input, toPaper);
  const boundaries = input.layout.content.boundaries;
  for (const f of boundaries.filter((z) => z.kind === 'fence')) {
    doc.setDrawColor(...FENCE.paper.colour);
    doc.setLineWidth(FENCE.paper.width);
    addLinePath(doc, f.points, toPaper);
    doc.stroke();
  }
  for (const o of boundaries.filter((z) => z.kind === 'opening')) {
    const [a, b] = o.points.map(([x, y]) => toPaper(x, y));
    doc.setDrawColor(...OPENING.paper.gap.colour);
    doc.setLineWidth(OPENING.paper.gap.width);
    doc.line(a[0], a[1], b[0], b[1]);
    label(doc, `${o.id} door`, (a[0] + b[0]) / 2, (a[1] + b[1]) / 2 - 2, 5.5, OPENING.paper.label, true, 'center');
  }
  for (const p of parts.posts) {
    const [x, y] = toPaper(p.at[0], p.at[1]);
    doc.setFillColor(...(p.kind === 'line' ? GREY : INK));
    doc.rect(x - 0.5, y - 0.5, 1, 1, 'F');
  }
  const every = parts.panels.length > NUMBER_EVERY_LIMIT ? 5 : 1;
  for (const pn of parts.panels) {
    if (pn.n % every !== 0 && pn.n !== 1) continue;
    const [x, y] = toPaper(pn.at[0], pn.at[1]);
    // Numbers beside the line on its right-hand side (outside a counter-clockwise ring); paper y runs down.
    const a = (pn.angleDeg * Math.PI) / 180;
    label(doc, String(pn.n), x + Math.sin(a) * 2.4, y + Math.cos(a) * 2.4 + 0.9, 5, pn.cutFromMm == null ? INK : [150, 60, 20], pn.cutFromMm != null, 'center');
  }
  doc.restoreGraphicsState();
  drawScaleBar(doc, area.x + 2, area.y + area.h + 6, n, pages.size);
  label(doc, `Panels numbered along each fence from its first point; cut panels in brown, bold. Posts: dark = corner or wall-fixing, grey = line. Counted with panels of ${DEFAULT_FENCE_SYSTEM.panelWidthsMm.join(', ')} mm and ${DEFAULT_FENCE_SYSTEM.postWidthMm} mm posts.`, area.x + 2, area.y + area.h + 13.5, 6, GREY);

  pages.newPage('Fence parts — bill of materials', 'fences');
  const b2 = pages.contentBox();
  label(doc, `Total fence length ${(parts.lengthMm / 1000).toFixed(2)} m (doors included) · ${parts.panels.length} panels · ${parts.posts.length} posts · ${parts.doors.length} doors`, b2.x, b2.y + 2, 8, INK, true);
  const bomCols: Column[] = [
    { title: 'Item', width: 50 },
    { title: 'Size', width: 90 },
    { title: 'Quantity', width: 25, align: 'right' },
  ];
  const bomRows: Row[] = parts.bom.map((l) => ({ cells: [{ text: l.item, bold: true }, l.size, String(l.quantity)] }));
  drawTable(doc, { x: b2.x, y: b2.y + 5, w: Math.min(b2.w, 165), h: b2.h - 5 }, bomCols, bomRows, () => pages.continuePage());

  pages.newPage('Fence parts — panel list', 'fences');
  const listCols: Column[] = [
    { title: 'No.', width: 14, align: 'right' },
    { title: 'Fence', width: 30 },
    { title: 'Width mm', width: 22, align: 'right' },
    { title: 'Height mm', width: 22, align: 'right' },
    { title: 'Cut from mm', width: 24, align: 'right' },
  ];
  const listRows: Row[] = parts.panels.map((p) => ({ cells: [String(p.n), p.fenceId, String(p.widthMm), String(Math.round(p.heightMm)), p.cutFromMm == null ? '—' : String(p.cutFromMm)] }));
  drawTable(doc, { ...pages.contentBox(), w: Math.min(pages.contentBox().w, 112) }, listCols, listRows, () => pages.continuePage());
}
