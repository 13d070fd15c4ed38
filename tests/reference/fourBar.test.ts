import { describe, expect, it } from 'vitest';
import { assemblyRanges, fourBarPose, grashofClass, transmissionAngle, type FourBarBranch, type FourBarLinks } from '@shared/kinematics/fourBar';

const norton: FourBarLinks = { a: 2, b: 7, c: 9, d: 6 };
const DEG = 180 / Math.PI;

/**
 * The independent route: rocker and coupler angles by Freudenstein's equation in Norton's
 * half-angle form (Design of Machinery, ch. 4): K1 = d/a, K2 = d/c, K3 = (a² − b² + c² + d²)/(2ac),
 * A = cos θ2 − K1 − K2 cos θ2 + K3, B = −2 sin θ2, C = K1 − (K2 + 1) cos θ2 + K3,
 * θ4 = 2·atan2(−B ∓ √(B² − 4AC), 2A); K4 = d/b, K5 = (c² − d² − a² − b²)/(2ab) likewise for θ3.
 * Degrees, ground line at 0°; null when the discriminant is negative (the linkage does not assemble).
 */
function freudensteinPose({ a, b, c, d }: FourBarLinks, theta2Deg: number, branch: FourBarBranch): { theta3Deg: number; theta4Deg: number } | null {
  const c2 = Math.cos(theta2Deg / DEG);
  const s2 = Math.sin(theta2Deg / DEG);
  const K1 = d / a;
  const K2 = d / c;
  const K3 = (a * a - b * b + c * c + d * d) / (2 * a * c);
  const K4 = d / b;
  const K5 = (c * c - d * d - a * a - b * b) / (2 * a * b);
  const A = c2 - K1 - K2 * c2 + K3;
  const B = -2 * s2;
  const C = K1 - (K2 + 1) * c2 + K3;
  const D = c2 - K1 + K4 * c2 + K5;
  const E = -2 * s2;
  const F = K1 + (K4 - 1) * c2 + K5;
  const disc4 = B * B - 4 * A * C;
  const disc3 = E * E - 4 * D * F;
  if (disc4 < -1e-12 || disc3 < -1e-12) return null;
  const sign = branch === 'open' ? -1 : 1;
  return {
    theta3Deg: 2 * Math.atan2(-E + sign * Math.sqrt(Math.max(0, disc3)), 2 * D) * DEG,
    theta4Deg: 2 * Math.atan2(-B + sign * Math.sqrt(Math.max(0, disc4)), 2 * A) * DEG,
  };
}

/** Residual of Freudenstein's equation K1 cos θ4 − K2 cos θ2 + K3 − cos(θ2 − θ4) (0 on a valid pose); degrees in. */
function freudensteinResidual({ a, b, c, d }: FourBarLinks, theta2Deg: number, theta4Deg: number): number {
  const t2 = theta2Deg / DEG;
  const t4 = theta4Deg / DEG;
  const K3 = (a * a - b * b + c * c + d * d) / (2 * a * c);
  return (d / a) * Math.cos(t4) - (d / c) * Math.cos(t2) + K3 - Math.cos(t2 - t4);
}

function pose(p: ReturnType<typeof fourBarPose>) {
  if (!p.ok) throw new Error('expected an assembled pose');
  return p;
}

describe('four-bar against Norton, Design of Machinery, ch. 4', () => {
  it('Example 4-1 (a=2, b=7, c=9, d=6, θ2=30°): open θ3 = 88.84°, θ4 = 117.29°', () => {
    // Source: Norton, Example 4-1 — value from memory, reproduced by derivation (docs/sources.md [mem]).
    const p = pose(fourBarPose(norton, 30, 'open'));
    expect(p.theta3Deg).toBeCloseTo(88.84, 2);
    expect(p.theta4Deg).toBeCloseTo(117.29, 2);
  });

  it('crossed branch θ3 = −115.21°, θ4 = −143.66°', () => {
    // Source: same linkage, crossed circuit — derived from the law of cosines (docs/sources.md [derived]).
    const p = pose(fourBarPose(norton, 30, 'crossed'));
    expect(p.theta3Deg).toBeCloseTo(-115.21, 2);
    expect(p.theta4Deg).toBeCloseTo(-143.66, 1);
  });

  it('transmission angle μ = 28.45° at θ2 = 30°', () => {
    // Source: transmission angle of Example 4-1 — derived (docs/sources.md [derived]).
    expect(transmissionAngle(norton, 30)).toBeCloseTo(28.45, 2);
    expect(pose(fourBarPose(norton, 30, 'open')).transmissionDeg).toBeCloseTo(28.45, 2);
  });

  it('law of cosines route and Freudenstein half-angle form agree over many input angles and linkages', () => {
    // Source: Freudenstein's equation, Norton ch. 4 form (docs/sources.md [pub]) as an independent route.
    const linkages: FourBarLinks[] = [norton, { a: 3, b: 8, c: 6, d: 7 }, { a: 150, b: 1250, c: 150, d: 1250.5 }, { a: 5, b: 3, c: 4, d: 7 }];
    let compared = 0;
    for (const links of linkages) {
      for (let t = -179; t <= 180; t += 1.7) {
        for (const branch of ['open', 'crossed'] as const) {
          const lc = fourBarPose(links, t, branch);
          const fr = freudensteinPose(links, t, branch);
          expect(lc.ok).toBe(fr !== null);
          if (lc.ok && fr) {
            const d4 = Math.abs(((lc.theta4Deg - fr.theta4Deg + 540) % 360) - 180);
            const d3 = Math.abs(((lc.theta3Deg - fr.theta3Deg + 540) % 360) - 180);
            expect(d4).toBeLessThan(1e-6);
            expect(d3).toBeLessThan(1e-6);
            expect(Math.abs(freudensteinResidual(links, t, lc.theta4Deg))).toBeLessThan(1e-9);
            compared++;
          }
        }
      }
    }
    expect(compared).toBeGreaterThan(500);
  });

  it('Grashof classes: s + l vs p + q and which link is shortest', () => {
    // Source: Grashof condition, Norton ch. 2 (docs/sources.md [pub]); Example 4-1 is a crank-rocker.
    expect(grashofClass(norton).kind).toBe('crank-rocker');
    expect(grashofClass({ a: 4, b: 7, c: 8, d: 2 }).kind).toBe('double-crank');
    expect(grashofClass({ a: 7, b: 2, c: 9, d: 6 }).kind).toBe('double-rocker');
    expect(grashofClass({ a: 2, b: 6, c: 2, d: 6 }).kind).toBe('change-point');
    expect(grashofClass({ a: 5, b: 3, c: 4, d: 7 }).kind).toBe('triple-rocker');
    expect(grashofClass({ a: 5, b: 3, c: 4, d: 7 }).grashof).toBe(false);
  });

  it('assembly ranges: a crank-rocker turns fully, a triple rocker stops at its toggle angles', () => {
    // Source: assembly condition |b − c| ≤ f ≤ b + c with the law of cosines for f (docs/sources.md [pub]).
    expect(assemblyRanges(norton)).toEqual([[-180, 180]]);
    const tripleRocker = { a: 5, b: 3, c: 4, d: 7 };
    const r = assemblyRanges(tripleRocker);
    expect(r.length).toBe(1);
    // Toggle: f = b + c = 7 → cos θ2 = (25 + 49 − 49)/70 → θ2 = ±69.075°; f = |b − c| is never reached.
    const toggle = (Math.acos(25 / 70) * 180) / Math.PI;
    expect(r[0][0]).toBeCloseTo(-toggle, 9);
    expect(r[0][1]).toBeCloseTo(toggle, 9);
    expect(fourBarPose(tripleRocker, toggle + 1, 'open')).toEqual({ ok: false, reason: 'not-assemblable' });
    expect(freudensteinPose(tripleRocker, toggle + 1, 'open')).toBeNull();
    expect(fourBarPose(tripleRocker, toggle - 1, 'open').ok).toBe(true);
    expect(assemblyRanges({ a: 1, b: 1, c: 1, d: 10 })).toEqual([]);
  });
});
