import { queryOptions, useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { createContext, useContext } from 'react';
import type { LoginInput, Role } from '@shared/schemas/user';
import { api, isApiError } from './client';
import { authKeys } from './queryKeys';

/** The signed-in person as `/api/auth/me` presents them. */
export interface SessionUser {
  id: number;
  email: string;
  name: string;
  role: Role;
}

/** The current session: the user, or `null` when nobody is signed in (401 is an answer, not an error). */
export const meQuery = () =>
  queryOptions({
    queryKey: authKeys.me(),
    queryFn: async ({ signal }): Promise<SessionUser | null> => {
      try {
        const { user } = await api<{ user: SessionUser }>('/auth/me', { signal });
        return user;
      } catch (error) {
        if (isApiError(error, 401)) return null;
        throw error;
      }
    },
    staleTime: 5 * 60_000,
  });

/** The signed-in user (or null) with the query state. */
export function useMe() {
  return useQuery(meQuery());
}

/**
 * The signed-in user as the route guard last saw them. Pages read it through `useSessionUser`
 * rather than the `me` query, so a page never renders with the user already gone (sign-out,
 * lapsed session) before the guard has taken it away.
 */
export const SessionUserContext = createContext<SessionUser | null>(null);

/** The signed-in user for pages inside the route guard; throws when used outside it. */
export function useSessionUser(): SessionUser {
  const user = useContext(SessionUserContext);
  if (!user) throw new Error('useSessionUser: no signed-in user (use it inside the route guard)');
  return user;
}

/** Signs in with e-mail and password; on success the session user replaces every cached answer. */
export function useLogin() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: LoginInput) =>
      api<{ user: SessionUser }>('/auth/login', { method: 'POST', body: input }).then((r) => r.user),
    onSuccess: (user) => {
      // Answers cached for a previous person must not leak to the next one.
      queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== authKeys.all[0] });
      queryClient.setQueryData(authKeys.me(), user);
    },
  });
}

/** Drops every cached answer and marks nobody as signed in. */
export function forgetSession(queryClient: QueryClient): void {
  queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== authKeys.all[0] });
  queryClient.setQueryData(authKeys.me(), null);
}

/**
 * Ends the session on the server. The caller decides where to go next and then calls
 * `forgetSession`, so the route guard does not bounce the person back with a `?next=`.
 */
export function useLogout() {
  return useMutation({
    mutationFn: () => api<void>('/auth/logout', { method: 'POST' }),
  });
}
