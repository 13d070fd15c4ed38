/** The review workflow of revisions: who may see one, submit (freeze the layout), decide. Each step mails the people next in line. */
import type { Sequelize, Transaction } from 'sequelize';
import { can } from '@shared/policy';
import type { SessionUser } from '../../auth/passport';
import { badRequest, conflict, forbidden, notFound } from '../../http/errors';
import { Layout, Revision, User } from '../../models';
import type { RevisionState } from '../../models/Revision';
import { audit } from '../audit/audit';
import { canSeeProject } from '../projectAccess';
import { decidedMail, deliver, submittedMail, type MailContext, type RevisionMailFacts } from '../reviewMail';
import { buildSnapshot, snapshotChecksum, splitSnapshot, storeSnapshotFloorPlan } from './snapshot';
import { REVISION_STATE_LABEL } from '@shared/words';

/** The n-th revision letter, 0-based: A … Z, AA … AZ, BA … (bijective base 26). */
export function revisionLetter(index: number): string {
  if (!Number.isInteger(index) || index < 0) throw new Error('revisionLetter: index must be a non-negative integer');
  let n = index + 1;
  let s = '';
  while (n > 0) {
    const r = (n - 1) % 26;
    s = String.fromCharCode(65 + r) + s;
    n = Math.floor((n - 1) / 26);
  }
  return s;
}

/** Loads a revision the user may see, or 404: clients only released revisions of member projects. */
export async function loadVisibleRevision(user: SessionUser, id: number): Promise<Revision> {
  const rev = await Revision.findByPk(id, { attributes: { exclude: ['planSheet'] } });
  if (!rev || !(await canSeeProject(user, rev.projectId))) throw notFound('Revision');
  if (!can(user.role, 'revision.readDrafts') && rev.state !== 'released') throw notFound('Revision');
  return rev;
}

function mailFacts(rev: Revision): RevisionMailFacts {
  const snap = rev.snapshot;
  return { projectName: snap.project.name, projectId: rev.projectId, revisionId: rev.id, layoutName: snap.layout.name, letter: rev.letter };
}

/**
 * Freezes the layout into the next revision (state submitted) inside the caller's transaction; 409
 * while another one is open. No mail: submitRevision sends it once the transaction is committed.
 */
export async function freezeRevision(user: SessionUser, layoutId: number, now: Date, transaction: Transaction): Promise<Revision> {
  const layout = await Layout.findByPk(layoutId, { transaction, lock: transaction.LOCK.UPDATE });
  if (!layout) throw notFound('Layout');
  const open = await Revision.findOne({ where: { layoutId, state: 'submitted' }, attributes: ['id', 'letter'], transaction });
  if (open) throw conflict(`Revision ${open.letter} of this cell layout is still waiting for review; a new one can be submitted once it is decided.`, { openRevisionId: open.id });
  const count = await Revision.count({ where: { layoutId }, transaction });
  const snapshot = await buildSnapshot(layout, transaction);
  // The floor plan is stored once per content and shared; the checksum covers the whole snapshot.
  const { stored, floorPlan, floorPlanChecksum } = splitSnapshot(snapshot);
  if (floorPlan && floorPlanChecksum) await storeSnapshotFloorPlan(floorPlan, floorPlanChecksum, transaction);
  const r = await Revision.create(
    {
      layoutId,
      projectId: layout.projectId,
      letter: revisionLetter(count),
      snapshot: stored,
      floorPlanChecksum,
      checksum: snapshotChecksum(snapshot),
      state: 'submitted',
      submittedBy: user.id,
      submittedAt: now,
    },
    { transaction },
  );
  await audit(user.id, 'revision.submit', 'revision', r.id, { layoutId, letter: r.letter, checksum: r.checksum, layoutVersion: layout.version }, transaction, now);
  return r;
}

/** Freezes the layout into the next revision (state submitted); 409 while another one is open. Mails the reviewers. */
export async function submitRevision(sequelize: Sequelize, user: SessionUser, layoutId: number, mail: MailContext, now: Date): Promise<Revision> {
  const rev = await sequelize.transaction((transaction) => freezeRevision(user, layoutId, now, transaction));
  const reviewers = await User.findAll({ where: { role: 'reviewer', active: true }, attributes: ['email'], order: [['id', 'ASC']] });
  await deliver(mail, 'submitted', rev.id, submittedMail(mail, mailFacts(rev), reviewers.map((u) => u.email), user.name), now);
  return rev;
}

/** What a reviewer decides about a submitted revision. */
export interface RevisionDecision {
  decision: 'sign_off' | 'return';
  comment: string;
}

/**
 * Records a reviewer's decision on a submitted revision inside the caller's transaction (never on
 * one they submitted; returning it for changes needs a comment). No mail: decideRevision sends it after commit.
 */
export async function recordDecision(user: SessionUser, id: number, input: RevisionDecision, now: Date, transaction: Transaction): Promise<Revision> {
  if (input.decision === 'return' && !input.comment.trim()) throw badRequest('Say what needs to change.', { comment: 'A comment is required to return it for changes' });
  const r = await Revision.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE, attributes: { exclude: ['planSheet'] } });
  if (!r) throw notFound('Revision');
  if (r.submittedBy === user.id) throw forbidden('You submitted this revision; another reviewer must decide it.');
  if (r.state !== 'submitted') throw conflict(`Revision ${r.letter} was already decided (${REVISION_STATE_LABEL[r.state].toLowerCase()}).`);
  const state: RevisionState = input.decision === 'sign_off' ? 'signed_off' : 'returned';
  await r.update({ state, decidedBy: user.id, decidedAt: now, decisionComment: input.comment.trim() || null }, { transaction });
  await audit(user.id, `revision.${input.decision === 'sign_off' ? 'sign_off' : 'return'}`, 'revision', r.id, { letter: r.letter, comment: input.comment.trim() }, transaction, now);
  return r;
}

/** Signs off or returns for changes a submitted revision (reviewer; never one they submitted). Mails the submitter. */
export async function decideRevision(sequelize: Sequelize, user: SessionUser, id: number, input: RevisionDecision, mail: MailContext, now: Date): Promise<Revision> {
  const rev = await sequelize.transaction((transaction) => recordDecision(user, id, input, now, transaction));
  const submitter = rev.submittedBy ? await User.findByPk(rev.submittedBy, { attributes: ['email'] }) : null;
  await deliver(mail, 'decided', rev.id, decidedMail(mail, mailFacts(rev), submitter ? [submitter.email] : [], user.name, input.decision, input.comment.trim()), now);
  return rev;
}
