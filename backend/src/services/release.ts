/**
 * Release of a signed-off revision: the plan sheet rendered from the frozen snapshot (no DRAFT mark,
 * dated with the release time, which is stored so the same bytes can be rendered again), kept with
 * the revision with its sha256, and mailed to the project's clients. A failed mail never undoes the
 * release: it is recorded in mail_deliveries and can be retried.
 */
import { createHash } from 'node:crypto';
import type { Sequelize, Transaction } from 'sequelize';
import type { SessionUser } from '../auth/passport';
import { conflict, notFound } from '../http/errors';
import { Acknowledgement, MailDelivery, ProjectMember, Revision, User } from '../models';
import { audit } from './audit/audit';
import { renderPlanSheetInPool } from './planSheet/renderInPool';
import type { PlanSheetInput, PlanSheetOptions } from './planSheet/types';
import { attemptDelivery, recordDelivery, releasedMail, type MailContext } from './reviewMail';
import { loadRevisionSheetInput } from './revisions';
import { REVISION_STATE_LABEL } from '@shared/words';

/** Paper size of released sheets. */
export const RELEASE_SHEET_SIZE = 'A3' as const;

function render(input: PlanSheetInput, opts: PlanSheetOptions): Promise<Buffer> {
  return renderPlanSheetInPool(input, opts);
}

/** sha256 of bytes, hex. */
export function sha256Hex(bytes: Buffer): string {
  return createHash('sha256').update(bytes).digest('hex');
}

async function clientEmails(projectId: number): Promise<string[]> {
  const members = await ProjectMember.findAll({ where: { projectId }, attributes: ['userId'] });
  if (!members.length) return [];
  const users = await User.findAll({ where: { id: members.map((m) => m.userId), role: 'client', active: true }, attributes: ['email'], order: [['id', 'ASC']] });
  return users.map((u) => u.email);
}

function facts(rev: Revision) {
  const snap = rev.snapshot;
  return { projectName: snap.project.name, projectId: rev.projectId, revisionId: rev.id, layoutName: snap.layout.name, letter: rev.letter };
}

/**
 * Renders the plan sheet of a signed-off revision and stores it with the revision (state released),
 * inside the caller's transaction; 409 unless signed off. No mail: releaseRevision sends it after commit.
 */
export async function storeRelease(user: SessionUser, id: number, now: Date, transaction: Transaction): Promise<Revision> {
  const r = await Revision.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
  if (!r) throw notFound('Revision');
  if (r.state !== 'signed_off') throw conflict(r.state === 'released' ? `Revision ${r.letter} is already released.` : `Only a signed-off revision can be released; revision ${r.letter} is ${REVISION_STATE_LABEL[r.state].toLowerCase()}.`);
  r.set({ state: 'released', releasedBy: user.id, releasedAt: now, sheetCreatedAt: now });
  const pdf = await render(await loadRevisionSheetInput(r, transaction), { size: RELEASE_SHEET_SIZE, draft: false, createdAt: now });
  r.set({ planSheet: pdf, planSheetChecksum: sha256Hex(pdf) });
  await r.save({ transaction });
  await audit(user.id, 'revision.release', 'revision', r.id, { letter: r.letter, planSheetChecksum: r.planSheetChecksum, bytes: pdf.length }, transaction, now);
  return r;
}

/** Renders, stores and mails the plan sheet of a signed-off revision (planner). 409 unless signed off. */
export async function releaseRevision(sequelize: Sequelize, user: SessionUser, id: number, mail: MailContext, now: Date) {
  const rev = await sequelize.transaction((transaction) => storeRelease(user, id, now, transaction));
  const out = releasedMail(mail, facts(rev), await clientEmails(rev.projectId), rev.planSheet!);
  const delivery = await attemptDelivery(mail, await recordDelivery('release', rev.id, out, now), out, now);
  return { revision: rev, delivery };
}

/** Sends the release mail again when it failed (to the project's clients as they are now). */
export async function retryReleaseMail(user: SessionUser, id: number, mail: MailContext, now: Date) {
  const rev = await Revision.findByPk(id);
  if (!rev) throw notFound('Revision');
  if (rev.state !== 'released' || !rev.planSheet) throw conflict(`Revision ${rev.letter} is not released yet.`);
  const last = await MailDelivery.findOne({ where: { revisionId: rev.id, kind: 'release' }, order: [['id', 'DESC']] });
  if (last && last.status === 'sent') throw conflict('The release mail was already delivered.');
  const out = releasedMail(mail, facts(rev), await clientEmails(rev.projectId), rev.planSheet);
  let delivery = last;
  if (delivery) await delivery.update({ to: out.to, subject: out.subject });
  else delivery = await recordDelivery('release', rev.id, out, now);
  await attemptDelivery(mail, delivery, out, now);
  await audit(user.id, 'revision.release_mail_retry', 'revision', rev.id, { status: delivery.status, attempts: delivery.attempts });
  return delivery;
}

/** The PDF to send for a revision: the stored sheet when released, a fresh DRAFT otherwise. */
export async function planSheetFor(rev: Revision, now: Date): Promise<{ pdf: Buffer; draft: boolean }> {
  if (rev.state === 'released') {
    const stored = await Revision.findByPk(rev.id, { attributes: ['id', 'planSheet'] });
    if (!stored?.planSheet) throw notFound('Plan sheet');
    return { pdf: stored.planSheet, draft: false };
  }
  const pdf = await render(await loadRevisionSheetInput(rev), { size: RELEASE_SHEET_SIZE, draft: true, createdAt: now });
  return { pdf, draft: true };
}

/** Re-renders a released revision with its stored release date (for an integrity check). */
export async function rerenderReleased(rev: Revision): Promise<Buffer> {
  if (rev.state !== 'released' || !rev.sheetCreatedAt) throw conflict(`Revision ${rev.letter} is not released.`);
  return render(await loadRevisionSheetInput(rev), { size: RELEASE_SHEET_SIZE, draft: false, createdAt: rev.sheetCreatedAt });
}

/** Records that a client received a released revision (once per person; a second call keeps the first time). */
export async function acknowledgeRevision(user: SessionUser, rev: Revision, now: Date) {
  if (rev.state !== 'released') throw notFound('Revision');
  const [ack, created] = await Acknowledgement.findOrCreate({ where: { revisionId: rev.id, userId: user.id }, defaults: { revisionId: rev.id, userId: user.id, at: now } });
  if (created) await audit(user.id, 'revision.acknowledge', 'revision', rev.id, { letter: rev.letter });
  return ack;
}
