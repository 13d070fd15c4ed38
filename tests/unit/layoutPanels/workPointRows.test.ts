import { describe, expect, it } from 'vitest';
import { WorkPoint } from '@shared/schemas/layout';
import {
  editWorkPoint,
  filterWorkPointRows,
  newWorkPoint,
  nextWorkPointId,
  pointCoverage,
  removeWorkPoints,
  workPointRows,
} from '../../../frontend/src/components/layout/workPointRows';

const wp = (p: Partial<WorkPoint> & { id: string }): WorkPoint => WorkPoint.parse({ x: 0, y: 0, z: 0, ...p });
const ARMS = ['R1', 'R2', 'R3'];

describe('pointCoverage', () => {
  it('takes the best margin and lists reaching arms best first, ignoring arms no longer on the layout', () => {
    expect(pointCoverage({ R1: -20, R2: 35.5, R3: 0, R9: 900 }, ARMS)).toEqual({ best: 35.5, bestArm: 'R2', reachedBy: ['R2', 'R3'] });
    expect(pointCoverage({ R1: -20, R2: -5 }, ARMS)).toEqual({ best: -5, bestArm: 'R2', reachedBy: [] });
    expect(pointCoverage(undefined, ARMS)).toEqual({ best: null, bestArm: null, reachedBy: [] });
    expect(pointCoverage({}, ARMS).best).toBeNull();
  });

  it('builds table rows from the analysis, none without it', () => {
    const pts = [wp({ id: 'P1' }), wp({ id: 'P2' })];
    const rows = workPointRows(pts, ARMS, { coverage: { P1: { R1: 10 } }, findings: [], sharedZones: [], regions: {}, timingMs: 0 });
    expect(rows.map((r) => [r.point.id, r.best])).toEqual([['P1', 10], ['P2', null]]);
    expect(workPointRows(pts, ARMS, null).every((r) => r.best === null)).toBe(true);
  });
});

describe('editWorkPoint', () => {
  const pts = Object.freeze([wp({ id: 'P1', x: 100, assignedArm: 'R1' }), wp({ id: 'P2', tag: 'case' })]);

  it('sets a number, trims text, clears the assigned arm, and leaves the input alone', () => {
    const a = editWorkPoint(pts, 'P1', 'x', ' 1250.5 ', ARMS);
    expect(a.ok && a.points[0].x).toBe(1250.5);
    expect(pts[0].x).toBe(100);
    const b = editWorkPoint(pts, 'P2', 'tag', '  pallet L2 ', ARMS);
    expect(b.ok && b.points[1].tag).toBe('pallet L2');
    const c = editWorkPoint(pts, 'P1', 'assignedArm', '', ARMS);
    expect(c.ok && 'assignedArm' in c.points[0]).toBe(false);
    const d = editWorkPoint(pts, 'P1', 'id', 'P7', ARMS);
    expect(d.ok && d.points.map((p) => p.id)).toEqual(['P7', 'P2']);
  });

  it('rejects bad values with a message for the cell', () => {
    const msg = (field: Parameters<typeof editWorkPoint>[2], raw: string) => {
      const r = editWorkPoint(pts, 'P1', field, raw, ARMS);
      return r.ok ? 'ok' : r.message;
    };
    expect(msg('z', 'high')).toBe('z is not a number');
    expect(msg('z', ' ')).toBe('z is missing');
    expect(msg('id', 'P2')).toBe('id P2 is already used');
    expect(msg('id', '')).toBe('Give it an id');
    expect(msg('id', 'x'.repeat(25))).toBe('Id: use at most 24 characters');
    expect(msg('assignedArm', 'R9')).toBe('arm R9 is not on this cell layout');
    expect(msg('approach', 'side')).toBe('approach must be top or any');
    expect(msg('tag', 't'.repeat(61))).toMatch(/60/);
    expect(() => editWorkPoint(pts, 'P9', 'x', '1', ARMS)).toThrow('id P9 is not a work point of this cell layout');
  });
});

describe('new and removed points', () => {
  it('numbers new points one above the largest P-number and skips ids in use', () => {
    expect(nextWorkPointId([])).toBe('P1');
    expect(nextWorkPointId([wp({ id: 'P3' }), wp({ id: 'pallet-1' }), wp({ id: 'P12' })])).toBe('P13');
    const p = newWorkPoint([wp({ id: 'P2', x: 1000, y: 50, z: 900, tag: 'infeed' })]);
    expect(p).toEqual({ id: 'P3', x: 1500, y: 50, z: 900, approach: 'top', tag: 'infeed' });
    expect(newWorkPoint([])).toEqual({ id: 'P1', x: 0, y: 0, z: 0, approach: 'top', tag: '' });
  });

  it('removes the chosen ids only', () => {
    const pts = [wp({ id: 'P1' }), wp({ id: 'P2' }), wp({ id: 'P3' })];
    expect(removeWorkPoints(pts, new Set(['P2', 'P9'])).map((p) => p.id)).toEqual(['P1', 'P3']);
  });
});

describe('filterWorkPointRows', () => {
  const rows = [
    { point: wp({ id: 'P1', tag: 'infeed', assignedArm: 'R1' }), best: 20, bestArm: 'R1', reachedBy: ['R1'] },
    { point: wp({ id: 'P2', tag: 'pallet L1' }), best: -15, bestArm: 'R2', reachedBy: [] },
    { point: wp({ id: 'P3', tag: 'pallet L2' }), best: null, bestArm: null, reachedBy: [] },
  ];
  it('matches every word in id, tag, arms; "unreached" means best margin below 0', () => {
    expect(filterWorkPointRows(rows, 'pallet').map((r) => r.point.id)).toEqual(['P2', 'P3']);
    expect(filterWorkPointRows(rows, 'PALLET l2').map((r) => r.point.id)).toEqual(['P3']);
    expect(filterWorkPointRows(rows, 'r1').map((r) => r.point.id)).toEqual(['P1']);
    expect(filterWorkPointRows(rows, 'unreached').map((r) => r.point.id)).toEqual(['P2']);
    expect(filterWorkPointRows(rows, 'not reached').map((r) => r.point.id)).toEqual(['P2']);
    expect(filterWorkPointRows(rows, '  ').length).toBe(3);
  });
});

describe('pointCoverage walks only the arms near a point', () => {
  // Reference: the plain walk over every arm of the layout in its order (first best wins a tie).
  function reference(row: Record<string, number> | undefined, armIds: string[]) {
    if (!row) return { best: null, bestArm: null, reachedBy: [] as string[] };
    let best: number | null = null;
    let bestArm: string | null = null;
    const reached: Array<[string, number]> = [];
    for (const a of armIds) {
      const m = row[a];
      if (typeof m !== 'number' || Number.isNaN(m)) continue;
      if (best === null || m > best) {
        best = m;
        bestArm = a;
      }
      if (m >= 0) reached.push([a, m]);
    }
    reached.sort((p, q) => q[1] - p[1] || (p[0] < q[0] ? -1 : 1));
    return { best, bestArm, reachedBy: reached.map(([a]) => a) };
  }

  it('gives the same best arm, margin and reaching arms as the walk over every arm, ties and strangers included', () => {
    let seed = 42;
    const rand = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
    const armIds = Array.from({ length: 30 }, (_, i) => `R${i + 1}`);
    for (let n = 0; n < 2000; n++) {
      const row: Record<string, number> = {};
      const k = Math.floor(rand() * 6);
      for (let j = 0; j < k; j++) {
        const arm = rand() < 0.1 ? `X${j}` : armIds[Math.floor(rand() * armIds.length)];
        // Few distinct values, so ties (and the 0 mm edge) come up often.
        row[arm] = [-20, -0.5, 0, 0, 15, 15, 120][Math.floor(rand() * 7)];
      }
      expect(pointCoverage(row, armIds)).toEqual(reference(row, armIds));
    }
    expect(pointCoverage(undefined, armIds)).toEqual(reference(undefined, armIds));
  });
});
