// The revision diff over every input of the analysis: named changes with their units, "no changes"
// only for equal inputs, and a generic check that changing any one leaf of a snapshot — or adding a
// field the diff has never seen — is reported.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { RevisionDiff, type RevisionSnapshot } from '@shared/schemas/revision';
import { diffSnapshots, type DiffSide } from '../../../backend/src/services/revisions/diff';

const sample = (name: string) => JSON.parse(readFileSync(new URL(`../../../samples/arm-models/${name}.json`, import.meta.url), 'utf8')) as { name: string; params: Record<string, unknown> & { family: string } };
const MODELS = ['demo-scara-600', 'demo-articulated-1400', 'demo-palletizer-3100', 'demo-six-axis-2000'].map((f, i) => {
  const m = sample(f);
  return { id: i + 1, name: m.name, family: m.params.family, params: m.params };
});
// Every optional axis field appears somewhere: zero offset and direction on the articulated J2.
(MODELS[1].params.axes as Array<Record<string, number>>)[1] = { min: -60, max: 145, zeroOffset: 90, direction: -1 };

const finding = (id: string, message: string) => ({
  id,
  kind: id.split(':')[0] as RevisionSnapshot['analysis']['findings'][number]['kind'],
  severity: 'warning' as const,
  arms: ['R1'],
  points: [],
  geometry: null,
  at: [0, 0] as [number, number],
  message,
  data: { areaM2: 1.2 },
});

/** A revision snapshot holding every kind of element and every optional field once (invented values). */
function baseSnapshot(): RevisionSnapshot {
  return {
    project: { id: 3, name: 'Fernhill Biscuit Works', clientName: 'Fernhill Biscuits', siteName: 'Hall 2' },
    layout: {
      id: 11,
      name: 'Line 3 end-of-line cell',
      version: 4,
      content: {
        arms: [
          { id: 'R1', armModelId: 1, label: 'Picker 1', x: 4000, y: 3000, yaw: 0, mountHeight: 400, restrict: { j1Min: -170, j1Max: 170 } },
          { id: 'R2', armModelId: 2, label: 'Case packer', x: 8000, y: 3000, yaw: 90, mountHeight: 0 },
          { id: 'R3', armModelId: 3, label: 'Palletizer', x: 12000, y: 3000, yaw: 180, mountHeight: 0 },
          { id: 'R4', armModelId: 4, label: '', x: 16000, y: 3000, yaw: -90, mountHeight: 0 },
        ],
        workPoints: [
          { id: 'P1', x: 4400, y: 3000, z: 100, approach: 'top', tag: 'infeed', assignedArm: 'R1' },
          { id: 'P2', x: 8400, y: 3000, z: 900, approach: 'any', tag: '' },
        ],
        boundaries: [
          { id: 'F1', kind: 'fence', label: 'Cell guard', height: 1400, meshMm: 30, meshShape: 'square', points: [[0, 0], [20000, 0], [20000, 8000], [0, 8000], [0, 0]] },
          { id: 'G1', kind: 'opening', label: 'Pallet exchange', fenceId: 'F1', safeguard: { device: 'light-curtain', responseTimeS: 0.02, stopCategory: 0, resolutionMm: 30, approach: 'parallel', heightMm: 300 }, points: [[9000, 8000], [11000, 8000]] },
          { id: 'G2', kind: 'opening', label: 'Service door', fenceId: 'F1', safeguard: { device: 'multi-beam', responseTimeS: 0.03, stopCategory: 1, beams: 4, approach: 'normal' }, points: [[20000, 2000], [20000, 3000]] },
          { id: 'K1', kind: 'keepout', label: 'Infeed drive', points: [[1000, 1000], [1500, 1000], [1500, 1400]] },
          { id: 'A1', kind: 'operator', label: 'Pallet exchange', points: [[9000, 8100], [11000, 8100], [11000, 9500], [9000, 9500]] },
        ],
        workHeights: [100, 900],
      },
    },
    floorPlan: {
      id: 7,
      fileName: 'hall.dxf',
      units: 'mm',
      geometry: {
        type: 'FeatureCollection',
        features: [
          { type: 'Feature', properties: { layer: 'OUTLINE', role: 'outline' }, geometry: { type: 'Polygon', coordinates: [[[0, 0], [24000, 0], [24000, 16000], [0, 0]]] } },
          { type: 'Feature', properties: { layer: 'WALLS', role: 'wall', height: 1500 }, geometry: { type: 'LineString', coordinates: [[5000, 0], [5000, 2000]] } },
        ],
      },
      layers: [
        { name: 'OUTLINE', role: 'outline', height: null, entityCount: 1, color: '#ffffff' },
        { name: 'WALLS', role: 'wall', height: 1500, entityCount: 1, color: '#ff0000' },
      ],
      bounds: { minX: 0, minY: 0, maxX: 24000, maxY: 16000 },
    },
    models: structuredClone(MODELS),
    analysis: {
      findings: [finding('shared-zone:R1+R2', 'Arms R1 and R2 share 1.200 m².'), finding('fence-too-low:F1', 'Fence F1 is 1400 mm high.')],
      sharedZones: [],
      coverage: { P1: { R1: 120 } },
      regions: {},
      timingMs: 12,
    },
  } as RevisionSnapshot;
}

const A = { id: 1, letter: 'A' };
const diff = (before: DiffSide, after: DiffSide) => diffSnapshots(before, after, A);
/** The change lines of the group with this title. */
function linesOf(d: RevisionDiff, title: string): string[] {
  const g = d.groups.find((x) => x.title === title);
  if (!g) throw new Error(`no group "${title}" in ${JSON.stringify(d.groups.map((x) => x.title))}`);
  return g.changes.map((c) => c.text);
}
const changed = (edit: (s: RevisionSnapshot) => void) => {
  const after = baseSnapshot();
  edit(after);
  const d = diff(baseSnapshot(), after);
  expect(RevisionDiff.safeParse(d).error?.issues ?? []).toEqual([]);
  return d;
};
const nothing = (d: RevisionDiff) => !d.groups.length && !d.findings.added.length && !d.findings.removed.length && !d.findings.changed.length;

describe('revision diff: named changes', () => {
  it('identical snapshots — equal copies, members in another order — have no changes', () => {
    expect(nothing(diff(baseSnapshot(), baseSnapshot()))).toBe(true);
    const reordered = JSON.parse(JSON.stringify(baseSnapshot(), (_k, v: unknown) => (v && typeof v === 'object' && !Array.isArray(v) ? Object.fromEntries(Object.entries(v).reverse()) : v))) as RevisionSnapshot;
    expect(nothing(diff(baseSnapshot(), reordered))).toBe(true);
    // Bookkeeping and analysis results (they follow from the inputs) are not changes.
    expect(nothing(changed((s) => ((s.layout.version = 5), (s.analysis.timingMs = 40), (s.analysis.coverage.P1.R1 = 80))))).toBe(true);
    // The first revision has nothing to compare with.
    expect(diffSnapshots(null, baseSnapshot(), null)).toEqual({ previous: null, groups: [], findings: { added: [], removed: [], changed: [] } });
  });

  it('an arm\'s J1 restriction, mount height, model, label, move and turn', () => {
    const d = changed((s) => {
      s.layout.content.arms[0].restrict = { j1Min: -120, j1Max: 120 };
      s.layout.content.arms[1].mountHeight = 350;
      s.layout.content.arms[1].armModelId = 1;
      s.models.splice(1, 1);
      // 3-4-5 right triangle: a move of (300, 400) mm is 500 mm (Pythagoras)
      s.layout.content.arms[2].x += 300;
      s.layout.content.arms[2].y += 400;
      s.layout.content.arms[2].yaw = -170;
      s.layout.content.arms[3].label = 'Six-axis';
    });
    expect(linesOf(d, 'Arm R1 (Picker 1)')).toEqual(['J1 restriction −170…170° → −120…120°']);
    expect(linesOf(d, 'Arm R2 (Case packer)')).toEqual(['model Demo Articulated 1400 → Demo SCARA 600', 'mount height 0 → 350 mm']);
    // 180° → −170° is a turn of +10° across the wrap
    expect(linesOf(d, 'Arm R3 (Palletizer)')).toEqual(['moved 500 mm (from 12000, 3000 to 12300, 3400 mm)', 'turned +10° (yaw 180 → −170°)']);
    expect(linesOf(d, 'Arm R4 (Six-axis)')).toEqual(['label none → ‘Six-axis’']);
    // R2 now uses only the SCARA model: the articulated model leaves the snapshot.
    expect(d.groups.find((g) => g.element === 'armModel')).toMatchObject({ title: 'Demo Articulated 1400', status: 'removed' });
  });

  it('a restriction added and removed', () => {
    const d = changed((s) => {
      delete s.layout.content.arms[0].restrict;
      s.layout.content.arms[1].restrict = { j1Min: -90, j1Max: 150 };
    });
    expect(linesOf(d, 'Arm R1 (Picker 1)')).toEqual(['J1 restriction −170…170° → none (full J1 range)']);
    expect(linesOf(d, 'Arm R2 (Case packer)')).toEqual(['J1 restriction none → −90…150°']);
  });

  it('fence height, mesh and points; opening safeguard fields; keep-out moved; operator area reshaped', () => {
    const d = changed((s) => {
      const [f1, g1, g2, k1, a1] = s.layout.content.boundaries;
      f1.height = 2000;
      f1.meshMm = 20;
      f1.meshShape = 'slot';
      g1.safeguard = { ...g1.safeguard!, responseTimeS: 0.05, resolutionMm: 14 };
      g2.safeguard = { device: 'interlock', responseTimeS: 0.03, stopCategory: 1, approach: 'normal' };
      k1.points = k1.points.map(([x, y]) => [x + 30, y + 40]);
      a1.points = [...a1.points, [8500, 9000]];
    });
    expect(linesOf(d, 'Fence F1 (Cell guard)')).toEqual(['height 1400 → 2000 mm', 'mesh size 30 → 20 mm', 'mesh shape square → slot']);
    expect(linesOf(d, 'Access opening G1 (Pallet exchange)')).toEqual(['safeguard response time 0.02 → 0.05 s', 'light-curtain resolution 30 → 14 mm']);
    expect(linesOf(d, 'Access opening G2 (Service door)')).toEqual(['safeguard multi-beam device → interlocked guard', 'beams 4 → none']);
    // (30, 40) → 50 mm (Pythagoras)
    expect(linesOf(d, 'Keep-out K1 (Infeed drive)')).toEqual(['moved 50 mm (all 3 points)']);
    expect(linesOf(d, 'Operator area A1 (Pallet exchange)')).toEqual(['reshaped: 4 → 5 points']);
    expect(d.groups.filter((g) => g.element === 'boundary').map((g) => g.id)).toEqual(['F1', 'G1', 'G2', 'K1', 'A1']);
  });

  it('arm model parameters: link lengths, axis limits, stopping data, link sizes, DH rows, four-bar', () => {
    const d = changed((s) => {
      type Axis = Record<string, number>;
      const [scara, art, pal, six] = s.models.map((m) => m.params) as [
        { innerLink: number },
        { upperArm: number; axes: Axis[]; stopTimeS: number; linkSizes: Axis },
        { fourBar: Axis; axes: Axis[] },
        { joints: Axis[]; tool: Axis; stopTimeCat1S?: number },
      ];
      scara.innerLink = 350;
      art.upperArm = 640;
      art.axes[0].max = 160;
      art.axes[1].direction = 1;
      art.stopTimeS = 0.5;
      art.linkSizes.forearmRadius = 95;
      pal.fourBar.crank = 330;
      pal.axes[2].zeroOffset = 175;
      six.joints[1].a = 910;
      six.tool.z = 160;
      delete six.stopTimeCat1S;
    });
    expect(linesOf(d, 'Demo SCARA 600')).toEqual(['inner link length 325 → 350 mm']);
    expect(linesOf(d, 'Demo Articulated 1400')).toEqual([
      'upper arm length 610 → 640 mm',
      'stopping time, category 0 stop 0.4 → 0.5 s',
      'link size, forearm radius 90 → 95 mm',
      'J1 upper limit 170 → 160°',
      'J2 direction reversed → normal',
    ]);
    expect(linesOf(d, 'Demo Palletizer 3100')).toEqual(['four-bar crank 320 → 330 mm', 'J3 motor zero offset 180 → 175°']);
    expect(linesOf(d, 'Demo Six-Axis 2000')).toEqual(['joint 2 DH a 900 → 910 mm', 'tool point z 140 → 160 mm', 'stopping time, category 1 stop 0.85 s → none']);
    // Numbers that differ only beyond the usual decimals still read differently.
    const fine = changed((s) => ((s.models[1].params as { upperArm: number }).upperArm = 610.0004));
    expect(linesOf(fine, 'Demo Articulated 1400')).toEqual(['upper arm length 610 → 610.0004 mm']);
  });

  it('work points moved, z, approach, assigned arm, tag; added and removed', () => {
    const d = changed((s) => {
      const [p1, p2] = s.layout.content.workPoints;
      // (72, 96) → 120 mm (Pythagoras, 3-4-5 scaled by 24)
      p1.x += 72;
      p1.y += 96;
      p1.z = 300;
      p1.assignedArm = 'R2';
      p2.approach = 'top';
      p2.tag = 'case';
      s.layout.content.workPoints.push({ id: 'P3', x: 100, y: 200, z: 50, approach: 'top', tag: '', assignedArm: 'R4' });
    });
    expect(linesOf(d, 'Work point P1')).toEqual(['moved 120 mm (from 4400, 3000 to 4472, 3096 mm)', 'z 100 → 300 mm', 'assigned arm R1 → R2']);
    expect(linesOf(d, 'Work point P2')).toEqual(['approach any direction → from above', 'tag none → ‘case’']);
    expect(d.groups.find((g) => g.id === 'P3')).toMatchObject({ status: 'added', changes: [{ text: 'at 100, 200 mm, z 50 mm, approach from above, assigned arm R4' }] });
    const gone = changed((s) => s.layout.content.workPoints.splice(1, 1));
    expect(gone.groups).toMatchObject([{ element: 'workPoint', id: 'P2', status: 'removed' }]);
  });

  it('work heights, names, floor plan file, layers, drawing and its checksum', () => {
    const d = changed((s) => {
      s.layout.content.workHeights = [100, 1100];
      s.project.clientName = null;
      s.layout.name = 'Line 3 cell';
      const fp = s.floorPlan!;
      fp.fileName = 'hall-rev2.dxf';
      fp.layers[1].role = 'column';
      fp.layers[1].height = null;
      fp.layers.push({ name: 'COLUMNS', role: 'column', height: null, entityCount: 6, color: '#00ff00' });
      (fp.geometry.features[1].geometry as { coordinates: number[][] }).coordinates[1] = [5000, 2500];
      fp.bounds.maxX = 25000;
    });
    expect(linesOf(d, 'Project')).toEqual(['client ‘Fernhill Biscuits’ → none']);
    expect(linesOf(d, 'Cell layout')).toEqual(['name ‘Line 3 end-of-line cell’ → ‘Line 3 cell’']);
    expect(linesOf(d, 'Work heights')).toEqual(['100, 900 mm → 100, 1100 mm']);
    const plan = linesOf(d, 'Floor plan');
    expect(plan[0]).toMatch(/^checksum [0-9a-f]{12} → [0-9a-f]{12}$/);
    expect(plan.slice(1)).toEqual([
      'file ‘hall.dxf’ → ‘hall-rev2.dxf’',
      'drawing changed (2 features)',
      'layer WALLS role wall → column',
      'layer WALLS height 1500 mm → full height',
      'layer COLUMNS added (column, 6 entities)',
      'extent x 0…24000, y 0…16000 → x 0…25000, y 0…16000 mm',
    ]);
    // The order of the groups: project, layout, floor plan, work heights, then the lists.
    expect(d.groups.map((g) => g.element)).toEqual(['project', 'layout', 'floorPlan', 'workHeights']);
    // Checksums the caller already has (the stored plans' keys) are used: equal ones skip the plan's compare.
    const renamed = baseSnapshot();
    renamed.floorPlan!.fileName = 'other.dxf';
    expect(diffSnapshots(baseSnapshot(), renamed, A, { floorPlanChecksums: { before: 'f'.repeat(64), after: 'f'.repeat(64) } }).groups).toEqual([]);
    expect(linesOf(diffSnapshots(baseSnapshot(), renamed, A, { floorPlanChecksums: { before: 'a'.repeat(64), after: 'b'.repeat(64) } }), 'Floor plan')).toEqual(['checksum aaaaaaaaaaaa → bbbbbbbbbbbb', 'file ‘hall.dxf’ → ‘other.dxf’']);
    const removed = changed((s) => (s.floorPlan = null));
    expect(removed.groups[0]).toMatchObject({ element: 'floorPlan', status: 'removed' });
    expect(removed.groups[0].changes.map((c) => c.text)).toEqual([expect.stringMatching(/^checksum [0-9a-f]{12}$/), '‘hall.dxf’ (drawing unit mm, 2 features)']);
  });

  it('findings new, gone and changed', () => {
    const d = changed((s) => {
      s.analysis.findings[0] = { ...s.analysis.findings[0], message: 'Arms R1 and R2 share 0.800 m².' };
      s.analysis.findings[1] = finding('fence-reach-over:F1+R1', 'R1 reaches over fence F1.');
    });
    expect(d.groups).toEqual([]);
    expect(d.findings.added.map((f) => f.id)).toEqual(['fence-reach-over:F1+R1']);
    expect(d.findings.removed.map((f) => f.id)).toEqual(['fence-too-low:F1']);
    expect(d.findings.changed).toEqual([{ id: 'shared-zone:R1+R2', severity: 'warning', message: 'Arms R1 and R2 share 0.800 m².', before: { severity: 'warning', message: 'Arms R1 and R2 share 1.200 m².' } }]);
  });
});

// ——— Every leaf ———

type Path = Array<string | number>;
/** Paths the diff leaves out on purpose: bookkeeping, and analysis results other than the findings' id, severity and message. */
const LEFT_OUT = [/^project\.id$/, /^layout\.id$/, /^layout\.version$/, /^analysis\.(?!findings\.\d+\.(id|severity|message)$)/];
const leftOut = (p: Path) => LEFT_OUT.some((re) => re.test(p.join('.')));

function nodes(v: unknown, path: Path = [], out: Array<{ path: Path; value: unknown }> = []) {
  out.push({ path, value: v });
  if (Array.isArray(v)) v.forEach((x, i) => nodes(x, [...path, i], out));
  else if (v && typeof v === 'object') for (const [k, x] of Object.entries(v)) nodes(x, [...path, k], out);
  return out;
}
const isLeaf = (v: unknown) => v === null || typeof v !== 'object';
function edit(s: unknown, path: Path, f: (parent: Record<string | number, unknown>, key: string | number) => void) {
  const parent = path.slice(0, -1).reduce<unknown>((o, k) => (o as Record<string | number, unknown>)[k], s) as Record<string | number, unknown>;
  f(parent, path[path.length - 1]);
}
const mutated = (v: unknown) => (typeof v === 'number' ? v + 7.25 : typeof v === 'string' ? `${v}x` : typeof v === 'boolean' ? !v : 5);
const lines = (d: RevisionDiff) => [...d.groups.flatMap((g) => g.changes.map((c) => c.text)), ...d.findings.added.map((f) => f.id), ...d.findings.removed.map((f) => f.id), ...d.findings.changed.map((f) => f.id)];

describe('revision diff: every leaf', () => {
  const all = nodes(baseSnapshot());
  const leaves = all.filter((n) => n.path.length && isLeaf(n.value));

  it('a change of any one leaf of the inputs is reported, in words (never as a raw field path), both ways', () => {
    const inputs = leaves.filter((n) => !leftOut(n.path));
    expect(inputs.length).toBeGreaterThan(250);
    const silent: string[] = [];
    const raw: string[] = [];
    for (const { path, value } of inputs) {
      const after = baseSnapshot();
      edit(after, path, (o, k) => (o[k] = mutated(value)));
      for (const d of [diff(baseSnapshot(), after), diff(after, baseSnapshot())]) {
        if (nothing(d)) silent.push(path.join('.'));
        raw.push(...lines(d).filter((t) => t.startsWith('field ‘')).map((t) => `${path.join('.')}: ${t}`));
      }
    }
    expect(silent).toEqual([]);
    expect(raw).toEqual([]);
  });

  it('removing any member of the inputs is reported', () => {
    const CONTAINERS = new Set(['project', 'layout', 'layout.content', 'models', 'analysis', 'analysis.findings']);
    const members = all.filter((n) => n.path.length && typeof n.path[n.path.length - 1] === 'string' && n.value !== null && !leftOut(n.path) && !CONTAINERS.has(n.path.join('.')));
    const silent: string[] = [];
    for (const { path } of members) {
      const after = baseSnapshot();
      edit(after, path, (o, k) => delete o[k]);
      if (nothing(diff(baseSnapshot(), after))) silent.push(path.join('.'));
    }
    expect(silent).toEqual([]);
  });

  it('a field the diff has no words for, added anywhere in the inputs, is still reported under its path', () => {
    const objects = all.filter((n) => n.value && typeof n.value === 'object' && !Array.isArray(n.value) && !leftOut(n.path) && !/^analysis/.test(n.path.join('.')));
    const silent: string[] = [];
    for (const { path } of objects) {
      const after = baseSnapshot();
      const target = path.reduce<unknown>((o, k) => (o as Record<string | number, unknown>)[k], after) as Record<string, unknown>;
      target.addedLater = 42;
      const text = lines(diff(baseSnapshot(), after));
      // Inside the drawing's GeoJSON any change reads as "drawing changed"; everywhere else the new field is named.
      const inDrawing = path.join('.').startsWith('floorPlan.geometry');
      if (!text.some((t) => (inDrawing ? t.startsWith('drawing changed') : t.includes('addedLater') && t.endsWith('none → 42')))) silent.push(`${path.join('.') || '(root)'}: ${JSON.stringify(text)}`);
    }
    expect(silent).toEqual([]);
  });
});
