import { Router } from 'express';
import { z } from 'zod';
import { multiLineText } from '@shared/schemas/fields';
import { allow, currentUser } from '../auth/guards';
import type { FeatureContext } from '../featureContext';
import { badRequest, conflict, notFound } from '../http/errors';
import { idParam, parseOr400 } from '../http/validate';
import { ReviewComment, User } from '../models';
import { audit } from '../services/audit/audit';
import { loadVisibleRevision, presentComment } from '../services/revisions';

// zod's number refuses NaN and ±Infinity.
const finite = z.number();
const CommentInput = z
  .object({
    body: multiLineText().min(1, 'Write the comment').max(10_000, 'Use at most 10 000 characters'),
    findingId: z.string().trim().min(1).max(200).optional(),
    /** A plan spot, mm (x east, y north). */
    point: z.object({ x: finite, y: finite }).strict().optional(),
  })
  .strict()
  .refine((c) => !(c.findingId && c.point), { message: 'Pin the comment to a finding or to a spot, not both', path: ['point'] });
const CommentUpdate = z.object({ resolved: z.boolean({ error: 'Say whether it is resolved' }) }).strict();

/** Review comments on revisions: pinned to a finding (its stable id) or a plan point; read-only once released. */
export function commentsRouter(ctx: FeatureContext): Router {
  const r = Router();
  const now = () => (ctx.now ? ctx.now() : new Date());

  r.post('/revisions/:id/comments', allow('comment.write'), async (req, res) => {
    const user = currentUser(req);
    const rev = await loadVisibleRevision(user, idParam(req.params.id, 'Revision'));
    const input = parseOr400(CommentInput, req.body, 'The comment');
    if (rev.state === 'released') throw conflict(`Revision ${rev.letter} is released; its comments are read-only.`);
    if (input.findingId) {
      const findings = rev.snapshot.analysis.findings;
      if (!findings.some((f) => f.id === input.findingId)) throw badRequest(`Revision ${rev.letter} has no finding ${input.findingId}.`, { findingId: 'No such finding on this revision' });
    }
    const c = await ctx.sequelize.transaction(async (transaction) => {
      const row = await ReviewComment.create(
        { revisionId: rev.id, authorId: user.id, findingId: input.findingId ?? null, pointX: input.point?.x ?? null, pointY: input.point?.y ?? null, body: input.body, createdAt: now(), updatedAt: now() },
        { transaction },
      );
      await audit(user.id, 'comment.create', 'comment', row.id, { revisionId: rev.id, findingId: row.findingId, point: input.point ?? null }, transaction);
      return row;
    });
    res.status(201).json({ comment: presentComment(c, new Map([[user.id, user.name]])) });
  });

  r.patch('/comments/:id', allow('comment.write'), async (req, res) => {
    const user = currentUser(req);
    const c = await ReviewComment.findByPk(idParam(req.params.id, 'Comment'));
    if (!c) throw notFound('Comment');
    const rev = await loadVisibleRevision(user, c.revisionId).catch(() => {
      throw notFound('Comment');
    });
    const input = parseOr400(CommentUpdate, req.body, 'The change');
    if (rev.state === 'released') throw conflict(`Revision ${rev.letter} is released; its comments are read-only.`);
    await ctx.sequelize.transaction(async (transaction) => {
      await c.update({ resolved: input.resolved, resolvedBy: input.resolved ? user.id : null, resolvedAt: input.resolved ? now() : null }, { transaction });
      await audit(user.id, input.resolved ? 'comment.resolve' : 'comment.reopen', 'comment', c.id, { revisionId: rev.id }, transaction);
    });
    const ids = [c.authorId, c.resolvedBy].filter((i): i is number => i != null);
    const names = new Map((await User.findAll({ where: { id: ids }, attributes: ['id', 'name'] })).map((u) => [u.id, u.name]));
    res.json({ comment: presentComment(c, names) });
  });

  return r;
}
