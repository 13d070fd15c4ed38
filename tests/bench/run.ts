// Runs every tests/bench/*.bench.ts in turn (or those whose name contains the argument), each in a
// process of its own, and ends with one line: how many targets and checks were met and missed
// (tests/bench/report.ts). Exit code 1 only when a benchmark failed: it crashed, or one of its
// checks (a wrong answer) failed; a missed speed target alone is reported, not an error.
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import os from 'node:os';
import path from 'node:path';

const dir = path.dirname(fileURLToPath(import.meta.url));
const only = process.argv[2];
const files = readdirSync(dir)
  .filter((f) => f.endsWith('.bench.ts'))
  .filter((f) => !only || f.includes(only))
  .sort();
if (files.length === 0) {
  console.log(`no benchmark matches "${only}" (${readdirSync(dir).filter((f) => f.endsWith('.bench.ts')).map((f) => f.replace('.bench.ts', '')).join(', ')})`);
  process.exit(1);
}
const tmp = mkdtempSync(path.join(os.tmpdir(), 'ringfence-bench-'));
const results = path.join(tmp, 'results.jsonl');
const failed: string[] = [];
try {
  for (const f of files) {
    console.log(`\n=== ${f}`);
    const r = spawnSync(process.execPath, ['--import', 'tsx', path.join(dir, f)], { stdio: 'inherit', env: { ...process.env, BENCH_RESULTS: results } });
    if (r.status !== 0) failed.push(`${f} (${r.signal ?? `exit ${r.status}`})`);
  }
  let text = '';
  try {
    text = readFileSync(results, 'utf8');
  } catch {
    // no benchmark reported anything
  }
  const lines = text.split('\n').filter(Boolean).map((l) => JSON.parse(l) as { what: string; met: boolean });
  const met = lines.filter((l) => l.met).length;
  const missed = lines.length - met;
  console.log(
    `\n${met} met, ${missed} missed across ${files.length} benchmark file(s)` +
      (missed ? ` (missed: ${lines.filter((l) => !l.met).map((l) => l.what).join('; ')})` : '') +
      (failed.length ? `; failed: ${failed.join(', ')}` : ''),
  );
} finally {
  rmSync(tmp, { recursive: true, force: true });
}
if (failed.length) process.exit(1);
