import { Router, type Request } from 'express';
import { z } from 'zod';
import { can } from '@shared/policy';
import { multiLineText } from '@shared/schemas/fields';
import { allow, currentUser } from '../auth/guards';
import type { FeatureContext } from '../featureContext';
import { conflict, notFound } from '../http/errors';
import { idParam, parseOr400 } from '../http/validate';
import { Revision } from '../models';
import { loadVisibleLayout } from '../services/layouts';
import { mailContextFor } from '../services/mailContext';
import { acknowledgeRevision, planSheetFor, releaseRevision, retryReleaseMail } from '../services/release';
import { decideRevision, loadVisibleRevision, presentRevisionDetail, presentRevisions, REVISION_LIST_ATTRIBUTES, submitRevision } from '../services/revisions';
import { loadVisibleProject } from '../services/projectAccess';

const DecisionInput = z.object({
  decision: z.enum(['sign_off', 'return'], { error: 'Choose to sign off or to return for changes' }),
  comment: multiLineText().max(10_000, 'Use at most 10 000 characters').default(''),
});

/** Revisions: submit (planner), decide (reviewer), release (planner), plan sheet, acknowledge (client). */
export function revisionsRouter(ctx: FeatureContext): Router {
  const r = Router();
  const now = () => (ctx.now ? ctx.now() : new Date());

  r.post('/layouts/:id/revisions', allow('revision.submit'), async (req, res) => {
    const user = currentUser(req);
    const layout = await loadVisibleLayout(user, idParam(req.params.id, 'Layout'));
    const rev = await submitRevision(ctx.sequelize, user, layout.id, mailContextFor(ctx, req), now());
    res.status(201).json({ revision: await presentRevisionDetail(user, rev) });
  });

  r.get('/layouts/:id/revisions', allow('revision.readDrafts'), async (req, res) => {
    const user = currentUser(req);
    const layout = await loadVisibleLayout(user, idParam(req.params.id, 'Layout'));
    const revs = await Revision.findAll({ where: { layoutId: layout.id }, attributes: REVISION_LIST_ATTRIBUTES, order: [['id', 'ASC']] });
    res.json({ revisions: await presentRevisions(user, revs) });
  });

  r.get('/projects/:id/revisions', allow('revision.read'), async (req, res) => {
    const user = currentUser(req);
    const project = await loadVisibleProject(user, idParam(req.params.id, 'Project'));
    const where = can(user.role, 'revision.readDrafts') ? { projectId: project.id } : { projectId: project.id, state: 'released' };
    const revs = await Revision.findAll({ where, attributes: REVISION_LIST_ATTRIBUTES, order: [['layoutId', 'ASC'], ['id', 'ASC']] });
    res.json({ revisions: await presentRevisions(user, revs) });
  });

  r.get('/revisions/:id', allow('revision.read'), async (req, res) => {
    const user = currentUser(req);
    const rev = await loadVisibleRevision(user, idParam(req.params.id, 'Revision'));
    res.json({ revision: await presentRevisionDetail(user, rev) });
  });

  // A revision is immutable: any attempt to change or remove it is a conflict.
  const immutable = async (req: Request) => {
    const user = currentUser(req);
    const rev = await loadVisibleRevision(user, idParam(req.params.id, 'Revision'));
    throw conflict(`Revision ${rev.letter} is immutable; submit a new revision instead.`);
  };
  r.put('/revisions/:id', allow('revision.read'), immutable);
  r.patch('/revisions/:id', allow('revision.read'), immutable);
  r.delete('/revisions/:id', allow('revision.read'), immutable);

  r.post('/revisions/:id/decision', allow('revision.decide'), async (req, res) => {
    const user = currentUser(req);
    const rev = await loadVisibleRevision(user, idParam(req.params.id, 'Revision'));
    const input = parseOr400(DecisionInput, req.body, 'The decision');
    const decided = await decideRevision(ctx.sequelize, user, rev.id, input, mailContextFor(ctx, req), now());
    res.json({ revision: await presentRevisionDetail(user, decided) });
  });

  r.post('/revisions/:id/release', allow('revision.release'), async (req, res) => {
    const user = currentUser(req);
    const rev = await loadVisibleRevision(user, idParam(req.params.id, 'Revision'));
    const { revision, delivery } = await releaseRevision(ctx.sequelize, user, rev.id, mailContextFor(ctx, req), now());
    res.json({ revision: await presentRevisionDetail(user, revision), mail: { status: delivery.status, error: delivery.error, attempts: delivery.attempts, to: delivery.to } });
  });

  r.post('/revisions/:id/release/retry-mail', allow('revision.release'), async (req, res) => {
    const user = currentUser(req);
    const rev = await loadVisibleRevision(user, idParam(req.params.id, 'Revision'));
    const d = await retryReleaseMail(user, rev.id, mailContextFor(ctx, req), now());
    res.json({ mail: { status: d.status, error: d.error, attempts: d.attempts, to: d.to } });
  });

  r.get('/revisions/:id/plan-sheet.pdf', allow('revision.read'), async (req, res) => {
    const user = currentUser(req);
    const rev = await loadVisibleRevision(user, idParam(req.params.id, 'Revision'));
    if (rev.state !== 'released' && !can(user.role, 'revision.readDrafts')) throw notFound('Revision');
    const { pdf, draft } = await planSheetFor(rev, now());
    const snapName = rev.snapshot.project.name.replace(/[^A-Za-z0-9._-]+/g, '-');
    const name = `${snapName}-revision-${rev.letter}${draft ? '-DRAFT' : ''}.pdf`;
    res.set('Content-Type', 'application/pdf');
    res.set('Content-Disposition', `${req.query.download ? 'attachment' : 'inline'}; filename="${name}"`);
    if (!draft && rev.planSheetChecksum) res.set('X-Content-SHA256', rev.planSheetChecksum);
    res.send(pdf);
  });

  r.post('/revisions/:id/acknowledge', allow('revision.acknowledge'), async (req, res) => {
    const user = currentUser(req);
    const rev = await loadVisibleRevision(user, idParam(req.params.id, 'Revision'));
    const ack = await acknowledgeRevision(user, rev, now());
    res.json({ acknowledgement: { revisionId: rev.id, at: ack.at.toISOString() } });
  });

  return r;
}
