// Builds the web client (vite build into dist/client) when it is missing or older than its sources.
import { existsSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');

function newestMtime(dir: string): number {
  let newest = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, entry.name);
    newest = Math.max(newest, entry.isDirectory() ? newestMtime(p) : statSync(p).mtimeMs);
  }
  return newest;
}

/** Runs vite build when dist/client/index.html is missing or older than frontend/ and shared/; true when it built. */
export async function buildClientIfNeeded(say: (m: string) => void): Promise<boolean> {
  const index = path.join(root, 'dist/client/index.html');
  const sources = Math.max(newestMtime(path.join(root, 'frontend')), newestMtime(path.join(root, 'shared')));
  if (existsSync(index) && statSync(index).mtimeMs >= sources) return false;
  say('Building the web client (first start or sources changed)…');
  const { build } = await import('vite');
  await build({ configFile: path.join(root, 'vite.config.ts'), logLevel: 'warn', mode: 'production' });
  return true;
}
