import { describe, expect, it } from 'vitest';
import { annularSector, clipIntersect, circleRing, polygonArea, polygonsArea, ringArea, sectorArea } from '@shared/geometry';

// Lens (circle–circle intersection) area, Wolfram MathWorld "Circle-Circle Intersection".
function lensArea(r: number, R: number, d: number): number {
  return (
    r * r * Math.acos((d * d + r * r - R * R) / (2 * d * r)) +
    R * R * Math.acos((d * d + R * R - r * r) / (2 * d * R)) -
    0.5 * Math.sqrt((-d + r + R) * (d + r - R) * (d - r + R) * (d + r + R))
  );
}

describe('geometry against published values', () => {
  it('shoelace formula: pentagon (3,4),(5,11),(12,8),(9,5),(5,6) has area 30', () => {
    // Source: shoelace formula worked example, docs/sources.md "Geometry" [pub, derived].
    const ring: Array<[number, number]> = [[3, 4], [5, 11], [12, 8], [9, 5], [5, 6]];
    expect(Math.abs(ringArea(ring))).toBeCloseTo(30, 12);
    expect(ringArea([...ring].reverse())).toBeCloseTo(-ringArea(ring), 12);
    expect(polygonArea([ring])).toBeCloseTo(30, 12);
  });

  it('annular sector formula A = (θ/2)(R² − r²): R = 1.8, r = 0.4, θ = 340° → 9.1385', () => {
    // Source: annular sector area formula, docs/sources.md "Geometry" [derived].
    expect(sectorArea(0.4, 1.8, 340)).toBeCloseTo(9.1385, 4);
    // The discretised polygon (in mm, scaled ×1000) errs outward but stays within 0.1 %.
    const poly = annularSector({ cx: 0, cy: 0, rInner: 400, rOuter: 1800, startDeg: 10, endDeg: 350, toleranceMm: 0.5 });
    const a = polygonArea(poly) / 1e6;
    expect(a).toBeGreaterThanOrEqual(9.1385 - 1e-4);
    expect(a / 9.13850).toBeLessThan(1.001);
  });

  it('lens area: r = R = 1, d = 1 → 1.22837; r = 2, R = 1, d = 2 → 1.40307; half overlap at d ≈ 0.80795', () => {
    // Source: Wolfram MathWorld, "Circle-Circle Intersection" [pub]; second value [derived].
    expect(lensArea(1, 1, 1)).toBeCloseTo(1.22837, 5);
    expect(lensArea(2, 1, 2)).toBeCloseTo(1.40307, 5);
    expect(lensArea(1, 1, 0.80795) / Math.PI).toBeCloseTo(0.5, 4);
  });

  it('clipper intersection of two discretised disks matches the lens formula to 0.1 %', () => {
    // Source: lens formula (MathWorld) as the reference for our polygon clipping, units of 1000 mm.
    const cases: Array<[number, number, number, number]> = [
      [1000, 1000, 1000, 1228370],
      [2000, 1000, 2000, 1403070],
    ];
    for (const [r, R, d] of cases) {
      const a = [[circleRing(0, 0, r, 'outer', 0.2)]];
      const b = [[circleRing(d, 0, R, 'outer', 0.2)]];
      const area = polygonsArea(clipIntersect(a, b));
      expect(Math.abs(area / lensArea(r, R, d) - 1)).toBeLessThan(1e-3);
    }
  });
});
