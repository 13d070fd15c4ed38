// Layout analysis through the real kinematics, checked against published geometry formulas.
import { describe, expect, it } from 'vitest';
import { createAnalyzer, prepareFloor, type AnalysisInput } from '@shared/analysis';
import { armReachFor } from '@shared/analysis/armReach';
import { sectorArea } from '@shared/geometry/annularSector';

/** Circle–circle intersection (lens) area — Wolfram MathWorld, "Circle-Circle Intersection". */
function lensArea(r: number, R: number, d: number): number {
  return (
    r * r * Math.acos((d * d + r * r - R * R) / (2 * d * r)) +
    R * R * Math.acos((d * d + R * R - r * r) / (2 * d * R)) -
    0.5 * Math.sqrt((-d + r + R) * (d + r - R) * (d - r + R) * (d + r + R))
  );
}

// A SCARA with equal links and full J1/J2 ranges reaches the whole disk of radius a1 + a2
// (planar 2R reach annulus |a1 − a2| … a1 + a2: Spong et al., planar elbow arm). Large links keep the
// 1 mm chord tolerance (outer arcs circumscribed) well inside 0.1 % of the area. Link sizes 0: the
// links are their centre lines, which sweep inside the same disk.
const noLinkSizes = { innerLinkRadius: 0, outerLinkRadius: 0, toolRadius: 0 };
const fullScara = {
  family: 'scara',
  innerLink: 1500,
  outerLink: 1500,
  strokeMin: 0,
  strokeMax: 300,
  axes: [{ min: -180, max: 180 }, { min: -180, max: 180 }],
  linkSizes: noLinkSizes,
};
// The same arm with a 100 mm half-width outer link: its plan envelope is the disk of radius
// a1 + a2 + 100 (the disk grown by the link radius — Minkowski sum of a disk and a disk).
const fatScara = { ...fullScara, linkSizes: { ...noLinkSizes, outerLinkRadius: 100 } };

// An articulated arm whose wrist stays in front of J1 (θ2 ∈ [0°, 90°], θ3 ∈ [−90°, 0°]): its plan
// projection is the radial interval 0 … a2 + a3 (anthropomorphic arm closed form, Siciliano et al. §2.9.3).
const bigFrontArticulated = {
  family: 'articulated',
  shoulderHeight: 800,
  shoulderOffset: 0,
  upperArm: 1700,
  forearm: 1300,
  axes: [{ min: -170, max: 170 }, { min: 0, max: 90 }, { min: -90, max: 0 }],
  // centre lines only: the upper arm and forearm sweep radii 0 … a2 + a3 as the wrist does
  linkSizes: { upperArmRadius: 0, forearmRadius: 0, toolRadius: 0 },
};
const frontArticulated = {
  family: 'articulated',
  shoulderHeight: 400,
  shoulderOffset: 0,
  upperArm: 500,
  forearm: 400,
  axes: [{ min: -170, max: 170 }, { min: 0, max: 90 }, { min: -90, max: 0 }],
};

const smallScara = { ...fullScara, innerLink: 500, outerLink: 500 };
const MODELS: Record<number, unknown> = { 1: fullScara, 2: frontArticulated, 3: bigFrontArticulated, 4: smallScara, 5: fatScara };
const analyzer = () => createAnalyzer((id, restrict) => armReachFor(MODELS[id], restrict));
const empty = (): AnalysisInput => ({ arms: [], workPoints: [], boundaries: [], workHeights: [], floor: null });
const place = (id: string, armModelId: number, x: number, y: number, extra: object = {}) => ({ id, armModelId, label: '', x, y, yaw: 0, mountHeight: 0, ...extra });

describe('shared zones and spaces against published formulas', () => {
  it('two full-range SCARA arms share exactly the circle–circle lens (MathWorld) to 0.1 %', () => {
    for (const d of [1500, 3000, 4800]) {
      const r = analyzer().analyze({ ...empty(), arms: [place('R1', 1, 0, 0), place('R2', 1, d, 0)] });
      const expected = lensArea(3000, 3000, d) / 1e6;
      expect(r.sharedZones).toHaveLength(1);
      expect(Math.abs(r.sharedZones[0].areaM2 - expected) / expected).toBeLessThan(0.001);
      expect(r.sharedZones[0].areaM2).toBeGreaterThanOrEqual(expected * (1 - 1e-6)); // errs toward more space
    }
    // with the outer link's half-width 100 mm, the envelopes are disks of 3100 mm; the offset's
    // arcs err outward by up to 2 mm on the radius (chord tolerance of the disk and of the offset)
    for (const d of [1500, 4800]) {
      const r = analyzer().analyze({ ...empty(), arms: [place('R1', 5, 0, 0), place('R2', 5, d, 0)] });
      const expected = lensArea(3100, 3100, d) / 1e6;
      const outer = lensArea(3102, 3102, d) / 1e6;
      expect(r.sharedZones[0].areaM2).toBeLessThanOrEqual(outer);
      expect(r.sharedZones[0].areaM2).toBeGreaterThanOrEqual(expected * (1 - 1e-6));
    }
    // r = R = 1, d = 1 → 1.22837 (MathWorld's tabulated value, scaled to metres here)
    expect(lensArea(1000, 1000, 1000) / 1e6).toBeCloseTo(1.22837, 5);
  });

  it('an articulated arm restricted by J1 limits covers the annular sector (θ/2)(R² − r²) to 0.1 %', () => {
    for (const [j1Min, j1Max] of [[-45, 45], [10, 130], [-170, 170]]) {
      const reach = armReachFor(bigFrontArticulated, { j1Min, j1Max });
      const area = reach.restricted.reduce((s, p) => s + p.reduce((a, ring, i) => a + (i === 0 ? 1 : -1) * Math.abs(shoelace(ring)), 0), 0);
      const expected = sectorArea(0, 3000, j1Max - j1Min);
      expect(Math.abs(area - expected) / expected).toBeLessThan(0.001);
      expect(area).toBeGreaterThanOrEqual(expected * (1 - 1e-6));
    }
  });
});

function shoelace(ring: Array<[number, number]>): number {
  let s = 0;
  for (let i = 0; i < ring.length; i++) {
    const [x1, y1] = ring[i];
    const [x2, y2] = ring[(i + 1) % ring.length];
    s += x1 * y2 - x2 * y1;
  }
  return s / 2;
}

describe('coverage through the kinematics', () => {
  it('classifies points at known radii and heights with margins to 1 mm; restricted J1 excludes points behind', () => {
    // Wrist-centre region: circle of radius a2 + a3 = 900 about the shoulder (z = 400) for the
    // stretched arm; a point at r = 850 in the shoulder plane is 50 mm inside, r = 950 is 50 mm outside.
    // approach 'any': the point itself is the wrist target (no tool length here).
    const pts = [
      { id: 'IN', x: 850, y: 0, z: 400, approach: 'any' as const, tag: '' },
      { id: 'OUT', x: 950, y: 0, z: 400, approach: 'any' as const, tag: '' },
      { id: 'BEHIND', x: -500, y: 0, z: 400, approach: 'any' as const, tag: '' },
    ];
    const r = analyzer().analyze({ ...empty(), arms: [place('R1', 2, 0, 0, { restrict: { j1Min: -90, j1Max: 90 } })], workPoints: pts });
    expect(r.coverage.IN.R1).toBeGreaterThan(49);
    expect(r.coverage.IN.R1).toBeLessThan(51);
    expect(r.coverage.OUT.R1).toBeGreaterThan(-51);
    expect(r.coverage.OUT.R1).toBeLessThan(-49);
    expect(r.coverage.BEHIND.R1).toBeLessThan(0);
    expect(r.findings.map((f) => f.id)).toEqual(expect.arrayContaining(['unreached-point:OUT', 'unreached-point:BEHIND']));
    expect(r.findings.map((f) => f.id)).not.toContain('unreached-point:IN');
  });
});

describe('clearance findings through the kinematics', () => {
  const hall = {
    type: 'FeatureCollection' as const,
    features: [
      { type: 'Feature' as const, properties: { layer: 'OUTLINE' }, geometry: { type: 'Polygon' as const, coordinates: [[[-4000, -4000], [8000, -4000], [8000, 4000], [-4000, 4000], [-4000, -4000]]] } },
      // 400 × 400 column whose near face is 800 mm from R1 (inside its 1000 mm reach)
      { type: 'Feature' as const, properties: { layer: 'COLUMNS' }, geometry: { type: 'Polygon' as const, coordinates: [[[800, -200], [1200, -200], [1200, 200], [800, 200], [800, -200]]] } },
    ],
  };
  const layers = [
    { name: 'OUTLINE', role: 'outline' as const, height: null },
    { name: 'COLUMNS', role: 'column' as const, height: null },
  ];

  it('an arm beside a column, a fence crossing and an operator area each give exactly the expected finding', () => {
    const floor = prepareFloor(hall, layers);
    const input: AnalysisInput = {
      ...empty(),
      floor,
      arms: [place('R1', 4, 0, 0), place('R2', 4, 5000, 0)],
      boundaries: [
        { id: 'F1', kind: 'fence', label: '', points: [[5900, -3000], [5900, 3000]], height: 2000 },
        { id: 'OP', kind: 'operator', label: '', points: [[4000, 700], [6000, 700], [6000, 2000], [4000, 2000]] },
      ],
    };
    const ids = analyzer().analyze(input).findings.map((f) => f.id).sort();
    expect(ids).toEqual(['reach-beyond-fence:R2+F1', 'reach-into-operator-area:R2+OP', 'reach-into-structure:R1+COLUMNS'].sort());
  });

  it('keeps finding ids when an unrelated arm moves', () => {
    const floor = prepareFloor(hall, layers);
    const a = analyzer();
    const base: AnalysisInput = { ...empty(), floor, arms: [place('R1', 4, 0, 0), place('R2', 4, 5000, 0), place('R3', 4, 2500, 3000)] };
    const before = a.analyze(base).findings.filter((f) => !f.arms.includes('R3')).map((f) => f.id);
    const after = a.analyze({ ...base, arms: [base.arms[0], base.arms[1], place('R3', 4, 2600, 2900)] }).findings.filter((f) => !f.arms.includes('R3')).map((f) => f.id);
    expect(after).toEqual(before);
    expect(a.lastStats().arms).toBe(1);
  });
});
