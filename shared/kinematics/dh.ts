/**
 * Denavit–Hartenberg transforms and chain products.
 *
 * A homogeneous transform is a `Mat4`: a Float64Array of 16 numbers, ROW-MAJOR, element
 * (row i, column j) at index 4·i + j, so the translation sits at indices 3, 7, 11 and the
 * rotation's rows at 0–2, 4–6, 8–10. Lengths in mm, angles in RADIANS inside this module
 * (the family modules convert degrees once at their edge).
 *
 * Conventions (both published in the standard robotics texts):
 * - standard DH: A_i = Rz(θ_i) · Tz(d_i) · Tx(a_i) · Rx(α_i); joint i moves about/along z_{i-1};
 * - modified DH (Craig): A_i = Rx(α_{i-1}) · Tx(a_{i-1}) · Rz(θ_i) · Tz(d_i); joint i moves about/along
 *   z_i. A row of a modified table carries (α_{i-1}, a_{i-1}, θ_i, d_i), i.e. the `a`/`alpha` of
 *   row i describe the link BEFORE joint i, as modified tables are printed.
 */

/** 4×4 homogeneous transform, row-major Float64Array(16); see the module comment. */
export type Mat4 = Float64Array;

export type DhConvention = 'standard' | 'modified';

/** One DH row with its joint variable already applied: lengths mm, angles rad. */
export interface DhRow {
  a: number;
  alpha: number;
  d: number;
  theta: number;
}

/** Constant part of one joint of a chain: the variable adds to θ (revolute, rad) or d (prismatic, mm). */
export interface DhJoint {
  kind: 'revolute' | 'prismatic';
  a: number;
  alpha: number;
  d: number;
  theta: number;
}

/** Identity transform (written into `out` when given). */
export function mat4Identity(out: Mat4 = new Float64Array(16)): Mat4 {
  out.fill(0);
  out[0] = 1;
  out[5] = 1;
  out[10] = 1;
  out[15] = 1;
  return out;
}

/**
 * Product a·b of two homogeneous transforms (rigid: last rows are 0 0 0 1), written into `out`;
 * `out` may be `a` or `b`. No allocation when `out` is given.
 */
export function mat4Multiply(a: Mat4, b: Mat4, out: Mat4 = new Float64Array(16)): Mat4 {
  const a00 = a[0], a01 = a[1], a02 = a[2], a03 = a[3];
  const a10 = a[4], a11 = a[5], a12 = a[6], a13 = a[7];
  const a20 = a[8], a21 = a[9], a22 = a[10], a23 = a[11];
  const b00 = b[0], b01 = b[1], b02 = b[2], b03 = b[3];
  const b10 = b[4], b11 = b[5], b12 = b[6], b13 = b[7];
  const b20 = b[8], b21 = b[9], b22 = b[10], b23 = b[11];
  out[0] = a00 * b00 + a01 * b10 + a02 * b20;
  out[1] = a00 * b01 + a01 * b11 + a02 * b21;
  out[2] = a00 * b02 + a01 * b12 + a02 * b22;
  out[3] = a00 * b03 + a01 * b13 + a02 * b23 + a03;
  out[4] = a10 * b00 + a11 * b10 + a12 * b20;
  out[5] = a10 * b01 + a11 * b11 + a12 * b21;
  out[6] = a10 * b02 + a11 * b12 + a12 * b22;
  out[7] = a10 * b03 + a11 * b13 + a12 * b23 + a13;
  out[8] = a20 * b00 + a21 * b10 + a22 * b20;
  out[9] = a20 * b01 + a21 * b11 + a22 * b21;
  out[10] = a20 * b02 + a21 * b12 + a22 * b22;
  out[11] = a20 * b03 + a21 * b13 + a22 * b23 + a23;
  out[12] = 0;
  out[13] = 0;
  out[14] = 0;
  out[15] = 1;
  return out;
}

/** Pure translation transform (x, y, z in mm). */
export function mat4Translation(x: number, y: number, z: number, out: Mat4 = new Float64Array(16)): Mat4 {
  mat4Identity(out);
  out[3] = x;
  out[7] = y;
  out[11] = z;
  return out;
}

/** Standard DH link transform A = Rz(θ)·Tz(d)·Tx(a)·Rx(α) (Denavit–Hartenberg), mm and rad. */
export function standardDhTransform(theta: number, d: number, a: number, alpha: number, out: Mat4 = new Float64Array(16)): Mat4 {
  const ct = Math.cos(theta), st = Math.sin(theta);
  const ca = Math.cos(alpha), sa = Math.sin(alpha);
  out[0] = ct; out[1] = -st * ca; out[2] = st * sa; out[3] = a * ct;
  out[4] = st; out[5] = ct * ca; out[6] = -ct * sa; out[7] = a * st;
  out[8] = 0; out[9] = sa; out[10] = ca; out[11] = d;
  out[12] = 0; out[13] = 0; out[14] = 0; out[15] = 1;
  return out;
}

/** Modified (Craig) DH link transform A = Rx(α_{i-1})·Tx(a_{i-1})·Rz(θ_i)·Tz(d_i), mm and rad. */
export function modifiedDhTransform(alphaPrev: number, aPrev: number, theta: number, d: number, out: Mat4 = new Float64Array(16)): Mat4 {
  const ct = Math.cos(theta), st = Math.sin(theta);
  const ca = Math.cos(alphaPrev), sa = Math.sin(alphaPrev);
  out[0] = ct; out[1] = -st; out[2] = 0; out[3] = aPrev;
  out[4] = st * ca; out[5] = ct * ca; out[6] = -sa; out[7] = -sa * d;
  out[8] = st * sa; out[9] = ct * sa; out[10] = ca; out[11] = ca * d;
  out[12] = 0; out[13] = 0; out[14] = 0; out[15] = 1;
  return out;
}

/** Link transform of one DH row in the given convention (standard or modified DH), mm and rad. */
export function dhTransform(convention: DhConvention, row: DhRow, out: Mat4 = new Float64Array(16)): Mat4 {
  return convention === 'standard'
    ? standardDhTransform(row.theta, row.d, row.a, row.alpha, out)
    : modifiedDhTransform(row.alpha, row.a, row.theta, row.d, out);
}

/**
 * Product of a DH chain, every frame: [base (identity), T_0^1, T_0^2, …, T_0^n] and, when `tool`
 * is given, T_0^n·tool last. Rows carry their joint variables already applied (mm, rad).
 */
export function chainTransforms(convention: DhConvention, rows: readonly DhRow[], tool?: Mat4): Mat4[] {
  const frames: Mat4[] = [mat4Identity()];
  const link = new Float64Array(16);
  let current = frames[0];
  for (const row of rows) {
    dhTransform(convention, row, link);
    current = mat4Multiply(current, link);
    frames.push(current);
  }
  if (tool) frames.push(mat4Multiply(current, tool));
  return frames;
}

/** Rows of a chain with joint variables q applied (θ += q for revolute in rad, d += q for prismatic in mm). */
export function dhRowsAt(joints: readonly DhJoint[], q: ArrayLike<number>): DhRow[] {
  if (q.length !== joints.length) throw new Error(`q: expected ${joints.length} joint values, got ${q.length}`);
  return joints.map((j, i) => ({
    a: j.a,
    alpha: j.alpha,
    d: j.kind === 'prismatic' ? j.d + q[i] : j.d,
    theta: j.kind === 'revolute' ? j.theta + q[i] : j.theta,
  }));
}

/**
 * Allocation-free tool point of a DH chain for the sampling loop: the tool offset (mm, in the
 * last frame) is carried back to the base through A_n … A_1 (one point transform per link
 * instead of 4×4 products). Precomputes cos/sin of the constant angles once.
 */
export class DhPointEvaluator {
  readonly n: number;
  private readonly standard: boolean;
  private readonly prismatic: Uint8Array;
  private readonly a: Float64Array;
  private readonly d: Float64Array;
  private readonly theta: Float64Array;
  private readonly ca: Float64Array;
  private readonly sa: Float64Array;
  private readonly tx: number;
  private readonly ty: number;
  private readonly tz: number;

  constructor(convention: DhConvention, joints: readonly DhJoint[], tool: { x: number; y: number; z: number } = { x: 0, y: 0, z: 0 }) {
    this.n = joints.length;
    this.standard = convention === 'standard';
    this.prismatic = Uint8Array.from(joints, (j) => (j.kind === 'prismatic' ? 1 : 0));
    this.a = Float64Array.from(joints, (j) => j.a);
    this.d = Float64Array.from(joints, (j) => j.d);
    this.theta = Float64Array.from(joints, (j) => j.theta);
    this.ca = Float64Array.from(joints, (j) => Math.cos(j.alpha));
    this.sa = Float64Array.from(joints, (j) => Math.sin(j.alpha));
    this.tx = tool.x;
    this.ty = tool.y;
    this.tz = tool.z;
  }

  /**
   * Tool point in the base frame (mm) for joint variables q (rad / mm, added to the constant θ / d),
   * written to out[offset..offset+2].
   */
  point(q: ArrayLike<number>, out: Float64Array, offset = 0): void {
    let x = this.tx, y = this.ty, z = this.tz;
    const { prismatic, a, d, theta, ca, sa } = this;
    for (let i = this.n - 1; i >= 0; i--) {
      const th = prismatic[i] ? theta[i] : theta[i] + q[i];
      const di = prismatic[i] ? d[i] + q[i] : d[i];
      const ct = Math.cos(th), st = Math.sin(th);
      if (this.standard) {
        // Rx(α), then Tz(d)·Tx(a), then Rz(θ)
        const y1 = ca[i] * y - sa[i] * z;
        const z1 = sa[i] * y + ca[i] * z;
        const x2 = x + a[i];
        x = ct * x2 - st * y1;
        y = st * x2 + ct * y1;
        z = z1 + di;
      } else {
        // Tz(d), then Rz(θ), then Tx(a), then Rx(α)
        const z1 = z + di;
        const x2 = ct * x - st * y + a[i];
        const y2 = st * x + ct * y;
        x = x2;
        y = ca[i] * y2 - sa[i] * z1;
        z = sa[i] * y2 + ca[i] * z1;
      }
    }
    out[offset] = x;
    out[offset + 1] = y;
    out[offset + 2] = z;
  }
}
