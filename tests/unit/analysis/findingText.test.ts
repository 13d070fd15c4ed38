// What findings say: kinematic errors caught into findings read as sentences with labels (no
// property paths, no internal text), and the elements a finding concerns go by their names.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { armReachFromModels, ConcernLookup, concernsText, createAnalyzer, findingConcerns, type ArmReachFactory, type Finding } from '@shared/analysis';
import type { ArmPlacement, LayoutContent } from '@shared/schemas/layout';

const samples = path.resolve(__dirname, '../../../samples');
const params = (file: string) => (JSON.parse(readFileSync(path.join(samples, 'arm-models', file), 'utf8')) as { params: Record<string, unknown> }).params;
const articulated = params('demo-articulated-1400.json');

/** Property names, dotted paths and the internal prefixes kinematic errors used to carry. */
const INTERNAL = /\b[a-z]+[A-Z]\w*\b|\b[A-Za-z_]\w*\.(?:[A-Za-z_]\w*|\d+\b)|\brestrict:|\bparams\b|\bmodel \d+/;

function findingsOf(arms: ArmPlacement[], reachFor: ArmReachFactory): Finding[] {
  return createAnalyzer(reachFor).analyze({ arms, workPoints: [], boundaries: [], workHeights: [900], floor: null }).findings;
}
const arm = (over: Partial<ArmPlacement> = {}): ArmPlacement => ({ id: 'R3', armModelId: 1, label: 'Case packer', x: 0, y: 0, yaw: 0, mountHeight: 0, ...over });
const reachFinding = (fs: Finding[]) => fs.find((f) => f.kind === 'unknown-model');

describe('findings of arms whose reach cannot be built', () => {
  it('a model with bad parameters: the field by its label, no path', () => {
    const axes = articulated.axes as Array<Record<string, number>>;
    const bad = { ...articulated, axes: [axes[0], { ...axes[1], max: axes[1].min - 10 }, axes[2]], stopTimeS: 0 };
    const f = reachFinding(findingsOf([arm()], armReachFromModels(new Map([[1, bad]]))));
    expect(f?.arms).toEqual(['R3']);
    expect(f?.message).toBe('Case packer: its reach could not be computed (in its arm model, J2 max must be greater than J2 min).');
    expect(f?.message).not.toMatch(INTERNAL);
    // The same for a stopping time of 0 s alone: label and unit.
    const stop = reachFinding(findingsOf([arm()], armReachFromModels(new Map([[1, { ...articulated, stopTimeS: 0 }]]))));
    expect(stop?.message).toBe('Case packer: its reach could not be computed (in its arm model, stop time (category 0) must be greater than 0 s).');
  });

  it('J1 limits outside the model’s range, and a model no longer in the catalogue', () => {
    const limits = reachFinding(findingsOf([arm({ restrict: { j1Min: 200, j1Max: 210 } })], armReachFromModels(new Map([[1, articulated]]))));
    const j1 = (articulated.axes as Array<{ min: number; max: number }>)[0];
    const deg = (v: number) => `${v < 0 ? '−' : ''}${Math.abs(v)}°`;
    expect(limits?.message).toBe(`Case packer: its reach could not be computed (its J1 limits 200° to 210° do not overlap the arm model's J1 range ${deg(j1.min)} to ${deg(j1.max)}).`);
    const missing = reachFinding(findingsOf([arm({ label: '' })], armReachFromModels(new Map())));
    expect(missing?.message).toBe('R3: its reach could not be computed (its arm model is not in the catalogue: choose one that is).');
    for (const m of [limits?.message, missing?.message]) expect(m).not.toMatch(INTERNAL);
  });

  it('keeps the text of an internal failure out of the finding', () => {
    const failing: ArmReachFactory = () => {
      throw new Error('pointFn: no pose over the axis ranges assembles (axes[1].min)');
    };
    const f = reachFinding(findingsOf([arm()], failing));
    expect(f?.message).toBe('Case packer: its reach could not be computed (check its arm model and its J1 limits).');
  });
});

describe('what a finding concerns', () => {
  const content: Pick<LayoutContent, 'arms' | 'boundaries' | 'workPoints'> = {
    arms: [arm({ id: 'R1', label: 'Picker 1' }), arm({ id: 'R2', label: '' })],
    boundaries: [
      { id: 'F1', kind: 'fence', label: 'Cell guard', points: [[0, 0], [10, 0]], height: 2000 },
      { id: 'O1', kind: 'opening', label: '', points: [[2, 0], [4, 0]], fenceId: 'F1' },
    ],
    workPoints: [{ id: 'P1', x: 0, y: 0, z: 900, approach: 'top', tag: 'infeed' }],
  };
  const finding = (id: string, arms: string[] = [], points: string[] = []) => ({ id, arms, points });

  it('names arms, boundaries, layers and work points by their labels, never by the finding id', () => {
    expect(concernsText(findingConcerns(finding('reach-beyond-fence:R1+F1', ['R1']), content))).toBe('Arm R1 (Picker 1) · Fence F1 (Cell guard)');
    expect(concernsText(findingConcerns(finding('opening-too-close:O1+R2', ['R2']), content))).toBe('Arm R2 · Access opening O1');
    expect(concernsText(findingConcerns(finding('shared-zone:R1+R2', ['R1', 'R2'], ['P1']), content))).toBe('Arms R1 (Picker 1), R2 · Work point P1 (infeed)');
    expect(concernsText(findingConcerns(finding('reach-into-structure:R1+COLUMNS', ['R1']), content))).toBe('Arm R1 (Picker 1) · Layer “COLUMNS”');
    expect(concernsText(findingConcerns(finding('base-on-column:R2+COLUMNS#4', ['R2']), content))).toBe('Arm R2 · Layer “COLUMNS”');
    expect(concernsText(findingConcerns(finding('computation-failed:fence+F1'), content))).toBe('Fence F1 (Cell guard)');
    expect(concernsText(findingConcerns(finding('fence-too-low:F1'), content))).toBe('Fence F1 (Cell guard)');
    // A finding of an earlier revision whose elements are gone names what is left (here nothing).
    expect(concernsText(findingConcerns(finding('reach-beyond-fence:R7+F9'), content))).toBe('');
    const many = Array.from({ length: 9 }, (_v, i) => `P${i + 1}`);
    expect(concernsText(findingConcerns(finding('unreached-point:P1', [], many), content))).toBe('Work points P1 (infeed), P2, P3, P4, P5, P6 and 3 more');
  });

  it('answers the same through a lookup built once for the layout (as the findings lists use it)', () => {
    const lookup = new ConcernLookup(content);
    const many = Array.from({ length: 9 }, (_v, i) => `P${i + 1}`);
    const cases = [
      finding('reach-beyond-fence:R1+F1', ['R1']),
      finding('opening-too-close:O1+R2', ['R2']),
      finding('shared-zone:R1+R2', ['R1', 'R2'], ['P1']),
      finding('base-on-column:R2+COLUMNS#4', ['R2']),
      finding('computation-failed:fence+F1'),
      finding('reach-beyond-fence:R7+F9'),
      finding('unreached-point:P1', [], many),
    ];
    for (const f of cases) expect(findingConcerns(f, lookup)).toEqual(findingConcerns(f, content));
    expect(concernsText(findingConcerns(finding('shared-zone:R1+R2', ['R1', 'R2'], ['P1']), lookup))).toBe('Arms R1 (Picker 1), R2 · Work point P1 (infeed)');
    // A lookup is of the content it was built from: a label changed later shows with a new one.
    const renamed = { ...content, arms: [arm({ id: 'R1', label: 'Picker 9' }), arm({ id: 'R2', label: '' })] };
    expect(concernsText(findingConcerns(finding('fence-too-low:F1', ['R1']), new ConcernLookup(renamed)))).toBe('Arm R1 (Picker 9) · Fence F1 (Cell guard)');
  });
});
