// The closed-form families against the general DH chain (standard DH: Spong et al. / Siciliano et al.
// conventions) and against an independent four-bar solution; the exact reach profile against the
// sampled one. Every model here is invented test data.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { signedDistanceToPolygons } from '@shared/geometry/pointInPolygon';
import { articulatedForward, articulatedReachProfile, chainFamily, chainParamsSchema, linkageForward, parseArmParams, scaraForward } from '@shared/kinematics';
import { sampleProfile } from '@shared/kinematics/sampledProfile';
import type { ArticulatedParams, LinkageParams, ScaraParams } from '@shared/schemas/armModel';

const deg = Math.PI / 180;
const close = (a: { x: number; y: number; z: number }, b: { x: number; y: number; z: number }, tol = 1e-6) =>
  Math.hypot(a.x - b.x, a.y - b.y, a.z - b.z) <= tol;

const articulated = parseArmParams({
  family: 'articulated', shoulderHeight: 450, shoulderOffset: 150, upperArm: 610, forearm: 660, elbowOffset: 115, toolLength: 0,
  axes: [{ min: -170, max: 170, zeroOffset: 10, direction: -1 }, { min: -60, max: 145 }, { min: -200, max: 70, zeroOffset: -5 }],
}) as ArticulatedParams;

/** The articulated arm as a standard DH chain: J1 (θ1, d = h, a = a1, α = 90°), J2 (a = a2), J3 (a = a3), wrist offset e along y3. */
const articulatedAsChain = chainParamsSchema.parse({
  family: 'chain', convention: 'standard',
  joints: [
    { type: 'revolute', a: 150, alpha: 90, d: 450, theta: 0, min: -170, max: 170, zeroOffset: 10, direction: -1 },
    { type: 'revolute', a: 610, alpha: 0, d: 0, theta: 0, min: -60, max: 145 },
    { type: 'revolute', a: 660, alpha: 0, d: 0, theta: 0, min: -200, max: 70, zeroOffset: -5 },
  ],
  tool: { x: 0, y: 115, z: 0 },
});

const scara = parseArmParams({ family: 'scara', innerLink: 325, outerLink: 275, strokeMin: 480, strokeMax: 680, axes: [{ min: -140, max: 140 }, { min: -150, max: 150, direction: -1 }] }) as ScaraParams;
/** The SCARA as a DH chain: two revolute links in the plane (α = 0) and a prismatic stroke. */
const scaraAsChain = chainParamsSchema.parse({
  family: 'chain', convention: 'standard',
  joints: [
    { type: 'revolute', a: 325, alpha: 0, d: 0, theta: 0, min: -140, max: 140 },
    { type: 'revolute', a: 275, alpha: 0, d: 0, theta: 0, min: -150, max: 150, direction: -1 },
    { type: 'prismatic', a: 0, alpha: 0, d: 0, theta: 0, min: 480, max: 680 },
  ],
  tool: { x: 0, y: 0, z: 0 },
});

const inLimits = (axes: Array<{ min: number; max: number }>) => fc.tuple(...axes.map((a) => fc.double({ min: a.min, max: a.max, noNaN: true })));

describe('closed-form families agree with the DH chain', () => {
  it('articulated wrist = standard DH chain tool point (1 000 random in-limit poses)', () => {
    fc.assert(
      fc.property(inLimits(articulated.axes), (q) => {
        const a = articulatedForward(articulated, q);
        const c = chainFamily.forward(articulatedAsChain, q);
        expect(a.ok && c.ok).toBe(true);
        if (a.ok && c.ok) expect(close(a.wrist, c.tool)).toBe(true);
      }),
      { numRuns: 1000 },
    );
  });

  it('SCARA flange = DH chain with a prismatic stroke (1 000 random in-limit poses)', () => {
    fc.assert(
      fc.property(inLimits([...scara.axes, { min: 480, max: 680 }]), (q) => {
        const s = scaraForward(scara, q);
        const c = chainFamily.forward(scaraAsChain, q);
        expect(s.ok && c.ok).toBe(true);
        if (s.ok && c.ok) expect(close(s.wrist, c.tool)).toBe(true);
      }),
      { numRuns: 1000 },
    );
  });

  it('linkage flange = DH chain driven by an independent four-bar solution (circle intersection)', () => {
    const lk = parseArmParams({
      family: 'linkage', shoulderHeight: 900, shoulderOffset: 250, upperArm: 1350, forearm: 1600, elbowOffset: 0,
      flangeOffset: { horizontal: 250, vertical: -250 },
      fourBar: { ground: 1350, crank: 320, coupler: 1360, rocker: 300, groundAngle: 0, branch: 'open', rockerToForearm: 180 },
      interiorAngle: { min: 25, max: 150 },
      // axis limits of the demo palletizer sample (J3 motor zero turned by 180°)
      axes: [{ min: -180, max: 180 }, { min: 40, max: 135 }, { min: -75, max: 20, zeroOffset: 180 }],
    }) as LinkageParams;
    const fb = lk.fourBar!;
    let checked = 0;
    fc.assert(
      fc.property(inLimits(lk.axes), (q) => {
        const f = linkageForward(lk, q);
        if (!f.ok) return; // not assemblable or outside the coupled limit: a value, checked elsewhere
        const [t1, u, m3] = q.map((v, i) => ((lk.axes[i].direction ?? 1) * v + (lk.axes[i].zeroOffset ?? 0)) * deg);
        // Crank tip C = S + a·(cos m3, sin m3); rocker pivot at the elbow E = S + d·(cos u, sin u);
        // the rocker tip lies on circle(E, c) ∩ circle(C, b) — two assemblies.
        const E = [lk.upperArm * Math.cos(u), lk.upperArm * Math.sin(u)];
        const C = [fb.crank * Math.cos(m3), fb.crank * Math.sin(m3)];
        const dx = C[0] - E[0], dy = C[1] - E[1];
        const dist = Math.hypot(dx, dy);
        const along = (fb.rocker ** 2 - fb.coupler ** 2 + dist ** 2) / (2 * dist);
        const h = Math.sqrt(Math.max(0, fb.rocker ** 2 - along ** 2));
        const base = Math.atan2(dy, dx);
        const spread = Math.atan2(h, along);
        const options = [base + spread, base - spread].map((psi) => psi + fb.rockerToForearm * deg - u);
        const matches = options.some((rel) => {
          const chain = chainParamsSchema.parse({
            family: 'chain', convention: 'standard',
            joints: [
              { type: 'revolute', a: lk.shoulderOffset, alpha: 90, d: lk.shoulderHeight, theta: 0, min: -180, max: 180 },
              { type: 'revolute', a: lk.upperArm, alpha: 0, d: 0, theta: 0, min: -360, max: 360 },
              { type: 'revolute', a: lk.forearm, alpha: 0, d: 0, theta: 0, min: -720, max: 720 },
            ],
            tool: { x: 0, y: 0, z: 0 },
          });
          const relDeg = ((((rel / deg) % 360) + 540) % 360) - 180;
          const w = chainFamily.forward(chain, [t1 / deg, u / deg, relDeg]);
          if (!w.ok) return false;
          const flange = { x: w.tool.x + 250 * Math.cos(t1), y: w.tool.y + 250 * Math.sin(t1), z: w.tool.z - 250 };
          return close(flange, f.wrist, 1e-6);
        });
        expect(matches).toBe(true);
        checked++;
      }),
      { numRuns: 1000 },
    );
    expect(checked).toBeGreaterThan(200);
  });
});

describe('exact and sampled reach profiles agree', () => {
  it('the articulated exact profile and the sampled profile of its forward() differ by no more than their stated tolerances', () => {
    const exact = articulatedReachProfile(articulated);
    const sampled = sampleProfile(
      (q, out) => {
        const r = articulatedForward(articulated, [q[0], q[1], q[2]]);
        if (!r.ok) return false;
        out[0] = r.wrist.x;
        out[1] = r.wrist.y;
        out[2] = r.wrist.z;
        return true;
      },
      // J1 held where its kinematic bearing is 0 (controller −10° with direction −1, zero offset 10°)
      [{ min: 10, max: 10 }, articulated.axes[1], articulated.axes[2]],
      { bearingDeg: 0 },
    );
    const tol = exact.toleranceMm + sampled.toleranceMm;
    for (const poly of sampled.polygons) {
      for (const [r, z] of poly[0]) expect(-signedDistanceToPolygons(r, z, exact.polygons)).toBeLessThanOrEqual(tol);
    }
    for (const poly of exact.polygons) {
      for (const [r, z] of poly[0]) expect(-signedDistanceToPolygons(r, z, sampled.polygons)).toBeLessThanOrEqual(tol);
    }
    expect(Math.abs(sampled.maxReach - exact.maxReach)).toBeLessThanOrEqual(tol);
  });
});
