// Released revisions are records the client holds: a layout or project with submitted or released
// revisions cannot be deleted (the API says why, and the database refuses too); it is archived
// instead — hidden from lists, read-only, restorable by an admin.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Acknowledgement, AuditEvent, Layout, MailDelivery, Project, Revision } from '../../backend/src/models';
import { buildReleasedRevision } from '../support/revisionFixtures';
import { buildProject, buildUser, TEST_PASSWORD } from '../support/factories';
import { createTestApp, signedIn, type TestApp } from '../support/testApp';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => t.close());

const EMPTY = { arms: [], workPoints: [], boundaries: [], workHeights: [] };

async function projectWithRecords() {
  const client = await buildUser({ role: 'client' });
  const project = await buildProject({ members: [client] });
  const layout = await Layout.create({ projectId: project.id, floorPlanId: null, name: 'Released cell', content: EMPTY, createdBy: null });
  const { released, submitted } = await buildReleasedRevision(project.id, layout.id);
  await Acknowledgement.create({ revisionId: released.id, userId: client.id, at: new Date() } as never);
  return { client, project, layout, released, submitted };
}

describe('deleting what holds records', () => {
  it('refuses to delete a layout or a project with submitted or released revisions, and keeps every record', async () => {
    const planner = await buildUser({ role: 'planner' });
    const agent = await signedIn(t.app, planner.email, TEST_PASSWORD);
    const { project, layout, released } = await projectWithRecords();
    const delLayout = await agent.delete(`/api/layouts/${layout.id}`);
    expect(delLayout.status).toBe(409);
    expect(delLayout.body.error.message).toMatch(/archive/i);
    const delProject = await agent.delete(`/api/projects/${project.id}`);
    expect(delProject.status).toBe(409);
    expect(delProject.body.error.message).toMatch(/archive/i);
    expect(await Layout.findByPk(layout.id)).not.toBeNull();
    expect(await Project.findByPk(project.id)).not.toBeNull();
    const kept = await Revision.findByPk(released.id);
    expect(kept!.planSheet!.length).toBeGreaterThan(1000);
    expect(await Acknowledgement.count({ where: { revisionId: released.id } })).toBe(1);
    expect(await MailDelivery.count({ where: { revisionId: released.id } })).toBe(1);
  });

  it('has the database itself refuse deleting a layout or project that has revisions', async () => {
    const { project, layout } = await projectWithRecords();
    await expect(t.sequelize.query(`DELETE FROM layouts WHERE id = ${layout.id}`)).rejects.toThrow(/foreign key/i);
    await expect(t.sequelize.query(`DELETE FROM projects WHERE id = ${project.id}`)).rejects.toThrow(/foreign key/i);
    expect(await Revision.count({ where: { layoutId: layout.id } })).toBe(2);
  });

  it('still deletes a layout whose only revisions were sent back, and one without revisions', async () => {
    const planner = await buildUser({ role: 'planner' });
    const agent = await signedIn(t.app, planner.email, TEST_PASSWORD);
    const project = await buildProject();
    const plain = await Layout.create({ projectId: project.id, floorPlanId: null, name: 'Sketch', content: EMPTY, createdBy: null });
    expect((await agent.delete(`/api/layouts/${plain.id}`)).status).toBe(204);
    const returned = await Layout.create({ projectId: project.id, floorPlanId: null, name: 'Returned', content: EMPTY, createdBy: null });
    const { submitted, released } = await buildReleasedRevision(project.id, returned.id);
    await Revision.destroy({ where: { id: released.id } });
    await submitted.update({ state: 'returned', decidedAt: new Date() });
    expect((await agent.delete(`/api/layouts/${returned.id}`)).status).toBe(204);
    expect(await Revision.count({ where: { layoutId: returned.id } })).toBe(0);
    expect((await agent.delete(`/api/projects/${project.id}`)).status).toBe(204);
  });
});

describe('archive and restore', () => {
  it('archives a project: hidden from lists, read-only with a sentence, restored by an admin only', async () => {
    const planner = await buildUser({ role: 'planner' });
    const admin = await buildUser({ role: 'admin' });
    const p = await signedIn(t.app, planner.email, TEST_PASSWORD);
    const a = await signedIn(t.app, admin.email, TEST_PASSWORD);
    const { client, project, layout } = await projectWithRecords();
    const c = await signedIn(t.app, client.email, TEST_PASSWORD);

    const archived = await p.post(`/api/projects/${project.id}/archive`);
    expect(archived.status).toBe(200);
    expect(archived.body.project.archivedAt).toBeTypeOf('string');
    expect(await AuditEvent.count({ where: { action: 'project.archive', entityId: String(project.id) } })).toBe(1);

    const ids = (res: { body: { projects: Array<{ id: number }> } }) => res.body.projects.map((x) => x.id);
    expect(ids(await p.get('/api/projects'))).not.toContain(project.id);
    expect(ids(await c.get('/api/projects'))).not.toContain(project.id);
    expect(ids(await p.get('/api/projects?archived=1'))).toContain(project.id);
    // still readable
    expect((await p.get(`/api/projects/${project.id}`)).status).toBe(200);
    expect((await p.get(`/api/layouts/${layout.id}`)).status).toBe(200);
    // read-only
    const edit = await p.patch(`/api/projects/${project.id}`).send({ description: 'changed' });
    expect(edit.status).toBe(409);
    expect(edit.body.error.message).toMatch(/archived/i);
    expect((await p.post(`/api/projects/${project.id}/layouts`).send({ name: 'New one' })).status).toBe(409);
    expect((await p.put(`/api/layouts/${layout.id}`).send({ version: 1, name: 'Renamed' })).status).toBe(409);
    expect((await Project.findByPk(project.id))!.description).not.toBe('changed');

    expect((await p.post(`/api/projects/${project.id}/restore`)).status).toBe(403);
    const restored = await a.post(`/api/projects/${project.id}/restore`);
    expect(restored.status).toBe(200);
    expect(restored.body.project.archivedAt).toBeNull();
    expect(ids(await p.get('/api/projects'))).toContain(project.id);
    expect((await p.patch(`/api/projects/${project.id}`).send({ description: 'changed' })).status).toBe(200);
  });

  it('archives a layout: hidden from the project list, read-only, restorable', async () => {
    const planner = await buildUser({ role: 'planner' });
    const admin = await buildUser({ role: 'admin' });
    const p = await signedIn(t.app, planner.email, TEST_PASSWORD);
    const a = await signedIn(t.app, admin.email, TEST_PASSWORD);
    const { project, layout } = await projectWithRecords();
    const res = await p.post(`/api/layouts/${layout.id}/archive`);
    expect(res.status).toBe(200);
    expect(res.body.layout.archivedAt).toBeTypeOf('string');
    const ids = (r: { body: { layouts: Array<{ id: number }> } }) => r.body.layouts.map((x) => x.id);
    expect(ids(await p.get(`/api/projects/${project.id}/layouts`))).not.toContain(layout.id);
    expect(ids(await p.get(`/api/projects/${project.id}/layouts?archived=1`))).toContain(layout.id);
    const put = await p.put(`/api/layouts/${layout.id}`).send({ version: 1, name: 'Renamed' });
    expect(put.status).toBe(409);
    expect(put.body.error.message).toMatch(/archived/i);
    expect((await p.delete(`/api/layouts/${layout.id}`)).status).toBe(409);
    expect((await p.post(`/api/layouts/${layout.id}/restore`)).status).toBe(403);
    expect((await a.post(`/api/layouts/${layout.id}/restore`)).status).toBe(200);
    expect((await p.put(`/api/layouts/${layout.id}`).send({ version: 1, name: 'Renamed' })).status).toBe(200);
  });
});

describe('migrations', () => {
  it('undo the archiving and rate-limit migrations and apply them again', async () => {
    const { createMigrator } = await import('../../backend/src/db/migrate');
    const { QueryTypes } = await import('sequelize');
    const fkRule = async () =>
      (
        await t.sequelize.query<{ r: string }>(
          `SELECT confdeltype AS r FROM pg_constraint WHERE conrelid = 'revisions'::regclass AND contype = 'f' AND conname = 'revisions_layoutId_fkey'`,
          { type: QueryTypes.SELECT },
        )
      )[0]?.r;
    const columns = async () =>
      (await t.sequelize.query<{ c: string }>(`SELECT column_name AS c FROM information_schema.columns WHERE table_name = 'layouts'`, { type: QueryTypes.SELECT })).map((r) => r.c);
    expect(await fkRule()).toBe('r'); // PostgreSQL's pg_constraint: 'r' = RESTRICT, 'c' = CASCADE
    const migrator = createMigrator(t.sequelize);
    await migrator.down({ to: '20261202090000-create-rate-limit-hits' });
    expect(await fkRule()).toBe('c');
    expect(await columns()).not.toContain('archivedAt');
    const [tables] = await t.sequelize.query(`SELECT to_regclass('rate_limit_hits') AS t`);
    expect((tables as Array<{ t: string | null }>)[0].t).toBeNull();
    await migrator.up();
    expect(await fkRule()).toBe('r');
    expect(await columns()).toContain('archivedAt');
  });
});
