// The fence-parts sheet of the demo, read back with pdfjs-dist (an independent PDF reader): the plan
// numbers every panel, the BOM page lists the counts, every page carries the cautions. Not part of
// the default sheet set (the pinned demo sheet stays as it is).
import { describe, expect, it } from 'vitest';
import { layoutFenceParts } from '../../../backend/src/services/planSheet/fenceSheet';
import { renderPlanSheet } from '../../../backend/src/services/planSheet';
import { DEFAULT_SHEET_KINDS } from '../../../backend/src/services/planSheet/types';
import { demoSheetInput } from '../../support/planSheetInput';

const pdfjs = await import('pdfjs-dist/legacy/build/pdf.mjs');

async function pageTexts(pdf: Buffer): Promise<string[]> {
  const doc = await pdfjs.getDocument({ data: new Uint8Array(pdf), useSystemFonts: false }).promise;
  const out: string[] = [];
  for (let i = 1; i <= doc.numPages; i++) {
    const tc = await (await doc.getPage(i)).getTextContent();
    out.push(tc.items.map((it) => ('str' in it ? it.str : '')).join(' ').replace(/\s+/g, ' '));
  }
  return out;
}

describe('fence-parts sheet', () => {
  it('draws the fences with numbered panels, then the bill of materials and the panel list', async () => {
    const input = demoSheetInput();
    const parts = layoutFenceParts(input);
    expect(parts.panels.length).toBeGreaterThan(10);
    const pdf = await renderPlanSheet(input, { size: 'A3', draft: true, createdAt: new Date('2026-03-02T09:00:00Z'), sheets: ['fences'] });
    const pages = await pageTexts(pdf);
    expect(pages[0]).toContain('Fence parts — plan');
    const numbers = new Set(pages[0].split(' '));
    for (const p of parts.panels) expect(numbers.has(String(p.n))).toBe(true);
    expect(pages[1]).toContain('Fence parts — bill of materials');
    expect(pages[1]).toContain(`${parts.panels.length} panels · ${parts.posts.length} posts · ${parts.doors.length} doors`);
    for (const line of parts.bom) expect(pages[1]).toContain(line.item);
    expect(pages[2]).toContain('Fence parts — panel list');
    for (const t of pages) {
      expect(t).toContain('ISO 12100');
      expect(t).toContain('competent person');
    }
    expect(DEFAULT_SHEET_KINDS).not.toContain('fences');
  });
});
