import { describe, expect, it } from 'vitest';
import { armReachFor } from '@shared/analysis/armReach';
import { sectionCutOf, sectionOf, type SectionArm, type SectionInput } from '@shared/analysis/section';
import type { ArmEnvelope, PreparedFloor } from '@shared/analysis/types';
import { profileColumnAt, profileColumnIndex, profileSliceAt } from '@shared/kinematics/profile';
import { reachProfileOf, parseArmParams } from '@shared/kinematics';
import type { Boundary } from '@shared/schemas/layout';
import { ax, deepFreeze } from '../kinematics/fixtures';

/** Horizontal slice of cut polygons at height z: s-intervals, mm (the same even–odd slicer as the profile's). */
const widthAt = (polygons: SectionArm['envelope']['profile'], z: number) => profileSliceAt({ polygons }, z);

/** A hand-built envelope: the rectangle r0…r1 × z0…z1 turned over a J1 range (degrees). */
function boxEnvelope(r0: number, r1: number, z0: number, z1: number, j1 = { min: -180, max: 180 }): ArmEnvelope {
  return { profile: [[[[r0, z0], [r1, z0], [r1, z1], [r0, z1]]]], toleranceMm: 0, j1RangeDeg: j1, lateralMm: { min: 0, max: 0 } };
}

/** The tool point's side profile as an envelope over full J1: the section geometry checked against closed forms. */
function toolEnvelope(raw: unknown): ArmEnvelope {
  const prof = reachProfileOf(parseArmParams(raw));
  return { profile: prof.polygons, toleranceMm: prof.toleranceMm, j1RangeDeg: { min: -180, max: 180 }, lateralMm: { min: 0, max: 0 } };
}

const input = (over: Partial<SectionInput>): SectionInput => ({ line: [[0, 0], [5000, 0]], floor: null, boundaries: [], arms: [], ...over });

describe('section: an arm space cut through its J1 axis', () => {
  it('a full-range SCARA gives the planar 2R annulus on both sides', () => {
    // Planar 2R reach (Spong, Hutchinson & Vidyasagar, "Robot Modeling and Control", planar elbow
    // arm; law of cosines): outer radius l1 + l2, inner √(l1² + l2² + 2·l1·l2·cos ψmax) for |ψ| ≤ ψmax < 180°.
    const params = { family: 'scara', innerLink: 325, outerLink: 275, strokeMin: 480, strokeMax: 680, axes: [ax(-180, 180), ax(-145, 145)] };
    const env = toolEnvelope(params);
    const outer = 325 + 275;
    const inner = Math.sqrt(325 ** 2 + 275 ** 2 + 2 * 325 * 275 * Math.cos((145 * Math.PI) / 180));
    const c = 2500;
    const cut = sectionCutOf([[0, 0], [5000, 0]], { id: 'R1', label: 'Picker', pose: { x: c, y: 0, yaw: 30, mountHeight: 400 }, envelope: env });
    expect(cut).not.toBeNull();
    expect(cut!.spans).toHaveLength(2);
    const [[a0, a1], [b0, b1]] = cut!.spans;
    expect(a0).toBeCloseTo(c - outer, 4);
    expect(a1).toBeCloseTo(c - inner, 4);
    expect(b0).toBeCloseTo(c + inner, 4);
    expect(b1).toBeCloseTo(c + outer, 4);
    // Heights: the stroke, shifted up by the mount height.
    expect(cut!.zMin).toBeCloseTo(480 + 400, 9);
    expect(cut!.zMax).toBeCloseTo(680 + 400, 9);
    const mid = widthAt(cut!.polygons, 580 + 400);
    expect(mid[0][0]).toBeCloseTo(c - outer, 1);
    expect(mid[mid.length - 1][1]).toBeCloseTo(c + outer, 1);
  });

  it('a full-range articulated arm: symmetric, width at a height = twice the profile reach there (annulus closed form)', () => {
    // No shoulder or elbow offset and full J2/J3: the wrist sweeps an annulus about the shoulder,
    // radii |l2 − l3| … l2 + l3 (planar 2R workspace, Spong et al.). At a height dz above the shoulder
    // its outer half-width is √((l2 + l3)² − dz²).
    const params = parseArmParams({ family: 'articulated', shoulderHeight: 900, shoulderOffset: 0, upperArm: 500, forearm: 300, axes: [ax(-180, 180), ax(-180, 180), ax(-180, 180)] });
    const env = toolEnvelope(params);
    const tol = env.toleranceMm + 1; // the profile's stated tolerance plus one sample step
    const c = 2000;
    const cut = sectionCutOf([[c, -3000], [c, 3000]], { id: 'R3', label: 'Packer', pose: { x: c, y: 0, yaw: 0, mountHeight: 0 }, envelope: env })!;
    for (const dz of [0, 150, 500, -500]) {
      const z = 900 + dz;
      const slice = widthAt(cut.polygons, z);
      const lo = slice[0][0] - 3000;
      const hi = slice[slice.length - 1][1] - 3000;
      expect(Math.abs(lo + hi)).toBeLessThan(tol); // symmetric about the J1 axis
      expect(Math.abs(hi - Math.sqrt(800 ** 2 - dz ** 2))).toBeLessThan(tol);
      const reach = Math.max(...profileSliceAt(reachProfileOf(params), z).map(([r0, r1]) => Math.max(Math.abs(r0), Math.abs(r1))));
      expect(Math.abs(hi - lo - 2 * reach)).toBeLessThan(2 * tol);
    }
    // The hole of the annulus: at the shoulder height the cut stops 200 mm either side of the axis.
    const atShoulder = widthAt(cut.polygons, 900);
    expect(atShoulder).toHaveLength(2);
    expect(Math.abs(atShoulder[0][1] - 3000 + 200)).toBeLessThan(tol);
  });

  it('the whole-arm envelope cuts at least as wide as the tool point alone', () => {
    const params = { family: 'scara', innerLink: 325, outerLink: 275, strokeMin: 480, strokeMax: 680, axes: [ax(-180, 180), ax(-145, 145)] };
    const line: [[number, number], [number, number]] = [[0, 0], [5000, 0]];
    const pose = { x: 2500, y: 0, yaw: 30, mountHeight: 400 };
    const tool = sectionCutOf(line, { id: 'R1', label: '', pose, envelope: toolEnvelope(params) })!;
    const whole = sectionCutOf(line, { id: 'R1', label: '', pose, envelope: armReachFor(params, undefined).envelope })!;
    expect(whole.spans[0][0]).toBeLessThanOrEqual(tool.spans[0][0]);
    expect(whole.spans[whole.spans.length - 1][1]).toBeGreaterThanOrEqual(tool.spans[tool.spans.length - 1][1]);
    expect(whole.zMax).toBeGreaterThanOrEqual(tool.zMax);
  });

  it('a line that misses the arm gives no cut', () => {
    const arm: SectionArm = { id: 'R1', label: '', pose: { x: 2500, y: 2000, yaw: 0 }, envelope: boxEnvelope(300, 1200, 100, 900) };
    expect(sectionCutOf([[0, 0], [5000, 0]], arm)).toBeNull();
    expect(sectionOf(input({ arms: [arm] })).arms).toEqual([]);
  });

  it('a restricted J1 range cuts only one side', () => {
    const env = boxEnvelope(300, 1200, 0, 500, { min: -90, max: 90 });
    const cut = sectionCutOf([[0, 0], [5000, 0]], { id: 'R1', label: '', pose: { x: 2500, y: 0, yaw: 0 }, envelope: env })!;
    expect(cut.spans).toHaveLength(1);
    expect(cut.spans[0][0]).toBeCloseTo(2800, 4);
    expect(cut.spans[0][1]).toBeCloseTo(3700, 4);
    // Turned by yaw 180°, the same limits face the other way.
    const back = sectionCutOf([[0, 0], [5000, 0]], { id: 'R1', label: '', pose: { x: 2500, y: 0, yaw: 180 }, envelope: env })!;
    expect(back.spans).toHaveLength(1);
    expect(back.spans[0][0]).toBeCloseTo(1300, 4);
    expect(back.spans[0][1]).toBeCloseTo(2200, 4);
  });

  it('cuts along a line off the axis follow the J1 limit ray exactly', () => {
    // Line y = 500 across an arm at the origin with J1 0…90°: the space starts where the bearing is
    // 90° (s = x = 0) and the radial reach ends at x = √(1200² − 500²) (Pythagoras).
    const env = boxEnvelope(0, 1200, 0, 500, { min: 0, max: 90 });
    const cut = sectionCutOf([[-2000, 500], [2000, 500]], { id: 'R1', label: '', pose: { x: 0, y: 0, yaw: 0 }, envelope: env })!;
    expect(cut.spans).toHaveLength(1);
    expect(cut.spans[0][0]).toBeCloseTo(2000, 4);
    expect(cut.spans[0][1]).toBeCloseTo(2000 + Math.sqrt(1200 ** 2 - 500 ** 2), 4);
  });
});

describe('section: fences, structure, floor', () => {
  const fence: Boundary = { id: 'F1', kind: 'fence', label: 'Cell fence', points: [[3000, -1000], [3000, 1000]], height: 1400 };
  const arm: SectionArm = { id: 'R1', label: 'Picker', pose: { x: 1000, y: 0, yaw: 0 }, envelope: boxEnvelope(300, 1200, 100, 900) };

  it('the fence numbers on a hand-built case: fence at s = 3000, space ends at s = 2200 → c = 800', () => {
    const r = sectionOf(deepFreeze(input({ boundaries: [fence], arms: [arm] })));
    expect(r.fences).toEqual([{ id: 'F1', label: 'Cell fence', s: 3000, height: 1400 }]);
    expect(r.dimensions).toHaveLength(1);
    const d = r.dimensions[0];
    expect(d.b).toBe(1400);
    expect(d.a).toBeCloseTo(900, 9);
    expect(d.c).toBeCloseTo(800, 4);
    expect(d.toS).toBeCloseTo(2200, 4);
    expect(d.armId).toBe('R1');
    // The space reaching past the fence gives c = 0.
    const close = sectionOf(input({ boundaries: [fence], arms: [{ ...arm, pose: { x: 2000, y: 0, yaw: 0 } }] }));
    expect(close.dimensions[0].c).toBe(0);
  });

  it('an opening cut into the fence is not a solid crossing', () => {
    const opening: Boundary = { id: 'O1', kind: 'opening', label: 'Door', points: [[3000, -500], [3000, 500]], fenceId: 'F1' };
    const r = sectionOf(input({ boundaries: [fence, opening], arms: [arm] }));
    expect(r.fences).toEqual([]);
    expect(r.openings).toEqual([{ id: 'O1', label: 'Door', s: 3000 }]);
    expect(r.dimensions).toEqual([]);
  });

  it('a wall crossed gives its s-interval and top; a full-height column has top null', () => {
    const floor: PreparedFloor = {
      outline: [[[[-100, -5000], [4500, -5000], [4500, 5000], [-100, 5000]]]],
      structures: [
        { id: 'walls#3', layer: 'walls', role: 'wall', top: 2500, polygons: [[[[4000, -300], [4200, -300], [4200, 300], [4000, 300]]]], lines: [], bbox: [4000, -300, 4200, 300] },
        { id: 'columns#1', layer: 'columns', role: 'column', top: Infinity, polygons: [[[[1500, -200], [1900, -200], [1900, 200], [1500, 200]]]], lines: [], bbox: [1500, -200, 1900, 200] },
        { id: 'walls#4', layer: 'walls', role: 'wall', top: 3000, polygons: [], lines: [[[600, -100], [600, 100]]], bbox: [600, -100, 600, 100] },
      ],
    };
    const r = sectionOf(input({ floor }));
    expect(r.structures).toEqual([
      { id: 'walls#4', layer: 'walls', role: 'wall', s: [600, 600], top: 3000 },
      { id: 'columns#1', layer: 'columns', role: 'column', s: [1500, 1900], top: null },
      { id: 'walls#3', layer: 'walls', role: 'wall', s: [4000, 4200], top: 2500 },
    ]);
    expect(r.floor).toEqual([[0, 4500]]);
    expect(sectionOf(input({})).floor).toEqual([[0, 5000]]);
  });

  it('refuses a section line whose ends coincide or are not numbers', () => {
    expect(() => sectionOf(input({ line: [[10, 10], [10, 10]] }))).toThrow(/at least 1 mm apart/);
    expect(() => sectionOf(input({ line: [[Number.NaN, 0], [10, 10]] }))).toThrow(/start x/);
  });
});

describe('profileColumnAt', () => {
  it('a rectangle profile: the vertical slice is its height interval inside, nothing outside', () => {
    const p = { polygons: boxEnvelope(300, 1200, 100, 900).profile };
    expect(profileColumnAt(p, 500)).toEqual([[100, 900]]);
    expect(profileColumnAt(p, 200)).toEqual([]);
    expect(profileColumnAt(p, 1300)).toEqual([]);
  });

  it('the bucketed index gives the same intervals as the plain scan on a traced profile', () => {
    const profile = reachProfileOf(parseArmParams({ family: 'articulated', shoulderHeight: 450, shoulderOffset: 150, upperArm: 610, forearm: 660, elbowOffset: 115, axes: [ax(-170, 170), ax(-60, 145), ax(-200, 70)] }));
    const idx = profileColumnIndex(profile);
    for (let r = -1600; r <= 1600; r += 37.3) expect(idx(r)).toEqual(profileColumnAt(profile, r));
  });
});
