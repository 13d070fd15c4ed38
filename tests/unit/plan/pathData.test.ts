import { geoPath } from 'd3';
import { describe, expect, it } from 'vitest';
import { geometryPath } from '../../../frontend/src/plan/pathData';

// Independent implementation: d3-geo's geoPath with no projection draws planar coordinates as
// they are (d3 7.9). Both strings are parsed to numbers and compared.
const numbers = (d: string) => (d.match(/-?\d+(\.\d+)?(e-?\d+)?/g) ?? []).map(Number);
const commands = (d: string) => d.replace(/[^MLZ]/g, '');

describe('geometryPath', () => {
  it('draws a line string like d3 geoPath', () => {
    const g = { type: 'LineString' as const, coordinates: [[0, 0], [2400.5, 0], [2400.5, -1600.25]] };
    const ours = geometryPath(g);
    const theirs = geoPath()(g)!;
    expect(commands(ours)).toBe(commands(theirs));
    expect(numbers(ours)).toEqual(numbers(theirs));
  });

  it('draws a polygon with a hole as closed rings like d3 geoPath', () => {
    const g = {
      type: 'Polygon' as const,
      coordinates: [
        [[0, 0], [8000, 0], [8000, 8000], [0, 8000], [0, 0]],
        [[3000, 3000], [3000, 5000], [5000, 5000], [5000, 3000], [3000, 3000]],
      ],
    };
    const ours = geometryPath(g);
    const theirs = geoPath()(g)!;
    expect(commands(ours).split('Z').length).toBe(3);
    // geoPath drops each ring's repeated closing point; ours keeps it before Z. Compare the rings' points.
    const ring = (d: string) => d.split('Z').filter(Boolean).map((r) => numbers(r));
    const a = ring(ours).map((r) => r.slice(0, -2));
    expect(a).toEqual(ring(theirs));
  });

  it('writes coordinates to 0.01 mm and never as −0', () => {
    expect(geometryPath({ type: 'LineString', coordinates: [[-0.001, 1.23456], [10, -0]] })).toBe('M0,1.23L10,0');
  });

  it('draws nothing for points and missing geometry', () => {
    expect(geometryPath({ type: 'Point', coordinates: [1, 2] })).toBe('');
    expect(geometryPath(null)).toBe('');
  });
});
