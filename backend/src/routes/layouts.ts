import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { LayoutContent, LayoutCreateInput, LayoutUpdateInput } from '@shared/schemas/layout';
import { allow, currentUser } from '../auth/guards';
import { badRequest, conflict, notFound } from '../http/errors';
import { idParam, parseOr400 } from '../http/validate';
import { ArmModel, FloorPlan, Layout } from '../models';
import { deleteReturnedRevisions, refuseDeletingRecords } from '../services/archive';
import { audit } from '../services/audit/audit';
import { analyzeLayout } from '../services/layoutAnalysis';
import { loadVisibleLayout, presentLayout } from '../services/layouts';
import { loadVisibleProject } from '../services/projectAccess';

/** Checks references the schema cannot: arm models exist, the floor plan is in the same project. */
async function checkReferences(projectId: number, floorPlanId: number | null | undefined, content: LayoutContent | undefined) {
  if (floorPlanId != null) {
    const fp = await FloorPlan.findByPk(floorPlanId, { attributes: ['id', 'projectId'] });
    if (!fp || fp.projectId !== projectId) throw badRequest('The floor plan is not one of this project.', { floorPlanId: 'Choose a floor plan of this project' });
  }
  if (content) {
    const ids = [...new Set(content.arms.map((a) => a.armModelId))];
    const found = new Set((await ArmModel.findAll({ where: { id: ids }, attributes: ['id'] })).map((m) => m.id));
    const fields: Record<string, string> = {};
    content.arms.forEach((a, i) => {
      if (!found.has(a.armModelId)) fields[`content.arms.${i}.armModelId`] = `Unknown arm model ${a.armModelId}`;
    });
    if (Object.keys(fields).length) throw badRequest(`The cell layout names an arm model that does not exist (${Object.values(fields)[0]}).`, fields);
  }
}

/** Layouts (working copies) of a project; PUT carries `version` (optimistic lock, 409 when stale). */
export function layoutsRouter(sequelize: Sequelize): Router {
  const r = Router();

  r.get('/projects/:id/layouts', allow('layout.read'), async (req, res) => {
    const project = await loadVisibleProject(currentUser(req), idParam(req.params.id, 'Project'));
    const active = req.query.archived === '1' ? {} : { archivedAt: null };
    const layouts = await Layout.findAll({ where: { projectId: project.id, ...active }, order: [['updatedAt', 'DESC']] });
    res.json({
      layouts: layouts.map((l) => {
        const c = l.content as LayoutContent;
        return { ...presentLayout(l), content: undefined, counts: { arms: c.arms?.length ?? 0, workPoints: c.workPoints?.length ?? 0, boundaries: c.boundaries?.length ?? 0 } };
      }),
    });
  });

  r.post('/projects/:id/layouts', allow('layout.write'), async (req, res) => {
    const user = currentUser(req);
    const project = await loadVisibleProject(user, idParam(req.params.id, 'Project'));
    const input = parseOr400(LayoutCreateInput, req.body, 'The cell layout');
    await checkReferences(project.id, input.floorPlanId, input.content);
    const layout = await sequelize.transaction(async (transaction) => {
      const l = await Layout.create({ projectId: project.id, floorPlanId: input.floorPlanId, name: input.name, content: input.content, createdBy: user.id }, { transaction });
      await audit(user.id, 'layout.create', 'layout', l.id, { projectId: project.id, name: l.name }, transaction);
      return l;
    });
    res.status(201).json({ layout: presentLayout(layout) });
  });

  r.get('/layouts/:id', allow('layout.read'), async (req, res) => {
    const layout = await loadVisibleLayout(currentUser(req), idParam(req.params.id, 'Layout'));
    res.json({ layout: presentLayout(layout) });
  });

  r.put('/layouts/:id', allow('layout.write'), async (req, res) => {
    const user = currentUser(req);
    const id = idParam(req.params.id, 'Layout');
    await loadVisibleLayout(user, id);
    const input = parseOr400(LayoutUpdateInput, req.body, 'The cell layout');
    const updated = await sequelize.transaction(async (transaction) => {
      // Lock the row so two saves cannot both pass the version check.
      const layout = await Layout.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
      if (!layout) throw notFound('Layout');
      if (layout.version !== input.version) {
        throw conflict(`This cell layout was changed elsewhere (now version ${layout.version}, you edited ${input.version}). Reload it or keep your copy.`, {
          currentVersion: layout.version,
        });
      }
      await checkReferences(layout.projectId, input.floorPlanId, input.content);
      const changes: Partial<Layout> = { version: layout.version + 1 };
      if (input.name !== undefined) changes.name = input.name;
      if (input.floorPlanId !== undefined) changes.floorPlanId = input.floorPlanId;
      if (input.content !== undefined) changes.content = input.content;
      await layout.update(changes, { transaction });
      await audit(user.id, 'layout.update', 'layout', layout.id, { version: layout.version }, transaction);
      return layout;
    });
    res.json({ layout: presentLayout(updated) });
  });

  // Analysis of the stored layout, or of unsaved content sent in the body (the editor's working state).
  r.post('/layouts/:id/analysis', allow('layout.read'), async (req, res) => {
    const layout = await loadVisibleLayout(currentUser(req), idParam(req.params.id, 'Layout'));
    const body = (req.body ?? {}) as { content?: unknown };
    const content = body.content === undefined ? undefined : parseOr400(LayoutContent, body.content, 'The cell layout content');
    if (content) await checkReferences(layout.projectId, undefined, content);
    const result = await analyzeLayout(layout, content);
    res.json(result);
  });

  r.delete('/layouts/:id', allow('layout.write'), async (req, res) => {
    const user = currentUser(req);
    const layout = await loadVisibleLayout(user, idParam(req.params.id, 'Layout'));
    await sequelize.transaction(async (transaction) => {
      await refuseDeletingRecords({ layoutId: layout.id }, 'layout', transaction);
      await deleteReturnedRevisions({ layoutId: layout.id }, transaction);
      await audit(user.id, 'layout.delete', 'layout', layout.id, { name: layout.name }, transaction);
      await layout.destroy({ transaction });
    });
    res.status(204).end();
  });

  return r;
}
