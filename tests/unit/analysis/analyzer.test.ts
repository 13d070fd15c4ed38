// Analyzer logic against disk-shaped reach regions (an arm that reaches every point within R of its
// base at every height): the checks' geometry, ids and incremental caching, independent of any family.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createAnalyzer, prepareFloor, type AnalysisInput, type ArmReachFactory } from '@shared/analysis';
import { diskReach } from '../../support/diskReach';


const base = (): AnalysisInput => ({
  arms: [],
  workPoints: [],
  boundaries: [],
  workHeights: [900],
  floor: null,
});

const arm = (id: string, x: number, y: number, R = 1000) => ({ id, armModelId: R, label: '', x, y, yaw: 0, mountHeight: 0 });

describe('analysis engine', () => {
  it('finds the shared zone of two disks with the circle–circle lens area', () => {
    // Lens area (Wolfram MathWorld, "Circle-Circle Intersection"): r = R = 1, d = 1 → 1.22837 (scaled by 1000² mm²).
    const a = createAnalyzer(diskReach);
    const r = a.analyze({ ...base(), arms: [arm('R1', 0, 0), arm('R2', 1000, 0)] });
    expect(r.sharedZones).toHaveLength(1);
    expect(r.sharedZones[0].areaM2).toBeCloseTo(1.22837, 2);
    const f = r.findings.find((x) => x.kind === 'shared-zone')!;
    expect(f.id).toBe('shared-zone:R1+R2');
    expect(f.severity).toBe('warning');
  });

  it('classifies coverage with margins, flags unreached and wrongly assigned points, and handovers', () => {
    const a = createAnalyzer(diskReach);
    const r = a.analyze({
      ...base(),
      arms: [arm('R1', 0, 0), arm('R2', 1500, 0)],
      workPoints: [
        { id: 'P1', x: 750, y: 0, z: 900, approach: 'top', tag: '' },
        { id: 'P2', x: 0, y: 1200, z: 900, approach: 'top', tag: 'far', assignedArm: 'R1' },
        { id: 'P3', x: 200, y: 0, z: 900, approach: 'top', tag: '', assignedArm: 'R2' },
      ],
    });
    expect(r.coverage.P1).toEqual({ R1: 250, R2: 250 });
    expect(r.coverage.P2.R1).toBeCloseTo(-200, 5);
    const ids = r.findings.map((f) => f.id);
    expect(ids).toContain('unreached-point:P2');
    expect(ids).toContain('assigned-unreachable:P2+R1');
    expect(ids).toContain('assigned-unreachable:P3+R2');
    expect(ids).toContain('handover:R1+R2');
    expect(r.findings.find((f) => f.id === 'unreached-point:P2')!.message).toMatch(/200 mm short/);
  });

  it('flags a fence crossing, a too-close fence, reach through an opening, and a low fence', () => {
    const a = createAnalyzer(diskReach);
    const r = a.analyze({
      ...base(),
      arms: [arm('R1', 0, 0), arm('R2', 5000, 0)],
      boundaries: [
        { id: 'F1', kind: 'fence', label: '', points: [[900, -2000], [900, 2000]], height: 2000 },
        { id: 'F2', kind: 'fence', label: '', points: [[6100, -2000], [6100, 2000]], height: 1200 },
        { id: 'O1', kind: 'opening', label: '', points: [[900, -500], [900, 500]], fenceId: 'F1' },
      ],
    });
    const ids = r.findings.map((f) => f.id);
    // F1 at x = 900 crosses R1's disk (R = 1000) only where the opening is (|y| ≤ 436 mm): reach through the opening, not the fence.
    expect(ids).toContain('reach-through-opening:R1+O1');
    expect(ids).not.toContain('reach-beyond-fence:R1+F1');
    // F2 at x = 6100 is 100 mm from R2's disk: clearance warning (150 mm kept, common practice); 1200 mm is below 1400 mm (ISO 10218-2).
    expect(ids).toContain('fence-clearance:R2+F2');
    expect(ids).toContain('fence-too-low:F2');
    // without the opening the same fence is crossed
    const r2 = a.analyze({ ...base(), arms: [arm('R1', 0, 0)], boundaries: [{ id: 'F1', kind: 'fence', label: '', points: [[900, -2000], [900, 2000]], height: 2000 }] });
    expect(r2.findings.map((f) => f.id)).toContain('reach-beyond-fence:R1+F1');
  });

  it('measures reach into an operator area and a keep-out', () => {
    const a = createAnalyzer(diskReach);
    const r = a.analyze({
      ...base(),
      arms: [arm('R1', 0, 0)],
      boundaries: [
        { id: 'OP', kind: 'operator', label: 'pallet exchange', points: [[0, 0], [2000, 0], [2000, 2000], [0, 2000]] },
        { id: 'K1', kind: 'keepout', label: '', points: [[3000, 0], [4000, 0], [4000, 1000]] },
      ],
    });
    const op = r.findings.find((f) => f.id === 'reach-into-operator-area:R1+OP')!;
    expect(op.severity).toBe('critical');
    // a quarter disk of radius 1 m: π/4 m² (circle area, elementary geometry)
    expect(op.data!.areaM2).toBeCloseTo(Math.PI / 4, 2);
    expect(r.findings.some((f) => f.id.startsWith('reach-into-keepout'))).toBe(false);
  });

  it('checks structure by height: only reach below an obstacle top can hit it; bases off the floor or on a column', () => {
    const geometry = {
      type: 'FeatureCollection' as const,
      features: [
        { type: 'Feature' as const, properties: { layer: 'OUTLINE' }, geometry: { type: 'Polygon' as const, coordinates: [[[-5000, -5000], [5000, -5000], [5000, 5000], [-5000, 5000], [-5000, -5000]]] } },
        // low machine 800 mm away from R1 — within the full reach (1000) but outside the reach below 1000 mm height (700)
        { type: 'Feature' as const, properties: { layer: 'MACHINES' }, geometry: { type: 'Polygon' as const, coordinates: [[[800, -100], [1200, -100], [1200, 100], [800, 100], [800, -100]]] } },
        { type: 'Feature' as const, properties: { layer: 'COLUMNS' }, geometry: { type: 'Polygon' as const, coordinates: [[[-200, 2800], [200, 2800], [200, 3200], [-200, 3200], [-200, 2800]]] } },
      ],
    };
    const layers = [
      { name: 'OUTLINE', role: 'outline' as const, height: null },
      { name: 'MACHINES', role: 'obstacle' as const, height: 900 },
      { name: 'COLUMNS', role: 'column' as const, height: null },
    ];
    const floor = prepareFloor(geometry, layers);
    const a = createAnalyzer(diskReach);
    const low = a.analyze({ ...base(), floor, arms: [arm('R1', 0, 0), arm('R2', 0, 3000), arm('R3', 9000, 0)] });
    let ids = low.findings.map((f) => f.id);
    expect(ids).not.toContain('reach-into-structure:R1+MACHINES');
    expect(ids.some((i) => i.startsWith('base-on-column:R2'))).toBe(true);
    expect(ids).toContain('base-off-floor:R3');
    const tall = prepareFloor(geometry, layers.map((l) => (l.name === 'MACHINES' ? { ...l, height: 1500 } : l)));
    ids = a.analyze({ ...base(), floor: tall, arms: [arm('R1', 0, 0)] }).findings.map((f) => f.id);
    expect(ids).toContain('reach-into-structure:R1+MACHINES');
  });

  it('keeps finding ids when an unrelated arm moves, and recomputes only the moved arm', () => {
    const a = createAnalyzer(diskReach);
    const points = Array.from({ length: 50 }, (_, i) => ({ id: `P${i}`, x: i * 100, y: 0, z: 900, approach: 'top' as const, tag: '' }));
    const input = { ...base(), workPoints: points, arms: [arm('R1', 0, 0), arm('R2', 1500, 0), arm('R3', 20000, 0)] };
    const first = a.analyze(input);
    expect(a.lastStats()).toEqual({ arms: 3, pairs: 1, columns: 3 });
    const moved = a.analyze({ ...input, arms: [input.arms[0], input.arms[1], arm('R3', 21000, 500)] });
    expect(a.lastStats()).toEqual({ arms: 1, pairs: 0, columns: 1 });
    const keep = (r: typeof first) => r.findings.filter((f) => !f.arms.includes('R3') && !f.points.some((p) => Number(p.slice(1)) >= 26)).map((f) => f.id);
    expect(keep(moved)).toEqual(keep(first));
    expect(moved.sharedZones.map((o) => o.arms)).toEqual([['R1', 'R2']]);
  });

  it('reports an arm whose reach cannot be computed as a finding, never a crash', () => {
    const failing: ArmReachFactory = (id, r) => {
      if (id === 13) throw new Error('unknown arm model 13');
      return diskReach(id, r);
    };
    const r = createAnalyzer(failing).analyze({ ...base(), arms: [arm('R1', 0, 0, 13), arm('R2', 0, 0)] });
    expect(r.findings.map((f) => f.id)).toContain('unknown-model:R1');
  });

  it('after any sequence of edits, an analyzer that has seen every step gives what a new one gives (property)', () => {
    // Edits: move, add or remove an arm, change its reach, assign a point, or replace the points.
    const edit = fc.oneof(
      fc.record({ op: fc.constant('move' as const), k: fc.nat(), dx: fc.integer({ min: -900, max: 900 }), dy: fc.integer({ min: -900, max: 900 }) }),
      fc.record({ op: fc.constant('add' as const), x: fc.integer({ min: 0, max: 6000 }), y: fc.integer({ min: 0, max: 3000 }), R: fc.integer({ min: 300, max: 1800 }) }),
      fc.record({ op: fc.constant('remove' as const), k: fc.nat() }),
      fc.record({ op: fc.constant('reach' as const), k: fc.nat(), R: fc.integer({ min: 300, max: 1800 }) }),
      fc.record({ op: fc.constant('assign' as const), k: fc.nat(), p: fc.nat() }),
      fc.record({ op: fc.constant('points' as const), seed: fc.nat() }),
    );
    const pointsOf = (seed: number) =>
      Array.from({ length: 120 }, (_, i) => ({ id: `P${i}`, x: ((i * 7919 + seed * 31) % 6000) + 0.5, y: ((i * 104729 + seed * 17) % 3000) + 0.5, z: 900, approach: 'top' as const, tag: '' }));
    const comparable = (r: ReturnType<ReturnType<typeof createAnalyzer>['analyze']>) => ({ findings: r.findings, sharedZones: r.sharedZones, coverage: r.coverage });
    fc.assert(
      fc.property(fc.array(edit, { minLength: 1, maxLength: 12 }), (edits) => {
        const a = createAnalyzer(diskReach);
        let input: AnalysisInput = { ...base(), workPoints: pointsOf(0), arms: [arm('R1', 1000, 1000), arm('R2', 2500, 1200), arm('R3', 4200, 900, 1500)] };
        let next = 4;
        a.analyze(input);
        for (const e of edits) {
          const arms = input.arms.slice();
          if (e.op === 'move' && arms.length) {
            const k = e.k % arms.length;
            arms[k] = { ...arms[k], x: arms[k].x + e.dx, y: arms[k].y + e.dy };
          } else if (e.op === 'add') arms.push(arm(`R${next++}`, e.x, e.y, e.R));
          else if (e.op === 'remove' && arms.length) arms.splice(e.k % arms.length, 1);
          else if (e.op === 'reach' && arms.length) {
            const k = e.k % arms.length;
            arms[k] = { ...arms[k], armModelId: e.R };
          }
          let workPoints = input.workPoints;
          if (e.op === 'assign' && arms.length) {
            const copy = workPoints.slice();
            const p = e.p % copy.length;
            copy[p] = { ...copy[p], assignedArm: arms[e.k % arms.length].id };
            workPoints = copy;
          } else if (e.op === 'points') workPoints = pointsOf(e.seed);
          input = { ...input, arms, workPoints };
          expect(comparable(a.analyze(input))).toEqual(comparable(createAnalyzer(diskReach).analyze(input)));
        }
      }),
      { numRuns: 60 },
    );
  });
});
