import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { allow, currentUser } from '../auth/guards';
import { notFound } from '../http/errors';
import { idParam } from '../http/validate';
import { Layout, Project, ProjectMember, User, presentProject } from '../models';
import { archivedConflict, archivedTargetOf, setArchived } from '../services/archive';
import { loadVisibleProject } from '../services/projectAccess';
import { loadVisibleLayout, presentLayout } from '../services/layouts';

const WRITES = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

/**
 * Archive and restore of projects and layouts, and the rule that archived ones are read-only:
 * every staff write under an archived project or layout gets 409 with a sentence. Clients are
 * left to the routes (their only write, acknowledging a released sheet, stays possible).
 */
export function archiveRouter(sequelize: Sequelize): Router {
  const r = Router();

  r.use(async (req, _res, next) => {
    if (!WRITES.has(req.method) || !req.user || req.user.role === 'client') return next();
    const target = await archivedTargetOf(req.path);
    next(target ? archivedConflict(target) : undefined);
  });

  const projectBody = async (id: number) => {
    const project = await Project.findByPk(id, { include: [{ model: User, as: 'creator' }] });
    if (!project) throw notFound('Project');
    return { project: presentProject(project, await ProjectMember.count({ where: { projectId: id } })) };
  };

  for (const [verb, action, archived] of [['archive', 'project.archive', true], ['restore', 'project.restore', false]] as const) {
    r.post(`/projects/:id/${verb}`, allow(action), async (req, res) => {
      const user = currentUser(req);
      const project = await loadVisibleProject(user, idParam(req.params.id, 'Project'));
      await setArchived(sequelize, user, project, archived);
      res.json(await projectBody(project.id));
    });
  }

  for (const [verb, action, archived] of [['archive', 'layout.archive', true], ['restore', 'layout.restore', false]] as const) {
    r.post(`/layouts/:id/${verb}`, allow(action), async (req, res) => {
      const user = currentUser(req);
      const layout = await loadVisibleLayout(user, idParam(req.params.id, 'Layout'));
      await setArchived(sequelize, user, layout, archived);
      res.json({ layout: presentLayout((await Layout.findByPk(layout.id))!) });
    });
  }

  return r;
}
