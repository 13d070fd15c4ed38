/**
 * Invitations: an admin invites a person by e-mail with a role (and, for a client, a project). The
 * mail carries a one-time link with a random 32-byte token; only its sha256 is stored. The link
 * expires after 72 hours and works once.
 */
import { createHash, randomBytes } from 'node:crypto';
import type { Sequelize } from 'sequelize';
import type { Role } from '@shared/schemas/user';
import { hashPassword, type SessionUser } from '../auth/passport';
import { badRequest, conflict, HttpError, notFound } from '../http/errors';
import { Invitation, Project, ProjectMember, User } from '../models';
import { audit } from './audit/audit';
import { deliver, invitationMail, type MailContext } from './reviewMail';

export const INVITATION_TTL_MS = 72 * 60 * 60 * 1000;

/** sha256 (hex) of a token as sent in the link. */
export function tokenHash(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

const ROLE_WORD: Record<Role, string> = { admin: 'an administrator', planner: 'a planner', reviewer: 'a reviewer', client: 'a client' };

/** Creates an invitation and mails its link; 409 when an account with that e-mail exists. */
export async function createInvitation(
  sequelize: Sequelize,
  admin: SessionUser,
  input: { email: string; role: Role; projectId?: number | null },
  mail: MailContext,
  now: Date,
) {
  if (input.role === 'client' && !input.projectId) throw badRequest('Choose the project the client is invited to.', { projectId: 'Choose a project' });
  if (input.projectId && !(await Project.findByPk(input.projectId, { attributes: ['id'] }))) throw badRequest('That project does not exist.', { projectId: 'Choose a project' });
  if (await User.findOne({ where: { email: input.email }, attributes: ['id'] })) throw conflict(`An account for ${input.email} already exists.`);
  const token = randomBytes(32).toString('base64url');
  const expiresAt = new Date(now.getTime() + INVITATION_TTL_MS);
  const inv = await sequelize.transaction(async (transaction) => {
    const row = await Invitation.create(
      { email: input.email, role: input.role, projectId: input.projectId ?? null, tokenHash: tokenHash(token), expiresAt, invitedBy: admin.id, createdAt: now },
      { transaction },
    );
    await audit(admin.id, 'invitation.create', 'invitation', row.id, { email: row.email, role: row.role, projectId: row.projectId }, transaction);
    return row;
  });
  const delivery = await deliver(mail, 'invitation', null, invitationMail(mail, inv.email, ROLE_WORD[inv.role], token, expiresAt, admin.name), now);
  return { invitation: inv, delivery };
}

export type InvitationProblem = 'unknown' | 'used' | 'expired' | 'revoked';

/** The invitation a token names and whether it can still be used. */
export async function findByToken(token: string, now: Date): Promise<{ invitation: Invitation | null; problem: InvitationProblem | null }> {
  if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) return { invitation: null, problem: 'unknown' };
  const inv = await Invitation.findOne({ where: { tokenHash: tokenHash(token) } });
  if (!inv) return { invitation: null, problem: 'unknown' };
  if (inv.usedAt) return { invitation: inv, problem: 'used' };
  if (inv.revokedAt) return { invitation: inv, problem: 'revoked' };
  if (inv.expiresAt.getTime() <= now.getTime()) return { invitation: inv, problem: 'expired' };
  return { invitation: inv, problem: null };
}

const PROBLEM_TEXT: Record<InvitationProblem, string> = {
  unknown: 'This invitation link is not valid. Ask for a new invitation.',
  used: 'This invitation link was already used. Sign in with the account it created, or ask for a new invitation.',
  expired: 'This invitation link has expired. Ask for a new invitation.',
  revoked: 'This invitation was withdrawn. Ask for a new invitation.',
};

/** 410 Gone with a clear message for a link that cannot be used. */
export function invitationGone(problem: InvitationProblem): HttpError {
  return new HttpError(problem === 'unknown' ? 404 : 410, `invitation_${problem}`, PROBLEM_TEXT[problem]);
}

/** Uses the invitation once: creates the account (and the project membership for a client). */
export async function acceptInvitation(sequelize: Sequelize, token: string, input: { name: string; password: string }, bcryptCost: number, now: Date): Promise<User> {
  // The token first: a bogus link must not cost a bcrypt hash (checked again under the row lock).
  const first = await findByToken(token, now);
  if (first.problem) throw invitationGone(first.problem);
  const passwordHash = await hashPassword(input.password, bcryptCost);
  return sequelize.transaction(async (transaction) => {
    const inv = await Invitation.findOne({ where: { tokenHash: tokenHash(token) }, transaction, lock: transaction.LOCK.UPDATE });
    const { problem } = inv ? await findByToken(token, now) : { problem: 'unknown' as const };
    if (!inv || problem) throw invitationGone(problem ?? 'unknown');
    if (await User.findOne({ where: { email: inv.email }, attributes: ['id'], transaction })) throw conflict(`An account for ${inv.email} already exists.`);
    const user = await User.create({ email: inv.email, name: input.name, role: inv.role, passwordHash, active: true, invitedAt: inv.createdAt }, { transaction });
    if (inv.projectId) await ProjectMember.create({ projectId: inv.projectId, userId: user.id }, { transaction });
    await inv.update({ usedAt: now, userId: user.id }, { transaction });
    await audit(user.id, 'invitation.accept', 'invitation', inv.id, { userId: user.id, role: user.role }, transaction);
    return user;
  });
}

/** Withdraws a pending invitation (admin). */
export async function revokeInvitation(sequelize: Sequelize, admin: SessionUser, id: number, now: Date): Promise<void> {
  await sequelize.transaction(async (transaction) => {
    const inv = await Invitation.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
    if (!inv) throw notFound('Invitation');
    if (inv.usedAt) throw conflict('This invitation was already used.');
    if (inv.revokedAt) return;
    await inv.update({ revokedAt: now }, { transaction });
    await audit(admin.id, 'invitation.revoke', 'invitation', inv.id, { email: inv.email }, transaction);
  });
}
