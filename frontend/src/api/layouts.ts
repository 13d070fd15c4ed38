import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { LayoutContent, LayoutDto } from '@shared/schemas/layout';
import { api } from './client';
import { layoutKeys } from './queryKeys';

export interface LayoutSummaryDto extends Omit<LayoutDto, 'content'> {
  counts: { arms: number; workPoints: number; zones: number };
}

/** A project's layouts (without their content). */
export const layoutListQuery = (projectId: number) =>
  queryOptions({
    queryKey: layoutKeys.list(projectId),
    queryFn: ({ signal }) => api<{ layouts: LayoutSummaryDto[] }>(`/projects/${projectId}/layouts`, { signal }).then((r) => r.layouts),
  });

/** One layout with its content and version. */
export const layoutDetailQuery = (id: number) =>
  queryOptions({
    queryKey: layoutKeys.detail(id),
    queryFn: ({ signal }) => api<{ layout: LayoutDto }>(`/layouts/${id}`, { signal }).then((r) => r.layout),
  });

export function useLayouts(projectId: number) {
  return useQuery(layoutListQuery(projectId));
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
