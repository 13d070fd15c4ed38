// Names and labels are one line of text: no Unicode control characters (general category Cc per
// the Unicode Character Database: U+0000–U+001F, U+007F–U+009F, so TAB, LF and CR among them).
import { describe, expect, it } from 'vitest';
import { SINGLE_LINE_MESSAGE, singleLineText } from '@shared/schemas/fields';
import { ArmModelInput } from '@shared/schemas/armModel';
import { readDemoCatalogue } from '../../../backend/src/db/demoCatalogue';
import { LayerPatch } from '@shared/schemas/floorPlan';
import { ArmPlacement, LayoutCreateInput, LayoutUpdateInput, WorkPoint, Boundary } from '@shared/schemas/layout';
import { ProjectInput, ProjectUpdateInput } from '@shared/schemas/project';
import { UserCreateInput, UserUpdateInput } from '@shared/schemas/user';

const BAD = ['A\nB', 'A\rB', 'A\tB', 'A\u0000B', 'A\u007fB', 'A\u0085B', 'R1\n0\nLINE\n8\nEVIL'];

/** The message the schema gives for `field` of `value`, or null when it accepts it. */
function messageFor(schema: { safeParse(v: unknown): { success: boolean; error?: { issues: Array<{ path: PropertyKey[]; message: string }> } } }, base: object, field: string, value: string) {
  const r = schema.safeParse({ ...base, [field]: value });
  if (r.success) return null;
  return r.error!.issues.find((i) => i.path.join('.') === field)?.message ?? `other: ${r.error!.issues.map((i) => i.path.join('.')).join(',')}`;
}

describe('singleLineText', () => {
  it('trims, keeps ordinary text of any script, refuses every control character', () => {
    const s = singleLineText().max(40);
    expect(s.parse('  Fernhill line 3 — Zelle Ø 2  ')).toBe('Fernhill line 3 — Zelle Ø 2');
    for (const v of BAD) expect(s.safeParse(v).error?.issues[0].message, JSON.stringify(v)).toBe(SINGLE_LINE_MESSAGE);
  });

  const params = readDemoCatalogue()[0].params;
  const cases: Array<[string, Parameters<typeof messageFor>[0], object, string]> = [
    ['project name', ProjectInput, { name: 'P', clientName: 'C' }, 'name'],
    ['project client', ProjectInput, { name: 'P', clientName: 'C' }, 'clientName'],
    ['project site', ProjectInput, { name: 'P', clientName: 'C' }, 'siteName'],
    ['project update name', ProjectUpdateInput, {}, 'name'],
    ['layout name', LayoutCreateInput, { name: 'L' }, 'name'],
    ['layout update name', LayoutUpdateInput, { version: 1 }, 'name'],
    ['arm label', ArmPlacement, { id: 'R1', armModelId: 1, x: 0, y: 0, yaw: 0 }, 'label'],
    ['work point tag', WorkPoint, { id: 'P1', x: 0, y: 0, z: 0 }, 'tag'],
    ['boundary label', Boundary, { id: 'Z1', kind: 'keepout', points: [[0, 0], [1000, 0], [0, 1000]] }, 'label'],
    ['user name', UserCreateInput, { email: 'a@b.test', name: 'N', role: 'planner', password: 'long enough password 1' }, 'name'],
    ['user update name', UserUpdateInput, {}, 'name'],
    ['arm model name', ArmModelInput, { name: 'M', params }, 'name'],
    ['floor-plan layer name', LayerPatch, { name: 'WALLS' }, 'name'],
  ];
  for (const [what, schema, base, field] of cases) {
    it(`${what} refuses CR, LF, TAB and other control characters`, () => {
      for (const v of BAD) expect(messageFor(schema, base, field, v), JSON.stringify(v)).toBe(SINGLE_LINE_MESSAGE);
      expect(messageFor(schema, base, field, 'Cell 3 — north')).toBeNull();
    });
  }

  it('a project description may have line breaks and tabs, not other control characters', () => {
    expect(ProjectInput.safeParse({ name: 'P', clientName: 'C', description: 'line one\nline two\ttabbed' }).success).toBe(true);
    expect(ProjectInput.safeParse({ name: 'P', clientName: 'C', description: 'bell \u0007' }).success).toBe(false);
  });
});
