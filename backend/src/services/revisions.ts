/**
 * Revisions: immutable snapshots of a layout (content, its analysis, the floor plan and the arm
 * models' parameters) with a sha256 checksum of the canonical JSON, the review decision, and the
 * sheet input built from the snapshot (never from the live layout).
 */
import { createHash } from 'node:crypto';
import { Op, type Sequelize } from 'sequelize';
import type { AnalysisResult, Finding } from '@shared/analysis/types';
import { can } from '@shared/policy';
import type { LayoutContent } from '@shared/schemas/layout';
import type { SessionUser } from '../auth/passport';
import { badRequest, conflict, forbidden, notFound } from '../http/errors';
import { Acknowledgement, ArmModel, FloorPlan, Layout, MailDelivery, Project, ReviewComment, Revision, User } from '../models';
import type { RevisionState } from '../models/Revision';
import { audit } from './audit/audit';
import { analyzeLayout } from './layoutAnalysis';
import type { PlanSheetInput } from './planSheet/types';
import { canSeeProject } from './projectAccess';
import { decidedMail, deliver, submittedMail, type MailContext, type RevisionMailFacts } from './reviewMail';

export interface RevisionSnapshot {
  project: { id: number; name: string; clientName: string | null; siteName: string | null };
  layout: { id: number; name: string; version: number; content: LayoutContent };
  floorPlan: { id: number; fileName: string; units: string; geometry: unknown; layers: unknown[]; bounds: { minX: number; minY: number; maxX: number; maxY: number } } | null;
  models: Array<{ id: number; name: string; family: string; params: Record<string, unknown> }>;
  analysis: AnalysisResult;
}

/** JSON with object keys sorted at every level (arrays keep their order): the form the checksum covers. */
export function canonicalJson(value: unknown): string {
  if (value === null || typeof value !== 'object') return JSON.stringify(value) ?? 'null';
  if (Array.isArray(value)) return `[${value.map((v) => (v === undefined ? 'null' : canonicalJson(v))).join(',')}]`;
  const entries = Object.keys(value as Record<string, unknown>)
    .filter((k) => (value as Record<string, unknown>)[k] !== undefined)
    .sort()
    .map((k) => `${JSON.stringify(k)}:${canonicalJson((value as Record<string, unknown>)[k])}`);
  return `{${entries.join(',')}}`;
}

/** sha256 (hex) of the canonical JSON of a snapshot. */
export function snapshotChecksum(snapshot: unknown): string {
  return createHash('sha256').update(canonicalJson(snapshot)).digest('hex');
}

/** The n-th revision letter, 0-based: A … Z, AA … AZ, BA … (bijective base 26). */
export function revisionLetter(index: number): string {
  if (!Number.isInteger(index) || index < 0) throw new Error('revisionLetter: index must be a non-negative integer');
  let n = index + 1;
  let s = '';
  while (n > 0) {
    const r = (n - 1) % 26;
    s = String.fromCharCode(65 + r) + s;
    n = Math.floor((n - 1) / 26);
  }
  return s;
}

/** Freezes a layout as stored now into a snapshot (JSON-normalised, so it reads back identically). */
export async function buildSnapshot(layout: Layout): Promise<RevisionSnapshot> {
  const content = layout.content as LayoutContent;
  const project = await Project.findByPk(layout.projectId);
  if (!project) throw notFound('Project');
  const fp = layout.floorPlanId ? await FloorPlan.findByPk(layout.floorPlanId, { attributes: ['id', 'fileName', 'units', 'geometry', 'layers', 'bounds'] }) : null;
  const ids = [...new Set(content.arms.map((a) => a.armModelId))];
  const models = await ArmModel.findAll({ where: { id: ids }, attributes: ['id', 'name', 'family', 'params'], order: [['id', 'ASC']] });
  const analysis = await analyzeLayout(layout);
  const raw: RevisionSnapshot = {
    project: { id: project.id, name: project.name, clientName: project.clientName ?? null, siteName: project.siteName ?? null },
    layout: { id: layout.id, name: layout.name, version: layout.version, content },
    floorPlan: fp ? { id: fp.id, fileName: fp.fileName, units: fp.units, geometry: fp.geometry, layers: fp.layers, bounds: fp.bounds } : null,
    models: models.map((m) => ({ id: m.id, name: m.name, family: m.family, params: m.params })),
    analysis,
  };
  return JSON.parse(JSON.stringify(raw)) as RevisionSnapshot;
}

/** Loads a revision the user may see, or 404: clients only released revisions of member projects. */
export async function loadVisibleRevision(user: SessionUser, id: number): Promise<Revision> {
  const rev = await Revision.findByPk(id, { attributes: { exclude: ['planSheet'] } });
  if (!rev || !(await canSeeProject(user, rev.projectId))) throw notFound('Revision');
  if (!can(user.role, 'revision.readDrafts') && rev.state !== 'released') throw notFound('Revision');
  return rev;
}

async function namesOf(ids: Array<number | null | undefined>): Promise<Map<number, string>> {
  const wanted = [...new Set(ids.filter((i): i is number => typeof i === 'number'))];
  if (!wanted.length) return new Map();
  const users = await User.findAll({ where: { id: wanted }, attributes: ['id', 'name'] });
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
    const snap = r.snapshot as unknown as RevisionSnapshot;
    const mine = acks.filter((a) => a.revisionId === r.id);
    const base = {
      id: r.id,
      layoutId: r.layoutId,
      projectId: r.projectId,
      layoutName: snap.layout.name,
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
      counts: { arms: snap.layout.content.arms.length, findings: snap.analysis.findings.length },
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

export interface RevisionDiff {
  previous: { id: number; letter: string } | null;
  arms: {
    added: Array<{ id: string; x: number; y: number }>;
    removed: Array<{ id: string; x: number; y: number }>;
    /** distance = plan distance between the two base positions, mm; yaw change in degrees. */
    moved: Array<{ id: string; from: [number, number]; to: [number, number]; distance: number; yawChange: number }>;
  };
  findings: { added: Array<Pick<Finding, 'id' | 'severity' | 'message'>>; removed: Array<Pick<Finding, 'id' | 'severity' | 'message'>> };
}

/** Moves smaller than this (mm) or turns smaller than this (deg) are rounding, not changes. */
const MOVE_EPS_MM = 0.5;
const YAW_EPS_DEG = 0.01;

/** Arms added/removed/moved (Euclidean plan distance, yaw change wrapped to ±180°) and findings new/gone by id. */
export function diffSnapshots(prev: RevisionSnapshot | null, cur: RevisionSnapshot, previous: RevisionDiff['previous']): RevisionDiff {
  const before = new Map((prev?.layout.content.arms ?? []).map((a) => [a.id, a]));
  const after = new Map(cur.layout.content.arms.map((a) => [a.id, a]));
  const diff: RevisionDiff = { previous, arms: { added: [], removed: [], moved: [] }, findings: { added: [], removed: [] } };
  if (!prev) return diff;
  for (const [id, a] of after) {
    const b = before.get(id);
    if (!b) {
      diff.arms.added.push({ id, x: a.x, y: a.y });
      continue;
    }
    const distance = Math.hypot(a.x - b.x, a.y - b.y);
    const yawChange = ((((a.yaw - b.yaw) % 360) + 540) % 360) - 180;
    if (distance > MOVE_EPS_MM || Math.abs(yawChange) > YAW_EPS_DEG) diff.arms.moved.push({ id, from: [b.x, b.y], to: [a.x, a.y], distance, yawChange });
  }
  for (const [id, b] of before) if (!after.has(id)) diff.arms.removed.push({ id, x: b.x, y: b.y });
  const fBefore = new Map(prev.analysis.findings.map((f) => [f.id, f]));
  const fAfter = new Map(cur.analysis.findings.map((f) => [f.id, f]));
  const pick = (f: Finding) => ({ id: f.id, severity: f.severity, message: f.message });
  for (const [id, f] of fAfter) if (!fBefore.has(id)) diff.findings.added.push(pick(f));
  for (const [id, f] of fBefore) if (!fAfter.has(id)) diff.findings.removed.push(pick(f));
  return diff;
}

/** The whole revision for the review page (staff), or the client's reduced view. */
export async function presentRevisionDetail(user: SessionUser, rev: Revision) {
  const [summary] = await presentRevisions(user, [rev]);
  if (!can(user.role, 'revision.readDrafts')) return summary;
  const snap = rev.snapshot as unknown as RevisionSnapshot;
  const earlier = await Revision.findAll({
    where: { layoutId: rev.layoutId, id: { [Op.lt]: rev.id } },
    attributes: ['id', 'letter', 'snapshot'],
    order: [['id', 'DESC']],
  });
  const prev = earlier[0] ?? null;
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
    diff: diffSnapshots(prev ? (prev.snapshot as unknown as RevisionSnapshot) : null, snap, prev ? { id: prev.id, letter: prev.letter } : null),
    mail: deliveries.map((d) => ({ id: d.id, kind: d.kind, to: d.to, subject: d.subject, status: d.status, error: d.error, attempts: d.attempts, lastAttemptAt: iso(d.lastAttemptAt) })),
  };
}

function mailFacts(rev: Revision): RevisionMailFacts {
  const snap = rev.snapshot as unknown as RevisionSnapshot;
  return { projectName: snap.project.name, projectId: rev.projectId, revisionId: rev.id, layoutName: snap.layout.name, letter: rev.letter };
}

/** Freezes the layout into the next revision (state submitted); 409 while another one is open. Mails the reviewers. */
export async function submitRevision(sequelize: Sequelize, user: SessionUser, layoutId: number, mail: MailContext, now: Date): Promise<Revision> {
  const rev = await sequelize.transaction(async (transaction) => {
    const layout = await Layout.findByPk(layoutId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!layout) throw notFound('Layout');
    const open = await Revision.findOne({ where: { layoutId, state: 'submitted' }, attributes: ['id', 'letter'], transaction });
    if (open) throw conflict(`Revision ${open.letter} of this layout is still waiting for review; a new one can be submitted once it is decided.`, { openRevisionId: open.id });
    const count = await Revision.count({ where: { layoutId }, transaction });
    const snapshot = await buildSnapshot(layout);
    const r = await Revision.create(
      {
        layoutId,
        projectId: layout.projectId,
        letter: revisionLetter(count),
        snapshot: snapshot as unknown as Record<string, unknown>,
        checksum: snapshotChecksum(snapshot),
        state: 'submitted',
        submittedBy: user.id,
        submittedAt: now,
      },
      { transaction },
    );
    await audit(user.id, 'revision.submit', 'revision', r.id, { layoutId, letter: r.letter, checksum: r.checksum, layoutVersion: layout.version }, transaction);
    return r;
  });
  const reviewers = await User.findAll({ where: { role: 'reviewer', active: true }, attributes: ['email'], order: [['id', 'ASC']] });
  await deliver(mail, 'submitted', rev.id, submittedMail(mail, mailFacts(rev), reviewers.map((u) => u.email), user.name), now);
  return rev;
}

/** Approves or sends back a submitted revision (reviewer; never one they submitted). Mails the submitter. */
export async function decideRevision(
  sequelize: Sequelize,
  user: SessionUser,
  id: number,
  input: { decision: 'approve' | 'request_changes'; comment: string },
  mail: MailContext,
  now: Date,
): Promise<Revision> {
  if (input.decision === 'request_changes' && !input.comment.trim()) throw badRequest('Say what needs to change.', { comment: 'A comment is required to request changes' });
  const rev = await sequelize.transaction(async (transaction) => {
    const r = await Revision.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE, attributes: { exclude: ['planSheet'] } });
    if (!r) throw notFound('Revision');
    if (r.submittedBy === user.id) throw forbidden('You submitted this revision; another reviewer must decide it.');
    if (r.state !== 'submitted') throw conflict(`Revision ${r.letter} was already decided (${r.state.replace('_', ' ')}).`);
    const state: RevisionState = input.decision === 'approve' ? 'approved' : 'changes_requested';
    await r.update({ state, decidedBy: user.id, decidedAt: now, decisionComment: input.comment.trim() || null }, { transaction });
    await audit(user.id, `revision.${input.decision === 'approve' ? 'approve' : 'request_changes'}`, 'revision', r.id, { letter: r.letter, comment: input.comment.trim() }, transaction);
    return r;
  });
  const submitter = rev.submittedBy ? await User.findByPk(rev.submittedBy, { attributes: ['email'] }) : null;
  await deliver(mail, 'decided', rev.id, decidedMail(mail, mailFacts(rev), submitter ? [submitter.email] : [], user.name, input.decision, input.comment.trim()), now);
  return rev;
}

/** The plan-sheet input of a revision, from its frozen snapshot (never the live layout). */
export async function loadRevisionSheetInput(revision: Revision): Promise<PlanSheetInput> {
  const snap = revision.snapshot as unknown as RevisionSnapshot;
  const rows = await Revision.findAll({
    where: { layoutId: revision.layoutId, id: { [Op.lte]: revision.id } },
    attributes: ['id', 'letter', 'state', 'submittedBy', 'submittedAt', 'decidedBy', 'decidedAt', 'decisionComment', 'releasedBy', 'releasedAt'],
    order: [['id', 'ASC']],
  });
  // The sheet's own row shows the state it is being rendered in (the caller may be releasing it now).
  const self = rows.find((r) => r.id === revision.id);
  if (self) Object.assign(self, { state: revision.state, releasedAt: revision.releasedAt, releasedBy: revision.releasedBy });
  const names = await namesOf(rows.flatMap((r) => [r.submittedBy, r.decidedBy, r.releasedBy]));
  const nm = (id: number | null | undefined) => (id == null ? null : (names.get(id) ?? 'Former user'));
  const history = rows.map((r) => {
    const at = r.releasedAt ?? r.decidedAt ?? r.submittedAt;
    const by = r.releasedAt ? nm(r.releasedBy) : r.decidedAt ? nm(r.decidedBy) : nm(r.submittedBy);
    return { letter: r.letter, state: r.state, at, by, note: r.decisionComment ?? null };
  });
  const fp = snap.floorPlan;
  return {
    project: { name: snap.project.name, clientName: snap.project.clientName, siteName: snap.project.siteName },
    layout: { id: snap.layout.id, name: snap.layout.name, content: snap.layout.content },
    floorPlan: fp ? { geometry: fp.geometry as NonNullable<PlanSheetInput['floorPlan']>['geometry'], layers: fp.layers as NonNullable<PlanSheetInput['floorPlan']>['layers'], bounds: fp.bounds } : null,
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
