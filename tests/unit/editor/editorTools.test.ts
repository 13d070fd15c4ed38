import { describe, expect, it } from 'vitest';
import type { LayoutContent, Boundary } from '@shared/schemas/layout';
import { drawHint, isRepeatClick, openingEndAt, pointsNeeded } from '../../../frontend/src/components/layout/tools/drawBoundaryTool';
import { draggedBase } from '../../../frontend/src/components/layout/tools/moveArmTool';
import { turnYaw } from '../../../frontend/src/components/layout/tools/turnArmTool';

const fence = (id: string, points: Array<[number, number]>): Boundary => ({ id, kind: 'fence', label: '', points, height: 1400 }) as Boundary;
const content = (boundaries: Boundary[]): LayoutContent => ({ arms: [], workPoints: [], boundaries, workHeights: [] });

describe('turn angle', () => {
  // Direction angle atan2(dy, dx): tan 45° = 1, tan 60° = √3 (standard trigonometry table values).
  it('points J1 zero from the base at the pointer, degrees CCW from +x', () => {
    expect(turnYaw([0, 0], [1, 0])).toBe(0);
    expect(turnYaw([0, 0], [1, 1])).toBe(45);
    expect(turnYaw([100, 200], [100 + 1, 200 + Math.sqrt(3)])).toBe(60);
    expect(turnYaw([0, 0], [0, 5])).toBe(90);
    expect(turnYaw([0, 0], [0, -5])).toBe(-90);
    expect(turnYaw([0, 0], [-1, -1])).toBe(-135);
  });

  it('gives 180 (not -180) straight west and rounds to 0.1°', () => {
    expect(turnYaw([0, 0], [-3, 0])).toBe(180);
    // atan(1/1000) = 0.0573° (small-angle: ≈ 1/1000 rad × 57.2958 °/rad)
    expect(turnYaw([0, 0], [1000, 1])).toBe(0.1);
    expect(turnYaw([0, 0], [1000, -1])).toBe(-0.1);
  });
});

describe('dragged base', () => {
  it('keeps the grab offset and rounds to 0.1 mm', () => {
    expect(draggedBase([10, -5], [100.04, 200.06])).toEqual([110, 195.1]);
    expect(draggedBase([0, 0], [-0.06, 0.05])).toEqual([-0.1, 0.1]);
  });
});

describe('opening snapping', () => {
  const c = content([fence('F1', [[0, 0], [1000, 0], [1000, 1000]])]);

  // Orthogonal projection of the click onto the nearest fence segment, clamped to it.
  it('puts the end at the foot of the perpendicular on the nearest run', () => {
    expect(openingEndAt(c, [500, 10], 1)).toEqual({ ok: true, at: [500, 0] });
    expect(openingEndAt(c, [1010, 400], 1)).toEqual({ ok: true, at: [1000, 400] });
  });

  it('takes a click within 24 px on screen only, whatever the zoom', () => {
    expect(openingEndAt(c, [500, 30], 1)).toEqual({ ok: false, reason: 'off-fence' });
    // At 0.5 px per mm, 30 mm is 15 px on screen.
    expect(openingEndAt(c, [500, 30], 0.5)).toEqual({ ok: true, at: [500, 0] });
  });

  it('says when there is no fence to cut into', () => {
    expect(openingEndAt(content([]), [0, 0], 1)).toEqual({ ok: false, reason: 'no-fence' });
  });
});

describe('drawing by clicks', () => {
  it('treats a click within 4 px of the last corner as the second click of a double-click', () => {
    expect(isRepeatClick([0, 0], [3, 0], 1)).toBe(true);
    expect(isRepeatClick([0, 0], [3, 0], 2)).toBe(false);
    expect(isRepeatClick(undefined, [0, 0], 1)).toBe(false);
  });

  it('needs two corners for lines and three for areas, and says so', () => {
    expect([pointsNeeded('fence'), pointsNeeded('opening'), pointsNeeded('keepout'), pointsNeeded('operator')]).toEqual([2, 2, 3, 3]);
    expect(drawHint('fence', 0)).toMatch(/first corner/);
    expect(drawHint('fence', 1)).toMatch(/^1 point — /);
    expect(drawHint('operator', 2)).toMatch(/2 of at least 3/);
    expect(drawHint('keepout', 3)).toMatch(/closes the area/);
  });
});
