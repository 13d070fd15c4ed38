import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { FeatureCollection, Geometry } from 'geojson';
import type { UnitCheck } from '@shared/geometry';
import type { FloorPlanPatch, ImportBounds, ImportGaps, ImportLayer, ImportNotes, PlanFeatureProps, PlanOrigin, SavedLayerRole, UnitName } from '@shared/schemas/floorPlan';
import type { ApiErrorBody } from '@shared/schemas/errors';
import { api, ApiError } from './client';
import { floorPlanKeys } from './queryKeys';

/** A floor plan as the list and the upload answer present it (no geometry); lengths in mm. */
export interface FloorPlanSummaryDto {
  id: number;
  projectId: number;
  fileName: string;
  units: UnitName;
  /** Where the drawing unit came from: the file's $INSUNITS header, the default, or a person's choice. */
  unitsSource: 'header' | 'default' | 'chosen';
  bounds: ImportBounds;
  layers: ImportLayer[];
  warnings: string[];
  /** Entities left out on purpose, and those that could not be read. */
  notes: ImportNotes;
  stats: { entities: number; features: number; skipped?: Record<string, number>; gaps?: ImportGaps } & Record<string, unknown>;
  /** Where the plan's 0,0 lies in the drawing, mm (0,0 unless the drawing was moved at import). */
  origin: PlanOrigin;
  /** Whether the extent is plausible for a building floor in the drawing unit, and which unit would be. */
  unitCheck: UnitCheck;
  createdAt: string;
  updatedAt?: string;
}

/** A floor plan with its geometry (GeoJSON in plan mm, x east, y north). */
export interface FloorPlanDto extends FloorPlanSummaryDto {
  geometry: FeatureCollection<Geometry, PlanFeatureProps>;
}

/** Where the original uploaded file is served (as an attachment). */
export function floorPlanSourceUrl(id: number): string {
  return `/api/floor-plans/${id}/source`;
}

/** The floor plans of one project, newest first. */
export const floorPlanListQuery = (projectId: number) =>
  queryOptions({
    queryKey: floorPlanKeys.list(projectId),
    queryFn: ({ signal }) =>
      api<{ floorPlans: FloorPlanSummaryDto[] }>(`/projects/${projectId}/floor-plans`, { signal }).then((r) => r.floorPlans),
  });

/** One floor plan with geometry. */
export const floorPlanDetailQuery = (id: number) =>
  queryOptions({
    queryKey: floorPlanKeys.detail(id),
    queryFn: ({ signal }) => api<FloorPlanDto>(`/floor-plans/${id}`, { signal }),
  });

export function useFloorPlans(projectId: number) {
  return useQuery(floorPlanListQuery(projectId));
}

export function useFloorPlan(id: number) {
  return useQuery(floorPlanDetailQuery(id));
}

/** Progress of an upload: bytes sent so far, then the wait while the server reads the drawing. */
export type UploadProgress = { phase: 'sending'; loaded: number; total: number } | { phase: 'reading' };

const UPLOAD_FALLBACK: Record<number, string> = {
  400: 'The drawing could not be read.',
  401: 'Please sign in again.',
  403: 'You are not allowed to upload floor plans.',
  413: 'The file is larger than the upload limit.',
  415: 'The file is not an ASCII DXF drawing.',
};

/** The ApiError for a finished XMLHttpRequest that failed, with the server's own message when it sent one. */
export function uploadError(status: number, responseText: string): ApiError {
  let parsed: unknown;
  try {
    parsed = responseText ? JSON.parse(responseText) : undefined;
  } catch {
    parsed = undefined;
  }
  const body = parsed as Partial<ApiErrorBody> | undefined;
  if (body?.error && typeof body.error.message === 'string') {
    return new ApiError(status, body.error.code || 'error', body.error.message, body.error.fields ?? {});
  }
  return new ApiError(status, `http_${status}`, UPLOAD_FALLBACK[status] ?? `The server answered ${status}.`);
}

/**
 * Uploads a DXF file as multipart field `file` with XMLHttpRequest (fetch reports no upload
 * progress); `onProgress` gets the bytes sent, then `reading` once the body is sent and the
 * server parses. Resolves to the new plan's summary; rejects with an ApiError.
 */
export function uploadFloorPlan(
  projectId: number,
  file: File,
  { onProgress, signal }: { onProgress?: (p: UploadProgress) => void; signal?: AbortSignal } = {},
): Promise<FloorPlanSummaryDto> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `/api/projects/${projectId}/floor-plans`);
    xhr.withCredentials = true;
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.upload.onprogress = (e) => onProgress?.({ phase: 'sending', loaded: e.loaded, total: e.lengthComputable ? e.total : file.size });
    xhr.upload.onload = () => onProgress?.({ phase: 'reading' });
    xhr.onload = () => {
      if (xhr.status >= 200 && xhr.status < 300) {
        try {
          resolve(JSON.parse(xhr.responseText) as FloorPlanSummaryDto);
        } catch {
          reject(new ApiError(xhr.status, 'bad_response', 'The server sent an answer that could not be read.'));
        }
      } else {
        reject(uploadError(xhr.status, xhr.responseText));
      }
    };
    xhr.onerror = () => reject(new ApiError(0, 'network', 'The server cannot be reached. Check the connection and try again.'));
    xhr.onabort = () => reject(new DOMException('The upload was cancelled.', 'AbortError'));
    signal?.addEventListener('abort', () => xhr.abort(), { once: true });
    const form = new FormData();
    form.append('file', file, file.name);
    xhr.send(form);
  });
}

/** Uploads a floor plan into a project (with progress); refreshes the project's list. */
export function useUploadFloorPlan(projectId: number, onProgress?: (p: UploadProgress) => void) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (file: File) => uploadFloorPlan(projectId, file, { onProgress }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: floorPlanKeys.list(projectId) }),
  });
}

/** Changes units and/or layer roles and heights; the answer (full plan) replaces the cached detail. */
export function useUpdateFloorPlan(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (patch: FloorPlanPatch) => api<FloorPlanDto>(`/floor-plans/${id}`, { method: 'PATCH', body: patch }),
    onSuccess: async (plan) => {
      queryClient.setQueryData(floorPlanKeys.detail(id), plan);
      await queryClient.invalidateQueries({ queryKey: floorPlanKeys.list(plan.projectId) });
    },
  });
}

/** Deletes a floor plan (409 with the server's message when a layout uses it). */
export function useDeleteFloorPlan(id: number, projectId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api<void>(`/floor-plans/${id}`, { method: 'DELETE' }),
    onSuccess: async () => {
      queryClient.setQueryData<FloorPlanSummaryDto[]>(floorPlanKeys.list(projectId), (old) => old?.filter((p) => p.id !== id));
      await queryClient.invalidateQueries({ queryKey: floorPlanKeys.detail(id), refetchType: 'none' });
      await queryClient.invalidateQueries({ queryKey: floorPlanKeys.list(projectId) });
    },
  });
}

export interface SavedLayerRolesDto {
  layers: SavedLayerRole[];
  updatedAt: string | null;
}

export const savedLayerRolesQuery = (projectId: number) =>
  queryOptions({
    queryKey: floorPlanKeys.savedRoles(projectId),
    queryFn: ({ signal }) => api<SavedLayerRolesDto>(`/projects/${projectId}/layer-roles`, { signal }),
  });

/** The layer roles saved for a project (applied to its next uploads). */
export function useSavedLayerRoles(projectId: number) {
  return useQuery(savedLayerRolesQuery(projectId));
}

/** Saves layer roles for the project's next uploads, replacing what was saved. */
export function useSaveLayerRoles(projectId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (layers: SavedLayerRole[]) =>
      api<SavedLayerRolesDto>(`/projects/${projectId}/layer-roles`, { method: 'PUT', body: { layers } }),
    onSuccess: (saved) => queryClient.setQueryData(floorPlanKeys.savedRoles(projectId), saved),
  });
}
