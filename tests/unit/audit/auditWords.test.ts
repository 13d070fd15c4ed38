// The audit log in words (shared/audit): every action the server records has its sentence — found
// by reading every `audit(` call of the server's source with the TypeScript checker, so a new
// action without words fails here — item kinds read as words, items by name with "(removed)" for
// what is gone, and stored details as lines of changes, never JSON or code names. The words are
// the product's own choice (docs/glossary.md); no outside source applies.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';
import {
  AUDIT_ACTIONS,
  AUDIT_KIND_LABEL,
  auditActionGroups,
  auditActionPhrase,
  auditKindLabel,
  auditKindOptions,
  auditRefs,
  describeAuditEvent,
  humanWords,
  layoutChangeLine,
  type AuditLookup,
} from '@shared/audit';
import { layoutChanges } from '../../../backend/src/services/audit/layoutChanges';
import { pageTitle } from '../../../frontend/src/lib/usePageTitle';

const ROOT = path.resolve(__dirname, '../../..');

function sources(dir: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(path.join(ROOT, dir))) {
    const rel = path.posix.join(dir, name);
    if (rel === 'backend/src/db/migrations') continue;
    if (statSync(path.join(ROOT, rel)).isDirectory()) out.push(...sources(rel));
    else if (rel.endsWith('.ts')) out.push(rel);
  }
  return out;
}

/** Every `audit(…)` call of the server and the action codes its second argument can take (by the checker). */
function auditCallSites(): { calls: Array<{ at: string; actions: string[] | null }>; textCount: number } {
  const files = sources('backend/src').filter((rel) => /\baudit\(/.test(readFileSync(path.join(ROOT, rel), 'utf8')));
  const textCount = files.reduce((n, rel) => n + (readFileSync(path.join(ROOT, rel), 'utf8').match(/(?<![\w.]|function )audit\(/g)?.length ?? 0), 0);
  const config = ts.parseJsonConfigFileContent(JSON.parse(readFileSync(path.join(ROOT, 'tsconfig.json'), 'utf8')), ts.sys, ROOT);
  const program = ts.createProgram(files.map((f) => path.join(ROOT, f)), { ...config.options, noEmit: true });
  const checker = program.getTypeChecker();
  const calls: Array<{ at: string; actions: string[] | null }> = [];
  for (const rel of files) {
    const sf = program.getSourceFile(path.join(ROOT, rel))!;
    const visit = (node: ts.Node): void => {
      if (ts.isCallExpression(node) && ts.isIdentifier(node.expression) && node.expression.text === 'audit') {
        const at = `${rel}:${sf.getLineAndCharacterOfPosition(node.getStart(sf)).line + 1}`;
        const arg = node.arguments[1];
        const type = checker.getTypeAtLocation(arg);
        const parts = type.isUnion() ? type.types : [type];
        const literal = parts.every((t) => t.isStringLiteral());
        calls.push({ at, actions: literal ? parts.map((t) => (t as ts.StringLiteralType).value) : null });
      }
      ts.forEachChild(node, visit);
    };
    visit(sf);
  }
  return { calls, textCount };
}

const names: Record<string, string> = {
  'revision:11': 'B',
  'revisionLayout:11': 'Cell 1',
  'revision:10': 'A',
  'revisionLayout:10': 'Cell 1',
  'layout:5': 'Cell 1',
  'project:2': 'Fernhill line 3',
  'armModel:3': 'Picker S-600',
  'floorPlan:4': 'hall-2.dxf',
  'user:7': 'Rita Reviewer',
  'commentRevision:21': 'A',
};
const lookup: AuditLookup = (kind, id) => names[`${kind}:${id}`];

describe('audit action words', () => {
  const { calls, textCount } = auditCallSites();

  it('finds every audit call of the server (the scan itself works)', () => {
    expect(calls.length).toBeGreaterThan(30);
    expect(calls.length).toBe(textCount);
    expect(calls.map((c) => c.at)).toContainEqual(expect.stringMatching(/^backend\/src\/services\/revisions\/workflow\.ts:/));
  });

  it('every call records a known action code, never a free string', () => {
    expect(calls.filter((c) => c.actions === null).map((c) => c.at)).toEqual([]);
  });

  it('every action the server records has its words, and the table names no action nobody records', () => {
    const recorded = new Set(calls.flatMap((c) => c.actions ?? []));
    // The decision's template and archiving's `${entity}.archive` are expanded by the checker.
    expect(recorded).toContain('revision.sign_off');
    expect(recorded).toContain('revision.return');
    expect(recorded).toContain('layout.archive');
    expect([...recorded].filter((a) => !(AUDIT_ACTIONS as string[]).includes(a))).toEqual([]);
    expect(AUDIT_ACTIONS.filter((a) => !recorded.has(a))).toEqual([]);
  });

  it('reads each action as a short sentence without code names', () => {
    expect(auditActionPhrase('revision.sign_off', { letter: 'B' })).toBe('Signed off revision B');
    expect(auditActionPhrase('revision.return', { letter: 'A' })).toBe('Returned revision A for changes');
    expect(auditActionPhrase('revision.return')).toBe('Returned a revision for changes');
    expect(auditActionPhrase('layout.update')).toBe('Edited cell layout');
    expect(auditActionPhrase('auth.login')).toBe('Signed in');
    expect(auditActionPhrase('auth.login_failed')).toBe('Failed sign-in');
    for (const a of AUDIT_ACTIONS) {
      const s = auditActionPhrase(a, { letter: 'C' });
      expect(s, a).toMatch(/^[A-Z][a-z]/);
      expect(s, a).not.toMatch(/[a-z][A-Z]|[._{}"]/);
    }
  });

  it('words an action the table does not know from its code, safely', () => {
    expect(auditActionPhrase('floorPlan.reScan_all')).toBe('Floor plan: re scan all');
    expect(auditActionPhrase('gadget.{"x":1}')).toBe('Gadget: x 1');
    expect(auditActionPhrase('')).toBe('Other');
    expect(humanWords('zones.count')).toBe('Boundaries count');
  });

  it('names each item kind in words, for the page and its filter', () => {
    expect(auditKindLabel('floorPlan')).toBe('Floor plan');
    expect(auditKindLabel('armModel')).toBe('Arm model');
    expect(auditKindLabel('layout')).toBe('Cell layout');
    expect(auditKindLabel('safetyCheck')).toBe('Safety check');
    expect(auditKindOptions().map((o) => o.label)).toEqual(Object.values(AUDIT_KIND_LABEL));
    for (const label of [...Object.values(AUDIT_KIND_LABEL), ...auditActionGroups().flatMap((g) => [g.label, ...g.options.map((o) => o.label)])]) {
      expect(label).not.toMatch(/[a-z][A-Z]|[._]/);
    }
    // Each action is in the filter once, under its group's "any" option (the server's prefix match).
    const groups = auditActionGroups();
    expect(groups.flatMap((g) => g.options.map((o) => o.value)).filter((v) => !v.endsWith('.')).sort()).toEqual([...AUDIT_ACTIONS].sort());
    expect(groups.find((g) => g.label === 'Revision')?.options[0]).toEqual({ value: 'revision.', label: 'Any revision action' });
  });
});

describe('audit events in words', () => {
  it('a sign-off: sentence with the letter, the revision by letter and layout, the comment', () => {
    const e = { action: 'revision.sign_off', entity: 'revision', entityId: '11', details: { letter: 'B', comment: 'Fine as drawn.' } };
    expect(describeAuditEvent(e, lookup)).toEqual({ action: 'Signed off revision B', kind: 'Revision', item: 'B of Cell 1', details: ['Comment: “Fine as drawn.”'] });
  });

  it('a cell layout edit: its changes as lines, references by name, "(removed)" for what is gone', () => {
    const changes = [
      { what: 'name', from: 'Cell 1', to: 'Cell 2' },
      { what: 'count', list: 'arms', from: 4, to: 5 },
      { what: 'added', list: 'arms', id: 'R5' },
      { what: 'field', list: 'boundaries', id: 'F1', kind: 'fence', field: 'height', from: 2000, to: 2200 },
      { what: 'field', list: 'arms', id: 'R1', field: 'armModelId', from: 3, to: 99 },
      { what: 'field', list: 'arms', id: 'R2', field: 'mountHeight', from: 0, to: 450 },
      { what: 'field', list: 'arms', id: 'R4', field: 'y', from: 9400, to: 8700 },
      { what: 'field', list: 'boundaries', id: 'F1', kind: 'fence', field: 'points' },
      { what: 'floorPlan', from: 4, to: null },
      { what: 'removed', list: 'boundaries', id: 'K1', kind: 'keepout' },
    ];
    const e = { action: 'layout.update', entity: 'layout', entityId: '5', details: { version: 8, changes } };
    expect(auditRefs(e)).toEqual(expect.arrayContaining([['layout', '5'], ['armModel', '3'], ['armModel', '99'], ['floorPlan', '4']]));
    expect(describeAuditEvent(e, lookup)).toEqual({
      action: 'Edited cell layout',
      kind: 'Cell layout',
      item: 'Cell 1',
      details: [
        'Name: Cell 1 → Cell 2',
        'Arms: 4 → 5',
        'Arm R5 added',
        'Height of guard fence F1: 2000 mm → 2200 mm',
        'Arm model of arm R1: Picker S-600 → (removed)',
        'Mount height of arm R2: 0 mm → 450 mm',
        'Y (north) of arm R4: 9400 mm → 8700 mm',
        'Points of guard fence F1 changed',
        'Floor plan: hall-2.dxf → none',
        'Keep-out K1 removed',
      ],
    });
  });

  it('reads details stored under the older word for boundaries in today\'s words', () => {
    expect(layoutChangeLine({ what: 'count', list: 'zones', from: 2, to: 3 }, lookup)).toBe('Boundaries: 2 → 3');
    const e = { action: 'layout.update', entity: 'layout', entityId: '5', details: { 'zones.count': 3, zonesEdited: ['F1'] } };
    expect(describeAuditEvent(e, lookup).details).toEqual(['Boundaries count: 3', 'Boundaries edited: F1']);
  });

  it('an older edit that kept only its version still says something', () => {
    expect(describeAuditEvent({ action: 'layout.update', entity: 'layout', entityId: '5', details: { version: 3 } }, lookup).details).toEqual(['Saved as version 3']);
  });

  it('a deleted item keeps the name its event stored; a gone one without reads "(removed)"', () => {
    expect(describeAuditEvent({ action: 'layout.delete', entity: 'layout', entityId: '404', details: { name: 'Old cell' } }, lookup)).toEqual({ action: 'Deleted cell layout', kind: 'Cell layout', item: 'Old cell', details: [] });
    expect(describeAuditEvent({ action: 'armModel.create', entity: 'armModel', entityId: '404', details: {} }, lookup).item).toBe('(removed)');
  });

  it('sign-ins, comments and references read in words', () => {
    expect(describeAuditEvent({ action: 'auth.login_failed', entity: 'user', entityId: null, details: { email: 'x@y.test', reason: 'wrong_password', ip: '127.0.0.1' } }, lookup)).toEqual({
      action: 'Failed sign-in',
      kind: 'Account',
      item: null,
      details: ['E-mail: x@y.test', 'Reason: wrong password', 'From address: 127.0.0.1'],
    });
    expect(describeAuditEvent({ action: 'comment.create', entity: 'comment', entityId: '21', details: { revisionId: 10, findingId: 'shared-zone:R1+R2', point: null } }, lookup)).toEqual({
      action: 'Commented on revision A',
      kind: 'Comment',
      item: 'on revision A',
      details: ['About a finding'],
    });
    expect(describeAuditEvent({ action: 'project.member.add', entity: 'project', entityId: '2', details: { userId: 7 } }, lookup).details).toEqual(['Account: Rita Reviewer']);
    expect(describeAuditEvent({ action: 'project.update', entity: 'project', entityId: '2', details: { fields: ['name', 'clientName'] } }, lookup).details).toEqual(['Changed: Name, Client']);
    expect(describeAuditEvent({ action: 'armModel.update', entity: 'armModel', entityId: '3', details: { before: { name: 'Old', family: 'scara' }, name: 'Picker S-600', family: 'scara' } }, lookup).details).toEqual(['Name: Old → Picker S-600']);
  });

  it('never shows JSON, whatever is stored', () => {
    const odd = { action: 'gadget.tune', entity: 'gadgetPart', entityId: '1', details: { nested: { deep: { deeper: [1, 2] } }, list: [{ a: 1 }], flag: true, n: null } };
    const w = describeAuditEvent(odd, lookup);
    expect(w.kind).toBe('Gadget part');
    expect(w.action).toBe('Gadget: tune');
    for (const line of w.details) expect(line).not.toMatch(/[{}[\]"]/);
    expect(w.details).toEqual(['Nested: deep several values', 'List: several values', 'Flag: yes', 'N: none']);
  });
});

describe('layout changes kept by an edit', () => {
  const content = (over: Record<string, unknown> = {}) => ({
    arms: [{ id: 'R1', armModelId: 3, label: '', x: 0, y: 0, yaw: 0, mountHeight: 0 }],
    workPoints: [{ id: 'P1', x: 100, y: 0, z: 50, approach: 'top', tag: '' }],
    boundaries: [
      { id: 'F1', kind: 'fence', label: '', points: [[0, 0], [1000, 0]], height: 2000 },
      { id: 'O1', kind: 'opening', label: '', points: [[100, 0], [900, 0]], fenceId: 'F1', safeguard: { device: 'interlock', responseTimeS: 0.1, stopCategory: 0, approach: 'normal' } },
    ],
    workHeights: [100],
    ...over,
  });

  it('records name, counts, added elements and changed fields, and words them', () => {
    const before = { name: 'Cell 1', floorPlanId: 4, content: content() };
    const c = content();
    (c.boundaries[0] as Record<string, unknown>).height = 2200;
    (c.boundaries[1].safeguard as Record<string, unknown>).device = 'light-curtain';
    c.arms.push({ id: 'R2', armModelId: 3, label: '', x: 2000, y: 0, yaw: 90, mountHeight: 0 });
    const after = { name: 'Cell 2', floorPlanId: 4, content: c };
    const { changes, more } = layoutChanges(before, after);
    expect(more).toBe(0);
    expect(changes.map((x) => layoutChangeLine(x, lookup))).toEqual([
      'Name: Cell 1 → Cell 2',
      'Arms: 1 → 2',
      'Arm R2 added',
      'Height of guard fence F1: 2000 mm → 2200 mm',
      'Safeguard device of access opening O1: interlocked guard → light curtain',
    ]);
  });

  it('keeps at most its limit and counts the rest', () => {
    const many = Array.from({ length: 60 }, (_, i) => ({ id: `P${i + 1}`, x: i, y: 0, z: 0, approach: 'top', tag: '' }));
    const { changes, more } = layoutChanges({ name: 'a', floorPlanId: null, content: content() }, { name: 'a', floorPlanId: null, content: content({ workPoints: many }) });
    expect(changes.length + more).toBe(1 + 59 + 1 + 1); // count line, 59 added (P2…P60), P1's x and z
    expect(changes.length).toBe(40);
  });

  it('an edit that changed nothing records no changes', () => {
    expect(layoutChanges({ name: 'a', floorPlanId: 1, content: content() }, { name: 'a', floorPlanId: 1, content: content() })).toEqual({ changes: [], more: 0 });
  });
});

describe('tab titles', () => {
  it('name the page, then the project, then the product', () => {
    expect(pageTitle('Cell 1', 'Fernhill')).toBe('Cell 1 · Fernhill · Ringfence');
    expect(pageTitle('Audit log')).toBe('Audit log · Ringfence');
    expect(pageTitle('Cell layout', undefined, ' ')).toBe('Cell layout · Ringfence');
  });
});
