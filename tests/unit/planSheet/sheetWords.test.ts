// The plan sheet speaks the glossary (docs/glossary.md), not the stored values: revision states on
// the title block, the history table and the PDF properties, model families in the arm schedule,
// severities in the findings, and a "not given" where a model has no stopping data. Read back with
// pdfjs-dist (an independent PDF reader). The product's own words; no outside source applies.
import { describe, expect, it } from 'vitest';
import { renderPlanSheet } from '../../../backend/src/services/planSheet';
import { demoSheetInput } from '../../support/planSheetInput';

const pdfjs = await import('pdfjs-dist/legacy/build/pdf.mjs');

async function read(pdf: Buffer): Promise<{ text: string; subject: string }> {
  const doc = await pdfjs.getDocument({ data: new Uint8Array(pdf), useSystemFonts: false }).promise;
  const pages: string[] = [];
  for (let i = 1; i <= doc.numPages; i++) {
    const tc = await (await doc.getPage(i)).getTextContent();
    pages.push(tc.items.map((it) => ('str' in it ? it.str : '')).join(' '));
  }
  const meta = await doc.getMetadata();
  return { text: pages.join(' ').replace(/\s+/g, ' '), subject: String((meta.info as { Subject?: string }).Subject ?? '') };
}

describe('plan sheet words', () => {
  it('names states, families and severities in words and says when stopping data is not given', async () => {
    const input = demoSheetInput();
    const at = new Date('2026-11-20T09:00:00Z');
    input.revision = { letter: 'B', state: 'signed_off', submittedBy: 'Pat Planner', decidedBy: 'Riley Reviewer', decidedAt: at, releasedAt: null };
    input.history = [
      { letter: 'A', state: 'returned', at, by: 'Riley Reviewer', note: 'Move the palletizer.' },
      // Stored before the states were renamed: read the same.
      { letter: 'A0', state: 'changes_requested', at, by: 'Riley Reviewer', note: null },
      { letter: 'B', state: 'signed_off', at, by: 'Riley Reviewer', note: null },
    ];
    // One model without stopping data.
    const scara = input.models.find((m) => m.family === 'scara')!;
    delete scara.params.stopTimeS;
    delete scara.params.stopTimeCat1S;
    const { text, subject } = await read(await renderPlanSheet(input, { size: 'A3', draft: true, createdAt: at }));

    expect(subject).toBe('Revision B (signed off)');
    expect(text).toContain('B — signed off');
    expect(text).toMatch(/A Returned for changes/);
    expect(text).toMatch(/A0 Returned for changes/);
    expect(text).toMatch(/B Signed off/);
    for (const raw of ['changes_requested', 'signed_off', ' returned ']) expect(text).not.toContain(raw);
    // Families as the catalogue names them.
    expect(text).toContain('Linkage-driven');
    expect(text).toContain('Articulated');
    expect(text).not.toMatch(/\blinkage\b|\barticulated\b/);
    // Severities in words; the lightest one is a "Note".
    expect(text).toMatch(/\bNote\b/);
    expect(text).not.toMatch(/\binfo\b|\bcritical\b|\bwarning\b/);
    // The schedule says where stopping data is missing instead of leaving a bare dash.
    expect(text).toMatch(/Demo SCARA 600[^]*?not given/);
  }, 60_000);
});

describe('plan sheet reference direction and empty findings', () => {
  it('marks plan north (+y), and an empty findings page lists what was checked', async () => {
    const input = demoSheetInput();
    input.analysis = { ...input.analysis, findings: [] };
    const { text } = await read(await renderPlanSheet(input, { size: 'A3', draft: true, createdAt: new Date('2026-11-20T09:00:00Z'), sheets: ['plan', 'findings'] }));
    expect(text).toContain('Plan north (+y)');
    expect(text).toContain('PN');
    expect(text).toContain('No findings from the checks run on this cell layout:');
    expect(text).toContain('shared zones of every pair of arms');
    expect(text).not.toContain('The checks found nothing');
  }, 60_000);
});
