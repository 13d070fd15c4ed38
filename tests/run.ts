// `npm test`: the type checker and the linter, one throwaway PostgreSQL for the run, the client built
// for the e2e suite, every vitest project (unit, reference, api, e2e), then the plain summary line CI
// reads (typecheck and lint count as one check each).
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { startTestPg } from './support/pgForTests';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const out = path.join(root, 'tests/.output');
mkdirSync(out, { recursive: true });
const resultsFile = path.join(out, 'results.json');
rmSync(resultsFile, { force: true });

const args = process.argv.slice(2);
const env: NodeJS.ProcessEnv = { ...process.env, NO_COLOR: '1', FORCE_COLOR: '0' };

// Static checks first: the type checker and the linter each count as one check in the summary.
const statics: Array<{ name: string; ok: boolean }> = [];
for (const [name, script] of [
  ['typecheck', 'node_modules/typescript/bin/tsc'],
  ['lint', 'node_modules/eslint/bin/eslint.js'],
] as const) {
  console.log(`[test] ${name}…`);
  const argv = name === 'typecheck' ? ['--noEmit', '-p', 'tsconfig.json'] : ['.'];
  const r = spawnSync(process.execPath, [path.join(root, script), ...argv], { cwd: root, env, stdio: 'inherit' });
  statics.push({ name, ok: r.status === 0 });
  if (r.status !== 0) console.log(`[test] ${name} failed (npm run ${name} shows the same)`);
}

console.log('[test] starting a throwaway PostgreSQL…');
const { local, cleanup } = await startTestPg();
// Set by the try block; if it throws, the error ends the run before `code` is read.
let code: number;
try {
  env.TEST_PG_ADMIN_URL = local.adminUrl;
  console.log('[test] building the web client for the end-to-end suite…');
  const build = spawnSync(process.execPath, [path.join(root, 'node_modules/vite/bin/vite.js'), 'build', '--logLevel', 'warn'], {
    cwd: root,
    env,
    stdio: 'inherit',
  });
  if (build.status !== 0) throw new Error('vite build failed');
  const vitest = spawnSync(
    process.execPath,
    [path.join(root, 'node_modules/vitest/vitest.mjs'), 'run', '--reporter=default', '--reporter=json', `--outputFile=${resultsFile}`, ...args],
    { cwd: root, env, stdio: 'inherit' },
  );
  code = vitest.status ?? 1;
} finally {
  cleanup();
}

const staticPassed = statics.filter((c) => c.ok).length;
const staticFailed = statics.length - staticPassed;
if (existsSync(resultsFile)) {
  const r = JSON.parse(readFileSync(resultsFile, 'utf8')) as {
    numPassedTests: number;
    numFailedTests: number;
    numPendingTests: number;
    numTodoTests?: number;
    numFailedTestSuites?: number;
  };
  // A file that fails to load has no failed tests of its own: count it as one failure.
  const failed = Math.max(r.numFailedTests, r.numFailedTestSuites ?? 0) + staticFailed;
  console.log(`${r.numPassedTests + staticPassed} passed, ${failed} failed, ${r.numPendingTests + (r.numTodoTests ?? 0)} skipped`);
  if (failed > 0) code = code || 1;
} else {
  console.log(`${staticPassed} passed, ${1 + staticFailed} failed, 0 skipped`);
  code = code || 1;
}
process.exit(code);
