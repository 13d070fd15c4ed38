/**
 * Affine maps of 3-D space as 3×4 row-major arrays [r00 r01 r02 tx, r10 r11 r12 ty, r20 r21 r22 tz]:
 * p' = R·p + t. Used to carry entity (OCS) and block coordinates into the plan frame.
 */
export type Affine = Float64Array;

/** Uniform scale by `s` (drawing units → mm). */
export function scaling(s: number): Affine {
  return Float64Array.of(s, 0, 0, 0, 0, s, 0, 0, 0, 0, s, 0);
}

/** a ∘ b: apply b first, then a (matrix product). */
export function compose(a: Affine, b: Affine): Affine {
  const m = new Float64Array(12);
  for (let r = 0; r < 3; r++) {
    const a0 = a[r * 4];
    const a1 = a[r * 4 + 1];
    const a2 = a[r * 4 + 2];
    m[r * 4] = a0 * b[0] + a1 * b[4] + a2 * b[8];
    m[r * 4 + 1] = a0 * b[1] + a1 * b[5] + a2 * b[9];
    m[r * 4 + 2] = a0 * b[2] + a1 * b[6] + a2 * b[10];
    m[r * 4 + 3] = a0 * b[3] + a1 * b[7] + a2 * b[11] + a[r * 4 + 3];
  }
  return m;
}

/**
 * Map from an entity's object coordinate system to world coordinates for extrusion direction
 * N, by the DXF reference's arbitrary axis algorithm: Ax = (Wy × N) when |Nx| and |Ny| are both
 * below 1/64, else (Wz × N); Ay = N × Ax; columns Ax, Ay, N. Null for N = (0, 0, 1) (identity).
 * A zero or non-finite N is taken as (0, 0, 1).
 */
export function ocsToWcs(nx: number, ny: number, nz: number): Affine | null {
  const len = Math.hypot(nx, ny, nz);
  if (!Number.isFinite(len) || len < 1e-12) return null;
  nx /= len;
  ny /= len;
  nz /= len;
  if (Math.abs(nx) < 1e-12 && Math.abs(ny) < 1e-12 && nz > 0) return null;
  let ax: number;
  let ay: number;
  let az: number;
  if (Math.abs(nx) < 1 / 64 && Math.abs(ny) < 1 / 64) {
    // Wy × N = (0,1,0) × N
    ax = nz;
    ay = 0;
    az = -nx;
  } else {
    // Wz × N = (0,0,1) × N
    ax = -ny;
    ay = nx;
    az = 0;
  }
  const al = Math.hypot(ax, ay, az);
  ax /= al;
  ay /= al;
  az /= al;
  // Ay = N × Ax
  const bx = ny * az - nz * ay;
  const by = nz * ax - nx * az;
  const bz = nx * ay - ny * ax;
  return Float64Array.of(ax, bx, nx, 0, ay, by, ny, 0, az, bz, nz, 0);
}

/**
 * Insert transform of a block reference (DXF INSERT): p ↦ position + Rz(rotation)·(S·(p − base)
 * + cell offset), where S = diag(sx, sy, sz) and the array cell offset (column·columnSpacing,
 * row·rowSpacing) runs along the rotated, unscaled axes. Rotation in degrees, counter-clockwise.
 */
export function insertTransform(
  position: { x: number; y: number; z: number },
  base: { x: number; y: number; z: number },
  sx: number,
  sy: number,
  sz: number,
  rotationDeg: number,
  offsetX: number,
  offsetY: number,
): Affine {
  const t = (rotationDeg * Math.PI) / 180;
  // Exact quarter turns keep exact coordinates (cos 90° is not 0 in floating point).
  const q = rotationDeg / 90;
  let c: number;
  let s: number;
  if (Number.isInteger(q)) {
    const k = ((q % 4) + 4) % 4;
    c = [1, 0, -1, 0][k];
    s = [0, 1, 0, -1][k];
  } else {
    c = Math.cos(t);
    s = Math.sin(t);
  }
  // local = S·(p − base) + o ; world = position + R·local
  const lx = -sx * base.x + offsetX;
  const ly = -sy * base.y + offsetY;
  const lz = -sz * base.z;
  return Float64Array.of(
    c * sx, -s * sy, 0, position.x + c * lx - s * ly,
    s * sx, c * sy, 0, position.y + s * lx + c * ly,
    0, 0, sz, position.z + lz,
  );
}

/**
 * Largest stretch of any direction by the plan projection of M (largest singular value of its
 * top 2×3 block): a deviation of d local units becomes at most d·planScale(M) in plan.
 */
export function planScale(m: Affine): number {
  const a = m[0] * m[0] + m[1] * m[1] + m[2] * m[2];
  const b = m[0] * m[4] + m[1] * m[5] + m[2] * m[6];
  const c = m[4] * m[4] + m[5] * m[5] + m[6] * m[6];
  const lmax = (a + c + Math.sqrt((a - c) * (a - c) + 4 * b * b)) / 2;
  return Math.sqrt(Math.max(lmax, 0));
}
