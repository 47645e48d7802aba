// Pictures of a proposal and a design: the changed region (before/after graphs and default
// stimulus), the before/after simulation run on demand, and whole-design or subcircuit drawings.
import useSWR from 'swr';
import { useCallback, useState } from 'react';
import type { DesignDrawing, ProposalRegion, RegionSimulation } from '@/shared/api/pictures';
import { api } from './api-client';

export const regionKey = (proposalId: string) => `/api/proposals/${proposalId}/region`;
export const drawingKey = (designId: string, instance?: string) => `/api/designs/${designId}/drawing${instance ? `?instance=${encodeURIComponent(instance)}` : ''}`;

export function useProposalRegion(proposalId: string | null) {
  const { data, error, isLoading, mutate } = useSWR<ProposalRegion>(proposalId ? regionKey(proposalId) : null);
  return { region: data, error: error as unknown, isLoading, retry: () => mutate() };
}

export function useDesignDrawing(designId: string | null, instance?: string) {
  const { data, error, isLoading, mutate } = useSWR<DesignDrawing>(designId ? drawingKey(designId, instance) : null);
  return { drawing: data, error: error as unknown, isLoading, retry: () => mutate() };
}

/** Runs the simulation (default stimulus first, then whatever the reader edits) and keeps the last answer. */
export function useRegionSimulation(proposalId: string | null) {
  const [state, setState] = useState<{ result?: RegionSimulation; error?: unknown; busy: boolean }>({ busy: false });
  const run = useCallback(
    async (stimulus?: string) => {
      if (!proposalId) return;
      setState((s) => ({ ...s, busy: true, error: undefined }));
      try {
        const result = await api.post<RegionSimulation>(`/api/proposals/${proposalId}/simulate`, stimulus === undefined ? {} : { stimulus });
        setState({ result, busy: false });
      } catch (error) {
        setState((s) => ({ ...s, error, busy: false }));
      }
    },
    [proposalId],
  );
  return { ...state, run };
}
