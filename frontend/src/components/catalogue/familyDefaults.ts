import type { z } from 'zod';
import type { ArmModelInput } from './modelCore';

/** The editor's form values (what the schema takes in). */
export type ArmModelFormValues = z.input<typeof ArmModelInput>;

/**
 * A four-bar to start from when a parallelogram drive is switched to a four-bar: ground = the
 * upper arm, a short crank and rocker, the coupler a little longer than the ground (crank-rocker
 * by Grashof's condition).
 */
export const DEFAULT_FOUR_BAR = (upperArm: number) => {
  const ground = Number.isFinite(upperArm) && upperArm > 0 ? upperArm : 1150;
  return { ground, crank: 300, coupler: ground + 10, rocker: 320, groundAngle: 0, branch: 'crossed' as const, rockerToForearm: 0 };
};

/**
 * Starting parameters of a new model per family: a plausible arm to edit from (lengths mm, angles deg).
 * Stopping data is left empty: it must come from the maker's measured values for the real arm.
 */
export function defaultParams(family: string): ArmModelFormValues['params'] {
  switch (family) {
    case 'scara':
      return {
        family: 'scara',
        innerLink: 325,
        outerLink: 275,
        strokeMin: 100,
        strokeMax: 300,
        axes: [
          { min: -140, max: 140, zeroOffset: 0, direction: 1 },
          { min: -145, max: 145, zeroOffset: 0, direction: 1 },
        ],
        toolLength: 50,
        payloadKg: 6,
      };
    case 'articulated':
      return {
        family: 'articulated',
        shoulderHeight: 450,
        shoulderOffset: 150,
        upperArm: 560,
        forearm: 620,
        elbowOffset: 0,
        axes: [
          { min: -170, max: 170, zeroOffset: 0, direction: 1 },
          { min: -90, max: 150, zeroOffset: 90, direction: -1 },
          { min: -160, max: 70, zeroOffset: -90, direction: 1 },
        ],
        toolLength: 100,
        payloadKg: 10,
      };
    case 'linkage':
      return {
        family: 'linkage',
        shoulderHeight: 700,
        shoulderOffset: 250,
        upperArm: 1150,
        forearm: 1300,
        elbowOffset: 0,
        flangeOffset: { horizontal: 200, vertical: -150 },
        fourBar: DEFAULT_FOUR_BAR(1150),
        interiorAngle: { min: 25, max: 160 },
        axes: [
          { min: -180, max: 180, zeroOffset: 0, direction: 1 },
          { min: -40, max: 90, zeroOffset: 90, direction: -1 },
          { min: -100, max: 40, zeroOffset: 0, direction: 1 },
        ],
        toolLength: 250,
        payloadKg: 120,
      };
    case 'chain':
    default:
      return {
        family: 'chain',
        convention: 'standard',
        joints: [
          { type: 'revolute', a: 0, alpha: 90, d: 400, theta: 0, min: -170, max: 170, zeroOffset: 0, direction: 1 },
          { type: 'revolute', a: 600, alpha: 0, d: 0, theta: 0, min: -60, max: 150, zeroOffset: 0, direction: 1 },
          { type: 'revolute', a: 500, alpha: 0, d: 0, theta: 0, min: -150, max: 120, zeroOffset: 0, direction: 1 },
        ],
        tool: { x: 0, y: 0, z: 0 },
        payloadKg: 10,
      };
  }
}
