import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { addToBounds, emptyBounds, isEmptyBounds, padBounds, pointsBounds, polygonsBounds } from '@shared/geometry/bounds';
import { nearestPointOnSegment, nearestSegmentParam, pointSegmentDistance, pointSegmentDistance2Rel } from '@shared/geometry/segmentDistance';

// Micrometre steps: the hot form needs a finite 1/|b − a|², which a segment shorter than ~1e-154 mm would not give.
const coord = fc.integer({ min: -1e7, max: 1e7 }).map((n) => n / 1000);

describe('point–segment distance', () => {
  it('worked values: a 3-4-5 right triangle, the foot inside the segment, past either end, a degenerate segment', () => {
    // Pythagoras: from (3, 4) to the segment (0, 0)–(10, 0) the foot is (3, 0), distance 4.
    expect(pointSegmentDistance(3, 4, 0, 0, 10, 0)).toBe(4);
    expect(nearestPointOnSegment(3, 4, 0, 0, 10, 0)).toEqual([3, 0]);
    // Past the end (13, 4): nearest is the end (10, 0), distance 5; before the start likewise.
    expect(pointSegmentDistance(13, 4, 0, 0, 10, 0)).toBe(5);
    expect(pointSegmentDistance(-3, -4, 0, 0, 10, 0)).toBe(5);
    expect(nearestSegmentParam(13, 4, 0, 0, 10, 0)).toBe(1);
    // A zero-length segment is its point.
    expect(pointSegmentDistance(3, 4, 0, 0, 0, 0)).toBe(5);
  });

  it('the squared hot-loop form agrees with the plain form (to rounding) and never exceeds the distance to either end', () => {
    fc.assert(
      fc.property(coord, coord, coord, coord, coord, coord, (x, y, ax, ay, bx, by) => {
        const dx = bx - ax;
        const dy = by - ay;
        const l2 = dx * dx + dy * dy;
        const d = pointSegmentDistance(x, y, ax, ay, bx, by);
        const d2 = pointSegmentDistance2Rel(x - ax, y - ay, dx, dy, l2 > 0 ? 1 / l2 : 0);
        expect(Math.sqrt(d2)).toBeCloseTo(d, 5);
        expect(d).toBeLessThanOrEqual(Math.hypot(x - ax, y - ay) + 1e-9);
        expect(d).toBeLessThanOrEqual(Math.hypot(x - bx, y - by) + 1e-9);
      }),
      { numRuns: 2000 },
    );
  });
});

describe('bounds', () => {
  it('hold every point added, and nothing before the first', () => {
    const b = emptyBounds();
    expect(isEmptyBounds(b)).toBe(true);
    addToBounds(b, 3, -1);
    addToBounds(b, -2, 5);
    expect(b).toEqual({ minX: -2, minY: -1, maxX: 3, maxY: 5 });
    expect(padBounds(b, 10)).toEqual({ minX: -12, minY: -11, maxX: 13, maxY: 15 });
    expect(pointsBounds([])).toBeNull();
    expect(pointsBounds([[1, 2]])).toEqual({ minX: 1, minY: 2, maxX: 1, maxY: 2 });
    expect(polygonsBounds([[[[0, 0], [4, 0], [4, 3]], [[1, 1], [2, 1], [2, -7]]]])).toEqual([0, -7, 4, 3]);
    expect(polygonsBounds([])).toBeNull();
  });
});
