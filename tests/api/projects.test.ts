import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent, Project, ProjectMember } from '../../backend/src/models';
import { buildProject, buildUser, TEST_PASSWORD } from '../support/factories';
import { createTestApp, signedIn, type TestApp } from '../support/testApp';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => t.close());

describe('projects', () => {
  it('lets a planner create, read, edit and delete a project, each step audited', async () => {
    const planner = await buildUser({ role: 'planner' });
    const agent = await signedIn(t.app, planner.email, TEST_PASSWORD);
    const created = await agent.post('/api/projects').send({ name: 'Tray loader cell', clientName: 'Fernhill Biscuit Works', siteName: 'Hall 2' });
    expect(created.status).toBe(201);
    const id = created.body.project.id as number;
    expect(created.body.project).toMatchObject({ name: 'Tray loader cell', description: '', createdBy: { id: planner.id }, members: [] });
    const patched = await agent.patch(`/api/projects/${id}`).send({ description: 'Second shift layout' });
    expect(patched.status).toBe(200);
    expect(patched.body.project.description).toBe('Second shift layout');
    expect((await Project.findByPk(id))!.description).toBe('Second shift layout');
    expect((await agent.delete(`/api/projects/${id}`)).status).toBe(204);
    expect(await Project.findByPk(id)).toBeNull();
    const actions = (await AuditEvent.findAll({ where: { entity: 'project', entityId: String(id) } })).map((e) => e.action).sort();
    expect(actions).toEqual(['project.create', 'project.delete', 'project.update']);
  });

  it('rejects invalid input with field messages and stores nothing', async () => {
    const planner = await buildUser({ role: 'planner' });
    const agent = await signedIn(t.app, planner.email, TEST_PASSWORD);
    const before = await Project.count();
    const res = await agent.post('/api/projects').send({ name: '  ', clientName: '' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toMatchObject({ name: expect.any(String), clientName: expect.any(String) });
    expect(await Project.count()).toBe(before);
    const empty = await agent.patch(`/api/projects/${(await buildProject()).id}`).send({});
    expect(empty.status).toBe(400);
  });

  it('shows a client only the projects they are a member of, and 404 for the others', async () => {
    const client = await buildUser({ role: 'client' });
    const mine = await buildProject({ members: [client] });
    const other = await buildProject();
    const agent = await signedIn(t.app, client.email, TEST_PASSWORD);
    const list = await agent.get('/api/projects');
    expect(list.status).toBe(200);
    expect(list.body.projects.map((p: { id: number }) => p.id)).toEqual([mine.id]);
    expect(list.body.projects[0].memberCount).toBe(1);
    expect((await agent.get(`/api/projects/${mine.id}`)).status).toBe(200);
    const hidden = await agent.get(`/api/projects/${other.id}`);
    expect(hidden.status).toBe(404);
    expect(JSON.stringify(hidden.body)).not.toContain(other.name);
    expect((await agent.get(`/api/projects/${other.id}/members`)).status).toBe(404);
  });

  it('lets reviewers read every project but change none', async () => {
    const reviewer = await buildUser({ role: 'reviewer' });
    const p = await buildProject();
    const agent = await signedIn(t.app, reviewer.email, TEST_PASSWORD);
    expect((await agent.get(`/api/projects/${p.id}`)).status).toBe(200);
    expect((await agent.patch(`/api/projects/${p.id}`).send({ name: 'x' })).status).toBe(403);
    expect((await agent.delete(`/api/projects/${p.id}`)).status).toBe(403);
    expect((await agent.post('/api/projects').send({ name: 'x', clientName: 'y' })).status).toBe(403);
    expect((await Project.findByPk(p.id))!.name).toBe(p.name);
  });

  it('adds and removes members; a duplicate is a 409; an unknown user a 400', async () => {
    const planner = await buildUser({ role: 'planner' });
    const client = await buildUser({ role: 'client' });
    const p = await buildProject();
    const agent = await signedIn(t.app, planner.email, TEST_PASSWORD);
    const add = await agent.post(`/api/projects/${p.id}/members`).send({ userId: client.id });
    expect(add.status).toBe(201);
    expect(add.body.member).toMatchObject({ userId: client.id, role: 'client' });
    expect((await agent.post(`/api/projects/${p.id}/members`).send({ userId: client.id })).status).toBe(409);
    expect((await agent.post(`/api/projects/${p.id}/members`).send({ userId: 999999 })).status).toBe(400);
    const detail = await agent.get(`/api/projects/${p.id}`);
    expect(detail.body.project.memberCount).toBe(1);
    const listed = (await agent.get('/api/projects')).body.projects as Array<{ id: number; memberCount: number }>;
    expect(listed.find((x) => x.id === p.id)?.memberCount).toBe(1);
    expect(listed.every((x) => Number.isInteger(x.memberCount))).toBe(true);
    expect((await agent.delete(`/api/projects/${p.id}/members/${client.id}`)).status).toBe(204);
    expect(await ProjectMember.count({ where: { projectId: p.id } })).toBe(0);
    expect((await agent.delete(`/api/projects/${p.id}/members/${client.id}`)).status).toBe(404);
  });

  it('treats malformed ids as not found', async () => {
    const planner = await buildUser({ role: 'planner' });
    const agent = await signedIn(t.app, planner.email, TEST_PASSWORD);
    for (const bad of ['abc', '0', '-1', '1.5', '99999999999']) {
      expect((await agent.get(`/api/projects/${bad}`)).status).toBe(404);
    }
  });
});

describe('users (admin)', () => {
  it('creates a user with a temporary password who can then sign in; duplicates are 409', async () => {
    const adminUser = await buildUser({ role: 'admin' });
    const agent = await signedIn(t.app, adminUser.email, TEST_PASSWORD);
    const res = await agent.post('/api/users').send({ email: 'New.Person@Example.test', name: 'New Person', role: 'client', password: 'temporary-pass-1' });
    expect(res.status).toBe(201);
    expect(res.body.user).toMatchObject({ email: 'new.person@example.test', role: 'client', active: true });
    expect(res.body.user.passwordHash).toBeUndefined();
    expect((await request(t.app).post('/api/auth/login').send({ email: 'new.person@example.test', password: 'temporary-pass-1' })).status).toBe(200);
    const dup = await agent.post('/api/users').send({ email: 'new.person@example.test', name: 'Again', role: 'client', password: 'temporary-pass-1' });
    expect(dup.status).toBe(409);
    const short = await agent.post('/api/users').send({ email: 'b@example.test', name: 'B', role: 'client', password: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.error.fields.password).toMatch(/10/);
  });

  it('changes a role, and refuses to let an admin demote or deactivate themselves', async () => {
    const adminUser = await buildUser({ role: 'admin' });
    const u = await buildUser({ role: 'client' });
    const agent = await signedIn(t.app, adminUser.email, TEST_PASSWORD);
    const res = await agent.patch(`/api/users/${u.id}`).send({ role: 'reviewer' });
    expect(res.status).toBe(200);
    expect(res.body.user.role).toBe('reviewer');
    expect((await agent.patch(`/api/users/${adminUser.id}`).send({ active: false })).status).toBe(400);
    expect((await agent.patch(`/api/users/${adminUser.id}`).send({ role: 'planner' })).status).toBe(400);
    expect((await agent.patch(`/api/users/${u.id}`).send({ role: 'wizard' })).status).toBe(400);
  });
});
