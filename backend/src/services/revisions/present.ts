/** Revisions and review comments as the API shows them (staff see everything, clients the released summary). */
import { literal, Op, type FindAttributeOptions, type Transaction } from 'sequelize';
import { can } from '@shared/policy';
import { upgradeSnapshotNames, type RevisionSnapshot, type StoredRevisionSnapshot } from '@shared/schemas/revision';
import type { SessionUser } from '../../auth/passport';
import { Acknowledgement, MailDelivery, ReviewComment, Revision, User } from '../../models';
import { diffSnapshots, type DiffSide } from './diff';
import { loadSnapshotFloorPlan, readSnapshot } from './snapshot';

/**
 * What a revision list selects: the columns it shows and three figures read out of the snapshot
 * by the database (layout name, arm and finding counts); never the snapshot itself.
 */
export const REVISION_LIST_ATTRIBUTES: FindAttributeOptions = [
  'id',
  'layoutId',
  'projectId',
  'letter',
  'state',
  'checksum',
  'submittedBy',
  'submittedAt',
  'decidedBy',
  'decidedAt',
  'decisionComment',
  'releasedBy',
  'releasedAt',
  'planSheetChecksum',
  [literal(`"snapshot"->'layout'->>'name'`), 'layoutName'],
  [literal(`jsonb_array_length("snapshot"->'layout'->'content'->'arms')`), 'armCount'],
  [literal(`jsonb_array_length("snapshot"->'analysis'->'findings')`), 'findingCount'],
];

/** Layout name and counts of a revision: from its snapshot when loaded, else from the list's figures. */
function listFacts(r: Revision): { layoutName: string; arms: number; findings: number } {
  const snap = r.get('snapshot') as StoredRevisionSnapshot | undefined;
  if (snap) return { layoutName: snap.layout.name, arms: snap.layout.content.arms.length, findings: snap.analysis.findings.length };
  return { layoutName: String(r.get('layoutName')), arms: Number(r.get('armCount')), findings: Number(r.get('findingCount')) };
}

/** Display names of users by id (people removed since keep their id). */
export async function namesOf(ids: Array<number | null | undefined>, transaction?: Transaction): Promise<Map<number, string>> {
  const wanted = [...new Set(ids.filter((i): i is number => typeof i === 'number'))];
  if (!wanted.length) return new Map();
  const users = await User.findAll({ where: { id: wanted }, attributes: ['id', 'name'], transaction });
  return new Map(users.map((u) => [u.id, u.name]));
}

const person = (names: Map<number, string>, id: number | null | undefined) => (id == null ? null : { id, name: names.get(id) ?? 'Former user' });
const iso = (d: Date | null | undefined) => (d ? d.toISOString() : null);

/** The list/summary shape of revisions for staff (or the reduced one for clients). */
export async function presentRevisions(user: SessionUser, revs: Revision[]) {
  const ids = revs.map((r) => r.id);
  const acks = ids.length ? await Acknowledgement.findAll({ where: { revisionId: ids }, order: [['at', 'ASC']] }) : [];
  const names = await namesOf([...revs.flatMap((r) => [r.submittedBy, r.decidedBy, r.releasedBy]), ...acks.map((a) => a.userId)]);
  const staff = can(user.role, 'revision.readDrafts');
  return revs.map((r) => {
    const facts = listFacts(r);
    const mine = acks.filter((a) => a.revisionId === r.id);
    const base = {
      id: r.id,
      layoutId: r.layoutId,
      projectId: r.projectId,
      layoutName: facts.layoutName,
      letter: r.letter,
      state: r.state,
      releasedAt: iso(r.releasedAt),
      planSheetChecksum: r.planSheetChecksum ?? null,
    };
    if (!staff) {
      const own = mine.find((a) => a.userId === user.id);
      return { ...base, acknowledgedAt: iso(own?.at) };
    }
    return {
      ...base,
      checksum: r.checksum,
      submittedBy: person(names, r.submittedBy),
      submittedAt: r.submittedAt.toISOString(),
      decidedBy: person(names, r.decidedBy),
      decidedAt: iso(r.decidedAt),
      decisionComment: r.decisionComment ?? null,
      releasedBy: person(names, r.releasedBy),
      counts: { arms: facts.arms, findings: facts.findings },
      acknowledgements: mine.map((a) => ({ user: person(names, a.userId)!, at: a.at.toISOString() })),
    };
  });
}

/** A comment as the API shows it. */
export function presentComment(c: ReviewComment, names: Map<number, string>, letter?: string) {
  return {
    id: c.id,
    revisionId: c.revisionId,
    ...(letter ? { revisionLetter: letter } : {}),
    author: person(names, c.authorId),
    findingId: c.findingId,
    point: c.pointX != null && c.pointY != null ? { x: c.pointX, y: c.pointY } : null,
    body: c.body,
    resolved: c.resolved,
    resolvedBy: person(names, c.resolvedBy),
    resolvedAt: iso(c.resolvedAt),
    createdAt: c.createdAt.toISOString(),
  };
}

/**
 * What the diff reads of the revision before: its snapshot without the analysis but with its
 * findings (the regions are large and not compared), and its floor plan, loaded only when it is
 * not the same stored plan as the current revision's.
 */
async function diffSideOf(id: number, cur: RevisionSnapshot, curPlanChecksum: string | null): Promise<{ side: DiffSide; floorPlanChecksum: string | null } | null> {
  const row = (await Revision.findByPk(id, {
    attributes: [[literal(`"snapshot" - 'analysis'`), 'rest'], [literal(`"snapshot"->'analysis'->'findings'`), 'findings'], 'floorPlanChecksum'],
    raw: true,
  })) as unknown as { rest: Omit<StoredRevisionSnapshot, 'analysis'>; findings: RevisionSnapshot['analysis']['findings']; floorPlanChecksum: string | null } | null;
  if (!row) return null;
  const { floorPlan: inline, ...rest } = row.rest;
  const floorPlan =
    row.floorPlanChecksum && row.floorPlanChecksum === curPlanChecksum ? cur.floorPlan : row.floorPlanChecksum ? await loadSnapshotFloorPlan({ floorPlanChecksum: row.floorPlanChecksum, storedSnapshot: () => row.rest as StoredRevisionSnapshot }) : (inline ?? null);
  // Read under today's names, as the current side is (snapshots frozen under older ones keep their bytes).
  return { side: upgradeSnapshotNames({ ...rest, floorPlan, analysis: { findings: row.findings } }), floorPlanChecksum: row.floorPlanChecksum };
}

/** The whole revision for the review page (staff), or the client's reduced view. */
export async function presentRevisionDetail(user: SessionUser, rev: Revision) {
  const [summary] = await presentRevisions(user, [rev]);
  if (!can(user.role, 'revision.readDrafts')) return summary;
  const snap = await readSnapshot(rev);
  const earlier = await Revision.findAll({
    where: { layoutId: rev.layoutId, id: { [Op.lt]: rev.id } },
    attributes: ['id', 'letter'],
    order: [['id', 'DESC']],
  });
  const prev = earlier[0] ?? null;
  const prevSide = prev ? await diffSideOf(prev.id, snap, rev.floorPlanChecksum) : null;
  const comments = await ReviewComment.findAll({ where: { revisionId: rev.id }, order: [['createdAt', 'ASC'], ['id', 'ASC']] });
  const older = earlier.length
    ? await ReviewComment.findAll({ where: { revisionId: earlier.map((e) => e.id), findingId: { [Op.ne]: null } }, order: [['createdAt', 'ASC'], ['id', 'ASC']] })
    : [];
  const letters = new Map(earlier.map((e) => [e.id, e.letter]));
  const names = await namesOf([...comments, ...older].flatMap((c) => [c.authorId, c.resolvedBy]));
  const deliveries = await MailDelivery.findAll({ where: { revisionId: rev.id }, order: [['id', 'ASC']] });
  return {
    ...summary,
    snapshot: snap,
    comments: comments.map((c) => presentComment(c, names)),
    history: older.map((c) => presentComment(c, names, letters.get(c.revisionId))),
    diff: diffSnapshots(prevSide?.side ?? null, snap, prev ? { id: prev.id, letter: prev.letter } : null, {
      floorPlanChecksums: { before: prevSide?.floorPlanChecksum ?? null, after: rev.floorPlanChecksum ?? null },
    }),
    mail: deliveries.map((d) => ({ id: d.id, kind: d.kind, to: d.to, subject: d.subject, status: d.status, error: d.error, attempts: d.attempts, lastAttemptAt: iso(d.lastAttemptAt) })),
  };
}
