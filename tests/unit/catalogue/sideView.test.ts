// Side view of a pose (pose panel drawing) and the copy names of duplicated models.
import { Matrix4 } from 'three';
import { describe, expect, it } from 'vitest';
import { chainForward, chainParamsSchema } from '@shared/kinematics/chain';
import { copyName } from '../../../frontend/src/api/armModels';
import { polygonsPath } from '../../../frontend/src/components/catalogue/profileDrawing';
import { sideViewPoints } from '../../../frontend/src/components/catalogue/sideView';

/** Anthropomorphic 3R (Siciliano et al., Robotics: Modelling, Planning and Control, §2.9.3), d1 = 300, a2 = 500, a3 = 400 mm, as a standard DH chain. */
const threeR = chainParamsSchema.parse({
  family: 'chain',
  convention: 'standard',
  joints: [
    { type: 'revolute', a: 0, alpha: 90, d: 300, theta: 0, min: -180, max: 180 },
    { type: 'revolute', a: 500, alpha: 0, d: 0, theta: 0, min: -180, max: 180 },
    { type: 'revolute', a: 400, alpha: 0, d: 0, theta: 0, min: -180, max: 180 },
  ],
  tool: { x: 0, y: 0, z: 0 },
});

describe('sideViewPoints', () => {
  it('gives the planar elbow arm in its own plane: shoulder, elbow and wrist at (r, z) of the closed form', () => {
    const r = chainForward(threeR, [45, 30, -60]);
    if (!r.ok) throw new Error(r.message);
    const pts = sideViewPoints(r.frames);
    // r = a2 cos θ2 + a3 cos(θ2 + θ3), z = d1 + a2 sin θ2 + a3 sin(θ2 + θ3) (Siciliano et al. §2.9.3) [derived]
    const t2 = Math.PI / 6, t23 = -Math.PI / 6;
    const want: Array<[number, number]> = [
      [0, 0],
      [0, 300],
      [500 * Math.cos(t2), 300 + 500 * Math.sin(t2)],
      [500 * Math.cos(t2) + 400 * Math.cos(t23), 300 + 500 * Math.sin(t2) + 400 * Math.sin(t23)],
    ];
    expect(pts).toHaveLength(want.length);
    pts.forEach((p, i) => {
      expect(p[0]).toBeCloseTo(want[i][0], 9);
      expect(p[1]).toBeCloseTo(want[i][1], 9);
    });
  });

  it('does not change when J1 turns (rotation about the vertical axis, checked with three.js Matrix4)', () => {
    const a = chainForward(threeR, [0, 70, -150]);
    const b = chainForward(threeR, [-120, 70, -150]);
    if (!a.ok || !b.ok) throw new Error('pose');
    // The J1 = −120° frames are the J1 = 0 frames turned by −120° about z (independent rotation via three.js).
    const rot = new Matrix4().makeRotationZ((-120 * Math.PI) / 180);
    a.frames.forEach((f, i) => {
      const m = new Matrix4().makeTranslation(f.origin.x, f.origin.y, f.origin.z).premultiply(rot);
      expect(b.frames[i].origin.x).toBeCloseTo(m.elements[12], 9);
      expect(b.frames[i].origin.y).toBeCloseTo(m.elements[13], 9);
    });
    const pa = sideViewPoints(a.frames), pb = sideViewPoints(b.frames);
    pa.forEach((p, i) => {
      expect(pb[i][0]).toBeCloseTo(p[0], 9);
      expect(pb[i][1]).toBeCloseTo(p[1], 9);
    });
    // The elbow leaning back over the top is drawn behind the J1 axis (negative r).
    const c = chainForward(threeR, [0, 120, 0]);
    if (!c.ok) throw new Error('pose');
    expect(sideViewPoints(c.frames).at(-1)![0]).toBeLessThan(0);
  });
});

describe('copyName', () => {
  it('adds "(copy)", then numbers it while the name is taken (any letter case)', () => {
    expect(copyName('Demo SCARA 600', ['Demo SCARA 600'])).toBe('Demo SCARA 600 (copy)');
    expect(copyName('Demo SCARA 600', ['demo scara 600 (COPY)'])).toBe('Demo SCARA 600 (copy 2)');
    expect(copyName('A', ['A (copy)', 'A (copy 2)'])).toBe('A (copy 3)');
  });
});

describe('polygonsPath', () => {
  it('writes every ring (outer and holes) as a closed subpath through the scales', () => {
    const d = polygonsPath(
      [
        [
          [[0, 0], [10, 0], [10, 10], [0, 10]],
          [[2, 2], [4, 2], [4, 4]],
        ],
      ],
      (r) => r * 2,
      (z) => -z,
    );
    expect(d).toBe('M0.00,0.00L20.00,0.00L20.00,-10.00L0.00,-10.00ZM4.00,-2.00L8.00,-2.00L8.00,-4.00Z');
  });
});
