// Chain forward kinematics against published worked examples (sources named beside each check,
// as listed in docs/sources.md).
import { describe, expect, it } from 'vitest';
import { chainFamily, chainParamsSchema, type ChainParams } from '@shared/kinematics/chain';

type Row = [theta: number, d: number, a: number, alpha: number];

function standardChain(rows: Row[], tool = { x: 0, y: 0, z: 0 }): ChainParams {
  return chainParamsSchema.parse({
    family: 'chain',
    convention: 'standard',
    joints: rows.map(([theta, d, a, alpha]) => ({ type: 'revolute', a, alpha, d, theta, min: -360, max: 360 })),
    tool,
  });
}

/** The same arm as a modified (Craig) table: row i takes a_{i-1}, α_{i-1} of the standard table; the last Tx(a_n)Rx(α_n) is zero here. */
function modifiedChain(rows: Row[]): ChainParams {
  return chainParamsSchema.parse({
    family: 'chain',
    convention: 'modified',
    joints: rows.map(([theta, d], i) => ({
      type: 'revolute',
      a: i === 0 ? 0 : rows[i - 1][2],
      alpha: i === 0 ? 0 : rows[i - 1][3],
      d,
      theta,
      min: -360,
      max: 360,
    })),
    tool: { x: 0, y: 0, z: 0 },
  });
}

function forwardOk(p: ChainParams, q: number[]) {
  const r = chainFamily.forward(p, q);
  if (!r.ok) throw new Error(r.message);
  return r;
}

// The six-axis DH worked example: Corke, Robotics, Vision and Control, 2nd ed., kinematics
// chapter; standard DH rows (θ offset, d, a, α) in metres there, in mm here.
const SIX_AXIS: Row[] = [
  [0, 0, 0, 90],
  [0, 0, 431.8, 0],
  [0, 150.05, 20.3, -90],
  [0, 431.8, 0, 90],
  [0, 0, 0, -90],
  [0, 0, 0, 0],
];
// Published values have 4 decimals of a metre (±0.05 mm) and rotation entries to 4 digits.
const PUBLISHED_MM = 0.051;
const PUBLISHED_ROT = 1e-4;

describe('the six-axis DH worked example (Corke, Robotics, Vision and Control, 2nd ed.)', () => {
  const arm = standardChain(SIX_AXIS);
  const deg = (v: number[]) => v;

  it('all joints 0 → identity rotation, position (0.4521, −0.15005, 0.4318) m [pub]', () => {
    const r = forwardOk(arm, [0, 0, 0, 0, 0, 0]);
    expect(r.tool.x).toBeCloseTo(452.1, 1);
    expect(Math.abs(r.tool.x - 452.1)).toBeLessThan(PUBLISHED_MM);
    expect(Math.abs(r.tool.y + 150.05)).toBeLessThan(PUBLISHED_MM);
    expect(Math.abs(r.tool.z - 431.8)).toBeLessThan(PUBLISHED_MM);
    const rot = r.frames[r.frames.length - 1].rotation;
    [[1, 0, 0], [0, 1, 0], [0, 0, 1]].forEach((row, i) => row.forEach((v, j) => expect(Math.abs(rot[i][j] - v)).toBeLessThan(PUBLISHED_ROT)));
  });

  it('q = (0, 90°, −90°, 0, 0, 0) → identity rotation, position (0.0203, −0.15005, 0.8636) m [derived]', () => {
    const r = forwardOk(arm, deg([0, 90, -90, 0, 0, 0]));
    expect(Math.abs(r.tool.x - 20.3)).toBeLessThan(PUBLISHED_MM);
    expect(Math.abs(r.tool.y + 150.05)).toBeLessThan(PUBLISHED_MM);
    expect(Math.abs(r.tool.z - 863.6)).toBeLessThan(PUBLISHED_MM);
    const rot = r.frames[r.frames.length - 1].rotation;
    [[1, 0, 0], [0, 1, 0], [0, 0, 1]].forEach((row, i) => row.forEach((v, j) => expect(Math.abs(rot[i][j] - v)).toBeLessThan(PUBLISHED_ROT)));
  });

  it('q = (0, 45°, 180°, 0, 45°, 0) → (0.5963, −0.15005, −0.0144) m, rotation rows [[0,0,1],[0,1,0],[−1,0,0]] [derived; matches the book from memory]', () => {
    const r = forwardOk(arm, deg([0, 45, 180, 0, 45, 0]));
    expect(Math.abs(r.tool.x - 596.3)).toBeLessThan(PUBLISHED_MM);
    expect(Math.abs(r.tool.y + 150.05)).toBeLessThan(PUBLISHED_MM);
    expect(Math.abs(r.tool.z + 14.4)).toBeLessThan(PUBLISHED_MM);
    const rot = r.frames[r.frames.length - 1].rotation;
    [[0, 0, 1], [0, 1, 0], [-1, 0, 0]].forEach((row, i) => row.forEach((v, j) => expect(Math.abs(rot[i][j] - v)).toBeLessThan(PUBLISHED_ROT)));
  });

  it('the wrist is the frame-4 origin, which the tool point equals for a zero tool (spherical wrist) [derived]', () => {
    const r = forwardOk(arm, [10, 20, -30, 40, 50, 60]);
    expect(r.wrist.x).toBeCloseTo(r.tool.x, 9);
    expect(r.wrist.y).toBeCloseTo(r.tool.y, 9);
    expect(r.wrist.z).toBeCloseTo(r.tool.z, 9);
    expect(r.frames.map((f) => f.label)).toEqual(['base', 'J1', 'J2', 'J3', 'J4', 'J5', 'J6', 'tool']);
  });

  it('the same arm as a modified-DH table gives the same tool points [derived: regrouping the product of the standard transforms]', () => {
    const modified = modifiedChain(SIX_AXIS);
    for (const q of [[0, 0, 0, 0, 0, 0], [0, 90, -90, 0, 0, 0], [0, 45, 180, 0, 45, 0], [33, -71, 12, 150, -95, 270], [-170, 10, 200, -45, 30, -10]]) {
      const a = forwardOk(arm, q), b = forwardOk(modified, q);
      expect(b.tool.x).toBeCloseTo(a.tool.x, 9);
      expect(b.tool.y).toBeCloseTo(a.tool.y, 9);
      expect(b.tool.z).toBeCloseTo(a.tool.z, 9);
      expect(b.wrist.x).toBeCloseTo(a.wrist.x, 9);
      expect(b.wrist.z).toBeCloseTo(a.wrist.z, 9);
    }
  });
});

describe('planar 2R as a DH chain (Spong, Hutchinson & Vidyasagar, planar elbow arm; Siciliano et al. §2.9)', () => {
  // two revolute joints about parallel vertical axes: rows (θ, d, a, α) = (0, 0, l1, 0), (0, 0, l2, 0)
  it('l1 = l2 = 1, θ = (30°, 45°) → (1.12484, 1.46593) [derived]', () => {
    const r = forwardOk(standardChain([[0, 0, 1, 0], [0, 0, 1, 0]]), [30, 45]);
    expect(r.tool.x).toBeCloseTo(1.12484, 5);
    expect(r.tool.y).toBeCloseTo(1.46593, 5);
    expect(r.tool.z).toBeCloseTo(0, 12);
  });

  it('l = (0.5, 0.4), θ = (0°, 90°) → (0.5, 0.4) [derived]', () => {
    const r = forwardOk(standardChain([[0, 0, 0.5, 0], [0, 0, 0.4, 0]]), [0, 90]);
    expect(r.tool.x).toBeCloseTo(0.5, 12);
    expect(r.tool.y).toBeCloseTo(0.4, 12);
  });
});

describe('anthropomorphic 3R with base height d1 (Siciliano et al. §2.9.3)', () => {
  // rows (θ, d, a, α): (0, d1, 0, 90°), (0, 0, a2, 0), (0, 0, a3, 0)
  const arm = standardChain([[0, 300, 0, 90], [0, 0, 500, 0], [0, 0, 400, 0]]);

  it('d1 = 300, a2 = 500, a3 = 400 mm, θ = (45°, 30°, −60°) → (551.1, 551.1, 350.0) mm [derived]', () => {
    const r = forwardOk(arm, [45, 30, -60]);
    expect(r.tool.x).toBeCloseTo(551.1, 1);
    expect(r.tool.y).toBeCloseTo(551.1, 1);
    expect(r.tool.z).toBeCloseTo(350.0, 1);
  });

  it('matches the closed form x = cos θ1 (a2 cos θ2 + a3 cos(θ2+θ3)), z = d1 + a2 sin θ2 + a3 sin(θ2+θ3) at other poses [pub]', () => {
    const rad = Math.PI / 180;
    for (const [t1, t2, t3] of [[0, 0, 0], [-120, 75, 40], [200, -30, -150], [10, 170, 90]]) {
      const r = forwardOk(arm, [t1, t2, t3]);
      const planar = 500 * Math.cos(t2 * rad) + 400 * Math.cos((t2 + t3) * rad);
      expect(r.tool.x).toBeCloseTo(Math.cos(t1 * rad) * planar, 9);
      expect(r.tool.y).toBeCloseTo(Math.sin(t1 * rad) * planar, 9);
      expect(r.tool.z).toBeCloseTo(300 + 500 * Math.sin(t2 * rad) + 400 * Math.sin((t2 + t3) * rad), 9);
    }
  });
});
