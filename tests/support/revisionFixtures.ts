// Revision rows for API tests that need one in a given state without walking the whole workflow.
import { createHash } from 'node:crypto';
import { Layout, MailDelivery, Revision } from '../../backend/src/models';
import { renderPlanSheet } from '../../backend/src/services/planSheet';
import { buildSnapshot, loadRevisionSheetInput, snapshotChecksum } from '../../backend/src/services/revisions';

/** On one layout: revision A released (with a really rendered sheet, mail delivered) and B submitted. */
export async function buildReleasedRevision(projectId: number, layoutId: number): Promise<{ released: Revision; submitted: Revision }> {
  const layout = await Layout.findByPk(layoutId);
  if (!layout || layout.projectId !== projectId) throw new Error('buildReleasedRevision: layout is not in the project');
  const snapshot = await buildSnapshot(layout);
  const at = new Date('2026-11-02T09:00:00Z');
  const released = await Revision.create({
    layoutId, projectId, letter: 'A', snapshot, checksum: snapshotChecksum(snapshot),
    state: 'released', submittedBy: null, submittedAt: at, decidedAt: at, releasedAt: at, sheetCreatedAt: at,
  });
  const pdf = await renderPlanSheet(await loadRevisionSheetInput(released), { size: 'A3', draft: false, createdAt: at });
  await released.update({ planSheet: pdf, planSheetChecksum: createHash('sha256').update(pdf).digest('hex') });
  await MailDelivery.create({ kind: 'release', revisionId: released.id, to: [], subject: 'fixture', status: 'sent', createdAt: at });
  const submitted = await Revision.create({
    layoutId, projectId, letter: 'B', snapshot, checksum: snapshotChecksum(snapshot),
    state: 'submitted', submittedBy: null, submittedAt: at,
  });
  return { released, submitted };
}

/**
 * Two revisions of a layout (A sent back, B submitted) stored the way rows were written before
 * floor plans were kept apart: the whole snapshot, floor plan inside, in the row.
 */
export async function makeInlineRevisions(layout: Layout): Promise<number[]> {
  const snapshot = await buildSnapshot(layout);
  const at = new Date('2026-11-02T09:00:00Z');
  const base = { layoutId: layout.id, projectId: layout.projectId, snapshot, checksum: snapshotChecksum(snapshot), submittedBy: null, submittedAt: at };
  const a = await Revision.create({ ...base, letter: 'A', state: 'returned', decidedAt: at });
  const b = await Revision.create({ ...base, letter: 'B', state: 'submitted' });
  return [a.id, b.id];
}
