import { useMutation } from '@tanstack/react-query';
import type { FenceProposal } from '@shared/analysis';
import type { FenceSystemInput } from '@shared/schemas/fenceProposal';
import type { LayoutContent } from '@shared/schemas/layout';
import { api } from './client';

/** What the server sends back for a proposal (the shared core's result). */
export type FenceProposalDto = FenceProposal;

/** Asks the server for a guard ring around the editor's current content (nothing is stored). */
export function useFenceProposal(layoutId: number) {
  return useMutation({
    mutationFn: (input: { system: FenceSystemInput; content: LayoutContent }) =>
      api<FenceProposalDto>(`/layouts/${layoutId}/fence-proposal`, { method: 'POST', body: { ...input.system, content: input.content } }),
  });
}
