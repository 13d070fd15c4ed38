// Layout analysis benchmark: 40 arms × 10 000 work points × 3 work heights on a 2 000-entity floor,
// against a naive baseline in the same run (every pair through turf.intersect, every point through
// turf.booleanPointInPolygon on the placed plan bands, no prefilter) — the same shared zones and the
// same unreached points. Target: ≥ 30× faster and ≤ 100 ms. Then incremental re-analysis after one
// arm moves with 100 arms × 50 000 points — target ≤ 16 ms. Between them, the same 40-arm layout with
// fences and safeguarded openings (the safeguarding checks' cost; compare with a run before them).
// Reports figures and ratios (report.ts); the same shared zones as the baseline is a check.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { booleanPointInPolygon, featureCollection, intersect, point, polygon as turfPolygon, multiPolygon } from '@turf/turf';
import type { Feature, FeatureCollection, MultiPolygon, Polygon } from 'geojson';
import { createAnalyzer, prepareFloor, type AnalysisInput } from '@shared/analysis';
import { armReachFor } from '@shared/analysis/armReach';
import { armPose } from '@shared/geometry/frames';
import { polygonsToGeoJSON } from '@shared/geometry/geojson';
import { polygonsArea } from '@shared/geometry/area';
import type { ArmPlacement, WorkPoint, Boundary } from '@shared/schemas/layout';
import { check, report } from './report';

const FULL_TARGET_MS = 100;
const SPEEDUP_TARGET = 30;
const INCREMENTAL_TARGET_MS = 16;
/** Runs per figure: medians of few runs swing with the collector and with which arm moves. */
const FULL_RUNS = 9;
const INCREMENTAL_MOVES = 45;

const samples = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../samples/arm-models');
const MODELS: Record<number, unknown> = {};
['demo-scara-600', 'demo-articulated-1400', 'demo-palletizer-3100'].forEach((f, i) => {
  MODELS[i + 1] = JSON.parse(readFileSync(path.join(samples, `${f}.json`), 'utf8')).params;
});
const reachFor = (id: number, r: ArmPlacement['restrict']) => armReachFor(MODELS[id], r);

/** Deterministic pseudo-random numbers (mulberry32) so every run measures the same layout. */
function rng(seed: number) {
  return () => {
    seed |= 0;
    seed = (seed + 0x6d2b79f5) | 0;
    let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function layout(arms: number, points: number, seed: number) {
  const rand = rng(seed);
  const cols = Math.ceil(Math.sqrt(arms * 1.6));
  const spacing = 3200;
  const armList: ArmPlacement[] = Array.from({ length: arms }, (_, i) => ({
    id: `R${i + 1}`,
    armModelId: 1 + (i % 3),
    label: '',
    x: 2000 + (i % cols) * spacing + rand() * 600,
    y: 2000 + Math.floor(i / cols) * spacing + rand() * 600,
    yaw: Math.round(rand() * 360),
    mountHeight: i % 3 === 0 ? 400 : 0,
  }));
  const w = 2000 + cols * spacing;
  const h = 2000 + Math.ceil(arms / cols) * spacing;
  const heights = [800, 1000, 1200];
  const pts: WorkPoint[] = Array.from({ length: points }, (_, i) => ({
    id: `P${i + 1}`, x: rand() * w, y: rand() * h, z: heights[i % 3], approach: 'top', tag: '',
  }));
  // 2 000 floor entities: a column grid (closed squares) and wall lines
  const features: Feature[] = [{ type: 'Feature', properties: { layer: 'OUTLINE' }, geometry: { type: 'Polygon', coordinates: [[[0, 0], [w, 0], [w, h], [0, h], [0, 0]]] } }];
  for (let i = 0; features.length < 2000; i++) {
    const cx = (i * 7919) % w;
    const cy = (i * 104729) % h;
    if (i % 2 === 0) features.push({ type: 'Feature', properties: { layer: 'COLUMNS' }, geometry: { type: 'Polygon', coordinates: [[[cx, cy], [cx + 300, cy], [cx + 300, cy + 300], [cx, cy + 300], [cx, cy]]] } });
    else features.push({ type: 'Feature', properties: { layer: 'WALLS' }, geometry: { type: 'LineString', coordinates: [[cx, cy], [cx + 1500, cy]] } });
  }
  const floor = prepareFloor({ type: 'FeatureCollection', features } as FeatureCollection, [
    { name: 'OUTLINE', role: 'outline', height: null },
    { name: 'COLUMNS', role: 'column', height: null },
    { name: 'WALLS', role: 'wall', height: 1200 },
  ]);
  const input: AnalysisInput = { arms: armList, workPoints: pts, boundaries: [], workHeights: heights, floor };
  return input;
}

function median(xs: number[]) {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

/** The naive baseline: turf on placed plan polygons, no prefilter, no caches. */
function naive(input: AnalysisInput) {
  const placed = input.arms.map((a) => {
    const reach = reachFor(a.armModelId, a.restrict);
    const pose = armPose(a);
    const restricted = pose.placePolygons(reach.restricted);
    const bands = new Map(input.workHeights.map((h) => [h, polygonsToGeoJSON(pose.placePolygons(reach.bandAt(pose.toArmZ(h))))]));
    return { a, restricted: polygonsToGeoJSON(restricted), bands };
  });
  const toFeature = (g: Polygon | MultiPolygon): Feature<Polygon | MultiPolygon> => (g.type === 'Polygon' ? turfPolygon(g.coordinates) : multiPolygon(g.coordinates));
  const shared: string[] = [];
  for (let i = 0; i < placed.length; i++) {
    for (let j = i + 1; j < placed.length; j++) {
      const r = intersect(featureCollection([toFeature(placed[i].restricted), toFeature(placed[j].restricted)]));
      if (r) {
        const g = r.geometry;
        const polys = g.type === 'Polygon' ? [g.coordinates] : g.coordinates;
        const area = polygonsArea(polys.map((p) => p.map((ring) => ring.slice(0, -1).map(([x, y]) => [x, y] as [number, number]))));
        if (area >= 1) shared.push([placed[i].a.id, placed[j].a.id].sort().join('+'));
      }
    }
  }
  const unreached: string[] = [];
  for (const p of input.workPoints) {
    const pt = point([p.x, p.y]);
    let reached = false;
    for (const q of placed) {
      const band = q.bands.get(p.z)!;
      if (band.coordinates.length && booleanPointInPolygon(pt, band)) reached = true;
    }
    if (!reached) unreached.push(p.id);
  }
  return { shared: shared.sort(), unreached };
}

// Each section runs in its own function, so what it built is garbage before the next one measures
// (the incremental run should see a heap like the editor's worker: one layout and its analyzer).
/** CPU time of this process since `c0`, ms (less sensitive than wall time to what else runs). */
const cpuMs = (c0: NodeJS.CpuUsage) => {
  const u = process.cpuUsage(c0);
  return (u.user + u.system) / 1000;
};

function fullSection(): void {
  // ---- full analysis
  const input = layout(40, 10_000, 42);
  createAnalyzer(reachFor).analyze(input); // warms the per-model reach cache (models load once per session)
  const fullTimes: number[] = [];
  const fullCpu: number[] = [];
  let result = createAnalyzer(reachFor).analyze(input);
  for (let i = 0; i < FULL_RUNS; i++) {
    const t = performance.now();
    const c0 = process.cpuUsage();
    result = createAnalyzer(reachFor).analyze(input);
    fullCpu.push(cpuMs(c0));
    fullTimes.push(performance.now() - t);
  }
  const tn = performance.now();
  const base = naive(input);
  const naiveMs = performance.now() - tn;

  const ours = {
    shared: result.sharedZones.map((o) => [...o.arms].sort().join('+')).sort(),
    unreached: result.findings.filter((f) => f.kind === 'unreached-point').map((f) => f.points[0]),
  };
  const sameShared = JSON.stringify(ours.shared) === JSON.stringify(base.shared);
  const a = new Set(ours.unreached);
  const b = new Set(base.unreached);
  const onlyOurs = [...a].filter((x) => !b.has(x));
  const onlyBase = [...b].filter((x) => !a.has(x));
  const full = median(fullTimes);
  const what = 'full analysis, 40 arms × 10 000 points × 3 heights, 2 000 floor entities';
  report({ what: `${what} (median of ${FULL_RUNS})`, figure: full, unit: 'ms', target: FULL_TARGET_MS, better: 'lower', digits: 1, note: `CPU time ${median(fullCpu).toFixed(1)} ms (all threads, the collector's included)` });
  console.log(`  baseline ${naiveMs.toFixed(1)} ms (turf.intersect per pair, booleanPointInPolygon per point × arm)`);
  report({ what: `${what}, speed-up over the baseline`, figure: naiveMs / full, unit: '×', target: SPEEDUP_TARGET, better: 'higher', digits: 1 });
  check('full analysis finds the same shared zones as the baseline', sameShared, `${ours.shared.length} vs ${base.shared.length}; unreached points ${a.size} vs ${b.size}` +
    (onlyOurs.length + onlyBase.length ? `, differing ${onlyOurs.length + onlyBase.length} (within the 1 mm chord tolerance of a band edge)` : ', identical'));

  // ---- full analysis with fences and safeguarded openings (ISO 13855/13857/13854 checks)
  function withGuards(base: AnalysisInput): AnalysisInput {
    const cols = Math.ceil(Math.sqrt(base.arms.length * 1.6));
    const rows = Math.ceil(base.arms.length / cols);
    const w = 2000 + cols * 3200;
    const h = 2000 + rows * 3200;
    const boundaries: Boundary[] = [{ id: 'F0', kind: 'fence', label: '', points: [[0, 0], [w, 0], [w, h], [0, h], [0, 0]], height: 2000, meshMm: 30, meshShape: 'square' }];
    for (let r = 0; r + 1 < rows; r++) {
      const y = 2000 + r * 3200 + 1900;
      boundaries.push({ id: `F${r + 1}`, kind: 'fence', label: '', points: [[0, y], [w, y]], height: 1400 });
      for (let c = 0; c < cols; c++) {
        const x = 2000 + c * 3200 + 1000;
        boundaries.push({ id: `O${r + 1}-${c + 1}`, kind: 'opening', label: '', points: [[x, y], [x + 1000, y]], fenceId: `F${r + 1}`, safeguard: { device: c % 2 ? 'light-curtain' : 'interlock', resolutionMm: c % 2 ? 30 : undefined, responseTimeS: 0.05, stopCategory: 0, approach: 'normal' } });
      }
    }
    return { ...base, boundaries };
  }
  const guarded = withGuards(input);
  createAnalyzer(reachFor).analyze(guarded);
  const guardTimes: number[] = [];
  let guardedResult = createAnalyzer(reachFor).analyze(guarded);
  for (let i = 0; i < 5; i++) {
    const t = performance.now();
    guardedResult = createAnalyzer(reachFor).analyze(guarded);
    guardTimes.push(performance.now() - t);
  }
  console.log(`full analysis with ${guarded.boundaries.filter((z) => z.kind === 'fence').length} fences and ${guarded.boundaries.filter((z) => z.kind === 'opening').length} safeguarded openings, same layout`);
  console.log(`  ${median(guardTimes).toFixed(1)} ms (median of 5); ${guardedResult.findings.length} findings, ${guardedResult.safeguarding?.openings.length ?? 0} opening rows`);
}
fullSection();

function incrementalSection(): void {
  // ---- incremental
  const big = layout(100, 50_000, 7);
  const analyzer = createAnalyzer(reachFor);
  analyzer.analyze(big);
  const incTimes: number[] = [];
  const incCpu: number[] = [];
  for (let i = 0; i < INCREMENTAL_MOVES; i++) {
    const arms = big.arms.slice();
    const k = (i * 37) % arms.length;
    arms[k] = { ...arms[k], x: arms[k].x + 50 + i, y: arms[k].y + 25 };
    const t = performance.now();
    const c0 = process.cpuUsage();
    analyzer.analyze({ ...big, arms });
    incCpu.push(cpuMs(c0));
    incTimes.push(performance.now() - t);
    big.arms = arms;
  }
  const inc = median(incTimes);
  report({
    what: `incremental re-analysis after one arm moves, 100 arms × 50 000 points (median of ${INCREMENTAL_MOVES})`, figure: inc, unit: 'ms', target: INCREMENTAL_TARGET_MS, better: 'lower', digits: 1,
    note: `CPU time ${median(incCpu).toFixed(1)} ms; last recomputed ${JSON.stringify(analyzer.lastStats())}`,
  });
}
incrementalSection();
