/**
 * The audit log in words: what each recorded action is called, what each kind of item is called,
 * how an item is named (by its name or letter, never its bare id) and how the stored details read
 * as a list of changes. One table for the admin page (its filters too) and the server's describer
 * (backend/src/services/audit/describe.ts); `audit()` accepts only the actions named here.
 * Pure: the caller looks up names of the items an event refers to (`auditRefs` says which).
 */
import { DEVICE_TEXT } from '@shared/analysis';
import { fieldLabel, withUnit } from '@shared/schemas/labels';
import { APPROACH_LABEL, BOUNDARY_KIND_WORD, familyLabel } from '@shared/words';

/** Kinds of item an audit event is about, as the page names them. */
export const AUDIT_KIND_LABEL = {
  project: 'Project',
  floorPlan: 'Floor plan',
  layout: 'Cell layout',
  revision: 'Revision',
  comment: 'Comment',
  armModel: 'Arm model',
  user: 'Account',
  invitation: 'Invitation',
} as const;
export type AuditEntity = keyof typeof AUDIT_KIND_LABEL;

/** What an action's phrase may name: the revision letter (revisions, and the revision a comment is on). */
export interface PhraseCtx {
  letter: string | null;
}
type Phrase = (c: PhraseCtx) => string;
const plain =
  (text: string): Phrase =>
  () =>
    text;
/** "Signed off revision B"; "Signed off a revision" where the letter is not known (the filter lists). */
const onRevision =
  (verb: string, after = ''): Phrase =>
  (c) =>
    `${verb} ${c.letter ? `revision ${c.letter}` : 'a revision'}${after}`;

/** Every action the server records, as a short sentence of what was done. */
export const AUDIT_ACTION_WORDS = {
  'auth.login': plain('Signed in'),
  'auth.logout': plain('Signed out'),
  'auth.login_failed': plain('Failed sign-in'),
  'user.create': plain('Created an account'),
  'user.update': plain('Edited an account'),
  'invitation.create': plain('Sent an invitation'),
  'invitation.accept': plain('Accepted an invitation'),
  'invitation.revoke': plain('Withdrew an invitation'),
  'project.create': plain('Created project'),
  'project.update': plain('Edited project'),
  'project.delete': plain('Deleted project'),
  'project.archive': plain('Archived project'),
  'project.restore': plain('Restored project'),
  'project.member.add': plain('Added a project member'),
  'project.member.remove': plain('Removed a project member'),
  'project.layerRoles': plain('Saved the layer roles of the project'),
  'floorPlan.create': plain('Uploaded floor plan'),
  'floorPlan.update': plain('Edited floor plan'),
  'floorPlan.delete': plain('Deleted floor plan'),
  'layout.create': plain('Created cell layout'),
  'layout.update': plain('Edited cell layout'),
  'layout.delete': plain('Deleted cell layout'),
  'layout.archive': plain('Archived cell layout'),
  'layout.restore': plain('Restored cell layout'),
  'revision.submit': onRevision('Submitted'),
  'revision.sign_off': onRevision('Signed off'),
  'revision.return': onRevision('Returned', ' for changes'),
  'revision.release': onRevision('Released'),
  'revision.release_mail_retry': onRevision('Sent the release mail again for'),
  'revision.acknowledge': onRevision('Confirmed receipt of'),
  'comment.create': onRevision('Commented on'),
  'comment.resolve': onRevision('Resolved a comment on'),
  'comment.reopen': onRevision('Reopened a comment on'),
  'armModel.create': plain('Added arm model'),
  'armModel.update': plain('Edited arm model'),
  'armModel.delete': plain('Deleted arm model'),
  'armModel.builtIn.create': plain('Added built-in arm model'),
  'armModel.builtIn.update': plain('Updated built-in arm model'),
  'demo.seed': plain('Set up the demo project'),
} as const satisfies Record<string, Phrase>;
export type AuditAction = keyof typeof AUDIT_ACTION_WORDS;

/** Every action code, in the table's order. */
export const AUDIT_ACTIONS = Object.keys(AUDIT_ACTION_WORDS) as AuditAction[];

const isAction = (a: string): a is AuditAction => Object.prototype.hasOwnProperty.call(AUDIT_ACTION_WORDS, a);
const isEntity = (e: string): e is AuditEntity => Object.prototype.hasOwnProperty.call(AUDIT_KIND_LABEL, e);

/** Groups of actions the filter offers ("any revision action"), by the code's first part. */
export const AUDIT_ACTION_GROUP_LABEL: Record<string, string> = {
  auth: 'Any sign-in or sign-out',
  user: 'Any account action',
  invitation: 'Any invitation action',
  project: 'Any project action',
  floorPlan: 'Any floor plan action',
  layout: 'Any cell layout action',
  revision: 'Any revision action',
  comment: 'Any comment action',
  armModel: 'Any arm model action',
  demo: 'Any demo action',
};

/** Headings of the action groups that are no item kind. */
const GROUP_HEADING: Record<string, string> = { auth: 'Signing in', demo: 'Demo' };

/** An option of a filter select: the stored code it filters by and its words. */
export interface AuditOption {
  value: string;
  label: string;
}

/**
 * The page's action filter: one group per item kind (its heading from the kind's label), first
 * "any … action" (value ending in ".": the server matches the prefix), then each action.
 */
export function auditActionGroups(): Array<{ label: string; options: AuditOption[] }> {
  const out: Array<{ key: string; label: string; options: AuditOption[] }> = [];
  for (const a of AUDIT_ACTIONS) {
    const key = a.split('.')[0];
    let g = out.find((x) => x.key === key);
    if (!g) {
      g = { key, label: isEntity(key) ? AUDIT_KIND_LABEL[key] : (GROUP_HEADING[key] ?? humanWords(key)), options: [{ value: `${key}.`, label: AUDIT_ACTION_GROUP_LABEL[key] ?? `Any ${humanWords(key).toLowerCase()} action` }] };
      out.push(g);
    }
    g.options.push({ value: a, label: AUDIT_ACTION_WORDS[a]({ letter: null }) });
  }
  return out.map(({ label, options }) => ({ label, options }));
}

/** The options of the page's item-kind filter. */
export const auditKindOptions = (): AuditOption[] =>
  (Object.keys(AUDIT_KIND_LABEL) as AuditEntity[]).map((k) => ({ value: k, label: AUDIT_KIND_LABEL[k] }));

// ---------------------------------------------------------------------------------------------
// Readable words made from stored codes the table does not know (older or newer rows).

/**
 * A code ("floorPlan.reProcess", "bytes_sent") as plain words ("Floor plan re process"): letters
 * and digits only, camel case and separators split, at most 60 characters. Stored words of the
 * older vocabulary read as today's (the boundaries of a cell layout were once stored as zones).
 */
export function humanWords(code: string): string {
  const words = code
    .replace(/[^A-Za-z0-9]+/g, ' ')
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .trim()
    .toLowerCase()
    .replace(/\bzones\b/g, 'boundaries')
    .replace(/\bzone\b/g, 'boundary')
    .slice(0, 60)
    .trim();
  return words ? words[0].toUpperCase() + words.slice(1) : 'Other';
}

/** An item kind in words ("floorPlan" → "Floor plan"); a kind the table lacks is made readable. */
export function auditKindLabel(entity: string): string {
  return isEntity(entity) ? AUDIT_KIND_LABEL[entity] : humanWords(entity);
}

/** An action as a sentence; an action the table lacks reads as its item kind and the rest of its code. */
export function auditActionPhrase(action: string, c: PhraseCtx = { letter: null }): string {
  if (isAction(action)) return AUDIT_ACTION_WORDS[action](c);
  const [head, ...rest] = action.split('.');
  const what = rest.length ? humanWords(rest.join(' ')).toLowerCase() : '';
  return what ? `${auditKindLabel(head)}: ${what}` : humanWords(head);
}

// ---------------------------------------------------------------------------------------------
// What a cell layout edit stored: the changes from the version before (layoutChanges on the server).

/** The lists of a cell layout whose elements a change can name. */
export type LayoutList = 'arms' | 'boundaries' | 'workPoints';

/** One change of a cell layout edit, as stored in the `layout.update` event's `changes`. */
export type LayoutChange =
  | { what: 'name'; from: string; to: string }
  | { what: 'floorPlan'; from: number | null; to: number | null }
  | { what: 'workHeights'; from: number[]; to: number[] }
  | { what: 'count'; list: LayoutList; from: number; to: number }
  | { what: 'added' | 'removed'; list: LayoutList; id: string; kind?: string }
  /** A field of an element on both sides; `from`/`to` are left out when the value is not a plain one (a shape). */
  | { what: 'field'; list: LayoutList; id: string; kind?: string; field: string; from?: string | number | boolean | null; to?: string | number | boolean | null };

// ---------------------------------------------------------------------------------------------
// Names of what an event refers to.

/** What the describer may ask the caller to name: items by kind, plus a revision's cell layout and a comment's revision. */
export type AuditRefKind = AuditEntity | 'revisionLayout' | 'commentRevision';
/** A name by kind and id; null or undefined when the item is gone (the words then say "(removed)"). */
export type AuditLookup = (kind: AuditRefKind, id: string) => string | null | undefined;

/** One stored event as the describer reads it. */
export interface AuditEventInput {
  action: string;
  entity: string;
  entityId: string | null;
  details: unknown;
}

/** An event in words, as the page shows it. */
export interface AuditEventWords {
  /** The sentence of what was done ("Signed off revision B"). */
  action: string;
  /** The kind of item ("Floor plan"). */
  kind: string;
  /** The item by its name or letter; null when the event is about no item. */
  item: string | null;
  /** The details, one readable line each ("Name: Cell 1 → Cell 2"). */
  details: string[];
}

export const REMOVED = '(removed)';

type Rec = Record<string, unknown>;
const rec = (v: unknown): Rec => (typeof v === 'object' && v !== null && !Array.isArray(v) ? (v as Rec) : {});
const idText = (v: unknown): string | null => (typeof v === 'number' || (typeof v === 'string' && v !== '') ? String(v) : null);

/** Lists of a layout under their stored names (older rows named the boundaries zones). */
const listOf = (v: unknown): LayoutList | null => {
  const s = String(v);
  if (s === 'arms' || s === 'boundaries' || s === 'workPoints') return s;
  return humanWords(s) === 'Boundaries' ? 'boundaries' : null;
};

/** Every name the describer will look up for an event: pairs of kind and id. */
export function auditRefs(e: AuditEventInput): Array<[AuditRefKind, string]> {
  const d = rec(e.details);
  const out: Array<[AuditRefKind, string]> = [];
  const add = (kind: AuditRefKind, v: unknown) => {
    const id = idText(v);
    if (id !== null && !out.some(([k, i]) => k === kind && i === id)) out.push([kind, id]);
  };
  if (e.entityId !== null && isEntity(e.entity)) add(e.entity, e.entityId);
  if (e.entity === 'revision') add('revisionLayout', e.entityId);
  if (e.entity === 'comment') add('commentRevision', e.entityId);
  add('project', d.projectId);
  add('layout', d.layoutId);
  add('revision', d.revisionId);
  add('user', d.userId);
  for (const c of Array.isArray(d.changes) ? d.changes : []) {
    const r = rec(c);
    if (r.what === 'floorPlan') {
      add('floorPlan', r.from);
      add('floorPlan', r.to);
    }
    if (r.what === 'field' && r.field === 'armModelId') {
      add('armModel', r.from);
      add('armModel', r.to);
    }
  }
  return out;
}

// ---------------------------------------------------------------------------------------------
// Values and details.

/** A text cut to at most `max` characters, with "…" where it was cut. */
const clip = (s: string, max: number) => (s.length > max ? `${s.slice(0, max - 1)}…` : s);

/** A stored value as a person reads it: text as it is, numbers with their unit, lists joined; never JSON. */
function valueText(v: unknown, unit?: Parameters<typeof withUnit>[1], depth = 0): string {
  if (v === null || v === undefined || v === '') return 'none';
  if (typeof v === 'number') return Number.isFinite(v) ? withUnit(Math.round(v * 1000) / 1000, unit) : 'none';
  if (typeof v === 'boolean') return v ? 'yes' : 'no';
  if (typeof v === 'string') return clip(v, 120);
  if (Array.isArray(v)) {
    if (!v.length) return 'none';
    if (depth > 0) return `${v.length} entries`;
    const parts = v.slice(0, 8).map((x) => valueText(x, unit, depth + 1));
    return v.length > 8 ? `${parts.join(', ')} and ${v.length - 8} more` : parts.join(', ');
  }
  if (depth > 0) return 'several values';
  const entries = Object.entries(rec(v)).slice(0, 6);
  return entries.length ? entries.map(([k, x]) => `${humanWords(k).toLowerCase()} ${valueText(x, undefined, depth + 1)}`).join(', ') : 'none';
}

const kb = (n: unknown) => (typeof n === 'number' ? (n < 1024 ? `${n} bytes` : `${withUnit(Math.round((n / 1024) * 10) / 10)} kB`) : valueText(n));
const shortSum = (v: unknown) => (typeof v === 'string' ? v.slice(0, 12) : valueText(v));
const FAILED_REASON: Record<string, string> = {
  unknown_email: 'no account has this e-mail address',
  wrong_password: 'wrong password',
  deactivated: 'the account is deactivated',
};

/** A layout element in words inside a sentence: "arm R1", "guard fence F1", "work point P1". */
function elementText(list: LayoutList, id: string, kind?: string): string {
  if (list === 'arms') return `arm ${id}`;
  if (list === 'workPoints') return `work point ${id}`;
  const word = kind && Object.prototype.hasOwnProperty.call(BOUNDARY_KIND_WORD, kind) ? BOUNDARY_KIND_WORD[kind as keyof typeof BOUNDARY_KIND_WORD] : 'boundary';
  return `${word} ${id}`;
}

const upperFirst = (s: string) => (s ? s[0].toUpperCase() + s.slice(1) : s);

/** The label and unit of a field of a layout element: the label table's, else the field's own words. */
function elementField(list: LayoutList, field: string) {
  const segs = field.split('.');
  const own = fieldLabel(segs) ?? fieldLabel(['content', list, 0, ...segs]);
  return own ?? { label: humanWords(field) };
}

/** A value of a layout element's field, named where it refers to something. */
function fieldValue(field: string, v: unknown, unit: Parameters<typeof withUnit>[1], lookup: AuditLookup): string {
  if (v === null || v === undefined) return 'none';
  if (field === 'armModelId') return lookup('armModel', String(v)) ?? REMOVED;
  if (field === 'approach') return (APPROACH_LABEL as Record<string, string>)[String(v)] ?? valueText(v);
  if (field === 'kind') return upperFirst((BOUNDARY_KIND_WORD as Record<string, string>)[String(v)] ?? valueText(v));
  if (field === 'safeguard.device') return (DEVICE_TEXT as Record<string, string>)[String(v)] ?? valueText(v);
  return valueText(v, unit);
}

/** One stored layout change as a line ("Height of guard fence F1: 2000 mm → 2200 mm"). */
export function layoutChangeLine(raw: unknown, lookup: AuditLookup): string {
  const c = rec(raw);
  const list = listOf(c.list);
  const id = idText(c.id) ?? '';
  switch (c.what) {
    case 'name':
      return `Name: ${valueText(c.from)} → ${valueText(c.to)}`;
    case 'floorPlan': {
      const plan = (v: unknown) => (idText(v) === null ? 'none' : (lookup('floorPlan', String(v)) ?? REMOVED));
      return `Floor plan: ${plan(c.from)} → ${plan(c.to)}`;
    }
    case 'workHeights':
      return `Work heights: ${valueText(c.from, 'mm')} → ${valueText(c.to, 'mm')}`;
    case 'count':
      if (list) return `${fieldLabel([list])?.label ?? humanWords(list)}: ${valueText(c.from)} → ${valueText(c.to)}`;
      break;
    case 'added':
    case 'removed':
      if (list) return `${upperFirst(elementText(list, id, typeof c.kind === 'string' ? c.kind : undefined))} ${c.what}`;
      break;
    case 'field':
      if (list && typeof c.field === 'string') {
        const { label, unit } = elementField(list, c.field);
        const where = elementText(list, id, typeof c.kind === 'string' ? c.kind : undefined);
        if (!('from' in c) && !('to' in c)) return `${upperFirst(label)} of ${where} changed`;
        return `${upperFirst(label)} of ${where}: ${fieldValue(c.field, c.from, unit, lookup)} → ${fieldValue(c.field, c.to, unit, lookup)}`;
      }
      break;
  }
  return genericLines(c)[0] ?? 'Changed';
}

/** Details no table row covers: "Key: value" per member, in words. */
function genericLines(d: Rec): string[] {
  return Object.entries(d).map(([k, v]) => `${humanWords(k)}: ${valueText(v)}`);
}

/** The fields an edit touched (`fields: ['name', 'clientName']`), by their labels. */
const fieldsLine = (v: unknown) => {
  const names = (Array.isArray(v) ? v : []).map((f) => fieldLabel([String(f)])?.label ?? humanWords(String(f)));
  return names.length ? `Changed: ${names.join(', ')}` : null;
};

/** The detail lines of an event, per action; members an action's words do not name are added generically. */
function detailLines(e: AuditEventInput, lookup: AuditLookup, item: string | null): string[] {
  const d = rec(e.details);
  const lines: Array<string | null> = [];
  const used = new Set<string>();
  const take = (...keys: string[]) => {
    for (const k of keys) used.add(k);
  };
  const named = (kind: AuditRefKind, v: unknown) => (idText(v) === null ? 'none' : (lookup(kind, String(v)) ?? REMOVED));
  const line = (label: string, key: string, text: (v: unknown) => string = (v) => valueText(v)) => {
    if (used.has(key)) return;
    take(key);
    // A name already shown as the item is not repeated.
    if (key in d && d[key] !== null && d[key] !== undefined && d[key] !== item) lines.push(`${label}: ${text(d[key])}`);
  };

  if ('projectId' in d) line('Project', 'projectId', (v) => named('project', v));
  // A revision's item already names its cell layout ("B of Cell 1").
  if (e.entity === 'revision') take('layoutId');
  else if ('layoutId' in d) line('Cell layout', 'layoutId', (v) => named('layout', v));
  if ('userId' in d) line('Account', 'userId', (v) => named('user', v));
  take('revisionId', 'letter', 'version');

  switch (e.action) {
    case 'layout.update': {
      take('changes', 'more');
      const changes = Array.isArray(d.changes) ? d.changes : [];
      for (const c of changes) lines.push(layoutChangeLine(c, lookup));
      if (typeof d.more === 'number' && d.more > 0) lines.push(`…and ${d.more} more change${d.more === 1 ? '' : 's'}`);
      if (!changes.length && typeof d.version === 'number') lines.push(`Saved as version ${d.version}`);
      break;
    }
    case 'revision.submit':
      line('From working copy version', 'layoutVersion');
      line('Checksum', 'checksum', shortSum);
      break;
    case 'revision.sign_off':
    case 'revision.return':
      take('comment');
      if (typeof d.comment === 'string' && d.comment.trim()) lines.push(`Comment: “${clip(d.comment.trim(), 400)}”`);
      break;
    case 'revision.release':
      line('Plan sheet checksum', 'planSheetChecksum', shortSum);
      line('Plan sheet size', 'bytes', kb);
      break;
    case 'revision.release_mail_retry':
      line('Mail', 'status', (v) => humanWords(String(v)).toLowerCase());
      line('Attempts', 'attempts');
      break;
    case 'comment.create':
      take('findingId', 'point');
      if (d.findingId) lines.push('About a finding');
      if (d.point && typeof d.point === 'object') {
        const p = rec(d.point);
        lines.push(`At a spot on the plan: x ${valueText(p.x)}, y ${valueText(p.y)} mm`);
      }
      break;
    case 'auth.login_failed':
      line('E-mail', 'email');
      line('Reason', 'reason', (v) => FAILED_REASON[String(v)] ?? humanWords(String(v)).toLowerCase());
      line('From address', 'ip');
      break;
    case 'user.update':
      take('fields', 'passwordChanged');
      lines.push(fieldsLine(d.fields));
      if (d.passwordChanged === true) lines.push('Password changed');
      break;
    case 'project.update':
      take('fields');
      lines.push(fieldsLine(d.fields));
      break;
    case 'project.layerRoles':
      line('Layers', 'layers');
      break;
    case 'floorPlan.create':
      line('File', 'fileName');
      line('Size', 'bytes', kb);
      break;
    case 'floorPlan.update':
      line('Drawing unit', 'units');
      line('Layers', 'layers');
      break;
    case 'armModel.update': {
      take('before');
      const before = rec(d.before);
      if (before.name !== undefined && before.name !== d.name) lines.push(`Name: ${valueText(before.name)} → ${valueText(d.name)}`);
      if (before.family !== undefined && before.family !== d.family) lines.push(`Kinematic family: ${familyLabel(String(before.family))} → ${familyLabel(String(d.family))}`);
      take('name', 'family');
      break;
    }
    default:
      break;
  }
  // Members many actions keep; anything else reads generically.
  line('Name', 'name');
  line('Kinematic family', 'family', (v) => familyLabel(String(v)));
  line('E-mail', 'email');
  line('Role', 'role', (v) => humanWords(String(v)));
  line('File', 'fileName');
  const rest = Object.fromEntries(Object.entries(d).filter(([k]) => !used.has(k)));
  lines.push(...genericLines(rest));
  return lines.filter((l): l is string => l !== null);
}

/** The item of an event by its name or letter: the stored row's, else the name the event kept, else "(removed)". */
function itemName(e: AuditEventInput, lookup: AuditLookup): string | null {
  const d = rec(e.details);
  if (e.entityId === null) return null;
  const kept = [d.letter, d.name, d.fileName, d.email].find((v) => typeof v === 'string' && v !== '') as string | undefined;
  const found = isEntity(e.entity) ? lookup(e.entity, e.entityId) : null;
  if (e.entity === 'revision') {
    const letter = found ?? kept;
    const layout = lookup('revisionLayout', e.entityId);
    return letter ? `${letter}${layout ? ` of ${layout}` : ''}` : REMOVED;
  }
  if (e.entity === 'comment') {
    const on = lookup('commentRevision', e.entityId);
    return on ? `on revision ${on}` : REMOVED;
  }
  return found ?? kept ?? REMOVED;
}

/** The letter an action's phrase names: the event's own revision, or the revision a comment is on. */
function phraseLetter(e: AuditEventInput, lookup: AuditLookup): string | null {
  const d = rec(e.details);
  if (e.entity === 'revision') return (typeof d.letter === 'string' ? d.letter : null) ?? (e.entityId !== null ? (lookup('revision', e.entityId) ?? null) : null);
  if (e.entity === 'comment') return (e.entityId !== null ? lookup('commentRevision', e.entityId) : null) ?? (idText(d.revisionId) !== null ? (lookup('revision', String(d.revisionId)) ?? null) : null);
  return null;
}

/** One stored event in words. */
export function describeAuditEvent(e: AuditEventInput, lookup: AuditLookup): AuditEventWords {
  const item = itemName(e, lookup);
  return {
    action: auditActionPhrase(e.action, { letter: phraseLetter(e, lookup) }),
    kind: auditKindLabel(e.entity),
    item,
    details: detailLines(e, lookup, item),
  };
}
