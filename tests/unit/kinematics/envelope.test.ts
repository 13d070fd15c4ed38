// The whole-arm envelope: every link capsule of every sampled pose inside it, the tool point's
// margins within the stated tolerance under restricted J1 limits, links filling a tool annulus'
// hole, and a scara's link sweeps against closed-form areas.
import fc from 'fast-check';
import { readFileSync, readdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { polygonsArea } from '@shared/geometry/area';
import { buildDistanceGrid } from '@shared/geometry/distanceGrid';
import { pointInPolygons } from '@shared/geometry/pointInPolygon';
import { axisKinematicDeg } from '@shared/kinematics/articulated';
import { bodyCapsules, envelopeProfileOf, markWithinDistance, scaraLinkSweeps, squaredDistanceTransform, type Capsule } from '@shared/kinematics/envelope';
import { forwardModel, parseArmParams, reachProfileOf } from '@shared/kinematics/families';
import { bandPolygons, restrictedBelowPolygons, restrictedSpacePolygons } from '@shared/kinematics/planRegions';
import { armReach } from '@shared/kinematics/pointReach';
import { ArmModelInput, type ArmParams, type ScaraParams } from '@shared/schemas/armModel';
import { modifiedChain } from './chainFixtures';
import { ax } from './fixtures';

const dir = new URL('../../../samples/arm-models/', import.meta.url);
const demos: Array<{ name: string; params: ArmParams }> = readdirSync(dir)
  .filter((f) => f.endsWith('.json'))
  .sort()
  .map((f) => ArmModelInput.parse(JSON.parse(readFileSync(new URL(f, dir), 'utf8'))));
const byFamily = (family: string) => demos.find((d) => d.params.family === family)!.params;

/** Controller limits of every axis of a model. */
function limits(m: ArmParams): Array<{ min: number; max: number }> {
  if (m.family === 'chain') return m.joints.map((j) => ({ min: j.min, max: j.max }));
  const a = m.axes.map((x) => ({ min: x.min, max: x.max }));
  if (m.family === 'scara') a.push({ min: m.strokeMin, max: m.strokeMax });
  return a;
}

/** Kinematic J1 bearing (rad) of controller value v. */
function bearingOf(m: ArmParams, v: number): number {
  if (m.family === 'chain') {
    const j = m.joints[0];
    return (((j.direction ?? 1) * v + (j.zeroOffset ?? 0) + j.theta) * Math.PI) / 180;
  }
  return (axisKinematicDeg(m.axes[0], v) * Math.PI) / 180;
}

/** Points on a capsule: its axis at both ends and the middle, and each grown by the radius in 26 directions. */
function capsulePoints(c: Capsule): Array<[number, number, number]> {
  const out: Array<[number, number, number]> = [];
  const dirs: Array<[number, number, number]> = [];
  for (const x of [-1, 0, 1]) for (const y of [-1, 0, 1]) for (const z of [-1, 0, 1]) if (x || y || z) dirs.push([x, y, z]);
  for (const t of [0, 0.5, 1]) {
    const p: [number, number, number] = [c.a.x + t * (c.b.x - c.a.x), c.a.y + t * (c.b.y - c.a.y), c.a.z + t * (c.b.z - c.a.z)];
    out.push(p);
    for (const [x, y, z] of dirs) {
      const n = Math.hypot(x, y, z);
      out.push([p[0] + (c.radius * x) / n, p[1] + (c.radius * y) / n, p[2] + (c.radius * z) / n]);
    }
  }
  return out;
}

const modifiedWithTool = parseArmParams({ ...modifiedChain, toolLength: 120, payloadRadius: 90 });
const CASES: Array<{ name: string; params: ArmParams; restrict: { j1Min: number; j1Max: number } }> = [
  ...demos.map((d) => ({ name: d.name, params: d.params, restrict: { j1Min: -90, j1Max: 90 } })),
  { name: 'modified-DH chain', params: modifiedWithTool, restrict: { j1Min: -60, j1Max: 75 } },
];

describe('whole-arm envelope contains every capsule', () => {
  for (const { name, params, restrict } of CASES) {
    it(`${name}: link, tool and payload capsules of random poses lie inside the profile, the restricted space and the height range`, () => {
      const env = envelopeProfileOf(params);
      const profileGrid = buildDistanceGrid(env.polygons);
      const spaceGrid = buildDistanceGrid(restrictedSpacePolygons(params, restrict));
      const lims = limits(params);
      const own = lims[0];
      const j1Lo = Math.max(own.min, restrict.j1Min);
      const j1Hi = Math.min(own.max, restrict.j1Max);
      const arb = fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), ...lims.slice(1).map(() => fc.double({ min: 0, max: 1, noNaN: true })));
      fc.assert(
        fc.property(arb, (us) => {
          const joints = us.map((u, i) => (i === 0 ? j1Lo + u * (j1Hi - j1Lo) : lims[i].min + u * (lims[i].max - lims[i].min)));
          const caps = bodyCapsules(params, joints);
          if (!caps) return; // a linkage pose that does not assemble
          const b = bearingOf(params, joints[0]);
          const cb = Math.cos(b), sb = Math.sin(b);
          for (const c of caps) {
            for (const [x, y, z] of capsulePoints(c)) {
              expect(z).toBeGreaterThanOrEqual(env.zMin - 1e-6);
              expect(z).toBeLessThanOrEqual(env.zMax + 1e-6);
              // plan: inside the restricted space (0.05 mm for the clipping grid)
              expect(spaceGrid.signedDistance(x, y)).toBeGreaterThanOrEqual(-0.05);
              if (params.family === 'scara') continue;
              // side view: turned back by the J1 bearing, r = ±√(x² + y²)
              const xi = cb * x + sb * y;
              const yi = -sb * x + cb * y;
              const rho = Math.hypot(xi, yi);
              expect(profileGrid.signedDistance(xi >= 0 ? rho : -rho, z)).toBeGreaterThanOrEqual(-0.05);
              expect(yi).toBeGreaterThanOrEqual(env.lateralMm.min - 1e-6);
              expect(yi).toBeLessThanOrEqual(env.lateralMm.max + 1e-6);
            }
          }
        }),
        { numRuns: 40, seed: 20261202 },
      );
    }, 60_000);
  }
});

describe('tool-point margins under restricted J1 limits', () => {
  for (const { name, params, restrict } of CASES) {
    it(`${name}: every sampled tool point has a margin no worse than the stated tolerance`, () => {
      const reach = armReach(params, restrict);
      const tol = reachProfileOf(params).toleranceMm;
      const lims = limits(params);
      const j1Lo = Math.max(lims[0].min, restrict.j1Min);
      const j1Hi = Math.min(lims[0].max, restrict.j1Max);
      let seed = 7;
      const rnd = () => ((seed = (seed * 1103515245 + 12345) >>> 0) / 4294967296);
      let worst = Infinity;
      for (let k = 0; k < 3000; k++) {
        const joints = lims.map((l, i) => (i === 0 ? j1Lo + rnd() * (j1Hi - j1Lo) : l.min + rnd() * (l.max - l.min)));
        const fk = forwardModel(params, joints);
        if (!fk.ok) continue;
        worst = Math.min(worst, reach.margin(fk.tool.x, fk.tool.y, fk.tool.z, 'top'));
      }
      expect(worst).toBeGreaterThanOrEqual(-tol);
    }, 60_000);
  }

  it('the demo six-axis pose J = [−90, 140, 20, −90, −100, 0] with J1 restricted to ±90° is reached, its payload inside the restricted space', () => {
    const m = byFamily('chain');
    const restrict = { j1Min: -90, j1Max: 90 };
    const fk = forwardModel(m, [-90, 140, 20, -90, -100, 0]);
    expect(fk.ok).toBe(true);
    if (!fk.ok) return;
    const reach = armReach(m, restrict);
    expect(reach.margin(fk.tool.x, fk.tool.y, fk.tool.z, 'top')).toBeGreaterThanOrEqual(-reachProfileOf(m).toleranceMm);
    const pr = m.payloadRadius ?? 0;
    for (let k = 0; k < 16; k++) {
      const a = (k / 16) * 2 * Math.PI;
      expect(pointInPolygons(fk.tool.x + pr * Math.cos(a), fk.tool.y + pr * Math.sin(a), reach.restricted)).toBe(true);
    }
  });

  it("a chain's toolLength counts in the height range: a structure top between the tool point's lowest height and the tooling's is flagged", () => {
    const m = parseArmParams({ ...byFamily('chain'), toolLength: 400 });
    const reach = armReach(m, null);
    const prof = reachProfileOf(m);
    expect(reach.zMin).toBeLessThanOrEqual(prof.zMin - 400);
    const top = prof.zMin - 200; // below every tool point, above the tooling's lowest reach
    expect(restrictedBelowPolygons(m, top).length).toBeGreaterThan(0);
  });
});

describe('links fill a tool annulus', () => {
  it('a scara with a short J2 range: the flange annulus has a hole at the J1 axis, the links fill it', () => {
    const m = parseArmParams({ family: 'scara', innerLink: 400, outerLink: 300, strokeMin: 0, strokeMax: 200, axes: [ax(-180, 180), ax(-20, 20)] }) as ScaraParams;
    expect(pointInPolygons(50, 0, bandPolygons(m, 100))).toBe(false);
    expect(pointInPolygons(50, 0, restrictedSpacePolygons(m))).toBe(true);
  });

  it('an articulated arm with the wrist kept far out: the upper arm fills the hole of the wrist annulus', () => {
    const m = parseArmParams({ family: 'articulated', shoulderHeight: 600, shoulderOffset: 0, upperArm: 700, forearm: 600, axes: [ax(-180, 180), ax(0, 30), ax(-20, 0)] });
    const z = 600;
    expect(pointInPolygons(300, 0, bandPolygons(m, z))).toBe(false);
    expect(pointInPolygons(300, 0, restrictedSpacePolygons(m))).toBe(true);
  });
});

describe('scara link sweeps against closed forms', () => {
  const l1 = 400, l2 = 300;
  it("link 1 over a 90° J1 range: Steiner's formula for the parallel body of a convex set, A + P·ρ + πρ²", () => {
    const rho = 60;
    const m = parseArmParams({ family: 'scara', innerLink: l1, outerLink: l2, strokeMin: 0, strokeMax: 200, axes: [ax(0, 90), ax(-10, 10)], linkSizes: { innerLinkRadius: rho, outerLinkRadius: 0, toolRadius: 0 } }) as ScaraParams;
    const { inner } = scaraLinkSweeps(m);
    // quarter disk of radius l1: area πl1²/4, perimeter 2·l1 + πl1/2 (common formulas)
    const steiner = (g: number) => (Math.PI * l1 * l1) / 4 + (2 * l1 + (Math.PI * l1) / 2) * g + Math.PI * g * g;
    const got = polygonsArea(inner);
    // errs outward only, by at most the offset's arc tolerance (1 mm) and the chord tolerance
    expect(got).toBeGreaterThanOrEqual(steiner(rho) * (1 - 1e-6));
    expect(got).toBeLessThanOrEqual(steiner(rho + 2));
  });

  it('link 2 with J2 held near 0 over a 90° J1 range: the annular sector (θ/2)(R² − r²), r = l1, R = l1 + l2', () => {
    const m = parseArmParams({ family: 'scara', innerLink: l1, outerLink: l2, strokeMin: 0, strokeMax: 200, axes: [ax(0, 90), ax(-0.01, 0.01)], linkSizes: { innerLinkRadius: 0, outerLinkRadius: 0, toolRadius: 0 } }) as ScaraParams;
    const { outer } = scaraLinkSweeps(m);
    const expected = (Math.PI / 4) * ((l1 + l2) ** 2 - l1 ** 2);
    const got = polygonsArea(outer);
    expect(got).toBeGreaterThanOrEqual(expected * (1 - 1e-6));
    expect(Math.abs(got - expected) / expected).toBeLessThan(0.005);
  });

  it('full J1 and J2 ranges: the envelope is the disk of radius l1 + l2 + the outer link radius (πR²)', () => {
    const rho = 50;
    const m = parseArmParams({ family: 'scara', innerLink: l1, outerLink: l2, strokeMin: 0, strokeMax: 200, axes: [ax(-180, 180), ax(-180, 180)], linkSizes: { innerLinkRadius: 40, outerLinkRadius: rho, toolRadius: 0 } }) as ScaraParams;
    const got = polygonsArea(restrictedSpacePolygons(m));
    expect(got).toBeGreaterThanOrEqual(Math.PI * (l1 + l2 + rho) ** 2 * (1 - 1e-6));
    expect(got).toBeLessThanOrEqual(Math.PI * (l1 + l2 + rho + 2) ** 2);
  });
});

describe('distance transform of a raster', () => {
  /** Squared distance to the nearest marked cell by its definition (every pair), 1e20 when none is marked. */
  function bruteForce(mask: Uint8Array, w: number, h: number): Float64Array {
    const out = new Float64Array(w * h).fill(1e20);
    for (let c = 0; c < w * h; c++) {
      for (let m = 0; m < w * h; m++) {
        if (!mask[m]) continue;
        const dx = (c % w) - (m % w), dy = Math.floor(c / w) - Math.floor(m / w);
        out[c] = Math.min(out[c], dx * dx + dy * dy);
      }
    }
    return out;
  }
  const rasters = fc.record({ w: fc.integer({ min: 1, max: 17 }), h: fc.integer({ min: 1, max: 13 }), density: fc.double({ min: 0, max: 0.3, noNaN: true }), seed: fc.integer() });

  it('equals the squared distance to the nearest marked cell by definition, empty rows, columns and rasters included (property)', () => {
    fc.assert(
      fc.property(rasters, ({ w, h, density, seed }) => {
        let x = seed | 0;
        const mask = Uint8Array.from({ length: w * h }, () => {
          x = (Math.imul(x, 1103515245) + 12345) | 0;
          return ((x >>> 8) & 0xffff) / 0x10000 < density ? 1 : 0;
        });
        expect(Array.from(squaredDistanceTransform(mask, w, h))).toEqual(Array.from(bruteForce(mask, w, h)));
      }),
      { numRuns: 300 },
    );
  });

  it('marks exactly the cells within the limit of a marked cell (property)', () => {
    fc.assert(
      fc.property(rasters, fc.double({ min: 0, max: 9, noNaN: true }), ({ w, h, density, seed }, limit) => {
        let x = seed | 0;
        const mask = Uint8Array.from({ length: w * h }, () => {
          x = (Math.imul(x, 1103515245) + 12345) | 0;
          return ((x >>> 8) & 0xffff) / 0x10000 < density ? 1 : 0;
        });
        const into = new Uint8Array(w * h);
        markWithinDistance(mask, w, h, limit, into);
        const d2 = bruteForce(mask, w, h);
        expect(Array.from(into)).toEqual(Array.from(d2, (d) => (d <= limit * limit ? 1 : 0)));
      }),
      { numRuns: 300 },
    );
  });
});
