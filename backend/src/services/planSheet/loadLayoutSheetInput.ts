import type { LayoutContent } from '@shared/schemas/layout';
import { ArmModel, FloorPlan, Project, User, type Layout } from '../../models';
import { analyzeLayout } from '../layoutAnalysis';
import type { PlanSheetFloorLayer, PlanSheetInput } from './types';

/**
 * Everything the plan sheet of a layout's working copy shows: project, floor plan, arm models, the
 * server's analysis of the stored content; no revision (the title block then says "working copy").
 */
export async function loadLayoutSheetInput(layout: Layout): Promise<PlanSheetInput> {
  const content = layout.content as LayoutContent;
  const [project, fp, analysis] = await Promise.all([
    Project.findByPk(layout.projectId),
    layout.floorPlanId ? FloorPlan.findByPk(layout.floorPlanId, { attributes: ['id', 'geometry', 'layers', 'bounds', 'origin'] }) : Promise.resolve(null),
    analyzeLayout(layout),
  ]);
  if (!project) throw new Error(`layout ${layout.id}: its project ${layout.projectId} does not exist`);
  const modelIds = [...new Set(content.arms.map((a) => a.armModelId))];
  const models = modelIds.length ? await ArmModel.findAll({ where: { id: modelIds }, attributes: ['id', 'name', 'family', 'params'], order: [['id', 'ASC']] }) : [];
  const author = layout.createdBy ? await User.findByPk(layout.createdBy, { attributes: ['id', 'name'] }) : null;
  return {
    project: { name: project.name, clientName: project.clientName, siteName: project.siteName },
    layout: { id: layout.id, name: layout.name, content },
    floorPlan: fp
      ? {
          geometry: fp.geometry,
          layers: (fp.layers as PlanSheetFloorLayer[]).map((l) => ({ name: l.name, role: l.role, height: l.height, color: l.color })),
          bounds: fp.bounds,
          origin: fp.origin,
        }
      : null,
    analysis,
    models: models.map((m) => ({ id: m.id, name: m.name, family: m.family, params: m.params })),
    revision: null,
    history: [],
    drawnBy: author?.name ?? '—',
    reviewedBy: null,
  };
}
