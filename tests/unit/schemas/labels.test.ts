// Field messages people see: every field of every input schema has a label, and every failure of
// those schemas reads as a sentence with labels and units, never a property name or a dotted path.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import type { z } from 'zod';
import { FeasibleArmModelInput } from '@shared/kinematics';
import { invalidFieldsMessage, fieldErrors } from '@shared/schemas/errors';
import { FenceProposalRequest } from '@shared/schemas/fenceProposal';
import { FloorPlanPatch, SavedLayerRoles } from '@shared/schemas/floorPlan';
import { fieldLabel, hasTableLabel, issueSentence } from '@shared/schemas/labels';
import { LayoutCreateInput, LayoutUpdateInput } from '@shared/schemas/layout';
import { AutoLayoutInput, PlacementSearchInput } from '@shared/schemas/placement';
import { MemberInput, ProjectInput, ProjectUpdateInput } from '@shared/schemas/project';
import { InvitationAcceptInput, InvitationInput, LoginInput, UserCreateInput, UserUpdateInput } from '@shared/schemas/user';

const samples = path.resolve(__dirname, '../../../samples');
const armModel = (file: string) => JSON.parse(readFileSync(path.join(samples, 'arm-models', file), 'utf8')) as { name: string; params: Record<string, unknown> };
const demoLayout = JSON.parse(readFileSync(path.join(samples, 'layouts', 'fernhill-line3.json'), 'utf8')) as { content: Record<string, unknown> };
const content = { ...demoLayout.content, arms: (demoLayout.content.arms as Array<Record<string, unknown>>).map((a) => ({ ...a, armModelId: 1 })) };

/** A chain model with a prismatic joint (the DH sample has revolute joints only). */
const chainWithStroke = {
  name: 'Demo Gantry Chain',
  params: {
    family: 'chain',
    convention: 'standard',
    joints: [
      { type: 'revolute', a: 0, alpha: 0, d: 400, theta: 0, min: -170, max: 170 },
      { type: 'prismatic', a: 300, alpha: 0, d: 0, theta: 0, min: 0, max: 500, zeroOffset: 0, direction: 1 },
    ],
    tool: { x: 0, y: 0, z: 50 },
    linkSizes: { linkRadius: 60, toolRadius: 40 },
  },
};

/** Every input schema of shared/schemas with a valid value (the demo data where there is one). */
const SCHEMAS: Array<{ name: string; schema: z.ZodType; valid: unknown }> = [
  { name: 'arm model (SCARA)', schema: FeasibleArmModelInput, valid: armModel('demo-scara-600.json') },
  { name: 'arm model (articulated)', schema: FeasibleArmModelInput, valid: armModel('demo-articulated-1400.json') },
  { name: 'arm model (linkage)', schema: FeasibleArmModelInput, valid: armModel('demo-palletizer-3100.json') },
  { name: 'arm model (DH chain)', schema: FeasibleArmModelInput, valid: armModel('demo-six-axis-2000.json') },
  { name: 'arm model (DH chain with a stroke)', schema: FeasibleArmModelInput, valid: chainWithStroke },
  { name: 'cell layout (create)', schema: LayoutCreateInput, valid: { name: 'Line 3 cell', floorPlanId: 4, content } },
  { name: 'cell layout (update)', schema: LayoutUpdateInput, valid: { version: 3, name: 'Line 3 cell', floorPlanId: null, content } },
  { name: 'project', schema: ProjectInput, valid: { name: 'Line 3 end of line', clientName: 'Fernhill Biscuit Works', siteName: 'Hall 2', description: 'Two pickers, a packer, a palletizer.' } },
  { name: 'project change', schema: ProjectUpdateInput, valid: { name: 'Line 3', clientName: 'Fernhill', siteName: 'Hall 2', description: 'Cell' } },
  { name: 'project member', schema: MemberInput, valid: { userId: 7 } },
  { name: 'sign-in', schema: LoginInput, valid: { email: 'planner@fernhill.test', password: 'secret' } },
  { name: 'new user', schema: UserCreateInput, valid: { email: 'new@fernhill.test', name: 'Ada Planner', role: 'planner', password: 'long enough password' } },
  { name: 'user change', schema: UserUpdateInput, valid: { name: 'Ada', role: 'reviewer', active: true, password: 'long enough password' } },
  { name: 'invitation', schema: InvitationInput, valid: { email: 'client@fernhill.test', role: 'client', projectId: 3 } },
  { name: 'invitation taken up', schema: InvitationAcceptInput, valid: { name: 'Cleo Client', password: 'long enough password' } },
  { name: 'floor plan change', schema: FloorPlanPatch, valid: { layers: [{ name: 'Walls', role: 'wall', height: 3000 }], units: 'mm' } },
  { name: 'saved layer roles', schema: SavedLayerRoles, valid: { layers: [{ name: 'Columns', role: 'column', height: null }] } },
  {
    name: 'fence proposal',
    schema: FenceProposalRequest,
    valid: { panelWidthsMm: [500, 1000], panelHeightMm: 2000, meshMm: 20, meshShape: 'square', postWidthMm: 60, clearanceMm: 150, doorWidthsMm: [1000], useWalls: true, content },
  },
  {
    name: 'placement search',
    schema: PlacementSearchInput,
    valid: { armModelId: 2, armId: 'R1', pointIds: ['P1', 'P2'], minMarginMm: 20, yawMinDeg: -90, yawMaxDeg: 90, yawStepDeg: 5, mountHeightMm: 400, restrict: { j1Min: -90, j1Max: 90 }, gridMm: 10 },
  },
  { name: 'auto-layout', schema: AutoLayoutInput, valid: { models: [{ armModelId: 2, count: 2 }], pointIds: ['P1'], minMarginMm: 0, mountHeightMm: 0, seed: 1, timeLimitS: 10 } },
];

/** What must never appear in a message: a camelCase property name, a dotted path, zod's own wording. */
function unreadable(message: string): string | null {
  const camel = /\b[a-z]+[A-Z][A-Za-z0-9]*\b/.exec(message);
  if (camel) return `camelCase name "${camel[0]}"`;
  const dotted = /\b[A-Za-z_][A-Za-z0-9_]*\.(?:[A-Za-z_#][A-Za-z0-9_]*|\d+\b)/.exec(message);
  if (dotted) return `dotted path "${dotted[0]}"`;
  if (/Invalid (input|option|string|number|discriminator)|Too (big|small)|Unrecognized key|expected \w+, received/.test(message)) return 'zod default wording';
  // A sentence starts with its label; only the plan coordinates are written small ("x (east) …").
  if (/^[a-z]/.test(message) && !/^[xyz] \(/.test(message)) return 'a lower-case property name as subject';
  return null;
}

type Leaf = { path: Array<string | number>; value: unknown };
/** Every primitive of a value with its path (list items and object fields). */
function leaves(value: unknown, at: Array<string | number> = []): Leaf[] {
  if (Array.isArray(value)) return value.flatMap((v, i) => leaves(v, [...at, i]));
  if (value !== null && typeof value === 'object') return Object.entries(value).flatMap(([k, v]) => leaves(v, [...at, k]));
  return [{ path: at, value }];
}
/** Every node path (objects, lists and fields) of a value, lists cut to their first items. */
function nodes(value: unknown, at: Array<string | number> = []): Array<Array<string | number>> {
  const here = at.length ? [at] : [];
  if (Array.isArray(value)) return [...here, ...value.slice(0, 3).flatMap((v, i) => nodes(v, [...at, i]))];
  if (value !== null && typeof value === 'object') return [...here, ...Object.entries(value).flatMap(([k, v]) => nodes(v, [...at, k]))];
  return here;
}
function withValue(base: unknown, at: Array<string | number>, v: unknown): unknown {
  const copy = structuredClone(base) as Record<string | number, unknown>;
  let o = copy;
  for (const k of at.slice(0, -1)) o = o[k] as Record<string | number, unknown>;
  o[at[at.length - 1]] = v;
  return copy;
}
/** Wrong values of the kind of `v`: the wrong type, far out of range, empty, too long, a control character. */
function wrongValues(v: unknown): unknown[] {
  if (typeof v === 'number') return ['not a number', -1e12, 1e12, Number.NaN, 0.5];
  if (typeof v === 'string') return [12, '', 'x'.repeat(5000), 'two\nlines', 'no such value'];
  if (typeof v === 'boolean') return ['yes'];
  return [12, 'text'];
}

describe('field labels', () => {
  it('labels every field of every input schema from the table (no label made from a property name)', () => {
    const missing: string[] = [];
    for (const { name, valid } of SCHEMAS) {
      for (const p of nodes(valid)) {
        const endsAtItem = typeof p[p.length - 1] === 'number';
        if (endsAtItem ? fieldLabel(p) === null : !hasTableLabel(p)) missing.push(`${name}: ${p.join('.')}`);
      }
    }
    expect(missing).toEqual([]);
  });

  it('gives labels with units, list positions counted from 1', () => {
    expect(fieldLabel(['params', 'stopTimeS'])).toEqual({ label: 'Stop time (category 0)', unit: 's' });
    expect(fieldLabel(['stopTimeS'])).toEqual({ label: 'Stop time (category 0)', unit: 's' });
    expect(fieldLabel(['params', 'fourBar', 'ground'])).toEqual({ label: 'Ground link', unit: 'mm' });
    expect(fieldLabel(['params', 'axes', 0, 'max'])).toEqual({ label: 'J1 max', unit: '°' });
    expect(fieldLabel(['mountHeightMm'])).toEqual({ label: 'Mount height', unit: 'mm' });
    expect(fieldLabel(['content', 'boundaries', 2, 'height'])).toEqual({ label: 'Fence height', unit: 'mm' });
    expect(fieldLabel(['content', 'boundaries', 0, 'points', 3, 1])).toEqual({ label: 'Point 4 y', unit: 'mm' });
    expect(fieldLabel(['panelWidthsMm', 1])).toEqual({ label: 'Panel width 2', unit: 'mm' });
  });
});

describe('issue sentences', () => {
  /** Real failures of the schemas: a field made wrong in a valid value, and the sentence people get. */
  const CASES: Array<{ schema: z.ZodType; base: unknown; at: Array<string | number>; value: unknown; sentence: string }> = [
    { schema: FeasibleArmModelInput, base: armModel('demo-scara-600.json'), at: ['params', 'stopTimeS'], value: 0, sentence: 'Stop time (category 0) must be greater than 0 s' },
    { schema: FeasibleArmModelInput, base: armModel('demo-scara-600.json'), at: ['params', 'stopTimeCat1S'], value: 90, sentence: 'Stop time (category 1) must be at most 60 s' },
    { schema: FeasibleArmModelInput, base: armModel('demo-scara-600.json'), at: ['params', 'innerLink'], value: -1, sentence: 'Inner link must be greater than 0 mm' },
    { schema: FeasibleArmModelInput, base: armModel('demo-scara-600.json'), at: ['params', 'strokeMax'], value: -500, sentence: 'Stroke top must be greater than stroke bottom' },
    { schema: FeasibleArmModelInput, base: armModel('demo-scara-600.json'), at: ['params', 'axes', 1, 'max'], value: -170, sentence: 'J2 max must be greater than J2 min' },
    { schema: FeasibleArmModelInput, base: armModel('demo-scara-600.json'), at: ['params', 'family'], value: 'delta', sentence: 'Choose a kinematic family: SCARA, articulated, linkage-driven or DH chain' },
    { schema: FeasibleArmModelInput, base: armModel('demo-articulated-1400.json'), at: ['params', 'upperArm'], value: 'long', sentence: 'Upper arm must be a number' },
    { schema: FeasibleArmModelInput, base: armModel('demo-articulated-1400.json'), at: ['params', 'axes', 0, 'direction'], value: 2, sentence: 'J1 direction must be 1 or −1' },
    { schema: FeasibleArmModelInput, base: armModel('demo-articulated-1400.json'), at: ['params', 'linkSizes', 'toolRadius'], value: 6000, sentence: 'Tool radius must be at most 5000 mm' },
    { schema: FeasibleArmModelInput, base: armModel('demo-palletizer-3100.json'), at: ['params', 'fourBar', 'crank'], value: 0, sentence: 'Crank must be greater than 0 mm' },
    { schema: FeasibleArmModelInput, base: armModel('demo-palletizer-3100.json'), at: ['params', 'fourBar', 'branch'], value: 'sideways', sentence: 'Four-bar branch must be open or crossed' },
    { schema: FeasibleArmModelInput, base: armModel('demo-palletizer-3100.json'), at: ['params', 'interiorAngle', 'max'], value: 10, sentence: 'Elbow angle max must be greater than elbow angle min' },
    { schema: FeasibleArmModelInput, base: armModel('demo-six-axis-2000.json'), at: ['params', 'joints', 1, 'max'], value: 800, sentence: 'J2 max: a revolute joint takes limits within ±720°' },
    { schema: FeasibleArmModelInput, base: armModel('demo-six-axis-2000.json'), at: ['params', 'convention'], value: 'other', sentence: 'DH convention must be standard or modified' },
    { schema: FeasibleArmModelInput, base: chainWithStroke, at: ['params', 'tool', 'z'], value: undefined, sentence: 'Tool z is required' },
    { schema: LayoutUpdateInput, base: { version: 1, content }, at: ['content', 'arms', 0, 'mountHeight'], value: 'high', sentence: 'Mount height of arm R1 must be a number' },
    { schema: LayoutUpdateInput, base: { version: 1, content }, at: ['content', 'arms', 2, 'restrict', 'j1Max'], value: -120, sentence: 'Arm R3: J1 min must be below J1 max' },
    { schema: LayoutUpdateInput, base: { version: 1, content }, at: ['content', 'workPoints', 0, 'assignedArm'], value: 'R9', sentence: 'Work point P1: no arm R9 on this cell layout' },
    { schema: LayoutUpdateInput, base: { version: 1, content }, at: ['content', 'workPoints', 1, 'z'], value: null, sentence: 'z (height) of work point P2 must be a number' },
    { schema: LayoutUpdateInput, base: { version: 1, content }, at: ['content', 'boundaries', 0, 'height'], value: -5, sentence: 'Fence height of fence F1 must be greater than 0 mm' },
    { schema: LayoutUpdateInput, base: { version: 1, content }, at: ['content', 'boundaries', 1, 'safeguard', 'responseTimeS'], value: 50, sentence: 'Response time of access opening O1 must be at most 30 s' },
    { schema: LayoutUpdateInput, base: { version: 1, content }, at: ['content', 'workHeights', 0], value: 'a', sentence: 'Work height 1 must be a number' },
    { schema: ProjectInput, base: { name: 'Line 3', clientName: 'Fernhill' }, at: ['name'], value: '', sentence: 'Enter a project name' },
    { schema: ProjectInput, base: { name: 'Line 3', clientName: 'Fernhill' }, at: ['clientName'], value: undefined, sentence: 'Client is required' },
    { schema: UserCreateInput, base: { email: 'a@b.test', name: 'Ada', role: 'planner', password: 'long enough password' }, at: ['password'], value: 'short', sentence: 'Password: use at least 10 characters' },
    { schema: UserCreateInput, base: { email: 'a@b.test', name: 'Ada', role: 'planner', password: 'long enough password' }, at: ['email'], value: 'not an address', sentence: 'Enter a valid e-mail address' },
    { schema: InvitationInput, base: { email: 'a@b.test', role: 'client' }, at: ['role'], value: 'boss', sentence: 'Role must be one of admin, planner, reviewer or client' },
    { schema: FloorPlanPatch, base: { layers: [{ name: 'Walls', height: 3000 }] }, at: ['layers', 0, 'height'], value: -1, sentence: 'Layer “Walls”: height must be above the floor' },
    { schema: FenceProposalRequest, base: {}, at: ['panelHeightMm'], value: 1000, sentence: 'Panel height must be at least 1400 mm' },
    { schema: FenceProposalRequest, base: { panelWidthsMm: [500, 1000] }, at: ['panelWidthsMm', 1], value: 50, sentence: 'Panel width 2 must be at least 100 mm' },
    { schema: FenceProposalRequest, base: {}, at: ['useWalls'], value: 'yes', sentence: 'Use of walls must be yes or no' },
    { schema: PlacementSearchInput, base: { armModelId: 1, pointIds: ['P1'] }, at: ['mountHeightMm'], value: 'x', sentence: 'Mount height must be a number' },
    { schema: PlacementSearchInput, base: { armModelId: 1, pointIds: ['P1'] }, at: ['yawStepDeg'], value: 0.1, sentence: 'Yaw step must be between 0.5° and 360°' },
    { schema: AutoLayoutInput, base: { models: [{ armModelId: 1, count: 1 }], pointIds: ['P1'] }, at: ['models', 0, 'count'], value: 0, sentence: 'Arm model 1 of the list: count must be at least 1' },
  ];

  it.each(CASES.map((c) => [c.at.join('.'), c] as const))('%s', (_p, c) => {
    const input = withValue(c.base, c.at, c.value);
    const r = c.schema.safeParse(input);
    expect(r.success).toBe(false);
    const fields = r.success ? {} : fieldErrors(r.error.issues, { input });
    expect(fields[c.at.join('.')]).toBe(c.sentence);
    expect(unreadable(c.sentence)).toBeNull();
  });

  it('makes every field of every schema fail in several ways and reads each message as a sentence', () => {
    const bad: string[] = [];
    let checked = 0;
    for (const { name, schema, valid } of SCHEMAS) {
      expect(schema.safeParse(valid).success, name).toBe(true);
      for (const leaf of leaves(valid)) {
        for (const v of wrongValues(leaf.value)) {
          const input = withValue(valid, leaf.path, v);
          const r = schema.safeParse(input);
          if (r.success) continue;
          const messages = [...Object.values(fieldErrors(r.error.issues, { input })), invalidFieldsMessage('The input', r.error.issues, input)];
          for (const m of messages) {
            checked++;
            const why = unreadable(m);
            if (why) bad.push(`${name} ${leaf.path.join('.')}=${JSON.stringify(v)}: ${why} in "${m}"`);
          }
        }
      }
    }
    expect(checked).toBeGreaterThan(1000);
    expect(bad).toEqual([]);
  });

  it('names the whole input, unknown fields and list items without their property names', () => {
    const extra = LayoutUpdateInput.safeParse({ version: 1, content: { ...content, arms: [{ ...(content.arms as object[])[0], reachMm: 5 }] } });
    expect(extra.success).toBe(false);
    expect(issueSentence(extra.error!.issues[0], { input: { content: { arms: [{ id: 'R1' }] } } })).toBe('Arm R1 has a field it does not take');
    // Without the input at hand, list items go by their position.
    expect(issueSentence({ code: 'too_small', origin: 'number', minimum: 0, inclusive: false, path: ['boundaries', 2, 'height'], message: 'Too small: expected number to be >0' })).toBe(
      'Fence height of boundary 3 must be greater than 0 mm',
    );
    expect(issueSentence({ code: 'custom', path: [], message: 'Nothing to change' })).toBe('Nothing to change');
    // A field nobody put in the table is still named in words, with the unit its name carries.
    expect(issueSentence({ code: 'too_small', origin: 'number', minimum: 0, inclusive: true, path: ['clampForceKg'], message: 'Too small: expected number to be >=0' })).toBe('Clamp force must not be negative');
  });
});
