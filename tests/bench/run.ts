// Runs every tests/bench/*.bench.ts in turn (each prints its own figures and ratios).
import { readdirSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import path from 'node:path';

const dir = path.dirname(fileURLToPath(import.meta.url));
const only = process.argv[2];
const files = readdirSync(dir)
  .filter((f) => f.endsWith('.bench.ts'))
  .filter((f) => !only || f.includes(only))
  .sort();
let failed = 0;
for (const f of files) {
  console.log(`\n=== ${f}`);
  const r = spawnSync(process.execPath, ['--import', 'tsx', path.join(dir, f)], { stdio: 'inherit' });
  if (r.status !== 0) failed++;
}
if (failed) {
  console.log(`\n${failed} benchmark file(s) failed`);
  process.exit(1);
}
