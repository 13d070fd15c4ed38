import { readFileSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { fieldErrors } from '@shared/schemas/errors';
import { ArmModelInput, armParamsSchema } from '@shared/schemas/armModel';
import { feasibleArmParamsSchema, parseArmParams, reachProfileOf } from '@shared/kinematics/families';
import { palletizerFourBar } from './fixtures';

const scara = { family: 'scara', innerLink: 325, outerLink: 275, strokeMin: 0, strokeMax: 200, axes: [{ min: -140, max: 140 }, { min: -145, max: 145 }] };
const articulated = { family: 'articulated', shoulderHeight: 450, shoulderOffset: 150, upperArm: 610, forearm: 660, axes: [{ min: -170, max: 170 }, { min: -60, max: 150 }, { min: -200, max: 70 }] };

// The parameters as the server and the model form check them: the schema plus the kinematic checks.
function errorsOf(raw: unknown): Record<string, string> {
  const r = feasibleArmParamsSchema.safeParse(raw);
  expect(r.success).toBe(false);
  return r.success ? {} : fieldErrors(r.error.issues);
}

describe('arm model schema', () => {
  it('applies defaults (tool, payload, axis mapping)', () => {
    const p = armParamsSchema.parse(scara);
    expect(p.family).toBe('scara');
    if (p.family !== 'scara') return;
    expect(p.toolLength).toBe(0);
    expect(p.payloadRadius).toBe(0);
    expect(p.axes[0]).toEqual({ min: -140, max: 140, zeroOffset: 0, direction: 1 });
  });

  it('rejects invalid parameters with a message per field path', () => {
    expect(errorsOf({ ...articulated, upperArm: 0 })).toHaveProperty('upperArm');
    expect(errorsOf({ ...articulated, forearm: -5 })).toHaveProperty('forearm');
    expect(errorsOf({ ...scara, outerLink: 0 })).toHaveProperty('outerLink');
    expect(errorsOf({ ...scara, strokeMin: 300 })).toHaveProperty('strokeMax');
    expect(errorsOf({ ...articulated, axes: [{ min: -170, max: 170 }, { min: 10, max: 10 }, { min: -200, max: 70 }] })['axes.1.max']).toBe('J2 max must be greater than J2 min');
    expect(errorsOf({ ...articulated, axes: [{ min: -170, max: 170 }] })).toHaveProperty('axes');
    expect(errorsOf({ ...articulated, axes: [{ min: -170, max: 170, direction: 2 }, { min: 0, max: 1 }, { min: 0, max: 1 }] })).toHaveProperty('axes.0.direction');
    expect(errorsOf({ ...scara, toolLength: -1 })).toHaveProperty('toolLength');
    expect(errorsOf({ ...scara, innerLink: Number.NaN })).toHaveProperty('innerLink');
    expect(errorsOf({ ...scara, family: 'delta' })).toHaveProperty('family');
  });

  it('rejects a four-bar that assembles nowhere in the motor ranges, and a ground that is not the upper arm', () => {
    // Coupler far too short to bridge crank and rocker across the 1350 mm ground.
    const broken = { ...palletizerFourBar, fourBar: { ...palletizerFourBar.fourBar, coupler: 300 } };
    expect(errorsOf(broken).fourBar).toMatch(/does not assemble/);
    expect(() => parseArmParams(broken)).toThrow(/^in its arm model, the four-bar does not assemble/);
    // The schema alone (zod only, no kinematics) leaves assembly to the kinematic check.
    expect(armParamsSchema.safeParse(broken).success).toBe(true);
    const wrongGround = { ...palletizerFourBar, fourBar: { ...palletizerFourBar.fourBar, ground: 900 } };
    expect(errorsOf(wrongGround)['fourBar.ground']).toMatch(/make the ground link equal to the upper arm/);
    const tight = { ...palletizerFourBar, interiorAngle: { min: 170, max: 175 } };
    expect(errorsOf(tight).interiorAngle).toMatch(/within the elbow angle limits/);
    expect(errorsOf({ ...palletizerFourBar, interiorAngle: { min: 90, max: 40 } })).toHaveProperty('interiorAngle.max');
    expect(armParamsSchema.safeParse(palletizerFourBar).success).toBe(true);
    expect(armParamsSchema.safeParse({ ...palletizerFourBar, fourBar: null }).success).toBe(true);
  });

  it('every samples/arm-models/*.json parses with the schema the app uses and has a reach profile', () => {
    const dir = path.resolve(__dirname, '../../../samples/arm-models');
    const files = readdirSync(dir).filter((f) => f.endsWith('.json'));
    expect(files.length).toBeGreaterThanOrEqual(3);
    for (const f of files) {
      const input = ArmModelInput.parse(JSON.parse(readFileSync(path.join(dir, f), 'utf8')));
      expect(input.name).toMatch(/^Demo /);
      const profile = reachProfileOf(input.params);
      expect(profile.polygons.length).toBeGreaterThan(0);
      expect(profile.maxReach).toBeGreaterThan(0);
    }
  });
});
