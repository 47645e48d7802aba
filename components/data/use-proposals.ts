// Proposals: a design's filtered list, one proposal's detail, and the reviewer's decision and
// comments on it.
import useSWR, { useSWRConfig } from 'swr';
import { useMemo } from 'react';
import type { Comment, ProposalDetail, ProposalSummary } from '@/shared/api/proposals';
import type { DecisionBody } from '@/shared/api/review';
import { api } from './api-client';
import { AUDIT_KEY } from './keys';
import { DESIGNS_KEY, designKey, isProposalsKeyOf, proposalKey, proposalsKey, REVIEW_QUEUE_KEY, type ProposalFilters } from './workflow-keys';

export function useProposals(designId: string | null, filters: ProposalFilters = {}) {
  const { data, error, isLoading, mutate } = useSWR<{ proposals: ProposalSummary[] }>(designId ? proposalsKey(designId, filters) : null, { keepPreviousData: true });
  return { proposals: data?.proposals, error: error as unknown, isLoading, retry: () => mutate() };
}

export function useProposal(id: string | null) {
  const { data, error, isLoading, mutate } = useSWR<ProposalDetail>(id ? proposalKey(id) : null);
  return { proposal: data, error: error as unknown, isLoading, retry: () => mutate() };
}

export function useProposalActions() {
  const { mutate } = useSWRConfig();
  return useMemo(
    () => ({
      decide: async (proposal: Pick<ProposalDetail, 'id' | 'designId'>, body: DecisionBody) => {
        const next = await api.post<ProposalDetail>(`${proposalKey(proposal.id)}/decision`, body);
        // The answer may be the summary only; read the detail again for decisions and status.
        await mutate(proposalKey(proposal.id));
        await Promise.all([mutate(REVIEW_QUEUE_KEY), mutate(isProposalsKeyOf(proposal.designId)), mutate(designKey(proposal.designId)), mutate(DESIGNS_KEY), mutate(AUDIT_KEY)]);
        return next;
      },
      comment: async (proposalId: string, body: string) => {
        const made = await api.post<Comment>(`${proposalKey(proposalId)}/comments`, { body });
        await mutate(proposalKey(proposalId));
        return made;
      },
    }),
    [mutate],
  );
}
