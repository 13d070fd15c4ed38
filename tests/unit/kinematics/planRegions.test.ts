import { describe, expect, it } from 'vitest';
import { polygonsArea } from '@shared/geometry/area';
import { sectorArea } from '@shared/geometry/annularSector';
import { armPose } from '@shared/geometry/frames';
import { geoJSONToPolygons } from '@shared/geometry/geojson';
import { pointInPolygons } from '@shared/geometry/pointInPolygon';
import { parseArmParams, reachProfileOf } from '@shared/kinematics/families';
import {
  bandAt,
  bandPolygons,
  bandSectors,
  maximumSpacePolygons,
  restrictedBelowPolygons,
  restrictedSpacePolygons,
} from '@shared/kinematics/planRegions';
import { profileProjection, profileSliceAt } from '@shared/kinematics/profile';
import { envelopeProfileOf } from '@shared/kinematics/envelope';
import { ax, articulatedSets, deepFreeze, linkageSets, scaraSets } from './fixtures';

const full = [ax(-180, 180), ax(-180, 180)];

describe('reach bands and spaces', () => {
  it('band of a full-circle scara matches the annular sector formula to 0.1 % (0.25 mm chords)', () => {
    // Source: annular sector area A = (θ/2)(R² − r²) (docs/sources.md "Geometry" [derived]).
    const s = parseArmParams({ family: 'scara', innerLink: 400, outerLink: 250, strokeMin: 0, strokeMax: 300, toolLength: 50, axes: full });
    const band = bandPolygons(s, 100, null, 0.25);
    const exact = sectorArea(150, 650, 360);
    expect(polygonsArea(band)).toBeGreaterThanOrEqual(exact);
    expect(polygonsArea(band) / exact).toBeLessThan(1.001);
    // Flange height 100 + 50 is inside the stroke; a tool point at 280 puts the flange above it.
    expect(bandPolygons(s, 280)).toEqual([]);
  });

  it('restricted J1 band of an articulated arm matches (θ/2)(R² − r²) over its slice to 0.1 %', () => {
    // Source: annular sector area formula (docs/sources.md [derived]); θ = 90° from restricting limits −30…60°.
    const a = articulatedSets[0];
    const zTool = a.shoulderHeight - a.toolLength;
    const slice = profileSliceAt(reachProfileOf(a), a.shoulderHeight);
    // Each part of an interval on either side of the J1 axis is one sector (behind: turned 180°).
    const parts = slice.flatMap(([r0, r1]) => (r0 < 0 && r1 > 0 ? [[r0, 0], [0, r1]] : [[r0, r1]]));
    const exact = parts.reduce((acc, [r0, r1]) => acc + sectorArea(Math.min(Math.abs(r0), Math.abs(r1)), Math.max(Math.abs(r0), Math.abs(r1)), 90), 0);
    const band = bandPolygons(a, zTool, { j1Min: -30, j1Max: 60 }, 0.25);
    expect(polygonsArea(band)).toBeGreaterThanOrEqual(exact * (1 - 1e-6));
    expect(polygonsArea(band) / exact).toBeLessThan(1.001);
    // The sector lies between bearings −30° and 60°; a point at 100° is outside.
    const last = slice[slice.length - 1];
    const r = (Math.max(0, last[0]) + last[1]) / 2;
    expect(pointInPolygons(r * Math.cos(0.3), r * Math.sin(0.3), band)).toBe(true);
    expect(pointInPolygons(r * Math.cos(1.75), r * Math.sin(1.75), band)).toBe(false);
  });

  it('negative-r intervals turn into sectors rotated by 180°', () => {
    const sectors = bandSectors(-900, -400, 0, Math.PI / 4);
    const area = polygonsArea(sectors);
    expect(area / sectorArea(400, 900, 45)).toBeGreaterThan(1 - 1e-9);
    expect(pointInPolygons(-650 * Math.cos(0.4), -650 * Math.sin(0.4), sectors)).toBe(true);
    expect(pointInPolygons(650 * Math.cos(0.4), 650 * Math.sin(0.4), sectors)).toBe(false);
  });

  it('a lateral offset turns sector edges by atan2(e, r) and keeps points at √(r² + e²)', () => {
    const e = 150;
    const sectors = bandSectors(300, 800, 0, Math.PI / 2, e);
    // In-plane point r = 500 at J1 = 10°: plan point R(10°)·(500, 150).
    const t = (10 * Math.PI) / 180;
    expect(pointInPolygons(500 * Math.cos(t) - e * Math.sin(t), 500 * Math.sin(t) + e * Math.cos(t), sectors)).toBe(true);
    // The straight J1 = 0 edge runs along y = e; below it is outside.
    expect(pointInPolygons(500, e - 5, sectors)).toBe(false);
    expect(pointInPolygons(500, e + 5, sectors)).toBe(true);
  });

  it('maximum ⊇ restricted ⊇ band, and the space grows by payload (and tool for articulated arms)', () => {
    // Source: ISO 10218 spaces, maximum ⊇ restricted ⊇ operating (docs/sources.md [pub]).
    for (const m of [articulatedSets[0], linkageSets[0], scaraSets[0]]) {
      const max = maximumSpacePolygons(m);
      const restricted = restrictedSpacePolygons(m, { j1Min: -40, j1Max: 40 });
      expect(polygonsArea(restricted)).toBeLessThan(polygonsArea(max));
      const band = bandPolygons(m, (reachProfileOf(m).zMin + reachProfileOf(m).zMax) / 2 - (m.toolLength ?? 0), { j1Min: -40, j1Max: 40 });
      for (const p of band) for (const [x, y] of p[0]) expect(pointInPolygons(x, y, restricted) || Math.hypot(x, y) > 0).toBe(true);
    }
    const a = articulatedSets[0];
    const [, rMax] = profileProjection(reachProfileOf(a)).at(-1)!;
    const grown = maximumSpacePolygons({ ...a, payloadRadius: 200 });
    const farthest = Math.max(...grown.flatMap((p) => p[0].map(([x, y]) => Math.hypot(x, y))));
    expect(farthest).toBeGreaterThanOrEqual(rMax + a.toolLength + 200);
    expect(farthest).toBeLessThan(rMax + a.toolLength + 200 + 3);
  });

  it('restricted space below a height shrinks to nothing under the whole-arm envelope', () => {
    const m = linkageSets[0];
    const prof = reachProfileOf(m);
    const env = envelopeProfileOf(m);
    // the envelope reaches at least the tool point's lowest height, less the tool
    expect(env.zMin).toBeLessThanOrEqual(prof.zMin - m.toolLength + 1e-9);
    expect(restrictedBelowPolygons(m, env.zMin - 1)).toEqual([]);
    expect(restrictedBelowPolygons(m, env.zMin + 1).length).toBeGreaterThan(0);
    const all = polygonsArea(restrictedSpacePolygons(m));
    const low = polygonsArea(restrictedBelowPolygons(m, prof.zMin + 200));
    expect(low).toBeGreaterThan(0);
    expect(low).toBeLessThanOrEqual(all + 1e-6);
  });

  it('armPose places arm-frame geometry on the plan by yaw and position', () => {
    const g = bandAt(articulatedSets[0], 300, { j1Min: -10, j1Max: 10 });
    const placed = armPose({ x: 10000, y: 5000, yaw: 90 }).placePolygons(geoJSONToPolygons(g));
    expect(pointInPolygons(10000, 5000 + 1000, placed)).toBe(true);
    expect(pointInPolygons(10000 + 1000, 5000, placed)).toBe(false);
    expect(polygonsArea(placed)).toBeCloseTo(polygonsArea(geoJSONToPolygons(g)), 0);
  });

  it('rejects restricting limits that miss the model range, and does not mutate frozen inputs', () => {
    const m = deepFreeze(structuredClone(articulatedSets[0]));
    expect(() => restrictedSpacePolygons(m, { j1Min: 171, j1Max: 200 })).toThrow(/^its J1 limits 171° to 200° do not overlap the arm model's J1 range/);
    expect(() => bandAt(m, Number.NaN)).toThrow(/zArm/);
    expect(() => restrictedSpacePolygons(m, deepFreeze({ j1Min: -20, j1Max: 20 }))).not.toThrow();
  });
});
