// Layout panels: the work done in JavaScript when 10 000 work points meet 20 arms.
// Targets: building and sorting the coverage matrix in under 50 ms (it runs once per analysis
// result or sort change); one frame's colour work for the rows in view in under 2 ms (the canvas
// draws only those, whatever the point count); parsing a 10 000-row CSV in under 300 ms.
import { performance } from 'node:perf_hooks';
import { buildCoverageMatrix, marginColourScale, marginScaleSpan, visibleRows } from '../../frontend/src/components/layout/coverageMatrixModel';
import { parseWorkPointsCsv, workPointsToCsv } from '../../frontend/src/components/layout/workPointsCsv';
import { workPointRows } from '../../frontend/src/components/layout/workPointRows';
import { report } from './report';

const POINTS = 10_000;
const ARMS = 20;
const MATRIX_TARGET_MS = 50;
const FRAME_TARGET_MS = 2;
const CSV_TARGET_MS = 300;

let seed = 7;
const rnd = () => ((seed = (seed * 16807) % 2147483647) / 2147483647);
const armIds = Array.from({ length: ARMS }, (_, i) => `R${i + 1}`);
const points = Array.from({ length: POINTS }, (_, i) => ({
  id: `P${i + 1}`, x: Math.round(rnd() * 24000), y: Math.round(rnd() * 16000), z: Math.round(rnd() * 1600),
  approach: 'top' as const, tag: i % 3 ? 'infeed' : 'pallet L1', assignedArm: armIds[i % ARMS],
}));
const coverage: Record<string, Record<string, number>> = {};
for (const p of points) coverage[p.id] = Object.fromEntries(armIds.map((a) => [a, Math.round((rnd() * 4000 - 3000) * 10) / 10]));

function median(f: () => unknown, runs = 15): number {
  for (let i = 0; i < 3; i++) f();
  const t: number[] = [];
  for (let i = 0; i < runs; i++) {
    const s = performance.now();
    f();
    t.push(performance.now() - s);
  }
  return t.sort((a, b) => a - b)[Math.floor(runs / 2)];
}
const line = (name: string, ms: number, target: number) => report({ what: name, figure: ms, unit: 'ms', target, better: 'lower', digits: 2 });

const matrixMs = median(() => buildCoverageMatrix(points, armIds, coverage, { by: 'worst', dir: 'asc' }));
line(`coverage matrix ${POINTS} × ${ARMS}, worst first`, matrixMs, MATRIX_TARGET_MS);
line(`coverage matrix ${POINTS} × ${ARMS}, by one arm`, median(() => buildCoverageMatrix(points, armIds, coverage, { by: 'arm', arm: 'R7' })), MATRIX_TARGET_MS);

const m = buildCoverageMatrix(points, armIds, coverage, { by: 'worst', dir: 'asc' });
const scale = marginColourScale(marginScaleSpan(m.maxAbs));
const frameMs = median(() => {
  // What one redraw computes: the rows in a 350 px view at 18 px a row, every arm's colour.
  const [first, last] = visibleRows(5000 * 18, 350, m.ids.length, 18);
  let n = 0;
  for (let r = first; r < last; r++) for (let c = 0; c < ARMS; c++) n += scale(m.margins[r * ARMS + c]).length;
  return n;
}, 101);
line(`colours of one frame (${Math.ceil(350 / 18) + 1} rows × ${ARMS} arms)`, frameMs, FRAME_TARGET_MS);

line(`table rows with best margin, ${POINTS} points`, median(() => workPointRows(points, armIds, { coverage, findings: [], sharedZones: [], regions: {}, timingMs: 0 })), MATRIX_TARGET_MS);

const csv = workPointsToCsv(points, armIds, coverage);
line(`CSV export, ${POINTS} rows (${(csv.length / 1e6).toFixed(1)} MB)`, median(() => workPointsToCsv(points, armIds, coverage), 7), CSV_TARGET_MS);
const parseMs = median(() => parseWorkPointsCsv(csv, { armIds }), 7);
line(`CSV import check, ${POINTS} rows`, parseMs, CSV_TARGET_MS);
const back = parseWorkPointsCsv(csv, { armIds });
console.log(`round trip: ${back.points.length} points back, ${back.errors.length} errors`);
