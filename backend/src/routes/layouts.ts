import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { LayoutContent, LayoutCreateInput, LayoutUpdateInput } from '@shared/schemas/layout';
import { allow, currentUser } from '../auth/guards';
import { badRequest } from '../http/errors';
import { idParam, parseOr400 } from '../http/validate';
import { Layout } from '../models';
import { deleteReturnedRevisions, refuseDeletingRecords } from '../services/archive';
import { audit } from '../services/audit/audit';
import { analyzeLayout, analyzeLayoutView } from '../services/layoutAnalysis';
import { checkLayoutReferences, loadVisibleLayout, presentLayout, updateLayout } from '../services/layouts';
import { loadVisibleProject } from '../services/projectAccess';

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
    await checkLayoutReferences(project.id, input.floorPlanId, input.content);
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
    const updated = await sequelize.transaction((transaction) => updateLayout(user, id, input, transaction));
    res.json({ layout: presentLayout(updated) });
  });

  // The stored layout's analysis with each arm's maximum space: what the editor shows on opening
  // while its own worker starts. `version` names the stored version analysed.
  r.get('/layouts/:id/analysis', allow('layout.read'), async (req, res) => {
    const layout = await loadVisibleLayout(currentUser(req), idParam(req.params.id, 'Layout'));
    // ?maxChecks=N: answer 413 at once when the layout needs more reach checks (the editor asks
    // for a first view only of layouts its worker would not answer as quickly itself).
    const cap = req.query.maxChecks === undefined ? undefined : Number(req.query.maxChecks);
    if (cap !== undefined && !(Number.isInteger(cap) && cap >= 0)) throw badRequest('maxChecks must be a whole number of reach checks, 0 or more.', { maxChecks: 'a whole number, 0 or more' });
    const view = await analyzeLayoutView(layout, cap);
    res.json({ version: layout.version, ...view });
  });

  // Analysis of the stored layout, or of unsaved content sent in the body (the editor's working state).
  r.post('/layouts/:id/analysis', allow('layout.read'), async (req, res) => {
    const layout = await loadVisibleLayout(currentUser(req), idParam(req.params.id, 'Layout'));
    const body = (req.body ?? {}) as { content?: unknown };
    const content = body.content === undefined ? undefined : parseOr400(LayoutContent, body.content, 'The cell layout content');
    if (content) await checkLayoutReferences(layout.projectId, undefined, content);
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
