import { armReachFromModels, placementSearch, prepareFloor, type FloorLayer } from '@shared/analysis';
import { placementQueryOf, presentPlacement } from '@shared/analysis';
import { readableMessage } from '@shared/schemas/errors';
import type { LayoutContent } from '@shared/schemas/layout';
import type { PlacementSearchDto, PlacementSearchInput } from '@shared/schemas/placement';
import { badRequest } from '../http/errors';
import { ArmModel, FloorPlan, type Layout } from '../models';

/** The placement search on a stored layout: its floor plan, boundaries, placed arms and the models' stored parameters. */
export async function searchPlacement(layout: Layout, input: PlacementSearchInput): Promise<PlacementSearchDto> {
  const content = layout.content as LayoutContent;
  const modelIds = [...new Set([input.armModelId, ...content.arms.map((a) => a.armModelId)])];
  const models = await ArmModel.findAll({ where: { id: modelIds }, attributes: ['id', 'params'] });
  const params = new Map(models.map((m) => [m.id, m.params]));
  if (!params.has(input.armModelId)) throw badRequest(`Unknown arm model ${input.armModelId}.`, { armModelId: 'Choose an arm model of the catalogue' });
  const fp = layout.floorPlanId ? await FloorPlan.findByPk(layout.floorPlanId, { attributes: ['id', 'geometry', 'layers'] }) : null;
  const floor = fp ? prepareFloor(fp.geometry, fp.layers as FloorLayer[]) : null;
  let query;
  try {
    query = placementQueryOf(input, content, floor, armReachFromModels(params));
  } catch (err) {
    const why = readableMessage(err, null);
    if (why === null) throw err;
    throw badRequest(`The placement search cannot run: ${why}.`);
  }
  return presentPlacement(placementSearch(query));
}
