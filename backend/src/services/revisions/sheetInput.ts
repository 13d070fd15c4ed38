/** What the plan sheet of a revision shows: its snapshot and the revision history up to it. */
import { Op, type Transaction } from 'sequelize';
import { Revision } from '../../models';
import type { PlanSheetInput } from '../planSheet/types';
import { namesOf } from './present';
import { loadSnapshotFloorPlan } from './snapshot';

/** The plan-sheet input of a revision, from its frozen snapshot (never the live layout); reads inside `transaction` when given. */
export async function loadRevisionSheetInput(revision: Revision, transaction?: Transaction): Promise<PlanSheetInput> {
  const snap = revision.snapshot;
  const rows = await Revision.findAll({
    where: { layoutId: revision.layoutId, id: { [Op.lte]: revision.id } },
    attributes: ['id', 'letter', 'state', 'submittedBy', 'submittedAt', 'decidedBy', 'decidedAt', 'decisionComment', 'releasedBy', 'releasedAt'],
    order: [['id', 'ASC']],
    transaction,
  });
  // The sheet's own row shows the state it is being rendered in (the caller may be releasing it now).
  const self = rows.find((r) => r.id === revision.id);
  if (self) Object.assign(self, { state: revision.state, releasedAt: revision.releasedAt, releasedBy: revision.releasedBy });
  const names = await namesOf(rows.flatMap((r) => [r.submittedBy, r.decidedBy, r.releasedBy]), transaction);
  const nm = (id: number | null | undefined) => (id == null ? null : (names.get(id) ?? 'Former user'));
  const history = rows.map((r) => {
    const at = r.releasedAt ?? r.decidedAt ?? r.submittedAt;
    const by = r.releasedAt ? nm(r.releasedBy) : r.decidedAt ? nm(r.decidedBy) : nm(r.submittedBy);
    return { letter: r.letter, state: r.state, at, by, note: r.decisionComment ?? null };
  });
  const fp = await loadSnapshotFloorPlan(revision, transaction);
  return {
    project: { name: snap.project.name, clientName: snap.project.clientName, siteName: snap.project.siteName },
    layout: { id: snap.layout.id, name: snap.layout.name, content: snap.layout.content },
    floorPlan: fp ? { geometry: fp.geometry, layers: fp.layers, bounds: fp.bounds } : null,
    analysis: snap.analysis,
    models: snap.models,
    revision: {
      letter: revision.letter,
      state: revision.state,
      submittedBy: nm(revision.submittedBy),
      decidedBy: nm(revision.decidedBy),
      decidedAt: revision.decidedAt ?? null,
      releasedAt: revision.releasedAt ?? null,
    },
    history,
    drawnBy: nm(revision.submittedBy) ?? 'Unknown',
    reviewedBy: nm(revision.decidedBy),
  };
}
