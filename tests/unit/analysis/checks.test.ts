// The words an empty findings list shows: which checks ran on the cell layout. Each listed check is
// tied to the analyzer: the condition that lists it is the one under which the analyzer can report it.
import { describe, expect, it } from 'vitest';
import { checkedFloorOf, checksRun, createAnalyzer, noFindingsSentence, type AnalysisInput } from '@shared/analysis';
import { diskReach } from '../../support/diskReach';

const arm = (id: string, x: number, y: number) => ({ id, armModelId: 1000, label: '', x, y, yaw: 0, mountHeight: 0 });
const base = (): AnalysisInput => ({ arms: [], workPoints: [], boundaries: [], workHeights: [900], floor: null });

describe('checks run on a cell layout', () => {
  it('an empty layout says what to add, not "no findings"', () => {
    expect(checksRun(base(), null)).toEqual([]);
    expect(noFindingsSentence(base(), null)).toBe('Nothing to check yet: place an arm or add work points, and the checks run as you edit.');
  });

  it('lists shared zones only from two arms on, which is when the analyzer can report one', () => {
    const one = { ...base(), arms: [arm('R1', 0, 0)] };
    const two = { ...base(), arms: [arm('R1', 0, 0), arm('R2', 1500, 0)] };
    expect(checksRun(one, null).some((c) => c.includes('shared zones'))).toBe(false);
    expect(checksRun(two, null).some((c) => c.includes('shared zones'))).toBe(true);
    const a = createAnalyzer(diskReach);
    expect(a.analyze(two).findings.some((f) => f.kind === 'shared-zone')).toBe(true);
  });

  it('a layout with no findings names the checks it passed, fences and openings among them', () => {
    const content: AnalysisInput = {
      ...base(),
      arms: [arm('R1', 0, 0), arm('R2', 5000, 0)],
      workPoints: [{ id: 'P1', x: 500, y: 0, z: 900, approach: 'top', tag: '' }],
      boundaries: [{ id: 'F1', kind: 'fence', label: '', points: [[-3000, 3000], [8000, 3000]], height: 2200 }],
    };
    const r = createAnalyzer(diskReach).analyze(content);
    expect(r.findings.map((f) => f.kind)).toEqual([]);
    const s = noFindingsSentence(content, null);
    expect(s.startsWith('No findings from the checks run on this cell layout: every work point reached by an arm')).toBe(true);
    expect(s).toContain('shared zones of every pair of arms');
    expect(s).toContain('reach beyond guard fences');
    expect(s).not.toContain('access openings');
    expect(s).not.toContain('floor outline');
  });

  it('reads the floor plan from its layer roles; ignored layers check nothing', () => {
    expect(checkedFloorOf(null)).toBeNull();
    expect(checkedFloorOf([{ role: 'ignore' }])).toEqual({ outline: false, structure: false });
    expect(checkedFloorOf([{ role: 'outline' }, { role: 'column' }])).toEqual({ outline: true, structure: true });
    const withFloor = checksRun({ ...base(), arms: [arm('R1', 0, 0)] }, { outline: true, structure: true });
    expect(withFloor).toContain('arm bases on the floor outline');
    expect(withFloor).toContain('crushing gaps between restricted spaces and structure or fences (ISO 13854)');
  });
});
