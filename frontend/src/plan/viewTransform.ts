/**
 * The view of the plan canvas: one uniform scale `k` (screen px per plan mm) and a screen offset
 * `(x, y)` in px, as d3-zoom keeps it. The plan frame has y north (up) while SVG y points down,
 * so a plan point (px, py) is drawn at screen (x + k·px, y − k·py): the zoom transform applied
 * to the point mirrored in the x axis.
 */

/** A point in the plan frame, mm (x east, y north). */
export interface PlanPoint {
  x: number;
  y: number;
}

/** An axis-aligned box in the plan frame, mm. */
export interface PlanBounds {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

/** A view: scale k (px per mm) and offset x, y (px) — the fields of a d3 ZoomTransform. */
export interface ViewTransform {
  k: number;
  x: number;
  y: number;
}

/** Extent used to fit a plan whose bounds have no width and no height (a single point), mm. */
export const DEGENERATE_EXTENT_MM = 10_000;

function checkTransform(t: ViewTransform, name: string): void {
  if (!(t.k > 0) || !Number.isFinite(t.k) || !Number.isFinite(t.x) || !Number.isFinite(t.y)) {
    throw new RangeError(`${name}: needs a positive finite scale and a finite offset`);
  }
}

/** True when every field is finite and min ≤ max on both axes. */
export function isValidBounds(b: PlanBounds | null | undefined): b is PlanBounds {
  return (
    b != null &&
    [b.minX, b.minY, b.maxX, b.maxY].every(Number.isFinite) &&
    b.minX <= b.maxX &&
    b.minY <= b.maxY
  );
}

/** Screen position (px) of a plan point (mm) under view t: (x + k·px, y − k·py). */
export function planToScreen(t: ViewTransform, p: PlanPoint): [number, number] {
  return [t.x + t.k * p.x, t.y - t.k * p.y];
}

/** Plan point (mm) under a screen position (px) for view t; the inverse of planToScreen. */
export function screenToPlan(t: ViewTransform, sx: number, sy: number): PlanPoint {
  checkTransform(t, 'transform');
  return { x: (sx - t.x) / t.k, y: (t.y - sy) / t.k };
}

/**
 * The view that shows `bounds` whole and centred in a `width` × `height` px viewport with
 * `padding` px kept free on every side (uniform scale: the smaller of the two axis ratios).
 */
export function fitTransform(bounds: PlanBounds, width: number, height: number, padding = 24): ViewTransform {
  if (!isValidBounds(bounds)) throw new RangeError('bounds: needs finite min ≤ max on both axes');
  if (!(width > 0) || !(height > 0)) throw new RangeError('width, height: the viewport must have a size');
  if (!(padding >= 0)) throw new RangeError('padding: must be zero or more px');
  const availW = Math.max(1, width - 2 * padding);
  const availH = Math.max(1, height - 2 * padding);
  let bw = bounds.maxX - bounds.minX;
  let bh = bounds.maxY - bounds.minY;
  if (bw <= 0 && bh <= 0) bw = bh = DEGENERATE_EXTENT_MM;
  const k = Math.min(bw > 0 ? availW / bw : Infinity, bh > 0 ? availH / bh : Infinity);
  const cx = (bounds.minX + bounds.maxX) / 2;
  const cy = (bounds.minY + bounds.maxY) / 2;
  return { k, x: width / 2 - k * cx, y: height / 2 + k * cy };
}
