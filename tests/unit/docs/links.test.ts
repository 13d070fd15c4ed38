// The repository carries its own documentation (docs/). This test keeps the pointers to it whole:
// relative Markdown links in README.md, DEVELOPERS.md and docs/*.md must reach an existing file
// (and heading, when they name one), and code comments must name only docs pages that exist, never
// a design note kept outside the repository.
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../..');

/** Design-note file names that live outside the repository; a pointer to one cannot resolve. */
const OUTSIDE_NOTES = ['KINEMATICS', 'ARCHITECTURE', 'PRODUCT', 'REFERENCES', 'STACK', 'STYLE'];
const CODE_DIRS = ['shared', 'backend', 'frontend/src', 'tests'];
const CODE_EXT = /\.(ts|tsx|mts|cts|js|jsx|mjs|cjs)$/;

// ---------------------------------------------------------------------------------------------
// Markdown

/** Markdown text without fenced code blocks and inline code spans (links there are not links). */
export function stripCode(md: string): string {
  return md.replace(/^(```|~~~)[^\n]*\n[\s\S]*?^\1[^\n]*$/gm, '').replace(/`[^`\n]*`/g, '');
}

/** Link targets of inline links `[text](target)`, images and reference definitions `[id]: target`. */
export function markdownLinks(md: string): string[] {
  const text = stripCode(md);
  const out: string[] = [];
  for (const m of text.matchAll(/!?\[[^\]]*\]\(\s*<?([^)\s>]+)>?(?:\s+"[^"]*")?\s*\)/g)) out.push(m[1]);
  for (const m of text.matchAll(/^\s{0,3}\[[^\]]+\]:\s*<?(\S+?)>?(?:\s+.*)?$/gm)) out.push(m[1]);
  return out;
}

/** Plain text of a heading as rendered: inline code, emphasis and link syntax removed. */
function headingText(raw: string): string {
  return raw
    .replace(/`([^`]*)`/g, '$1')
    .replace(/\[([^\]]*)\]\([^)]*\)/g, '$1')
    .replace(/[*_]{1,3}([^*_]+)[*_]{1,3}/g, '$1')
    .trim();
}

/** Headings of a Markdown text (ATX style), as plain text. */
export function headings(md: string): string[] {
  return [...stripFences(md).matchAll(/^#{1,6}\s+(.+?)\s*#*\s*$/gm)].map((m) => headingText(m[1]));
}

function stripFences(md: string): string {
  return md.replace(/^(```|~~~)[^\n]*\n[\s\S]*?^\1[^\n]*$/gm, '');
}

/** Anchors the headings of a page get, as GitHub makes them (lower case, punctuation dropped, spaces → '-', repeats numbered). */
export function anchors(md: string): Set<string> {
  const seen = new Map<string, number>();
  const out = new Set<string>();
  for (const h of headings(md)) {
    const base = h.toLowerCase().replace(/[^\p{L}\p{M}\p{N}\p{Pc} -]/gu, '').replace(/ /g, '-');
    const n = seen.get(base) ?? 0;
    seen.set(base, n + 1);
    out.add(n === 0 ? base : `${base}-${n}`);
  }
  return out;
}

/** Problems with the relative links of one Markdown file (paths relative to the repository). */
export function brokenMarkdownLinks(file: string, md: string, read: (abs: string) => string | null): string[] {
  const problems: string[] = [];
  const dir = path.dirname(path.join(ROOT, file));
  for (const target of markdownLinks(md)) {
    if (/^[a-z][a-z0-9+.-]*:/i.test(target) || target.startsWith('//')) continue; // http:, mailto: …
    const [rawPath, anchor] = target.split('#', 2) as [string, string | undefined];
    const pathPart = decodeURI(rawPath.split('?')[0]);
    const abs = pathPart === '' ? path.join(ROOT, file) : path.resolve(dir, pathPart);
    const body = read(abs);
    if (pathPart !== '' && body === null && !isDir(abs)) {
      problems.push(`${file}: link to ${target} — ${path.relative(ROOT, abs)} does not exist`);
      continue;
    }
    if (anchor && abs.endsWith('.md') && body !== null && !anchors(body).has(anchor)) {
      problems.push(`${file}: link to ${target} — no heading with anchor #${anchor}`);
    }
  }
  for (const { name } of outsideNoteNames(stripCode(md))) {
    problems.push(`${file}: names ${name}, a design note outside the repository; point to docs/ instead`);
  }
  return problems;
}

// ---------------------------------------------------------------------------------------------
// Code comments

/** Every comment of a TypeScript/JavaScript source (line and block comments, JSX included), with its line. */
export function codeComments(fileName: string, text: string): Array<{ line: number; text: string }> {
  const kind = fileName.endsWith('.tsx') || fileName.endsWith('.jsx') ? ts.ScriptKind.TSX : fileName.match(/\.[mc]?js$/) ? ts.ScriptKind.JS : ts.ScriptKind.TS;
  const sf = ts.createSourceFile(fileName, text, ts.ScriptTarget.Latest, true, kind);
  const seen = new Set<number>();
  const jsxText: Array<[number, number]> = [];
  const out: Array<{ pos: number; line: number; text: string }> = [];
  const take = (ranges: ts.CommentRange[] | undefined) => {
    for (const r of ranges ?? []) {
      if (seen.has(r.pos)) continue;
      seen.add(r.pos);
      out.push({ pos: r.pos, line: sf.getLineAndCharacterOfPosition(r.pos).line + 1, text: text.slice(r.pos, r.end) });
    }
  };
  // Every token's leading and trailing trivia: walking getChildren() reaches punctuation tokens too,
  // so a comment in an empty block or a JSX expression is found as well as one before a statement.
  const visit = (node: ts.Node) => {
    if (node.kind === ts.SyntaxKind.JsxText) {
      // '//' in JSX text is text, not a comment
      jsxText.push([node.getFullStart(), node.getEnd()]);
      return;
    }
    // JSDoc nodes lie inside a comment; the comment itself is the next token's leading trivia.
    const children = node.getChildren(sf).filter((c) => c.kind < ts.SyntaxKind.FirstJSDocNode || c.kind > ts.SyntaxKind.LastJSDocNode);
    if (children.length === 0) {
      take(ts.getLeadingCommentRanges(text, node.getFullStart()));
      take(ts.getTrailingCommentRanges(text, node.getEnd()));
      return;
    }
    children.forEach(visit);
  };
  visit(sf);
  take(ts.getLeadingCommentRanges(text, 0));
  return out
    .filter((c) => !jsxText.some(([s, e]) => c.pos >= s && c.pos < e))
    .sort((a, b) => a.pos - b.pos)
    .map(({ line, text: t }) => ({ line, text: t }));
}

/** Design-note names in a text that are not an existing page under docs/. */
function outsideNoteNames(text: string): Array<{ name: string; index: number }> {
  const out: Array<{ name: string; index: number }> = [];
  const re = new RegExp(`([\\w./-]*?)\\b(${OUTSIDE_NOTES.join('|')})\\.md\\b`, 'g');
  for (const m of text.matchAll(re)) {
    const prefix = m[1];
    const inDocs = /(^|\/)docs\/$/.test(prefix) && existsSync(path.join(ROOT, 'docs', `${m[2]}.md`));
    if (!inDocs) out.push({ name: `${m[2]}.md`, index: m.index });
  }
  const design = /(^|[^\w])shared\/design\//.exec(text);
  if (design) out.push({ name: 'shared/design/', index: design.index });
  return out;
}

/** Problems with the documentation pointers in the comments of one source file (path relative to the repository). */
export function brokenCommentPointers(file: string, source: string, read: (abs: string) => string | null): string[] {
  const problems: string[] = [];
  // Every pointer checked below contains one of these; a file without any needs no parsing.
  if (!/\.md\b|docs\/|shared\/design\//.test(source)) return problems;
  for (const c of codeComments(file, source)) {
    const lineOf = (index: number | undefined) => c.line + (c.text.slice(0, index ?? 0).match(/\n/g)?.length ?? 0);
    for (const { name, index } of outsideNoteNames(c.text)) {
      problems.push(`${file}:${lineOf(index)}: names ${name}, a design note outside the repository; point to docs/ instead`);
    }
    // A docs page (docs/<name>.md), optionally followed by #anchor or a quoted heading ("Heading" or , "Heading").
    for (const m of c.text.matchAll(/(?<![\w./-])((?:\.\.\/)*docs\/([\w./-]+?\.md))(?:#([\w-]+)|,?\s+"([^"\n]+)")?/g)) {
      const page = path.join(ROOT, 'docs', m[2]);
      const body = read(page);
      const line = lineOf(m.index);
      if (body === null) {
        problems.push(`${file}:${line}: names docs/${m[2]}, which does not exist`);
        continue;
      }
      if (m[3] && !anchors(body).has(m[3])) problems.push(`${file}:${line}: docs/${m[2]}#${m[3]} — no such heading`);
      if (m[4] && !headings(body).some((h) => h.toLowerCase().startsWith(m[4].toLowerCase()))) {
        problems.push(`${file}:${line}: docs/${m[2]} has no section "${m[4]}"`);
      }
    }
  }
  return problems;
}

// ---------------------------------------------------------------------------------------------
// The repository

function isDir(abs: string): boolean {
  return existsSync(abs) && statSync(abs).isDirectory();
}

function readOrNull(abs: string): string | null {
  return existsSync(abs) && statSync(abs).isFile() ? readFileSync(abs, 'utf8') : null;
}

function walk(dir: string, keep: (name: string) => boolean, out: string[] = []): string[] {
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    if (e.name === 'node_modules' || e.name.startsWith('.')) continue;
    const abs = path.join(dir, e.name);
    if (e.isDirectory()) walk(abs, keep, out);
    else if (keep(e.name)) out.push(abs);
  }
  return out;
}

const markdownFiles = () => ['README.md', 'DEVELOPERS.md', ...readdirSync(path.join(ROOT, 'docs')).filter((f) => f.endsWith('.md')).map((f) => `docs/${f}`)];
const codeFiles = () => CODE_DIRS.flatMap((d) => walk(path.join(ROOT, d), (n) => CODE_EXT.test(n) && !n.endsWith('.d.ts'))).map((abs) => path.relative(ROOT, abs));

describe('documentation links in the repository', () => {
  it('docs/ has its index and the pages the code points to', () => {
    for (const page of ['README.md', 'kinematics.md', 'analysis.md', 'sources.md']) expect(existsSync(path.join(ROOT, 'docs', page)), `docs/${page}`).toBe(true);
  });

  it('every relative link in README.md, DEVELOPERS.md and docs/*.md reaches an existing file and heading', () => {
    const files = markdownFiles();
    expect(files.length).toBeGreaterThanOrEqual(6);
    const problems = files.flatMap((f) => brokenMarkdownLinks(f, readFileSync(path.join(ROOT, f), 'utf8'), readOrNull));
    expect(problems).toEqual([]);
  });

  it('code comments in shared/, backend/, frontend/src/ and tests/ name only existing docs pages and no outside design notes', () => {
    const files = codeFiles();
    expect(files.length).toBeGreaterThan(100);
    const problems = files.flatMap((f) => brokenCommentPointers(f, readFileSync(path.join(ROOT, f), 'utf8'), readOrNull));
    expect(problems).toEqual([]);
  });
});

describe('the link checks themselves', () => {
  const pages: Record<string, string> = {
    [path.join(ROOT, 'docs', 'kinematics.md')]: '# Kinematics\n\n## Sampled profiles (`sampledProfile.ts`)\n\n## Plan regions\n',
  };
  const read = (abs: string) => pages[abs] ?? null;

  // Names of pages that do not exist, built at run time so this file itself names no missing page.
  const page = (name: string) => `${name}.${'md'}`;

  it('find a Markdown link to a missing file, a missing heading and an outside design note; skip code and URLs', () => {
    const md = [
      `[ok](kinematics.md#sampled-profiles-sampledprofilets) [gone](${page('missing')}) [web](https://example.com/${page('x')})`,
      `[bad anchor](kinematics.md#nowhere) \`[in code](${page('nope')})\``,
      '```', `[fenced](${page('nope2')})`, '```',
      'See ' + 'STYLE' + '.md for habits.',
      `[ref]: ./${page('also-missing')}`,
    ].join('\n');
    const problems = brokenMarkdownLinks(`docs/${page('index')}`, md, read);
    expect(problems).toHaveLength(4);
    expect(problems.join('\n')).toMatch(/missing\.md/);
    expect(problems.join('\n')).toMatch(/#nowhere/);
    expect(problems.join('\n')).toMatch(/also-missing\.md/);
    expect(problems.join('\n')).toMatch(/design note outside/);
  });

  it('find comment pointers to missing docs pages, missing sections and outside notes, but not strings', () => {
    const src = [
      '/** Method (docs/kinematics.md, "Sampled profiles"). */',
      '// see docs/kinematics.md "Bands that do not exist"',
      `// see docs/${page('nothing')}`,
      `// values as in ${'REFERENCES'}.md [pub]`,
      `const s = 'docs/${page('not-a-comment')} ${'KINEMATICS'}.md';`,
      'function f() { /* docs/kinematics.md#plan-regions */ }',
      `const el = <div>{/* docs/${page('missing-in-jsx')} */}</div>;`,
      `const t = <p>// text, not docs/${page('jsx-text')}</p>;`,
      '/**',
      ` * From ${'../shared/design'}/ notes.`,
      ' */',
    ].join('\n');
    const problems = brokenCommentPointers('frontend/src/x.tsx', src, read);
    expect(problems).toEqual([
      expect.stringMatching(/:2: docs\/kinematics\.md has no section "Bands that do not exist"/),
      expect.stringMatching(/:3: names docs\/nothing\.md, which does not exist/),
      expect.stringMatching(/:4: names REFERENCES\.md, a design note outside/),
      expect.stringMatching(/:7: names docs\/missing-in-jsx\.md, which does not exist/),
      expect.stringMatching(/:10: names shared\/design\/, a design note outside/),
    ]);
  });
});
