import { Router } from 'express';
import { literal, Op, type Sequelize } from 'sequelize';
import { can } from '@shared/policy';
import { MemberInput, ProjectInput, ProjectUpdateInput, type MemberDto } from '@shared/schemas/project';
import { allow, currentUser } from '../auth/guards';
import { badRequest, conflict, notFound } from '../http/errors';
import { idParam, parseOr400 } from '../http/validate';
import { Project, ProjectMember, User, presentProject } from '../models';
import { deleteReturnedRevisions, refuseDeletingRecords } from '../services/archive';
import { audit } from '../services/audit/audit';
import { loadVisibleProject } from '../services/projectAccess';

async function membersOf(projectId: number): Promise<MemberDto[]> {
  const rows = await ProjectMember.findAll({ where: { projectId }, order: [['createdAt', 'ASC']] });
  const users = await User.findAll({ where: { id: rows.map((r) => r.userId) } });
  const byId = new Map(users.map((u) => [u.id, u]));
  return rows.flatMap((r) => {
    const u = byId.get(r.userId);
    return u ? [{ userId: u.id, email: u.email, name: u.name, role: u.role, addedAt: r.createdAt.toISOString() }] : [];
  });
}

async function detail(project: Project) {
  await project.reload({ include: [{ model: User, as: 'creator' }] });
  const members = await membersOf(project.id);
  return { ...presentProject(project, members.length), members };
}

/** Projects and their members. Clients see member projects only; reviewers read all. */
export function projectsRouter(sequelize: Sequelize): Router {
  const r = Router();

  r.get('/projects', allow('project.read'), async (req, res) => {
    const user = currentUser(req);
    // Archived projects only with ?archived=1 (then beside the active ones).
    const active = req.query.archived === '1' ? {} : { archivedAt: null };
    // Clients see their member projects only. One statement: the projects, their creators and
    // member counts (subqueries on project_members).
    const visible = can(user.role, 'project.readAll')
      ? {}
      : { id: { [Op.in]: literal(`(SELECT "projectId" FROM project_members WHERE "userId" = ${sequelize.escape(user.id)})`) } };
    const projects = await Project.findAll({
      where: { ...visible, ...active },
      attributes: { include: [[literal('(SELECT COUNT(*) FROM project_members AS pm WHERE pm."projectId" = "Project"."id")'), 'memberCount']] },
      include: [{ model: User, as: 'creator' }],
      order: [['updatedAt', 'DESC']],
    });
    res.json({ projects: projects.map((p) => presentProject(p, Number(p.get('memberCount')))) });
  });

  r.post('/projects', allow('project.write'), async (req, res) => {
    const user = currentUser(req);
    const input = parseOr400(ProjectInput, req.body, 'The project');
    const project = await sequelize.transaction(async (transaction) => {
      const p = await Project.create({ ...input, createdBy: user.id }, { transaction });
      await audit(user.id, 'project.create', 'project', p.id, { name: p.name }, transaction);
      return p;
    });
    res.status(201).json({ project: await detail(project) });
  });

  r.get('/projects/:id', allow('project.read'), async (req, res) => {
    const project = await loadVisibleProject(currentUser(req), idParam(req.params.id, 'Project'));
    res.json({ project: await detail(project) });
  });

  r.patch('/projects/:id', allow('project.write'), async (req, res) => {
    const user = currentUser(req);
    const project = await loadVisibleProject(user, idParam(req.params.id, 'Project'));
    const input = parseOr400(ProjectUpdateInput, req.body, 'The project');
    await sequelize.transaction(async (transaction) => {
      await project.update(input, { transaction });
      await audit(user.id, 'project.update', 'project', project.id, { fields: Object.keys(input) }, transaction);
    });
    res.json({ project: await detail(project) });
  });

  r.delete('/projects/:id', allow('project.write'), async (req, res) => {
    const user = currentUser(req);
    const project = await loadVisibleProject(user, idParam(req.params.id, 'Project'));
    await sequelize.transaction(async (transaction) => {
      await refuseDeletingRecords({ projectId: project.id }, 'project', transaction);
      await deleteReturnedRevisions({ projectId: project.id }, transaction);
      await audit(user.id, 'project.delete', 'project', project.id, { name: project.name }, transaction);
      await project.destroy({ transaction });
    });
    res.status(204).end();
  });

  r.get('/projects/:id/members', allow('project.read'), async (req, res) => {
    const project = await loadVisibleProject(currentUser(req), idParam(req.params.id, 'Project'));
    res.json({ members: await membersOf(project.id) });
  });

  r.post('/projects/:id/members', allow('project.members'), async (req, res) => {
    const user = currentUser(req);
    const project = await loadVisibleProject(user, idParam(req.params.id, 'Project'));
    const { userId } = parseOr400(MemberInput, req.body, 'The member');
    const member = await User.findByPk(userId);
    if (!member) throw badRequest('That user does not exist.', { userId: 'Choose an existing user' });
    if (await ProjectMember.findOne({ where: { projectId: project.id, userId } })) {
      throw conflict(`${member.name} is already a member of this project.`);
    }
    await sequelize.transaction(async (transaction) => {
      await ProjectMember.create({ projectId: project.id, userId }, { transaction });
      await audit(user.id, 'project.member.add', 'project', project.id, { userId }, transaction);
    });
    const dto = (await membersOf(project.id)).find((m) => m.userId === userId);
    res.status(201).json({ member: dto });
  });

  r.delete('/projects/:id/members/:userId', allow('project.members'), async (req, res) => {
    const user = currentUser(req);
    const project = await loadVisibleProject(user, idParam(req.params.id, 'Project'));
    const userId = idParam(req.params.userId, 'Member');
    const removed = await sequelize.transaction(async (transaction) => {
      const n = await ProjectMember.destroy({ where: { projectId: project.id, userId }, transaction });
      if (n) await audit(user.id, 'project.member.remove', 'project', project.id, { userId }, transaction);
      return n;
    });
    if (!removed) throw notFound('Member');
    res.status(204).end();
  });

  return r;
}
