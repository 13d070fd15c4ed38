import { describe, expect, it } from 'vitest';
import { fourBarPose } from '@shared/kinematics/fourBar';
import { linkageForward, linkageInteriorDeg } from '@shared/kinematics/linkage';
import { deepFreeze, linkageSets } from './fixtures';

const deg = Math.PI / 180;

describe('linkage forward kinematics', () => {
  const p = linkageSets[0];

  it('a pose the four-bar cannot assemble is a value, never NaN', () => {
    // Crank 10° from the upper arm: with crank 320 / rocker 300 the loop only closes beyond ±21.96°.
    const f = linkageForward(deepFreeze(structuredClone(p)), [0, 100, 110 - 180]);
    expect(f).toMatchObject({ ok: false, reason: 'not-assemblable', axis: 3 });
    expect(JSON.stringify(f)).not.toMatch(/NaN|null/);
  });

  it('the coupled interior-angle limit rejects a pose, naming the angle', () => {
    const f = linkageForward(p, [0, 100, -57]); // crank 23° from the upper arm: assembles, interior ≈ 23° < 25°
    expect(f.ok).toBe(false);
    if (!f.ok) {
      expect(f.reason).toBe('out-of-limits');
      expect(f.message).toMatch(/upper arm–forearm angle/);
    }
  });

  it('closes the four-bar loop: |rocker tip − crank tip| = coupler, rocker at θ4 from the upper arm', () => {
    // Source: the loop-closure condition of the four-bar (Norton ch. 4) checked on forward()'s own frames.
    const fb = p.fourBar!;
    for (const [j2, j3] of [
      [60, -30],
      [90, 0],
      [120, -20],
      [45, 5],
    ]) {
      const f = linkageForward(p, [0, j2, j3]);
      if (!f.ok) throw new Error(f.message);
      const shoulder = f.frames.find((x) => x.label === 'shoulder')!;
      const elbow = f.frames.find((x) => x.label === 'elbow')!;
      const m3 = (j3 + 180) * deg; // crank's absolute angle (J3 zero offset 180°)
      const forearm = Math.atan2(elbow.rotation[2][0], elbow.rotation[0][0]);
      const rocker = forearm - fb.rockerToForearm * deg;
      const ax = shoulder.origin.x + fb.crank * Math.cos(m3);
      const az = shoulder.origin.z + fb.crank * Math.sin(m3);
      const bx = elbow.origin.x + fb.rocker * Math.cos(rocker);
      const bz = elbow.origin.z + fb.rocker * Math.sin(rocker);
      expect(Math.hypot(bx - ax, bz - az)).toBeCloseTo(fb.coupler, 6);
      // The same rocker angle from the stand-alone solver, in the upper arm's frame.
      const pose = fourBarPose({ a: fb.crank, b: fb.coupler, c: fb.rocker, d: fb.ground }, j3 + 180 - j2, fb.branch);
      if (!pose.ok) throw new Error('expected an assembled four-bar');
      const rel = (((rocker / deg - j2 - pose.theta4Deg) % 360) + 540) % 360 - 180;
      expect(Math.abs(rel)).toBeLessThan(1e-6);
    }
  });

  it('with an exact parallelogram the forearm keeps the J3 motor angle whatever J2 does', () => {
    const q = linkageSets[1];
    for (const j2 of [35, 70, 110]) {
      const f = linkageForward(q, [0, j2, -20]);
      if (!f.ok) throw new Error(f.message);
      const elbow = f.frames.find((x) => x.label === 'elbow')!;
      expect(Math.atan2(elbow.rotation[2][0], elbow.rotation[0][0]) / deg).toBeCloseTo(-20, 9);
    }
    expect(linkageInteriorDeg(0)).toBeCloseTo(180, 12);
    expect(linkageInteriorDeg(-Math.PI / 2)).toBeCloseTo(90, 12);
  });
});
