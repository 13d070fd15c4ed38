import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { forwardModel, parseArmParams } from '@shared/kinematics/families';
import { angularMargin } from '@shared/geometry/angles';
import { signedDistanceToPolygons } from '@shared/geometry/pointInPolygon';
import { reachProfileOf } from '@shared/kinematics/families';
import { j1KinematicRange } from '@shared/kinematics/planRegions';
import { armReach, makePointReach, marginFnOf, pointReach } from '@shared/kinematics/pointReach';
import type { ArmParams } from '@shared/schemas/armModel';
import { ax, articulatedSets, deepFreeze, linkageSets, scaraSets } from './fixtures';

function jointLimits(m: ArmParams): Array<{ min: number; max: number }> {
  if (m.family === 'scara') return [...m.axes, { min: m.strokeMin, max: m.strokeMax }];
  if (m.family === 'chain') return m.joints;
  return m.axes;
}

describe('point reach agrees with forward kinematics', () => {
  for (const m of [...articulatedSets, ...scaraSets, ...linkageSets]) {
    it(`${m.family}: the tool point of every assembled in-limit pose is reached, in the arm frame and placed on the plan`, () => {
      const check = makePointReach(m);
      const place = { x: 12000, y: -3500, yaw: 37, mountHeight: 400 };
      const yaw = (place.yaw * Math.PI) / 180;
      fc.assert(
        fc.property(fc.tuple(...jointLimits(m).map((l) => fc.double({ min: l.min, max: l.max, noNaN: true }))), (joints) => {
          const f = forwardModel(m, joints);
          if (!f.ok) return;
          const a = check({ x: f.tool.x, y: f.tool.y, z: f.tool.z });
          expect(a.marginMm).toBeGreaterThanOrEqual(0);
          expect(a.reached).toBe(true);
          const px = place.x + Math.cos(yaw) * f.tool.x - Math.sin(yaw) * f.tool.y;
          const py = place.y + Math.sin(yaw) * f.tool.x + Math.cos(yaw) * f.tool.y;
          const b = pointReach(m, place, { x: px, y: py, z: f.tool.z + place.mountHeight });
          expect(b.reached).toBe(true);
          expect(b.marginMm).toBeCloseTo(a.marginMm, 6);
        }),
        { numRuns: 1500 },
      );
    });
  }
});

describe('point reach at known radii and heights', () => {
  // Full J2/J3 ranges: the wrist reaches the annulus 100…1100 mm around the shoulder (planar 2R
  // annulus, Spong et al. [pub]); the shoulder sits on the J1 axis at 500 mm.
  const ring = parseArmParams({ family: 'articulated', shoulderHeight: 500, shoulderOffset: 0, upperArm: 600, forearm: 500, axes: [ax(-180, 180), ax(-180, 180), ax(-180, 180)] });
  const check = makePointReach(ring);

  it('classifies points inside and outside with margins to 1 mm', () => {
    const cases: Array<[number, number, number]> = [
      [800, 500, 300], // r = 800 at shoulder height: 1100 − 800 (and 800 − 100)
      [1200, 500, -100], // beyond full stretch
      [300, 1400, 1100 - Math.hypot(300, 900)],
      [50, 500, -50], // inside the fold hole
      [0, 500 - 1150, -50], // straight below, beyond reach
    ];
    for (const [r, z, margin] of cases) {
      const got = check({ x: r, y: 0, z });
      expect(Math.abs(got.marginMm - margin)).toBeLessThanOrEqual(1);
      expect(got.reached).toBe(margin >= 0);
    }
  });

  it('the top approach targets the flange toolLength above the point', () => {
    const tooled = makePointReach({ ...ring, toolLength: 200 });
    expect(Math.abs(tooled({ x: 800, y: 0, z: 300 }).marginMm - 300)).toBeLessThanOrEqual(1);
    expect(Math.abs(tooled({ x: 0, y: 0, z: 500 - 1100 - 200 + 10 }).marginMm - 10)).toBeLessThanOrEqual(1);
    // 'any' lets an articulated wrist reach within toolLength in the reach plane.
    expect(tooled({ x: 1250, y: 0, z: 500, approach: 'any' }).reached).toBe(true);
    expect(tooled({ x: 1250, y: 0, z: 500 }).reached).toBe(false);
  });

  it('restricted J1 limits exclude points behind, with the J1 edge counted as arc length', () => {
    const fwd = parseArmParams({ family: 'articulated', shoulderHeight: 500, shoulderOffset: 100, upperArm: 600, forearm: 500, axes: [ax(-180, 180), ax(-30, 80), ax(-150, 0)] });
    const p = { x: 0, y: 0, z: 600 };
    const a = forwardModel(fwd, [0, 20, -60]);
    if (!a.ok) throw new Error(a.message);
    const r = a.tool.x;
    expect(pointReach(fwd, { ...p, yaw: 0, mountHeight: 0 }, { x: -r, y: 0, z: a.tool.z }).reached).toBe(true);
    const restricted = { ...p, yaw: 0, mountHeight: 0, restrict: { j1Min: -90, j1Max: 90 } };
    const behind = pointReach(fwd, restricted, { x: -r, y: 0, z: a.tool.z });
    expect(behind.reached).toBe(false);
    expect(behind.marginMm).toBeCloseTo(-r * (Math.PI / 2), 0);
    // 10° past the restricting limit: margin −r·10° (the point lies well inside the profile).
    const t = (100 * Math.PI) / 180;
    const past = pointReach(fwd, restricted, { x: r * Math.cos(t), y: r * Math.sin(t), z: a.tool.z });
    expect(past.marginMm).toBeCloseTo(-r * ((10 * Math.PI) / 180), 0);
    // The same place turned by the arm's yaw is reached again.
    expect(pointReach(fwd, { ...restricted, yaw: 180 }, { x: -r, y: 0, z: a.tool.z }).reached).toBe(true);
  });

  it('scara: plan region and stroke', () => {
    const s = parseArmParams({ family: 'scara', innerLink: 325, outerLink: 275, strokeMin: 50, strokeMax: 250, toolLength: 40, axes: [ax(-180, 180), ax(-180, 180)] });
    const c = makePointReach(s);
    // r = 300 in the 50…600 annulus; flange at 110 + 40 = 150 → 100 mm from each stroke end.
    expect(Math.abs(c({ x: 0, y: 300, z: 110 }).marginMm - 100)).toBeLessThanOrEqual(1);
    expect(Math.abs(c({ x: 560, y: 0, z: 110 }).marginMm - 40)).toBeLessThanOrEqual(1);
    expect(c({ x: 300, y: 0, z: 230 }).reached).toBe(false);
    expect(Math.abs(c({ x: 300, y: 0, z: 230 }).marginMm + 20)).toBeLessThanOrEqual(1);
    expect(c({ x: 0, y: 20, z: 110 }).reached).toBe(false);
  });

  it('armReach bundles the regions and margins the layout analysis needs', () => {
    const m = deepFreeze(structuredClone(linkageSets[0]));
    const r = armReach(m, { j1Min: -60, j1Max: 60 });
    expect(r.maxReach).toBeGreaterThan(3000);
    expect(r.zMin).toBeLessThan(r.zMax);
    expect(r.restricted.length).toBeGreaterThan(0);
    expect(r.bandAt(1200).length).toBeGreaterThan(0);
    expect(r.margin(2500, 0, 1200)).toBeGreaterThan(0);
    expect(r.margin(-2500, 0, 1200)).toBeLessThan(0);
    expect(scaraSets.length).toBeGreaterThan(0);
  });
});

describe('the fast margin equals its plain definition', () => {
  // Plain form: max over the two ways to reach a bearing (in front, or behind over the top when the
  // profile reaches behind the J1 axis) of combine(profile distance, J1 edge arc length).
  const combine = (a: number, b: number) => (a >= 0 && b >= 0 ? Math.min(a, b) : a < 0 && b < 0 ? -Math.hypot(a, b) : Math.min(a, b));
  for (const m of [articulatedSets[0], articulatedSets[1], linkageSets[2]]) {
    it(`${m.family}: brute-force distances and the grid agree for random points`, () => {
      const restrict = { j1Min: -75, j1Max: 120 };
      const fast = marginFnOf(m, restrict);
      const prof = reachProfileOf(m);
      const range = j1KinematicRange(m, restrict);
      const a0 = (range.min * Math.PI) / 180 - 1e-9;
      const a1 = (range.max * Math.PI) / 180 + 1e-9;
      const behind = prof.polygons.some((p) => p[0].some(([r]) => r < 0));
      const R = prof.maxReach * 2;
      fc.assert(
        fc.property(fc.double({ min: -R, max: R, noNaN: true }), fc.double({ min: -R, max: R, noNaN: true }), fc.double({ min: prof.zMin - 1000, max: prof.zMax + 1000, noNaN: true }), (x, y, z) => {
          const rho = Math.hypot(x, y);
          if (rho < 1e-6) return; // on the J1 axis no J1 edge applies (see pointReach.ts)
          const zt = z + m.toolLength;
          const b = Math.atan2(y, x);
          const arc = (ang: number) => rho * angularMargin(ang, a0, a1);
          const mA = combine(signedDistanceToPolygons(rho, zt, prof.polygons), arc(b));
          const mB = combine(signedDistanceToPolygons(-rho, zt, prof.polygons), arc(b - Math.PI));
          const plain = behind ? Math.max(mA, mB) : mA;
          expect(fast(x, y, z)).toBeCloseTo(plain, 6);
        }),
        { numRuns: 2000 },
      );
    });
  }
});

describe('chains through the registry', () => {
  it('a chain whose reach plane is offset from J1 (lateral offset) reaches its forward samples, J1 limits included', () => {
    const m = parseArmParams({
      family: 'chain',
      convention: 'standard',
      joints: [
        { type: 'revolute', a: 0, alpha: 90, d: 400, theta: 0, min: -90, max: 90 },
        { type: 'revolute', a: 500, alpha: 0, d: 150, theta: 0, min: -30, max: 120 },
        { type: 'revolute', a: 400, alpha: 0, d: 0, theta: 0, min: -150, max: 0 },
      ],
      tool: { x: 0, y: 0, z: 0 },
    });
    const check = makePointReach(m);
    fc.assert(
      fc.property(fc.tuple(...jointLimits(m).map((l) => fc.double({ min: l.min, max: l.max, noNaN: true }))), (q) => {
        const f = forwardModel(m, q);
        if (!f.ok) return;
        expect(check({ x: f.tool.x, y: f.tool.y, z: f.tool.z }).reached).toBe(true);
      }),
      { numRuns: 1000 },
    );
    // Mirrored across the x axis the point would need J1 = 90° + 2·atan(150/r), beyond the J1 limit
    // (or reaching over the top behind the axis, which this arm cannot do at that height).
    const f = forwardModel(m, [-90, 30, -60]);
    if (!f.ok) throw new Error(f.message);
    expect(check({ x: f.tool.x, y: -f.tool.y, z: f.tool.z }).reached).toBe(false);
  });
});

describe('chain margins from the outward-simplified outline', () => {
  // The margin region of a sampled profile contains the profile (so no margin is smaller than the
  // plain one) and lies within one raster cell outside it (so none is larger by more than that).
  // Signed distance is monotone under inclusion and moves by at most the boundaries' separation
  // (plane geometry); the plain form is the brute-force distance to the profile's own polygons.
  const combine = (a: number, b: number) => (a >= 0 && b >= 0 ? Math.min(a, b) : a < 0 && b < 0 ? -Math.hypot(a, b) : Math.min(a, b));
  it('Demo Six-Axis 2000: plain ≤ fast ≤ plain + one cell for random points, J1 limits included', async () => {
    const { demoSixAxis } = await import('./chainFixtures');
    const { familyOf } = await import('@shared/kinematics/families');
    const m = demoSixAxis();
    // Its wrist sits a hair off the plane through J1: the bearing shift atan2(e, r) moves a J1-edge
    // arc length by at most about |e|, which the comparison allows for.
    const e = Math.abs(familyOf(m).lateralOffset(m));
    expect(e).toBeLessThan(0.1);
    const slack = e + 0.02;
    const restrict = { j1Min: -100, j1Max: 140 };
    const fast = marginFnOf(m, restrict);
    const prof = reachProfileOf(m) as ReturnType<typeof reachProfileOf> & { cellMm: number };
    expect(prof.method).toBe('sampled');
    const range = j1KinematicRange(m, restrict);
    const a0 = (range.min * Math.PI) / 180 - 1e-9;
    const a1 = (range.max * Math.PI) / 180 + 1e-9;
    const behind = prof.polygons.some((p) => p[0].some(([r]) => r < 0));
    const R = prof.maxReach * 1.5;
    fc.assert(
      fc.property(fc.double({ min: -R, max: R, noNaN: true }), fc.double({ min: -R, max: R, noNaN: true }), fc.double({ min: prof.zMin - 800, max: prof.zMax + 800, noNaN: true }), (x, y, z) => {
        const rho = Math.hypot(x, y);
        if (rho < 1) return; // within the lateral offset of the J1 axis the bearing test is not used (see pointReach.ts)
        const b = Math.atan2(y, x);
        // the J1 window widened by the tool point's full sideways spread (docs/kinematics.md, "Point reach")
        const lat = (prof as unknown as { lateral: { min: number; max: number } }).lateral;
        const as = (v: number) => Math.asin(Math.max(-1, Math.min(1, v / rho)));
        const arcW = (ang: number, lo: number, hi: number) => (hi - lo >= 2 * Math.PI - 1e-9 ? Infinity : rho * angularMargin(ang, lo, hi));
        const mA = combine(signedDistanceToPolygons(rho, z, prof.polygons), arcW(b, a0 + as(lat.min), a1 + as(lat.max)));
        const mB = combine(signedDistanceToPolygons(-rho, z, prof.polygons), arcW(b - Math.PI, a0 - as(lat.max), a1 - as(lat.min)));
        const plain = behind ? Math.max(mA, mB) : mA;
        const got = fast(x, y, z);
        expect(got).toBeGreaterThanOrEqual(plain - slack);
        expect(got).toBeLessThanOrEqual(plain + prof.cellMm + slack);
      }),
      { numRuns: 3000 },
    );
  });
});

describe('the fast margin agrees with its plain definition within 0.01 mm, every family, full and restricted J1', () => {
  // Plain form (the file comment of pointReach.ts): the best of the ways to a bearing of
  // combine(brute-force signed distance to the margin region, J1 edge arc length), the J1 window
  // widened by the tool point's sideways spread; a scara's plan region with its stroke. The margin
  // region is the profile itself, or for a sampled (chain) profile its outline simplified outward
  // by half a raster cell, rebuilt here with the same geometry call.
  const combine = (a: number, b: number) => (a >= 0 && b >= 0 ? Math.min(a, b) : a < 0 && b < 0 ? -Math.hypot(a, b) : Math.min(a, b));
  const cases: Array<[string, () => Promise<ArmParams> | ArmParams]> = [
    ['articulated', () => articulatedSets[0]],
    ['linkage', () => linkageSets[0]],
    ['scara', () => scaraSets[0]],
    ['chain', async () => (await import('./chainFixtures')).demoSixAxis()],
  ];
  for (const [name, make] of cases) {
    for (const restrict of [null, { j1Min: -75, j1Max: 120 }]) {
      it(`${name}, J1 ${restrict ? 'restricted' : 'as the model'}: random points`, async () => {
        const m = await make();
        const { simplifyPolygonsOutward } = await import('@shared/geometry/simplify');
        const { scaraPlanRegion } = await import('@shared/kinematics/scara');
        const { toolLateralSpread, toolDrop } = await import('@shared/kinematics/planRegions');
        const fast = marginFnOf(m, restrict);
        const range = j1KinematicRange(m, restrict);
        const drop = toolDrop(m);
        if (m.family === 'scara') {
          const plan = scaraPlanRegion(m, range);
          fc.assert(
            fc.property(fc.double({ min: -900, max: 900, noNaN: true }), fc.double({ min: -900, max: 900, noNaN: true }), fc.double({ min: -200, max: 500, noNaN: true }), (x, y, z) => {
              const zf = z + drop;
              const plain = combine(signedDistanceToPolygons(x, y, plan), Math.min(zf - m.strokeMin, m.strokeMax - zf));
              expect(Math.abs(fast(x, y, z) - plain)).toBeLessThanOrEqual(0.01);
            }),
            { numRuns: 1500 },
          );
          return;
        }
        const prof = reachProfileOf(m) as ReturnType<typeof reachProfileOf> & { cellMm?: number };
        const polys = prof.method === 'sampled' ? simplifyPolygonsOutward(prof.polygons, (prof.cellMm ?? prof.toleranceMm / 3) / 2) : prof.polygons;
        const a0 = (range.min * Math.PI) / 180 - 1e-9;
        const a1 = (range.max * Math.PI) / 180 + 1e-9;
        const lat = toolLateralSpread(m);
        const behind = polys.some((p) => p[0].some(([r]) => r < 0));
        const R = prof.maxReach * 1.6;
        fc.assert(
          fc.property(fc.double({ min: -R, max: R, noNaN: true }), fc.double({ min: -R, max: R, noNaN: true }), fc.double({ min: prof.zMin - 800, max: prof.zMax + 800, noNaN: true }), (x, y, z) => {
            const rho = Math.hypot(x, y);
            if (rho < 1e-6) return; // on the J1 axis no J1 edge applies (see pointReach.ts)
            const zt = z + drop;
            const b = Math.atan2(y, x);
            const as = (v: number) => Math.asin(Math.max(-1, Math.min(1, v / rho)));
            const arcW = (ang: number, lo: number, hi: number) => (hi - lo >= 2 * Math.PI - 1e-9 ? Infinity : rho * angularMargin(ang, lo, hi));
            const mA = combine(signedDistanceToPolygons(rho, zt, polys), arcW(b, a0 + as(lat.min), a1 + as(lat.max)));
            const mB = combine(signedDistanceToPolygons(-rho, zt, polys), arcW(b - Math.PI, a0 - as(lat.max), a1 - as(lat.min)));
            const plain = behind ? Math.max(mA, mB) : mA;
            expect(Math.abs(fast(x, y, z) - plain)).toBeLessThanOrEqual(0.01);
          }),
          { numRuns: 1500 },
        );
      });
    }
  }
});
