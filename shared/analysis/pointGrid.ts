import { addToBounds, emptyBounds } from '../geometry/bounds';
import type { WorkPoint } from '../schemas/layout';

/** Uniform grid over work points (plan mm) for "points within radius R of (x, y)" queries. */
export interface PointGrid {
  cell: number;
  minX: number;
  minY: number;
  cols: number;
  rows: number;
  /** Point indices by cell (CSR layout: start offsets + flat indices). */
  start: Int32Array;
  items: Int32Array;
  /** Plan coordinates of the points in `items` order, so that a query reads memory in sequence. */
  xs: Float64Array;
  ys: Float64Array;
}

/** Builds the grid once per set of work points (cell ≈ 1 m keeps a query to a few dozen cells). */
export function buildPointGrid(points: ReadonlyArray<WorkPoint>, cell = 1000): PointGrid {
  const box = emptyBounds();
  for (const p of points) addToBounds(box, p.x, p.y);
  const { minX, minY, maxX, maxY } = box;
  if (!points.length) return { cell, minX: 0, minY: 0, cols: 1, rows: 1, start: new Int32Array(2), items: new Int32Array(0), xs: new Float64Array(0), ys: new Float64Array(0) };
  // Keep the grid to at most ~1M cells for very spread-out points.
  while (((maxX - minX) / cell + 1) * ((maxY - minY) / cell + 1) > 1e6) cell *= 2;
  const cols = Math.floor((maxX - minX) / cell) + 1;
  const rows = Math.floor((maxY - minY) / cell) + 1;
  const count = new Int32Array(cols * rows + 1);
  const cellOf = new Int32Array(points.length);
  points.forEach((p, i) => {
    const c = Math.floor((p.y - minY) / cell) * cols + Math.floor((p.x - minX) / cell);
    cellOf[i] = c;
    count[c + 1]++;
  });
  for (let i = 1; i < count.length; i++) count[i] += count[i - 1];
  const items = new Int32Array(points.length);
  const fill = count.slice(0, -1);
  for (let i = 0; i < points.length; i++) items[fill[cellOf[i]]++] = i;
  const xs = new Float64Array(points.length);
  const ys = new Float64Array(points.length);
  for (let k = 0; k < items.length; k++) {
    xs[k] = points[items[k]].x;
    ys[k] = points[items[k]].y;
  }
  return { cell, minX, minY, cols, rows, start: count, items, xs, ys };
}

/** Indices of the points within `radius` of (x, y), ascending (the points the grid was built from). */
export function pointsNear(grid: PointGrid, x: number, y: number, radius: number): Int32Array {
  const c0 = Math.max(0, Math.floor((x - radius - grid.minX) / grid.cell));
  const c1 = Math.min(grid.cols - 1, Math.floor((x + radius - grid.minX) / grid.cell));
  const r0 = Math.max(0, Math.floor((y - radius - grid.minY) / grid.cell));
  const r1 = Math.min(grid.rows - 1, Math.floor((y + radius - grid.minY) / grid.cell));
  const { start, items, xs, ys } = grid;
  let out = new Int32Array(64);
  let n = 0;
  const r2 = radius * radius;
  for (let r = r0; r <= r1; r++) {
    for (let k = start[r * grid.cols + c0], end = start[r * grid.cols + c1 + 1]; k < end; k++) {
      const dx = xs[k] - x;
      const dy = ys[k] - y;
      if (dx * dx + dy * dy > r2) continue;
      if (n === out.length) {
        const grown = new Int32Array(n * 2);
        grown.set(out);
        out = grown;
      }
      out[n++] = items[k];
    }
  }
  return out.slice(0, n).sort();
}
