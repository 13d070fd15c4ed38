// Stored data under the product's older names: the migration renames what may change (working
// copies, floor plans, saved layer roles, revision states, audit actions), and frozen snapshots keep
// their bytes (their checksums still verify) while every page reads them under today's names.
import { createHash } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { canonicalJson } from '@shared/canonicalJson';
import { AuditEvent, Layout, Revision } from '../../backend/src/models';
import { buildSnapshot, fullSnapshot, readSnapshot, snapshotChecksum } from '../../backend/src/services/revisions';
import { buildProject, buildUser, TEST_PASSWORD } from '../support/factories';
import { createTestApp, signedIn, type TestApp } from '../support/testApp';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => t.close());

const FENCE = { id: 'F1', kind: 'fence', label: 'Cell fence', height: 1400, points: [[0, 0], [4000, 0], [4000, 3000]] };

describe('one vocabulary in stored data', () => {
  it('the migration renames working copies, layer roles, states and audit actions, and its down puts them back', async () => {
    const migration = await import('../../backend/src/db/migrations/20261202100000-one-vocabulary');
    const qi = t.sequelize.getQueryInterface();
    const project = await buildProject();
    const layout = await Layout.create({ projectId: project.id, floorPlanId: null, name: 'Old names', content: { arms: [], workPoints: [], boundaries: [FENCE], workHeights: [] }, createdBy: null });
    const snapshot = await buildSnapshot(layout);
    const rev = await Revision.create({ layoutId: layout.id, projectId: project.id, letter: 'A', snapshot, checksum: snapshotChecksum(snapshot), state: 'returned', submittedBy: null, submittedAt: new Date(), decidedAt: new Date() });
    const ev = await AuditEvent.create({ userId: null, action: 'revision.return', entity: 'revision', entityId: rev.id, details: {}, at: new Date() } as never);
    await t.sequelize.query(`INSERT INTO project_layer_roles ("projectId", layers, "createdAt", "updatedAt") VALUES (:id, :layers, now(), now())`, {
      replacements: { id: project.id, layers: JSON.stringify([{ name: 'OUTLINE', role: 'outline', height: null }, { name: 'WALLS', role: 'wall', height: 2400 }]) },
    });
    const content = async () => (await t.sequelize.query<{ c: Record<string, unknown> }>(`SELECT content AS c FROM layouts WHERE id = :id`, { replacements: { id: layout.id }, type: QueryTypes.SELECT }))[0].c;
    const roles = async () => (await t.sequelize.query<{ l: Array<{ role: string }> }>(`SELECT layers AS l FROM project_layer_roles WHERE "projectId" = :id`, { replacements: { id: project.id }, type: QueryTypes.SELECT }))[0].l.map((l) => l.role);

    await migration.down({ context: qi });
    expect(Object.keys(await content())).toContain('zones');
    expect(Object.keys(await content())).not.toContain('boundaries');
    expect(await roles()).toEqual(['boundary', 'wall']);
    expect((await Revision.findByPk(rev.id))!.state).toBe('changes_requested');
    expect((await AuditEvent.findByPk(ev.get('id') as number))!.action).toBe('revision.request_changes');

    await migration.up({ context: qi });
    expect((await content()).boundaries).toEqual([FENCE]);
    expect(Object.keys(await content())).not.toContain('zones');
    expect(await roles()).toEqual(['outline', 'wall']);
    expect((await Revision.findByPk(rev.id))!.state).toBe('returned');
    expect((await AuditEvent.findByPk(ev.get('id') as number))!.action).toBe('revision.return');
  });

  it('a snapshot frozen under the old names keeps its checksum and reads under the new ones on the review page', async () => {
    const reviewer = await buildUser({ role: 'reviewer' });
    const project = await buildProject({ members: [reviewer] });
    const layout = await Layout.create({ projectId: project.id, floorPlanId: null, name: 'Frozen old', content: { arms: [], workPoints: [], boundaries: [FENCE], workHeights: [] }, createdBy: null });
    const current = await buildSnapshot(layout);
    // The same snapshot as it was written before the rename: `zones` in the content, `overlaps` in the analysis.
    const { boundaries, ...contentRest } = current.layout.content;
    const { sharedZones, ...analysisRest } = current.analysis;
    const old = { ...current, layout: { ...current.layout, content: { ...contentRest, zones: boundaries } }, analysis: { ...analysisRest, overlaps: sharedZones } };
    const checksum = createHash('sha256').update(canonicalJson(old)).digest('hex');
    const rev = await Revision.create({ layoutId: layout.id, projectId: project.id, letter: 'A', snapshot: old as never, checksum, state: 'submitted', submittedBy: null, submittedAt: new Date() });

    const row = (await Revision.findByPk(rev.id))!;
    // Stored bytes unchanged: the checksum is over them, and the row still verifies.
    expect(createHash('sha256').update(canonicalJson(await fullSnapshot(row))).digest('hex')).toBe(checksum);
    expect(Object.keys((await fullSnapshot(row)).layout.content)).toContain('zones');
    const read = await readSnapshot(row);
    expect(read.layout.content.boundaries).toEqual([FENCE]);
    expect(read.analysis.sharedZones).toEqual([]);

    const agent = await signedIn(t.app, reviewer.email, TEST_PASSWORD);
    const res = await agent.get(`/api/revisions/${rev.id}`);
    expect(res.status).toBe(200);
    const text = JSON.stringify(res.body);
    expect(text).not.toMatch(/"zones"|"overlaps"/);
    expect(text).toContain('"boundaries"');
  });
});
