import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { polygonContains } from 'd3';
import { chainFamily, chainSampledProfile, chainIdleTrailingJoints, type ChainParams } from '@shared/kinematics/chain';
import { HaltonSequence, sampleProfile } from '@shared/kinematics/sampledProfile';
import type { Polygon2, ReachProfile } from '@shared/kinematics/types';
import { demoSixAxis, modifiedChain, prismaticChain, sixAxisExample } from './chainFixtures';

/** Point-in-region for a polygon set with holes (d3.polygonContains per ring, even-odd over holes). */
function inProfile(polygons: Polygon2[], r: number, z: number): boolean {
  return polygons.some((poly) => polygonContains(poly[0], [r, z]) && !poly.slice(1).some((hole) => polygonContains(hole, [r, z])));
}

/** (r, z) of a tool point as the profile defines it: r = sign(x)·√(x²+y²) after turning J1 back to kinematic 0. */
function profilePoint(p: ChainParams, q: number[]): [number, number] {
  const r = chainFamily.forward(p, q);
  if (!r.ok) throw new Error(r.message);
  const j = p.joints[0];
  const bearing = (((j.direction ?? 1) * q[0] + (j.zeroOffset ?? 0) + j.theta) * Math.PI) / 180;
  const x = Math.cos(bearing) * r.tool.x + Math.sin(bearing) * r.tool.y;
  const rho = Math.hypot(r.tool.x, r.tool.y);
  return [x >= 0 ? rho : -rho, r.tool.z];
}

/** Radical inverse of i in base b from its definition (digits of i mirrored about the radix point), for checking the incremental sequence. */
function radicalInverse(i: number, b: number): number {
  let result = 0;
  for (let f = 1 / b; i > 0; f /= b) {
    result += (i % b) * f;
    i = Math.floor(i / b);
  }
  return result;
}

describe('Halton sequence (radical inverse, van der Corput)', () => {
  it('points 1 … 6 in bases 2 and 3 give the textbook values [pub: van der Corput sequence]', () => {
    const seq = new HaltonSequence(2);
    const u = new Float64Array(2);
    seq.next(u); // point 0 is the origin
    expect(Array.from(u)).toEqual([0, 0]);
    const base2: number[] = [];
    const base3: number[] = [];
    for (let i = 1; i <= 6; i++) {
      seq.next(u);
      base2.push(u[0]);
      base3.push(u[1]);
    }
    expect(base2).toEqual([0.5, 0.25, 0.75, 0.125, 0.625, 0.375]);
    [1 / 3, 2 / 3, 1 / 9, 4 / 9, 7 / 9, 2 / 9].forEach((v, i) => expect(base3[i]).toBeCloseTo(v, 15));
  });

  it('the incremental sequence matches the radical inverse in every base over 20,000 points', () => {
    const seq = new HaltonSequence(6);
    const u = new Float64Array(6);
    const bases = [2, 3, 5, 7, 11, 13];
    for (let i = 0; i < 20000; i++) {
      seq.next(u);
      bases.forEach((b, k) => expect(Math.abs(u[k] - radicalInverse(i, b))).toBeLessThan(1e-12));
    }
  });
});

describe('sampled reach profile of chains', () => {
  const cases: Array<[string, ChainParams, number | undefined]> = [
    ['Demo Six-Axis 2000 (default tolerance)', demoSixAxis(), undefined],
    ['the six-axis DH worked example', sixAxisExample, 8],
    ['a chain with prismatic joints', prismaticChain, 12],
    ['a modified-DH chain', modifiedChain, 20],
  ];
  const profiles = new Map<string, ReachProfile>();
  const profileOf = (name: string, p: ChainParams, tol?: number) => {
    if (!profiles.has(name)) profiles.set(name, chainFamily.reachProfile(p, tol ? { toleranceMm: tol } : undefined));
    return profiles.get(name)!;
  };

  for (const [name, params, tol] of cases) {
    it(`${name}: every forward() tool point of random in-limit joints lies inside the profile (100 %)`, () => {
      const profile = profileOf(name, params, tol);
      expect(profile.method).toBe('sampled');
      expect(profile.toleranceMm).toBeGreaterThan(0);
      fc.assert(
        fc.property(fc.tuple(...params.joints.map((j) => fc.double({ min: j.min, max: j.max, noNaN: true }))), (q) => {
          const [r, z] = profilePoint(params, q);
          expect(inProfile(profile.polygons, r, z)).toBe(true);
        }),
        { numRuns: 2000 },
      );
    });
  }

  it('the six-axis example: the tool point is the wrist centre, whose reach follows from the link lengths [derived]', () => {
    const profile = profileOf('the six-axis DH worked example', sixAxisExample, 8);
    // J4–J6 cannot move a tool point at the wrist centre: only J2, J3 are sampled
    expect(chainIdleTrailingJoints(sixAxisExample)).toBe(3);
    // stretched arm: ρ = √((a2 + √(a3² + d4²))² + d3²); the outline may exceed it by the tolerance, never fall short
    const stretched = Math.hypot(431.8 + Math.hypot(20.3, 431.8), 150.05);
    expect(profile.maxReach).toBeGreaterThanOrEqual(stretched - 1e-6);
    expect(profile.maxReach).toBeLessThanOrEqual(stretched + profile.toleranceMm);
    // a lateral offset of d3 keeps every point at least 150.05 mm from the J1 axis
    expect(profile.minReach).toBeGreaterThan(150.05 - profile.toleranceMm);
  });

  it('Demo Six-Axis 2000: the outline reaches the stretched arm and exceeds it by no more than the tolerance [derived]', () => {
    const demo = demoSixAxis();
    const profile = profileOf('Demo Six-Axis 2000 (default tolerance)', demo, undefined);
    expect(profile.toleranceMm).toBeLessThanOrEqual(40);
    // farthest tool point: upper arm, the forearm vector (a3, d4) and the flange + tool (d6 + tool z) all in
    // one horizontal line (J2 = 90°, J3 ≈ 78.9° and a wrist bend of about 11°, all inside the limits):
    // ρ_max = a1 + a2 + √(a3² + d4²) + d6 + tool z
    const j = demo.joints;
    const rhoMax = j[0].a + j[1].a + Math.hypot(j[2].a, j[3].d) + j[5].d + demo.tool.z;
    expect(profile.maxReach).toBeGreaterThanOrEqual(rhoMax);
    expect(profile.maxReach).toBeLessThanOrEqual(rhoMax + profile.toleranceMm);
    expect(inProfile(profile.polygons, rhoMax + profile.toleranceMm + 1, j[0].d)).toBe(false);
    expect(inProfile(profile.polygons, -(rhoMax + profile.toleranceMm + 1), j[0].d)).toBe(false);
  });

  it('the generic sampleProfile() on a planar 2R (l1 = 500, l2 = 300, J2 ±180°) gives the reach annulus 200 … 800 [pub: planar 2R reach annulus]', () => {
    // J1 held at 0, the 2R plane is the (x, z) plane: r = x, z = y of the planar arm
    const profile = sampleProfile(
      (q, out) => {
        const t = (q[1] * Math.PI) / 180;
        out[0] = 500 + 300 * Math.cos(t);
        out[1] = 0;
        out[2] = 300 * Math.sin(t);
        return true;
      },
      [{ min: 0, max: 0 }, { min: -180, max: 180 }],
      { toleranceMm: 6 },
    );
    // a single J2 sweeps a circle of radius 300 about (500, 0): r ∈ [200, 800]
    expect(profile.maxReach).toBeGreaterThanOrEqual(800);
    expect(profile.maxReach).toBeLessThanOrEqual(800 + profile.toleranceMm);
    expect(profile.minReach).toBeLessThanOrEqual(200);
    expect(profile.minReach).toBeGreaterThanOrEqual(200 - profile.toleranceMm);
    expect(inProfile(profile.polygons, 500, 0)).toBe(false); // the circle's centre is not reached
    expect(profile.converged).toBe(true);
  });

  it('the chain profile of a chain is independent of where J1 is (sampled at kinematic 0)', () => {
    const turned = structuredClone(demoSixAxis());
    turned.joints[0].zeroOffset = 40;
    const a = chainSampledProfile(demoSixAxis(), { toleranceMm: 45 });
    const b = chainSampledProfile(turned, { toleranceMm: 45 });
    expect(b.maxReach).toBeCloseTo(a.maxReach, 6);
    expect(b.zMax).toBeCloseTo(a.zMax, 6);
    expect(chainFamily.j1Range(turned)).toEqual({ min: -140, max: 220 });
  });
});
