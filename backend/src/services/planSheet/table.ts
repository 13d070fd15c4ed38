import type { jsPDF } from 'jspdf';
import { sheetText } from './fonts';
import type { Box } from './paper';
import type { Rgb } from './pdfPaths';

export interface Column {
  title: string;
  /** Paper mm. */
  width: number;
  align?: 'left' | 'right' | 'center';
  /** Wrap long text onto more lines (other columns are cut to one line). */
  wrap?: boolean;
}

export interface Cell {
  text: string;
  colour?: Rgb;
  fill?: Rgb;
  bold?: boolean;
}

export interface Row {
  cells: Array<string | Cell>;
  /** Whole-row background. */
  fill?: Rgb;
}

const FONT_PT = 6.8;
const LINE_MM = 2.9;
const PAD_MM = 1.1;
const HEAD_MM = 6;

const asCell = (c: string | Cell): Cell => (typeof c === 'string' ? { text: c } : c);

/** Text cut to fit a width (paper mm) at the current font, with "…" when cut. */
function fitOneLine(doc: jsPDF, text: string, width: number): string {
  if (doc.getTextWidth(text) <= width) return text;
  let lo = 0, hi = text.length;
  while (lo < hi) {
    const mid = Math.ceil((lo + hi) / 2);
    if (doc.getTextWidth(text.slice(0, mid) + '…') <= width) lo = mid;
    else hi = mid - 1;
  }
  return text.slice(0, lo) + '…';
}

/** Lines of each cell and the row height, paper mm. */
function layoutRow(doc: jsPDF, cols: Column[], row: Row): { lines: string[][]; height: number } {
  doc.setFontSize(FONT_PT);
  const lines = cols.map((c, i) => {
    const cell = asCell(row.cells[i] ?? '');
    doc.setFont('Lato', cell.bold ? 'bold' : 'normal');
    const text = sheetText(cell.text);
    const inner = c.width - 2 * PAD_MM;
    return c.wrap ? (doc.splitTextToSize(text, inner) as string[]) : [fitOneLine(doc, text, inner)];
  });
  const n = Math.max(1, ...lines.map((l) => l.length));
  return { lines, height: n * LINE_MM + 2 * PAD_MM };
}

function drawHeader(doc: jsPDF, cols: Column[], x: number, y: number): void {
  const w = cols.reduce((s, c) => s + c.width, 0);
  doc.setFillColor(40, 48, 64);
  doc.rect(x, y, w, HEAD_MM, 'F');
  doc.setFont('Lato', 'bold');
  doc.setFontSize(FONT_PT);
  doc.setTextColor(255, 255, 255);
  let cx = x;
  for (const c of cols) {
    const tx = c.align === 'right' ? cx + c.width - PAD_MM : c.align === 'center' ? cx + c.width / 2 : cx + PAD_MM;
    doc.text(sheetText(c.title), tx, y + HEAD_MM - 2, { align: c.align ?? 'left' });
    cx += c.width;
  }
}

/**
 * Draws a table into boxes, asking for a new box (a new page) whenever the rows do not fit: header
 * row repeated on every page, rows banded, wrapped cells grow their row. Returns the y (paper mm)
 * below the last row on the last page.
 */
export function drawTable(doc: jsPDF, first: Box, cols: Column[], rows: Row[], nextBox: () => Box): number {
  let box = first;
  let y = box.y;
  drawHeader(doc, cols, box.x, y);
  y += HEAD_MM;
  const w = cols.reduce((s, c) => s + c.width, 0);
  rows.forEach((row, ri) => {
    const { lines, height } = layoutRow(doc, cols, row);
    if (y + height > box.y + box.h) {
      box = nextBox();
      y = box.y;
      drawHeader(doc, cols, box.x, y);
      y += HEAD_MM;
    }
    const fill = row.fill ?? (ri % 2 === 1 ? ([244, 245, 248] as Rgb) : null);
    if (fill) {
      doc.setFillColor(fill[0], fill[1], fill[2]);
      doc.rect(box.x, y, w, height, 'F');
    }
    let cx = box.x;
    cols.forEach((c, i) => {
      const cell = asCell(row.cells[i] ?? '');
      if (cell.fill) {
        doc.setFillColor(cell.fill[0], cell.fill[1], cell.fill[2]);
        doc.rect(cx, y, c.width, height, 'F');
      }
      doc.setFont('Lato', cell.bold ? 'bold' : 'normal');
      doc.setFontSize(FONT_PT);
      const col = cell.colour ?? [28, 34, 48];
      doc.setTextColor(col[0], col[1], col[2]);
      const tx = c.align === 'right' ? cx + c.width - PAD_MM : c.align === 'center' ? cx + c.width / 2 : cx + PAD_MM;
      lines[i].forEach((line, li) => doc.text(line, tx, y + PAD_MM + (li + 1) * LINE_MM - 0.7, { align: c.align ?? 'left' }));
      cx += c.width;
    });
    doc.setDrawColor(214, 217, 224);
    doc.setLineWidth(0.1);
    doc.line(box.x, y + height, box.x + w, y + height);
    y += height;
  });
  return y;
}
