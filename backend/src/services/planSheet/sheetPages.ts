import type { jsPDF } from 'jspdf';
import { sheetText } from './fonts';
import { pageFrame, type Box, type PageFrame } from './paper';
import { withOpacity } from './pdfPaths';
import { sheetTextWidth, TextBatch } from './pdfText';
import type { Column } from './table';
import type { PlanSheetInput, SheetKind, SheetSize } from './types';
import { revisionStateLabel } from '@shared/words';
import { CAUTIONS } from '@shared/safety';

/** The cautions every page carries (one wording for every output: shared/safety/cautions.ts). */
export { CAUTIONS };
export const DRAFT_MARK = 'DRAFT — not for construction';

const INK = [28, 34, 48] as const;
const GREY = [110, 116, 126] as const;

interface PageInfo {
  title: string;
  kind: SheetKind;
  /** Height of the side column's top part already used (legend), mm. */
  sideUsed: number;
}

/** Pages of one sheet set: adds pages, hands out content boxes, and at the end draws every page's frame. */
export class SheetPages {
  readonly frame: PageFrame;
  readonly pages: PageInfo[] = [];
  /** The page furniture's texts, written per part of the page (frame, title block, cautions, index). */
  private readonly texts: TextBatch;

  constructor(
    readonly doc: jsPDF,
    readonly size: SheetSize,
  ) {
    this.frame = pageFrame(size);
    this.texts = new TextBatch(doc);
  }

  /** Starts a new page of a sheet (the document's first page is used for the first sheet). */
  newPage(title: string, kind: SheetKind): void {
    if (this.pages.length > 0) this.doc.addPage(this.size.toLowerCase(), 'landscape');
    this.pages.push({ title, kind, sideUsed: 0 });
  }

  /** A further page of the current sheet ("(continued)"); returns its content box. */
  continuePage(): Box {
    const cur = this.pages[this.pages.length - 1];
    const base = cur.title.replace(/ \(continued\)$/, '');
    this.newPage(`${base} (continued)`, cur.kind);
    return this.contentBox();
  }

  /** Marks how much of the side column's top the current page used (legend), mm. */
  useSide(mm: number): void {
    this.pages[this.pages.length - 1].sideUsed = mm;
  }

  /** Where a table page puts its rows (below the sheet heading), paper mm. */
  contentBox(): Box {
    const m = this.frame.main;
    return { x: m.x + 5, y: m.y + 14, w: m.w - 10, h: m.h - 19 };
  }

  /** Columns scaled to the content width (a table fills the page width whatever the paper). */
  fit(cols: Column[]): Column[] {
    const total = cols.reduce((s, c) => s + c.width, 0);
    const k = this.contentBox().w / total;
    return cols.map((c) => ({ ...c, width: c.width * k }));
  }

  /** Draws frames, headings, the cautions, the title block and (draft) the diagonal mark on every page. */
  finish(input: PlanSheetInput, o: { createdAt: Date; draft: boolean; scale: number | null }): void {
    const n = this.pages.length;
    const cautions = this.cautionLines();
    this.pages.forEach((p, i) => {
      this.doc.setPage(i + 1);
      this.drawFrame(p);
      const tbTop = this.drawTitleBlock(input, p, i + 1, n, o);
      this.drawCautions(tbTop, cautions);
      if (p.kind !== 'plan') this.drawSheetIndex(i);
      this.texts.flush();
      if (o.draft) this.drawDraftMark();
    });
  }

  private text(s: string, x: number, y: number, pt: number, bold = false, rgb: readonly number[] = INK, align: 'left' | 'right' | 'center' = 'left'): void {
    this.texts.add(sheetText(s), x, y, bold ? 'bold' : 'normal', pt, rgb, align);
  }

  private drawFrame(p: PageInfo): void {
    const { border, side, main } = this.frame;
    const d = this.doc;
    d.setDrawColor(INK[0], INK[1], INK[2]);
    d.setLineWidth(0.6);
    d.rect(border.x, border.y, border.w, border.h, 'S');
    d.setLineWidth(0.3);
    d.line(side.x, side.y, side.x, side.y + side.h);
    // Thin outer trim line 3 mm outside the border.
    d.setLineWidth(0.1);
    d.rect(border.x - 3, border.y - 3, border.w + 6, border.h + 6, 'S');
    if (p.kind !== 'plan') this.text(p.title, main.x + 5, main.y + 9, 12, true);
    this.texts.flush();
  }

  /** Title block at the bottom of the side column; returns its top y, mm. */
  private drawTitleBlock(input: PlanSheetInput, p: PageInfo, i: number, n: number, o: { createdAt: Date; scale: number | null }): number {
    const { side } = this.frame;
    const d = this.doc;
    const rowH = 8.2;
    const rev = input.revision;
    const cells: Array<Array<{ label: string; value: string; bold?: boolean }>> = [
      [{ label: 'Project', value: input.project.name, bold: true }],
      [{ label: 'Client', value: input.project.clientName || '—' }],
      [{ label: 'Site', value: input.project.siteName || '—' }],
      [{ label: 'Cell layout', value: input.layout.name, bold: true }],
      [
        { label: 'Revision', value: rev ? `${rev.letter} — ${revisionStateLabel(rev.state).toLowerCase()}` : 'working copy', bold: true },
        { label: 'Date', value: o.createdAt.toISOString().slice(0, 10) },
      ],
      [
        { label: 'Drawn by', value: input.drawnBy || '—' },
        { label: 'Reviewed by', value: input.reviewedBy || '—' },
      ],
      [
        { label: 'Scale', value: p.kind === 'plan' && o.scale ? `1:${o.scale} at ${this.size}` : `not to scale · ${this.size}` },
        { label: 'Sheet', value: `${i} of ${n}`, bold: true },
      ],
      [{ label: 'Sheet title', value: p.title }],
    ];
    const headH = 7;
    const h = headH + rowH * cells.length;
    const top = side.y + side.h - h;
    d.setFillColor(40, 48, 64);
    d.rect(side.x, top, side.w, headH, 'F');
    this.text('RINGFENCE', side.x + 3, top + 4.9, 8.5, true, [255, 255, 255]);
    this.text('workcell plan sheet', side.x + side.w - 3, top + 4.9, 6.5, false, [200, 206, 218], 'right');
    d.setDrawColor(INK[0], INK[1], INK[2]);
    d.setLineWidth(0.3);
    d.line(side.x, top, side.x + side.w, top);
    cells.forEach((row, r) => {
      const y = top + headH + r * rowH;
      d.setLineWidth(0.12);
      d.line(side.x, y, side.x + side.w, y);
      const w = side.w / row.length;
      row.forEach((c, ci) => {
        const x = side.x + ci * w;
        if (ci > 0) d.line(x, y, x, y + rowH);
        this.text(c.label.toUpperCase(), x + 2, y + 2.9, 4.6, false, GREY);
        let v = sheetText(c.value);
        while (v.length > 1 && sheetTextWidth(d, v, c.bold ? 'bold' : 'normal', 7.6) > w - 4) v = v.slice(0, -2) + '…';
        this.text(v, x + 2, y + 6.6, 7.6, c.bold);
      });
    });
    this.texts.flush();
    return top;
  }

  /** The cautions broken into lines of the cautions box (the same on every page). */
  private cautionLines(): string[][] {
    const d = this.doc;
    d.setFont('Lato', 'normal');
    d.setFontSize(6);
    const inner = this.frame.side.w - 8;
    return CAUTIONS.map((c) => d.splitTextToSize(sheetText(c), inner - 3) as string[]);
  }

  private drawCautions(bottom: number, lines: string[][]): void {
    const { side } = this.frame;
    const d = this.doc;
    const lineH = 2.55;
    const h = 9 + lines.reduce((s, l) => s + l.length * lineH + 0.8, 0);
    const top = bottom - h - 2;
    d.setFillColor(255, 247, 230);
    d.setDrawColor(200, 140, 20);
    d.setLineWidth(0.3);
    d.rect(side.x + 2, top, side.w - 4, h, 'FD');
    this.text('Cautions — read before use', side.x + 4, top + 4.6, 7, true, [120, 70, 0]);
    let y = top + 8.6;
    lines.forEach((l) => {
      this.text('•', side.x + 4, y, 6, true, [120, 70, 0]);
      l.forEach((line) => {
        this.text(line, side.x + 7, y, 6, false, INK);
        y += lineH;
      });
      y += 0.8;
    });
    this.texts.flush();
  }

  /** On table pages: the list of this set's sheets, the current one marked. */
  private drawSheetIndex(current: number): void {
    const { side } = this.frame;
    this.text('Sheets in this set', side.x + 4, side.y + 6, 8, true);
    const max = Math.min(this.pages.length, 28);
    for (let i = 0; i < max; i++) {
      const p = this.pages[i];
      this.text(`${i + 1}  ${p.title}`.slice(0, 60), side.x + 4, side.y + 11 + i * 3.6, 5.6, i === current, i === current ? INK : GREY);
    }
    if (this.pages.length > max) this.text(`… ${this.pages.length - max} more`, side.x + 4, side.y + 11 + max * 3.6, 5.6, false, GREY);
  }

  private drawDraftMark(): void {
    const { paper } = this.frame;
    const d = this.doc;
    const pt = paper.w / 420 * 64;
    d.setFont('Lato', 'bold');
    d.setFontSize(pt);
    const w = d.getTextWidth(DRAFT_MARK);
    const angle = Math.atan2(paper.h, paper.w) * 0.8;
    const cx = paper.w / 2, cy = paper.h / 2;
    // jsPDF turns text counter-clockwise on the page; start point so that the line's middle is the page centre.
    const x = cx - (w / 2) * Math.cos(angle);
    const y = cy + (w / 2) * Math.sin(angle);
    withOpacity(d, 0.13, () => {
      d.setTextColor(196, 40, 40);
      d.text(DRAFT_MARK, x, y, { angle: (angle * 180) / Math.PI });
    });
  }
}
