import { interpolateRgb, scaleDiverging, type ScaleDiverging } from 'd3';
import type { AnalysisResult } from '@shared/analysis';
import { isReached } from '@shared/analysis';
import type { WorkPoint } from '@shared/schemas/layout';

/** Row orders of the coverage matrix. */
export type CoverageSort =
  | { by: 'layout' }
  /** By the point's best margin over all arms, least covered first (`asc`) or best covered first. */
  | { by: 'worst'; dir: 'asc' | 'desc' }
  /** By one arm's margin, shortest first. */
  | { by: 'arm'; arm: string };

/**
 * Points × arms margins in row order. `margins[r * armCount + c]` is the margin (mm, positive =
 * reached) of point `ids[r]` for arm `armIds[c]`, NaN when that pair was not analysed.
 */
export interface CoverageMatrix {
  ids: string[];
  armIds: string[];
  margins: Float64Array;
  /** Best margin of each row over the arms, NaN when none is known. */
  best: Float64Array;
  /** Rows whose best margin is below 0 (no arm reaches the point). */
  unreached: number;
  /** Largest |margin| in the matrix, mm (0 when empty). */
  maxAbs: number;
}

/** Builds the matrix of the layout's points and arms from the analysis' coverage, sorted as asked. */
export function buildCoverageMatrix(
  points: ReadonlyArray<Pick<WorkPoint, 'id'>>,
  armIds: ReadonlyArray<string>,
  coverage: AnalysisResult['coverage'] | null,
  sort: CoverageSort,
): CoverageMatrix {
  const n = points.length;
  const k = armIds.length;
  const raw = new Float64Array(n * k).fill(NaN);
  const rawBest = new Float64Array(n).fill(NaN);
  for (let r = 0; r < n; r++) {
    const row = coverage?.[points[r].id];
    if (!row) continue;
    let best = -Infinity;
    for (let c = 0; c < k; c++) {
      const m = row[armIds[c]];
      // An analysed point's row leaves out arms far beyond their reach (FAR_MM): −∞ = "far out of reach".
      const v = typeof m === 'number' && !Number.isNaN(m) ? m : -Infinity;
      raw[r * k + c] = v;
      if (v > best) best = v;
    }
    rawBest[r] = k > 0 ? best : NaN;
  }
  const order = sortedRowOrder(rawBest, raw, k, armIds, sort);
  const margins = new Float64Array(n * k);
  const best = new Float64Array(n);
  const ids = new Array<string>(n);
  let unreached = 0;
  let maxAbs = 0;
  for (let r = 0; r < n; r++) {
    const src = order[r];
    ids[r] = points[src].id;
    best[r] = rawBest[src];
    if (!Number.isNaN(rawBest[src]) && !isReached(rawBest[src])) unreached++;
    for (let c = 0; c < k; c++) {
      const m = raw[src * k + c];
      margins[r * k + c] = m;
      if (Number.isFinite(m) && Math.abs(m) > maxAbs) maxAbs = Math.abs(m);
    }
  }
  return { ids, armIds: [...armIds], margins, best, unreached, maxAbs };
}

/** Row indices in display order; unknown (NaN) keys go last, ties keep layout order (stable sort). */
export function sortedRowOrder(best: Float64Array, margins: Float64Array, armCount: number, armIds: ReadonlyArray<string>, sort: CoverageSort): Uint32Array {
  const n = best.length;
  const order = new Uint32Array(n);
  for (let i = 0; i < n; i++) order[i] = i;
  if (sort.by === 'layout') return order;
  let key: Float64Array;
  let sign = 1;
  if (sort.by === 'worst') {
    key = best;
    sign = sort.dir === 'asc' ? 1 : -1;
  } else {
    const c = armIds.indexOf(sort.arm);
    if (c < 0) throw new Error(`sort.arm ${sort.arm} is not one of the matrix arms`);
    key = new Float64Array(n);
    for (let i = 0; i < n; i++) key[i] = margins[i * armCount + c];
  }
  // Array.prototype.sort is stable (ES2019), so equal keys stay in layout order.
  const sorted = Array.from(order).sort((a, b) => {
    const ka = key[a];
    const kb = key[b];
    const na = Number.isNaN(ka);
    const nb = Number.isNaN(kb);
    if (na || nb) return na === nb ? 0 : na ? 1 : -1;
    return sign * (ka - kb);
  });
  return Uint32Array.from(sorted);
}

/**
 * Colours of the heat map: far short, just short, just reached, reached with room to spare; not
 * analysed. The two sides do not meet in one colour, so 1 mm short never looks like 1 mm reached.
 */
export const MARGIN_COLOURS = {
  short: '#b42318',
  shortEdge: '#f2cfc8',
  reachedEdge: '#d3eadb',
  reached: '#1f7a4d',
  unknown: '#d8d4c9',
} as const;

/**
 * The half-width of the colour scale, mm: the largest |margin| rounded up to a 1-2-5 step,
 * at least 50 mm and at most `cap` so one far-off point does not wash out the rest.
 */
export function marginScaleSpan(maxAbs: number, cap = 2000): number {
  if (!(maxAbs >= 0)) throw new Error('maxAbs must be a number ≥ 0');
  const m = Math.min(Math.max(maxAbs, 50), cap);
  const p = 10 ** Math.floor(Math.log10(m));
  for (const f of [1, 2, 5, 10]) if (f * p >= m - 1e-9) return f * p;
  return 10 * p;
}

/**
 * Diverging colour scale over margin mm: −span deep red … just below 0 pale red | 0 pale green …
 * +span deep green (a margin of 0 counts as reached, as in the analysis); clamped beyond ±span.
 */
const shortRamp = interpolateRgb(MARGIN_COLOURS.short, MARGIN_COLOURS.shortEdge);
const reachedRamp = interpolateRgb(MARGIN_COLOURS.reachedEdge, MARGIN_COLOURS.reached);

export function marginColourScale(span: number): ScaleDiverging<string> {
  if (!(span > 0)) throw new Error('span must be greater than 0');
  return scaleDiverging<string>()
    .domain([-span, 0, span])
    .interpolator((t: number) => (t < 0.5 ? shortRamp(t * 2) : reachedRamp((t - 0.5) * 2)))
    .clamp(true);
}

/** Geometry of the drawn matrix, CSS px. */
export interface MatrixGeometry {
  labelWidth: number;
  cellWidth: number;
  rowHeight: number;
}

/** The cell under a point of the scrolled matrix (x from the canvas' left, y from the matrix top), or null. */
export function cellAt(x: number, y: number, rows: number, cols: number, g: MatrixGeometry): { row: number; col: number | null } | null {
  if (y < 0 || x < 0) return null;
  const row = Math.floor(y / g.rowHeight);
  if (row >= rows) return null;
  if (x < g.labelWidth) return { row, col: null };
  const col = Math.floor((x - g.labelWidth) / g.cellWidth);
  return col < cols ? { row, col } : null;
}

/** The range of rows [first, last) that intersects a viewport of `height` px scrolled by `scrollTop`. */
export function visibleRows(scrollTop: number, height: number, rows: number, rowHeight: number): [number, number] {
  const first = Math.max(0, Math.floor(scrollTop / rowHeight));
  const last = Math.min(rows, Math.ceil((scrollTop + height) / rowHeight));
  return [first, Math.max(first, last)];
}
