// One vocabulary (docs/glossary.md): every string a user can read — string literals, template
// pieces and JSX text of the pages, components, routes, services (plan sheet, DXF, CSV, mails),
// the core's messages and the schemas' errors, plus README and docs/ — is searched for the words
// the glossary retired. Comments are not read (they are not shown). The product's own choice of
// words; no outside source applies.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';

const ROOT = path.resolve(__dirname, '../../..');

/** Retired words: a pattern and what to say instead. */
const RETIRED: Array<{ re: RegExp; use: string; skipKeys?: boolean }> = [
  { re: /(?<!shared[\s-])\bzones?\b/i, use: '"boundary" (fence, opening, keep-out, operator area) or "shared zone"' },
  { re: /\bfloor boundar/i, use: '"floor outline"' },
  { re: /\bmax\.? reach\b/i, use: '"tool-point reach" or "maximum-space radius"' },
  { re: /reached by no arm/i, use: '"not reached"' },
  { re: /\bunreached\b/i, use: '"not reached"', skipKeys: true },
  { re: /changes[ _]requested|requests? changes|sent back|sends? back|send it back|needs changes/i, use: '"returned for changes" / "return for changes"' },
  { re: /\bapprov(e|ed|es|al|ing)\b/i, use: '"sign off" / "signed off"' },
  { re: /\bshares? (restricted )?space\b/i, use: '"shared zone"' },
];

/** Files that read data stored under the old names, and the exact old values they map. */
const LEGACY_READERS: Record<string, ReadonlySet<string>> = {
  'shared/schemas/revision.ts': new Set(['zones', 'overlaps', 'boundary']),
  'shared/words.ts': new Set(['changes_requested', 'approved']),
};

function files(dir: string, exts: string[], skip: (rel: string) => boolean): string[] {
  const out: string[] = [];
  for (const name of readdirSync(path.join(ROOT, dir))) {
    const rel = path.posix.join(dir, name);
    if (skip(rel)) continue;
    if (statSync(path.join(ROOT, rel)).isDirectory()) out.push(...files(rel, exts, skip));
    else if (exts.some((e) => rel.endsWith(e))) out.push(rel);
  }
  return out;
}

/** Every string literal, template piece and JSX text in a TypeScript file, with its line. */
function strings(rel: string): Array<{ text: string; line: number }> {
  const src = readFileSync(path.join(ROOT, rel), 'utf8');
  const sf = ts.createSourceFile(rel, src, ts.ScriptTarget.Latest, true, rel.endsWith('.tsx') ? ts.ScriptKind.TSX : ts.ScriptKind.TS);
  const out: Array<{ text: string; line: number }> = [];
  const add = (node: ts.Node, text: string) => {
    if (text.trim()) out.push({ text, line: sf.getLineAndCharacterOfPosition(node.getStart(sf)).line + 1 });
  };
  const visit = (node: ts.Node): void => {
    if (ts.isImportDeclaration(node) || ts.isExportDeclaration(node)) return;
    if (ts.isStringLiteral(node) || ts.isNoSubstitutionTemplateLiteral(node)) add(node, node.text);
    else if (ts.isTemplateHead(node) || ts.isTemplateMiddle(node) || ts.isTemplateTail(node)) add(node, node.text);
    else if (ts.isJsxText(node)) add(node, node.text);
    ts.forEachChild(node, visit);
  };
  visit(sf);
  return out;
}

const isKey = (s: string) => /^[a-z0-9_.:-]+$/i.test(s.trim()) && !/\s/.test(s.trim());

const CODE = [
  ...files('frontend/src', ['.ts', '.tsx'], () => false),
  ...files('backend/src', ['.ts'], (rel) => rel === 'backend/src/db/migrations'),
  ...files('shared', ['.ts'], () => false),
];
const DOCS = ['README.md', 'DEVELOPERS.md', ...files('docs', ['.md'], (rel) => rel === 'docs/glossary.md')];

describe('one vocabulary', () => {
  it('reads a few hundred source files (the walk itself works)', () => {
    expect(CODE.length).toBeGreaterThan(200);
    expect(CODE).toContain('backend/src/services/planSheet/tableSheets.ts');
    expect(CODE).toContain('frontend/src/components/layout/SharedZonesTable.tsx');
    // The walker sees JSX text and template pieces, not only quoted strings.
    const found = strings('frontend/src/components/review/DecisionPanel.tsx').map((s) => s.text).join(' ');
    expect(found).toMatch(/Return for changes/);
  });

  it('no string a user can read uses a retired word', () => {
    const hits: string[] = [];
    for (const rel of CODE) {
      const legacy = LEGACY_READERS[rel];
      for (const { text, line } of strings(rel)) {
        if (legacy?.has(text)) continue;
        for (const r of RETIRED) {
          if (r.skipKeys && isKey(text)) continue;
          if (r.re.test(text)) hits.push(`${rel}:${line}: "${text.trim().slice(0, 80)}" — use ${r.use}`);
        }
      }
    }
    expect(hits).toEqual([]);
  });

  it('README, DEVELOPERS.md and docs/ use the same words (the glossary names the retired ones)', () => {
    const hits: string[] = [];
    for (const rel of DOCS) {
      readFileSync(path.join(ROOT, rel), 'utf8').split('\n').forEach((lineText, i) => {
        const prose = lineText.replace(/`[^`]*`/g, ''); // code spans name data keys, which may keep old names
        for (const r of RETIRED) if (r.re.test(prose)) hits.push(`${rel}:${i + 1}: ${lineText.trim().slice(0, 90)} — use ${r.use}`);
      });
    }
    expect(hits).toEqual([]);
  });
});
