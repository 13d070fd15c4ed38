// One rule for "reached" (margin ≥ 0 mm, decided on the unrounded margin) seen the same way by
// the analysis JSON, the editor's work-point and coverage models, and the plan sheet's text.
// The margins are set exactly (a reach whose margin function returns chosen values), so the
// boundary cases are hit without floating-point luck: 0 mm, −0.03 mm (rounds to −0.0 at 0.1 mm)
// and +0.04 mm (rounds to 0.0).
import { describe, expect, it } from 'vitest';
import { createAnalyzer, isReached, roundMargin, type AnalysisResult } from '@shared/analysis';
import { armReachFor } from '@shared/analysis/armReach';
import type { LayoutContent } from '@shared/schemas/layout';
import { renderPlanSheet } from '../../../backend/src/services/planSheet';
import { workPointRows } from '../../../frontend/src/components/layout/workPointRows';
import { buildCoverageMatrix } from '../../../frontend/src/components/layout/coverageMatrixModel';
import { demoSheetInput } from '../../support/planSheetInput';

const pdfjs = await import('pdfjs-dist/legacy/build/pdf.mjs');

// Margin by point height (arm frame z, mm): the case under test.
const MARGIN_BY_Z: Record<number, number> = { 100: 0, 200: -0.03, 300: 0.04, 400: -12.3 };

function analyse(): { content: LayoutContent; analysis: AnalysisResult } {
  const base = demoSheetInput();
  const scara = base.models.find((m) => m.name === 'Demo SCARA 600')!;
  const content: LayoutContent = {
    ...base.layout.content,
    arms: [{ id: 'R1', armModelId: scara.id, label: 'Picker', x: 10000, y: 8000, yaw: 0, mountHeight: 0 }],
    workPoints: Object.keys(MARGIN_BY_Z).map((z, i) => ({ id: `Q${i + 1}`, x: 10300, y: 8000, z: Number(z), approach: 'top' as const, tag: '' })),
    boundaries: [],
  };
  const analyzer = createAnalyzer((_id, restrict) => {
    const real = armReachFor(scara.params, restrict);
    return { ...real, margin: (_x: number, _y: number, z: number) => MARGIN_BY_Z[Math.round(z)] ?? -5000 };
  });
  const analysis = analyzer.analyze({ arms: content.arms, workPoints: content.workPoints, boundaries: content.boundaries, workHeights: content.workHeights, floor: null });
  return { content, analysis };
}

describe('reached', () => {
  it('is margin ≥ 0, and rounding for display never crosses it', () => {
    expect(isReached(0)).toBe(true);
    expect(isReached(-0)).toBe(true);
    expect(isReached(-0.03)).toBe(false);
    expect(roundMargin(-0.03)).toBe(-0.1);
    expect(Object.is(roundMargin(-0), 0)).toBe(true);
    expect(roundMargin(0.04)).toBe(0);
    expect(roundMargin(-12.34)).toBe(-12.3);
    expect(roundMargin(12.36)).toBe(12.4);
  });

  it('gives the same verdict for 0 mm, −0.03 mm and +0.04 mm in the analysis JSON, the editor model and the PDF', async () => {
    const { content, analysis } = analyse();
    // Analysis JSON (as the API sends it).
    const json = JSON.parse(JSON.stringify(analysis)) as AnalysisResult;
    expect(json.coverage.Q1.R1).toBe(0);
    expect(json.coverage.Q2.R1).toBe(-0.1);
    expect(json.coverage.Q3.R1).toBe(0);
    const unreached = json.findings.filter((f) => f.kind === 'unreached-point').map((f) => f.points[0]);
    expect(unreached).toEqual(['Q2', 'Q4']);

    // Editor: work-points table rows and the coverage matrix, from the JSON the worker would post.
    const rows = workPointRows(content.workPoints, ['R1'], json);
    expect(rows.map((r) => r.reachedBy.length)).toEqual([1, 0, 1, 0]);
    const matrix = buildCoverageMatrix(content.workPoints, ['R1'], json.coverage, { by: 'layout' });
    expect(matrix.unreached).toBe(2);

    // Plan sheet: the coverage table says "not reached" for exactly Q2 and Q4.
    const input = { ...demoSheetInput(), layout: { id: 1, name: 'Boundary cases', content }, analysis: json };
    const pdf = await renderPlanSheet(input, { size: 'A3', draft: true, createdAt: new Date('2026-03-02T09:00:00Z'), sheets: ['coverage'] });
    const doc = await pdfjs.getDocument({ data: new Uint8Array(pdf), useSystemFonts: false }).promise;
    const page = await doc.getPage(1);
    const items = (await page.getTextContent()).items.map((it) => ('str' in it ? it.str : '')).filter((s) => s.trim());
    const verdictOf = (id: string) => {
      const i = items.indexOf(id);
      expect(i, `row ${id} on the coverage sheet`).toBeGreaterThanOrEqual(0);
      return items.slice(i, i + 8).find((s) => s === 'not reached' || /^\d+ arms?$/.test(s));
    };
    expect(['Q1', 'Q2', 'Q3', 'Q4'].map(verdictOf)).toEqual(['1 arm', 'not reached', '1 arm', 'not reached']);
  });
});
