import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { MemberDto, ProjectDetailDto, ProjectDto, ProjectInput, ProjectUpdateInput } from '@shared/schemas/project';
import { api } from './client';
import { projectKeys } from './queryKeys';

/** The projects the signed-in person may see: those in use, or the archived ones. */
export const projectListQuery = (show: 'active' | 'archived' = 'active') =>
  queryOptions({
    queryKey: projectKeys.list(show),
    queryFn: ({ signal }) =>
      show === 'active'
        ? api<{ projects: ProjectDto[] }>('/projects', { signal }).then((r) => r.projects)
        : api<{ projects: ProjectDto[] }>('/projects?archived=1', { signal }).then((r) => r.projects.filter((p) => p.archivedAt !== null)),
  });

/** One project with its members. */
export const projectDetailQuery = (id: number) =>
  queryOptions({
    queryKey: projectKeys.detail(id),
    queryFn: ({ signal }) => api<{ project: ProjectDetailDto }>(`/projects/${id}`, { signal }).then((r) => r.project),
  });

export function useProjects(show: 'active' | 'archived' = 'active') {
  return useQuery(projectListQuery(show));
}

export function useProject(id: number) {
  return useQuery(projectDetailQuery(id));
}

/** Creates a project (ProjectInput); refreshes the list. */
export function useCreateProject() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ProjectInput) =>
      api<{ project: ProjectDto }>('/projects', { method: 'POST', body: input }).then((r) => r.project),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: projectKeys.lists() }),
  });
}

/** Changes a project's details (ProjectUpdateInput); refreshes list and detail. */
export function useUpdateProject(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ProjectUpdateInput) =>
      api<{ project: ProjectDto }>(`/projects/${id}`, { method: 'PATCH', body: input }).then((r) => r.project),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: projectKeys.all }),
  });
}

/** Deletes a project; marks its cached detail stale and refreshes the list. */
export function useDeleteProject(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api<void>(`/projects/${id}`, { method: 'DELETE' }),
    onSuccess: async () => {
      // The list drops the row at once (it may be shown before its refetch returns); the
      // detail is marked stale, not removed, since the open page observes it until it leaves.
      queryClient.setQueryData<ProjectDto[]>(projectKeys.list('active'), (old) => old?.filter((p) => p.id !== id));
      await queryClient.invalidateQueries({ queryKey: projectKeys.detail(id), refetchType: 'none' });
      await queryClient.invalidateQueries({ queryKey: projectKeys.lists() });
    },
  });
}

/** Adds a person to a project's members. */
export function useAddMember(projectId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (userId: number) =>
      api<{ member: MemberDto }>(`/projects/${projectId}/members`, { method: 'POST', body: { userId } }).then(
        (r) => r.member,
      ),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: projectKeys.all }),
  });
}

/** Removes a person from a project's members. */
export function useRemoveMember(projectId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (userId: number) => api<void>(`/projects/${projectId}/members/${userId}`, { method: 'DELETE' }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: projectKeys.all }),
  });
}

/** Archives (hidden from lists, read-only) or restores (admins) a project; refreshes every project query. */
export function useSetProjectArchived(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (archived: boolean) =>
      api<{ project: ProjectDto }>(`/projects/${id}/${archived ? 'archive' : 'restore'}`, { method: 'POST' }).then((r) => r.project),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: projectKeys.all }),
  });
}
