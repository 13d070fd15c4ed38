import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { polygonsArea } from '@shared/geometry/area';
import { sectorArea } from '@shared/geometry/annularSector';
import { pointInPolygons, signedDistanceToPolygons } from '@shared/geometry/pointInPolygon';
import { articulatedForward, articulatedReachProfile, axisKinematicDeg } from '@shared/kinematics/articulated';
import { linkageForward, linkageReachProfile } from '@shared/kinematics/linkage';
import { profileSliceAt } from '@shared/kinematics/profile';
import { scaraForward, scaraPlanRegion, scaraReachProfile } from '@shared/kinematics/scara';
import type { Polygon2 } from '@shared/geometry/types';
import { articulatedSets, deepFreeze, linkageSets, scaraSets, signedR } from './fixtures';

const jointArb = (axes: ReadonlyArray<{ min: number; max: number }>) => fc.tuple(...axes.map((a) => fc.double({ min: a.min, max: a.max, noNaN: true })));

/** Largest distance by which the coarse polygons stick out of the fine ones, mm. */
function excessOver(coarse: Polygon2[], fine: Polygon2[]): number {
  let worst = 0;
  for (const p of coarse) for (const ring of p) for (const [x, y] of ring) worst = Math.max(worst, -signedDistanceToPolygons(x, y, fine));
  return worst;
}

describe('articulated reach profile (exact boundary tracing)', () => {
  articulatedSets.forEach((params, k) => {
    const profile = articulatedReachProfile(params);

    it(`set ${k}: every forward() wrist point of random in-limit joints lies inside the profile`, () => {
      fc.assert(
        fc.property(jointArb(params.axes), (joints) => {
          const f = articulatedForward(params, joints);
          expect(f.ok).toBe(true);
          if (!f.ok) return;
          const r = signedR(f.wrist.x, f.wrist.y, axisKinematicDeg(params.axes[0], joints[0]));
          expect(signedDistanceToPolygons(r, f.wrist.z, profile.polygons)).toBeGreaterThan(0);
        }),
        { numRuns: 3000 },
      );
    });

    it(`set ${k}: the profile exceeds a 0.05 mm tracing by no more than its stated tolerance`, () => {
      const fine = articulatedReachProfile(params, { toleranceMm: 0.05 });
      expect(profile.toleranceMm).toBeGreaterThanOrEqual(1);
      expect(excessOver(profile.polygons, fine.polygons)).toBeLessThanOrEqual(profile.toleranceMm);
    });
  });

  it('reaches a1 + a2 + a3e at shoulder height when the arm can stretch horizontally', () => {
    const p = articulatedSets[0];
    const profile = articulatedReachProfile(p);
    const slice = profileSliceAt(profile, p.shoulderHeight);
    const far = slice[slice.length - 1][1];
    const stretch = p.shoulderOffset + p.upperArm + Math.hypot(p.forearm, p.elbowOffset);
    expect(far).toBeGreaterThanOrEqual(stretch - 1e-6);
    expect(far - stretch).toBeLessThanOrEqual(profile.toleranceMm);
  });

  it('does not mutate frozen parameters', () => {
    const frozen = deepFreeze(structuredClone(articulatedSets[1]));
    expect(() => articulatedReachProfile(frozen)).not.toThrow();
    expect(articulatedForward(frozen, [10, 20, 30]).ok).toBe(true);
  });
});

describe('scara plan region', () => {
  scaraSets.forEach((params, k) => {
    const region = scaraPlanRegion(params);
    const profile = scaraReachProfile(params);

    it(`set ${k}: every forward() flange point lies inside the plan region and the profile`, () => {
      fc.assert(
        fc.property(jointArb([...params.axes, { min: params.strokeMin, max: params.strokeMax }]), (joints) => {
          const f = scaraForward(params, joints);
          expect(f.ok).toBe(true);
          if (!f.ok) return;
          expect(signedDistanceToPolygons(f.wrist.x, f.wrist.y, region)).toBeGreaterThan(0);
          // The scara profile is exact (no arcs): stroke ends and stretch/fold radii lie on its boundary.
          expect(signedDistanceToPolygons(Math.hypot(f.wrist.x, f.wrist.y), f.wrist.z, profile.polygons)).toBeGreaterThanOrEqual(-1e-6);
          expect(f.tool.z).toBeCloseTo(f.wrist.z - params.toolLength, 12);
        }),
        { numRuns: 3000 },
      );
    });

    it(`set ${k}: J1 limits do not cut the region along radial lines (it reaches past the J1 limit bearing)`, () => {
      // At J1 = max and J2 = max the flange bearing lies beyond the J1 limit; the region must hold it.
      const f = scaraForward(params, [params.axes[0].direction === 1 ? params.axes[0].max : params.axes[0].min, params.axes[1].max, params.strokeMin]);
      if (!f.ok) throw new Error('pose expected');
      expect(pointInPolygons(f.wrist.x, f.wrist.y, region)).toBe(true);
    });
  });

  it('a 2R with full J1 and J2 ranges gives the annulus |a1 − a2| … a1 + a2 (area to 0.1 % with 0.25 mm chords)', () => {
    // Source: planar 2R reach annulus, Spong, Hutchinson & Vidyasagar (docs/sources.md [pub]).
    const p = { ...scaraSets[0], axes: [{ min: -180, max: 180, zeroOffset: 0, direction: 1 as const }, { min: -180, max: 180, zeroOffset: 0, direction: 1 as const }] };
    const region = scaraPlanRegion(p, undefined, 0.25);
    const exact = sectorArea(50, 600, 360);
    const a = polygonsArea(region);
    expect(a).toBeGreaterThanOrEqual(exact * (1 - 1e-6));
    expect(a / exact).toBeLessThan(1.001);
    expect(pointInPolygons(20, 0, region)).toBe(false);
    expect(pointInPolygons(0, 320, region)).toBe(true);
    expect(pointInPolygons(-602, 0, region)).toBe(false);
  });
});

describe('linkage reach profile (motor space, four-bar, coupled limit)', () => {
  linkageSets.forEach((params, k) => {
    const profile = linkageReachProfile(params);

    it(`set ${k}: every assembled in-limit pose puts the flange inside the profile; others are values, never NaN`, () => {
      let assembled = 0;
      fc.assert(
        fc.property(jointArb(params.axes), (joints) => {
          const f = linkageForward(params, joints);
          if (!f.ok) {
            expect(['not-assemblable', 'out-of-limits']).toContain(f.reason);
            expect(typeof f.message).toBe('string');
            return;
          }
          assembled++;
          for (const v of [f.wrist.x, f.wrist.y, f.wrist.z, f.tool.z]) expect(Number.isFinite(v)).toBe(true);
          const r = signedR(f.wrist.x, f.wrist.y, axisKinematicDeg(params.axes[0], joints[0]));
          expect(signedDistanceToPolygons(r, f.wrist.z, profile.polygons)).toBeGreaterThan(0);
        }),
        { numRuns: 4000 },
      );
      expect(assembled).toBeGreaterThan(200);
    });

    it(`set ${k}: the profile exceeds a 0.05 mm tracing by no more than its stated tolerance`, () => {
      const fine = linkageReachProfile(params, { toleranceMm: 0.05 });
      expect(excessOver(profile.polygons, fine.polygons)).toBeLessThanOrEqual(profile.toleranceMm);
    });
  });
});
