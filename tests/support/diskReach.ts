// A stand-in arm for analyzer tests: it reaches every point within R of its base at every height,
// so the checks' geometry can be checked with closed forms, independent of any family.
import { annularSector } from '@shared/geometry/annularSector';
import type { ArmReach, ArmReachFactory } from '@shared/analysis';

/** model id = reach radius in mm (below 1000 mm height the radius shrinks by 30 %). */
export const diskReach: ArmReachFactory = (modelId) => {
  const R = modelId;
  const disk = (r: number) => [annularSector({ cx: 0, cy: 0, rInner: 0, rOuter: r, startDeg: 0, endDeg: 360 })];
  const full = disk(R);
  const reach: ArmReach = {
    maxReach: R,
    zMin: 0,
    zMax: 2000,
    restricted: full,
    envelope: { profile: [[[[0, 0], [R, 0], [R, 2000], [0, 2000]]]], toleranceMm: 0, j1RangeDeg: { min: -180, max: 180 }, lateralMm: { min: 0, max: 0 } },
    bandAt: () => full,
    restrictedBelow: (z) => (z >= 1000 ? full : disk(R * 0.7)),
    margin: (x, y) => R - Math.hypot(x, y),
  };
  return reach;
};
