// Cropping clipper paths to the box two shapes share before intersecting them: the answer must be
// the very same polygons clipper-lib gives for the whole paths (the reference here is clipper-lib
// itself, called directly on the uncropped paths), and the crop must never move or add a vertex.
import ClipperLib from 'clipper-lib';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { annularSector, clipIntersectShapes, clipShape, clipUnion, polygonsArea, type Polygon2 } from '@shared/geometry';
import { cropPathsToBox } from '@shared/geometry/clipper';

type Path = Array<{ X: number; Y: number }>;

/** clipper-lib's intersection of the whole paths, as rings in mm (0.01 mm units), each started at its least vertex. */
function wholeIntersection(a: Polygon2[], b: Polygon2[]): string[] {
  const c = new ClipperLib.Clipper();
  c.AddPaths(clipShape(a).paths, ClipperLib.PolyType.ptSubject, true);
  c.AddPaths(clipShape(b).paths, ClipperLib.PolyType.ptClip, true);
  const out: ClipperLib.Paths = [];
  c.Execute(ClipperLib.ClipType.ctIntersection, out, ClipperLib.PolyFillType.pftNonZero, ClipperLib.PolyFillType.pftNonZero);
  return canonical(out.map((p) => p.map(({ X, Y }) => [X / 100, Y / 100] as [number, number])));
}

/** Rings as text, each turned to start at its least vertex and wound counter-clockwise, sorted: equal sets of rings give equal lists. */
function canonical(rings: Array<Array<[number, number]>>): string[] {
  return rings
    .map((r) => {
      const ccw = polygonsArea([[r]]) > 0 ? r : [...r].reverse();
      let k = 0;
      for (let i = 1; i < ccw.length; i++) if (ccw[i][0] < ccw[k][0] || (ccw[i][0] === ccw[k][0] && ccw[i][1] < ccw[k][1])) k = i;
      return JSON.stringify([...ccw.slice(k), ...ccw.slice(0, k)]);
    })
    .sort();
}

const ringsOf = (polys: Polygon2[]) => polys.flatMap((p) => p.map((r) => r.map(([x, y]) => [x, y] as [number, number])));

/** A union of annular sectors: reach-band-like regions with arcs, holes and separate parts. */
const sectorUnion = fc
  .array(
    fc.record({
      x: fc.integer({ min: -3000, max: 3000 }),
      y: fc.integer({ min: -3000, max: 3000 }),
      r0: fc.integer({ min: 0, max: 800 }),
      dr: fc.integer({ min: 200, max: 2500 }),
      a0: fc.integer({ min: -180, max: 180 }),
      span: fc.integer({ min: 20, max: 360 }),
    }),
    { minLength: 1, maxLength: 4 },
  )
  .map((parts) =>
    clipUnion(
      parts.map((s) => annularSector({ cx: s.x, cy: s.y, rInner: s.r0, rOuter: s.r0 + s.dr, startDeg: s.a0, endDeg: s.a0 + s.span, toleranceMm: 2 })),
    ),
  );

describe('crop to the shared box before intersecting', () => {
  it('gives exactly the polygons of the whole paths, on random unions of annular sectors [property; reference: clipper-lib on the uncropped paths]', () => {
    fc.assert(
      fc.property(sectorUnion, sectorUnion, (a, b) => {
        const ours = canonical(ringsOf(clipIntersectShapes(clipShape(a), clipShape(b))));
        expect(ours).toEqual(wholeIntersection(a, b));
      }),
      { numRuns: 150 },
    );
  });

  it('a large region against a small square: the same polygons, from a fraction of the region’s vertices [derived]', () => {
    const big = clipUnion([annularSector({ cx: 0, cy: 0, rInner: 500, rOuter: 2500, startDeg: -135, endDeg: 135, toleranceMm: 0.5 })]);
    const small: Polygon2[] = [[[[2000, -100], [2600, -100], [2600, 100], [2000, 100]]]];
    expect(canonical(ringsOf(clipIntersectShapes(clipShape(big), clipShape(small))))).toEqual(wholeIntersection(big, small));
    const cropped = cropPathsToBox(clipShape(big).paths, [200000, -10000, 260000, 10000]);
    const before = clipShape(big).paths.reduce((s, p) => s + p.length, 0);
    const after = cropped.reduce((s, p) => s + p.length, 0);
    expect(after).toBeLessThan(before / 10);
  });

  it('keeps vertices as they are, drops a ring wholly beyond one side and keeps one that goes round the box [derived]', () => {
    const box: [number, number, number, number] = [0, 0, 100, 100];
    const around: Path = [{ X: -50, Y: -50 }, { X: 150, Y: -50 }, { X: 150, Y: 150 }, { X: -50, Y: 150 }];
    const beyond: Path = [{ X: 200, Y: 0 }, { X: 300, Y: 0 }, { X: 300, Y: 100 }, { X: 200, Y: 100 }];
    // a square reaching into the box from the right, with three vertices far out on that side
    const reaching: Path = [{ X: 50, Y: 20 }, { X: 400, Y: 20 }, { X: 500, Y: 50 }, { X: 400, Y: 80 }, { X: 50, Y: 80 }];
    const out = cropPathsToBox([around, beyond, reaching], box);
    expect(out).toHaveLength(2);
    expect(out[0]).toBe(around);
    expect(out[1]).toEqual([{ X: 50, Y: 20 }, { X: 400, Y: 20 }, { X: 400, Y: 80 }, { X: 50, Y: 80 }]);
    for (const v of out[1]) expect(reaching).toContain(v);
  });

  it('a run that turns a corner of the box is not cut across the corner [derived]', () => {
    // below-left of the box, then left, then below: each neighbouring two share a side, but no one
    // side holds all three, and the chord from the first to the last would cut off a triangle
    // that covers part of the box, so all stay
    const box: [number, number, number, number] = [0, 0, 100, 100];
    const path: Path = [{ X: 50, Y: 50 }, { X: -5, Y: -5 }, { X: -5, Y: 80 }, { X: 80, Y: -5 }];
    expect(cropPathsToBox([path], box)[0]).toEqual(path);
    const turn: Path = [{ X: 50, Y: 50 }, { X: -10, Y: 50 }, { X: -10, Y: -10 }, { X: 50, Y: -10 }];
    expect(cropPathsToBox([turn], box)[0]).toEqual(turn);
  });
});
