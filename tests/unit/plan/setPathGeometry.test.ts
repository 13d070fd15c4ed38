// A path's `d` is written again only when its geometry object changes: the worker's deltas keep
// unchanged geometry by identity, so a drag redraws the moved arm's paths alone.
import type { Geometry } from 'geojson';
import { describe, expect, it } from 'vitest';
import { geometryPath, setPathGeometry } from '../../../frontend/src/plan/pathData';

function fakePath() {
  const writes: string[] = [];
  return { writes, el: { setAttribute: (name: string, v: string) => writes.push(`${name}=${v}`) } as unknown as Element };
}

describe('setPathGeometry', () => {
  it('writes d once per geometry object, again for a new object, and clears for null', () => {
    const a: Geometry = { type: 'Polygon', coordinates: [[[0, 0], [1000, 0], [1000, 1000], [0, 0]]] };
    const { writes, el } = fakePath();
    setPathGeometry(el, a);
    setPathGeometry(el, a);
    expect(writes).toEqual([`d=${geometryPath(a)}`]);
    const b: Geometry = structuredClone(a);
    setPathGeometry(el, b); // equal but not the same object: written (identity is the rule)
    setPathGeometry(el, null);
    setPathGeometry(el, undefined);
    expect(writes).toEqual([`d=${geometryPath(a)}`, `d=${geometryPath(b)}`, 'd=']);
    // another element is its own
    const other = fakePath();
    setPathGeometry(other.el, a);
    expect(other.writes).toHaveLength(1);
  });
});
