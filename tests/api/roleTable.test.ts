// Role × route table: every route that exists, for anonymous and each role, with the expected status.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Role } from '@shared/schemas/user';
import { ArmModel, FloorPlan, Invitation, Layout, ReviewComment } from '../../backend/src/models';
import { buildReleasedRevision } from '../support/revisionFixtures';
import { buildProject, buildUser, TEST_PASSWORD } from '../support/factories';
import { createTestApp, signedIn, type TestApp } from '../support/testApp';

type Who = 'anon' | Role;
const WHO: Who[] = ['anon', 'client', 'reviewer', 'planner', 'admin'];

interface Ctx {
  floorPlanId: number;
  layoutId: number;
  /** A layout without revisions (deletable) and a project and layout to archive. */
  plainLayoutId: number;
  archiveProjectId: number;
  archiveLayoutId: number;
  projectId: number;
  otherProjectId: number;
  memberUserId: number;
  targetUserId: number;
  armModelId: number;
  submittedRevisionId: number;
  releasedRevisionId: number;
  commentId: number;
  invitationId: number;
}

interface Row {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  path: (c: Ctx) => string;
  body?: (c: Ctx) => object;
  expect: Record<Who, number>;
}

const ROLE_TABLE_ARM = {
  family: 'chain',
  convention: 'standard',
  joints: [
    { type: 'revolute', a: 0, alpha: 90, d: 300, theta: 0, min: -180, max: 180 },
    { type: 'revolute', a: 500, alpha: 0, d: 0, theta: 0, min: -90, max: 90 },
  ],
  tool: { x: 0, y: 0, z: 0 },
};

const ROWS: Row[] = [
  { method: 'get', path: () => '/api/health', expect: { anon: 200, client: 200, reviewer: 200, planner: 200, admin: 200 } },
  { method: 'get', path: () => '/api/auth/me', expect: { anon: 401, client: 200, reviewer: 200, planner: 200, admin: 200 } },
  { method: 'get', path: () => '/api/projects', expect: { anon: 401, client: 200, reviewer: 200, planner: 200, admin: 200 } },
  {
    method: 'post',
    path: () => '/api/projects',
    body: () => ({ name: 'Role table project', clientName: 'Fernhill' }),
    expect: { anon: 401, client: 403, reviewer: 403, planner: 201, admin: 201 },
  },
  { method: 'get', path: (c) => `/api/projects/${c.projectId}`, expect: { anon: 401, client: 200, reviewer: 200, planner: 200, admin: 200 } },
  { method: 'get', path: (c) => `/api/projects/${c.otherProjectId}`, expect: { anon: 401, client: 404, reviewer: 200, planner: 200, admin: 200 } },
  {
    method: 'patch',
    path: (c) => `/api/projects/${c.projectId}`,
    body: () => ({ description: 'edited' }),
    expect: { anon: 401, client: 403, reviewer: 403, planner: 200, admin: 200 },
  },
  { method: 'get', path: (c) => `/api/projects/${c.projectId}/members`, expect: { anon: 401, client: 200, reviewer: 200, planner: 200, admin: 200 } },
  {
    method: 'post',
    path: (c) => `/api/projects/${c.otherProjectId}/members`,
    body: (c) => ({ userId: c.memberUserId }),
    expect: { anon: 401, client: 403, reviewer: 403, planner: 201, admin: 201 },
  },
  {
    method: 'delete',
    path: (c) => `/api/projects/${c.otherProjectId}/members/${c.memberUserId}`,
    expect: { anon: 401, client: 403, reviewer: 403, planner: 204, admin: 204 },
  },
  { method: 'get', path: () => '/api/users', expect: { anon: 401, client: 403, reviewer: 403, planner: 200, admin: 200 } },
  {
    method: 'post',
    path: () => '/api/users',
    body: () => ({ email: `rt-${Date.now()}-${Math.random().toString(36).slice(2)}@example.test`, name: 'Role Table', role: 'client', password: 'role-table-pass' }),
    expect: { anon: 401, client: 403, reviewer: 403, planner: 403, admin: 201 },
  },
  {
    method: 'patch',
    path: (c) => `/api/users/${c.targetUserId}`,
    body: () => ({ name: 'Renamed' }),
    expect: { anon: 401, client: 403, reviewer: 403, planner: 403, admin: 200 },
  },
  { method: 'get', path: (c) => `/api/projects/${c.projectId}/floor-plans`, expect: { anon: 401, client: 200, reviewer: 200, planner: 200, admin: 200 } },
  { method: 'get', path: (c) => `/api/floor-plans/${c.floorPlanId}`, expect: { anon: 401, client: 200, reviewer: 200, planner: 200, admin: 200 } },
  { method: 'get', path: (c) => `/api/floor-plans/${c.floorPlanId}/source`, expect: { anon: 401, client: 200, reviewer: 200, planner: 200, admin: 200 } },
  {
    method: 'patch',
    path: (c) => `/api/floor-plans/${c.floorPlanId}`,
    body: () => ({ layers: [{ name: 'OUTLINE', role: 'outline' }] }),
    expect: { anon: 401, client: 403, reviewer: 403, planner: 200, admin: 200 },
  },
  { method: 'post', path: (c) => `/api/projects/${c.projectId}/floor-plans`, expect: { anon: 401, client: 403, reviewer: 403, planner: 400, admin: 400 } },
  { method: 'get', path: (c) => `/api/projects/${c.projectId}/layouts`, expect: { anon: 401, client: 403, reviewer: 200, planner: 200, admin: 200 } },
  {
    method: 'post',
    path: (c) => `/api/projects/${c.projectId}/layouts`,
    body: () => ({ name: 'Role table layout' }),
    expect: { anon: 401, client: 403, reviewer: 403, planner: 201, admin: 201 },
  },
  { method: 'get', path: (c) => `/api/layouts/${c.layoutId}`, expect: { anon: 401, client: 403, reviewer: 200, planner: 200, admin: 200 } },
  {
    method: 'put',
    path: (c) => `/api/layouts/${c.layoutId}`,
    body: () => ({ version: 1, name: 'Renamed layout' }),
    expect: { anon: 401, client: 403, reviewer: 403, planner: 200, admin: 200 },
  },
  // The role-table layout has no arms: planners and admins get the 400 sentence, the others no access.
  { method: 'get', path: (c) => `/api/layouts/${c.layoutId}/analysis`, expect: { anon: 401, client: 403, reviewer: 200, planner: 200, admin: 200 } },
  { method: 'post', path: (c) => `/api/layouts/${c.layoutId}/analysis`, body: () => ({}), expect: { anon: 401, client: 403, reviewer: 200, planner: 200, admin: 200 } },
  { method: 'post', path: (c) => `/api/layouts/${c.layoutId}/fence-proposal`, body: () => ({}), expect: { anon: 401, client: 403, reviewer: 403, planner: 400, admin: 400 } },
  // Revisions: the submitted one belongs to a layout of the client's project; clients never see it.
  { method: 'get', path: (c) => `/api/projects/${c.projectId}/revisions`, expect: { anon: 401, client: 200, reviewer: 200, planner: 200, admin: 200 } },
  { method: 'get', path: (c) => `/api/layouts/${c.layoutId}/revisions`, expect: { anon: 401, client: 403, reviewer: 200, planner: 200, admin: 200 } },
  { method: 'get', path: (c) => `/api/revisions/${c.submittedRevisionId}`, expect: { anon: 401, client: 404, reviewer: 200, planner: 200, admin: 200 } },
  { method: 'get', path: (c) => `/api/revisions/${c.releasedRevisionId}`, expect: { anon: 401, client: 200, reviewer: 200, planner: 200, admin: 200 } },
  { method: 'put', path: (c) => `/api/revisions/${c.submittedRevisionId}`, body: () => ({ letter: 'Z' }), expect: { anon: 401, client: 404, reviewer: 409, planner: 409, admin: 409 } },
  { method: 'get', path: (c) => `/api/revisions/${c.releasedRevisionId}/plan-sheet.pdf`, expect: { anon: 401, client: 200, reviewer: 200, planner: 200, admin: 200 } },
  { method: 'post', path: (c) => `/api/revisions/${c.submittedRevisionId}/comments`, body: () => ({ body: 'Role table note', point: { x: 1, y: 2 } }), expect: { anon: 401, client: 403, reviewer: 201, planner: 201, admin: 201 } },
  { method: 'patch', path: (c) => `/api/comments/${c.commentId}`, body: () => ({ resolved: true }), expect: { anon: 401, client: 403, reviewer: 200, planner: 200, admin: 200 } },
  { method: 'post', path: (c) => `/api/revisions/${c.submittedRevisionId}/decision`, body: () => ({ decision: 'return' }), expect: { anon: 401, client: 403, reviewer: 400, planner: 403, admin: 403 } },
  { method: 'post', path: (c) => `/api/revisions/${c.submittedRevisionId}/release`, expect: { anon: 401, client: 403, reviewer: 403, planner: 409, admin: 409 } },
  { method: 'post', path: (c) => `/api/revisions/${c.releasedRevisionId}/release/retry-mail`, expect: { anon: 401, client: 403, reviewer: 403, planner: 409, admin: 409 } },
  { method: 'post', path: (c) => `/api/revisions/${c.releasedRevisionId}/acknowledge`, expect: { anon: 401, client: 200, reviewer: 403, planner: 403, admin: 403 } },
  { method: 'post', path: (c) => `/api/layouts/${c.layoutId}/revisions`, expect: { anon: 401, client: 403, reviewer: 403, planner: 409, admin: 409 } },
  // Admin: audit log, mail outbox, invitations.
  { method: 'get', path: () => '/api/admin/audit?action=revision.', expect: { anon: 401, client: 403, reviewer: 403, planner: 403, admin: 200 } },
  { method: 'get', path: () => '/api/admin/mail', expect: { anon: 401, client: 403, reviewer: 403, planner: 403, admin: 200 } },
  { method: 'get', path: () => '/api/admin/mail/2147483647', expect: { anon: 401, client: 403, reviewer: 403, planner: 403, admin: 404 } },
  { method: 'get', path: () => '/api/invitations', expect: { anon: 401, client: 403, reviewer: 403, planner: 403, admin: 200 } },
  {
    method: 'post',
    path: () => '/api/invitations',
    body: () => ({ email: `inv-${Date.now()}-${Math.random().toString(36).slice(2)}@example.test`, role: 'reviewer' }),
    expect: { anon: 401, client: 403, reviewer: 403, planner: 403, admin: 201 },
  },
  { method: 'delete', path: (c) => `/api/invitations/${c.invitationId}`, expect: { anon: 401, client: 403, reviewer: 403, planner: 403, admin: 204 } },
  { method: 'get', path: () => '/api/invitations/token/not-a-real-token-at-all-000', expect: { anon: 404, client: 404, reviewer: 404, planner: 404, admin: 404 } },
  { method: 'get', path: (c) => `/api/layouts/${c.layoutId}/plan-sheet.pdf?sheets=plan`, expect: { anon: 401, client: 403, reviewer: 200, planner: 200, admin: 200 } },
  {
    method: 'post',
    path: (c) => `/api/layouts/${c.layoutId}/placement-search`,
    body: (c) => ({ armModelId: c.armModelId, pointIds: ['P1'] }),
    expect: { anon: 401, client: 403, reviewer: 400, planner: 400, admin: 400 },
  },
  { method: 'get', path: (c) => `/api/layouts/${c.layoutId}/layout.dxf`, expect: { anon: 401, client: 403, reviewer: 200, planner: 200, admin: 200 } },
  // A layout with released revisions is a record: 409 (archive it instead); one without goes.
  { method: 'delete', path: (c) => `/api/layouts/${c.layoutId}`, expect: { anon: 401, client: 403, reviewer: 403, planner: 409, admin: 409 } },
  { method: 'delete', path: (c) => `/api/layouts/${c.plainLayoutId}`, expect: { anon: 401, client: 403, reviewer: 403, planner: 204, admin: 204 } },
  { method: 'delete', path: (c) => `/api/projects/${c.projectId}`, expect: { anon: 401, client: 403, reviewer: 403, planner: 409, admin: 409 } },
  { method: 'post', path: (c) => `/api/projects/${c.archiveProjectId}/archive`, expect: { anon: 401, client: 403, reviewer: 403, planner: 200, admin: 200 } },
  { method: 'get', path: () => '/api/projects?archived=1', expect: { anon: 401, client: 200, reviewer: 200, planner: 200, admin: 200 } },
  { method: 'post', path: (c) => `/api/projects/${c.archiveProjectId}/restore`, expect: { anon: 401, client: 403, reviewer: 403, planner: 403, admin: 200 } },
  { method: 'post', path: (c) => `/api/layouts/${c.archiveLayoutId}/archive`, expect: { anon: 401, client: 403, reviewer: 403, planner: 200, admin: 200 } },
  { method: 'get', path: (c) => `/api/projects/${c.projectId}/layouts?archived=1`, expect: { anon: 401, client: 403, reviewer: 200, planner: 200, admin: 200 } },
  { method: 'post', path: (c) => `/api/layouts/${c.archiveLayoutId}/restore`, expect: { anon: 401, client: 403, reviewer: 403, planner: 403, admin: 200 } },
  { method: 'delete', path: (c) => `/api/floor-plans/${c.floorPlanId}`, expect: { anon: 401, client: 403, reviewer: 403, planner: 204, admin: 204 } },
  { method: 'delete', path: (c) => `/api/projects/${c.otherProjectId}`, expect: { anon: 401, client: 403, reviewer: 403, planner: 204, admin: 204 } },
  { method: 'get', path: () => '/api/arm-models', expect: { anon: 401, client: 200, reviewer: 200, planner: 200, admin: 200 } },
  { method: 'get', path: (c) => `/api/arm-models/${c.armModelId}`, expect: { anon: 401, client: 200, reviewer: 200, planner: 200, admin: 200 } },
  {
    method: 'post',
    path: () => '/api/arm-models',
    body: () => ({ name: `Role table arm ${Date.now()}-${Math.random().toString(36).slice(2)}`, params: ROLE_TABLE_ARM }),
    expect: { anon: 401, client: 403, reviewer: 403, planner: 201, admin: 201 },
  },
  {
    method: 'put',
    path: (c) => `/api/arm-models/${c.armModelId}`,
    body: (c) => ({ name: `Role table arm ${c.armModelId} renamed`, params: ROLE_TABLE_ARM }),
    expect: { anon: 401, client: 403, reviewer: 403, planner: 200, admin: 200 },
  },
  {
    method: 'post',
    path: () => '/api/kinematics/forward',
    body: () => ({ model: ROLE_TABLE_ARM, joints: [0, 45] }),
    expect: { anon: 401, client: 200, reviewer: 200, planner: 200, admin: 200 },
  },
  {
    method: 'post',
    path: () => '/api/kinematics/reach',
    body: (c) => ({ model: { id: c.armModelId } }),
    expect: { anon: 401, client: 200, reviewer: 200, planner: 200, admin: 200 },
  },
  {
    method: 'post',
    path: () => '/api/safeguarding/separation',
    body: () => ({ device: 'light-curtain', resolutionMm: 14, responseTimeS: 0.02, stopTimeS: 0.18 }),
    expect: { anon: 401, client: 200, reviewer: 200, planner: 200, admin: 200 },
  },
  {
    method: 'post',
    path: () => '/api/safeguarding/reach-over',
    body: () => ({ hazardHeightMm: 2400, structureHeightMm: 1400 }),
    expect: { anon: 401, client: 200, reviewer: 200, planner: 200, admin: 200 },
  },
  {
    method: 'post',
    path: () => '/api/safeguarding/reach-through',
    body: () => ({ openingMm: 20, shape: 'square' }),
    expect: { anon: 401, client: 200, reviewer: 200, planner: 200, admin: 200 },
  },
  { method: 'delete', path: (c) => `/api/arm-models/${c.armModelId}`, expect: { anon: 401, client: 403, reviewer: 403, planner: 204, admin: 204 } },
  { method: 'post', path: () => '/api/auth/logout', expect: { anon: 401, client: 204, reviewer: 204, planner: 204, admin: 204 } },
];

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => t.close());

describe('role × route table', () => {
  it.each(WHO)('%s gets the expected status on every route', async (who) => {
    const client = await buildUser({ role: 'client' });
    const users: Partial<Record<Role, Awaited<ReturnType<typeof buildUser>>>> = { client };
    for (const r of ['reviewer', 'planner', 'admin'] as const) users[r] = await buildUser({ role: r });
    const projectId = (await buildProject({ members: [client] })).id;
    const fp = await FloorPlan.create({
      projectId,
      fileName: 'x.dxf',
      originalDxf: Buffer.from('0\nEOF\n'),
      units: 'mm',
      unitsSource: 'header',
      bounds: { minX: 0, minY: 0, maxX: 1, maxY: 1 },
      layers: [{ name: 'OUTLINE', role: 'outline', height: null, entityCount: 1, color: '#000000' }],
      geometry: { type: 'FeatureCollection', features: [] },
      createdBy: null,
    });
    const layout = await Layout.create({ projectId, floorPlanId: null, name: 'L', content: { arms: [], workPoints: [], boundaries: [], workHeights: [] }, createdBy: null });
    const { submitted, released } = await buildReleasedRevision(projectId, layout.id);
    const comment = await ReviewComment.create({ revisionId: submitted.id, authorId: null, findingId: null, pointX: 0, pointY: 0, body: 'Seed note' });
    const invitation = await Invitation.create({ email: `rt-${who}-${process.pid}@example.test`, role: 'planner', projectId: null, tokenHash: `${who}`.padEnd(64, '0'), expiresAt: new Date(Date.now() + 3600e3), invitedBy: null, createdAt: new Date() });
    const ctx: Ctx = {
      submittedRevisionId: submitted.id,
      releasedRevisionId: released.id,
      commentId: comment.id,
      invitationId: invitation.id,
      floorPlanId: fp.id,
      layoutId: layout.id,
      plainLayoutId: (await Layout.create({ projectId, floorPlanId: null, name: 'Plain', content: { arms: [], workPoints: [], boundaries: [], workHeights: [] }, createdBy: null })).id,
      archiveProjectId: (await buildProject()).id,
      archiveLayoutId: (await Layout.create({ projectId, floorPlanId: null, name: 'To archive', content: { arms: [], workPoints: [], boundaries: [], workHeights: [] }, createdBy: null })).id,
      projectId,
      otherProjectId: (await buildProject()).id,
      memberUserId: (await buildUser({ role: 'client' })).id,
      targetUserId: (await buildUser({ role: 'client' })).id,
      armModelId: (await ArmModel.create({ name: `Role table arm ${who} ${process.pid}`, family: 'chain', params: ROLE_TABLE_ARM, createdBy: null })).id,
    };
    const agent = who === 'anon' ? request.agent(t.app) : await signedIn(t.app, users[who]!.email, TEST_PASSWORD);
    const got: Record<string, number> = {};
    const want: Record<string, number> = {};
    for (const row of ROWS) {
      const key = `${row.method.toUpperCase()} ${row.path(ctx)}`;
      let req = agent[row.method](row.path(ctx));
      if (row.body) req = req.send(row.body(ctx));
      got[key] = (await req).status;
      want[key] = row.expect[who];
    }
    expect(got).toEqual(want);
  });
});
