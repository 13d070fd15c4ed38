// DXF import benchmark: a generated ~20 MB floor plan (≈200k entities, many block inserts),
// importDxf against the bare dxf-parser parse of the same text (target ≤ 1.2×), and the peak
// memory of an import measured in child processes (target ≤ 4× the file size).
// Timing runs in a child process that alternates the two (full GC before each run); memory is
// the peak RSS of fresh child processes, less that of one that only reads the file; the heap the
// finished result holds (after a full GC) is printed beside it, as the floor of that figure.
// The upload path's peak is measured the same way: the bytes read in a worker thread
// (readFloorPlan: worker, packed result, geometry JSON text) and the value that stores it made,
// beside the GeoJSON path uploads took before (the result rebuilt as objects, JSON.stringify).
// Run: npm run bench dxf   (or node --import tsx tests/bench/dxf.bench.ts)
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import DxfParser from 'dxf-parser';
import { Sequelize } from 'sequelize';
import { importDxf } from '../../backend/src/services/dxf/importDxf';
import { parseInWorker } from '../../backend/src/services/dxf/parseInWorker';
import { readFloorPlan, storedGeometry } from '../../backend/src/services/floorPlanImport';
import { DxfWriter } from '../../samples/make-samples';
import { report } from './report';

const TIME_TARGET = 1.2;
const MEMORY_TARGET = 4;
const self = fileURLToPath(import.meta.url);

/** A large invented hall: wall grid, racks as block arrays, machines, columns, labels. */
function bigPlan(): string {
  const w = new DxfWriter().insunits(4);
  w.layer('OUTLINE', 5).layer('WALLS', 8).layer('COLUMNS', 3).layer('RACKS', 4).layer('MACHINES', 6).layer('TEXT', 2);
  w.block('COLUMN', [0, 0], (b) => b.polyline('0', [[-200, -200], [200, -200], [200, 200], [-200, 200]], true));
  w.block('RACK', [0, 0], (b) => {
    b.polyline('0', [[0, 0], [2700, 0], [2700, 1100], [0, 1100]], true);
    b.line('0', [0, 550], [2700, 550]);
  });
  w.block('CELL', [500, 500], (b) => {
    b.polyline('0', [[500, 500, 0.2], [3500, 500], [3500, 2500, 0.2], [500, 2500]], true);
    b.circle('0', [2000, 1500], 400);
    b.arc('0', [2000, 1500], 700, 0, 135);
    b.insert('0', 'COLUMN', [600, 600], { xScale: 0.5, yScale: 0.5 });
  });
  const side = 400_000;
  w.polyline('OUTLINE', [[0, 0], [side, 0], [side, side], [0, side]], true);
  // wall segments on a 1 m grid: ≈120k LINEs
  let n = 0;
  for (let i = 0; i < 350 && n < 120_000; i++) {
    for (let j = 0; j < 350 && n < 120_000; j++, n++) {
      const x = i * 1000;
      const y = j * 1000;
      if ((i + j) % 2 === 0) w.line('WALLS', [x, y], [x + 1000, y]);
      else w.line('WALLS', [x, y], [x, y + 1000]);
    }
  }
  // 25k bulged polylines, 15k arcs, 10k circles
  for (let k = 0; k < 25_000; k++) {
    const x = (k % 500) * 800;
    const y = 200_000 + Math.floor(k / 500) * 800;
    w.polyline('MACHINES', [[x, y, 0.4], [x + 600, y], [x + 600, y + 400, -0.3], [x, y + 400]], true);
  }
  for (let k = 0; k < 15_000; k++) w.arc('MACHINES', [(k % 300) * 1300, 300_000 + Math.floor(k / 300) * 1300], 500, k % 360, (k % 360) + 120);
  for (let k = 0; k < 10_000; k++) w.circle('MACHINES', [(k % 200) * 2000, 350_000 + Math.floor(k / 200) * 1000], 150 + (k % 7) * 20);
  // 20k inserts: columns, rack arrays, nested cells
  for (let k = 0; k < 12_000; k++) w.insert('COLUMNS', 'COLUMN', [(k % 120) * 3300, 100_000 + Math.floor(k / 120) * 1000]);
  for (let k = 0; k < 5_000; k++) {
    w.insert('RACKS', 'RACK', [(k % 50) * 8000, 150_000 + Math.floor(k / 50) * 500], { columns: 2, rows: 1, columnSpacing: 2800, rotation: k % 2 ? 90 : 0 });
  }
  for (let k = 0; k < 3_000; k++) w.insert('MACHINES', 'CELL', [(k % 100) * 4000, 60_000 + Math.floor(k / 100) * 1300], { rotation: (k * 7) % 360 });
  for (let k = 0; k < 10_000; k++) w.text('TEXT', [(k % 100) * 4000, Math.floor(k / 100) * 600], 150, `Bay ${k}`);
  return w.toString();
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
}

const gc = (globalThis as { gc?: () => void }).gc ?? (() => undefined);

/**
 * Child process: reads the file and does one job. 'timing' alternates parse and import
 * (after one warm-up of each), with a full GC before every run so neither pays for the other's
 * garbage; the others report the peak RSS of one job.
 */
async function child(mode: string, file: string, rounds: number): Promise<void> {
  if (mode === 'bytes' || mode === 'upload' || mode === 'upload-geojson') {
    // as an upload arrives: the file's bytes (multer's buffer), then what the route stores
    const bytes = readFileSync(file);
    const before = process.memoryUsage().rss;
    let kept = 0;
    if (mode === 'upload') {
      // never connected: only its escaping is used, as the route's INSERT does
      const sequelize = new Sequelize('postgres://bench@127.0.0.1:1/bench', { logging: false });
      const r = await readFloorPlan(bytes);
      kept = storedGeometry(sequelize, r.geometryJson) ? r.stats.features : 0;
    } else if (mode === 'upload-geojson') {
      const r = await parseInWorker(bytes);
      kept = JSON.stringify(r.geometry).length > 0 ? r.stats.features : 0;
    }
    const peakKb = process.resourceUsage().maxRSS;
    process.stdout.write(JSON.stringify({ before, peak: peakKb * 1024, kept }));
    return;
  }
  const text = readFileSync(file, 'utf8');
  if (mode === 'timing') {
    const run = (f: () => unknown) => {
      gc();
      const c0 = process.cpuUsage();
      const t0 = performance.now();
      f();
      const wall = performance.now() - t0;
      const c = process.cpuUsage(c0);
      return { wall, cpu: (c.user + c.system) / 1000 };
    };
    const parse = () => new DxfParser().parseSync(text);
    const imp = () => importDxf(text);
    run(parse);
    run(imp);
    const out: Array<{ parse: { wall: number; cpu: number }; imp: { wall: number; cpu: number } }> = [];
    for (let i = 0; i < rounds; i++) {
      // alternate the order so drift in machine load hits both alike
      if (i % 2 === 0) out.push({ parse: run(parse), imp: run(imp) });
      else {
        const b = run(imp);
        out.push({ parse: run(parse), imp: b });
      }
    }
    process.stdout.write(JSON.stringify(out));
    return;
  }
  if (mode === 'result') {
    // heap the finished result holds on its own (GeoJSON: an array per position)
    gc();
    const heap0 = process.memoryUsage().heapUsed;
    const kept = importDxf(text);
    gc();
    process.stdout.write(JSON.stringify({ before: heap0, peak: process.memoryUsage().heapUsed, kept: kept.stats.features }));
    return;
  }
  const before = process.memoryUsage().rss;
  let keep: unknown;
  if (mode === 'parser') keep = new DxfParser().parseSync(text);
  else if (mode === 'import') keep = importDxf(text);
  const peakKb = process.resourceUsage().maxRSS;
  process.stdout.write(JSON.stringify({ before, peak: peakKb * 1024, kept: keep ? 1 : 0 }));
}

function spawnChild(mode: string, file: string, rounds = 0): string {
  const r = spawnSync(process.execPath, ['--expose-gc', '--import', 'tsx', self, '--child', mode, file, String(rounds)], {
    encoding: 'utf8',
    maxBuffer: 1 << 24,
  });
  if (r.status !== 0) throw new Error(`child ${mode} failed: ${r.stderr}`);
  return r.stdout;
}

function measure(mode: string, file: string): { before: number; peak: number } {
  return JSON.parse(spawnChild(mode, file));
}

const mb = (b: number) => `${(b / 1024 / 1024).toFixed(1)} MB`;

function main(): void {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'ringfence-dxf-bench-'));
  try {
    const file = path.join(dir, 'big-hall.dxf');
    const t0 = performance.now();
    writeFileSync(file, bigPlan());
    const size = statSync(file).size;
    const text = readFileSync(file, 'utf8');
    console.log(`generated ${mb(size)} in ${((performance.now() - t0) / 1000).toFixed(1)} s`);

    const result = importDxf(text);
    console.log(
      `  ${result.stats.entities.toLocaleString('en')} entities placed, ${result.stats.features.toLocaleString('en')} features, ${result.layers.length} layers`,
    );
    const rounds = Number(process.env.BENCH_ROUNDS ?? 5);
    const runs: Array<{ parse: { wall: number; cpu: number }; imp: { wall: number; cpu: number } }> = JSON.parse(
      spawnChild('timing', file, rounds),
    );
    const parseMs = median(runs.map((r) => r.parse.wall));
    const importMs = median(runs.map((r) => r.imp.wall));
    const ratio = median(runs.map((r) => r.imp.wall / r.parse.wall));
    const cpuRatio = median(runs.map((r) => r.imp.cpu / r.parse.cpu));
    console.log(`dxf-parser parseSync   ${parseMs.toFixed(0)} ms wall, ${median(runs.map((r) => r.parse.cpu)).toFixed(0)} ms CPU (median of ${rounds})`);
    console.log(`importDxf              ${importMs.toFixed(0)} ms wall, ${median(runs.map((r) => r.imp.cpu)).toFixed(0)} ms CPU`);
    report({ what: 'importDxf time over the bare dxf-parser parse (wall, median of pairs)', figure: ratio, unit: '×', target: TIME_TARGET, better: 'lower', digits: 2, note: `${cpuRatio.toFixed(2)}× CPU` });

    // peak memory, each in a fresh process, over one that only reads the file (as text, or as bytes for uploads)
    const base = measure('baseline', file);
    const bytes = measure('bytes', file);
    /** Prints one job's peak RSS over its baseline; answers the growth over the file size. */
    const peakOver = (label: string, mode: string, under: { peak: number }, note = ''): number => {
      const m = measure(mode, file);
      const delta = m.peak - under.peak;
      console.log(`peak RSS, ${label.padEnd(20)}${mb(m.peak)}  (+${mb(delta)}, ${(delta / size).toFixed(1)}× file${note})`);
      return delta / size;
    };
    console.log(`peak RSS, file read only      ${mb(base.peak)}`);
    console.log(`peak RSS, bytes read only     ${mb(bytes.peak)}`);
    peakOver('dxf-parser', 'parser', base);
    const memRatio = peakOver('importDxf', 'import', base);
    const held = measure('result', file);
    console.log(`heap the result holds         ${mb(held.peak - held.before)}  (${((held.peak - held.before) / size).toFixed(1)}× file, after GC)`);
    report({ what: 'importDxf peak memory over the file size', figure: memRatio, unit: '×', target: MEMORY_TARGET, better: 'lower', digits: 1 });

    // the upload path: worker thread and request thread in one process, the stored value made
    peakOver('GeoJSON upload', 'upload-geojson', bytes, ': worker result rebuilt as objects, JSON.stringify');
    const uploadRatio = peakOver('upload path', 'upload', bytes, ': readFloorPlan, JSON text from the packed arrays');
    report({ what: 'upload path (worker + request thread) peak memory over the file size', figure: uploadRatio, unit: '×', target: MEMORY_TARGET, better: 'lower', digits: 1 });
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

const at = process.argv.indexOf('--child');
if (at !== -1) await child(process.argv[at + 1], process.argv[at + 2], Number(process.argv[at + 3]));
else main();
