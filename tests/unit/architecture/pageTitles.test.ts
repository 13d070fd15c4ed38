// Every page names its browser tab: each page module in frontend/src/routes calls usePageTitle
// (frontend/src/lib/usePageTitle.ts), so no two pages share the bare product name. The product's
// own convention (DEVELOPERS.md, "A page"); no outside source applies.
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

const ROUTES = path.resolve(__dirname, '../../../frontend/src/routes');

describe('tab titles', () => {
  const pages = readdirSync(ROUTES).filter((f) => f.endsWith('Page.tsx'));

  it('reads the page modules (the walk itself works)', () => {
    expect(pages).toEqual(expect.arrayContaining(['SignInPage.tsx', 'NotFoundPage.tsx', 'ReviewPage.tsx', 'LayoutEditorPage.tsx', 'CataloguePage.tsx', 'AdminAuditPage.tsx']));
  });

  it('every page sets its own title, each a different one', () => {
    const titles = new Map<string, string>();
    for (const f of pages) {
      const src = readFileSync(path.join(ROUTES, f), 'utf8');
      const call = /usePageTitle\(([^;]*)\);/.exec(src);
      expect(call, `${f} calls usePageTitle`).not.toBeNull();
      titles.set(f, call![1]);
    }
    expect(new Set(titles.values()).size).toBe(titles.size);
  });
});
