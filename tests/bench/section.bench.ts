// Section benchmark: the side view of the demo cell along a 10 m line across all four demo arms,
// the fence and the floor, as the editor's worker computes it once per drag frame. Target: ≤ 16 ms
// per section (one frame) once warmed up, median of 40 runs with the line moved 1 mm each time so
// nothing is reused. Also the bucketed vertical slice against the plain scan. Prints figures and ratios.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { armReachFor } from '../../shared/analysis/armReach';
import { sectionOf, type SectionArm } from '../../shared/analysis/section';
import { profileColumnAt, profileColumnIndex } from '../../shared/kinematics/profile';
import type { Boundary } from '../../shared/schemas/layout';
import { report } from './report';

const FRAME_TARGET_MS = 16;

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const model = (f: string) => JSON.parse(readFileSync(path.join(root, 'samples/arm-models', `${f}.json`), 'utf8')).params;
const layout = JSON.parse(readFileSync(path.join(root, 'samples/layouts/fernhill-line3.json'), 'utf8'));
const content = layout.content ?? layout;
const byOrder = ['demo-scara-600', 'demo-scara-600', 'demo-articulated-1400', 'demo-palletizer-3100'];
const arms: SectionArm[] = content.arms.map((a: { id: string; label: string; x: number; y: number; yaw: number; mountHeight: number; restrict?: { j1Min: number; j1Max: number } }, i: number) => ({
  id: a.id,
  label: a.label,
  pose: a,
  envelope: armReachFor(model(byOrder[i]), a.restrict).envelope,
}));
const boundaries = content.boundaries as Boundary[];

// A line from the pickers to beyond the fence's east side, bent so it passes every arm's reach.
const line = (k: number): [[number, number], [number, number]] => [[11500, 6800 + k], [24500, 8200 + k]];
for (let i = 0; i < 10; i++) sectionOf({ line: line(i), floor: null, boundaries, arms });
const times: number[] = [];
let cuts = 0;
for (let i = 0; i < 40; i++) {
  const t = performance.now();
  const r = sectionOf({ line: line(10 + i), floor: null, boundaries, arms });
  times.push(performance.now() - t);
  cuts = r.arms.length;
}
times.sort((a, b) => a - b);
const median = times[times.length >> 1];
report({ what: `section of the demo cell, 13 m line (median of 40)`, figure: median, unit: 'ms', target: FRAME_TARGET_MS, better: 'lower', digits: 2, note: `${cuts} arms cut` });

// The vertical slice: bucketed index against the plain scan over every edge.
const profile = { polygons: arms[2].envelope.profile };
const idx = profileColumnIndex(profile);
const N = 200_000;
let t = performance.now();
for (let i = 0; i < N; i++) idx(-1800 + (i % 3600));
const fast = (performance.now() - t) / N;
t = performance.now();
for (let i = 0; i < N / 10; i++) profileColumnAt(profile, -1800 + (i % 3600));
const plain = (performance.now() - t) / (N / 10);
console.log(`  vertical slice: indexed ${(fast * 1e3).toFixed(2)} µs, plain scan ${(plain * 1e3).toFixed(2)} µs  ratio ${(plain / fast).toFixed(1)}×`);
