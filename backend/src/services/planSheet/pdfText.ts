/**
 * Text and paths written into the page's content in one go, for the many small items of the sheets
 * (table cells, title blocks, region outlines). jsPDF's `text()` runs every string through its whole
 * pipeline (shaping, bidi, escaping, one BT…ET text object each) and `moveTo`/`lineTo` write one
 * operator per call; here a row of cells becomes one text object and a path one write. The glyphs,
 * positions and numbers are those jsPDF writes: strings are encoded by jsPDF's own Identity-H
 * encoder (`pdfEscape16`, which also records the glyphs for the font subset and the ToUnicode map,
 * so text stays extractable), widths come from `getStringUnitWidth`, numbers are rounded as jsPDF
 * rounds them (floatPrecision 3). Text must be fit for the sheet font already (`sheetText`).
 */
import type { jsPDF } from 'jspdf';
import { SHEET_FONT } from './fonts';

/** The jsPDF members used here beside its typed API (present in jsPDF 4: utf8 plugin and `internal`). */
interface PdfFont {
  id: string;
  encoding: string;
  metadata: { cmap?: { unicode: { codeMap: Record<number, number | undefined> } } };
}
interface DocInternals {
  pdfEscape16(text: string, font: PdfFont): string;
  getFont(name: string, style: string): PdfFont;
  internal: {
    write(s: string): void;
    scaleFactor: number;
    pageSize: { getHeight(): number };
    getCurrentPageInfo(): { pageContext: { mediaBox: { topRightY: number; bottomLeftY: number } } };
  };
}
const inner = (doc: jsPDF) => doc as unknown as DocInternals;

/** A number as jsPDF writes it with floatPrecision 3 (fixed to 3 decimals, trailing zeros cut). */
export function pdfNum(v: number): string {
  const s = v.toFixed(3);
  let end = s.length;
  while (s.charCodeAt(end - 1) === 48) end--; // '0'
  return end === s.length ? s : s.slice(0, end);
}

export type FontStyle = 'normal' | 'bold';
export type Align = 'left' | 'right' | 'center';

/** Per-document caches: encoded strings and unit widths per font, and the fonts marked as used. */
interface DocCache {
  fonts: Map<FontStyle, PdfFont>;
  hex: Map<string, string>;
  width: Map<string, number>;
  marked: Set<string>;
}
const caches = new WeakMap<jsPDF, DocCache>();

function cacheOf(doc: jsPDF): DocCache {
  let c = caches.get(doc);
  if (!c) {
    c = { fonts: new Map(), hex: new Map(), width: new Map(), marked: new Set() };
    caches.set(doc, c);
  }
  return c;
}

function fontOf(doc: jsPDF, style: FontStyle): PdfFont {
  const c = cacheOf(doc);
  let f = c.fonts.get(style);
  if (!f) {
    f = inner(doc).getFont(SHEET_FONT, style);
    c.fonts.set(style, f);
  }
  return f;
}

/** Width of a text in the sheet font, paper mm (jsPDF's `getTextWidth` for that font and size, cached per string). */
export function sheetTextWidth(doc: jsPDF, text: string, style: FontStyle, pt: number): number {
  const c = cacheOf(doc);
  const font = fontOf(doc, style);
  const key = `${font.id}\u0000${text}`;
  let unit = c.width.get(key);
  if (unit === undefined) {
    unit = doc.getStringUnitWidth(text, { font, fontSize: pt, charSpace: 0 });
    c.width.set(key, unit);
  }
  return (unit * pt) / inner(doc).internal.scaleFactor;
}

/** The Identity-H hex string of a text, as jsPDF's utf8 plugin makes it (characters the font lacks above U+00FF are left out, as jsPDF does). */
function encoded(doc: jsPDF, font: PdfFont, text: string): string {
  const c = cacheOf(doc);
  const key = `${font.id}\u0000${text}`;
  let hex = c.hex.get(key);
  if (hex === undefined) {
    const codeMap = font.metadata.cmap?.unicode.codeMap;
    let kept = '';
    for (const ch of text) {
      const code = ch.charCodeAt(0);
      if (!codeMap || codeMap[code] || code < 256) kept += ch;
    }
    hex = inner(doc).pdfEscape16(kept, font);
    c.hex.set(key, hex);
  }
  return hex;
}

interface Item {
  text: string;
  x: number;
  y: number;
  style: FontStyle;
  pt: number;
  rgb: readonly number[];
  align: Align;
}

/**
 * Texts of one batch (a table row, a title block), written as one text object by `flush()` in the
 * order added. Flush before drawing anything that may overlap the texts, so the stacking stays.
 */
export class TextBatch {
  private items: Item[] = [];

  constructor(private readonly doc: jsPDF) {}

  add(text: string, x: number, y: number, style: FontStyle, pt: number, rgb: readonly number[], align: Align = 'left'): void {
    if (text.length) this.items.push({ text, x, y, style, pt, rgb, align });
  }

  flush(): void {
    const items = this.items;
    if (!items.length) return;
    this.items = [];
    const doc = this.doc;
    const d = inner(doc);
    const k = d.internal.scaleFactor;
    const box = d.internal.getCurrentPageInfo().pageContext.mediaBox;
    const pageH = box.topRightY - box.bottomLeftY;
    const c = cacheOf(doc);
    const out: string[] = ['BT'];
    let font = '';
    let rgb: number[] = [-1, -1, -1];
    // Line start in thousandths of a point: Td after the first moves relative to the one before.
    let px = 0, py = 0;
    for (const it of items) {
      const f = fontOf(doc, it.style);
      if (!c.marked.has(f.id)) {
        // The font's first text in this document goes through jsPDF's text(), which marks the font
        // as used (only used fonts are written, putOnlyUsedFonts).
        c.marked.add(f.id);
        if (out.length > 1) {
          out.push('ET');
          d.internal.write(out.join('\n'));
          out.length = 1; // 'BT'
        }
        font = '';
        rgb = [-1, -1, -1];
        px = py = 0;
        doc.setFont(SHEET_FONT, it.style);
        doc.setFontSize(it.pt);
        doc.setTextColor(it.rgb[0], it.rgb[1], it.rgb[2]);
        doc.text(it.text, it.x, it.y, { align: it.align });
        continue;
      }
      const fk = `/${f.id} ${it.pt} Tf`;
      if (fk !== font) out.push((font = fk));
      const [r, g, b] = it.rgb;
      if (r !== rgb[0] || g !== rgb[1] || b !== rgb[2]) {
        rgb = [r, g, b];
        out.push(`${pdfNum(r / 255)} ${pdfNum(g / 255)} ${pdfNum(b / 255)} rg`);
      }
      let x = it.x;
      if (it.align !== 'left') {
        const w = sheetTextWidth(doc, it.text, it.style, it.pt);
        x -= it.align === 'right' ? w : w / 2;
      }
      const ax = Math.round(x * k * 1000), ay = Math.round((pageH - it.y * k) * 1000);
      out.push(`${pdfNum((ax - px) / 1000)} ${pdfNum((ay - py) / 1000)} Td`, `<${encoded(doc, f, it.text)}> Tj`);
      px = ax;
      py = ay;
    }
    if (out.length === 1) return;
    out.push('ET');
    d.internal.write(out.join('\n'));
  }
}

/** Paper mm → the page's PDF points as jsPDF's moveTo/lineTo write them (x·k, (page height − y)·k). */
export function pathWriter(doc: jsPDF): { move(x: number, y: number): void; line(x: number, y: number): void; close(): void; flush(): void } {
  const d = inner(doc);
  const k = d.internal.scaleFactor;
  const h = d.internal.pageSize.getHeight();
  let ops: string[] = [];
  const pt = (x: number, y: number) => `${pdfNum(x * k)} ${pdfNum((h - y) * k)}`;
  return {
    move: (x, y) => void ops.push(`${pt(x, y)} m`),
    line: (x, y) => void ops.push(`${pt(x, y)} l`),
    close: () => void ops.push('h'),
    flush: () => {
      if (ops.length) d.internal.write(ops.join('\n'));
      ops = [];
    },
  };
}
