import { Router } from 'express';
import { ipKeyGenerator } from 'express-rate-limit';
import { Op } from 'sequelize';
import { InvitationAcceptInput, InvitationInput } from '@shared/schemas/user';
import { allow, currentUser } from '../auth/guards';
import { markSignedIn } from '../auth/passport';
import type { FeatureContext } from '../featureContext';
import { pgRateLimit } from '../http/rateLimit';
import { idParam, parseOr400 } from '../http/validate';
import { Invitation, Project, User } from '../models';
import { mailContextFor } from '../services/mailContext';
import { acceptInvitation, createInvitation, findByToken, invitationGone, revokeInvitation } from '../services/invitations';

function presentInvitation(i: Invitation, projects: Map<number, string>, now: Date) {
  return {
    id: i.id,
    email: i.email,
    role: i.role,
    project: i.projectId ? { id: i.projectId, name: projects.get(i.projectId) ?? '' } : null,
    createdAt: i.createdAt.toISOString(),
    expiresAt: i.expiresAt.toISOString(),
    status: i.usedAt ? 'used' : i.revokedAt ? 'revoked' : i.expiresAt.getTime() <= now.getTime() ? 'expired' : 'pending',
  };
}

/** Invitations (admin) and the public one-time link (`/invite/<token>` page calls the token routes). */
export function invitationsRouter(ctx: FeatureContext): Router {
  const r = Router();
  const now = () => (ctx.now ? ctx.now() : new Date());
  // The public link routes: per address, so nobody can try tokens (or make the server hash) at will.
  r.use(
    '/invitations/token',
    pgRateLimit(ctx.sequelize, {
      name: 'invite',
      limit: ctx.config.inviteRateLimit,
      windowMs: ctx.config.loginRateWindowMs,
      key: (req) => ipKeyGenerator(req.ip ?? ''),
      message: 'Too many tries with invitation links. Wait a few minutes and try again.',
    }),
  );

  r.get('/invitations', allow('invite.manage'), async (req, res) => {
    const all = req.query.all === '1';
    const t = now();
    const rows = await Invitation.findAll({
      where: all ? {} : { usedAt: null, revokedAt: null, expiresAt: { [Op.gt]: t } },
      order: [['id', 'DESC']],
      limit: 500,
    });
    const ids = [...new Set(rows.map((i) => i.projectId).filter((p): p is number => p != null))];
    const projects = new Map((ids.length ? await Project.findAll({ where: { id: ids }, attributes: ['id', 'name'] }) : []).map((p) => [p.id, p.name]));
    res.json({ invitations: rows.map((i) => presentInvitation(i, projects, t)) });
  });

  r.post('/invitations', allow('invite.manage'), async (req, res) => {
    const admin = currentUser(req);
    const input = parseOr400(InvitationInput, req.body, 'The invitation');
    const { invitation, delivery } = await createInvitation(ctx.sequelize, admin, input, mailContextFor(ctx, req), now());
    const projects = new Map<number, string>();
    if (invitation.projectId) projects.set(invitation.projectId, (await Project.findByPk(invitation.projectId, { attributes: ['name'] }))?.name ?? '');
    res.status(201).json({ invitation: presentInvitation(invitation, projects, now()), mail: { status: delivery.status, error: delivery.error } });
  });

  r.delete('/invitations/:id', allow('invite.manage'), async (req, res) => {
    await revokeInvitation(ctx.sequelize, currentUser(req), idParam(req.params.id, 'Invitation'), now());
    res.status(204).end();
  });

  // Public: what the link invites to, so the page can greet the person (or say why it cannot be used).
  r.get('/invitations/token/:token', async (req, res) => {
    const { invitation, problem } = await findByToken(String(req.params.token), now());
    if (problem || !invitation) throw invitationGone(problem ?? 'unknown');
    res.json({ invitation: { email: invitation.email, role: invitation.role, expiresAt: invitation.expiresAt.toISOString() } });
  });

  // Public: sets name and password, creates the account and signs it in (a new session).
  r.post('/invitations/token/:token/accept', async (req, res, next) => {
    const input = parseOr400(InvitationAcceptInput, req.body, 'Your details');
    const user: User = await acceptInvitation(ctx.sequelize, String(req.params.token), input, ctx.config.bcryptCost, now());
    const sessionUser = { id: user.id, email: user.email, name: user.name, role: user.role };
    req.logIn(sessionUser, (err) => {
      if (err) return next(err);
      markSignedIn(req, now());
      res.status(201).json({ user: sessionUser });
    });
  });

  return r;
}
