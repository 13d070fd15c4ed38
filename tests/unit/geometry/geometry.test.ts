import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  angularMargin,
  annularSector,
  arcPoints,
  buildDistanceGrid,
  circleRing,
  clipDifference,
  clipOffset,
  clipUnion,
  geoJSONToPolygons,
  isClose,
  normalizeDeg,
  pointInPolygon,
  polygonArea,
  polygonsArea,
  polygonsToGeoJSON,
  sectorArea,
  signedDistanceToPolygons,
  snapValue,
  toDegrees,
  toRadians,
  type Polygon2,
} from '@shared/geometry';

const square = (x0: number, y0: number, s: number): Polygon2 => [[[x0, y0], [x0 + s, y0], [x0 + s, y0 + s], [x0, y0 + s]]];

describe('angles and tolerance', () => {
  it('converts and wraps', () => {
    expect(toDegrees(toRadians(123.4))).toBeCloseTo(123.4, 12);
    expect(normalizeDeg(190)).toBeCloseTo(-170, 12);
    expect(normalizeDeg(-180)).toBeCloseTo(180, 12);
    expect(normalizeDeg(540)).toBeCloseTo(180, 12);
    expect(isClose(1, 1 + 1e-7)).toBe(true);
    expect(isClose(1, 1.001)).toBe(false);
  });

  it('angular margin is signed and respects wrap-around', () => {
    const d = Math.PI / 180;
    expect(angularMargin(0, -170 * d, 170 * d) / d).toBeCloseTo(170, 9);
    expect(angularMargin(175 * d, -170 * d, 170 * d) / d).toBeCloseTo(-5, 9);
    expect(angularMargin(-175 * d, -170 * d, 170 * d) / d).toBeCloseTo(-5, 9);
    expect(angularMargin(350 * d, -20 * d, 20 * d) / d).toBeCloseTo(10, 9);
    expect(angularMargin(1, 0, 2 * Math.PI)).toBe(Infinity);
  });
});

describe('arc discretisation errs outward', () => {
  it('outer arcs are circumscribed within the tolerance, inner arcs inscribed within it', () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 5000, noNaN: true }), fc.double({ min: 0.05, max: 5, noNaN: true }), (r, tol) => {
        const outer = arcPoints(0, 0, r, 0, 2, 'outer', tol);
        const inner = arcPoints(0, 0, r, 0, 2, 'inner', tol);
        for (const [x, y] of outer) {
          const rr = Math.hypot(x, y);
          expect(rr).toBeGreaterThanOrEqual(r - 1e-9);
          expect(rr - r).toBeLessThanOrEqual(tol + 1e-9);
        }
        for (const [x, y] of inner) expect(Math.abs(Math.hypot(x, y) - r)).toBeLessThan(1e-9);
        // Chord midpoints of the inner polyline cut in by at most the tolerance.
        for (let i = 1; i < inner.length; i++) {
          const mx = (inner[i][0] + inner[i - 1][0]) / 2;
          const my = (inner[i][1] + inner[i - 1][1]) / 2;
          expect(r - Math.hypot(mx, my)).toBeLessThanOrEqual(tol + 1e-9);
        }
        // Outer polyline segments are tangent to the circle (distance from centre to each segment = r).
        for (let i = 1; i < outer.length; i++) {
          const [ax, ay] = outer[i - 1];
          const [bx, by] = outer[i];
          const dist = Math.abs(ax * by - ay * bx) / Math.hypot(bx - ax, by - ay);
          expect(dist).toBeGreaterThanOrEqual(r - 1e-6);
        }
      }),
      { numRuns: 100 },
    );
  });

  it('a circumscribed circle ring contains the disk; its area is within the tolerance band', () => {
    const r = 1000;
    const ring = circleRing(0, 0, r, 'outer', 1);
    const a = polygonArea([ring]);
    expect(a).toBeGreaterThan(Math.PI * r * r);
    expect(a).toBeLessThan(Math.PI * (r + 1) ** 2);
  });
});

describe('annular sectors', () => {
  it('polygon area matches (θ/2)(R² − r²) to 0.1 % (0.2 mm chords) and never falls below it', () => {
    // Source: annular sector area formula, docs/sources.md "Geometry" [derived].
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 800, noNaN: true }),
        fc.double({ min: 200, max: 3000, noNaN: true }),
        fc.double({ min: -180, max: 180, noNaN: true }),
        fc.double({ min: 20, max: 360, noNaN: true }),
        (rIn, dr, start, sweep) => {
          const rOuter = rIn + dr;
          const poly = annularSector({ cx: 5, cy: -7, rInner: rIn, rOuter, startDeg: start, endDeg: start + sweep, toleranceMm: 0.2 });
          const exact = sectorArea(rIn, rOuter, sweep);
          const a = polygonArea(poly);
          expect(a).toBeGreaterThanOrEqual(exact * (1 - 1e-9));
          expect(a / exact).toBeLessThan(1.001);
        },
      ),
      { numRuns: 200 },
    );
  });

  it('full circle gives an annulus with a hole', () => {
    const p = annularSector({ cx: 0, cy: 0, rInner: 300, rOuter: 900, startDeg: -180, endDeg: 180 });
    expect(p.length).toBe(2);
    expect(pointInPolygon(0, 0, p)).toBe(false);
    expect(pointInPolygon(600, 0, p)).toBe(true);
    expect(() => annularSector({ cx: 0, cy: 0, rInner: 300, rOuter: 200, startDeg: 0, endDeg: 10 })).toThrow(/rOuter/);
  });
});

describe('point in polygon and signed distance', () => {
  const withHole: Polygon2 = [
    [[0, 0], [100, 0], [100, 100], [0, 100]],
    [[40, 40], [40, 60], [60, 60], [60, 40]],
  ];

  it('classifies points and measures distances', () => {
    expect(pointInPolygon(10, 10, withHole)).toBe(true);
    expect(pointInPolygon(50, 50, withHole)).toBe(false);
    expect(signedDistanceToPolygons(10, 50, [withHole])).toBeCloseTo(10, 12);
    expect(signedDistanceToPolygons(50, 50, [withHole])).toBeCloseTo(-10, 12);
    expect(signedDistanceToPolygons(-3, 104, [withHole])).toBeCloseTo(-5, 12);
  });

  it('the distance grid agrees with the brute-force signed distance everywhere', () => {
    const ring = annularSector({ cx: 0, cy: 0, rInner: 300, rOuter: 1200, startDeg: -150, endDeg: 150 });
    const polys = [ring, square(1500, -200, 300), withHole.map((r) => r.map(([x, y]) => [x - 200, y - 1600] as [number, number]))];
    const grid = buildDistanceGrid(polys);
    fc.assert(
      fc.property(fc.double({ min: -12000, max: 12000, noNaN: true }), fc.double({ min: -12000, max: 12000, noNaN: true }), (x, y) => {
        expect(grid.signedDistance(x, y)).toBeCloseTo(signedDistanceToPolygons(x, y, polys), 9);
      }),
      { numRuns: 3000 },
    );
    // Far outside the grid the fallback is still exact.
    expect(grid.signedDistance(1e5, 0)).toBeCloseTo(signedDistanceToPolygons(1e5, 0, polys), 6);
  });

  it('the mirrored queries: the better of a point and its mirror image in x = 0, and a bound that never undercuts it', () => {
    // An off-centre annular sector (so a point and its mirror image see different edges) and a
    // square; the brute-force signed distance (all edges) is the reference.
    const ring = annularSector({ cx: 250, cy: 0, rInner: 300, rOuter: 1200, startDeg: -40, endDeg: 200 });
    const polys = [ring, square(-1500, -200, 300)];
    const grid = buildDistanceGrid(polys);
    fc.assert(
      fc.property(fc.double({ min: -6000, max: 6000, noNaN: true }), fc.double({ min: -6000, max: 6000, noNaN: true }), (x, y) => {
        const here = signedDistanceToPolygons(x, y, polys);
        const mirrored = signedDistanceToPolygons(-x, y, polys);
        expect(grid.maxMirrored(x, y)).toBeCloseTo(Math.max(here, mirrored), 9);
        expect(grid.upperBoundMirrored(x, y)).toBeGreaterThanOrEqual(mirrored - 1e-9);
        expect(grid.upperBound(x, y)).toBeGreaterThanOrEqual(here - 1e-9);
      }),
      { numRuns: 3000 },
    );
  });

  it('on a jagged outline of many short edges the grid stays exact, and its edge-free upper bound never undercuts the distance', () => {
    // A raster-like staircase ring (1,600 vertices, 7 mm steps) around a wobbly circle, plus a
    // hole; the brute-force signed distance (all edges) is the reference.
    const ring: Array<[number, number]> = [];
    for (let i = 0; i < 800; i++) {
      const a = (i / 800) * 2 * Math.PI;
      const r = 1500 + 120 * Math.sin(5 * a);
      const x = Math.round((r * Math.cos(a)) / 7) * 7;
      const y = Math.round((r * Math.sin(a)) / 7) * 7;
      const last = ring[ring.length - 1];
      if (last && last[0] !== x && last[1] !== y) ring.push([x, last[1]]);
      if (!last || last[0] !== x || last[1] !== y) ring.push([x, y]);
    }
    const polys: Polygon2[] = [[ring, [[-200, -200], [-200, 200], [200, 200], [200, -200]]]];
    const grid = buildDistanceGrid(polys);
    expect(grid.edgeCount).toBeGreaterThan(1000);
    fc.assert(
      fc.property(fc.double({ min: -5000, max: 5000, noNaN: true }), fc.double({ min: -5000, max: 5000, noNaN: true }), (x, y) => {
        const plain = signedDistanceToPolygons(x, y, polys);
        expect(grid.signedDistance(x, y)).toBeCloseTo(plain, 9);
        expect(grid.upperBound(x, y)).toBeGreaterThanOrEqual(plain - 1e-9);
      }),
      { numRuns: 3000 },
    );
    // Points close to the boundary, where the nearest edge changes every few millimetres.
    for (let i = 0; i < 2000; i++) {
      const a = i * 0.0031;
      const r = 1500 + 120 * Math.sin(5 * a) + ((i % 21) - 10);
      const [x, y] = [r * Math.cos(a), r * Math.sin(a)];
      expect(grid.signedDistance(x, y)).toBeCloseTo(signedDistanceToPolygons(x, y, polys), 9);
    }
  });
});

describe('clipping, snapping and GeoJSON', () => {
  it('clipper union, difference and offset', () => {
    const u = clipUnion([square(0, 0, 100), square(50, 0, 100)]);
    expect(polygonsArea(u)).toBeCloseTo(15000, 6);
    const d = clipDifference([square(0, 0, 100)], [square(25, 25, 50)]);
    expect(d.length).toBe(1);
    expect(d[0].length).toBe(2);
    expect(polygonsArea(d)).toBeCloseTo(7500, 6);
    const o = clipOffset([square(0, 0, 100)], 10, { arcToleranceMm: 0.1 });
    // Minkowski sum of a square with a disk: s² + 4·s·δ + π·δ², grown by at most the arc tolerance.
    const exact = 100 * 100 + 4 * 100 * 10 + Math.PI * 100;
    const a = polygonsArea(o);
    expect(a).toBeGreaterThanOrEqual(exact);
    expect(a).toBeLessThan(exact + 0.1 * (4 * 100 + 2 * Math.PI * 10) + 1);
  });

  it('snaps to 0.01 mm and round-trips GeoJSON with RFC 7946 winding', () => {
    expect(snapValue(1.23456)).toBeCloseTo(1.23, 12);
    expect(snapValue(-0.001)).toBe(0);
    const g = polygonsToGeoJSON([[[[0, 0], [0, 10], [10, 10], [10, 0]]]]);
    expect(g.type).toBe('Polygon');
    const ring = (g as { coordinates: number[][][] }).coordinates[0];
    expect(ring[0]).toEqual(ring[ring.length - 1]);
    expect(polygonArea(geoJSONToPolygons(g)[0])).toBeCloseTo(100, 12);
    expect(polygonsToGeoJSON([]).type).toBe('MultiPolygon');
  });

  it('does not mutate frozen inputs', () => {
    const deepFreeze = <T>(o: T): T => {
      if (o && typeof o === 'object') {
        Object.values(o).forEach(deepFreeze);
        Object.freeze(o);
      }
      return o;
    };
    const polys = deepFreeze([square(0, 0, 100), square(50, 50, 100)]);
    expect(() => clipUnion(polys)).not.toThrow();
    expect(() => buildDistanceGrid(polys)).not.toThrow();
    expect(() => polygonsToGeoJSON(polys)).not.toThrow();
  });
});

describe('Douglas–Peucker simplification', () => {
  it('keeps every dropped vertex within eps of the kept ring, and the grown result contains the original', async () => {
    const { simplifyRing } = await import('@shared/geometry/simplify');
    // A wobbly circle: 720 vertices with ±0.3 mm ripple.
    const ring: Array<[number, number]> = [];
    for (let i = 0; i < 720; i++) {
      const a = (i / 720) * 2 * Math.PI;
      const r = 1000 + 0.3 * Math.sin(37 * a);
      ring.push([r * Math.cos(a), r * Math.sin(a)]);
    }
    const s = simplifyRing(ring, 0.5);
    expect(s.length).toBeLessThan(ring.length);
    for (const [x, y] of ring) expect(-signedDistanceToPolygons(x, y, [[s]])).toBeLessThanOrEqual(0.5 + 1e-9);
    const grown = clipOffset([[s]], 0.5, { join: 'miter' });
    for (const [x, y] of ring) expect(signedDistanceToPolygons(x, y, grown)).toBeGreaterThanOrEqual(-0.011);
  });

  it('outward simplification contains the original and lies within 2·eps outside it', async () => {
    const { simplifyPolygonsOutward } = await import('@shared/geometry/simplify');
    // A staircase ring (5 mm steps) like a raster contour: diagonal zigzags DP at 3 mm removes.
    const ring: Array<[number, number]> = [];
    for (let i = 0; i < 400; i++) {
      const a = (i / 400) * 2 * Math.PI;
      const x = Math.round((800 * Math.cos(a)) / 5) * 5;
      const y = Math.round((500 * Math.sin(a)) / 5) * 5;
      const last = ring[ring.length - 1];
      if (last && last[0] !== x && last[1] !== y) ring.push([x, last[1]]);
      if (!last || last[0] !== x || last[1] !== y) ring.push([x, y]);
    }
    const eps = 3;
    const out = simplifyPolygonsOutward([[ring]], eps);
    expect(out[0][0].length).toBeLessThan(0.6 * ring.length);
    for (const [x, y] of ring) expect(signedDistanceToPolygons(x, y, out)).toBeGreaterThanOrEqual(-0.011);
    for (const [x, y] of out[0][0]) expect(-signedDistanceToPolygons(x, y, [[ring]])).toBeLessThanOrEqual(2 * eps + 0.011);
    expect(() => simplifyPolygonsOutward([[ring]], 0)).toThrow(/eps/);
  });
});
