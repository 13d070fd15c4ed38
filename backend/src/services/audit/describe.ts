/**
 * Audit events in words for the admin page: looks up, in one query per kind, the names of
 * everything a page of events refers to (shared/audit's `auditRefs`) and words each event with
 * shared/audit's `describeAuditEvent`. Items that are gone read "(removed)" there.
 */
import { auditRefs, describeAuditEvent, type AuditEventInput, type AuditEventWords, type AuditRefKind } from '@shared/audit';
import { ArmModel, FloorPlan, Invitation, Layout, Project, ReviewComment, Revision, User } from '../../models';

const ids = (list: string[]) => [...new Set(list.filter((s) => /^[1-9]\d{0,15}$/.test(s)).map(Number))];

/** Names by kind and id for every reference of the events. */
async function lookupNames(events: AuditEventInput[]): Promise<Map<string, string>> {
  const wanted = new Map<AuditRefKind, string[]>();
  for (const e of events) for (const [kind, id] of auditRefs(e)) wanted.set(kind, [...(wanted.get(kind) ?? []), id]);
  const want = (...kinds: AuditRefKind[]) => ids(kinds.flatMap((k) => wanted.get(k) ?? []));
  const names = new Map<string, string>();
  const put = (kind: AuditRefKind, id: number, name: string) => names.set(`${kind}:${id}`, name);

  const comments = await ReviewComment.findAll({ where: { id: want('comment', 'commentRevision') }, attributes: ['id', 'revisionId'] });
  const revisions = await Revision.findAll({ where: { id: [...want('revision', 'revisionLayout'), ...comments.map((c) => c.revisionId)] }, attributes: ['id', 'letter', 'layoutId'] });
  const layoutIds = [...want('layout'), ...revisions.map((r) => r.layoutId)];
  const [layouts, projects, plans, models, users, invitations] = await Promise.all([
    Layout.findAll({ where: { id: layoutIds }, attributes: ['id', 'name'] }),
    Project.findAll({ where: { id: want('project') }, attributes: ['id', 'name'] }),
    FloorPlan.findAll({ where: { id: want('floorPlan') }, attributes: ['id', 'fileName'] }),
    ArmModel.findAll({ where: { id: want('armModel') }, attributes: ['id', 'name'] }),
    User.findAll({ where: { id: want('user') }, attributes: ['id', 'name'] }),
    Invitation.findAll({ where: { id: want('invitation') }, attributes: ['id', 'email'] }),
  ]);
  const layoutName = new Map(layouts.map((l) => [l.id, l.name]));
  for (const l of layouts) put('layout', l.id, l.name);
  for (const r of revisions) {
    put('revision', r.id, r.letter);
    const name = layoutName.get(r.layoutId);
    if (name) put('revisionLayout', r.id, name);
  }
  const letter = new Map(revisions.map((r) => [r.id, r.letter]));
  for (const c of comments) {
    const l = letter.get(c.revisionId);
    if (l) put('commentRevision', c.id, l);
  }
  for (const p of projects) put('project', p.id, p.name);
  for (const f of plans) put('floorPlan', f.id, f.fileName);
  for (const m of models) put('armModel', m.id, m.name);
  for (const u of users) put('user', u.id, u.name);
  for (const i of invitations) put('invitation', i.id, i.email);
  return names;
}

/** Each event in words, in the order given. */
export async function describeAuditEvents(events: AuditEventInput[]): Promise<AuditEventWords[]> {
  const names = await lookupNames(events);
  return events.map((e) => describeAuditEvent(e, (kind, id) => names.get(`${kind}:${id}`)));
}
