import { prepareFloor, type FloorLayer } from '@shared/analysis';
import { armReachFromModels } from '@shared/analysis';
import { FenceProposalError, proposeFence, type FenceProposal } from '@shared/analysis';
import type { FenceSystem } from '@shared/schemas/fenceProposal';
import type { LayoutContent } from '@shared/schemas/layout';
import { badRequest } from '../http/errors';
import { ArmModel, FloorPlan, type Layout } from '../models';

/**
 * Proposes guard rings for a layout as stored (or the unsaved content sent with the request): its
 * floor plan, the stored parameters of its arm models and the fence system chosen.
 */
export async function proposeLayoutFence(layout: Layout, system: FenceSystem, contentOverride?: LayoutContent): Promise<FenceProposal> {
  const content = contentOverride ?? (layout.content as LayoutContent);
  if (!content.arms.length) throw badRequest('The cell layout has no arms: place at least one arm before proposing a guard ring.');
  const modelIds = [...new Set(content.arms.map((a) => a.armModelId))];
  const models = await ArmModel.findAll({ where: { id: modelIds }, attributes: ['id', 'params'] });
  const params = new Map(models.map((m) => [m.id, m.params as Record<string, unknown>]));
  const fp = layout.floorPlanId ? await FloorPlan.findByPk(layout.floorPlanId, { attributes: ['id', 'geometry', 'layers'] }) : null;
  const floor = fp ? prepareFloor(fp.geometry, fp.layers as FloorLayer[]) : null;
  try {
    return proposeFence({
      arms: content.arms,
      boundaries: content.boundaries,
      floor,
      system,
      reachFor: armReachFromModels(params),
      stopTimeS: (modelId) => {
        const s = params.get(modelId)?.stopTimeS;
        return typeof s === 'number' ? s : undefined;
      },
    });
  } catch (err) {
    if (err instanceof FenceProposalError) throw badRequest(err.message, err.field ? { [err.field]: err.message } : undefined);
    throw err;
  }
}
