import { describe, expect, it } from 'vitest';
import { formatMetres, NICE_STEPS_MM, niceStepAtLeast, niceStepAtMost, scaleBarFor, SCALE_BAR_STEPS_MM } from '../../../frontend/src/plan/scaleBar';

// The 1-2-5 series of round lengths for scale bars and grids is common practice in drawings
// and charts (each decade split 1, 2, 5).
describe('scale bar steps', () => {
  it('runs 0.1, 0.2, 0.5, 1, 2, 5, 10, 20, 50 m and on (common practice: 1-2-5 series)', () => {
    expect(SCALE_BAR_STEPS_MM.slice(0, 9)).toEqual([100, 200, 500, 1000, 2000, 5000, 10000, 20000, 50000]);
    for (let i = 1; i < NICE_STEPS_MM.length; i += 1) expect(NICE_STEPS_MM[i]).toBeGreaterThan(NICE_STEPS_MM[i - 1]);
  });

  // Worked by hand: 0.1 px/mm is 100 px per metre. With at most 120 px the bar is 1 m (100 px);
  // 2 m would be 200 px. At 0.035 px/mm (the demo hall fitted), 120 px is 3.43 m → 2 m, 70 px.
  it('picks the longest step within the length (worked by hand)', () => {
    expect(scaleBarFor(0.1, 120)).toEqual({ mm: 1000, px: 100, label: '1 m' });
    const hall = scaleBarFor(0.035, 120);
    expect(hall.mm).toBe(2000);
    expect(hall.px).toBeCloseTo(70, 9);
    expect(scaleBarFor(10, 120).label).toBe('0.1 m');
    expect(scaleBarFor(0.001, 120).label).toBe('100 m');
  });

  it('never exceeds the length unless even the shortest step does, and is the longest that fits', () => {
    for (let e = -5; e <= 2; e += 0.173) {
      const k = 10 ** e;
      const bar = scaleBarFor(k, 150);
      const i = SCALE_BAR_STEPS_MM.indexOf(bar.mm);
      if (i > 0 || bar.px <= 150) expect(bar.px).toBeLessThanOrEqual(150 + 1e-9);
      if (i < SCALE_BAR_STEPS_MM.length - 1) expect(SCALE_BAR_STEPS_MM[i + 1] * k).toBeGreaterThan(150);
    }
  });

  it('grid spacing is the shortest step at least the given px apart', () => {
    expect(niceStepAtLeast(0.035, 24)).toBe(1000); // 500 mm is 17.5 px, 1 m is 35 px
    expect(niceStepAtMost(0.035, 24)).toBe(500);
  });

  it('writes metres plainly', () => {
    expect(formatMetres(100)).toBe('0.1 m');
    expect(formatMetres(500)).toBe('0.5 m');
    expect(formatMetres(20000)).toBe('20 m');
  });

  it('rejects a scale that is not a positive number', () => {
    expect(() => scaleBarFor(0)).toThrow(/pxPerMm/);
    expect(() => scaleBarFor(Number.NaN)).toThrow(/pxPerMm/);
  });
});
