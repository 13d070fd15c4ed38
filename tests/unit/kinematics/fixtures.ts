import type { ArmParams, ArticulatedParams, LinkageParams, ScaraParams } from '@shared/schemas/armModel';
import { parseArmParams } from '@shared/kinematics/families';

/** An axis in controller degrees with its controller → kinematic mapping. */
export const ax = (min: number, max: number, zeroOffset = 0, direction: 1 | -1 = 1) => ({ min, max, zeroOffset, direction });

/** Freezes an object graph, so a test can prove nothing mutates its inputs. */
export function deepFreeze<T>(o: T): T {
  if (o && typeof o === 'object' && !Object.isFrozen(o)) {
    Object.freeze(o);
    for (const v of Object.values(o as object)) deepFreeze(v);
  }
  return o;
}

export const articulatedSets: ArticulatedParams[] = [
  // A medium six-axis class arm (invented numbers), elbow offset, wide J3.
  parseArmParams({ family: 'articulated', shoulderHeight: 450, shoulderOffset: 150, upperArm: 610, forearm: 660, elbowOffset: 115, toolLength: 100, axes: [ax(-170, 170), ax(-60, 150), ax(-200, 70)] }),
  // Asymmetric limits, direction −1 and zero offsets, negative elbow offset.
  parseArmParams({ family: 'articulated', shoulderHeight: 300, shoulderOffset: 0, upperArm: 500, forearm: 420, elbowOffset: -40, axes: [ax(-100, 150, 30, -1), ax(-20, 120, 90, -1), ax(-150, 80, -90)] }),
  // Equal links with full stretch and fold inside the J3 range (folds to the shoulder).
  parseArmParams({ family: 'articulated', shoulderHeight: 700, shoulderOffset: 200, upperArm: 800, forearm: 800, axes: [ax(-180, 180), ax(-100, 200), ax(-180, 180)] }),
] as ArticulatedParams[];

export const scaraSets: ScaraParams[] = [
  parseArmParams({ family: 'scara', innerLink: 325, outerLink: 275, strokeMin: 50, strokeMax: 250, toolLength: 40, axes: [ax(-140, 140), ax(-145, 145)] }),
  parseArmParams({ family: 'scara', innerLink: 250, outerLink: 350, strokeMin: -100, strokeMax: 100, axes: [ax(-60, 170, 15, -1), ax(-30, 150, -20)] }),
] as ScaraParams[];

export const palletizerFourBar = {
  family: 'linkage',
  shoulderHeight: 900,
  shoulderOffset: 250,
  upperArm: 1350,
  forearm: 1600,
  flangeOffset: { horizontal: 250, vertical: -250 },
  fourBar: { ground: 1350, crank: 320, coupler: 1360, rocker: 300, groundAngle: 0, branch: 'open', rockerToForearm: 180 },
  interiorAngle: { min: 25, max: 150 },
  toolLength: 300,
  axes: [ax(-180, 180), ax(40, 135), ax(-75, 20, 180)],
} as const;

export const linkageSets: LinkageParams[] = [
  parseArmParams(palletizerFourBar),
  // Exact parallelogram: the forearm keeps the J3 motor's absolute angle.
  parseArmParams({ ...palletizerFourBar, fourBar: null, elbowOffset: 60, axes: [ax(-170, 170), ax(30, 130), ax(-80, 25)], interiorAngle: { min: 30, max: 160 } }),
  // Crossed branch with asymmetric, reversed motor axes.
  parseArmParams({
    ...palletizerFourBar,
    fourBar: { ground: 1350, crank: 280, coupler: 1300, rocker: 330, branch: 'crossed', rockerToForearm: -150 },
    interiorAngle: { min: 10, max: 350 },
    axes: [ax(-90, 200), ax(-120, -30, 0, -1), ax(-150, 150)],
  }),
] as LinkageParams[];

/** The plan-free "signed r" of an arm-frame point in the reach plane at kinematic bearing b (degrees). */
export function signedR(x: number, y: number, bearingDeg: number): number {
  const b = (bearingDeg * Math.PI) / 180;
  return x * Math.cos(b) + y * Math.sin(b);
}

export type { ArmParams };
