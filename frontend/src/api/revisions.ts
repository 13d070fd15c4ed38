import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { RevisionDiff, RevisionSnapshot } from '@shared/schemas/revision';
import { api } from './client';
import { layoutKeys } from './queryKeys';

export type RevisionState = 'submitted' | 'returned' | 'signed_off' | 'released';
export interface PersonRef {
  id: number;
  name: string;
}

/** A revision as listed (staff see all fields; clients get the released ones, reduced). */
export interface RevisionSummaryDto {
  id: number;
  layoutId: number;
  projectId: number;
  layoutName: string;
  letter: string;
  state: RevisionState;
  releasedAt: string | null;
  planSheetChecksum: string | null;
  /** Clients: when they acknowledged receipt. */
  acknowledgedAt?: string | null;
  checksum?: string;
  submittedBy?: PersonRef | null;
  submittedAt?: string;
  decidedBy?: PersonRef | null;
  decidedAt?: string | null;
  decisionComment?: string | null;
  releasedBy?: PersonRef | null;
  counts?: { arms: number; findings: number };
  acknowledgements?: Array<{ user: PersonRef; at: string }>;
}

export interface ReviewCommentDto {
  id: number;
  revisionId: number;
  revisionLetter?: string;
  author: PersonRef | null;
  findingId: string | null;
  /** Plan mm. */
  point: { x: number; y: number } | null;
  body: string;
  resolved: boolean;
  resolvedBy: PersonRef | null;
  resolvedAt: string | null;
  createdAt: string;
}

/** The frozen snapshot and the comparison with the revision before, as the shared schema describes them. */
export type RevisionSnapshotDto = RevisionSnapshot;
export type RevisionDiffDto = RevisionDiff;

export interface RevisionDetailDto extends RevisionSummaryDto {
  snapshot?: RevisionSnapshotDto;
  comments?: ReviewCommentDto[];
  history?: ReviewCommentDto[];
  diff?: RevisionDiffDto;
  mail?: Array<{ id: number; kind: string; to: string[]; subject: string; status: string; error: string | null; attempts: number; lastAttemptAt: string | null }>;
}

export const revisionKeys = {
  all: ['revisions'] as const,
  projectList: (projectId: number) => [...revisionKeys.all, 'project', projectId] as const,
  detail: (id: number) => [...revisionKeys.all, 'detail', id] as const,
};

export const projectRevisionsQuery = (projectId: number) =>
  queryOptions({
    queryKey: revisionKeys.projectList(projectId),
    queryFn: ({ signal }) => api<{ revisions: RevisionSummaryDto[] }>(`/projects/${projectId}/revisions`, { signal }).then((r) => r.revisions),
  });

export const revisionDetailQuery = (id: number) =>
  queryOptions({
    queryKey: revisionKeys.detail(id),
    queryFn: ({ signal }) => api<{ revision: RevisionDetailDto }>(`/revisions/${id}`, { signal }).then((r) => r.revision),
  });

export function useProjectRevisions(projectId: number) {
  return useQuery(projectRevisionsQuery(projectId));
}

export function useRevision(id: number) {
  return useQuery(revisionDetailQuery(id));
}

/** The plan sheet URL: the stored sheet for released revisions, a fresh DRAFT for others (staff). */
export function planSheetUrl(id: number, download = false): string {
  return `/api/revisions/${id}/plan-sheet.pdf${download ? '?download=1' : ''}`;
}

function useRevisionMutation<I, O extends object>(call: (input: I) => Promise<O>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: call,
    onSuccess: async (res) => {
      const rev = (res as { revision?: RevisionDetailDto }).revision;
      if (rev) queryClient.setQueryData(revisionKeys.detail(rev.id), rev);
      await queryClient.invalidateQueries({ queryKey: revisionKeys.all });
      await queryClient.invalidateQueries({ queryKey: layoutKeys.all });
    },
  });
}

export function useSubmitRevision(layoutId: number) {
  return useRevisionMutation((_: void) => api<{ revision: RevisionDetailDto }>(`/layouts/${layoutId}/revisions`, { method: 'POST' }));
}

export function useDecideRevision(id: number) {
  return useRevisionMutation((input: { decision: 'sign_off' | 'return'; comment: string }) =>
    api<{ revision: RevisionDetailDto }>(`/revisions/${id}/decision`, { method: 'POST', body: input }),
  );
}

export function useReleaseRevision(id: number) {
  return useRevisionMutation((_: void) => api<{ revision: RevisionDetailDto; mail: { status: string; error: string | null } }>(`/revisions/${id}/release`, { method: 'POST' }));
}

export function useRetryReleaseMail(id: number) {
  return useRevisionMutation((_: void) => api<{ mail: { status: string; error: string | null } }>(`/revisions/${id}/release/retry-mail`, { method: 'POST' }));
}

export function useAcknowledgeRevision(id: number) {
  return useRevisionMutation((_: void) => api<{ acknowledgement: { at: string } }>(`/revisions/${id}/acknowledge`, { method: 'POST' }));
}

export function useAddComment(revisionId: number) {
  return useRevisionMutation((input: { body: string; findingId?: string; point?: { x: number; y: number } }) =>
    api<{ comment: ReviewCommentDto }>(`/revisions/${revisionId}/comments`, { method: 'POST', body: input }),
  );
}

export function useResolveComment() {
  return useRevisionMutation((input: { id: number; resolved: boolean }) =>
    api<{ comment: ReviewCommentDto }>(`/comments/${input.id}`, { method: 'PATCH', body: { resolved: input.resolved } }),
  );
}
