import type { Degrees, Radians } from './types';

const DEG_PER_RAD = 180 / Math.PI;

/** Degrees → radians. */
export function toRadians(deg: Degrees): Radians {
  return deg / DEG_PER_RAD;
}

/** Radians → degrees. */
export function toDegrees(rad: Radians): Degrees {
  return rad * DEG_PER_RAD;
}

/** Wraps an angle into (−180°, 180°], degrees. */
export function normalizeDeg(deg: Degrees): Degrees {
  let a = deg % 360;
  if (a <= -180) a += 360;
  else if (a > 180) a -= 360;
  return a;
}

/** Wraps an angle into [0°, 360°), degrees. */
export function normalizeDeg360(deg: Degrees): Degrees {
  const a = deg % 360;
  return a < 0 ? a + 360 : a;
}

/** Wraps an angle into (−π, π], radians. */
export function normalizeRad(rad: Radians): Radians {
  let a = rad % (2 * Math.PI);
  if (a <= -Math.PI) a += 2 * Math.PI;
  else if (a > Math.PI) a -= 2 * Math.PI;
  return a;
}

/**
 * Signed angular margin of a bearing inside the range [min, max] (radians, any winding): positive
 * inside (distance to the nearer end), negative outside (distance to the nearer end). A range of
 * 2π or more has no ends: +Infinity.
 */
export function angularMargin(bearing: Radians, min: Radians, max: Radians): Radians {
  const span = max - min;
  if (span >= 2 * Math.PI - 1e-12) return Number.POSITIVE_INFINITY;
  const twoPi = 2 * Math.PI;
  let t = (bearing - min) % twoPi;
  if (t < 0) t += twoPi;
  if (t <= span) return Math.min(t, span - t);
  return -Math.min(t - span, twoPi - t);
}
