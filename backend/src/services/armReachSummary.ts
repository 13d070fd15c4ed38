import { feasibleArmParamsSchema, reachProfileOf } from '@shared/kinematics';
import type { ArmParams } from '@shared/schemas/armModel';

/**
 * What the catalogue shows of an arm model's reach, stored with the model when it is saved so a
 * list never recomputes profiles: largest and smallest horizontal reach from the J1 axis and the
 * lowest and highest tool-point height (arm frame, mm), and how the profile was made.
 */
export interface ArmReachSummary {
  maxReach: number;
  minReach: number;
  zMin: number;
  zMax: number;
  method: 'exact' | 'sampled';
  toleranceMm: number;
}

/** The reach summary of a checked parameter set (side reach profile of the shared kinematics). */
export function reachSummaryOf(params: ArmParams): ArmReachSummary {
  const p = reachProfileOf(params);
  return { maxReach: p.maxReach, minReach: p.minReach, zMin: p.zMin, zMax: p.zMax, method: p.method, toleranceMm: p.toleranceMm };
}

/** The summary of stored parameters, or null when they no longer pass the checks. */
export function reachSummaryOfStored(params: unknown): ArmReachSummary | null {
  const parsed = feasibleArmParamsSchema.safeParse(params);
  return parsed.success ? reachSummaryOf(parsed.data) : null;
}
