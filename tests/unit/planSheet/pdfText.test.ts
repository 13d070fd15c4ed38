// The sheets' batched text and path writer (backend/src/services/planSheet/pdfText.ts) against
// jsPDF's own text(), moveTo/lineTo and getTextWidth: the same strings at the same places, left,
// right and centre aligned, in both faces and several colours, the same path numbers. Read back
// with pdfjs-dist (an independent PDF reader) for the text; the path operators are compared in the
// uncompressed page content. No outside figures: the reference is the general-purpose library itself.
import { jsPDF } from 'jspdf';
import { describe, expect, it } from 'vitest';
import { embedLato, sheetText } from '../../../backend/src/services/planSheet/fonts';
import { pathWriter, pdfNum, sheetTextWidth, TextBatch, type Align, type FontStyle } from '../../../backend/src/services/planSheet/pdfText';

const pdfjs = await import('pdfjs-dist/legacy/build/pdf.mjs');

interface Sample {
  text: string;
  x: number;
  y: number;
  style: FontStyle;
  pt: number;
  rgb: [number, number, number];
  align: Align;
}

const SAMPLES: Sample[] = [
  { text: 'P1.1', x: 20, y: 30, style: 'bold', pt: 6.8, rgb: [28, 34, 48], align: 'left' },
  { text: 'station 1', x: 40, y: 30, style: 'normal', pt: 6.8, rgb: [28, 34, 48], align: 'left' },
  { text: '+584', x: 90, y: 30, style: 'normal', pt: 6.8, rgb: [20, 100, 50], align: 'right' },
  { text: sheetText('\u2212227 — not reached'), x: 140, y: 30, style: 'bold', pt: 6.8, rgb: [170, 30, 30], align: 'right' },
  { text: 'Critical', x: 180, y: 41.5, style: 'bold', pt: 6.8, rgb: [255, 255, 255], align: 'center' },
  { text: sheetText('Zürich – 12 m² ±0,5 °'), x: 25.25, y: 120.125, style: 'normal', pt: 12, rgb: [110, 116, 126], align: 'left' },
  { text: 'RINGFENCE', x: 300, y: 250, style: 'bold', pt: 8.5, rgb: [255, 255, 255], align: 'left' },
];

function newDoc(): jsPDF {
  const doc = new jsPDF({ orientation: 'landscape', unit: 'mm', format: 'a3', compress: false, putOnlyUsedFonts: true, floatPrecision: 3 });
  embedLato(doc);
  return doc;
}

async function items(pdf: ArrayBuffer) {
  const doc = await pdfjs.getDocument({ data: new Uint8Array(pdf), useSystemFonts: false }).promise;
  const tc = await (await doc.getPage(1)).getTextContent();
  // Gaps between texts of one text object come back as blank items; the strings are what counts.
  return tc.items.flatMap((it) => ('str' in it && it.str.trim() ? [{ str: it.str, x: it.transform[4], y: it.transform[5], size: it.transform[0], width: it.width }] : []));
}

describe('batched sheet text', () => {
  it('puts the same strings at the same places as jsPDF text()', async () => {
    const ref = newDoc();
    for (const s of SAMPLES) {
      ref.setFont('Lato', s.style);
      ref.setFontSize(s.pt);
      ref.setTextColor(...s.rgb);
      ref.text(s.text, s.x, s.y, { align: s.align });
    }
    const mine = newDoc();
    const batch = new TextBatch(mine);
    for (const s of SAMPLES) batch.add(s.text, s.x, s.y, s.style, s.pt, s.rgb, s.align);
    batch.flush();

    const a = await items(ref.output('arraybuffer'));
    const b = await items(mine.output('arraybuffer'));
    expect(b.map((i) => i.str)).toEqual(SAMPLES.map((s) => s.text));
    expect(b.map((i) => i.str)).toEqual(a.map((i) => i.str));
    a.forEach((r, i) => {
      expect(b[i].x).toBeCloseTo(r.x, 2); // pt; both round to 0.001 pt
      expect(b[i].y).toBeCloseTo(r.y, 2);
      expect(b[i].size).toBeCloseTo(r.size, 6);
      expect(b[i].width).toBeCloseTo(r.width, 6);
    });
    // One text object for the batch, after the first text of each face (jsPDF's, which marks the font as used).
    const content = mine.output();
    expect(content.match(/\nBT\n/g)?.length).toBe(3);
  });

  it('measures as jsPDF getTextWidth does', () => {
    const doc = newDoc();
    for (const s of SAMPLES) {
      doc.setFont('Lato', s.style);
      doc.setFontSize(s.pt);
      expect(sheetTextWidth(doc, s.text, s.style, s.pt)).toBe(doc.getTextWidth(s.text));
    }
  });

  it('writes path numbers as jsPDF moveTo/lineTo write them', () => {
    const pts: Array<[number, number]> = [[10, 10], [10.0004, 20.12345], [200.5, 280.9999], [-3.25, 0]];
    const ref = newDoc();
    ref.moveTo(...pts[0]);
    for (const p of pts.slice(1)) ref.lineTo(...p);
    ref.close();
    ref.stroke();
    const mine = newDoc();
    const path = pathWriter(mine);
    path.move(...pts[0]);
    for (const p of pts.slice(1)) path.line(...p);
    path.close();
    path.flush();
    mine.stroke();
    const ops = (d: jsPDF) => d.output().match(/^[-\d. ]+ [ml]$|^h$/gm);
    expect(ops(mine)).toEqual(ops(ref));
    expect(ops(mine)).toHaveLength(5);
  });

  it('rounds numbers as jsPDF does at floatPrecision 3', () => {
    const doc = newDoc() as unknown as { hpf(v: number): string };
    for (const v of [0, 1, -1, 0.1, 2.5, 45.6375, 762.52, -0.0004, 1190.55, 123456.789]) expect(pdfNum(v)).toBe(doc.hpf(v));
  });
});
