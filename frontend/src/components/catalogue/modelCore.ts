/**
 * The shared kinematics core as the catalogue pages use it: the arm model schema (the same the
 * server validates with), forward kinematics and the side reach profile, computed in the browser.
 */
import { z } from 'zod';
import { chainAxes, chainForward, chainParamsSchema, chainSampledProfile, type ChainParams } from '@shared/kinematics/chain';
import type { AxisInfo, ForwardResult, ReachProfile } from '@shared/kinematics/types';

export const ArmModelParams = chainParamsSchema;
export type ArmModelParams = ChainParams;
export const ArmModelInput = z.object({
  name: z.string({ error: 'Give the model a name' }).trim().min(1, 'Give the model a name').max(120, 'Use at most 120 characters'),
  params: ArmModelParams,
});
export type ArmModelInput = z.infer<typeof ArmModelInput>;

/** Families the editor offers, with their labels. */
export const FAMILY_LABELS: Record<string, string> = {
  chain: 'DH chain',
};

/** Forward kinematics from controller values (deg / mm), arm frame, mm. */
export function forwardOf(params: ArmModelParams, joints: readonly number[]): ForwardResult {
  return chainForward(params, joints);
}

/** The side reach profile of the tool point, arm-frame (r, z) mm. */
export function profileOf(params: ArmModelParams): ReachProfile {
  return chainSampledProfile(params);
}

/** Axes in controller units (deg / mm) for the pose panel. */
export function axesOf(params: ArmModelParams): AxisInfo[] {
  return chainAxes(params);
}
