import type { Role } from '@shared/schemas/user';
import type { SessionUser } from '../auth/passport';
import { Layout, type User } from '../models';
import { storeRelease } from '../services/release';
import { updateLayout } from '../services/layouts';
import { freezeRevision, recordDecision } from '../services/revisions';
import { loadDemoLayout } from './demoLayout';
import type { SeedStep } from './seed';

function actor(accounts: ReadonlyMap<Role, User>, role: Role): SessionUser {
  const u = accounts.get(role);
  if (!u) throw new Error(`demo review: there is no demo ${role}`);
  return { id: u.id, email: u.email, name: u.name, role: u.role };
}

/**
 * The demo layout's review, replayed through the services the API uses, inside the seed's
 * transaction and at the times of samples/demo-history.json: the planner submits the first draft
 * as revision A, the reviewer returns it for changes with a comment, the planner edits the working
 * copy into samples/layouts/fernhill-line3.json and submits revision B, the reviewer signs it off
 * and the planner releases it, which stores its plan sheet. Nothing is mailed: these are past
 * events. The working copy stays editable.
 */
export const seedDemoReview: SeedStep = async ({ transaction, project, accounts, history }) => {
  const planner = actor(accounts, 'planner');
  const reviewer = actor(accounts, 'reviewer');
  const demo = await loadDemoLayout(transaction);
  const layout = await Layout.findOne({ where: { projectId: project.id, name: demo.name }, attributes: ['id', 'version'], transaction });
  if (!layout) throw new Error(`demo review: the demo project has no layout "${demo.name}"`);
  const { revisionA: a, revisionB: b } = history;

  const revA = await freezeRevision(planner, layout.id, a.submitted, transaction);
  await recordDecision(reviewer, revA.id, { decision: 'return', comment: a.returnComment }, a.returned, transaction);

  await updateLayout(planner, layout.id, { version: layout.version, content: demo.content }, transaction, b.edited);
  const revB = await freezeRevision(planner, layout.id, b.submitted, transaction);
  await recordDecision(reviewer, revB.id, { decision: 'sign_off', comment: b.signOffComment }, b.signedOff, transaction);
  await storeRelease(planner, revB.id, b.released, transaction);
};
