import type { LayoutContent, LayoutDto } from '@shared/schemas/layout';
import type { SessionUser } from '../auth/passport';
import { notFound } from '../http/errors';
import { Layout } from '../models';
import { loadVisibleProject } from './projectAccess';

/** A layout as the API presents it (whitelisted fields). */
export function presentLayout(l: Layout): LayoutDto {
  return {
    id: l.id,
    projectId: l.projectId,
    floorPlanId: l.floorPlanId,
    name: l.name,
    content: l.content as LayoutContent,
    version: l.version,
    createdAt: l.createdAt.toISOString(),
    updatedAt: l.updatedAt.toISOString(),
    archivedAt: l.archivedAt ? l.archivedAt.toISOString() : null,
  };
}

/** Loads a layout whose project the user may see, or 404. */
export async function loadVisibleLayout(user: SessionUser, id: number): Promise<Layout> {
  const layout = await Layout.findByPk(id);
  if (!layout) throw notFound('Layout');
  await loadVisibleProject(user, layout.projectId).catch(() => {
    throw notFound('Layout');
  });
  return layout;
}
