import type { jsPDF } from 'jspdf';
import { sheetText } from './fonts';
import type { Box } from './paper';
import type { Rgb } from './pdfPaths';
import { sheetTextWidth, TextBatch, type FontStyle } from './pdfText';

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

const INK: Rgb = [28, 34, 48];
const WHITE: Rgb = [255, 255, 255];

const asCell = (c: string | Cell): Cell => (typeof c === 'string' ? { text: c } : c);
/** Where a cell's text starts (left), ends (right) or is centred, paper mm. */
const textX = (c: Column, x: number) => (c.align === 'right' ? x + c.width - PAD_MM : c.align === 'center' ? x + c.width / 2 : x + PAD_MM);

/** Text cut to fit a width (paper mm) at the current font, with "…" when cut. */
function fitOneLine(doc: jsPDF, text: string, width: number, style: FontStyle): string {
  if (sheetTextWidth(doc, text, style, FONT_PT) <= width) return text;
  let lo = 0, hi = text.length;
  while (lo < hi) {
    const mid = Math.ceil((lo + hi) / 2);
    if (sheetTextWidth(doc, text.slice(0, mid) + '…', style, FONT_PT) <= width) lo = mid;
    else hi = mid - 1;
  }
  return text.slice(0, lo) + '…';
}

/** Lines of each cell and the row height, paper mm. */
function layoutRow(doc: jsPDF, cols: Column[], row: Row): { lines: string[][]; height: number } {
  doc.setFontSize(FONT_PT);
  const lines = cols.map((c, i) => {
    const cell = asCell(row.cells[i] ?? '');
    const style = cell.bold ? 'bold' : 'normal';
    const text = sheetText(cell.text);
    const inner = c.width - 2 * PAD_MM;
    if (!c.wrap) return [fitOneLine(doc, text, inner, style)];
    doc.setFont('Lato', style);
    return doc.splitTextToSize(text, inner) as string[];
  });
  const n = Math.max(1, ...lines.map((l) => l.length));
  return { lines, height: n * LINE_MM + 2 * PAD_MM };
}

function drawHeader(doc: jsPDF, cols: Column[], x: number, y: number): void {
  const w = cols.reduce((s, c) => s + c.width, 0);
  doc.setFillColor(40, 48, 64);
  doc.rect(x, y, w, HEAD_MM, 'F');
  const texts = new TextBatch(doc);
  let cx = x;
  for (const c of cols) {
    texts.add(sheetText(c.title), textX(c, cx), y + HEAD_MM - 2, 'bold', FONT_PT, WHITE, c.align);
    cx += c.width;
  }
  texts.flush();
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
  const texts = new TextBatch(doc);
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
    // Cell fills first, then the row's texts as one text object (a fill never covers a neighbour's text).
    let cx = box.x;
    cols.forEach((c, i) => {
      const cell = asCell(row.cells[i] ?? '');
      if (cell.fill) {
        doc.setFillColor(cell.fill[0], cell.fill[1], cell.fill[2]);
        doc.rect(cx, y, c.width, height, 'F');
      }
      cx += c.width;
    });
    cx = box.x;
    cols.forEach((c, i) => {
      const cell = asCell(row.cells[i] ?? '');
      const tx = textX(c, cx);
      lines[i].forEach((line, li) => texts.add(line, tx, y + PAD_MM + (li + 1) * LINE_MM - 0.7, cell.bold ? 'bold' : 'normal', FONT_PT, cell.colour ?? INK, c.align));
      cx += c.width;
    });
    texts.flush();
    doc.setDrawColor(214, 217, 224);
    doc.setLineWidth(0.1);
    doc.line(box.x, y + height, box.x + w, y + height);
    y += height;
  });
  return y;
}
