import type { Geometry, Position } from 'geojson';

/**
 * SVG path data for plan geometry in plan coordinates (mm, y north, drawn under a y-mirroring
 * transform). Coordinates are written to 0.01 mm, far below what a floor plan is drawn to.
 */

function num(v: number): string {
  const r = Math.round(v * 100) / 100;
  return Object.is(r, -0) ? '0' : String(r);
}

function ringPath(coords: readonly Position[], close: boolean): string {
  if (coords.length === 0) return '';
  let d = `M${num(coords[0][0])},${num(coords[0][1])}`;
  for (let i = 1; i < coords.length; i += 1) d += `L${num(coords[i][0])},${num(coords[i][1])}`;
  if (close) d += 'Z';
  return d;
}

/**
 * Path data of a LineString, MultiLineString, Polygon or MultiPolygon in plan mm (polygon rings
 * closed with Z, so even-odd fill leaves holes open); '' for points and empty geometry.
 */
export function geometryPath(g: Geometry | null | undefined): string {
  if (!g) return '';
  switch (g.type) {
    case 'LineString':
      return ringPath(g.coordinates, false);
    case 'MultiLineString':
      return g.coordinates.map((c) => ringPath(c, false)).join('');
    case 'Polygon':
      return g.coordinates.map((r) => ringPath(r, true)).join('');
    case 'MultiPolygon':
      return g.coordinates.flatMap((p) => p.map((r) => ringPath(r, true))).join('');
    case 'GeometryCollection':
      return g.geometries.map((x) => geometryPath(x)).join('');
    default:
      return '';
  }
}

/** The geometry each path element was last drawn from (an element not in the map has not been drawn). */
const drawnFrom = new WeakMap<Element, Geometry | null>();

/**
 * Sets a path element's `d` from a geometry only when the geometry object is not the one it was
 * last drawn from: results that keep unchanged geometry by identity (the analysis worker's deltas)
 * cost no path string and no attribute change for it.
 */
export function setPathGeometry(el: Element, g: Geometry | null | undefined): void {
  const geometry = g ?? null;
  if (drawnFrom.has(el) && drawnFrom.get(el) === geometry) return;
  drawnFrom.set(el, geometry);
  el.setAttribute('d', geometryPath(geometry));
}
