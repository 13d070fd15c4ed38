import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildPointGrid, pointsNear } from '@shared/analysis/pointGrid';
import type { WorkPoint } from '@shared/schemas/layout';

// The grid query against its definition: every point within the radius (Euclidean distance, plan
// mm), in ascending index order, found by walking all points.
describe('work-point grid', () => {
  // Coordinates to 0.001 mm (no subnormal numbers, whose squares vanish below any radius).
  const coord = (min: number, max: number) => fc.integer({ min: min * 1000, max: max * 1000 }).map((v) => v / 1000);
  const point = fc.record({ x: coord(-20000, 60000), y: coord(-5000, 30000) });
  it('finds exactly the points within the radius, ascending', () => {
    fc.assert(
      fc.property(fc.array(point, { maxLength: 400 }), point, coord(0, 9000), fc.integer({ min: 50, max: 3000 }), (xy, c, radius, cell) => {
        const points: WorkPoint[] = xy.map((p, i) => ({ id: `P${i}`, x: p.x, y: p.y, z: 1000, approach: 'top', tag: '' }));
        const grid = buildPointGrid(points, cell);
        const brute = points.flatMap((p, i) => ((p.x - c.x) ** 2 + (p.y - c.y) ** 2 <= radius * radius ? [i] : []));
        expect([...pointsNear(grid, c.x, c.y, radius)]).toEqual(brute);
      }),
      { numRuns: 300 },
    );
  });
  it('answers an empty set of points', () => {
    expect([...pointsNear(buildPointGrid([]), 0, 0, 1000)]).toEqual([]);
  });
});
