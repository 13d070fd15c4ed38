import { can } from '@shared/policy';
import type { SessionUser } from '../auth/passport';
import { notFound } from '../http/errors';
import { Project, ProjectMember } from '../models';

/** True when the user may see the project: staff roles see all, clients only member projects. */
export async function canSeeProject(user: SessionUser, projectId: number): Promise<boolean> {
  if (can(user.role, 'project.readAll')) return true;
  return (await ProjectMember.count({ where: { projectId, userId: user.id } })) > 0;
}

/** Loads a project the user may see, or throws 404 (a client never learns other projects exist). */
export async function loadVisibleProject(user: SessionUser, projectId: number): Promise<Project> {
  const project = await Project.findByPk(projectId);
  if (!project || !(await canSeeProject(user, projectId))) throw notFound('Project');
  return project;
}
