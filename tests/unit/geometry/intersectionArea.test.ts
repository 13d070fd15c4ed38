// Area of the intersection of two prepared shapes from their boundaries alone, against closed
// forms and against the area of the intersection turf builds (floating-point clipping, so exact
// intersection vertices, as here; clipper-lib rounds them to the 0.01 mm grid and is off by up to a
// few mm² on reach bands).
import fc from 'fast-check';
import { readFileSync, readdirSync } from 'node:fs';
import { featureCollection, intersect, multiPolygon, polygon as turfPolygon } from '@turf/turf';
import type { Feature, MultiPolygon, Polygon } from 'geojson';
import { describe, expect, it } from 'vitest';
import { annularSector, circleRing, clipIntersectShapes, clipShape, clipUnion, polygonsArea, polygonsToGeoJSON, type Polygon2 } from '@shared/geometry';
import { armPose } from '@shared/geometry/frames';
import { intersectionArea } from '@shared/geometry/intersectionArea';
import { bandPolygons } from '@shared/kinematics/planRegions';
import { ArmModelInput, type ArmParams } from '@shared/schemas/armModel';

const square = (x: number, y: number, s: number): Polygon2 => [[[x, y], [x + s, y], [x + s, y + s], [x, y + s]]];
const area = (a: Polygon2[], b: Polygon2[]) => intersectionArea(clipShape(a), clipShape(b));
const clipperArea = (a: Polygon2[], b: Polygon2[]) => polygonsArea(clipIntersectShapes(clipShape(a), clipShape(b)));
/** Polygons on the 0.01 mm grid, as a prepared shape holds them. */
const onGrid = (ps: Polygon2[]): Polygon2[] => ps.map((p) => p.map((r) => r.map(([x, y]) => [Math.round(x * 100) / 100, Math.round(y * 100) / 100] as [number, number])));
/** Area of turf.intersect of the two sets on the grid, mm²; null when turf throws. */
function turfArea(a: Polygon2[], b: Polygon2[]): number | null {
  const feature = (ps: Polygon2[]): Feature<Polygon | MultiPolygon> => {
    const g = polygonsToGeoJSON(onGrid(ps))!;
    return g.type === 'Polygon' ? turfPolygon(g.coordinates) : multiPolygon(g.coordinates);
  };
  let r;
  try {
    r = intersect(featureCollection<Polygon | MultiPolygon>([feature(a), feature(b)]));
  } catch {
    return null;
  }
  if (!r) return 0;
  const polys = r.geometry.type === 'Polygon' ? [r.geometry.coordinates] : r.geometry.coordinates;
  return polygonsArea(polys.map((p) => p.map((ring) => ring.slice(0, -1).map(([x, y]) => [x, y] as [number, number]))));
}

describe('intersection area from the boundaries', () => {
  it('two overlapping squares: the overlap rectangle, 5 × 5 mm [derived]', () => {
    expect(area([square(0, 0, 10)], [square(5, 5, 10)])).toBeCloseTo(25, 9);
  });

  it('a square inside another, one with a hole, disjoint shapes, shapes whose boxes meet but not the shapes [derived]', () => {
    expect(area([square(0, 0, 100)], [square(20.5, 30.5, 10)])).toBeCloseTo(100, 9);
    expect(area([square(20.5, 30.5, 10)], [square(0, 0, 100)])).toBeCloseTo(100, 9);
    // a 100 mm square with a 40 mm square hole against a strip across it: 100 × 10 minus 40 × 10
    const holed: Polygon2 = [square(0, 0, 100)[0], [[30, 30], [30, 70], [70, 70], [70, 30]]];
    expect(area([holed], [[[[-10, 45.5], [110, 45.5], [110, 55.5], [-10, 55.5]]]])).toBeCloseTo(600, 9);
    expect(area([square(0, 0, 10)], [square(20, 20, 10)])).toBe(0);
    // an L shape and a square in its notch: the boxes overlap, the shapes do not
    const ell: Polygon2 = [[[0, 0], [100, 0], [100, 10], [10, 10], [10, 100], [0, 100]]];
    expect(area([ell], [square(50.5, 50.5, 20)])).toBeCloseTo(0, 9);
  });

  it('two disks of radius 1000 mm, 1200 mm apart: the lens area 2r²·acos(d/2r) − (d/2)·√(4r² − d²) within the polygons’ chord error [pub: circle–circle intersection]', () => {
    const r = 1000, d = 1200;
    const lens = 2 * r * r * Math.acos(d / (2 * r)) - (d / 2) * Math.sqrt(4 * r * r - d * d);
    const a = area([[circleRing(0, 0, r, 'inner', 0.05)]], [[circleRing(d, 0.3, r, 'inner', 0.05)]])!;
    // inscribed rings fall short of the disks by at most the chord tolerance along the lens' boundary
    expect(Math.abs(a - lens)).toBeLessThan(0.05 * 2 * Math.PI * r);
    expect(a).toBeLessThanOrEqual(lens + 1);
  });

  it('gives up (null) where the boundaries touch or run along each other, so the caller builds the intersection', () => {
    expect(area([square(0, 0, 10)], [square(10, 0, 10)])).toBeNull(); // a shared edge
    expect(area([square(0, 0, 10)], [square(0, 0, 10)])).toBeNull(); // the same square
    expect(area([square(0, 0, 10)], [square(5, 10, 10)])).toBeNull(); // edges along one line
    expect(area([square(0, 0, 10)], [[[[10, 5], [20, 2], [20, 8]]]])).toBeNull(); // a vertex on an edge
  });

  it('equals the area of the intersection turf builds within 0.001 mm², and clipper-lib’s within 5 mm², for unions of annular sectors placed at random (property)', () => {
    const sector = fc.record({
      cx: fc.double({ min: -2000, max: 2000, noNaN: true }), cy: fc.double({ min: -2000, max: 2000, noNaN: true }),
      rInner: fc.double({ min: 0, max: 800, noNaN: true }), width: fc.double({ min: 50, max: 1500, noNaN: true }),
      startDeg: fc.double({ min: -180, max: 180, noNaN: true }), sweep: fc.double({ min: 10, max: 400, noNaN: true }),
    });
    fc.assert(
      fc.property(fc.array(sector, { minLength: 1, maxLength: 3 }), fc.array(sector, { minLength: 1, maxLength: 3 }), (sa, sb) => {
        const shape = (ss: typeof sa) => clipUnion(ss.map((s) => annularSector({ cx: s.cx, cy: s.cy, rInner: s.rInner, rOuter: s.rInner + s.width, startDeg: s.startDeg, endDeg: s.startDeg + s.sweep })));
        const a = shape(sa), b = shape(sb);
        const fast = area(a, b);
        if (fast === null) return; // a touch: the caller falls back to clipper-lib
        const t = turfArea(a, b);
        if (t !== null) expect(Math.abs(fast - t)).toBeLessThan(1e-3);
        expect(Math.abs(fast - clipperArea(a, b))).toBeLessThan(5);
      }),
      { numRuns: 300 },
    );
  });

  it("equals turf's area within 0.001 mm², and clipper-lib's within 5 mm², for the demo models' reach bands at work heights, placed at random (property)", () => {
    const dir = new URL('../../../samples/arm-models/', import.meta.url);
    const models: ArmParams[] = readdirSync(dir).filter((f) => f.endsWith('.json')).sort()
      .map((f) => ArmModelInput.parse(JSON.parse(readFileSync(new URL(f, dir), 'utf8'))).params);
    const bands = models.flatMap((m) => [300, 800, 1200].map((z) => bandPolygons(m, z))).filter((b) => b.length > 0);
    const place = fc.record({ k: fc.nat(), x: fc.double({ min: -3000, max: 3000, noNaN: true }), y: fc.double({ min: -3000, max: 3000, noNaN: true }), yaw: fc.double({ min: 0, max: 360, noNaN: true }) });
    let compared = 0;
    fc.assert(
      fc.property(place, place, (pa, pb) => {
        const placed = (p: typeof pa) => armPose({ x: p.x, y: p.y, yaw: p.yaw, mountHeight: 0 }).placePolygons(bands[p.k % bands.length]);
        const a = placed(pa), b = placed(pb);
        const fast = area(a, b);
        if (fast === null) return;
        const t = turfArea(a, b);
        if (t === null) return;
        compared++;
        expect(Math.abs(fast - t)).toBeLessThan(1e-3);
        expect(Math.abs(fast - clipperArea(a, b))).toBeLessThan(5);
      }),
      { numRuns: 200 },
    );
    expect(compared).toBeGreaterThan(150);
  });
});
