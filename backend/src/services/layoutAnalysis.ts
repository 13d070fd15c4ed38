import { createAnalyzer, prepareFloor, type AnalysisResult, type FloorLayer } from '@shared/analysis';
import { armReachFor } from '@shared/analysis/armReach';
import type { LayoutContent } from '@shared/schemas/layout';
import { ArmModel, FloorPlan, type Layout } from '../models';

/**
 * Runs the shared analysis on a layout as stored: its floor plan (layer roles and heights), the arm
 * models it places, its work points, zones and work heights.
 */
export async function analyzeLayout(layout: Layout, contentOverride?: LayoutContent): Promise<AnalysisResult> {
  const content = contentOverride ?? (layout.content as LayoutContent);
  const modelIds = [...new Set(content.arms.map((a) => a.armModelId))];
  const models = await ArmModel.findAll({ where: { id: modelIds }, attributes: ['id', 'params'] });
  const params = new Map(models.map((m) => [m.id, m.params]));
  const fp = layout.floorPlanId ? await FloorPlan.findByPk(layout.floorPlanId, { attributes: ['id', 'geometry', 'layers'] }) : null;
  const floor = fp ? prepareFloor(fp.geometry, fp.layers as FloorLayer[]) : null;
  const analyzer = createAnalyzer((modelId, restrict) => {
    const p = params.get(modelId);
    if (!p) throw new Error(`arm model ${modelId} does not exist`);
    return armReachFor(p, restrict);
  });
  return analyzer.analyze({ arms: content.arms, workPoints: content.workPoints, zones: content.zones, workHeights: content.workHeights, floor });
}
