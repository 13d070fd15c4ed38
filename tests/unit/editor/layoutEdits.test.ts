import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { LayoutContent } from '@shared/schemas/layout';
import {
  addArm,
  addBoundary,
  duplicateArm,
  moveBoundaryVertex,
  nearestOnPolyline,
  nextFreeId,
  normalizeYaw,
  nudgeArm,
  removeArm,
  removeBoundary,
  rotateArm,
  setWorkHeights,
  updateArm,
} from '../../../frontend/src/editor/layoutEdits';

const empty = (): LayoutContent => ({ arms: [], workPoints: [], boundaries: [], workHeights: [] });
const deepFreeze = <T>(o: T): T => {
  if (o && typeof o === 'object') {
    Object.values(o).forEach(deepFreeze);
    Object.freeze(o);
  }
  return o;
};

describe('layout edits', () => {
  it('numbers arms R1, R2 … reusing the lowest free number', () => {
    expect(nextFreeId('R', [])).toBe('R1');
    expect(nextFreeId('R', ['R1', 'R3'])).toBe('R2');
    let c = empty();
    for (let i = 0; i < 3; i++) c = addArm(c, 7, [i * 1000, 0]).content;
    expect(c.arms.map((a) => a.id)).toEqual(['R1', 'R2', 'R3']);
    c = removeArm(c, 'R2');
    expect(addArm(c, 7, [0, 0]).id).toBe('R2');
  });

  it('never mutates its input and keeps the content valid for the schema', () => {
    const c0 = deepFreeze(addArm(addArm(empty(), 3, [0, 0]).content, 3, [2000, 0]).content);
    const steps = [
      nudgeArm(c0, 'R1', 10, -100),
      rotateArm(c0, 'R2', -5),
      duplicateArm(c0, 'R1').content,
      updateArm(c0, 'R1', { restrict: { j1Min: -90, j1Max: 90 }, label: 'picker' }),
      removeArm(c0, 'R1'),
      addBoundary(c0, 'fence', [[-3000, 3000], [3000, 3000], [3000, -3000]], { height: 2000 }).content,
      setWorkHeights(c0, [900, 300, 900]),
    ];
    for (const s of steps) expect(LayoutContent.safeParse(s).success).toBe(true);
    expect(c0.arms[0]).toMatchObject({ x: 0, y: 0, yaw: 0 });
  });

  it('wraps yaw into (−180°, 180°] and turns by steps without drift', () => {
    expect(normalizeYaw(180)).toBe(180);
    expect(normalizeYaw(-180)).toBe(180);
    expect(normalizeYaw(190)).toBe(-170);
    expect(normalizeYaw(-725)).toBe(-5);
    let c = addArm(empty(), 1, [0, 0]).content;
    // 72 turns of 5° make a full turn: back at 0.
    for (let i = 0; i < 72; i++) c = rotateArm(c, 'R1', 5);
    expect(c.arms[0].yaw).toBe(0);
    fc.assert(
      fc.property(fc.double({ min: -1e5, max: 1e5, noNaN: true }), (d) => {
        const y = normalizeYaw(d);
        // Same direction: the difference is a whole number of turns (within the 0.001° rounding).
        const turns = (d - y) / 360;
        return y > -180 && y <= 180 && Math.abs(turns - Math.round(turns)) < 1e-5 + 0.001 / 360;
      }),
    );
  });

  it('removing an arm unassigns its work points (the schema forbids a dangling arm)', () => {
    const c = { ...addArm(empty(), 1, [0, 0]).content, workPoints: [{ id: 'P1', x: 1, y: 2, z: 3, approach: 'top' as const, tag: '', assignedArm: 'R1' }] };
    const r = removeArm(c, 'R1');
    expect(r.workPoints[0].assignedArm).toBeUndefined();
    expect(LayoutContent.safeParse(r).success).toBe(true);
  });

  it('finds the nearest point of a polyline (perpendicular foot, worked by hand)', () => {
    // Segment (0,0)–(8,0), point (3,4): the foot is (3,0), distance 4; segment (8,0)–(8,6): foot (8,4), distance 5.
    const n = nearestOnPolyline([[0, 0], [8, 0], [8, 6]], [3, 4])!;
    expect(n.point).toEqual([3, 0]);
    expect(n.distance).toBe(4);
    // Past the end of the line: the end point, at the 3-4-5 distance.
    const e = nearestOnPolyline([[0, 0], [8, 0]], [11, 4])!;
    expect(e.point).toEqual([8, 0]);
    expect(e.distance).toBe(5);
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: -5000, max: 5000 }), fc.integer({ min: -5000, max: 5000 })), { minLength: 2, maxLength: 6 }),
        fc.tuple(fc.integer({ min: -6000, max: 6000 }), fc.integer({ min: -6000, max: 6000 })),
        (line, p) => {
          const r = nearestOnPolyline(line as Array<[number, number]>, p as [number, number])!;
          // Never farther than any vertex, and the reported distance is that of the reported point.
          const toVertex = Math.min(...line.map(([x, y]) => Math.hypot(x - p[0], y - p[1])));
          return r.distance <= toVertex + 1e-9 && Math.abs(Math.hypot(r.point[0] - p[0], r.point[1] - p[1]) - r.distance) < 1e-9;
        },
      ),
    );
  });

  it('snaps an opening onto the nearest fence and keeps it there when the fence moves', () => {
    let c = addBoundary(empty(), 'fence', [[0, 0], [6000, 0], [6000, 4000]], { height: 2000 }).content;
    const r = addBoundary(c, 'opening', [[1000, 120], [2200, -80]]);
    c = r.content;
    const o = c.boundaries.find((z) => z.id === r.id)!;
    expect(r.id).toBe('O1');
    expect(o.fenceId).toBe('F1');
    expect(o.points).toEqual([[1000, 0], [2200, 0]]);
    // Moving the fence's first corner up by 1000 mm tilts the first run; the opening follows onto it.
    c = moveBoundaryVertex(c, 'F1', 0, [0, 1000]);
    const moved = c.boundaries.find((z) => z.id === 'O1')!;
    for (const [x, y] of moved.points) expect(nearestOnPolyline(c.boundaries[0].points as Array<[number, number]>, [x, y])!.distance).toBeLessThan(0.1);
    expect(LayoutContent.safeParse(c).success).toBe(true);
    // Removing the fence removes its opening.
    expect(removeBoundary(c, 'F1').boundaries).toEqual([]);
  });

  it('refuses shapes the schema would refuse, naming the argument', () => {
    expect(() => addBoundary(empty(), 'opening', [[0, 0], [1, 1]])).toThrow(/^points: .*fence/);
    expect(() => addBoundary(empty(), 'keepout', [[0, 0], [1, 1]])).toThrow(/^points: .*3/);
    expect(() => addBoundary(empty(), 'fence', [[0, 0], [1, 1]])).toThrow(/^height:/);
    expect(() => nudgeArm(empty(), 'R9', 1, 1)).toThrow(/^id: no arm R9/);
  });

  it('keeps work heights distinct and sorted', () => {
    expect(setWorkHeights(empty(), [1200, 300, 1200.04, 850]).workHeights).toEqual([300, 850, 1200]);
  });
});
