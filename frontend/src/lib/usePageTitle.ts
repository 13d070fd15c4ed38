import { useEffect } from 'react';

/** The product's name, last in every browser tab title. */
export const PRODUCT_NAME = 'Ringfence';

/** A tab title from the page's parts, most specific first: ("Cell 1", "Fernhill") → "Cell 1 · Fernhill · Ringfence". */
export function pageTitle(...parts: Array<string | null | undefined>): string {
  return [...parts.map((p) => p?.trim()).filter((p): p is string => Boolean(p)), PRODUCT_NAME].join(' · ');
}

/**
 * Sets the browser tab's title while the page is shown, e.g. usePageTitle(layout.name, project.name);
 * parts not known yet (still loading) are left out.
 */
export function usePageTitle(...parts: Array<string | null | undefined>): void {
  const title = pageTitle(...parts);
  useEffect(() => {
    document.title = title;
  }, [title]);
}
