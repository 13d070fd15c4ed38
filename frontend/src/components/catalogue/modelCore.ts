/**
 * The shared kinematics core as the catalogue pages use it: the arm model schema (the same the
 * server validates with), forward kinematics and the side reach profile, computed in the browser.
 */
import type { z } from 'zod';
import { familyOf, FeasibleArmModelInput, feasibleArmParamsSchema, forwardModel, reachProfileOf } from '@shared/kinematics';
import type { AxisInfo, ForwardResult, ReachProfile } from '@shared/kinematics';
import type { ArmParams } from '@shared/schemas/armModel';
import { envelopeProfileOf, type EnvelopeProfile } from '@shared/kinematics';
import { FAMILY_LABEL } from '@shared/words';

export const ArmModelParams = feasibleArmParamsSchema;
export type ArmModelParams = ArmParams;
export const ArmModelInput = FeasibleArmModelInput;
export type ArmModelInput = z.infer<typeof FeasibleArmModelInput>;

/** The kinematic families the editor offers, with their labels, in the order shown. */
export const FAMILY_LABELS: Readonly<Record<string, string>> = FAMILY_LABEL;

/** Forward kinematics from controller values (deg / mm), arm frame, mm. */
export function forwardOf(params: ArmModelParams, joints: readonly number[]): ForwardResult {
  return forwardModel(params, joints);
}

/** The side reach profile of the tool point (or wrist centre / flange, per family), arm-frame (r, z) mm. */
export function profileOf(params: ArmModelParams): ReachProfile {
  return reachProfileOf(params);
}

/** The whole-arm envelope (links, tool and payload as capsules) in the same (r, z) frame, mm. */
export function envelopeOf(params: ArmModelParams): EnvelopeProfile {
  return envelopeProfileOf(params);
}

/** Axes in controller units (deg / mm) for the pose panel. */
export function axesOf(params: ArmModelParams): AxisInfo[] {
  return familyOf(params).axes(params);
}
