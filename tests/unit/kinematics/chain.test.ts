import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { Matrix4 } from 'three';
import { readFileSync } from 'node:fs';
import { chainFamily, chainParamsSchema, type ChainParams } from '@shared/kinematics/chain';
import { fieldErrors } from '@shared/schemas/errors';
import { demoSixAxis, demoSixAxisPath, modifiedChain, prismaticChain, randomPose, seeded, sixAxisExample } from './chainFixtures';

const DEG = Math.PI / 180;

/**
 * Independent implementation: the same chain composed with three.js Matrix4 (a general-purpose
 * matrix library; its elements are a plain JS number array, i.e. IEEE float64, column-major).
 * Standard DH: Rz(θ)·Tz(d)·Tx(a)·Rx(α); modified DH: Rx(α_{i-1})·Tx(a_{i-1})·Rz(θ)·Tz(d).
 */
function threeFrames(p: ChainParams, q: number[]): Matrix4[] {
  const frames = [new Matrix4()];
  let current = new Matrix4();
  p.joints.forEach((j, i) => {
    const v = (j.direction ?? 1) * q[i] + (j.zeroOffset ?? 0);
    const theta = (j.theta + (j.type === 'revolute' ? v : 0)) * DEG;
    const d = j.d + (j.type === 'prismatic' ? v : 0);
    const parts =
      p.convention === 'standard'
        ? [new Matrix4().makeRotationZ(theta), new Matrix4().makeTranslation(0, 0, d), new Matrix4().makeTranslation(j.a, 0, 0), new Matrix4().makeRotationX(j.alpha * DEG)]
        : [new Matrix4().makeRotationX(j.alpha * DEG), new Matrix4().makeTranslation(j.a, 0, 0), new Matrix4().makeRotationZ(theta), new Matrix4().makeTranslation(0, 0, d)];
    for (const m of parts) current = current.clone().multiply(m);
    frames.push(current);
  });
  frames.push(current.clone().multiply(new Matrix4().makeTranslation(p.tool.x, p.tool.y, p.tool.z)));
  return frames;
}

describe('chain forward() against three.js Matrix4 (independent implementation), 1,000 random poses each', () => {
  const chains: Array<[string, ChainParams]> = [
    ['the six-axis DH worked example', sixAxisExample],
    ['Demo Six-Axis 2000', demoSixAxis()],
    ['a chain with prismatic joints', prismaticChain],
    ['a modified-DH chain', modifiedChain],
  ];
  for (const [name, params] of chains) {
    it(`${name}: every frame (origin and rotation) agrees to 1e-9 mm`, () => {
      const rand = seeded(name.length * 7919);
      let worst = 0;
      for (let n = 0; n < 1000; n++) {
        const q = randomPose(params, rand);
        const r = chainFamily.forward(params, q);
        if (!r.ok) throw new Error(r.message);
        const ref = threeFrames(params, q);
        expect(r.frames.length).toBe(ref.length);
        r.frames.forEach((f, i) => {
          const e = ref[i].elements; // column-major: element (row, col) at col·4 + row
          const mine = [f.origin.x, f.origin.y, f.origin.z];
          for (let row = 0; row < 3; row++) {
            worst = Math.max(worst, Math.abs(mine[row] - e[12 + row]));
            for (let col = 0; col < 3; col++) worst = Math.max(worst, Math.abs(f.rotation[row][col] - e[col * 4 + row]));
          }
        });
        expect(r.tool).toEqual(r.frames[r.frames.length - 1].origin);
      }
      expect(worst).toBeLessThan(1e-9);
    });
  }
});

describe('chain forward() non-answers', () => {
  const demo = demoSixAxis();

  it('a value outside an axis limit gives out-of-limits with the axis (J1 = 1), never NaN', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 5 }), fc.double({ min: 1e-6, max: 1e4, noNaN: true }), fc.boolean(), (axis, beyond, above) => {
        const q = demo.joints.map((j) => (j.min + j.max) / 2);
        q[axis] = above ? demo.joints[axis].max + beyond : demo.joints[axis].min - beyond;
        const r = chainFamily.forward(demo, q);
        expect(r.ok).toBe(false);
        if (!r.ok) {
          expect(r.reason).toBe('out-of-limits');
          expect(r.axis).toBe(axis + 1);
          expect(r.message).toMatch(new RegExp(`^J${axis + 1} `));
        }
      }),
    );
  });

  it('in-limit values always give finite coordinates in every frame', () => {
    fc.assert(
      fc.property(fc.tuple(...demo.joints.map((j) => fc.double({ min: j.min, max: j.max, noNaN: true }))), (q) => {
        const r = chainFamily.forward(demo, q);
        expect(r.ok).toBe(true);
        if (r.ok) for (const f of r.frames) expect([f.origin.x, f.origin.y, f.origin.z, ...f.rotation.flat()].every(Number.isFinite)).toBe(true);
      }),
    );
  });

  it('a wrong number of values gives bad-joint-count; a non-finite value throws naming it', () => {
    const r = chainFamily.forward(demo, [0, 0, 0]);
    expect(r).toMatchObject({ ok: false, reason: 'bad-joint-count' });
    expect(() => chainFamily.forward(demo, [0, 0, Number.NaN, 0, 0, 0])).toThrow('joints[2]');
  });

  it('controller → kinematic: direction·value + zeroOffset (+ θ) — Demo J2 at controller 0 stands the upper arm vertical', () => {
    const r = chainFamily.forward(demo, [0, 0, 0, 0, 0, 0]);
    if (!r.ok) throw new Error(r.message);
    // J2 origin at the shoulder (a1 = 150, d1 = 520); J3 origin 900 mm straight above it
    expect(r.frames[2].origin.x).toBeCloseTo(150, 9);
    expect(r.frames[2].origin.z).toBeCloseTo(520 + 900, 9);
    const tilted = chainFamily.forward(demo, [0, 30, 0, 0, 0, 0]);
    if (!tilted.ok) throw new Error(tilted.message);
    // direction −1: positive controller J2 leans the upper arm forward (+x)
    expect(tilted.frames[2].origin.x).toBeCloseTo(150 + 900 * Math.sin(30 * DEG), 9);
  });
});

/** Chain parameters as plain JSON, so a test can write the wrong values the schema must reject. */
type LooseChain = { joints: Record<string, unknown>[]; tool: Record<string, unknown>; [key: string]: unknown };

describe('chainParamsSchema', () => {
  const good = () => structuredClone(demoSixAxis()) as LooseChain;
  const errorsOf = (v: unknown) => {
    const r = chainParamsSchema.safeParse(v);
    expect(r.success).toBe(false);
    return r.success ? {} : fieldErrors(r.error.issues);
  };

  it('the sample samples/arm-models/demo-six-axis-2000.json parses, is named generically, and its reach is about 2000 mm', () => {
    const raw = JSON.parse(readFileSync(demoSixAxisPath, 'utf8'));
    expect(raw.name).toBe('Demo Six-Axis 2000');
    const p = chainParamsSchema.parse(raw.params);
    // wrist-centre reach with the upper arm and forearm stretched forward: a1 + a2 + √(a3² + d4²)
    const wristReach = p.joints[0].a + p.joints[1].a + Math.hypot(p.joints[2].a, p.joints[3].d);
    expect(wristReach).toBeGreaterThan(1900);
    expect(wristReach).toBeLessThan(2100);
    expect(chainFamily.j1Range(p)).toEqual({ min: -180, max: 180 });
  });

  it('rejects min ≥ max, no joints, more than 8 joints, non-finite numbers, a non-vertical first axis — with field paths', () => {
    const a = good();
    a.joints[2].min = 50;
    a.joints[2].max = 50;
    expect(errorsOf(a)).toHaveProperty(['joints.2.max']);

    expect(errorsOf({ ...good(), joints: [] })).toHaveProperty(['joints']);
    const many = good();
    many.joints = Array.from({ length: 9 }, () => many.joints[1]);
    many.joints[0] = good().joints[0];
    expect(errorsOf(many)).toHaveProperty(['joints']);

    const nan = good();
    nan.joints[1].a = Number.NaN;
    expect(errorsOf(nan)['joints.1.a']).toBe('J2 a must be a number');
    const inf = good();
    inf.tool.z = Number.POSITIVE_INFINITY;
    expect(errorsOf(inf)).toHaveProperty(['tool.z']);

    const prismaticFirst = good();
    prismaticFirst.joints[0].type = 'prismatic';
    expect(errorsOf(prismaticFirst)).toHaveProperty(['joints.0.type']);

    const tilted = structuredClone(modifiedChain) as LooseChain;
    tilted.joints[0].alpha = 90;
    expect(errorsOf(tilted)).toHaveProperty(['joints.0.alpha']);
    const shifted = structuredClone(modifiedChain) as LooseChain;
    shifted.joints[0].a = 50;
    expect(errorsOf(shifted)).toHaveProperty(['joints.0.a']);

    const badDirection = good();
    badDirection.joints[1].direction = 2;
    expect(errorsOf(badDirection)).toHaveProperty(['joints.1.direction']);
  });

  it('any single corrupted number is rejected at its own path', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 5 }), fc.constantFrom('a', 'alpha', 'd', 'theta', 'min', 'max'), fc.constantFrom(Number.NaN, Infinity, -Infinity, '12'), (i, key, bad) => {
        const p = good();
        p.joints[i][key] = bad;
        expect(errorsOf(p)).toHaveProperty([`joints.${i}.${key}`]);
      }),
    );
  });
});

describe('chain family helpers', () => {
  it('axes() lists controller limits; j1Range() is direction·limit + zeroOffset + θ', () => {
    expect(chainFamily.axes(prismaticChain).map((a) => [a.label, a.kind, a.min, a.max])).toEqual([
      ['J1', 'revolute', -170, 170],
      ['J2', 'prismatic', 0, 900],
      ['J3', 'prismatic', -100, 700],
      ['J4', 'revolute', -120, 120],
    ]);
    // direction −1, zeroOffset 15: −1·170 + 15 = −155 … −1·(−170) + 15 = 185
    expect(chainFamily.j1Range(prismaticChain)).toEqual({ min: -155, max: 185 });
  });

  it('lateralOffset() is the side offset of the six-axis example (−150.05 mm: d3) and 0 for the in-plane demo arm', () => {
    expect(chainFamily.lateralOffset(sixAxisExample)).toBeCloseTo(-150.05, 6);
    expect(Math.abs(chainFamily.lateralOffset(demoSixAxis()))).toBeLessThan(5);
  });
});
