/**
 * Archiving: a released revision is a record the client holds, so a layout or project with
 * revisions that went out for review or release is never deleted (the database refuses too, by
 * RESTRICT foreign keys); it is archived instead — hidden from lists, read-only, restorable by an
 * admin. Revisions that were only returned for changes go with their layout as before.
 */
import { Op, QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { SessionUser } from '../auth/passport';
import { conflict } from '../http/errors';
import { Layout, Project, ReviewComment, Revision } from '../models';
import { audit } from './audit/audit';

/** Revision states that make a revision a record: in review, signed off, released. */
export const RECORD_STATES = ['submitted', 'signed_off', 'released'] as const;

type Scope = { layoutId: number } | { projectId: number };

/** 409 with a sentence when the layout or project holds revisions that are records. */
export async function refuseDeletingRecords(scope: Scope, what: 'layout' | 'project', transaction?: Transaction): Promise<void> {
  const n = await Revision.count({ where: { ...scope, state: RECORD_STATES as unknown as string[] }, transaction });
  if (n === 0) return;
  throw conflict(
    `This ${what} cannot be deleted: it has ${n} submitted or released revision${n === 1 ? '' : 's'}, which are records the client holds. Archive the ${what} instead; an admin can restore it.`,
  );
}

/** Deletes the revisions that are not records (returned for changes), so their layout or project can go. */
export async function deleteReturnedRevisions(scope: Scope, transaction: Transaction): Promise<void> {
  await Revision.destroy({ where: { ...scope, state: { [Op.notIn]: RECORD_STATES as unknown as string[] } }, transaction });
}

/** The sentence of a write refused because something is archived. */
export function archivedConflict(what: 'project' | 'layout') {
  return conflict(`This ${what} is archived and read-only. An admin can restore it to make changes.`);
}

/** Archives or restores a project or layout, audited; idempotent. */
export async function setArchived(sequelize: Sequelize, user: SessionUser, row: Project | Layout, archived: boolean): Promise<void> {
  if (Boolean(row.archivedAt) === archived) return;
  const entity = row instanceof Project ? 'project' : 'layout';
  await sequelize.transaction(async (transaction) => {
    const changes = archived ? { archivedAt: new Date(), archivedBy: user.id } : { archivedAt: null, archivedBy: null };
    // silent: archiving is not an edit, so the list order (updatedAt) stays as it was.
    await (row as Project).update(changes, { transaction, silent: true });
    await audit(user.id, `${entity}.${archived ? 'archive' : 'restore'}`, entity, row.id, { name: row.name }, transaction);
  });
}

/**
 * The archived project or layout a write to this API path would change, if any (paths relative to
 * /api). Archive and restore themselves, and the analysis of a layout (computes, stores nothing),
 * are not writes to it.
 */
export async function archivedTargetOf(path: string): Promise<'project' | 'layout' | null> {
  let m = /^\/projects\/(\d+)(\/[^/]+)?/.exec(path);
  if (m) {
    if (m[2] === '/archive' || m[2] === '/restore') return null;
    return (await projectArchived(Number(m[1]))) ? 'project' : null;
  }
  m = /^\/layouts\/(\d+)(\/[^/]+)?/.exec(path);
  if (m) {
    if (m[2] === '/archive' || m[2] === '/restore' || m[2] === '/analysis') return null;
    return layoutArchived(Number(m[1]));
  }
  m = /^\/floor-plans\/(\d+)/.exec(path);
  if (m) {
    const rows = await Project.sequelize!.query<{ a: boolean }>(`SELECT p."archivedAt" IS NOT NULL AS a FROM floor_plans f JOIN projects p ON p.id = f."projectId" WHERE f.id = :id`, {
      replacements: { id: Number(m[1]) },
      type: QueryTypes.SELECT,
    });
    return rows[0]?.a ? 'project' : null;
  }
  m = /^\/revisions\/(\d+)/.exec(path);
  if (m) {
    const rev = await Revision.findByPk(Number(m[1]), { attributes: ['layoutId'] });
    return rev ? layoutArchived(rev.layoutId) : null;
  }
  m = /^\/comments\/(\d+)/.exec(path);
  if (m) {
    const c = await ReviewComment.findByPk(Number(m[1]), { attributes: ['revisionId'] });
    const rev = c ? await Revision.findByPk(c.revisionId, { attributes: ['layoutId'] }) : null;
    return rev ? layoutArchived(rev.layoutId) : null;
  }
  return null;
}

async function projectArchived(id: number): Promise<boolean> {
  return Boolean((await Project.findByPk(id, { attributes: ['archivedAt'] }))?.archivedAt);
}

async function layoutArchived(id: number): Promise<'project' | 'layout' | null> {
  const l = await Layout.findByPk(id, { attributes: ['archivedAt', 'projectId'] });
  if (!l) return null;
  if (l.archivedAt) return 'layout';
  return (await projectArchived(l.projectId)) ? 'project' : null;
}
