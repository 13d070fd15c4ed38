import type { InferAttributes, Transaction } from 'sequelize';
import type { LayoutContent, LayoutDto, LayoutUpdateInput } from '@shared/schemas/layout';
import type { SessionUser } from '../auth/passport';
import { badRequest, conflict, notFound } from '../http/errors';
import { ArmModel, FloorPlan, Layout } from '../models';
import { audit } from './audit/audit';
import { layoutChanges } from './audit/layoutChanges';
import { canSeeProject } from './projectAccess';

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
  // The layout's project exists (foreign key), so only whether the user may see it is asked:
  // no statement at all for staff, one membership count for a client.
  if (!layout || !(await canSeeProject(user, layout.projectId))) throw notFound('Layout');
  return layout;
}

/** Checks references the schema cannot: arm models exist, the floor plan is in the same project. */
export async function checkLayoutReferences(projectId: number, floorPlanId: number | null | undefined, content: LayoutContent | undefined, transaction?: Transaction) {
  if (floorPlanId != null) {
    const fp = await FloorPlan.findByPk(floorPlanId, { attributes: ['id', 'projectId'], transaction });
    if (!fp || fp.projectId !== projectId) throw badRequest('The floor plan is not one of this project.', { floorPlanId: 'Choose a floor plan of this project' });
  }
  if (content) {
    const ids = [...new Set(content.arms.map((a) => a.armModelId))];
    const found = new Set((await ArmModel.findAll({ where: { id: ids }, attributes: ['id'], transaction })).map((m) => m.id));
    const fields: Record<string, string> = {};
    content.arms.forEach((a, i) => {
      if (!found.has(a.armModelId)) fields[`content.arms.${i}.armModelId`] = `Unknown arm model ${a.armModelId}`;
    });
    if (Object.keys(fields).length) throw badRequest(`The cell layout names an arm model that does not exist (${Object.values(fields)[0]}).`, fields);
  }
}

/**
 * Saves an edit of a layout's working copy inside the caller's transaction: 409 when `input.version`
 * is not the stored one, else the next version, changed at `now`, audited.
 */
export async function updateLayout(user: SessionUser, id: number, input: LayoutUpdateInput, transaction: Transaction, now = new Date()): Promise<Layout> {
  // Lock the row so two saves cannot both pass the version check.
  const layout = await Layout.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
  if (!layout) throw notFound('Layout');
  if (layout.version !== input.version) {
    throw conflict(`This cell layout was changed elsewhere (now version ${layout.version}, you edited ${input.version}). Reload it or keep your copy.`, {
      currentVersion: layout.version,
    });
  }
  await checkLayoutReferences(layout.projectId, input.floorPlanId, input.content, transaction);
  const changes: Partial<InferAttributes<Layout>> = { version: layout.version + 1, updatedAt: now };
  if (input.name !== undefined) changes.name = input.name;
  if (input.floorPlanId !== undefined) changes.floorPlanId = input.floorPlanId;
  if (input.content !== undefined) changes.content = input.content;
  // silent: updatedAt is the one set here (the caller's clock), not the database's.
  const [, [saved]] = await Layout.update(changes, { where: { id }, transaction, silent: true, returning: true });
  const { changes: edits, more } = layoutChanges(
    { name: layout.name, floorPlanId: layout.floorPlanId, content: layout.content },
    { name: saved.name, floorPlanId: saved.floorPlanId, content: saved.content },
  );
  await audit(user.id, 'layout.update', 'layout', layout.id, { version: saved.version, changes: edits, ...(more ? { more } : {}) }, transaction, now);
  return saved;
}
