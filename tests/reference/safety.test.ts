// Safeguarding distances against the published standards' formulas and tables.
import { describe, expect, it } from 'vitest';
import {
  NotCoveredError,
  REACH_OVER_COLUMNS_MM,
  REACH_OVER_ROWS,
  SafeguardInputError,
  reachOverDistance,
  reachThroughDistance,
  recommendedBeamHeights,
  separationDistance,
} from '@shared/safety';

const curtain = (t: number, d: number) => separationDistance({ device: 'light-curtain', resolutionMm: d, responseTimeS: 0, stopTimeS: t });

describe('ISO 13855 separation distance S = K·T + C', () => {
  // ISO 13855:2010, normal approach, d ≤ 40 mm: K = 2000 mm/s and C = 8(d − 14), at least 100 mm;
  // above 500 mm recompute with K = 1600 mm/s, at least 500 mm. Values derived from the formula.
  it('light curtain d = 14 mm, T = 0.2 s → 400 mm (K = 2000)', () => {
    expect(curtain(0.2, 14)).toMatchObject({ sMm: 400, kMmPerS: 2000, cMm: 0 });
  });
  it('light curtain d = 14 mm, T = 0.32 s → 640 mm > 500, so 1600 × 0.32 = 512 mm', () => {
    expect(curtain(0.32, 14)).toMatchObject({ sMm: 512, kMmPerS: 1600 });
  });
  it('light curtain d = 30 mm, T = 0.2 s → 528 > 500 → 448 → at least 500 mm', () => {
    const s = curtain(0.2, 30);
    expect(s).toMatchObject({ sMm: 500, kMmPerS: 1600, cMm: 128 });
    expect(s.formula).toContain('at least 500 mm');
  });
  it('light curtain d = 14 mm, T = 0.04 s → 80 mm → at least 100 mm', () => {
    expect(curtain(0.04, 14)).toMatchObject({ sMm: 100, kMmPerS: 2000 });
  });
  it('light curtain d = 50 mm (above 40), T = 0.5 s → 1600 × 0.5 + 850 = 1650 mm', () => {
    expect(curtain(0.5, 50)).toMatchObject({ sMm: 1650, kMmPerS: 1600, cMm: 850 });
  });
  it('T is the device response time plus the stopping time', () => {
    const s = separationDistance({ device: 'light-curtain', resolutionMm: 14, responseTimeS: 0.02, stopTimeS: 0.18 });
    expect(s.tS).toBeCloseTo(0.2, 12);
    expect(s.sMm).toBe(400);
  });
  it('multi-beam T = 0.3 s → 1600 × 0.3 + 850 = 1330 mm; single beam → + 1200 mm', () => {
    expect(separationDistance({ device: 'multi-beam', beams: 4, responseTimeS: 0.01, stopTimeS: 0.29 }).sMm).toBe(1330);
    expect(separationDistance({ device: 'single-beam', responseTimeS: 0, stopTimeS: 0.3 }).sMm).toBe(1680);
  });
  it('interlocked guard without guard locking: S = 1600·T; with guard locking: none needed', () => {
    expect(separationDistance({ device: 'interlock', responseTimeS: 0.05, stopTimeS: 0.45 })).toMatchObject({ sMm: 800, kMmPerS: 1600, cMm: 0 });
    const locked = separationDistance({ device: 'interlock-locking', responseTimeS: 0.05, stopTimeS: 0.45 });
    expect(locked.sMm).toBe(0);
    expect(locked.formula).toMatch(/no separation distance is needed/);
  });
  it('parallel approach: S = 1600·T + (1200 − 0.4·H), C never below 850 mm, H ≤ 1000 mm and ≥ 15(d − 50)', () => {
    // H = 300 mm: C = 1200 − 120 = 1080 mm; T = 0.25 s → 400 + 1080 = 1480 mm (derived).
    expect(separationDistance({ device: 'light-curtain', approach: 'parallel', heightMm: 300, resolutionMm: 40, responseTimeS: 0.05, stopTimeS: 0.2 })).toMatchObject({ sMm: 1480, cMm: 1080 });
    // H = 1000 mm: 1200 − 400 = 800 → C = 850 mm.
    expect(separationDistance({ device: 'light-curtain', approach: 'parallel', heightMm: 1000, resolutionMm: 40, responseTimeS: 0, stopTimeS: 0.25 })).toMatchObject({ sMm: 1250, cMm: 850 });
    expect(() => separationDistance({ device: 'light-curtain', approach: 'parallel', heightMm: 1100, resolutionMm: 40, responseTimeS: 0, stopTimeS: 0.2 })).toThrow(/1000 mm/);
    // d = 70 mm → H ≥ 15 × 20 = 300 mm.
    expect(() => separationDistance({ device: 'light-curtain', approach: 'parallel', heightMm: 200, resolutionMm: 70, responseTimeS: 0, stopTimeS: 0.2 })).toThrow(/at least 300 mm/);
  });
  it('names the field of bad input', () => {
    const field = (f: () => unknown) => {
      try {
        f();
      } catch (e) {
        return e instanceof SafeguardInputError ? e.field : String(e);
      }
      return null;
    };
    expect(field(() => separationDistance({ device: 'light-curtain', responseTimeS: 0.01, stopTimeS: 0.2 }))).toBe('resolutionMm');
    expect(field(() => separationDistance({ device: 'interlock', responseTimeS: -1, stopTimeS: 0.2 }))).toBe('responseTimeS');
    expect(field(() => separationDistance({ device: 'interlock', responseTimeS: 0.01, stopTimeS: Number.NaN }))).toBe('stopTimeS');
    expect(field(() => separationDistance({ device: 'laser' as never, responseTimeS: 0.01, stopTimeS: 0.2 }))).toBe('device');
    expect(field(() => separationDistance({ device: 'single-beam', approach: 'parallel', responseTimeS: 0.01, stopTimeS: 0.2 }))).toBe('approach');
  });
  it('recommended beam heights for 2, 3 and 4 beams (ISO 13855)', () => {
    expect(recommendedBeamHeights(4)).toEqual([300, 600, 900, 1200]);
    expect(recommendedBeamHeights(3)).toEqual([300, 700, 1100]);
    expect(recommendedBeamHeights(2)).toEqual([400, 900]);
    expect(recommendedBeamHeights(5)).toBeNull();
  });
});

describe('ISO 13857 reaching over a protective structure (high risk)', () => {
  // ISO 13857:2019 Table 2, rows a = 2000…2600 mm as published; rows below 2000 are values from memory.
  it('table cells on rows and columns', () => {
    expect(reachOverDistance(2600, 1000)).toEqual({ distanceMm: 900, rowMm: 2600, columnMm: 1000 });
    expect(reachOverDistance(2400, 1400)).toEqual({ distanceMm: 900, rowMm: 2400, columnMm: 1400 });
    expect(reachOverDistance(2200, 1800)).toEqual({ distanceMm: 800, rowMm: 2200, columnMm: 1800 });
    expect(reachOverDistance(2000, 2400)).toEqual({ distanceMm: 0, rowMm: 2000, columnMm: 2400 });
    expect(reachOverDistance(2600, 2500).distanceMm).toBe(100);
    expect(reachOverDistance(1400, 1400).distanceMm).toBe(1100); // value from memory
    expect(reachOverDistance(0, 1200).distanceMm).toBe(500); // value from memory
  });
  it('between columns takes the lower structure height, between rows the larger distance (no interpolation)', () => {
    // b = 1500 lies between 1400 and 1600 → column 1400; a = 2300 between 2400 (900) and 2200 (1000) → 1000.
    expect(reachOverDistance(2300, 1500)).toEqual({ distanceMm: 1000, rowMm: 2200, columnMm: 1400 });
    // a = 2500 between 2600 (900) and 2400 (1100) at b = 1000 → 1100 from the 2400 row.
    expect(reachOverDistance(2500, 1000)).toEqual({ distanceMm: 1100, rowMm: 2400, columnMm: 1000 });
    // Never less than either neighbouring cell anywhere in the table.
    for (let i = 0; i + 1 < REACH_OVER_ROWS.length; i++) {
      for (let j = 0; j < REACH_OVER_COLUMNS_MM.length; j++) {
        const a = (REACH_OVER_ROWS[i].aMm + REACH_OVER_ROWS[i + 1].aMm) / 2;
        const b = j + 1 < REACH_OVER_COLUMNS_MM.length ? (REACH_OVER_COLUMNS_MM[j] + REACH_OVER_COLUMNS_MM[j + 1]) / 2 : REACH_OVER_COLUMNS_MM[j] + 50;
        const c = reachOverDistance(a, b).distanceMm;
        expect(c).toBeGreaterThanOrEqual(REACH_OVER_ROWS[i].cMm[j]);
        expect(c).toBeGreaterThanOrEqual(REACH_OVER_ROWS[i + 1].cMm[j]);
      }
    }
  });
  it('hazards at 2700 mm or higher are out of reach; structures below 1000 mm are not covered', () => {
    expect(reachOverDistance(2800, 1000).distanceMm).toBe(0);
    expect(() => reachOverDistance(2000, 900)).toThrow(NotCoveredError);
    expect(() => reachOverDistance(2000, 900)).toThrow(/does not cover structures lower than 1000 mm/);
  });
});

describe('ISO 13857 reaching through openings (age 14 and over)', () => {
  // ISO 13857:2019, upper limb through regular openings: slot / square / round.
  it('table rows', () => {
    expect(reachThroughDistance(4, 'slot').distanceMm).toBe(2);
    expect(reachThroughDistance(6, 'square').distanceMm).toBe(5);
    expect(reachThroughDistance(8, 'slot').distanceMm).toBe(20);
    expect(reachThroughDistance(10, 'round').distanceMm).toBe(20);
    expect(reachThroughDistance(12, 'square').distanceMm).toBe(80);
    expect(reachThroughDistance(20, 'slot').distanceMm).toBe(120);
    expect(reachThroughDistance(30, 'slot').distanceMm).toBe(850);
    expect(reachThroughDistance(40, 'square').distanceMm).toBe(200);
    expect(reachThroughDistance(40, 'round').distanceMm).toBe(120);
    expect(reachThroughDistance(120, 'round').distanceMm).toBe(850);
  });
  it('sizes between rows take the next larger row (more safety)', () => {
    expect(reachThroughDistance(25, 'square')).toEqual({ distanceMm: 120, rowUpToMm: 30 });
    expect(reachThroughDistance(35, 'square')).toEqual({ distanceMm: 200, rowUpToMm: 40 });
    expect(reachThroughDistance(10.5, 'slot')).toEqual({ distanceMm: 100, rowUpToMm: 12 });
  });
  it('openings above 120 mm are not covered; bad input names the field', () => {
    expect(() => reachThroughDistance(150, 'square')).toThrow(NotCoveredError);
    expect(() => reachThroughDistance(0, 'square')).toThrow(/greater than 0/);
    expect(() => reachThroughDistance(20, 'hex' as never)).toThrow(/shape/);
  });
});
