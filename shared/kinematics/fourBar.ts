import { normalizeDeg, toDegrees, toRadians } from '../geometry/angles';
import { assertPositive } from '../geometry/tolerance';

/**
 * Planar four-bar linkage solver (Norton's naming): ground d from pivot O2 to pivot O4, crank a
 * (input, turns about O2), coupler b, rocker c (output, turns about O4). Angles are measured
 * counter-clockwise from the ground line O2→O4 unless a ground angle θ1 is given, in which case
 * all angles are in the frame where the ground line lies at θ1. Two assembly branches:
 * "open" (crank and rocker on the same side; θ4 = 180° − β − ψ) and "crossed" (θ4 = 180° − β + ψ).
 * A pose that cannot assemble is a value ({ok:false, reason:'not-assemblable'}), never NaN.
 */
export interface FourBarLinks {
  /** Crank (input) length, mm. */
  a: number;
  /** Coupler length, mm. */
  b: number;
  /** Rocker (output) length, mm. */
  c: number;
  /** Ground length, mm. */
  d: number;
}

export type FourBarBranch = 'open' | 'crossed';

export type FourBarPose =
  | { ok: true; theta3Deg: number; theta4Deg: number; transmissionDeg: number }
  | { ok: false; reason: 'not-assemblable' };

export type GrashofClass = 'crank-rocker' | 'double-crank' | 'double-rocker' | 'change-point' | 'triple-rocker';

function checkLinks(l: Readonly<FourBarLinks>): void {
  assertPositive('a', l.a);
  assertPositive('b', l.b);
  assertPositive('c', l.c);
  assertPositive('d', l.d);
}

/**
 * Rocker angle θ4 (rad, from the ground line) for input θ2 (rad, from the ground line) by the law
 * of cosines route; null when the linkage does not assemble. Hot-loop form, no checks.
 */
export function rockerAngleRad(a: number, b: number, c: number, d: number, theta2: number, open: boolean): number | null {
  const sx = a * Math.sin(theta2);
  const cx = d - a * Math.cos(theta2);
  const f2 = sx * sx + cx * cx;
  const f = Math.sqrt(f2);
  if (f === 0) return null;
  const cosPsi = (c * c + f2 - b * b) / (2 * c * f);
  if (cosPsi > 1 || cosPsi < -1) {
    // Allow round-off at the toggle positions.
    if (cosPsi > 1 + 1e-12 || cosPsi < -1 - 1e-12) return null;
  }
  const psi = Math.acos(Math.min(1, Math.max(-1, cosPsi)));
  const beta = Math.atan2(sx, cx);
  return open ? Math.PI - beta - psi : Math.PI - beta + psi;
}

/**
 * Coupler and rocker angles of a four-bar from the crank angle, degrees, by the law of cosines
 * (f² = a² + d² − 2ad·cos θ2, ψ from the triangle b, c, f, θ4 = 180° − β ∓ ψ); all angles in the
 * frame where the ground line lies at groundDeg (default 0).
 */
export function fourBarPose(links: Readonly<FourBarLinks>, theta2Deg: number, branch: FourBarBranch, groundDeg = 0): FourBarPose {
  checkLinks(links);
  const { a, b, c, d } = links;
  const t2 = toRadians(theta2Deg - groundDeg);
  const t4 = rockerAngleRad(a, b, c, d, t2, branch === 'open');
  if (t4 === null) return { ok: false, reason: 'not-assemblable' };
  // Coupler from crank tip A to rocker tip B.
  const ax = a * Math.cos(t2);
  const ay = a * Math.sin(t2);
  const bx = d + c * Math.cos(t4);
  const by = c * Math.sin(t4);
  const t3 = Math.atan2(by - ay, bx - ax);
  return {
    ok: true,
    theta3Deg: normalizeDeg(toDegrees(t3) + groundDeg),
    theta4Deg: normalizeDeg(toDegrees(t4) + groundDeg),
    transmissionDeg: transmissionAngleOf(t3, t4),
  };
}

function transmissionAngleOf(t3: number, t4: number): number {
  let mu = Math.abs(normalizeDeg(toDegrees(t3 - t4)));
  if (mu > 90) mu = 180 - mu;
  return mu;
}

/**
 * Transmission angle μ between coupler and rocker, degrees in [0°, 90°] (Norton's convention:
 * |θ3 − θ4| folded to the acute side), from cos μ = (b² + c² − f²)/(2bc); null when not assemblable.
 */
export function transmissionAngle(links: Readonly<FourBarLinks>, theta2Deg: number): number | null {
  checkLinks(links);
  const { a, b, c, d } = links;
  const t2 = toRadians(theta2Deg);
  const f2 = a * a + d * d - 2 * a * d * Math.cos(t2);
  const cosMu = (b * b + c * c - f2) / (2 * b * c);
  if (cosMu > 1 + 1e-12 || cosMu < -1 - 1e-12) return null;
  let mu = toDegrees(Math.acos(Math.min(1, Math.max(-1, cosMu))));
  if (mu > 90) mu = 180 - mu;
  return mu;
}

/**
 * Grashof classification: with s + l vs p + q (shortest, longest, the other two): s + l < p + q and
 * the shortest link is the ground → double crank, the coupler → double rocker, a side link →
 * crank-rocker; s + l = p + q → change point; s + l > p + q → non-Grashof triple rocker.
 */
export function grashofClass(links: Readonly<FourBarLinks>, eps = 1e-9): { kind: GrashofClass; grashof: boolean; shortest: keyof FourBarLinks } {
  checkLinks(links);
  const entries = (['a', 'b', 'c', 'd'] as const).map((k) => [k, links[k]] as const);
  const sorted = [...entries].sort((x, y) => x[1] - y[1]);
  const s = sorted[0][1];
  const l = sorted[3][1];
  const pq = sorted[1][1] + sorted[2][1];
  const shortest = sorted[0][0];
  const scale = Math.max(l, 1);
  if (Math.abs(s + l - pq) <= eps * scale) return { kind: 'change-point', grashof: true, shortest };
  if (s + l > pq) return { kind: 'triple-rocker', grashof: false, shortest };
  if (shortest === 'd') return { kind: 'double-crank', grashof: true, shortest };
  if (shortest === 'b') return { kind: 'double-rocker', grashof: true, shortest };
  return { kind: 'crank-rocker', grashof: true, shortest };
}

/**
 * Input (crank) angle ranges over which the four-bar assembles, degrees from the ground line,
 * from |b − c| ≤ f ≤ b + c with f² = a² + d² − 2ad·cos θ2 (both branches share them). Returns
 * [] when it never assembles, [[−180, 180]] for full rotation, else one or two intervals.
 */
export function assemblyRanges(links: Readonly<FourBarLinks>): Array<[number, number]> {
  checkLinks(links);
  const { a, b, c, d } = links;
  const kHi = (a * a + d * d - (b + c) * (b + c)) / (2 * a * d);
  const kLo = (a * a + d * d - (b - c) * (b - c)) / (2 * a * d);
  if (kHi > 1 || kLo < -1) return [];
  const lo = toDegrees(Math.acos(Math.min(1, kLo)));
  const hi = toDegrees(Math.acos(Math.max(-1, kHi)));
  if (lo <= 0 && hi >= 180) return [[-180, 180]];
  if (lo <= 0) return [[-hi, hi]];
  if (hi >= 180) return [[lo, 360 - lo]];
  return [
    [-hi, -lo],
    [lo, hi],
  ];
}
