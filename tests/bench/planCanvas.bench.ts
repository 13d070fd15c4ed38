// Plan canvas: building the static layers' path data for a large plan. The canvas builds it
// once per drawing (zoom and pan only move the group), so this is the cost of showing a plan.
// Target: a 20 000-feature plan's path data in under 100 ms (a few frames, once per drawing).
import { performance } from 'node:perf_hooks';
import type { Feature, LineString, Polygon } from 'geojson';
import { geometryPath } from '../../frontend/src/plan/pathData';
import { report } from './report';

const FEATURES = 20_000;
const TARGET_MS = 100;

/** A plan of rectangles (columns, racks) and polylines (walls) on a 100 × 200 grid, mm. */
function makePlan(n: number): Feature<LineString | Polygon>[] {
  const out: Feature<LineString | Polygon>[] = [];
  for (let i = 0; i < n; i += 1) {
    const x = (i % 200) * 1234.5;
    const y = Math.floor(i / 200) * 987.25;
    if (i % 2 === 0) {
      out.push({ type: 'Feature', properties: {}, geometry: { type: 'Polygon', coordinates: [[[x, y], [x + 400, y], [x + 400, y + 400], [x, y + 400], [x, y]]] } });
    } else {
      const pts = Array.from({ length: 8 }, (_, k) => [x + k * 100.125, y + (k % 2) * 50.5]);
      out.push({ type: 'Feature', properties: {}, geometry: { type: 'LineString', coordinates: pts } });
    }
  }
  return out;
}

const plan = makePlan(FEATURES);
const times: number[] = [];
let chars = 0;
for (let run = 0; run < 12; run += 1) {
  const t0 = performance.now();
  const parts: string[] = [];
  for (const f of plan) parts.push(geometryPath(f.geometry));
  const d = parts.join('');
  times.push(performance.now() - t0);
  chars = d.length;
}
times.sort((a, b) => a - b);
const median = times[Math.floor(times.length / 2)];
report({
  what: `plan canvas path data for ${FEATURES} features (median of 12)`, figure: median, unit: 'ms', target: TARGET_MS, better: 'lower', digits: 1,
  note: `best ${times[0].toFixed(1)} ms, ${(chars / 1e6).toFixed(2)} M characters`,
});
