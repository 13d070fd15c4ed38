import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { UserCreateInput, UserDto, UserUpdateInput } from '@shared/schemas/user';
import { api } from './client';
import { projectKeys, userKeys } from './queryKeys';

/** Every user account (admin and planner may list them). */
export const userListQuery = () =>
  queryOptions({
    queryKey: userKeys.list(),
    queryFn: ({ signal }) => api<{ users: UserDto[] }>('/users', { signal }).then((r) => r.users),
  });

export function useUsers(options: { enabled?: boolean } = {}) {
  return useQuery({ ...userListQuery(), enabled: options.enabled ?? true });
}

/** Creates an account with a temporary password (admin). */
export function useCreateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: UserCreateInput) =>
      api<{ user: UserDto }>('/users', { method: 'POST', body: input }).then((r) => r.user),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: userKeys.all }),
  });
}

/** Changes an account's name, role, active flag or password (admin). */
export function useUpdateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, changes }: { id: number; changes: UserUpdateInput }) =>
      api<{ user: UserDto }>(`/users/${id}`, { method: 'PATCH', body: changes }).then((r) => r.user),
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: userKeys.all });
      // Member lists show names and roles, so they follow.
      await queryClient.invalidateQueries({ queryKey: projectKeys.details() });
    },
  });
}
