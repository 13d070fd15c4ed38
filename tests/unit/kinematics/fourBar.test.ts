import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { assemblyRanges, fourBarPose, transmissionAngle } from '@shared/kinematics/fourBar';

describe('four-bar solver', () => {
  it('assembled poses close the loop: |B − A| = b for both branches; outside the ranges it is a value, never NaN', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 20, noNaN: true }),
        fc.double({ min: 1, max: 20, noNaN: true }),
        fc.double({ min: 1, max: 20, noNaN: true }),
        fc.double({ min: 1, max: 20, noNaN: true }),
        fc.double({ min: -180, max: 180, noNaN: true }),
        (a, b, c, d, t2) => {
          const links = { a, b, c, d };
          const ranges = assemblyRanges(links);
          const inRange = ranges.some(([lo, hi]) => (t2 >= lo && t2 <= hi) || (t2 + 360 >= lo && t2 + 360 <= hi));
          for (const branch of ['open', 'crossed'] as const) {
            const p = fourBarPose(links, t2, branch);
            if (!p.ok) {
              expect(p.reason).toBe('not-assemblable');
              // A few ulps at a toggle boundary are allowed either way.
              continue;
            }
            expect(inRange || ranges.some(([lo, hi]) => Math.min(Math.abs(t2 - lo), Math.abs(t2 - hi)) < 1e-3)).toBe(true);
            const t2r = (t2 * Math.PI) / 180;
            const t4r = (p.theta4Deg * Math.PI) / 180;
            const ax = a * Math.cos(t2r);
            const ay = a * Math.sin(t2r);
            const bx = d + c * Math.cos(t4r);
            const by = c * Math.sin(t4r);
            expect(Math.hypot(bx - ax, by - ay)).toBeCloseTo(b, 6);
            expect(Number.isFinite(p.theta3Deg)).toBe(true);
            expect(p.transmissionDeg).toBeGreaterThanOrEqual(0);
            expect(p.transmissionDeg).toBeLessThanOrEqual(90);
          }
          if (inRange) expect(transmissionAngle(links, t2)).not.toBeNull();
        },
      ),
      { numRuns: 500 },
    );
  });

  it('a parallelogram (change point) is the open branch above the ground line and the crossed one below it', () => {
    // At θ2 = 0° and 180° all links are collinear and the two branch formulas swap roles.
    for (let t = -175; t <= 175; t += 10) {
      const p = fourBarPose({ a: 150, b: 1200, c: 150, d: 1200 }, t, t > 0 ? 'open' : 'crossed');
      expect(p.ok).toBe(true);
      if (p.ok) expect(p.theta4Deg).toBeCloseTo(t, 9);
    }
  });

  it('rejects non-positive lengths by name', () => {
    expect(() => fourBarPose({ a: 0, b: 1, c: 1, d: 1 }, 0, 'open')).toThrow(/^a /);
    expect(() => assemblyRanges({ a: 1, b: 1, c: -1, d: 1 })).toThrow(/^c /);
  });
});
