import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { AnalysisResult } from '@shared/analysis';
import type { AreaGeometry } from '@shared/geometry';
import type { LayoutContent, LayoutDto } from '@shared/schemas/layout';
import { api } from './client';
import { layoutKeys } from './queryKeys';

export interface LayoutSummaryDto extends Omit<LayoutDto, 'content'> {
  counts: { arms: number; workPoints: number; boundaries: number };
}

/** A project's layouts (without their content): those in use, or those in use and the archived ones. */
export const layoutListQuery = (projectId: number, show: 'active' | 'archived' = 'active') =>
  queryOptions({
    queryKey: layoutKeys.listOf(projectId, show),
    queryFn: ({ signal }) =>
      api<{ layouts: LayoutSummaryDto[] }>(`/projects/${projectId}/layouts${show === 'archived' ? '?archived=1' : ''}`, { signal }).then((r) => r.layouts),
  });

/** One layout with its content and version. */
export const layoutDetailQuery = (id: number) =>
  queryOptions({
    queryKey: layoutKeys.detail(id),
    queryFn: ({ signal }) => api<{ layout: LayoutDto }>(`/layouts/${id}`, { signal }).then((r) => r.layout),
  });

/** The server's analysis of a stored layout with each arm's maximum space, and the version it is of. */
export interface LayoutFirstViewDto {
  version: number;
  analysis: AnalysisResult;
  maxSpaces: Record<string, AreaGeometry | null>;
}

/**
 * Most reach checks (arms × work points × work heights) for which the editor asks the server for a
 * first view: beyond it the answer would be megabytes and the worker's own first result as quick.
 */
export const FIRST_VIEW_MAX_CHECKS = 100_000;

/**
 * The server's analysis of a stored layout, for the editor to show while its worker starts (the
 * same shared analysis, so the worker's first result shows the same); asked only for layouts of at
 * most FIRST_VIEW_MAX_CHECKS reach checks (the server answers 413 at once beyond). A failure only
 * means waiting for the worker.
 */
export const layoutFirstViewQuery = (id: number) =>
  queryOptions({
    queryKey: layoutKeys.firstView(id),
    queryFn: ({ signal }) => api<LayoutFirstViewDto>(`/layouts/${id}/analysis?maxChecks=${FIRST_VIEW_MAX_CHECKS}`, { signal }),
    // Kept long enough for the page to pick up the answer its route's loader asked for, not so
    // long that a later opening shows an old version's (the editor checks the version too).
    staleTime: 10_000,
    gcTime: 10_000,
    retry: false,
  });

export function useLayoutFirstView(id: number) {
  return useQuery(layoutFirstViewQuery(id));
}

export function useLayouts(projectId: number, show: 'active' | 'archived' = 'active') {
  return useQuery(layoutListQuery(projectId, show));
}

/** Archives (hidden from the list, read-only) or restores (admins) a layout. */
export function useSetLayoutArchived(projectId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, archived }: { id: number; archived: boolean }) =>
      api<{ layout: LayoutDto }>(`/layouts/${id}/${archived ? 'archive' : 'restore'}`, { method: 'POST' }).then((r) => r.layout),
    onSuccess: (l) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: layoutKeys.list(projectId) }),
        queryClient.invalidateQueries({ queryKey: layoutKeys.detail(l.id) }),
      ]),
  });
}

export function useLayout(id: number) {
  return useQuery(layoutDetailQuery(id));
}

export function useCreateLayout(projectId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { name: string; floorPlanId: number | null; content?: LayoutContent }) =>
      api<{ layout: LayoutDto }>(`/projects/${projectId}/layouts`, { method: 'POST', body: input }).then((r) => r.layout),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: layoutKeys.lists() }),
  });
}

export function useDeleteLayout(projectId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => api<void>(`/layouts/${id}`, { method: 'DELETE' }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: layoutKeys.list(projectId) }),
  });
}

/** PUT with the version edited; a stale version rejects with ApiError status 409. */
export function saveLayout(id: number, body: { version: number; name?: string; floorPlanId?: number | null; content?: LayoutContent }): Promise<LayoutDto> {
  return api<{ layout: LayoutDto }>(`/layouts/${id}`, { method: 'PUT', body }).then((r) => r.layout);
}
