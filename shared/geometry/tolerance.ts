/**
 * The one tolerance module of the core. Lengths are millimetres, angles degrees unless a name
 * says otherwise. Never compare floats with `===`; use `isClose`.
 */

/** Length below which two positions count as the same, mm. */
export const EPS_MM = 1e-6;
/** Angle below which two directions count as the same, degrees. */
export const EPS_DEG = 1e-9;
/** Grid every boolean operation snaps to before it runs, mm (0.01 mm). */
export const GRID_MM = 0.01;
/** Default chord tolerance for arc discretisation, mm. */
export const DEFAULT_CHORD_TOLERANCE_MM = 1;

/** True when |a − b| ≤ eps (absolute tolerance, default EPS_MM). */
export function isClose(a: number, b: number, eps: number = EPS_MM): boolean {
  return Math.abs(a - b) <= eps;
}

/** Throws a short message naming the argument unless value is a finite number. */
export function assertFinite(name: string, value: unknown): asserts value is number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new Error(`${name} must be a finite number`);
  }
}

/** Throws a short message naming the argument unless value is a finite number > 0. */
export function assertPositive(name: string, value: unknown): asserts value is number {
  assertFinite(name, value);
  if (value <= 0) throw new Error(`${name} must be greater than 0`);
}
