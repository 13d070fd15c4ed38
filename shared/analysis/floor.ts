import type { FeatureCollection, Geometry, Position } from 'geojson';
import { clipUnion } from '../geometry/clipper';
import type { Polygon2, Ring } from '../geometry/types';
import type { PreparedFloor, StructureItem } from './types';

export interface FloorLayer {
  name: string;
  role: 'outline' | 'wall' | 'column' | 'obstacle' | 'ignore';
  /** mm above the floor; null = full height. */
  height: number | null;
}

const ring = (positions: ReadonlyArray<Position>): Ring => {
  const r: Ring = positions.map((p) => [p[0], p[1]]);
  if (r.length > 1 && r[0][0] === r[r.length - 1][0] && r[0][1] === r[r.length - 1][1]) r.pop();
  return r;
};

function bboxOf(polygons: Polygon2[], lines: Array<Array<[number, number]>>): [number, number, number, number] {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  const add = (x: number, y: number) => {
    if (x < minX) minX = x;
    if (y < minY) minY = y;
    if (x > maxX) maxX = x;
    if (y > maxY) maxY = y;
  };
  for (const p of polygons) for (const [x, y] of p[0] ?? []) add(x, y);
  for (const l of lines) for (const [x, y] of l) add(x, y);
  return [minX, minY, maxX, maxY];
}

function shapes(g: Geometry): { polygons: Polygon2[]; lines: Array<Array<[number, number]>> } {
  switch (g.type) {
    case 'Polygon':
      return { polygons: [g.coordinates.map(ring)], lines: [] };
    case 'MultiPolygon':
      return { polygons: g.coordinates.map((p) => p.map(ring)), lines: [] };
    case 'LineString':
      return { polygons: [], lines: [g.coordinates.map((p) => [p[0], p[1]] as [number, number])] };
    case 'MultiLineString':
      return { polygons: [], lines: g.coordinates.map((l) => l.map((p) => [p[0], p[1]] as [number, number])) };
    default:
      return { polygons: [], lines: [] };
  }
}

/**
 * Turns an imported floor plan (plan mm) and its layer roles into what the analysis checks against:
 * the floor outline (union of the outline layers' closed rings) and one item per wall, column or
 * obstacle feature with its top height (null → full height).
 */
export function prepareFloor(geometry: Readonly<FeatureCollection>, layers: ReadonlyArray<FloorLayer>): PreparedFloor {
  const byName = new Map(layers.map((l) => [l.name, l]));
  const outlinePolys: Polygon2[] = [];
  const structures: StructureItem[] = [];
  geometry.features.forEach((f, index) => {
    const layerName = String((f.properties as { layer?: string } | null)?.layer ?? '');
    const layer = byName.get(layerName);
    if (!layer || layer.role === 'ignore' || !f.geometry) return;
    const { polygons, lines } = shapes(f.geometry);
    if (layer.role === 'outline') {
      outlinePolys.push(...polygons);
      return;
    }
    if (polygons.length === 0 && lines.length === 0) return;
    structures.push({
      id: `${layerName}#${index}`,
      layer: layerName,
      role: layer.role,
      top: layer.height == null ? Infinity : layer.height,
      polygons,
      lines,
      bbox: bboxOf(polygons, lines),
    });
  });
  return { outline: outlinePolys.length ? clipUnion(outlinePolys) : [], structures };
}
