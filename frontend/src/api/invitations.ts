import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { Role } from '@shared/schemas/user';
import { api } from './client';
import { authKeys, userKeys } from './queryKeys';

export interface InvitationDto {
  id: number;
  email: string;
  role: Role;
  project: { id: number; name: string } | null;
  createdAt: string;
  expiresAt: string;
  status: 'pending' | 'used' | 'revoked' | 'expired';
}

export const invitationKeys = {
  all: ['invitations'] as const,
  list: () => [...invitationKeys.all, 'list'] as const,
  token: (t: string) => [...invitationKeys.all, 'token', t] as const,
};

export function useInvitations() {
  return useQuery({ queryKey: invitationKeys.list(), queryFn: ({ signal }) => api<{ invitations: InvitationDto[] }>('/invitations', { signal }).then((r) => r.invitations) });
}

export function useCreateInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { email: string; role: Role; projectId?: number | null }) =>
      api<{ invitation: InvitationDto; mail: { status: string; error: string | null } }>('/invitations', { method: 'POST', body: input }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: invitationKeys.all }),
  });
}

export function useRevokeInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => api<void>(`/invitations/${id}`, { method: 'DELETE' }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: invitationKeys.all }),
  });
}

/** What an invitation link offers (public); rejects with 404/410 for unknown, used, expired or withdrawn links. */
export function useInvitationToken(token: string) {
  return useQuery({
    queryKey: invitationKeys.token(token),
    queryFn: ({ signal }) => api<{ invitation: { email: string; role: Role; expiresAt: string } }>(`/invitations/token/${encodeURIComponent(token)}`, { signal }).then((r) => r.invitation),
    retry: false,
  });
}

export function useAcceptInvitation(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { name: string; password: string }) => api<{ user: { id: number; email: string; name: string; role: Role } }>(`/invitations/token/${encodeURIComponent(token)}/accept`, { method: 'POST', body: input }),
    onSuccess: async (res) => {
      queryClient.setQueryData(authKeys.me(), res.user);
      await queryClient.invalidateQueries({ queryKey: userKeys.all });
    },
  });
}
