// The house rules of the module graph, checked over the real sources with TypeScript's own module
// resolution (type-only imports included, which the linter's cycle rule does not follow):
// no import cycle anywhere; shared/ never imports backend/ or frontend/; the shared layers point one
// way (geometry ← kinematics ← analysis; schemas import only zod and types); route files import
// no other route file.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../..');
const SOURCE_DIRS = ['shared', 'backend/src', 'backend/scripts', 'frontend/src'];

function sources(dir: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir)) {
    const p = path.join(dir, name);
    if (statSync(p).isDirectory()) out.push(...sources(p));
    else if (/\.(ts|tsx)$/.test(name) && !name.endsWith('.d.ts')) out.push(p);
  }
  return out;
}

const config = ts.getParsedCommandLineOfConfigFile(path.join(root, 'tsconfig.json'), {}, { ...ts.sys, onUnRecoverableConfigFileDiagnostic: () => {} })!;
const files = SOURCE_DIRS.flatMap((d) => sources(path.join(root, d)));
const rel = (f: string) => path.relative(root, f).split(path.sep).join('/');

/** Project-internal imports of every source file (relative paths from the repository root). */
function importGraph(): Map<string, string[]> {
  const graph = new Map<string, string[]>();
  for (const f of files) {
    const info = ts.preProcessFile(readFileSync(f, 'utf8'), true, true);
    const deps: string[] = [];
    for (const imp of info.importedFiles) {
      const r = ts.resolveModuleName(imp.fileName, f, config.options, ts.sys).resolvedModule;
      if (!r || r.isExternalLibraryImport || r.resolvedFileName.includes('node_modules')) continue;
      deps.push(rel(r.resolvedFileName));
    }
    graph.set(rel(f), deps);
  }
  return graph;
}

const graph = importGraph();

/** Strongly connected components with more than one file (Tarjan), or a file importing itself. */
function cycles(g: Map<string, string[]>): string[][] {
  let index = 0;
  const idx = new Map<string, number>();
  const low = new Map<string, number>();
  const stack: string[] = [];
  const on = new Set<string>();
  const out: string[][] = [];
  const visit = (v: string) => {
    idx.set(v, index);
    low.set(v, index++);
    stack.push(v);
    on.add(v);
    for (const w of g.get(v) ?? []) {
      if (!g.has(w)) continue;
      if (!idx.has(w)) {
        visit(w);
        low.set(v, Math.min(low.get(v)!, low.get(w)!));
      } else if (on.has(w)) low.set(v, Math.min(low.get(v)!, idx.get(w)!));
    }
    if (low.get(v) === idx.get(v)) {
      const comp: string[] = [];
      let w: string;
      do {
        w = stack.pop()!;
        on.delete(w);
        comp.push(w);
      } while (w !== v);
      if (comp.length > 1 || (g.get(v) ?? []).includes(v)) out.push(comp.sort());
    }
  };
  for (const v of g.keys()) if (!idx.has(v)) visit(v);
  return out;
}

const edges = (pred: (from: string, to: string) => boolean) =>
  [...graph].flatMap(([from, deps]) => deps.filter((to) => pred(from, to)).map((to) => `${from} → ${to}`));

describe('module graph', () => {
  it('reads the sources it checks', () => {
    expect(graph.size).toBeGreaterThan(200);
    expect(graph.get('shared/analysis/analyze.ts')?.length).toBeGreaterThan(3);
  });

  it('has no import cycle, type-only imports included', () => {
    expect(cycles(graph)).toEqual([]);
    // The detector itself finds a cycle when there is one.
    expect(cycles(new Map([['a', ['b']], ['b', ['c']], ['c', ['a']], ['d', ['a']]]))).toEqual([['a', 'b', 'c']]);
  });

  it('keeps shared/ free of backend and frontend code', () => {
    expect(edges((f, t) => f.startsWith('shared/') && !t.startsWith('shared/'))).toEqual([]);
  });

  it('points the shared layers one way: geometry ← kinematics ← analysis, schemas beside them', () => {
    const layer = (p: string) => p.split('/')[1];
    const allowed: Record<string, string[]> = {
      geometry: ['geometry', 'schemas'],
      schemas: ['schemas'],
      kinematics: ['kinematics', 'geometry', 'schemas', 'canonicalJson.ts'],
      safety: ['safety'],
      analysis: ['analysis', 'kinematics', 'geometry', 'schemas', 'safety', 'canonicalJson.ts'],
    };
    expect(edges((f, t) => f.startsWith('shared/') && layer(f) in allowed && !allowed[layer(f)].includes(layer(t)))).toEqual([]);
  });

  it('lets route files import services, never other route files', () => {
    expect(edges((f, t) => f.startsWith('backend/src/routes/') && t.startsWith('backend/src/routes/'))).toEqual([]);
  });
});
