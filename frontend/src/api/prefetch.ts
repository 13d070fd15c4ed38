import type { QueryClient } from '@tanstack/react-query';
import { armModelListQuery } from './armModels';
import { floorPlanDetailQuery } from './floorPlans';
import { layoutDetailQuery, layoutFirstViewQuery } from './layouts';

let client: QueryClient | null = null;

/** The app's QueryClient, for route loaders that start a page's requests early (main.tsx sets it). */
export function setPrefetchClient(c: QueryClient | null): void {
  client = c;
}

/**
 * Starts the layout editor's requests as soon as its route matches, alongside loading the page's
 * code and the session check instead of after them: the layout (then its floor plan), the arm
 * catalogue and the server's first view. Nothing waits for them here; the page's own queries pick
 * the answers up, and a failure shows there as it would have.
 */
export function prefetchLayoutEditor(layoutId: number): void {
  const c = client;
  if (!c || !Number.isInteger(layoutId) || layoutId <= 0) return;
  void c.prefetchQuery(armModelListQuery());
  void c.prefetchQuery(layoutFirstViewQuery(layoutId));
  void c
    .fetchQuery(layoutDetailQuery(layoutId))
    .then((layout) => (layout.floorPlanId !== null ? c.prefetchQuery(floorPlanDetailQuery(layout.floorPlanId)) : undefined))
    .catch(() => undefined);
}
