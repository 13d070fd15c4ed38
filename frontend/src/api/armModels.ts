import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { ArmModelInput } from '../components/catalogue/modelCore';
import { api } from './client';
import { armModelKeys } from './queryKeys';

/** An arm model as the API presents it; lengths mm, angles deg. */
export interface ArmModelDto {
  id: number;
  name: string;
  family: string;
  params: Record<string, unknown> & { family: string; payloadKg?: number; stopTimeS?: number };
  builtIn: boolean;
  createdBy: number | null;
  createdAt: string;
  updatedAt: string;
  /** Largest horizontal reach of the tool point from the J1 axis, mm (null when the parameters do not parse). */
  maxReach: number | null;
  minReach: number | null;
}

/** The whole catalogue, built-in models first. */
export const armModelListQuery = () =>
  queryOptions({
    queryKey: armModelKeys.list(),
    queryFn: ({ signal }) => api<{ armModels: ArmModelDto[] }>('/arm-models', { signal }).then((r) => r.armModels),
  });

/** One arm model. */
export const armModelDetailQuery = (id: number) =>
  queryOptions({
    queryKey: armModelKeys.detail(id),
    queryFn: ({ signal }) => api<{ armModel: ArmModelDto }>(`/arm-models/${id}`, { signal }).then((r) => r.armModel),
  });

export function useArmModels() {
  return useQuery(armModelListQuery());
}

export function useArmModel(id: number) {
  return useQuery(armModelDetailQuery(id));
}

/** Adds a model to the catalogue (also used to duplicate one); refreshes the list. */
export function useCreateArmModel() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ArmModelInput) => api<{ armModel: ArmModelDto }>('/arm-models', { method: 'POST', body: input }).then((r) => r.armModel),
    onSuccess: async (model) => {
      queryClient.setQueryData(armModelKeys.detail(model.id), model);
      await queryClient.invalidateQueries({ queryKey: armModelKeys.lists() });
    },
  });
}

/** Saves a model's name and parameters; the answer replaces the cached detail. */
export function useUpdateArmModel(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ArmModelInput) => api<{ armModel: ArmModelDto }>(`/arm-models/${id}`, { method: 'PUT', body: input }).then((r) => r.armModel),
    onSuccess: async (model) => {
      queryClient.setQueryData(armModelKeys.detail(id), model);
      await queryClient.invalidateQueries({ queryKey: armModelKeys.lists() });
    },
  });
}

/** Deletes a model (409 with the layouts named when one uses it). */
export function useDeleteArmModel(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api<void>(`/arm-models/${id}`, { method: 'DELETE' }),
    onSuccess: async () => {
      queryClient.setQueryData<ArmModelDto[]>(armModelKeys.list(), (old) => old?.filter((m) => m.id !== id));
      await queryClient.invalidateQueries({ queryKey: armModelKeys.detail(id), refetchType: 'none' });
      await queryClient.invalidateQueries({ queryKey: armModelKeys.lists() });
    },
  });
}

/** "Demo Articulated 1400 (copy)", or "(copy 2)" … when that name is taken too. */
export function copyName(name: string, taken: ReadonlyArray<string>): string {
  const lower = new Set(taken.map((n) => n.toLowerCase()));
  const base = `${name} (copy)`;
  if (!lower.has(base.toLowerCase())) return base;
  for (let i = 2; ; i++) {
    const next = `${name} (copy ${i})`;
    if (!lower.has(next.toLowerCase())) return next;
  }
}
