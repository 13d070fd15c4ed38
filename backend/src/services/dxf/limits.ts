/**
 * The one place for the import engine's tolerances and size limits (plan millimetres unless a
 * name says otherwise).
 */

/** Largest distance between a curve and the polyline that replaces it, mm. */
export const DEFAULT_CHORD_TOLERANCE_MM = 1;
/** Smallest and largest chord tolerance a caller may ask for, mm. */
export const MIN_CHORD_TOLERANCE_MM = 0.01;
export const MAX_CHORD_TOLERANCE_MM = 1000;

/** Ends of lines and arcs closer than this are taken as one point when chains are joined, mm. */
export const DEFAULT_JOIN_TOLERANCE_MM = 1;

/**
 * No point of a floor plan lies farther than this from the drawing origin, mm (2^49 mm, about
 * 563 million km): beyond it float64 cannot place a point to 0.1 mm (its spacing there is
 * 2^-4 mm). Map-grid coordinates lie far inside; the import moves them to a local origin.
 */
export const MAX_COORDINATE_MM = 2 ** 49;

/** Most segments one curve is cut into; a larger count means a coarser approximation. */
export const MAX_SEGMENTS_PER_CURVE = 4096;

/** Deepest block nesting followed (INSERT inside a block inside a block …). */
export const MAX_BLOCK_DEPTH = 32;

/** Most entity instances one import places (after block expansion). */
export const MAX_ENTITY_INSTANCES = 2_000_000;

/** Most plan points one import holds. */
export const MAX_OUTPUT_POINTS = 5_000_000;

/** Rounds a plan coordinate to a grid of 1e-6 mm, a nanometre far below drawing accuracy (and turns −0 into 0). */
export function roundMm(v: number): number {
  return Math.round(v * 1e6) / 1e6 || 0;
}
