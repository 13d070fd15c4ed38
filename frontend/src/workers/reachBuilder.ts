/**
 * The analysis worker's reach builder: catalogue parameters (as the API sends them) parsed with the
 * arm model schema, then the kinematics' reach regions for the analysis (arm frame, mm).
 */
import type { ArmReach } from '@shared/analysis/types';
import { armReach } from '@shared/kinematics/pointReach';
import { armParamsSchema } from '@shared/schemas/armModel';
import type { ArmPlacement } from '@shared/schemas/layout';

/** ArmReach of a catalogue model under restricting J1 limits (controller degrees); throws naming the bad parameter. */
export function reachOfParams(params: unknown, restrict: ArmPlacement['restrict']): ArmReach {
  const parsed = armParamsSchema.safeParse(params);
  if (!parsed.success) {
    const first = parsed.error.issues[0];
    throw new Error(`params.${first?.path.join('.') || 'family'}: ${first?.message ?? 'invalid'}`);
  }
  return armReach(parsed.data, restrict ?? null);
}
