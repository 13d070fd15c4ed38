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

describe('linkage profile strictly contains the flange points', () => {
  it('Demo Palletizer 3100: 40 000 motor poses, dense near the four-bar toggle, all inside the traced profile', async () => {
    const { readFileSync } = await import('node:fs');
    const { ArmModelInput } = await import('@shared/schemas/armModel');
    const { buildDistanceGrid } = await import('@shared/geometry/distanceGrid');
    const { linkageReachProfile, linkageForward } = await import('@shared/kinematics/linkage');
    const m = ArmModelInput.parse(JSON.parse(readFileSync(new URL('../../../samples/arm-models/demo-palletizer-3100.json', import.meta.url), 'utf8'))).params;
    if (m.family !== 'linkage') throw new Error('expected a linkage');
    const grid = buildDistanceGrid(linkageReachProfile(m).polygons);
    let seed = 11;
    const rnd = () => ((seed = (seed * 1103515245 + 12345) >>> 0) / 4294967296);
    let worst = Infinity;
    const [, j2, j3] = m.axes;
    for (let k = 0; k < 40000; k++) {
      // half the poses at the J2 limits (constant-J2 edges), where the chord error showed
      const a = k % 2 === 0 ? (rnd() < 0.5 ? j2.min : j2.max) : j2.min + rnd() * (j2.max - j2.min);
      const b = j3.min + rnd() * (j3.max - j3.min);
      const fk = linkageForward(m, [0, a, b]);
      if (!fk.ok) continue;
      worst = Math.min(worst, grid.signedDistance(fk.wrist.x, fk.wrist.z));
    }
    // inside, to the clipping grid (0.01 mm)
    expect(worst).toBeGreaterThanOrEqual(-0.01);
  }, 60_000);
});
