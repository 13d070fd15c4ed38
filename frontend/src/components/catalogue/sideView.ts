import type { Frame } from '@shared/kinematics';

/**
 * The frames of one pose in the side view: each origin as (r, z) mm in the vertical plane through
 * the J1 axis at the pose's J1 angle, r = x·cos φ + y·sin φ. φ is read from the frame after J1 (its
 * x axis lies along the reach plane in DH chains), else from the base frame (the plane families
 * turn their base frame with J1), else from the first origin off the axis.
 * A lateral offset from that plane is dropped (the drawing is a projection).
 */
export function sideViewPoints(frames: readonly Frame[]): Array<[number, number]> {
  let phi: number | null = null;
  const j1 = frames.find((f) => f.label === 'J1') ?? frames.find((f) => f.label === 'base');
  if (j1) {
    const [cx, cy] = [j1.rotation[0][0], j1.rotation[1][0]];
    if (Math.hypot(cx, cy) > 1e-9) phi = Math.atan2(cy, cx);
  }
  if (phi === null) {
    const off = frames.find((f) => Math.hypot(f.origin.x, f.origin.y) > 1e-6);
    phi = off ? Math.atan2(off.origin.y, off.origin.x) : 0;
  }
  const c = Math.cos(phi), s = Math.sin(phi);
  const out: Array<[number, number]> = [];
  for (const f of frames) {
    const p: [number, number] = [f.origin.x * c + f.origin.y * s, f.origin.z];
    const prev = out[out.length - 1];
    if (!prev || Math.hypot(prev[0] - p[0], prev[1] - p[1]) > 1e-6) out.push(p);
  }
  return out;
}
