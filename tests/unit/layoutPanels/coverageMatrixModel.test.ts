import { color, scaleLinear } from 'd3';
import { describe, expect, it } from 'vitest';
import {
  buildCoverageMatrix,
  cellAt,
  MARGIN_COLOURS,
  marginColourScale,
  marginScaleSpan,
  visibleRows,
} from '../../../frontend/src/components/layout/coverageMatrixModel';

const points = ['P1', 'P2', 'P3', 'P4', 'P5'].map((id) => ({ id }));
const arms = ['R1', 'R2'];
const coverage = {
  P1: { R1: 50, R2: -10 },
  P2: { R1: -300, R2: -120 },
  P3: { R1: 5, R2: 400 },
  // P4 not analysed (added after the last run)
  P5: { R1: -300, R2: -120 },
};

describe('buildCoverageMatrix', () => {
  it('keeps layout order and lays margins out row by row, NaN where not analysed', () => {
    const m = buildCoverageMatrix(points, arms, coverage, { by: 'layout' });
    expect(m.ids).toEqual(['P1', 'P2', 'P3', 'P4', 'P5']);
    expect(Array.from(m.margins.slice(0, 6))).toEqual([50, -10, -300, -120, 5, 400]);
    expect(Number.isNaN(m.margins[6]) && Number.isNaN(m.best[3])).toBe(true);
    expect(Array.from(m.best)).toEqual([50, -120, 400, NaN, -120]);
    expect(m.unreached).toBe(2);
    expect(m.maxAbs).toBe(400);
  });

  it('sorts by best margin, least covered first, ties in layout order, unknown last', () => {
    const m = buildCoverageMatrix(points, arms, coverage, { by: 'worst', dir: 'asc' });
    expect(m.ids).toEqual(['P2', 'P5', 'P1', 'P3', 'P4']);
    // The same order from a plain comparator on objects (independent of the typed-array path).
    const plain = points
      .map((p, i) => ({ id: p.id, i, best: coverage[p.id as keyof typeof coverage] ? Math.max(...Object.values(coverage[p.id as keyof typeof coverage])) : null }))
      .sort((a, b) => (a.best === null ? 1 : b.best === null ? -1 : a.best - b.best || a.i - b.i))
      .map((r) => r.id);
    expect(m.ids).toEqual(plain);
    expect(Array.from(m.margins.slice(0, 2))).toEqual([-300, -120]);
    expect(buildCoverageMatrix(points, arms, coverage, { by: 'worst', dir: 'desc' }).ids).toEqual(['P3', 'P1', 'P2', 'P5', 'P4']);
  });

  it('sorts by one arm, shortest first', () => {
    expect(buildCoverageMatrix(points, arms, coverage, { by: 'arm', arm: 'R2' }).ids).toEqual(['P2', 'P5', 'P1', 'P3', 'P4']);
    expect(buildCoverageMatrix(points, arms, coverage, { by: 'arm', arm: 'R1' }).ids).toEqual(['P2', 'P5', 'P3', 'P1', 'P4']);
    expect(() => buildCoverageMatrix(points, arms, coverage, { by: 'arm', arm: 'R9' })).toThrow('sort.arm R9');
  });

  it('handles no analysis and no arms', () => {
    const m = buildCoverageMatrix(points, arms, null, { by: 'worst', dir: 'asc' });
    expect(m.ids).toEqual(['P1', 'P2', 'P3', 'P4', 'P5']);
    expect(m.unreached).toBe(0);
    expect(buildCoverageMatrix(points, [], coverage, { by: 'layout' }).margins.length).toBe(0);
  });
});

describe('colour scale', () => {
  it('rounds the span up to a 1-2-5 step between 50 mm and the cap', () => {
    expect([0, 12, 50, 51, 130, 400, 700, 1999, 5000].map((v) => marginScaleSpan(v))).toEqual([50, 50, 50, 100, 200, 500, 1000, 2000, 2000]);
    expect(() => marginScaleSpan(Number.NaN)).toThrow('maxAbs');
  });

  it('is red when short, green when reached (0 counts as reached), clamped beyond the span', () => {
    const s = marginColourScale(500);
    const rgb = (c: string) => color(c)!.rgb();
    expect(rgb(s(-500)).toString()).toBe(rgb(MARGIN_COLOURS.short).toString());
    expect(rgb(s(-5000)).toString()).toBe(rgb(MARGIN_COLOURS.short).toString());
    expect(rgb(s(0)).toString()).toBe(rgb(MARGIN_COLOURS.reachedEdge).toString());
    const justShort = rgb(s(-0.01));
    expect(justShort.r - justShort.g).toBeGreaterThan(20);
    const justReached = rgb(s(0.01));
    expect(justReached.g - justReached.r).toBeGreaterThan(20);
    expect(rgb(s(500)).toString()).toBe(rgb(MARGIN_COLOURS.reached).toString());
    // Halfway to the span: each channel halfway between the just-reached colour and the end colour
    // (linear RGB interpolation, checked with a d3 linear scale per channel).
    const half = rgb(s(250));
    const e = rgb(MARGIN_COLOURS.reachedEdge);
    const g = rgb(MARGIN_COLOURS.reached);
    // rgb strings round channels to integers, so allow one unit.
    for (const ch of ['r', 'g', 'b'] as const) expect(Math.abs(half[ch] - scaleLinear([0, 1], [e[ch], g[ch]])(0.5))).toBeLessThanOrEqual(1);
    expect(() => marginColourScale(0)).toThrow('span');
  });
});

describe('hit testing and windowing', () => {
  const g = { labelWidth: 80, cellWidth: 24, rowHeight: 16 };
  it('finds the cell under the pointer, the label column, or nothing', () => {
    expect(cellAt(80, 0, 10, 3, g)).toEqual({ row: 0, col: 0 });
    expect(cellAt(80 + 24 * 2 + 23.9, 16 * 9 + 15.9, 10, 3, g)).toEqual({ row: 9, col: 2 });
    expect(cellAt(10, 20, 10, 3, g)).toEqual({ row: 1, col: null });
    expect(cellAt(80 + 24 * 3, 0, 10, 3, g)).toBeNull();
    expect(cellAt(90, 160, 10, 3, g)).toBeNull();
    expect(cellAt(-1, 0, 10, 3, g)).toBeNull();
  });
  it('draws only the rows in view', () => {
    expect(visibleRows(0, 320, 10000, 16)).toEqual([0, 20]);
    expect(visibleRows(16 * 100 + 8, 320, 10000, 16)).toEqual([100, 121]);
    expect(visibleRows(16 * 9995, 320, 10000, 16)).toEqual([9995, 10000]);
    expect(visibleRows(0, 320, 0, 16)).toEqual([0, 0]);
  });
});
